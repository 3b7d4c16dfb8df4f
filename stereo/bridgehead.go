package stereo

import "stereoline/notation"

// In/out bridgeheads. In a small bridged bicycle the substituents of the
// two bridgeheads must both point out of the cage: seen from its
// substituent, each bridgehead shows the three bridges turning one way,
// and the other bridgehead shows them turning the other way (picture
// bicyclo[2.2.2]octane along its axis). Marks that make both turn the same
// way put one substituent inside the cage, which only bicycles with long
// bridges can take (in/out isomers; common practice). Bridges of at most
// maxSmallBridge atoms count as small.

const maxSmallBridge = 3

func (l *labeller) checkBridgeheads() {
	g := l.g
	// a bridgehead has three ring bonds
	var heads []int
	for _, a := range sortedKeys(l.cfg.tetra) {
		n := 0
		for _, e := range g.adj[a] {
			if g.ringBond[e.bond] {
				n++
			}
		}
		if n >= 3 {
			heads = append(heads, a)
		}
	}
	for i, a := range heads {
		for _, b := range heads[i+1:] {
			bridges, ok := g.bridges(a, b)
			if !ok {
				continue
			}
			ta, tb := l.cfg.tetra[a], l.cfg.tetra[b]
			if ta == nil || tb == nil {
				continue // already reported with another bridgehead
			}
			wa, oka := bridgeWinding(ta, bridges, 0)
			wb, okb := bridgeWinding(tb, bridges, 1)
			if !oka || !okb || wa != wb {
				continue
			}
			err := l.fail(tb.span, CodeImpossibleCenter, "these marks put a substituent of a bridgehead inside a small bicycle")
			err.Related = append(err.Related, notation.Related{Span: ta.span, Msg: "the other bridgehead"})
			delete(l.cfg.tetra, a)
			delete(l.cfg.tetra, b)
			l.unitAtoms[a], l.unitAtoms[b] = true, true
		}
	}
}

// bridges finds three vertex-disjoint paths between atoms a and b, each
// with one to maxSmallBridge atoms, and returns for each path its first
// atom at a and at b.
func (g *graph) bridges(a, b int) ([3][2]int, bool) {
	var out [3][2]int
	if len(g.adj[a]) < 3 || len(g.adj[b]) < 3 || g.mol.BondBetween(a, b) >= 0 {
		return out, false
	}
	used := map[int]bool{a: true, b: true}
	n := 0
	for _, e := range g.adj[a] {
		if !g.ringBond[e.bond] || used[e.to] {
			continue
		}
		path := g.shortPath(e.to, b, used, maxSmallBridge)
		if path == nil {
			continue
		}
		if n == 3 {
			return out, false
		}
		for _, x := range path {
			used[x] = true
		}
		out[n] = [2]int{path[0], path[len(path)-1]}
		n++
	}
	return out, n == 3
}

// shortPath returns the atoms of a shortest path from s to a neighbour
// of t (t excluded) avoiding blocked atoms, with at most limit atoms.
func (g *graph) shortPath(s, t int, blocked map[int]bool, limit int) []int {
	prev := map[int]int{s: -1}
	queue := []int{s}
	depth := map[int]int{s: 1}
	for len(queue) > 0 {
		u := queue[0]
		queue = queue[1:]
		if g.mol.BondBetween(u, t) >= 0 {
			var path []int
			for x := u; x != -1; x = prev[x] {
				path = append([]int{x}, path...)
			}
			return path
		}
		if depth[u] >= limit {
			continue
		}
		for _, e := range g.adj[u] {
			if _, seen := prev[e.to]; seen || blocked[e.to] || e.to == t {
				continue
			}
			prev[e.to] = u
			depth[e.to] = depth[u] + 1
			queue = append(queue, e.to)
		}
	}
	return nil
}

// bridgeWinding returns the handedness of a bridgehead: the parity of
// its written ligand order against (substituent, bridge 1, 2, 3),
// combined with the written winding.
func bridgeWinding(t *tetraConfig, bridges [3][2]int, side int) (bool, bool) {
	if len(t.ligands) != 4 {
		return false, false
	}
	want := make([]int, 0, 4)
	for _, br := range bridges {
		want = append(want, br[side])
	}
	order := make([]int, 4)
	exo := -1
	for i, x := range t.ligands {
		pos := -1
		for k, w := range want {
			if w == x {
				pos = k + 1
			}
		}
		if pos < 0 {
			if exo >= 0 {
				return false, false
			}
			exo = i
			pos = 0
		}
		order[i] = pos
	}
	if exo < 0 {
		return false, false
	}
	return (inversions(order)%2 == 0) == (t.winding == 1), true
}

// This file implements the sizes both engines draw their lines at, and
// the searches for small bicycles and the bridgeheads their cage fixes.

package ringgeom

import "stereoline/notation"

// MinTransRing is the smallest ring that holds a trans double bond: in
// a ring of fewer atoms a double bond can only be cis (trans-cyclooctene
// is the smallest isolable one; common practice), so marks there say
// nothing and a trans mark is impossible.
const MinTransRing = 8

// MaxSmallBridge is the longest bridge, in atoms, of a small bridged
// bicycle: one whose bridgehead substituents must both point out of the
// cage (bicyclo[2.2.2]octane and smaller; in/out isomers need longer
// bridges; common practice).
const MaxSmallBridge = 3

// MaxFusedPerimeter is the largest fused bicycle (two rings sharing a
// bond) that cannot be trans-fused, counted in atoms round its
// perimeter: bicyclo[2.2.0]hexane, bicyclo[3.1.0]hexane and the smaller
// ones have no trans-fused form (common practice), while
// trans-bicyclo[3.3.0]octane and trans-bicyclo[4.2.0]octane exist. The
// seven-atom cases (bicyclo[3.2.0]heptane, bicyclo[4.1.0]heptane) are
// highly strained when trans; they are left alone rather than called
// impossible, since an error there would be worse than silence.
const MaxFusedPerimeter = 6

// Graph is the part of a molecule the searches read: the molecule in
// its own neighbour order (the stereo order of notation.Atom.Bonds) and
// which bonds lie on rings, with the scratch space of the searches. An
// owner that analyses many molecules keeps its Graph and calls Reset for
// each, so the scratch grows once.
type Graph struct {
	mol  *notation.Molecule
	ring []bool // per bond: lies on a ring

	// mark holds, per atom, the stamp of the search that last touched
	// it, so no table is cleared between searches; stamps keep growing
	// across Reset, so an old mark never matches a new search
	mark, prev, depth []int
	stamp             int
	queue             []int
}

// Reset makes g the view of m with ring bonds ring (indexed by bond),
// keeping the scratch space of earlier molecules.
func (g *Graph) Reset(m *notation.Molecule, ring []bool) { g.mol, g.ring = m, ring }

// Release drops the molecule, keeping the scratch space.
func (g *Graph) Release() { g.mol, g.ring = nil, nil }

// newSearch returns the stamp of a new search, growing the scratch
// space to the molecule on first use.
func (g *Graph) newSearch() int {
	if n := len(g.mol.Atoms); len(g.mark) < n {
		g.mark, g.prev, g.depth = make([]int, n), make([]int, n), make([]int, n)
	}
	g.stamp++
	return g.stamp
}

// neighbour returns the atom bond bi joins to a, or -1 for a bond index
// out of range.
func (g *Graph) neighbour(a, bi int) int {
	if bi < 0 || bi >= len(g.mol.Bonds) {
		return -1
	}
	return g.mol.Bonds[bi].Other(a)
}

// RingBond reports whether bond bi lies on a ring.
func (g *Graph) RingBond(bi int) bool { return bi >= 0 && bi < len(g.ring) && g.ring[bi] }

// RingDegree counts the ring bonds of atom a.
func (g *Graph) RingDegree(a int) (n int) {
	for _, bi := range g.mol.Atoms[a].Bonds {
		if g.RingBond(bi) {
			n++
		}
	}
	return n
}

// PartnerHeads lists the atoms with three or more ring bonds that lie
// within MaxSmallBridge+1 ring bonds of x, in the order a breadth-first
// search meets them: the bridgeheads a small bicycle could pair with x.
func (g *Graph) PartnerHeads(x int) []int {
	seen := g.newSearch()
	g.mark[x], g.depth[x] = seen, 0
	queue := append(g.queue[:0], x)
	defer func() { g.queue = queue[:0] }()
	var out []int
	for head := 0; head < len(queue); head++ {
		u := queue[head]
		if u != x && g.RingDegree(u) >= 3 {
			out = append(out, u)
		}
		if g.depth[u] > MaxSmallBridge {
			continue
		}
		for _, bi := range g.mol.Atoms[u].Bonds {
			if v := g.neighbour(u, bi); g.RingBond(bi) && g.mark[v] != seen {
				g.mark[v], g.depth[v] = seen, g.depth[u]+1
				queue = append(queue, v)
			}
		}
	}
	return out
}

// Bridgeable is the cheap test before BridgePaths: three ring
// neighbours of x must lie within MaxSmallBridge bonds of y by paths
// that avoid x (one search from y instead of three). It never rejects
// a pair BridgePaths accepts.
func (g *Graph) Bridgeable(x, y int) bool {
	seen := g.newSearch()
	g.mark[y], g.depth[y] = seen, 0
	g.mark[x] = seen // never entered
	queue := append(g.queue[:0], y)
	for head := 0; head < len(queue); head++ {
		u := queue[head]
		if g.depth[u] >= MaxSmallBridge {
			continue
		}
		for _, bi := range g.mol.Atoms[u].Bonds {
			if v := g.neighbour(u, bi); v >= 0 && g.mark[v] != seen {
				g.mark[v], g.depth[v] = seen, g.depth[u]+1
				queue = append(queue, v)
			}
		}
	}
	g.queue = queue[:0]
	n := 0
	for _, bi := range g.mol.Atoms[x].Bonds {
		if v := g.neighbour(x, bi); g.RingBond(bi) && v != y && g.mark[v] == seen {
			n++
		}
	}
	return n >= 3
}

// BridgePaths finds the three bridges of a small bridged bicycle with
// bridgeheads a and b (not bonded to each other): three atom-disjoint
// paths, each of one to MaxSmallBridge atoms and leaving a through a
// ring bond, listed from the atom next to a to the atom next to b. Each
// is a shortest path that avoids the bridges found before it, tried
// from a's ring neighbours in neighbour order.
func (g *Graph) BridgePaths(a, b int) ([3][]int, bool) {
	var out [3][]int
	if g.mol.Degree(a) < 3 || g.mol.Degree(b) < 3 || g.mol.BondBetween(a, b) >= 0 {
		return out, false
	}
	blocked := g.newSearch()
	g.mark[a], g.mark[b] = blocked, blocked
	n := 0
	for _, bi := range g.mol.Atoms[a].Bonds {
		s := g.neighbour(a, bi)
		if !g.RingBond(bi) || g.mark[s] == blocked {
			continue
		}
		path := g.shortPath(s, b, blocked, MaxSmallBridge)
		if path == nil {
			continue
		}
		if n == 3 {
			return out, false // a fourth path: more than a bicycle
		}
		for _, x := range path {
			g.mark[x] = blocked
		}
		out[n] = path
		n++
	}
	return out, n == 3
}

// FusedPaths finds the two rings of a small fused bicycle around the
// bond a-b: two atom-disjoint paths from a to b besides the bond itself,
// with at most MaxFusedPerimeter atoms round the outside.
func (g *Graph) FusedPaths(a, b int) ([2][]int, bool) {
	var out [2][]int
	if g.mol.Degree(a) < 3 || g.mol.Degree(b) < 3 || g.mol.BondBetween(a, b) < 0 {
		return out, false
	}
	blocked := g.newSearch()
	g.mark[a], g.mark[b] = blocked, blocked
	n, atoms := 0, 2
	for _, bi := range g.mol.Atoms[a].Bonds {
		s := g.neighbour(a, bi)
		if !g.RingBond(bi) || g.mark[s] == blocked {
			continue
		}
		path := g.shortPath(s, b, blocked, MaxFusedPerimeter-3)
		if path == nil {
			continue
		}
		if n == 2 {
			return out, false // a third path: more than a bicycle
		}
		for _, x := range path {
			g.mark[x] = blocked
		}
		out[n] = path
		n++
		atoms += len(path)
	}
	return out, n == 2 && atoms <= MaxFusedPerimeter
}

// shortPath returns the atoms of a shortest path from s to a neighbour
// of t (t left out), avoiding the atoms marked blocked, with at most
// limit atoms.
func (g *Graph) shortPath(s, t, blocked, limit int) []int {
	seen := g.newSearch()
	g.mark[s], g.prev[s], g.depth[s] = seen, -1, 1
	queue := append(g.queue[:0], s)
	defer func() { g.queue = queue[:0] }()
	for head := 0; head < len(queue); head++ {
		u := queue[head]
		if g.mol.BondBetween(u, t) >= 0 {
			path := make([]int, g.depth[u])
			for x, i := u, g.depth[u]-1; x != -1; x, i = g.prev[x], i-1 {
				path[i] = x
			}
			return path
		}
		if g.depth[u] >= limit {
			continue
		}
		for _, bi := range g.mol.Atoms[u].Bonds {
			v := g.neighbour(u, bi)
			if v < 0 || v == t {
				continue
			}
			if m := g.mark[v]; m == seen || m == blocked {
				continue
			}
			g.mark[v], g.prev[v], g.depth[v] = seen, u, g.depth[u]+1
			queue = append(queue, v)
		}
	}
	return nil
}

// ConfiguredBeside reports whether a configured atom (configured) lies
// on the bridge path or on anything attached to it, searching from the
// bridge without passing the bridgeheads x and y or the atoms of the
// bridge other. A search that runs round into the remaining bridge
// counts it too, which can only keep a mark.
func (g *Graph) ConfiguredBeside(x, y int, other, path []int, configured func(atom int) bool) bool {
	seen := g.newSearch()
	g.mark[x], g.mark[y] = seen, seen
	for _, a := range other {
		g.mark[a] = seen
	}
	queue := g.queue[:0]
	for _, a := range path {
		if g.mark[a] != seen {
			g.mark[a] = seen
			queue = append(queue, a)
		}
	}
	defer func() { g.queue = queue[:0] }()
	for head := 0; head < len(queue); head++ {
		u := queue[head]
		if configured(u) {
			return true
		}
		for _, bi := range g.mol.Atoms[u].Bonds {
			if v := g.neighbour(u, bi); v >= 0 && g.mark[v] != seen {
				g.mark[v] = seen
				queue = append(queue, v)
			}
		}
	}
	return false
}

// CageFixed reports whether bridgehead x of a small bicycle, with
// partner bridgehead y and bridges paths (from BridgePaths; an empty
// path is the direct bond of a fused bicycle and never counts), is
// fixed by its cage: two bridges of the same length whose end atoms are
// pairwise the same (same, the caller's constitutional symmetry), and
// neither carrying a configuration (ConfiguredBeside with configured).
//
// The renaming that swaps two such bridges maps the molecule onto
// itself and reverses the configuration of both bridgeheads at once,
// while reversing one alone would put its substituent inside the cage;
// so a mark at such a bridgehead tells no two compounds apart:
// norbornane has no stereoisomers, and the bridgeheads of a
// 9,10-dihydro-9,10-ethanoanthracene are fixed once its ethano bridge
// is configured (common practice). Camphor's bridgeheads are not: its
// bridges all differ.
func (g *Graph) CageFixed(x, y int, paths [3][]int, same func(a, b int) bool, configured func(atom int) bool) bool {
	for i := 0; i < 3; i++ {
		for j := i + 1; j < 3; j++ {
			pi, pj := paths[i], paths[j]
			if len(pi) == 0 || len(pi) != len(pj) || !same(pi[0], pj[0]) || !same(pi[len(pi)-1], pj[len(pj)-1]) {
				continue
			}
			third := paths[3-i-j]
			if !g.ConfiguredBeside(x, y, third, pi, configured) && !g.ConfiguredBeside(x, y, third, pj, configured) {
				return true
			}
		}
	}
	return false
}

package stereo

import (
	"slices"

	"stereoline/notation"
	"stereoline/stereo/internal/ringgeom"
)

// In/out bridgeheads. In a small bridged bicycle the substituents of the
// two bridgeheads must both point out of the cage: seen from its
// substituent, each bridgehead shows the three bridges turning one way,
// and the other bridgehead shows them turning the other way (picture
// bicyclo[2.2.2]octane along its axis). Marks that make both turn the same
// way put one substituent inside the cage, which only bicycles with long
// bridges can take (in/out isomers; common practice). Bridges of at most
// ringgeom.MaxSmallBridge atoms count as small.


func (l *labeller) checkBridgeheads() {
	// two marked atoms with three ring bonds each, or nothing to check
	heads := 0
	for a := range l.cfg.tetra {
		if ringDegree(l.g, a) >= 3 {
			heads++
		}
	}
	if heads < 2 {
		return
	}
	for _, bc := range l.bicycles() {
		a, b := bc.heads[0], bc.heads[1]
		ta, tb := l.cfg.tetra[a], l.cfg.tetra[b]
		if ta == nil || tb == nil {
			continue // unmarked, or already reported with another bridgehead
		}
		var bridges [3][2]int
		for i, p := range bc.paths {
			if len(p) == 0 {
				// the direct bond of a fused bicycle: each head's bridge
				// begins at the other head
				bridges[i] = [2]int{b, a}
				continue
			}
			bridges[i] = [2]int{p[0], p[len(p)-1]}
		}
		wa, oka := bridgeWinding(ta, bridges, 0)
		wb, okb := bridgeWinding(tb, bridges, 1)
		if !oka || !okb || wa != wb {
			continue
		}
		msg := "these marks put a substituent of a bridgehead inside a small bicycle"
		if len(bc.paths[2]) == 0 {
			msg = "these marks put the bridgehead substituents of a small fused bicycle trans, which it cannot take"
		}
		err := l.fail(tb.span, CodeImpossibleCenter, "%s", msg)
		err.Related = append(err.Related, notation.Related{Span: ta.span, Msg: "the other bridgehead"})
		delete(l.cfg.tetra, a)
		delete(l.cfg.tetra, b)
		l.unitAtoms[a], l.unitAtoms[b] = true, true
	}
}

// bridgeable is the cheap test before bridgePaths: three ring
// neighbours of x must lie within ringgeom.MaxSmallBridge bonds of y by paths
// that avoid x (one search from y instead of three).
func (l *labeller) bridgeable(x, y int) bool {
	g := l.g
	sc := g.bfsMarks()
	sc.stamp++
	seen := sc.stamp
	sc.mark[y], sc.depth[y] = seen, 0
	sc.mark[x] = seen // never entered
	queue := append(sc.queue[:0], y)
	for head := 0; head < len(queue); head++ {
		u := queue[head]
		if sc.depth[u] >= ringgeom.MaxSmallBridge {
			continue
		}
		for _, e := range g.adj[u] {
			if sc.mark[e.to] != seen {
				sc.mark[e.to], sc.depth[e.to] = seen, sc.depth[u]+1
				queue = append(queue, e.to)
			}
		}
	}
	sc.queue = queue[:0]
	n := 0
	for _, e := range g.adj[x] {
		if g.ringBond[e.bond] && e.to != y && sc.mark[e.to] == seen {
			n++
		}
	}
	return n >= 3
}

// bicycle is a small bridged or fused bicycle: its two bridgeheads and
// its three bridges, each from the atom next to heads[0] to the one next
// to heads[1]; in a fused bicycle the third bridge is the bond between
// the heads, and empty.
type bicycle struct {
	heads [2]int
	paths [3][]int
}

// bicycles finds the small bicycles of the molecule once and keeps them:
// both the in/out check and the cage check read them. Pairs of
// bridgeheads come in the order of their first then second atom.
func (l *labeller) bicycles() []bicycle {
	if l.bicyclesFound {
		return l.bicycleList
	}
	l.bicyclesFound = true
	g := l.g
	// a bridgehead that can hold a configuration has four ligands (or
	// three and a lone pair: the nitrogens of Tröger's base), no double
	// bond and three ring bonds; aromatic ring fusions, the most common
	// atoms with three ring bonds, are left out at once
	head := func(a int) bool {
		at := &g.mol.Atoms[a]
		if at.Aromatic || g.doubleBonds(a) > 0 || ringDegree(g, a) < 3 {
			return false
		}
		d := g.degree(a)
		return d == 4 || d == 3 && hasLonePair(at, g.valence(a))
	}
	for x := 0; x < g.n; x++ {
		if !head(x) {
			continue
		}
		near := l.partnerHeads(x)
		slices.Sort(near)
		for _, y := range near {
			if y <= x || !head(y) {
				continue
			}
			if bi := g.mol.BondBetween(x, y); bi >= 0 {
				// a fused bicycle small enough (perimeter at most
				// ringgeom.MaxFusedPerimeter) has a ring of at most 4 atoms
				// through the shared bond: two rings of size r1 <= r2
				// have r1+r2-2 atoms round the outside
				if s := g.ringSize(bi); s == 0 || 2*s-2 > ringgeom.MaxFusedPerimeter {
					continue
				}
				if rings, ok := g.fusedPaths(x, y); ok {
					// the bond between the heads is the third bridge, of no atoms
					l.bicycleList = append(l.bicycleList, bicycle{heads: [2]int{x, y}, paths: [3][]int{rings[0], rings[1], nil}})
				}
				continue
			}
			if !l.bridgeable(x, y) {
				continue
			}
			if paths, ok := g.bridgePaths(x, y); ok {
				l.bicycleList = append(l.bicycleList, bicycle{heads: [2]int{x, y}, paths: paths})
			}
		}
	}
	return l.bicycleList
}

// bridges finds three vertex-disjoint paths between atoms a and b, each
// with one to ringgeom.MaxSmallBridge atoms, and returns for each path its first
// atom at a and at b.
func (g *graph) bridges(a, b int) ([3][2]int, bool) {
	var out [3][2]int
	paths, ok := g.bridgePaths(a, b)
	if !ok {
		return out, false
	}
	for i, p := range paths {
		out[i] = [2]int{p[0], p[len(p)-1]}
	}
	return out, true
}

// bridgePaths is bridges with the whole paths: the atoms of each bridge
// from the one next to a to the one next to b.
func (g *graph) bridgePaths(a, b int) ([3][]int, bool) {
	var out [3][]int
	if len(g.adj[a]) < 3 || len(g.adj[b]) < 3 || g.mol.BondBetween(a, b) >= 0 {
		return out, false
	}
	used := g.bfsMarks()
	used.stamp++
	blocked := used.stamp
	used.mark[a], used.mark[b] = blocked, blocked
	n := 0
	for _, e := range g.adj[a] {
		if !g.ringBond[e.bond] || used.mark[e.to] == blocked {
			continue
		}
		path := g.shortPath(e.to, b, used, blocked, ringgeom.MaxSmallBridge)
		if path == nil {
			continue
		}
		if n == 3 {
			return out, false
		}
		for _, x := range path {
			used.mark[x] = blocked
		}
		out[n] = path
		n++
	}
	return out, n == 3
}


// fusedPaths finds the two rings of a small fused bicycle around the bond
// a-b: two vertex-disjoint paths from a to b besides the bond itself,
// with at most ringgeom.MaxFusedPerimeter atoms round the outside.
func (g *graph) fusedPaths(a, b int) ([2][]int, bool) {
	var out [2][]int
	if len(g.adj[a]) < 3 || len(g.adj[b]) < 3 || g.mol.BondBetween(a, b) < 0 {
		return out, false
	}
	used := g.bfsMarks()
	used.stamp++
	blocked := used.stamp
	used.mark[a], used.mark[b] = blocked, blocked
	n, atoms := 0, 2
	for _, e := range g.adj[a] {
		if !g.ringBond[e.bond] || used.mark[e.to] == blocked {
			continue
		}
		path := g.shortPath(e.to, b, used, blocked, ringgeom.MaxFusedPerimeter-3)
		if path == nil {
			continue
		}
		if n == 2 {
			return out, false // a third path: more than a bicycle
		}
		for _, x := range path {
			used.mark[x] = blocked
		}
		out[n] = path
		n++
		atoms += len(path)
	}
	return out, n == 2 && atoms <= ringgeom.MaxFusedPerimeter
}

// bfsScratch is the state of the small searches of this file, kept in
// the graph: mark holds, per atom, the stamp of the search that last
// touched it, so no table is cleared between searches.
type bfsScratch struct {
	mark, prev, depth []int
	stamp             int
	queue             []int
}

func (g *graph) bfsMarks() *bfsScratch {
	if sc := &g.store.bfs; len(sc.mark) < g.n {
		*sc = bfsScratch{mark: make([]int, g.n), prev: make([]int, g.n), depth: make([]int, g.n), stamp: sc.stamp}
	}
	return &g.store.bfs
}

// shortPath returns the atoms of a shortest path from s to a neighbour
// of t (t excluded) avoiding the atoms whose mark is blocked, with at
// most limit atoms.
func (g *graph) shortPath(s, t int, sc *bfsScratch, blocked, limit int) []int {
	sc.stamp++
	seen := sc.stamp
	sc.mark[s], sc.prev[s], sc.depth[s] = seen, -1, 1
	queue := append(sc.queue[:0], s)
	defer func() { sc.queue = queue[:0] }()
	for head := 0; head < len(queue); head++ {
		u := queue[head]
		if g.mol.BondBetween(u, t) >= 0 {
			path := make([]int, sc.depth[u])
			for x, i := u, sc.depth[u]-1; x != -1; x, i = sc.prev[x], i-1 {
				path[i] = x
			}
			return path
		}
		if sc.depth[u] >= limit {
			continue
		}
		for _, e := range g.adj[u] {
			if m := sc.mark[e.to]; m == seen || m == blocked || e.to == t {
				continue
			}
			sc.mark[e.to], sc.prev[e.to], sc.depth[e.to] = seen, u, sc.depth[u]+1
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

// Bridgeheads fixed by their cage. When two bridges of a small bicycle
// are constitutionally equal and neither carries a configuration, the
// renaming that swaps them maps the molecule onto itself and reverses
// the written configuration of both bridgeheads. Reversing one alone
// would put its substituent inside the cage. So a mark at such a
// bridgehead says nothing, and leaving it out leaves nothing open:
// norbornane has no stereoisomers, and the bridgeheads of a
// 9,10-dihydro-9,10-ethanoanthracene are fixed once the ethano bridge is
// configured (common practice). Camphor's bridgeheads are untouched:
// their bridges all differ.

// checkCages reports the marks on bridgeheads fixed by their cage and
// drops them, so that no other unit reads a configuration from them.
func (l *labeller) checkCages() {
	for _, a := range l.cfg.tetraAtoms() {
		if !l.cageFixed(a) {
			continue
		}
		t := l.cfg.tetra[a]
		l.warn(t.span, CodeIneffectiveCenter, "mark on a bridgehead that its cage fixes: two of its bridges are the same and carry no configuration")
		delete(l.cfg.tetra, a)
		l.unitAtoms[a] = true
	}
}

// cageFixed reports whether atom x is a bridgehead of a small bicycle
// two of whose bridges are constitutionally equal and carry no
// configuration.
func (l *labeller) cageFixed(x int) bool {
	g := l.g
	// the classes are asked only once a bicycle is found: most ring
	// fusions are no bicycle, and their molecules may need no classes.
	// A nitrogen's lone pair is its fourth ligand (the nitrogens of
	// 1,4-diazabicyclo[2.2.1]heptane are fixed like norbornane's CH)
	if ringDegree(g, x) < 3 || g.degree(x) != 4 && !(g.degree(x) == 3 && hasLonePair(&g.mol.Atoms[x], g.valence(x))) {
		return false
	}
	for _, bc := range l.bicycles() {
		if bc.heads[0] != x && bc.heads[1] != x {
			continue
		}
		paths, y := bc.paths, bc.heads[1]
		if y == x {
			y = bc.heads[0]
		}
		for i := 0; i < 3; i++ {
			for j := i + 1; j < 3; j++ {
				pi, pj := paths[i], paths[j]
				if len(pi) == 0 || len(pi) != len(pj) || l.classes.of(pi[0]) != l.classes.of(pj[0]) ||
					l.classes.of(pi[len(pi)-1]) != l.classes.of(pj[len(pj)-1]) {
					continue
				}
				third := paths[3-i-j]
				if !l.configuredBeside(x, y, third, pi) && !l.configuredBeside(x, y, third, pj) {
					return true
				}
			}
		}
	}
	return false
}

// bridgedHead reports whether atom a is a bridgehead of a small bridged
// bicycle (every bridge at least one atom): such an atom cannot turn
// inside out, which holds a nitrogen's configuration (quinuclidine,
// Tröger's base). A ring-fusion atom of a fused bicycle does not count:
// the nitrogen of indolizidine inverts, and with it the ring fusion.
func (l *labeller) bridgedHead(a int) bool {
	for _, bc := range l.bicycles() {
		if (bc.heads[0] == a || bc.heads[1] == a) && len(bc.paths[2]) > 0 {
			return true
		}
	}
	return false
}

// ringDegree counts the ring bonds of a.
func ringDegree(g *graph, a int) (n int) {
	for _, e := range g.adj[a] {
		if g.ringBond[e.bond] {
			n++
		}
	}
	return n
}

// partnerHeads lists the atoms with three or more ring bonds that lie
// within ringgeom.MaxSmallBridge+1 ring bonds of x: the bridgeheads a small
// bicycle could pair with x.
func (l *labeller) partnerHeads(x int) []int {
	g := l.g
	sc := g.bfsMarks()
	sc.stamp++
	seen := sc.stamp
	sc.mark[x], sc.depth[x] = seen, 0
	queue := append(sc.queue[:0], x)
	var out []int
	for head := 0; head < len(queue); head++ {
		u := queue[head]
		if u != x && ringDegree(g, u) >= 3 {
			out = append(out, u)
		}
		if sc.depth[u] > ringgeom.MaxSmallBridge {
			continue
		}
		for _, e := range g.adj[u] {
			if g.ringBond[e.bond] && sc.mark[e.to] != seen {
				sc.mark[e.to], sc.depth[e.to] = seen, sc.depth[u]+1
				queue = append(queue, e.to)
			}
		}
	}
	sc.queue = queue[:0]
	return out
}

// configuredBeside reports whether a configuration lies on the bridge
// path or on anything attached to it, searching from the bridge without
// passing the bridgeheads x and y or the atoms of the other bridge
// given; a search that runs round into other bridges counts them too,
// which can only keep a mark.
func (l *labeller) configuredBeside(x, y int, other, path []int) bool {
	g := l.g
	sc := g.bfsMarks()
	sc.stamp++
	seen := sc.stamp
	sc.mark[x], sc.mark[y] = seen, seen
	for _, a := range other {
		sc.mark[a] = seen
	}
	queue := sc.queue[:0]
	for _, a := range path {
		if sc.mark[a] != seen {
			sc.mark[a] = seen
			queue = append(queue, a)
		}
	}
	defer func() { sc.queue = queue[:0] }()
	for head := 0; head < len(queue); head++ {
		u := queue[head]
		if _, ok := l.cfg.tetra[u]; ok {
			return true
		}
		if _, ok := l.cfg.allene[u]; ok {
			return true
		}
		for _, e := range g.adj[u] {
			if _, ok := l.cfg.bonds[e.bond]; ok {
				return true
			}
			if sc.mark[e.to] != seen {
				sc.mark[e.to] = seen
				queue = append(queue, e.to)
			}
		}
	}
	return false
}

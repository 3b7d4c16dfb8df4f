// This file implements the labeller's view of a molecule: neighbours in
// stereo order, rings and mancude ring systems.

package stereo

import (
	"stereoline/notation"
	"stereoline/stereo/internal/ringgeom"
)

// graph is the stereo engine's read-only view of a molecule: neighbours in
// stereo order with their bond orders, hydrogen counts, ring membership
// and the mancude ring systems the CIP rules treat specially. It is built
// once per Analyze call and shared by every digraph.
type graph struct {
	mol  *notation.Molecule
	n    int
	adj  [][]edge // neighbours in the stereo order of notation.Atom.Bonds
	hyd  []int    // hydrogens that are not atoms of their own
	z    []int
	mass []float64 // mass used by Rule 2

	ringBond []bool // bond lies on a ring
	// block numbers, per bond, the biconnected component (block) of the
	// graph the bond lies in; a bridge is a block of its own. A cycle
	// lies in one block, which lets the digraph look for ring closures
	// only along the part of a path inside the closing bond's block.
	block    []int32
	ringAtom []bool
	mancudeZ []float64 // for an atom of a mancude ring system, the atomic number of its duplicate
	mancudeM []float64 // and the mass of that duplicate, averaged the same way
	// mancudeBond marks the bonds that are double in some Kekulé
	// structure of a mancude ring system, the written one or another
	mancudeBond []bool

	// found on demand (smallestRing, smallRings)
	rings  [][]int // smallest ring through each ring bond, deduplicated
	ringOf [][]int // per bond: the atoms of that smallest ring, nil until searched
	// scratch space of the ring searches
	prev, dist, touched, queue []int
	ringStore                  []int // the rings found, one after another

	// geom is the view the ring and bicycle searches read (bridgehead.go)
	geom *ringgeom.Graph

	store graphStore // storage reused by the next build

	// massByZ caches massFollowsZ: 0 before it is asked, 1 or -1 after
	massByZ int8
}

// edge is one neighbour of an atom.
type edge struct {
	to, bond int
	order    int // Kekulé order 1..4
	cip      int // the order the digraph duplicates (see cipOrder)
}

// cipOrder is the bond order the hierarchical digraph uses. A double bond
// from phosphorus, sulfur, selenium or tellurium to a terminal oxygen,
// sulfur, selenium or tellurium (phosphoryl, sulfinyl, sulfonyl) is
// taken as the single bond of its dipolar form, P+-O-, without duplicate
// atoms: the validation suite of Hanson et al. 2018 ranks sulfinate and
// phosphonate centres that way (VS014, VS038, VS122, VS177).
func cipOrder(g *graph, b *notation.Bond, order int) int {
	if order != 2 {
		return order
	}
	for _, pair := range [2][2]int{{b.Begin, b.End}, {b.End, b.Begin}} {
		c, t := pair[0], pair[1]
		if hypervalentCentre(g.z[c]) && chalcogen(g.z[t]) && len(g.adj[t]) == 1 && g.hyd[t] == 0 {
			return 1
		}
	}
	return order
}

func hypervalentCentre(z int) bool {
	return z == notation.ElemP || z == notation.ElemS || z == notation.ElemSe || z == notation.ElemTe || z == notation.ElemAs
}

func chalcogen(z int) bool {
	return z == notation.ElemO || z == notation.ElemS || z == notation.ElemSe || z == notation.ElemTe
}

func newGraph(m *notation.Molecule) *graph {
	g := &graph{}
	g.build(m)
	return g
}

// build makes g the view of m, reusing the storage an earlier build left
// in g (analyses take their graph from a pool, workspace.go). Every
// per-atom table is a window of a few shared arrays, and every
// neighbour list a window of one array of edges.
func (g *graph) build(m *notation.Molecule) {
	n := len(m.Atoms)
	st := g.store
	*g = graph{mol: m, n: n, store: st, ringStore: st.rings[:0]}
	// tables the loop below writes in full need no clearing first
	g.adj = grown(&g.store.adj, n)
	ints := grown(&g.store.ints, 2*n)
	g.hyd, g.z = ints[:n:n], ints[n:]
	floats := grown(&g.store.floats, 3*n)
	g.mass, g.mancudeZ, g.mancudeM = floats[:n:n], floats[n:2*n:2*n], floats[2*n:]
	clear(floats[n:])
	// every bond gives an edge to each end: one pass less over the atoms
	edges := grown(&g.store.edges, 2*len(m.Bonds))[:0]
	for i := range m.Atoms {
		a := &m.Atoms[i]
		g.z[i] = a.Number
		g.hyd[i] = a.HydrogenCount()
		g.mass[i] = atomMass(a.Number, a.Isotope)
		start := len(edges)
		for _, bi := range a.Bonds {
			if bi < 0 || bi >= len(m.Bonds) {
				continue
			}
			b := &m.Bonds[bi]
			edges = append(edges, edge{to: b.Other(i), bond: bi, order: bondOrder(b)})
		}
		g.adj[i] = edges[start:len(edges):len(edges)]
	}
	// the orders the digraph duplicates need every atom's neighbours
	for i := range edges {
		e := &edges[i]
		e.cip = cipOrder(g, &m.Bonds[e.bond], e.order)
	}
	g.findRings()
	g.findMancude()
	g.geom = &g.store.geom
	g.geom.Reset(m, g.ringBond)
}

// graphStore is the storage of a graph kept for the next build.
type graphStore struct {
	adj     [][]edge
	ints    []int
	floats  []float64
	edges   []edge
	bools   []bool
	scratch []int
	frames  []dfsFrame
	blocks  []int32
	edgeSt  []int32
	rings   []int
	// the labeller's flags by bond and by atom (marks.go, analyze.go)
	marks, unitAtoms []bool
	// symmetry classes (perceive.go)
	class, classNext []uint64
	classInts        []int32
	classNextChanged []int32
	// the ring and bicycle searches, with their scratch space
	geom ringgeom.Graph
}

// sized returns (*buf)[:n], zeroed, growing *buf when it is too small.
func sized[T any](buf *[]T, n int) []T {
	s := grown(buf, n)
	clear(s)
	return s
}

// grown is sized without the zeroing, for tables the caller writes in
// full before reading.
func grown[T any](buf *[]T, n int) []T {
	if cap(*buf) < n {
		*buf = make([]T, n, n+n/4)
	}
	return (*buf)[:n:n]
}

func bondOrder(b *notation.Bond) int {
	if b.Kekule >= 1 && b.Kekule <= 4 {
		return b.Kekule
	}
	switch b.Order {
	case notation.OrderDouble:
		return 2
	case notation.OrderTriple:
		return 3
	case notation.OrderQuadruple:
		return 4
	}
	return 1
}

// degree counts the atoms bonded to a plus its hydrogens.
func (g *graph) degree(a int) int { return len(g.adj[a]) + g.hyd[a] }

// valence is the sum of bond orders plus hydrogens.
func (g *graph) valence(a int) int {
	v := g.hyd[a]
	for _, e := range g.adj[a] {
		v += e.order
	}
	return v
}

// doubleBonds counts the bonds of order 2 or more at a.
func (g *graph) doubleBonds(a int) (n int) {
	for _, e := range g.adj[a] {
		if e.order >= 2 {
			n++
		}
	}
	return n
}

// findRings marks the ring bonds and ring atoms: a bond lies on a ring
// exactly when it is not a bridge of the graph. The smallest ring through
// a bond is searched for only when asked (ringSize, smallestRing): most
// molecules never ask, and a search per ring bond was a good part of the
// time of a whole analysis.
func (g *graph) findRings() {
	m := g.mol
	nb := len(m.Bonds)
	bools := sized(&g.store.bools, 2*nb+g.n)
	g.ringBond, g.mancudeBond, g.ringAtom = bools[:nb:nb], bools[nb:2*nb:2*nb], bools[2*nb:]
	g.cyclicBonds(g.ringBond)
	for bi := range m.Bonds {
		b := &m.Bonds[bi]
		if b.Begin < 0 || b.Begin >= g.n || b.End < 0 || b.End >= g.n || b.Begin == b.End {
			g.ringBond[bi] = false // in no neighbour list, so on no ring
			continue
		}
		if g.ringBond[bi] {
			g.ringAtom[b.Begin], g.ringAtom[b.End] = true, true
		}
	}
}

// ringSize is the number of atoms of the smallest ring through bond bi,
// 0 when the bond lies on none.
func (g *graph) ringSize(bi int) int { return len(g.smallestRing(bi)) }

// smallestRing returns the atoms of the smallest ring through bond bi
// (from its end atom round to its begin atom), nil when the bond lies on
// none. The ring is found by a breadth-first search from one end to the
// other that avoids the bond itself, once per bond, and kept.
func (g *graph) smallestRing(bi int) []int {
	if bi < 0 || bi >= len(g.ringBond) || !g.ringBond[bi] {
		return nil
	}
	if g.ringOf == nil {
		g.ringOf = make([][]int, len(g.ringBond))
	}
	if r := g.ringOf[bi]; r != nil {
		return r
	}
	if g.prev == nil {
		scratch := make([]int, 2*g.n)
		g.prev, g.dist = scratch[:g.n:g.n], scratch[g.n:]
		for i := range g.dist {
			g.dist[i] = -1
		}
	}
	prev, dist := g.prev, g.dist
	b := &g.mol.Bonds[bi]
	src, dst := b.Begin, b.End
	touched := append(g.touched[:0], src)
	queue := append(g.queue[:0], src)
	dist[src] = 0
	found := false
	for head := 0; head < len(queue) && !found; head++ {
		u := queue[head]
		for _, e := range g.adj[u] {
			if int(e.bond) == bi || dist[e.to] >= 0 || !g.ringBond[e.bond] {
				continue
			}
			dist[e.to] = dist[u] + 1
			touched = append(touched, int(e.to))
			prev[e.to] = u
			if int(e.to) == dst {
				found = true
				break
			}
			queue = append(queue, int(e.to))
		}
	}
	var ring []int
	if found {
		// the rings are windows of one array, capped so that appending
		// to one cannot overwrite the next; a full array is replaced,
		// leaving the rings already handed out in the old one
		size := dist[dst] + 1
		if len(g.ringStore)+size > cap(g.ringStore) {
			g.ringStore = make([]int, 0, max(6*len(g.ringBond), 2*cap(g.ringStore), size))
			g.store.rings = g.ringStore
		}
		start := len(g.ringStore)
		g.ringStore = append(g.ringStore, dst)
		for v := dst; v != src; {
			v = prev[v]
			g.ringStore = append(g.ringStore, v)
		}
		ring = g.ringStore[start:len(g.ringStore):len(g.ringStore)]
	}
	for _, i := range touched {
		dist[i] = -1
	}
	g.touched, g.queue = touched[:0], queue[:0]
	if ring == nil {
		// cannot happen for a bond that is no bridge; kept empty
		ring = []int{}
	}
	g.ringOf[bi] = ring
	return ring
}

// smallRings returns the smallest ring through each ring bond, each ring
// once, in the order of the bonds.
func (g *graph) smallRings() [][]int {
	if g.rings != nil {
		return g.rings
	}
	g.rings = [][]int{}
	seen := map[uint64]bool{}
	for bi := range g.ringBond {
		ring := g.smallestRing(bi)
		if len(ring) == 0 {
			continue
		}
		if key := ringKey(ring); !seen[key] {
			seen[key] = true
			g.rings = append(g.rings, ring)
		}
	}
	return g.rings
}

// dfsFrame is one atom on the stack of the bridge search.
type dfsFrame struct{ v, viaBond, next int }

// cyclicBonds marks the bonds that lie on some cycle, every bond that is
// not a bridge of the graph, and numbers the blocks of the graph in
// g.block (depth-first search with low links and a stack of bonds,
// written with an explicit stack so that long chains cannot exhaust it).
func (g *graph) cyclicBonds(cyclic []bool) {
	for i := range cyclic {
		cyclic[i] = true
	}
	g.block = grown(&g.store.blocks, len(cyclic))
	for i := range g.block {
		g.block[i] = -1
	}
	scratch := sized(&g.store.scratch, 2*g.n)
	order, low := scratch[:g.n], scratch[g.n:]
	for i := range order {
		order[i] = -1
	}
	stack := g.store.frames[:0]
	bonds := g.store.edgeSt[:0]
	defer func() { g.store.frames, g.store.edgeSt = stack[:0], bonds[:0] }()
	counter, blocks := 0, int32(0)
	for s := 0; s < g.n; s++ {
		if order[s] >= 0 {
			continue
		}
		stack = append(stack[:0], dfsFrame{s, -1, 0})
		order[s], low[s] = counter, counter
		counter++
		for len(stack) > 0 {
			f := &stack[len(stack)-1]
			if f.next < len(g.adj[f.v]) {
				e := g.adj[f.v][f.next]
				f.next++
				if e.bond == f.viaBond {
					continue
				}
				if order[e.to] < 0 {
					order[e.to], low[e.to] = counter, counter
					counter++
					bonds = append(bonds, int32(e.bond))
					stack = append(stack, dfsFrame{e.to, e.bond, 0})
				} else if order[e.to] < order[f.v] {
					// a bond back up the tree, met from its lower end
					// only (from the upper end it is already stacked)
					bonds = append(bonds, int32(e.bond))
					if order[e.to] < low[f.v] {
						low[f.v] = order[e.to]
					}
				}
				continue
			}
			stack = stack[:len(stack)-1]
			if len(stack) > 0 {
				p := &stack[len(stack)-1]
				if low[f.v] < low[p.v] {
					low[p.v] = low[f.v]
				}
				if low[f.v] > order[p.v] && f.viaBond >= 0 {
					cyclic[f.viaBond] = false
				}
				if low[f.v] >= order[p.v] {
					// p separates the bonds stacked since f.viaBond
					// from the rest: they make one block
					for len(bonds) > 0 {
						b := bonds[len(bonds)-1]
						bonds = bonds[:len(bonds)-1]
						g.block[b] = blocks
						if int(b) == f.viaBond {
							break
						}
					}
					blocks++
				}
			}
		}
	}
}

// ringKey names a ring by a 64-bit hash of its set of atoms: the sum
// of a mixed value of each atom (ringgeom.Mix64), which does not depend
// on the order the search found them in, so no sorted copy is needed.
// Two different rings would need a 64-bit collision to share a key.
func ringKey(ring []int) uint64 {
	h := uint64(len(ring))
	for _, v := range ring {
		h += ringgeom.Mix64(uint64(v))
	}
	return h
}

// findMancude finds the atoms of mancude rings and ring systems (the
// most non-cumulative double bonds, aromatic or not, written in any
// Kekulé form) and gives each the duplicate P-92.1.4.4 asks for: the
// average of the atomic numbers (and masses) of the atoms it is double
// bonded to across the Kekulé structures. The written Kekulé structure is
// a matching of the double-bonded atoms; another structure can pair atom
// a with a ring neighbour v exactly when the bond a-v closes a cycle
// whose bonds alternate between the matching and the rest, so each
// candidate bond is tested with a search for such a cycle. This also
// finds perimeter systems that no smallest ring describes (the
// fourteen-atom perimeter of an azaphenalene dimer, VS215 of the suite).
func (g *graph) findMancude() {
	scratch := sized(&g.store.scratch, 2*g.n)
	partner, seen := scratch[:g.n], scratch[g.n:]
	for a := 0; a < g.n; a++ {
		partner[a] = -1
		dbl := 0
		for _, e := range g.adj[a] {
			if e.order >= 2 {
				dbl++
				if e.order == 2 && g.ringBond[e.bond] {
					partner[a] = e.to
				}
			}
		}
		if dbl != 1 {
			partner[a] = -1
		}
	}
	for a := 0; a < g.n; a++ {
		if partner[a] >= 0 && partner[partner[a]] != a {
			partner[a] = -1
		}
	}
	stamp := 0
	var queue []int
	for a := 0; a < g.n; a++ {
		if partner[a] < 0 {
			continue
		}
		zs, ms := float64(g.z[partner[a]]), g.mass[partner[a]]
		count := 1
		for _, e := range g.adj[a] {
			v := e.to
			if v == partner[a] || partner[v] < 0 || !g.ringBond[e.bond] || e.order != 1 {
				continue
			}
			stamp++
			var found bool
			if found, queue = g.alternatingCycle(a, v, partner, seen, stamp, queue); found {
				g.mancudeBond[e.bond] = true
				zs += float64(g.z[v])
				ms += g.mass[v]
				count++
			}
		}
		if count > 1 {
			for _, e := range g.adj[a] {
				if e.to == partner[a] {
					g.mancudeBond[e.bond] = true
				}
			}
			g.mancudeZ[a] = zs / float64(count)
			g.mancudeM[a] = ms / float64(count)
		}
	}
}

// alternatingCycle reports whether the single bond a-v lies on a cycle
// alternating between matched (double) and unmatched ring bonds:
// a - v = partner(v) - ... - partner(a) = a. queue is scratch space,
// returned for the next call.
func (g *graph) alternatingCycle(a, v int, partner, seen []int, stamp int, queue []int) (bool, []int) {
	target := partner[a]
	queue = append(queue[:0], partner[v])
	seen[v], seen[partner[v]], seen[a] = stamp, stamp, stamp
	for head := 0; head < len(queue); head++ {
		x := queue[head]
		for _, e := range g.adj[x] {
			y := e.to
			if e.order != 1 || !g.ringBond[e.bond] || partner[y] < 0 || seen[y] == stamp {
				continue
			}
			if y == target {
				return true, queue
			}
			seen[y] = stamp
			if w := partner[y]; seen[w] != stamp {
				seen[w] = stamp
				queue = append(queue, w)
			}
		}
	}
	return false, queue
}

// massFollowsZ reports whether every node a digraph of this molecule
// can hold has a mass fixed by its atomic number: no written isotope
// gives an atom a mass apart from its element's, and the averaged
// duplicates of mancude rings agree too. Lone pairs and phantom atoms
// have zero for both. Then Rule 2 cannot split branches that Rule 1a
// left tied (rules.go, canSplit). Worked out on first use and kept.
func (g *graph) massFollowsZ() bool {
	if g.massByZ == 0 {
		g.massByZ = -1
		if g.massesAgree() {
			g.massByZ = 1
		}
	}
	return g.massByZ > 0
}

func (g *graph) massesAgree() bool {
	seen := map[float64]float64{0: 0, 1: atomMass(1, 0)}
	agree := func(z, mass float64) bool {
		if m, ok := seen[z]; ok {
			return m == mass
		}
		seen[z] = mass
		return true
	}
	for a := 0; a < g.n; a++ {
		if !agree(float64(g.z[a]), g.mass[a]) {
			return false
		}
		if g.mancudeZ[a] > 0 && !agree(g.mancudeZ[a], g.mancudeM[a]) {
			return false
		}
	}
	return true
}

// inMancude reports whether the bond joins two atoms of one mancude
// system, so that its duplicate atoms take averaged atomic numbers.
func (g *graph) inMancude(a, b int) bool {
	return g.mancudeZ[a] > 0
}

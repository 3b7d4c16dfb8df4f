package notation

import (
	"sort"
	"strconv"
	"strings"
)

// Ring is one cycle of the molecule graph. Atoms are in cycle order and
// Bonds[i] joins Atoms[i] to Atoms[(i+1)%len(Atoms)].
type Ring struct {
	Atoms []int
	Bonds []int
}

// Size returns the number of atoms (equally, bonds) in the ring.
func (r Ring) Size() int { return len(r.Atoms) }

// Rings is what FindRings learns about the cycles of a molecule. It is a
// value of its own: the molecule is not changed.
type Rings struct {
	// AtomSize and BondSize give, for each atom and bond, the size of the
	// smallest ring it belongs to, or 0 when it is in no ring.
	AtomSize []int
	BondSize []int

	// SSSR is a smallest set of smallest rings: a minimum cycle basis of
	// the graph, sorted by size. Its length is Expected unless
	// Approximate is set.
	SSSR []Ring

	// Expected is the cyclomatic number bonds - atoms + components,
	// counted over the whole graph (components by connectivity, so a ring
	// closure across a dot joins two parts).
	Expected int

	// Approximate is set when a search budget was exhausted in a very
	// large fused ring system: some sizes are then upper bounds (the atom
	// count of the ring system) and SSSR may hold fewer than Expected
	// rings or rings that are not the smallest possible.
	Approximate bool
}

// AtomInRing reports whether atom a belongs to at least one ring.
func (r *Rings) AtomInRing(a int) bool { return a >= 0 && a < len(r.AtomSize) && r.AtomSize[a] > 0 }

// BondInRing reports whether bond b belongs to at least one ring.
func (r *Rings) BondInRing(b int) bool { return b >= 0 && b < len(r.BondSize) && r.BondSize[b] > 0 }

// Search budgets. They keep the cost linear in the size of the record:
// a ring search never visits more than ringSearchLimit atoms, the exact
// basis construction runs only on ring systems of at most
// hortonAtomLimit atoms, and the GF(2) elimination in one ring system
// does at most eliminationBudget units of work.
const (
	ringSearchLimit   = 4096
	hortonAtomLimit   = 128
	eliminationBudget = 1 << 24
)

// FindRings computes ring membership, smallest ring sizes and a smallest
// set of smallest rings.
//
// Cost: finding the ring systems (biconnected blocks) is linear in atoms
// plus bonds. A block that is a single cycle is handled in linear time.
// In other blocks every bond gets one breadth-first search from one end to
// the other, stopped at ringSearchLimit atoms, so the cost is
// O(bonds * min(block size, ringSearchLimit)); in molecules with ordinary
// rings each search ends after a few dozen atoms. Blocks of up to
// hortonAtomLimit atoms also get Horton's candidate set (one search per
// atom, O(atoms * bonds) for the block), which makes their basis exact.
// In larger blocks each basis ring is a shortest ring through one of its
// bonds; that is the usual smallest set for fused systems (a ladder, a
// sheet) but not guaranteed for every graph. Chains and the acyclic parts
// of a polymer cost one visit per atom and bond.
func FindRings(m *Molecule) *Rings {
	g := newRingGraph(m)
	r := &Rings{
		AtomSize: make([]int, len(m.Atoms)),
		BondSize: make([]int, len(m.Bonds)),
	}
	blocks, components := g.blocks()
	r.Expected = g.edges - len(m.Atoms) + components
	s := &ringSearch{g: g, stamp: make([]int, len(m.Atoms)), via: make([]int, len(m.Atoms))}
	for _, blk := range blocks {
		if len(blk) < 2 {
			continue // a bridge
		}
		s.block(r, blk)
	}
	for b, size := range r.BondSize {
		if size == 0 {
			continue
		}
		for _, a := range [2]int{m.Bonds[b].Begin, m.Bonds[b].End} {
			if r.AtomSize[a] == 0 || size < r.AtomSize[a] {
				r.AtomSize[a] = size
			}
		}
	}
	sort.SliceStable(r.SSSR, func(i, j int) bool { return r.SSSR[i].Size() < r.SSSR[j].Size() })
	return r
}

// ringGraph is the molecule as compact adjacency lists: the neighbours
// of atom a are adj[start[a]:start[a+1]]. Bonds with an end out of range
// or joining an atom to itself are left out.
type ringGraph struct {
	m     *Molecule
	start []int
	adj   []ringArc
	edges int
	block []int // block index of each bond, -1 when left out
}

type ringArc struct{ bond, atom int }

func newRingGraph(m *Molecule) *ringGraph {
	n := len(m.Atoms)
	g := &ringGraph{m: m, start: make([]int, n+1), block: make([]int, len(m.Bonds))}
	usable := func(b *Bond) bool {
		return b.Begin >= 0 && b.Begin < n && b.End >= 0 && b.End < n && b.Begin != b.End
	}
	for i := range m.Bonds {
		g.block[i] = -1
		if b := &m.Bonds[i]; usable(b) {
			g.start[b.Begin+1]++
			g.start[b.End+1]++
			g.edges++
		}
	}
	for a := 0; a < n; a++ {
		g.start[a+1] += g.start[a]
	}
	g.adj = make([]ringArc, g.start[n])
	fill := append([]int(nil), g.start[:n]...)
	for i := range m.Bonds {
		if b := &m.Bonds[i]; usable(b) {
			g.adj[fill[b.Begin]] = ringArc{i, b.End}
			fill[b.Begin]++
			g.adj[fill[b.End]] = ringArc{i, b.Begin}
			fill[b.End]++
		}
	}
	return g
}

func (g *ringGraph) arcs(a int) []ringArc { return g.adj[g.start[a]:g.start[a+1]] }

// blocks splits the bonds into biconnected blocks (Tarjan's algorithm,
// iterative so that a long chain cannot exhaust the stack) and counts the
// connected components. Every ring lies inside one block.
func (g *ringGraph) blocks() ([][]int, int) {
	n := len(g.m.Atoms)
	disc := make([]int, n)
	low := make([]int, n)
	for i := range disc {
		disc[i] = -1
	}
	type frame struct{ atom, parentBond, next int }
	var stack []frame
	var edgeStack []int
	var blocks [][]int
	// the blocks' bonds one after another in one array: each bond is in
	// at most one block, so it never grows
	all := make([]int, 0, len(g.m.Bonds))
	clock, components := 0, 0
	for root := 0; root < n; root++ {
		if disc[root] >= 0 {
			continue
		}
		components++
		disc[root], low[root] = clock, clock
		clock++
		stack = append(stack[:0], frame{root, -1, 0})
		for len(stack) > 0 {
			f := &stack[len(stack)-1]
			arcs := g.arcs(f.atom)
			if f.next < len(arcs) {
				arc := arcs[f.next]
				f.next++
				if arc.bond == f.parentBond {
					continue
				}
				w := arc.atom
				if disc[w] < 0 {
					edgeStack = append(edgeStack, arc.bond)
					disc[w], low[w] = clock, clock
					clock++
					stack = append(stack, frame{w, arc.bond, 0})
				} else if disc[w] < disc[f.atom] {
					edgeStack = append(edgeStack, arc.bond)
					if disc[w] < low[f.atom] {
						low[f.atom] = disc[w]
					}
				}
				continue
			}
			done := *f
			stack = stack[:len(stack)-1]
			if len(stack) == 0 {
				break
			}
			p := stack[len(stack)-1].atom
			if low[done.atom] < low[p] {
				low[p] = low[done.atom]
			}
			if low[done.atom] >= disc[p] {
				first := len(all)
				for {
					b := edgeStack[len(edgeStack)-1]
					edgeStack = edgeStack[:len(edgeStack)-1]
					all = append(all, b)
					g.block[b] = len(blocks)
					if b == done.parentBond {
						break
					}
				}
				blocks = append(blocks, all[first:len(all):len(all)])
			}
		}
	}
	return blocks, components
}

// ringSearch holds the scratch arrays reused by every search, so that
// the many small searches of a large record allocate nothing per atom.
type ringSearch struct {
	g      *ringGraph
	stamp  []int // stamp[a] == round when atom a was reached in this round
	via    []int // bond by which atom a was reached
	dist   []int
	branch []int // child of the root under which each atom hangs (Horton)
	round  int
	queue  []int
	local  []int // position of each bond in its block, for ring masks
}

// block finds the ring sizes and basis rings of one biconnected block.
func (s *ringSearch) block(r *Rings, blk []int) {
	sort.Ints(blk)
	atoms := s.blockAtoms(blk)
	if len(blk) == len(atoms) {
		ring := s.walkCycle(blk, atoms[0])
		for _, b := range blk {
			r.BondSize[b] = len(blk)
		}
		r.SSSR = append(r.SSSR, ring)
		return
	}
	pool := s.newRingPool(blk)
	for _, b := range blk {
		ring, ok := s.shortestThrough(b)
		if !ok {
			r.Approximate = true
			r.BondSize[b] = len(atoms)
			continue
		}
		r.BondSize[b] = ring.Size()
		pool.add(ring)
	}
	if len(atoms) <= hortonAtomLimit {
		for _, a := range atoms {
			s.hortonFrom(a, blk, pool)
		}
	}
	want := len(blk) - len(atoms) + 1
	basis, exact := selectBasis(pool.rings, blk, want)
	if len(basis) < want {
		// The searches gave up somewhere: complete the basis with the
		// fundamental cycles of a spanning tree, which always span the
		// cycle space, so that the count is right even if the rings are
		// not all the smallest.
		s.fundamentalCycles(blk, atoms[0], pool)
		basis, exact = selectBasis(pool.rings, blk, want)
	}
	if !exact || len(basis) < want {
		r.Approximate = true
	}
	r.SSSR = append(r.SSSR, basis...)
}

// fundamentalCycles adds to the pool, for every bond of the block outside
// a breadth-first spanning tree rooted at root, the cycle the bond closes
// in the tree. Their total length is bounded by eliminationBudget.
func (s *ringSearch) fundamentalCycles(blk []int, root int, pool *ringPool) {
	g := s.g
	id := g.block[blk[0]]
	s.round++
	if len(s.dist) < len(s.stamp) {
		s.dist = make([]int, len(s.stamp))
		s.branch = make([]int, len(s.stamp))
	}
	s.stamp[root], s.via[root], s.dist[root] = s.round, -1, 0
	s.queue = append(s.queue[:0], root)
	for head := 0; head < len(s.queue); head++ {
		a := s.queue[head]
		for _, arc := range g.arcs(a) {
			if g.block[arc.bond] != id || s.stamp[arc.atom] == s.round {
				continue
			}
			s.stamp[arc.atom] = s.round
			s.via[arc.atom] = arc.bond
			s.dist[arc.atom] = s.dist[a] + 1
			s.queue = append(s.queue, arc.atom)
		}
	}
	work := 0
	for _, b := range blk {
		bond := &g.m.Bonds[b]
		y, z := bond.Begin, bond.End
		if s.via[y] == b || s.via[z] == b {
			continue
		}
		// climb from both ends to their lowest common ancestor; the ring
		// runs from it down to z, across the bond to y, and back up.
		var left, right Ring
		for y != z {
			if s.dist[y] >= s.dist[z] {
				left.Atoms = append(left.Atoms, y)
				left.Bonds = append(left.Bonds, s.via[y])
				y = g.m.Bonds[s.via[y]].Other(y)
			} else {
				right.Atoms = append(right.Atoms, z)
				right.Bonds = append(right.Bonds, s.via[z])
				z = g.m.Bonds[s.via[z]].Other(z)
			}
		}
		reverseInts(right.Atoms)
		reverseInts(right.Bonds)
		ring := Ring{
			Atoms: append(append([]int{y}, right.Atoms...), left.Atoms...),
			Bonds: append(append(right.Bonds, b), left.Bonds...),
		}
		work += ring.Size()
		if work > eliminationBudget {
			return
		}
		pool.add(ring)
	}
}

// blockAtoms lists the atoms touched by the bonds of a block.
func (s *ringSearch) blockAtoms(blk []int) []int {
	s.round++
	var atoms []int
	for _, b := range blk {
		bond := &s.g.m.Bonds[b]
		for _, a := range [2]int{bond.Begin, bond.End} {
			if s.stamp[a] != s.round {
				s.stamp[a] = s.round
				atoms = append(atoms, a)
			}
		}
	}
	sort.Ints(atoms)
	return atoms
}

// walkCycle follows a block that is one simple cycle, starting at atom
// first.
func (s *ringSearch) walkCycle(blk []int, first int) Ring {
	g := s.g
	id := g.block[blk[0]]
	ring := Ring{Atoms: make([]int, 0, len(blk)), Bonds: make([]int, 0, len(blk))}
	at, came := first, -1
	for len(ring.Bonds) < len(blk) {
		next := -1
		for _, arc := range g.arcs(at) {
			if g.block[arc.bond] == id && arc.bond != came {
				next = arc.bond
				ring.Atoms = append(ring.Atoms, at)
				ring.Bonds = append(ring.Bonds, arc.bond)
				at, came = arc.atom, arc.bond
				break
			}
		}
		if next < 0 {
			break // cannot happen in a cycle block; stop rather than loop
		}
	}
	return ring
}

// shortestThrough finds the smallest ring through bond b: a
// breadth-first search from one end to the other that does not use b and
// stays inside b's block. It reports false when the search budget ran out.
func (s *ringSearch) shortestThrough(b int) (Ring, bool) {
	g := s.g
	bond := &g.m.Bonds[b]
	id := g.block[b]
	from, to := bond.Begin, bond.End
	s.round++
	s.stamp[from] = s.round
	s.via[from] = -1
	s.queue = append(s.queue[:0], from)
	for head := 0; head < len(s.queue); head++ {
		if len(s.queue) > ringSearchLimit {
			return Ring{}, false
		}
		a := s.queue[head]
		for _, arc := range g.arcs(a) {
			if arc.bond == b || g.block[arc.bond] != id || s.stamp[arc.atom] == s.round {
				continue
			}
			s.stamp[arc.atom] = s.round
			s.via[arc.atom] = arc.bond
			if arc.atom == to {
				return s.pathRing(from, to, b), true
			}
			s.queue = append(s.queue, arc.atom)
		}
	}
	return Ring{}, false
}

// pathRing turns the search tree path from..to plus the closing bond
// into a ring.
func (s *ringSearch) pathRing(from, to, closing int) Ring {
	size := 1
	for a := to; a != from; a = s.g.m.Bonds[s.via[a]].Other(a) {
		size++
	}
	ring := Ring{Atoms: make([]int, 0, size), Bonds: make([]int, 0, size)}
	for a := to; a != from; {
		b := s.via[a]
		ring.Atoms = append(ring.Atoms, a)
		ring.Bonds = append(ring.Bonds, b)
		a = s.g.m.Bonds[b].Other(a)
	}
	ring.Atoms = append(ring.Atoms, from)
	ring.Bonds = append(ring.Bonds, closing)
	return ring
}

// hortonFrom adds Horton's candidates rooted at atom x: for every bond
// y-z outside the breadth-first tree of x, the tree path x..y, the bond,
// and the tree path z..x, when the two paths meet only at x. By Horton's
// theorem these candidates contain a minimum cycle basis.
func (s *ringSearch) hortonFrom(x int, blk []int, pool *ringPool) {
	g := s.g
	id := g.block[blk[0]]
	s.round++
	if len(s.dist) < len(s.stamp) {
		s.dist = make([]int, len(s.stamp))
		s.branch = make([]int, len(s.stamp))
	}
	branch := s.branch
	s.stamp[x], s.via[x], s.dist[x] = s.round, -1, 0
	branch[x] = x
	s.queue = append(s.queue[:0], x)
	for head := 0; head < len(s.queue); head++ {
		a := s.queue[head]
		for _, arc := range g.arcs(a) {
			if g.block[arc.bond] != id || s.stamp[arc.atom] == s.round {
				continue
			}
			s.stamp[arc.atom] = s.round
			s.via[arc.atom] = arc.bond
			s.dist[arc.atom] = s.dist[a] + 1
			if a == x {
				branch[arc.atom] = arc.atom
			} else {
				branch[arc.atom] = branch[a]
			}
			s.queue = append(s.queue, arc.atom)
		}
	}
	for _, b := range blk {
		bond := &g.m.Bonds[b]
		y, z := bond.Begin, bond.End
		if s.via[y] == b || s.via[z] == b || branch[y] == branch[z] {
			continue
		}
		if pool.small {
			// the candidate's bonds as a mask first: most candidates
			// are rings found before, and need not be built
			mask := uint64(1) << pool.local[b]
			for _, end := range [2]int{y, z} {
				for a := end; a != x; {
					mask |= 1 << pool.local[s.via[a]]
					a = g.m.Bonds[s.via[a]].Other(a)
				}
			}
			if _, ok := pool.masks[mask]; ok {
				continue
			}
			pool.masks[mask] = struct{}{}
			pool.rings = append(pool.rings, s.hortonRing(x, y, z, b))
			continue
		}
		pool.add(s.hortonRing(x, y, z, b))
	}
}

// hortonRing is the candidate of hortonFrom for bond b = y-z: the tree
// path x..y, the bond, and the tree path z..x.
func (s *ringSearch) hortonRing(x, y, z, b int) Ring {
	g := s.g
	var ring Ring
	for a := y; a != x; { // x..y, collected backwards then reversed
		ring.Atoms = append(ring.Atoms, a)
		ring.Bonds = append(ring.Bonds, s.via[a])
		a = g.m.Bonds[s.via[a]].Other(a)
	}
	ring.Atoms = append(ring.Atoms, x)
	reverseInts(ring.Atoms)
	reverseInts(ring.Bonds)
	ring.Bonds = append(ring.Bonds, b)
	for a := z; a != x; {
		ring.Atoms = append(ring.Atoms, a)
		ring.Bonds = append(ring.Bonds, s.via[a])
		a = g.m.Bonds[s.via[a]].Other(a)
	}
	return ring
}

func reverseInts(s []int) {
	for i, j := 0, len(s)-1; i < j; i, j = i+1, j-1 {
		s[i], s[j] = s[j], s[i]
	}
}

// ringPool collects candidate rings without duplicates (two candidates
// are the same ring when they have the same bonds). In a block of at most
// 64 bonds a ring's bonds are a mask of their positions in the block.
type ringPool struct {
	seen  map[string]bool
	small bool
	masks map[uint64]struct{}
	local []int // bond -> position in the block, when small
	rings []Ring
}

func (s *ringSearch) newRingPool(blk []int) *ringPool {
	if len(blk) > 64 {
		return &ringPool{seen: make(map[string]bool)}
	}
	if len(s.local) < len(s.g.m.Bonds) {
		s.local = make([]int, len(s.g.m.Bonds))
	}
	for i, b := range blk {
		s.local[b] = i
	}
	return &ringPool{small: true, masks: make(map[uint64]struct{}), local: s.local}
}

func (p *ringPool) add(r Ring) {
	if p.small {
		var mask uint64
		for _, b := range r.Bonds {
			mask |= 1 << p.local[b]
		}
		if _, ok := p.masks[mask]; ok {
			return
		}
		p.masks[mask] = struct{}{}
		p.rings = append(p.rings, r)
		return
	}
	key := ringKey(r)
	if p.seen[key] {
		return
	}
	p.seen[key] = true
	p.rings = append(p.rings, r)
}

func ringKey(r Ring) string {
	bonds := append([]int(nil), r.Bonds...)
	sort.Ints(bonds)
	var sb strings.Builder
	for _, b := range bonds {
		sb.WriteString(strconv.Itoa(b))
		sb.WriteByte(',')
	}
	return sb.String()
}

// selectBasis picks, smallest first, candidates that are independent of
// those already picked (over GF(2), a ring being the set of its bonds),
// until want rings are picked. By the matroid greedy argument this gives
// a minimum basis when the candidates contain one. It reports false when
// the elimination budget ran out; the rings picked until then are still
// independent.
func selectBasis(cands []Ring, blk []int, want int) ([]Ring, bool) {
	sort.SliceStable(cands, func(i, j int) bool { return cands[i].Size() < cands[j].Size() })
	local := make(map[int]int32, len(blk))
	for i, b := range blk {
		local[b] = int32(i)
	}
	pivots := make(map[int32][]int32) // reduced vectors by their highest bond
	var basis []Ring
	work := 0
	for _, c := range cands {
		if len(basis) == want {
			break
		}
		v := make([]int32, len(c.Bonds))
		for i, b := range c.Bonds {
			v[i] = local[b]
		}
		sort.Slice(v, func(i, j int) bool { return v[i] < v[j] })
		for len(v) > 0 {
			p, ok := pivots[v[len(v)-1]]
			if !ok {
				break
			}
			work += len(v) + len(p)
			if work > eliminationBudget {
				return basis, false
			}
			v = xorSorted(v, p)
		}
		if len(v) == 0 {
			continue
		}
		pivots[v[len(v)-1]] = v
		basis = append(basis, c)
	}
	return basis, true
}

// xorSorted returns the symmetric difference of two ascending lists.
func xorSorted(a, b []int32) []int32 {
	out := make([]int32, 0, len(a)+len(b))
	i, j := 0, 0
	for i < len(a) && j < len(b) {
		switch {
		case a[i] < b[j]:
			out = append(out, a[i])
			i++
		case a[i] > b[j]:
			out = append(out, b[j])
			j++
		default:
			i++
			j++
		}
	}
	out = append(out, a[i:]...)
	return append(out, b[j:]...)
}

// This file implements the canonical search behind the identity key.

package identity

import (
	"encoding/binary"
	"slices"
	"sync"

	"stereoline/stereo"
	"stereoline/stereo/internal/ringgeom"
)

// The canonical form behind the identity key. It is built in four steps.
//
//  1. Invariants. Every atom starts with a class from what it is on its
//     own: reaction role, atomic number, isotope, charge, aromaticity,
//     hydrogen count and number of neighbours. Plain [H] atoms are folded
//     into their neighbour's hydrogen count first, so C and C[H] agree,
//     and rings written in Kekulé form count as aromatic
//     (aromatic.go), so C1=CC=CC=C1 and c1ccccc1 agree.
//  2. Refinement. Classes are refined until stable (the partition
//     refinement of Weininger's CANON, common practice): an atom's new
//     class is its old class followed by the sorted list of
//     (neighbour class, bond order) pairs. Old order is kept, so a
//     refinement only splits classes.
//  3. Stereo. Each marked unit is expressed on the ranks: a tetrahedral
//     centre as the handedness of its ligands taken in rank order (+1
//     when, seen from the lowest ranked ligand, the other three in
//     ascending rank turn anticlockwise), a double bond as whether the
//     highest ranked substituents of its two ends are trans, an allene
//     as the handedness of its four substituents taken end by end, the
//     higher ranked of each end first. A unit whose ligands tie has no
//     parity yet. The parities join the atom invariants and the ranks are
//     refined again; this repeats until nothing changes, so ligands that
//     differ only by configuration (the two branches at a
//     pseudoasymmetric centre) are told apart.
//  4. Tie-breaking. While a class holds several atoms (symmetry), the
//     lowest such class is split by moving one of its atoms ahead, and
//     steps 2 and 3 run again. Atoms that tie after refinement are
//     symmetry-equivalent in all but rare graphs, so which one moves
//     does not change the result, except for ring units whose parity
//     exists only relative to the broken tie (cis/trans-1,4-disubstituted
//     rings, an exocyclic double bond with a ring centre opposite):
//     then every atom of the class is tried, and the smallest
//     serialisation wins.
//
// Marks that cannot tell compounds apart are dropped before step 1: a
// double bond in a ring too small for trans (ringgeom.MinTransRing), a freely inverting
// nitrogen (keygraph.go), a bridgehead fixed by its cage
// (cage.go). Square-planar, trigonal-bipyramidal and
// octahedral marks enter the key as the classes of their ligands on the
// polyhedron (polyhedron.go).
//
// A unit that still has no parity after step 3 is not stereogenic and is
// left out of the key (the mark on the central carbon of propan-2-ol
// means nothing), unless it is such a ring unit and another one shares
// its ring system (chooseUnits), or a spiro centre (spiro.go).
// The key is the serialisation of the final order:
// atoms with their invariants, bonds as pairs of positions, and the kept
// units with their parities.

// canonLeafBudget bounds the tie-breaking orders tried for ring units;
// past it the first choice is taken, and a very symmetric structure with
// ring stereo may get a key that depends on the writing.
const canonLeafBudget = 1024

// canonState is one canonicalisation of a key graph.
type canonState struct {
	g      *keyGraph
	units  []keyUnit
	stereo bool
	keep   []bool // per unit: part of the key
	ring   []bool // per unit: kept as a ring unit, parity only after tie-breaking
	leaves int
	atoms  []int // the atoms in the order, folded hydrogens left out (the graph's, shared)
	seen   []bool

	// sym holds the symmetry classes after refinement, before ties are
	// broken, for the polyhedral centres (polyhedron.go); mirrored
	// reads those centres as in the mirror image.
	sym      []int
	mirrored bool
	// stereoSplit is set once unit parities have told atoms apart
	// (stereoRefine changed the ranks), at any point of the run
	stereoSplit bool

	// ringRoot is, per ring unit, its ring system (systems joined by a
	// ring link counting as one); related holds, per atom, the invariant
	// of a cis/trans relation between two ring units
	// (relative.go)
	ringRoot []int
	related  []int
	// relation is, per unit of such a pair, the product of the two
	// parities (cis-like or trans-like), 0 for other units: the pair is
	// serialised by it, which no tie-breaking changes, so the search
	// need not try both orders of each ring (a chain of k rings would
	// otherwise take 2^k orders)
	relation []int
}

// canonResult is the outcome: the rank of every atom (folded hydrogens
// -1), the serialisation and the parity of every unit on the final ranks
// (0 when not kept).
type canonResult struct {
	rank     []int
	text     string
	con      int // the length of the atoms and bonds that begin text
	parities []int
}

func newCanonState(g *keyGraph, units []keyUnit, stereo bool) *canonState {
	if g.atoms == nil {
		g.atoms = make([]int, 0, g.n)
		for a := 0; a < g.n; a++ {
			if !g.folded[a] {
				g.atoms = append(g.atoms, a)
			}
		}
	}
	return &canonState{g: g, units: units, stereo: stereo, atoms: g.atoms}
}

// run computes the canonical form.
func (c *canonState) run() canonResult {
	return c.runFrom(c.g.baseRanks())
}

// runFrom computes the canonical form from the refined ranks of the
// atom invariants (refine(initialRanks()), which depend on the graph
// alone, so that the states of one graph can share them).
func (c *canonState) runFrom(rank []int) canonResult {
	if c.stereo {
		rank = c.stereoRefine(rank)
		c.chooseUnits(rank)
		if c.relateRingPairs(rank) {
			rank = c.stereoRefine(rank)
			c.chooseUnits(rank)
		}
		c.sym = slices.Clone(rank)
	}
	return c.search(rank)
}

// baseRanks returns the refined ranks of the atom invariants, which
// every canonical state of the graph starts from; computed once, never
// modified.
func (g *keyGraph) baseRanks() []int {
	if g.base == nil {
		c := newCanonState(g, nil, false)
		g.base = c.refine(c.initialRanks())
	}
	return g.base
}

// mirrorLeaf returns the serialisation of the mirror image (the units
// of m, every tetrahedral and allene hand reversed) when it follows from
// this finished run without a run of its own, and false otherwise.
//
// It does when the parities never told atoms apart, no ring unit or
// ring relation is kept and the search reached one leaf. The parities
// enter the ranks only through stereoRefine, whose invariant per atom
// the mirror changes by a one-to-one map (a tetrahedral code 1 <-> 3, an
// allene code 4 <-> 12, double bonds kept), so atoms tie in the mirror
// exactly where they tie here: the mirror's run makes the same ranks,
// keeps the same units (which asks only whether a parity exists) and
// ends at the same leaf, where only the parities and the polyhedra are
// written differently.
func (c *canonState) mirrorLeaf(m *canonState, res canonResult) (string, bool) {
	if !c.plain() {
		return "", false
	}
	m.keep, m.ring, m.sym = c.keep, c.ring, c.sym
	return m.leafOn(res).text, true
}

// plain reports whether a finished stereo run took the path its
// constitution alone sets: the parities never told atoms apart, no ring
// unit or ring relation is kept, and the search reached one leaf, so it
// moved the first atom of the lowest tie ahead each time, as a run
// without stereo does (mirrorLeaf, identifyGraph).
func (c *canonState) plain() bool {
	if !c.stereo || c.stereoSplit || c.related != nil || c.leaves != 1 || c.keep == nil {
		return false
	}
	for i := range c.units {
		if c.ring[i] {
			return false
		}
	}
	return true
}

// atomInvariant is the class of an atom on its own.
func (c *canonState) atomInvariant(a int) [7]int {
	at := &c.g.mol.Atoms[a]
	arom := 0
	if c.g.arom[a] {
		arom = 1
	}
	return [7]int{int(at.Role), at.Number, at.Isotope, at.Charge, arom, c.g.hydro[a], len(c.g.adj[a])}
}

func (c *canonState) initialRanks() []int {
	rank := make([]int, c.g.n)
	for i := range rank {
		rank[i] = -1
	}
	sc := c.g.scratch()
	inv := grow(sc.inv, c.g.n) // only the entries of c.atoms are read
	sc.inv = inv
	for _, a := range c.atoms {
		inv[a] = c.atomInvariant(a)
	}
	sorted := append(sc.sorted[:0], c.atoms...)
	sc.sorted = sorted
	slices.SortStableFunc(sorted, func(x, y int) int { return compareInts(inv[x][:], inv[y][:]) })
	r := 0
	for i, a := range sorted {
		if i > 0 && inv[a] != inv[sorted[i-1]] {
			r = i
		}
		rank[a] = r
	}
	return rank
}

func compareInts(a, b []int) int {
	for i := 0; i < len(a) && i < len(b); i++ {
		if a[i] != b[i] {
			if a[i] < b[i] {
				return -1
			}
			return 1
		}
	}
	return len(a) - len(b)
}

// classes counts the distinct ranks. Ranks are positions below the
// number of atoms of the graph, so a flag per position suffices.
func (c *canonState) classes(rank []int) int {
	if cap(c.seen) < c.g.n {
		c.seen = make([]bool, c.g.n)
	}
	seen := c.seen[:c.g.n]
	clear(seen)
	n := 0
	for _, a := range c.atoms {
		if r := rank[a]; r >= 0 && r < len(seen) && !seen[r] {
			seen[r] = true
			n++
		}
	}
	return n
}

// refine splits classes by the classes of the neighbours until stable.
// Ranks are positions: an atom's rank is the number of atoms in lower
// classes, so the ranks of one class are equal and the order is total
// once every class holds one atom.
//
// Each round, an atom's signature is its rank followed by the sorted
// codes of its neighbours (neighbour rank and bond class), and its new
// rank is the number of atoms with a smaller signature. Since the rank
// comes first, only the atoms of one class need comparing: the new rank
// is where the class starts plus the members ahead of the atom.
func (c *canonState) refine(rank []int) []int { return c.refineFrom(nil, rank) }

// refineFrom is refine of rank, which splits classes of the ranks prev
// (positions that refine leaves as they are; nil: none known): only the
// classes with a neighbour of an atom whose rank changed can split in
// the first round, as in every later one.
func (c *canonState) refineFrom(prev, rank []int) []int {
	g := c.g
	sc := g.scratch()
	order := sc.byRank(c.atoms, rank)
	cur := rank
	bufs := [2][]int{grow(sc.rankA, g.n), grow(sc.rankB, g.n)}
	sc.rankA, sc.rankB = bufs[0], bufs[1]
	n := c.classes(rank)
	codes := func(a int) []int { return sc.codes[sc.off[a]:sc.off[a+1]] }
	// touched[a] is iter+1 when a neighbour of a changed rank before
	// round iter: a class none of whose atoms was touched has the codes
	// it had in the last round (or in prev, which refine leaves alone),
	// which were all equal, so it does not split and is not sorted again
	// (once the ranks are positions, so an unsplit class keeps its rank)
	touched := grow(sc.touched, g.n)
	sc.touched = touched
	clear(touched)
	if prev != nil {
		for _, a := range c.atoms {
			if prev[a] != rank[a] {
				for _, e := range g.adj[a] {
					touched[e.to] = 1
				}
			}
		}
	}
	for iter := 0; iter <= len(c.atoms); iter++ {
		next := bufs[iter%2]
		m := 0
		for i := 0; i < len(order); {
			j := i + 1
			for j < len(order) && cur[order[j]] == cur[order[i]] {
				j++
			}
			if j == i+1 {
				next[order[i]] = i
				m++
				i = j
				continue
			}
			class := order[i:j]
			if (iter > 0 || prev != nil) && !touchedIn(class, touched, iter+1) {
				for _, a := range class {
					next[a] = i
				}
				m++
				i = j
				continue
			}
			for _, a := range class {
				s := codes(a)[:0]
				for _, e := range g.adj[a] {
					s = append(s, cur[e.to]*8+e.class)
				}
				slices.Sort(s)
			}
			slices.SortFunc(class, func(x, y int) int { return compareInts(codes(x), codes(y)) })
			r := i
			for k, a := range class {
				if k > 0 && compareInts(codes(a), codes(class[k-1])) != 0 {
					r = i + k
					m++
				}
				next[a] = r
			}
			m++
			i = j
		}
		if m == n {
			cur = next
			break
		}
		for _, a := range order {
			if next[a] != cur[a] {
				for _, e := range g.adj[a] {
					touched[e.to] = iter + 2
				}
			}
		}
		cur = next
		n = m
	}
	return c.fresh(cur)
}

// touchedIn reports whether an atom of class was touched with stamp
// (refineFrom).
func touchedIn(class, touched []int, stamp int) bool {
	for _, a := range class {
		if touched[a] == stamp {
			return true
		}
	}
	return false
}

// fresh copies ranks of the atoms into a new slice, folded hydrogens -1.
func (c *canonState) fresh(rank []int) []int {
	out := make([]int, c.g.n)
	for i := range out {
		out[i] = -1
	}
	for _, a := range c.atoms {
		out[a] = rank[a]
	}
	return out
}

// splitBy refines ranks by one more invariant, key, compared after the
// rank: each atom's new rank is the number of atoms lower by (rank,
// key), computed class by class.
//
// The ranks are in scratch space, valid until the next splitBy: the
// callers refine them at once.
func (c *canonState) splitBy(rank []int, key func(a int) int) []int {
	sc := c.g.scratch()
	order := sc.byRank(c.atoms, rank)
	next := grow(sc.split, c.g.n)
	sc.split = next
	for i := 0; i < len(order); {
		j := i + 1
		for j < len(order) && rank[order[j]] == rank[order[i]] {
			j++
		}
		class := order[i:j]
		if len(class) > 1 {
			slices.SortFunc(class, func(x, y int) int { return key(x) - key(y) })
		}
		r := i
		for k, a := range class {
			if k > 0 && key(a) != key(class[k-1]) {
				r = i + k
			}
			next[a] = r
		}
		i = j
	}
	return next
}

// refineScratch is the working memory of ranking, shared by the
// canonical states of one key graph, which run one after another.
type refineScratch struct {
	order        []int // the atoms by rank
	count        []int
	codes        []int // neighbour codes of every atom, atom a's at codes[off[a]:off[a+1]]
	off          []int
	rankA, rankB []int
	split        []int // splitBy's ranks, read once by refine
	touched      []int // refine's round in which an atom's neighbour changed rank
	// initialRanks' invariants and atoms sorted by them
	inv    [][7]int
	sorted []int
	// leaf's serialisation, copied into the result's text
	leafOrder []int
	buf       []byte
	bonds     [][3]int
}

// scratch returns the graph's ranking scratch space.
func (g *keyGraph) scratch() *refineScratch {
	if g.sc == nil {
		sc := refineScratches.Get().(*refineScratch)
		sc.off = grow(sc.off, g.n+1)
		sc.off[0] = 0
		for a := 0; a < g.n; a++ {
			sc.off[a+1] = sc.off[a] + len(g.adj[a])
		}
		sc.codes = grow(sc.codes, sc.off[g.n])
		g.sc = sc
	}
	return g.sc
}

// refineScratches keeps ranking scratch space between key graphs: a
// caller done with a graph and all it computed gives it back
// (releaseScratch). Every user of the space sizes it for its graph
// before use (grow), as the canonical states of one graph already do.
var refineScratches = sync.Pool{New: func() any { return new(refineScratch) }}

// releaseScratch gives the graph's ranking scratch space back to the
// pool, unless a large graph grew it past refineKeep atoms. The graph
// must not be used after: the canonical results hold no scratch space
// (their ranks are fresh copies, their texts strings).
func (g *keyGraph) releaseScratch() {
	sc := g.sc
	g.sc = nil
	if sc != nil && cap(sc.off) <= refineKeep+1 && cap(sc.codes) <= 8*refineKeep {
		refineScratches.Put(sc)
	}
}

const refineKeep = 4096

// byRank returns the atoms sorted by rank (in atom order within a rank),
// in the scratch space.
func (sc *refineScratch) byRank(atoms, rank []int) []int {
	order := grow(sc.order, len(atoms))
	sc.order = order
	count := grow(sc.count, len(atoms)+1)
	sc.count = count
	clear(count)
	for _, a := range atoms {
		r := rank[a]
		if r < 0 || r >= len(atoms) {
			// not positions: sort in general
			copy(order, atoms)
			slices.SortStableFunc(order, func(x, y int) int { return rank[x] - rank[y] })
			return order
		}
		count[r+1]++
	}
	for r := 1; r < len(count); r++ {
		count[r] += count[r-1]
	}
	for _, a := range atoms {
		order[count[rank[a]]] = a
		count[rank[a]]++
	}
	return order
}

// stereoRefine adds the unit parities to the invariants and refines
// again, until the parities stop changing the ranks.
func (c *canonState) stereoRefine(rank []int) []int {
	for iter := 0; iter <= len(c.units)+1; iter++ {
		extra := make([]int, c.g.n)
		any := false
		for i := range c.units {
			if c.keep != nil && !c.keep[i] {
				continue
			}
			p := c.parity(&c.units[i], rank)
			if p == ringgeom.NoHand {
				continue
			}
			any = true
			u := &c.units[i]
			code := 2 + int(p) // 1 or 3, never 0
			switch u.kind {
			case keyTetrahedral:
				extra[u.centre] += code
			case keyAllene:
				extra[u.centre] += 4 * code
			case keyDoubleBond:
				extra[u.ends[0]] += 16 * code
				extra[u.ends[1]] += 16 * code
			}
		}
		if c.related != nil {
			any = true
			for a, code := range c.related {
				extra[a] += code
			}
		}
		if !any {
			return rank
		}
		before := c.classes(rank)
		next := c.splitBy(rank, func(a int) int { return extra[a] })
		next = c.refineFrom(rank, next)
		if c.classes(next) == before {
			return rank
		}
		c.stereoSplit = true
		rank = next
	}
	return rank
}

// ligandRank is the rank of a ligand; hydrogens and lone pairs rank
// below every atom.
func ligandRank(rank []int, x int) int {
	if x == stereo.ImplicitNeighbour {
		return -1
	}
	return rank[x]
}

// parity expresses a unit on the ranks: its hand read in rank order, or
// NoHand when ligands tie.
func (c *canonState) parity(u *keyUnit, rank []int) ringgeom.Hand {
	switch u.kind {
	case keyTetrahedral:
		var buf [8]int
		r := buf[:0]
		if len(u.ligands) > len(buf) {
			r = make([]int, 0, len(u.ligands))
		}
		for _, x := range u.ligands {
			r = append(r, ligandRank(rank, x))
		}
		p, distinct := ringgeom.PermutationParity(r)
		if !distinct {
			return ringgeom.NoHand
		}
		return u.hand.Permuted(p)
	case keyDoubleBond:
		// the written hand relates the refs; each end whose highest
		// ranked substituent is not its ref reverses it
		hand := u.hand
		for e := 0; e < 2; e++ {
			top, ok := c.topSubstituent(u.ends[e], u.ends[1-e], rank)
			if !ok {
				return ringgeom.NoHand
			}
			if top != u.refs[e] {
				hand = hand.Reversed()
			}
		}
		return hand
	case keyAllene:
		// position of each ligand in (end 0 higher, end 0 lower, end 1
		// higher, end 1 lower); which end comes first does not matter,
		// since exchanging the two pairs is an even permutation
		pos := make([]int, 4)
		for e := 0; e < 2; e++ {
			var idx []int
			for i := range u.ligands {
				if u.ligEnd[i] == e {
					idx = append(idx, i)
				}
			}
			if len(idx) != 2 {
				return ringgeom.NoHand
			}
			r0, r1 := ligandRank(rank, u.ligands[idx[0]]), ligandRank(rank, u.ligands[idx[1]])
			if r0 == r1 {
				return ringgeom.NoHand
			}
			hi, lo := idx[0], idx[1]
			if r1 > r0 {
				hi, lo = lo, hi
			}
			pos[hi], pos[lo] = 2*e, 2*e+1
		}
		p, _ := ringgeom.PermutationParity(pos)
		return u.hand.Permuted(p)
	}
	return ringgeom.NoHand
}

// topSubstituent returns the highest ranked substituent of double-bond
// end t (stereo.ImplicitNeighbour for a lone hydrogen), or false when two tie.
func (c *canonState) topSubstituent(t, partner int, rank []int) (int, bool) {
	subs := c.g.substituents(t, partner)
	for h := 0; h < c.g.hydro[t]; h++ {
		subs = append(subs, stereo.ImplicitNeighbour)
	}
	if len(subs) == 0 {
		return 0, false
	}
	best, tie := subs[0], false
	for _, x := range subs[1:] {
		rx, rb := ligandRank(rank, x), ligandRank(rank, best)
		switch {
		case rx > rb:
			best, tie = x, false
		case rx == rb:
			tie = true
		}
	}
	return best, !tie
}

// chooseUnits decides which units belong in the key, on the ranks after
// stereo refinement and before any tie is broken. A ring unit is kept
// when its ring system holds another one, ring systems joined by a
// double bond between them (ringLink) counting as one.
func (c *canonState) chooseUnits(rank []int) {
	c.keep = make([]bool, len(c.units))
	c.ring = make([]bool, len(c.units))
	var system [][2]int // per unit: its ring systems, when a ring unit
	var spiros []int    // spiro centres between two symmetric rings
	for i := range c.units {
		u := &c.units[i]
		if c.parity(u, rank) != ringgeom.NoHand {
			c.keep[i] = true
			continue
		}
		if u.kind == keyTetrahedral {
			// parity after tie-breaking; alone, no partner needed, else
			// one in each ring (spiro.go)
			if alone, ok := c.g.spiroShape(u.centre, u.ligands, rank); ok {
				if alone {
					c.keep[i] = true
				} else {
					spiros = append(spiros, i)
				}
				continue
			}
		}
		s, ok := c.ringCandidate(u, rank)
		pair := [2]int{s, -1}
		if !ok {
			pair[0], pair[1], ok = c.ringLink(u, rank)
		}
		if ok {
			if system == nil {
				system = make([][2]int, len(c.units))
			}
			c.ring[i], system[i] = true, pair
		}
	}
	c.ringRoot = nil
	if system == nil {
		return
	}
	parent := map[int]int{}
	var root func(int) int
	root = func(s int) int {
		p, ok := parent[s]
		if !ok || p == s {
			return s
		}
		r := root(p)
		parent[s] = r
		return r
	}
	for i := range c.units {
		if c.ring[i] && system[i][1] >= 0 {
			parent[root(system[i][0])] = root(system[i][1])
		}
	}
	perSystem := map[int]int{}
	for i := range c.units {
		if c.ring[i] && system[i][1] < 0 {
			perSystem[root(system[i][0])]++
		}
	}
	for i := range c.units {
		if c.ring[i] {
			if perSystem[root(system[i][0])] >= 2 {
				c.keep[i] = true
			} else {
				c.ring[i] = false
			}
		}
	}
	c.keepSpiros(spiros)
	c.ringRoot = make([]int, len(c.units))
	for i := range c.units {
		switch {
		case !c.ring[i]:
			c.ringRoot[i] = -1
		case slices.Contains(spiros, i):
			c.ringRoot[i] = root(c.g.system[c.units[i].centre])
		default:
			c.ringRoot[i] = root(system[i][0])
		}
	}
}

// ringCandidate reports whether a unit ties only because two of its
// ligands are the two ring branches of a symmetric ring, and returns the
// ring system. Such a unit is stereogenic together with another one on
// the same ring system: a tetrahedral centre (1,4-disubstituted
// cyclohexanes), an exocyclic double bond or allene
// (exocyclic.go).
func (c *canonState) ringCandidate(u *keyUnit, rank []int) (int, bool) {
	switch u.kind {
	case keyDoubleBond:
		return c.exocyclicCandidate(u, rank)
	case keyAllene:
		return c.exocyclicAllene(u, rank)
	}
	if u.kind != keyTetrahedral {
		return 0, false
	}
	c.g.findRingSystems()
	if c.g.system[u.centre] < 0 {
		return 0, false
	}
	m := c.g.mol
	var tied []int
	for i, x := range u.ligands {
		for j := i + 1; j < len(u.ligands); j++ {
			y := u.ligands[j]
			if ligandRank(rank, x) == ligandRank(rank, y) {
				tied = append(tied, x, y)
			}
		}
	}
	if len(tied) != 2 || tied[0] == stereo.ImplicitNeighbour {
		return 0, false
	}
	for _, x := range tied {
		bi := m.BondBetween(u.centre, x)
		if bi < 0 || !c.g.ring[bi] {
			return 0, false
		}
	}
	return c.g.system[u.centre], true
}

// pending reports whether some kept unit has no parity on these ranks.
func (c *canonState) pending(rank []int) bool {
	for i := range c.units {
		if c.relation != nil && c.relation[i] != 0 {
			continue // serialised by its relation, known already
		}
		if c.keep != nil && c.keep[i] && c.parity(&c.units[i], rank) == ringgeom.NoHand {
			return true
		}
	}
	return false
}

// search breaks ties until the order is total and returns the smallest
// serialisation over the choices it tries.
func (c *canonState) search(rank []int) canonResult {
	if c.classes(rank) == len(c.atoms) {
		c.leaves++
		return c.leaf(rank)
	}
	low, members := c.lowestTie(rank)
	if !c.stereo || c.leaves >= canonLeafBudget || !c.pending(rank) {
		members = members[:1]
	}
	var best canonResult
	for i, a := range members {
		r := c.search(c.moveAhead(rank, low, a))
		if i == 0 || r.text < best.text {
			best = r
		}
	}
	return best
}

// lowestTie returns the lowest rank held by more than one atom and its
// atoms.
func (c *canonState) lowestTie(rank []int) (int, []int) {
	sc := c.g.scratch()
	count := grow(sc.count, c.g.n+1)
	sc.count = count
	clear(count)
	for _, a := range c.atoms {
		if r := rank[a]; r >= 0 && r < len(count) {
			count[r]++
		}
	}
	low := -1
	for _, a := range c.atoms {
		r := rank[a]
		if r >= 0 && r < len(count) && count[r] > 1 && (low < 0 || r < low) {
			low = r
		}
	}
	var members []int
	for _, a := range c.atoms {
		if rank[a] == low {
			members = append(members, a)
		}
	}
	return low, members
}

// moveAhead breaks the tie of class low by moving atom a ahead of the
// rest of its class, and refines.
func (c *canonState) moveAhead(rank []int, low, a int) []int {
	next := c.splitBy(rank, func(x int) int {
		if rank[x] == low && x != a {
			return 1
		}
		return 0
	})
	next = c.refineFrom(rank, next)
	if c.stereo {
		next = c.stereoRefine(next)
	}
	return next
}

// leaf serialises a total order.
func (c *canonState) leaf(rank []int) canonResult {
	sc := c.g.scratch()
	buf := c.appendConstitution(sc.buf[:0], rank)
	return c.appendUnits(buf, rank, len(buf))
}

// leafOn serialises the total order of res, a leaf of another state of
// the same graph: the atoms and bonds are written as res wrote them, so
// only this state's units are written afresh (the mirror image's, and
// the constitution's, which has none).
func (c *canonState) leafOn(res canonResult) canonResult {
	if !c.stereo {
		// nothing after the atoms and bonds: the text is res's first part
		return canonResult{rank: res.rank, text: res.text[:res.con], con: res.con, parities: make([]int, len(c.units))}
	}
	sc := c.g.scratch()
	buf := append(sc.buf[:0], res.text[:res.con]...)
	return c.appendUnits(buf, res.rank, res.con)
}

// appendConstitution writes the atoms and bonds of a total order.
func (c *canonState) appendConstitution(buf []byte, rank []int) []byte {
	g := c.g
	sc := g.scratch()
	order := grow(sc.leafOrder, len(c.atoms))
	sc.leafOrder = order
	for _, a := range c.atoms {
		order[rank[a]] = a
	}
	put := func(v int) { buf = binary.AppendVarint(buf, int64(v)) }
	put(len(order))
	for _, a := range order {
		inv := c.atomInvariant(a)
		for _, v := range inv {
			put(v)
		}
	}
	// the bonds sorted by (lower position, higher position, class): the
	// order lists the lower ends ascending, so only each atom's own
	// bonds need sorting
	bonds := sc.bonds[:0]
	for _, a := range order {
		first := len(bonds)
		for _, e := range g.adj[a] {
			if rank[a] < rank[e.to] {
				bonds = append(bonds, [3]int{rank[a], rank[e.to], e.class})
			}
		}
		own := bonds[first:]
		for i := 1; i < len(own); i++ {
			for j := i; j > 0 && compareInts(own[j][:], own[j-1][:]) < 0; j-- {
				own[j], own[j-1] = own[j-1], own[j]
			}
		}
	}
	sc.bonds = bonds
	put(len(bonds))
	for _, b := range bonds {
		put(b[0])
		put(b[1])
		put(b[2])
	}
	return buf
}

// appendUnits writes the units of a stereo state after buf, the atoms
// and bonds of the total order rank (con bytes long), and returns the
// leaf.
func (c *canonState) appendUnits(buf []byte, rank []int, con int) canonResult {
	g := c.g
	put := func(v int) { buf = binary.AppendVarint(buf, int64(v)) }
	res := canonResult{rank: rank, con: con, parities: make([]int, len(c.units))}
	if c.stereo {
		var us [][4]int
		for i := range c.units {
			if !c.keep[i] {
				continue
			}
			u := &c.units[i]
			p := int(c.parity(u, rank))
			res.parities[i] = p
			if c.relation != nil && c.relation[i] != 0 {
				// a unit of a related ring pair: its own parity hangs
				// on a broken tie, its relation does not
				p = 2 * c.relation[i]
			}
			us = append(us, unitCode(u, rank, p))
		}
		slices.SortFunc(us, func(x, y [4]int) int { return compareInts(x[:], y[:]) })
		put(len(us))
		for _, u := range us {
			for _, v := range u {
				put(v)
			}
		}
		if poly := polyhedronCodes(g.mol, rank, c.sym, g.folded, c.mirrored); len(poly) > 0 {
			put(len(poly))
			for _, code := range poly {
				put(len(code))
				for _, v := range code {
					put(v)
				}
			}
		}
	}
	res.text = string(buf)
	g.scratch().buf = buf
	return res
}

// unitCode is a unit in canonical terms: kind, the positions of its
// atoms (lower first) and its parity.
func unitCode(u *keyUnit, rank []int, p int) [4]int {
	switch u.kind {
	case keyDoubleBond:
		a, b := rank[u.ends[0]], rank[u.ends[1]]
		if a > b {
			a, b = b, a
		}
		return [4]int{int(u.kind), a, b, p}
	}
	return [4]int{int(u.kind), rank[u.centre], -1, p}
}

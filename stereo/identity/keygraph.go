// This file implements the key graph and the units the key reads from the
// marks.

package identity

import (
	"sync"

	"stereoline/notation"
	"stereoline/stereo"
	"stereoline/stereo/internal/ringgeom"
)

// The graph the identity key is computed on, and the stereo units read
// from the marks in a form that does not depend on how the structure was
// written: each unit keeps the written ligand order and the written
// handedness, and canon.go expresses it on canonical ranks.
//
// The key reads the marks itself instead of taking the engine's units,
// because what makes a mark part of a structure's identity is graph
// symmetry, not CIP ranking: the ring carbons of cis-1,4-dimethyl-
// cyclohexane get no R/S, yet the cis and trans isomers are two compounds.

// unitKind is the geometry of a unit as the key sees it.
type unitKind uint8

const (
	keyTetrahedral unitKind = iota + 1
	keyDoubleBond
	keyAllene
)

// keyUnit is one marked unit. For a tetrahedral centre, ligands are in
// the written stereo order and hand is +1 for '@', -1 for '@@'. For a
// double bond, ends are the two atoms, refs one written substituent at
// each end and hand is +1 when the refs are trans, -1 when cis. For an
// allene, ends are the terminal atoms, ligands the four substituents in
// the order OpenSMILES reads them, ligEnd which end each belongs to.
type keyUnit struct {
	kind    unitKind
	centre  int // tetrahedral or allene centre; -1 for a double bond
	ends    [2]int
	refs    [2]int
	ligands []int
	ligEnd  []int
	hand    ringgeom.Hand
	bond    int // the double bond, -1 otherwise
}

// keyEdge is one neighbour in the key graph.
type keyEdge struct {
	to    int
	class int // bond order class: 1..4, 5 for aromatic
}

// keyGraph is the molecule with plain explicit hydrogens folded into
// their neighbours. Atom indices are the molecule's; folded atoms have no
// edges and are skipped by the canonical order.
type keyGraph struct {
	mol    *notation.Molecule
	n      int
	folded []bool
	hydro  []int // hydrogens on each atom, folded ones included
	adj    [][]keyEdge
	units  []keyUnit
	ring   []bool          // per bond: lies on a ring
	system []int           // per atom: ring system id, -1 outside rings
	rings  *notation.Rings // smallestRings, on first use
	arom   []bool          // per atom: aromatic, as written or as found in a Kekulé ring
	// geom is the view the ring and bicycle searches read, set by
	// findRingSystems
	geom  ringgeom.Graph
	sc    *refineScratch // canon.go, on first use
	base  []int          // baseRanks, on first use
	atoms []int          // the atoms not folded, on first use
	// cyclic is ringBonds's answer before findRingSystems ran
	cyclic []bool
}

func bondClass(b *notation.Bond) int {
	switch b.Order {
	case notation.OrderDouble:
		return 2
	case notation.OrderTriple:
		return 3
	case notation.OrderQuadruple:
		return 4
	case notation.OrderAromatic:
		return 5
	}
	return 1
}

func newKeyGraph(m *notation.Molecule) *keyGraph { return newKeyGraphIn(m, nil) }

// keyStore is the storage of a key graph's atom tables, edges and units,
// which Identify takes from a pool and gives back: a list of 100,000
// records would otherwise allocate it 100,000 times.
type keyStore struct {
	folded  []bool
	hydro   []int
	adj     [][]keyEdge
	degree  []int
	backing []keyEdge
	units   []keyUnit
}

var keyStores = sync.Pool{New: func() any { return new(keyStore) }}

// keyStoreKeep bounds the atoms of a graph whose storage goes back to
// the pool.
const keyStoreKeep = 4096

// release gives the storage back; nothing computed from the graph may
// point into it (the results' unit atoms and ranks are their own).
func (st *keyStore) release(g *keyGraph) {
	if g.n > keyStoreKeep {
		return
	}
	clear(st.adj) // windows of st.backing
	clear(g.units[:cap(g.units)])
	st.units = g.units[:0]
	keyStores.Put(st)
}

// newKeyGraphIn is newKeyGraph in st's storage, or in its own when st
// is nil.
func newKeyGraphIn(m *notation.Molecule, st *keyStore) *keyGraph {
	if st == nil {
		st = &keyStore{}
	}
	g := &keyGraph{mol: m, n: len(m.Atoms)}
	g.folded = grow(st.folded, g.n)
	clear(g.folded)
	g.hydro = grow(st.hydro, g.n)
	clear(g.hydro)
	g.adj = grow(st.adj, g.n)
	st.folded, st.hydro, st.adj = g.folded, g.hydro, g.adj
	g.units = st.units[:0]
	for a := range m.Atoms {
		g.hydro[a] += m.Atoms[a].HydrogenCount()
		if ringgeom.PlainHydrogen(m, a) {
			g.folded[a] = true
			g.hydro[m.Bonds[m.Atoms[a].Bonds[0]].Other(a)]++
		}
	}
	var aromBond []bool
	g.arom, aromBond = g.aromaticity()
	usable := func(b *notation.Bond) bool {
		return b.Begin >= 0 && b.End >= 0 && b.Begin < g.n && b.End < g.n && !g.folded[b.Begin] && !g.folded[b.End]
	}
	// every atom's edges in one backing array, in the order of the bonds
	degree := grow(st.degree, g.n)
	clear(degree)
	st.degree = degree
	total := 0
	for bi := range m.Bonds {
		if b := &m.Bonds[bi]; usable(b) {
			degree[b.Begin]++
			degree[b.End]++
			total += 2
		}
	}
	backing := grow(st.backing, total)
	st.backing = backing
	for a := range g.adj {
		g.adj[a], backing = backing[:0:degree[a]], backing[degree[a]:]
	}
	for bi := range m.Bonds {
		b := &m.Bonds[bi]
		if !usable(b) {
			continue
		}
		c := bondClass(b)
		switch {
		case aromBond[bi]:
			c = 5
		case c == 5:
			c = 1 // written aromatic but on no ring
		}
		g.adj[b.Begin] = append(g.adj[b.Begin], keyEdge{b.End, c})
		g.adj[b.End] = append(g.adj[b.End], keyEdge{b.Begin, c})
	}
	g.readUnits()
	return g
}

// findRingSystems groups ring atoms joined by ring bonds. It runs on
// first use: only ring units need it. Which bonds lie on a ring is all it
// needs (ringBonds, a bridge search); the smallest rings, a costlier
// search, are found only when asked for (smallestRings).
func (g *keyGraph) findRingSystems() {
	if g.system != nil {
		return
	}
	m := g.mol
	ring := g.ringBonds()
	g.ring = ring
	sets := ringgeom.NewDisjointSets(g.n)
	g.system = make([]int, g.n)
	for a := range g.system {
		g.system[a] = -1
	}
	for bi := range m.Bonds {
		if ring[bi] {
			b := &m.Bonds[bi]
			sets.Union(b.Begin, b.End)
			g.system[b.Begin], g.system[b.End] = 0, 0 // on a ring: set below
		}
	}
	for a := range g.system {
		if g.system[a] == 0 {
			g.system[a] = sets.Find(a)
		}
	}
	g.geom.Reset(m, g.ring)
}

// smallestRings returns the molecule's rings with their smallest sizes
// (notation.FindRings), found on first use.
func (g *keyGraph) smallestRings() *notation.Rings {
	if g.rings == nil {
		g.rings = notation.FindRings(g.mol)
	}
	return g.rings
}

// ligandOf maps a neighbour atom to the ligand the key sees: folded
// hydrogens become stereo.ImplicitNeighbour.
func (g *keyGraph) ligandOf(a int) int {
	if g.folded[a] {
		return stereo.ImplicitNeighbour
	}
	return a
}

// stereoOrder lists the ligands of atom a in the OpenSMILES stereo
// order, with implicit hydrogens (or a lone pair, when lonePair) at the
// hydrogen slot and folded [H] atoms as hydrogens.
func (g *keyGraph) stereoOrder(a int, lonePair bool) []int {
	return ringgeom.Ligands(g.mol, a, lonePair, true)
}

// doubleCount counts the non-aromatic bonds of order two or more at a.
func (g *keyGraph) doubleCount(a int) int {
	n := 0
	for _, e := range g.adj[a] {
		if e.class >= 2 && e.class <= 4 {
			n++
		}
	}
	return n
}

// readUnits reads every chirality mark and every marked double bond.
func (g *keyGraph) readUnits() {
	m := g.mol
	for a := range m.Atoms {
		if g.folded[a] {
			continue
		}
		ch := m.Atoms[a].Chirality
		if ch.Class != notation.ChiralTH && ch.Class != notation.ChiralAL {
			continue
		}
		// a number the reader rejected (@TH3, read as 0 and reported as
		// an error) is taken as '@'
		hand := ringgeom.MarkHand(ch.Num)
		if hand == ringgeom.NoHand {
			hand = ringgeom.Anticlockwise
		}
		if ends, inner, ok := g.alleneEnds(a); ok && (ch.Short || ch.Class == notation.ChiralAL) {
			u := keyUnit{kind: keyAllene, centre: a, ends: ends, hand: hand, bond: -1}
			u.ligands, u.ligEnd = ringgeom.AlleneLigands(g.mol, ends, inner, true)
			if len(u.ligands) == 4 {
				g.units = append(g.units, u)
			}
			continue
		}
		if ch.Class != notation.ChiralTH || g.arom[a] || g.doubleCount(a) > 0 && (m.Atoms[a].Number == notation.ElemC || m.Atoms[a].Number == notation.ElemN) {
			continue
		}
		count := len(g.adj[a]) + g.hydro[a]
		if count != 3 && count != 4 {
			continue
		}
		u := keyUnit{kind: keyTetrahedral, centre: a, hand: hand, bond: -1}
		u.ligands = g.stereoOrder(a, count == 3)
		if len(u.ligands) == 4 {
			g.units = append(g.units, u)
		}
	}
	for bi := range m.Bonds {
		if u, ok := g.readDoubleBond(bi); ok {
			g.units = append(g.units, u)
		}
	}
	g.dropFixedUnits()
}

// dropFixedUnits leaves out marks that cannot tell two compounds apart:
// a double bond in a ring too small for trans (ringgeom.MinTransRing) can only be cis, a
// three-coordinate nitrogen inverts quickly unless a small ring or a
// bridgehead position holds it (common practice; RDKit treats both the
// same way), and a bridgehead whose cage fixes it (cage.go).
func (g *keyGraph) dropFixedUnits() {
	m := g.mol
	keep := g.units[:0]
	for _, u := range g.units {
		switch {
		case u.kind == keyDoubleBond && u.bond >= 0:
			if g.ringBonds()[u.bond] && g.smallestRings().BondSize[u.bond] < ringgeom.MinTransRing {
				continue
			}
		case u.kind == keyTetrahedral && m.Atoms[u.centre].Number == notation.ElemN && len(g.adj[u.centre])+g.hydro[u.centre] == 3:
			if !g.heldNitrogen(u.centre) {
				continue
			}
		}
		keep = append(keep, u)
	}
	g.units = g.dropCageFixed(keep, nil, nil)
}

// heldNitrogen reports whether a three-coordinate nitrogen sits in a
// three-membered ring or at a bridgehead (all three bonds in rings).
// The labeller draws the line elsewhere: it holds only the bridgeheads
// of small bridged bicycles (bridgedHead in stereo/bridgehead.go) and
// reports the nitrogen of a ring fusion (indolizidine) as inverting,
// while the key keeps that mark; the two rules are kept apart so that
// neither the keys nor the diagnostics change.
func (g *keyGraph) heldNitrogen(a int) bool {
	g.findRingSystems()
	switch g.geom.RingDegree(a) {
	case 3:
		return true
	case 0:
		return false // on no ring, so on no three-membered one
	}
	return g.smallestRings().AtomSize[a] == 3
}

// substituents lists the neighbours of double-bond end t other than
// partner, joined by single bonds, or by aromatic ones when t is a ring
// atom of an aromatic ring with the double bond outside it (the imine
// of a 2-iminothiazoline).
func (g *keyGraph) substituents(t, partner int) []int {
	var out []int
	for _, e := range g.adj[t] {
		if e.to != partner && (e.class == 1 || e.class == 5) {
			out = append(out, e.to)
		}
	}
	return out
}

// readDoubleBond reads the direction marks around bond bi, a plain
// double bond whose ends carry no other double bond.
func (g *keyGraph) readDoubleBond(bi int) (keyUnit, bool) {
	m := g.mol
	b := &m.Bonds[bi]
	if b.Order != notation.OrderDouble || g.folded[b.Begin] || g.folded[b.End] || g.arom[b.Begin] && g.arom[b.End] {
		return keyUnit{}, false
	}
	// an odd cumulene is read at its middle bond, between its terminal
	// atoms; a plain double bond is a cumulene of one
	t0, _, c0 := ringgeom.Cumulene(m, g.cumulated, b.End, b.Begin)
	t1, _, c1 := ringgeom.Cumulene(m, g.cumulated, b.Begin, b.End)
	if c0 != c1 || t0 == t1 {
		return keyUnit{}, false
	}
	u := keyUnit{kind: keyDoubleBond, centre: -1, ends: [2]int{t0, t1}, bond: bi}
	var side [2]notation.Direction
	for e := 0; e < 2; e++ {
		t, partner := u.ends[e], u.ends[1-e]
		if g.doubleCount(t) != 1 {
			return keyUnit{}, false
		}
		found := false
		for _, bj := range m.Atoms[t].Bonds {
			x := m.Bonds[bj].Other(t)
			if x == partner || bondClass(&m.Bonds[bj]) == 2 || bondClass(&m.Bonds[bj]) == 3 {
				continue
			}
			d := m.BondDir(bj, x)
			if d == notation.DirNone {
				continue
			}
			if found {
				// a second mark at the same end must agree: on the other
				// side of the bond from the first
				if d == side[e] {
					return keyUnit{}, false
				}
				continue
			}
			found = true
			u.refs[e], side[e] = g.ligandOf(x), d
		}
		if !found {
			return keyUnit{}, false
		}
	}
	u.hand = ringgeom.Cis
	if side[0] != side[1] {
		u.hand = ringgeom.Trans
	}
	return u, true
}

// alleneEnds returns the terminal atoms of the even cumulene centred on
// c, and the chain atom next to each.
func (g *keyGraph) alleneEnds(c int) (ends, inner [2]int, ok bool) {
	return ringgeom.AlleneEnds(g.mol, g.cumulated, c)
}

// cumulated reports whether a has exactly two neighbours, both through
// double bonds, and no hydrogens.
func (g *keyGraph) cumulated(a int) bool {
	return len(g.adj[a]) == 2 && g.hydro[a] == 0 && g.adj[a][0].class == 2 && g.adj[a][1].class == 2
}

// This file implements the configurations read from the marks, before any
// question of what they mean.

package stereo

import (
	"stereoline/notation"
	"stereoline/stereo/internal/ringgeom"
)

// The configuration as written: each mark read over the neighbour order
// OpenSMILES defines, before any question of whether it means anything.

// tetraConfig is a tetrahedral mark: the ligands in stereo order and the
// hand seen from the first ('@' anticlockwise, '@@' clockwise).
type tetraConfig struct {
	centre   int
	ligands  []int
	hand     ringgeom.Hand
	lonePair bool // the implicit ligand is a lone pair, not a hydrogen
	span     notation.Span
}

// bondConfig is a cis/trans configuration on a double bond or an odd
// cumulene, between the terminal atoms ends[0] and ends[1]: refs are one
// substituent at each end (noReference when none is chosen) and hand
// says whether they lie on opposite sides (Trans) or one side (Cis).
type bondConfig struct {
	bond  int    // the (middle) double bond
	ends  [2]int // terminal atoms
	inner [2]int // the chain atom bonded to each terminal
	refs  [2]int
	hand  ringgeom.Hand
	spans []notation.Span
	marks []int // the marked single bonds at both ends
}

// noReference stands in refs for a bond ranked without marks (for the
// explanation of an unmarked unit): it matches no ligand, not even an
// implicit one (ImplicitNeighbour).
const noReference = -2

// unmarkedBond is the configuration an unmarked double bond (or odd
// cumulene, bond its middle bond) is ranked under; its hand is
// arbitrary, as no label is read from it.
func unmarkedBond(bond int, ends, inner [2]int) *bondConfig {
	return &bondConfig{bond: bond, ends: ends, inner: inner, refs: [2]int{noReference, noReference}, hand: ringgeom.Cis}
}

// alleneConfig is an extended tetrahedral mark on the centre of an even
// cumulene: the four substituents of the terminal atoms in OpenSMILES
// order, which end each belongs to, and the hand.
type alleneConfig struct {
	centre  int
	ends    [2]int
	inner   [2]int
	ligands []int
	ligEnd  []int
	hand    ringgeom.Hand
	span    notation.Span
}

// higherConfig keeps a square-planar, trigonal-bipyramidal or octahedral
// mark with its permutation number; the engine does not label them.
type higherConfig struct {
	centre  int
	kind    Kind
	number  int
	ligands []int
	span    notation.Span
}

// configs gathers every configuration read from the marks.
type configs struct {
	// tetraOrder holds the atoms of tetra in ascending order, as
	// readCentres adds them (entries deleted from tetra stay here and
	// are skipped by tetraAtoms)
	tetraOrder []int
	tetra      map[int]*tetraConfig
	bonds      map[int]*bondConfig // by the bond index of each double bond of the unit
	allene     map[int]*alleneConfig
	higher     map[int]*higherConfig
}

func newConfigs() *configs {
	c := &configs{}
	c.reset()
	return c
}

// keepConfigs is the largest map reset keeps: clearing costs time in
// proportion to the room a map once grew to.
const keepConfigs = 256

// reset empties c for another molecule, keeping small maps.
func (c *configs) reset() {
	c.tetraOrder = c.tetraOrder[:0]
	c.tetra = emptied(c.tetra)
	c.bonds = emptied(c.bonds)
	c.allene = emptied(c.allene)
	c.higher = emptied(c.higher)
}

// addTetra records a tetrahedral configuration; atoms come in ascending
// order.
func (c *configs) addTetra(t *tetraConfig) {
	c.tetra[t.centre] = t
	c.tetraOrder = append(c.tetraOrder, t.centre)
}

// tetraAtoms returns the atoms with a tetrahedral configuration, in
// ascending order, without sorting the map's keys.
func (c *configs) tetraAtoms() []int {
	out := make([]int, 0, len(c.tetra))
	for _, a := range c.tetraOrder {
		if _, ok := c.tetra[a]; ok {
			out = append(out, a)
		}
	}
	return out
}

func emptied[V any](m map[int]V) map[int]V {
	if m == nil || len(m) > keepConfigs {
		return map[int]V{}
	}
	clear(m)
	return m
}

// stereoLigands lists the ligands of atom a in stereo order, with the
// bracket hydrogen at its slot.
func stereoLigands(m *notation.Molecule, a int) []int { return ringgeom.Ligands(m, a, false, false) }

// cumulene follows a chain of cumulated double bonds from atom a through
// neighbour b (a=b). It returns the terminal atom reached, the chain atom
// next to it, and the number of double bonds walked.
func (g *graph) cumulene(a, b int) (terminal, inner, count int) {
	return ringgeom.Cumulene(g.mol, g.cumulated, a, b)
}

// cumulated reports whether a is an inner atom of a cumulene: exactly two
// neighbours, both through double bonds of the Kekulé structure.
func (g *graph) cumulated(a int) bool {
	if len(g.adj[a]) != 2 || g.hyd[a] != 0 {
		return false
	}
	return g.adj[a][0].order == 2 && g.adj[a][1].order == 2
}

// alleneEnds returns the terminal atoms of the even cumulene centred on
// c, or ok false when c is no such centre.
func (g *graph) alleneEnds(c int) (ends, inner [2]int, ok bool) {
	return ringgeom.AlleneEnds(g.mol, g.cumulated, c)
}

// readAllene builds the extended tetrahedral configuration at c.
func (g *graph) readAllene(c int, ch notation.Chirality) *alleneConfig {
	ends, inner, ok := g.alleneEnds(c)
	if !ok {
		return nil
	}
	cfg := &alleneConfig{centre: c, ends: ends, inner: inner, hand: markHand(ch), span: ch.Span}
	cfg.ligands, cfg.ligEnd = ringgeom.AlleneLigands(g.mol, ends, inner, false)
	return cfg
}

// markedSides returns, for terminal t of a cis/trans unit, the marked
// substituents and the side of each: the direction of the bond read from
// the substituent towards t, under the molecule's reading (a ring
// closure whose two marks contradict each other may count for nothing).
func (g *graph) markedSides(t, inner int) (atoms []int, sides []notation.Direction, spans []notation.Span) {
	m := g.mol
	for _, e := range g.adj[t] {
		if e.to == inner || e.order != 1 {
			continue
		}
		if d := m.BondDir(e.bond, e.to); d != notation.DirNone {
			atoms = append(atoms, e.to)
			sides = append(sides, d)
			spans = append(spans, m.MarkSpan(e.bond))
		}
	}
	return atoms, sides, spans
}

// markHand is the hand of a tetrahedral or allene mark. A number the
// reader rejected (@TH3, read as 0 and reported as an error) is taken as
// '@@', so that the record still gets its units.
func markHand(ch notation.Chirality) ringgeom.Hand {
	if h := ringgeom.MarkHand(ch.Num); h != ringgeom.NoHand {
		return h
	}
	return ringgeom.Clockwise
}

package stereo

import (
	"stereoline/notation"
	"stereoline/stereo/internal/ringgeom"
)

// This file implements the geometric reading of the marks for code that
// draws a molecule (package stereo/depict): which side of a double bond
// each marked substituent is on, and the neighbour order of an allene's
// mark. It reads the marks with the same helpers the labeller uses
// (markedSides, readAllene), so a drawing and a label never disagree on
// what a mark says.

// WrittenBond is the cis/trans configuration the direction marks give a
// double bond or odd cumulene: one reference substituent at each terminal
// atom and whether the two lie on opposite sides.
type WrittenBond struct {
	Ends  [2]int // the terminal atoms, as in Unit.Atoms
	Inner [2]int // the chain atom next to each terminal (the other terminal for a plain double bond)
	Refs  [2]int // one marked substituent at each end
	Trans bool
}

// WrittenDoubleBond reads the configuration of a specified double-bond
// unit u of m from its marks. ok is false when u is no double-bond unit
// or a terminal carries no usable mark (a unit specified only through
// its ring: ring double bonds of small rings are not units).
func WrittenDoubleBond(m *notation.Molecule, u *Unit) (WrittenBond, bool) {
	var w WrittenBond
	if u == nil || u.Kind != KindDoubleBond || len(u.Atoms) != 2 {
		return w, false
	}
	g := markGraph(m)
	var sides [2]notation.Direction
	for e := 0; e < 2; e++ {
		t := u.Atoms[e]
		inner := -1
		for _, ed := range g.adj[t] {
			if ed.order == 2 {
				inner = ed.to
			}
		}
		if inner < 0 {
			return w, false
		}
		atoms, ss, _ := g.markedSides(t, inner)
		if len(atoms) == 0 {
			return w, false
		}
		w.Ends[e], w.Inner[e], w.Refs[e], sides[e] = t, inner, atoms[0], ss[0]
	}
	w.Trans = sides[0] != sides[1]
	return w, true
}

// WrittenAllene is the extended tetrahedral mark on the centre of an
// allene or even cumulene: the four substituents of the terminal atoms in
// the OpenSMILES neighbour order (ImplicitNeighbour for a hydrogen), the
// terminal each hangs from (0 or 1, an index into Ends), and the winding
// seen from the first: Clockwise for '@@'.
type WrittenAllene struct {
	Centre    int
	Ends      [2]int
	Inner     [2]int
	Ligands   []int
	LigandEnd []int
	Clockwise bool
}

// ReadAllene reads the mark on allene centre c of m. ok is false when c
// carries no such mark or is no centre of an even cumulene.
func ReadAllene(m *notation.Molecule, c int) (WrittenAllene, bool) {
	if m == nil || c < 0 || c >= len(m.Atoms) {
		return WrittenAllene{}, false
	}
	ch := m.Atoms[c].Chirality
	if ch.Class != notation.ChiralTH && ch.Class != notation.ChiralAL {
		return WrittenAllene{}, false
	}
	cfg := markGraph(m).readAllene(c, ch)
	if cfg == nil || len(cfg.ligands) != 4 {
		return WrittenAllene{}, false
	}
	return WrittenAllene{Centre: c, Ends: cfg.ends, Inner: cfg.inner, Ligands: cfg.ligands,
		LigandEnd: cfg.ligEnd, Clockwise: cfg.hand == ringgeom.Clockwise}, true
}

// markGraph builds the part of the engine's graph that reading marks
// needs: neighbours in stereo order with their orders, and hydrogens.
func markGraph(m *notation.Molecule) *graph {
	g := &graph{mol: m, n: len(m.Atoms), adj: make([][]edge, len(m.Atoms)), hyd: make([]int, len(m.Atoms))}
	for i := range m.Atoms {
		a := &m.Atoms[i]
		g.hyd[i] = a.HydrogenCount()
		for _, bi := range a.Bonds {
			if bi < 0 || bi >= len(m.Bonds) {
				continue
			}
			b := &m.Bonds[bi]
			g.adj[i] = append(g.adj[i], edge{to: b.Other(i), bond: bi, order: bondOrder(b)})
		}
	}
	return g
}

// This file implements the walks along cumulated double bonds both
// engines read allenes and cumulenes with.

package ringgeom

import (
	"slices"

	"stereoline/notation"
)

// Cumulene follows a chain of cumulated double bonds from atom a
// through its neighbour b (a=b). It returns the terminal atom reached,
// the chain atom next to it, and the number of double bonds walked. A
// ring of cumulated atoms stops the walk after as many steps as the
// molecule has atoms.
func Cumulene(m *notation.Molecule, cumulated func(int) bool, a, b int) (terminal, inner, count int) {
	prev, cur := a, b
	count = 1
	for cumulated(cur) && count < len(m.Atoms) {
		next := -1
		for _, bi := range m.Atoms[cur].Bonds {
			if bi < 0 || bi >= len(m.Bonds) {
				continue
			}
			if x := m.Bonds[bi].Other(cur); x != prev {
				next = x
			}
		}
		if next < 0 {
			break
		}
		prev, cur = cur, next
		count++
	}
	return cur, prev, count
}

// AlleneEnds returns the terminal atoms of the even cumulene centred on
// c and the chain atom next to each, or ok false when c is no such
// centre (not cumulated, or its two arms differ in length or meet).
func AlleneEnds(m *notation.Molecule, cumulated func(int) bool, c int) (ends, inner [2]int, ok bool) {
	if !cumulated(c) {
		return ends, inner, false
	}
	var arm [2]int // the first neighbour of c along each arm
	n := 0
	for _, bi := range m.Atoms[c].Bonds {
		if bi >= 0 && bi < len(m.Bonds) && n < 2 {
			arm[n] = m.Bonds[bi].Other(c)
			n++
		}
	}
	t0, i0, n0 := Cumulene(m, cumulated, c, arm[0])
	t1, i1, n1 := Cumulene(m, cumulated, c, arm[1])
	if n0 != n1 || t0 == t1 {
		return ends, inner, false
	}
	return [2]int{t0, t1}, [2]int{i0, i1}, true
}

// AlleneLigands lists the substituents of the two terminal atoms of an
// allene (ends, each bonded to the chain through inner) in the order
// OpenSMILES reads an extended tetrahedral mark: by where the notation
// names each as seen from its terminal atom — a chain or branch
// neighbour at its own position, a ring-closure neighbour at the digit
// written on the terminal atom, a hydrogen inside the terminal atom's
// brackets. ligEnd says which end each belongs to. With fold, plain [H]
// atoms (PlainHydrogen) count as hydrogens of their terminal atom.
func AlleneLigands(m *notation.Molecule, ends, inner [2]int, fold bool) (ligands, ligEnd []int) {
	type ligand struct {
		atom, end int
		key       float64 // text offset
	}
	var ls []ligand
	for e := 0; e < 2; e++ {
		t := ends[e]
		hydrogens := m.Atoms[t].HydrogenCount()
		for _, bi := range m.Atoms[t].Bonds {
			if bi < 0 || bi >= len(m.Bonds) {
				continue
			}
			b := &m.Bonds[bi]
			x := b.Other(t)
			if x == inner[e] {
				continue
			}
			if fold && PlainHydrogen(m, x) {
				hydrogens++
				continue
			}
			key := float64(m.Atoms[x].Span.Start)
			if b.Ring {
				if b.Begin == t {
					key = float64(b.Span.Start) + 0.5
				} else {
					key = float64(b.CloseSpan.Start) + 0.5
				}
			}
			ls = append(ls, ligand{x, e, key})
		}
		for range hydrogens {
			ls = append(ls, ligand{Implicit, e, float64(m.Atoms[t].Span.Start) + 0.25})
		}
	}
	slices.SortStableFunc(ls, func(a, b ligand) int {
		switch {
		case a.key < b.key:
			return -1
		case a.key > b.key:
			return 1
		}
		return 0
	})
	for _, l := range ls {
		ligands = append(ligands, l.atom)
		ligEnd = append(ligEnd, l.end)
	}
	return ligands, ligEnd
}

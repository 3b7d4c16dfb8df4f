// This file implements the ligand lists both engines read marks over.

package ringgeom

import (
	"slices"

	"stereoline/notation"
)

// Implicit stands for an implicit or bracket hydrogen, a folded [H]
// atom or a lone pair in a ligand list. Package stereo exports it as
// ImplicitNeighbour; every engine uses that one value.
const Implicit = -1

// PlainHydrogen reports whether atom a is an [H] written as an atom
// that means nothing more than a hydrogen on its single neighbour: no
// isotope, charge or map number, one single bond, to an atom that is no
// hydrogen. The identity key folds such atoms into their neighbour's
// hydrogen count, so C and C[H] agree.
func PlainHydrogen(m *notation.Molecule, a int) bool {
	at := &m.Atoms[a]
	if at.Number != 1 || at.Isotope != 0 || at.Charge != 0 || at.Map != 0 || len(at.Bonds) != 1 || at.HydrogenCount() != 0 {
		return false
	}
	bi := at.Bonds[0]
	if bi < 0 || bi >= len(m.Bonds) || m.Bonds[bi].Order != notation.OrderSingle {
		return false
	}
	return m.Atoms[m.Bonds[bi].Other(a)].Number != 1
}

// Ligands lists the ligands of atom a in stereo order (the neighbour
// order of notation.Atom.Bonds, OpenSMILES 1.0, 3.9.1), with its
// hydrogens as Implicit at the hydrogen slot (notation.Atom.HydrogenSlot)
// and, when lonePair, a lone pair as Implicit where the molecule's
// reading puts it (notation.Molecule.LonePairSlot). With fold, plain [H]
// atoms (PlainHydrogen) are listed as Implicit where they stand. The list
// has room for one more ligand, so a caller may insert a lone pair
// without another allocation.
func Ligands(m *notation.Molecule, a int, lonePair, fold bool) []int {
	at := &m.Atoms[a]
	extra := at.HydrogenCount()
	out := make([]int, 0, len(at.Bonds)+extra+2)
	for _, bi := range at.Bonds {
		x := m.Bonds[bi].Other(a)
		if fold && PlainHydrogen(m, x) {
			x = Implicit
		}
		out = append(out, x)
	}
	if lonePair && extra == 0 && len(at.Bonds) == 3 {
		return slices.Insert(out, m.LonePairSlot(a), Implicit)
	}
	if lonePair {
		extra++
	}
	if extra > 0 {
		slot := min(at.HydrogenSlot(), len(out))
		for range extra {
			out = slices.Insert(out, slot, Implicit)
		}
	}
	return out
}

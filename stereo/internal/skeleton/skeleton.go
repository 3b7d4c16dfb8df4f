// Package skeleton records the constitution of a molecule, atom for atom
// in its order, so that a computation on the constitution alone can be
// shared with the next molecule when it is the same: the stereoisomers
// of one compound in a list, written alike but for their marks.
package skeleton

import "stereoline/notation"

// A Skeleton is what the constitution-only computations read from a
// molecule: of each atom its element, isotope, charge, role, map number,
// aromatic flag, hydrogens and bonds in order; of each bond its ends,
// its order and its Kekulé order; and the molecule's reading. Its zero
// value matches no molecule.
type Skeleton struct {
	taken   bool
	reading notation.Reading
	atoms   []atom
	bonds   []bond
	lists   []int // the atoms' bonds, one list after another
}

type atom struct {
	number, isotope, charge, hydrogens, mapNum, bonds int
	role                                              notation.Role
	aromatic                                          bool
}

type bond struct {
	begin, end int
	order      notation.BondOrder
	kekule     int
}

func atomOf(at *notation.Atom) atom {
	return atom{number: at.Number, isotope: at.Isotope, charge: at.Charge, hydrogens: at.HydrogenCount(),
		mapNum: at.Map, bonds: len(at.Bonds), role: at.Role, aromatic: at.Aromatic}
}

func bondOf(b *notation.Bond) bond { return bond{b.Begin, b.End, b.Order, b.Kekule} }

// Take records m's constitution, reusing the storage of the last.
func (s *Skeleton) Take(m *notation.Molecule) {
	s.taken, s.reading = true, m.Reading
	s.atoms, s.bonds, s.lists = s.atoms[:0], s.bonds[:0], s.lists[:0]
	for i := range m.Atoms {
		at := &m.Atoms[i]
		s.atoms = append(s.atoms, atomOf(at))
		s.lists = append(s.lists, at.Bonds...)
	}
	for i := range m.Bonds {
		s.bonds = append(s.bonds, bondOf(&m.Bonds[i]))
	}
}

// Forget makes s match no molecule.
func (s *Skeleton) Forget() { s.taken = false }

// Same reports whether m has the constitution last taken.
func (s *Skeleton) Same(m *notation.Molecule) bool {
	if !s.taken || m.Reading != s.reading || len(m.Atoms) != len(s.atoms) || len(m.Bonds) != len(s.bonds) {
		return false
	}
	for i := range m.Bonds {
		if s.bonds[i] != bondOf(&m.Bonds[i]) {
			return false
		}
	}
	k := 0
	for i := range m.Atoms {
		at := &m.Atoms[i]
		if s.atoms[i] != atomOf(at) || k+len(at.Bonds) > len(s.lists) {
			return false
		}
		for _, bi := range at.Bonds {
			if s.lists[k] != bi {
				return false
			}
			k++
		}
	}
	return true
}

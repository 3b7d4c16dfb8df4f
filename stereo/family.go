// This file implements the D/L descriptors of alpha-amino acids and
// monosaccharides (Fischer convention).

package stereo

import (
	"stereoline/notation"
	"stereoline/stereo/internal/ringgeom"
)

// Family is the D/L descriptor of the Fischer convention, which
// biochemists use for alpha-amino acids and monosaccharides beside the CIP
// labels. It is a geometric statement about one reference carbon, so it
// is computed from the mark, not from R/S (L-cysteine is R, L-serine S).
type Family uint8

// Families. FamilyNone means the structure has no reference carbon of a
// kind the convention covers, or its mark is missing.
const (
	FamilyNone Family = iota
	FamilyD
	FamilyL
)

func (f Family) String() string {
	switch f {
	case FamilyD:
		return "D"
	case FamilyL:
		return "L"
	}
	return ""
}

// FamilyKind says which convention a family descriptor follows.
type FamilyKind uint8

// Kinds of reference carbon.
const (
	FamilyAminoAcid FamilyKind = iota + 1 // the alpha carbon of an alpha-amino acid
	FamilySugar                           // the configurational reference carbon of a monosaccharide
)

func (k FamilyKind) String() string {
	switch k {
	case FamilyAminoAcid:
		return "alpha-amino acid"
	case FamilySugar:
		return "monosaccharide"
	}
	return ""
}

// FamilyLabel is the D/L descriptor of one reference carbon.
type FamilyLabel struct {
	Atom   int // 0-based reference carbon
	Kind   FamilyKind
	Family Family
}

// Families finds the reference carbons of alpha-amino acids and
// monosaccharides in m and gives each its D/L descriptor.
//
// In a Fischer projection the vertical bonds point away from the viewer
// and the horizontal ones towards. For an alpha-amino acid (carboxyl on
// top, side chain below) L has the amino group on the left; seen from the
// hydrogen that is carboxyl, side chain, amino group running clockwise
// (the "CORN" reading, common practice). For a monosaccharide the
// reference carbon is the stereocentre farthest from C1 (C5 of a hexose);
// D has its oxygen on the right, which seen from the hydrogen is the chain
// towards C1, the oxygen, the terminal carbon running clockwise. Both
// readings were derived from the projection's geometry.
func Families(m *notation.Molecule) []FamilyLabel {
	var out []FamilyLabel
	for c := range m.Atoms {
		a := &m.Atoms[c]
		if a.Number != notation.ElemC || a.Chirality.Class != notation.ChiralTH || a.HydrogenCount() != 1 || len(a.Bonds) != 3 {
			continue
		}
		if f, ok := aminoAcidFamily(m, c); ok {
			out = append(out, FamilyLabel{Atom: c, Kind: FamilyAminoAcid, Family: f})
			continue
		}
		if f, ok := sugarFamily(m, c); ok {
			out = append(out, FamilyLabel{Atom: c, Kind: FamilySugar, Family: f})
		}
	}
	return out
}

// aminoAcidFamily reads the alpha carbon c: bonded to an amino nitrogen,
// a carboxyl-type carbon (acid, ester, amide, carboxylate) and a side
// chain.
func aminoAcidFamily(m *notation.Molecule, c int) (Family, bool) {
	n, co, r := -1, -1, -1
	for i := range m.Atoms[c].Bonds {
		x := m.Neighbour(c, i)
		b := &m.Bonds[m.Atoms[c].Bonds[i]]
		if b.Kekule != 1 {
			return FamilyNone, false
		}
		switch {
		case m.Atoms[x].Number == notation.ElemN && !m.Atoms[x].Aromatic && n < 0:
			n = x
		case co < 0 && isCarboxylCarbon(m, x):
			co = x
		default:
			if r >= 0 {
				return FamilyNone, false
			}
			r = x
		}
	}
	if n < 0 || co < 0 || r < 0 {
		return FamilyNone, false
	}
	cw, ok := clockwiseFromHydrogen(m, c, co, r, n)
	if !ok {
		return FamilyNone, false
	}
	if cw {
		return FamilyL, true
	}
	return FamilyD, true
}

// isCarboxylCarbon reports a carbon with a double bond to oxygen and a
// single bond to oxygen or nitrogen.
func isCarboxylCarbon(m *notation.Molecule, x int) bool {
	if m.Atoms[x].Number != notation.ElemC {
		return false
	}
	oxo, single := false, false
	for _, bi := range m.Atoms[x].Bonds {
		b := &m.Bonds[bi]
		y := &m.Atoms[b.Other(x)]
		switch {
		case y.Number == notation.ElemO && b.Kekule == 2:
			oxo = true
		case (y.Number == notation.ElemO || y.Number == notation.ElemN) && b.Kekule == 1:
			single = true
		}
	}
	return oxo && single
}

// sugarFamily reads c as the reference carbon of a monosaccharide: one
// oxygen (hydroxyl, or the ring oxygen of a pyranose), a terminal carbon
// (CH2OH, or CH3 in 6-deoxy sugars) and a chain of oxygenated carbons
// towards C1, which is an aldehyde, a ketone, or an anomeric carbon with
// two oxygens.
func sugarFamily(m *notation.Molecule, c int) (Family, bool) {
	o, term, chain := -1, -1, -1
	for i := range m.Atoms[c].Bonds {
		x := m.Neighbour(c, i)
		if m.Bonds[m.Atoms[c].Bonds[i]].Kekule != 1 {
			return FamilyNone, false
		}
		switch m.Atoms[x].Number {
		case notation.ElemO:
			if o >= 0 {
				return FamilyNone, false
			}
			o = x
		case notation.ElemC:
			if isTerminalCarbon(m, x, c) && term < 0 {
				term = x
			} else if chain < 0 {
				chain = x
			} else {
				return FamilyNone, false
			}
		default:
			return FamilyNone, false
		}
	}
	if o < 0 || term < 0 || chain < 0 || !leadsToCarbonyl(m, c, chain) {
		return FamilyNone, false
	}
	cw, ok := clockwiseFromHydrogen(m, c, chain, o, term)
	if !ok {
		return FamilyNone, false
	}
	if cw {
		return FamilyD, true
	}
	return FamilyL, true
}

// isTerminalCarbon reports a carbon whose only carbon neighbour is from,
// carrying at least two hydrogens and otherwise only a single-bonded
// oxygen (CH2OH, CH2OR, CH2OP) or nothing (CH3).
func isTerminalCarbon(m *notation.Molecule, x, from int) bool {
	a := &m.Atoms[x]
	if a.Number != notation.ElemC || a.HydrogenCount() < 2 {
		return false
	}
	for _, bi := range a.Bonds {
		y := m.Bonds[bi].Other(x)
		if y == from {
			continue
		}
		if m.Atoms[y].Number != notation.ElemO || m.Bonds[bi].Kekule != 1 {
			return false
		}
	}
	return true
}

// leadsToCarbonyl walks the carbon chain from c through next, each carbon
// bearing an oxygen (one deoxy position allowed), until it meets C1: a
// carbon double-bonded to oxygen or bonded to two oxygens. At most six
// steps, the length of a heptose chain.
func leadsToCarbonyl(m *notation.Molecule, prev, cur int) bool {
	deoxy := 0
	for step := 0; step < 6; step++ {
		a := &m.Atoms[cur]
		if a.Number != notation.ElemC || a.Aromatic {
			return false
		}
		oxygens, oxo := 0, false
		next := -1
		for _, bi := range a.Bonds {
			b := &m.Bonds[bi]
			y := b.Other(cur)
			switch m.Atoms[y].Number {
			case notation.ElemO:
				oxygens++
				if b.Kekule == 2 {
					oxo = true
				}
			case notation.ElemC:
				if y != prev {
					if next >= 0 {
						next = -2 // branched: not a sugar chain
					} else if next == -1 {
						next = y
					}
				}
			}
		}
		if oxo || oxygens >= 2 {
			return step > 0 || oxo
		}
		if oxygens == 0 {
			deoxy++
			if deoxy > 1 {
				return false
			}
		}
		if next < 0 {
			return false
		}
		prev, cur = cur, next
	}
	return false
}

// clockwiseFromHydrogen reports whether, seen from the hydrogen of centre
// c, ligands x, y and z run clockwise according to the centre's mark.
func clockwiseFromHydrogen(m *notation.Molecule, c, x, y, z int) (bool, bool) {
	order, ok := NeighbourOrder(m, c)
	if !ok {
		return false, false
	}
	want := []int{ImplicitNeighbour, x, y, z}
	sign, ok := permutationSign(order, want)
	if !ok {
		return false, false
	}
	// the mark's hand seen from the first neighbour, read over want
	hand := ringgeom.MarkHand(m.Atoms[c].Chirality.Num).Permuted(ringgeom.Parity(sign))
	return hand == ringgeom.Clockwise, true
}

// NeighbourOrder returns the four ligands of a tetrahedral centre in the
// order its mark refers to (OpenSMILES 3.7): the preceding atom, the
// implicit hydrogen, ring closures, then branches and chain; a lone pair
// stands where the molecule's reading puts it. ok is false when the atom
// has no TH mark or not four ligands.
func NeighbourOrder(m *notation.Molecule, c int) ([]int, bool) {
	a := &m.Atoms[c]
	if a.Chirality.Class != notation.ChiralTH || (a.Chirality.Num != 1 && a.Chirality.Num != 2) {
		return nil, false
	}
	n := len(a.Bonds)
	implicit := a.HydrogenCount()
	if n+implicit != 4 && !(n == 3 && implicit == 0) {
		return nil, false
	}
	slot := a.HydrogenSlot()
	if implicit == 0 {
		slot = m.LonePairSlot(c)
	}
	order := make([]int, 0, 4)
	for i := 0; i < n; i++ {
		if i == slot && n < 4 {
			order = append(order, ImplicitNeighbour)
		}
		order = append(order, m.Neighbour(c, i))
	}
	if len(order) == 3 {
		order = append(order, ImplicitNeighbour)
	}
	return order, true
}

// permutationSign returns +1 when want is an even permutation of have,
// -1 when odd, and ok false when they hold different elements. Equal
// elements are matched in the order they stand.
func permutationSign(have, want []int) (int, bool) {
	if len(have) != len(want) {
		return 0, false
	}
	pos := make([]int, len(want))
	used := make([]bool, len(have))
	for i, w := range want {
		pos[i] = -1
		for j, h := range have {
			if !used[j] && h == w {
				pos[i], used[j] = j, true
				break
			}
		}
		if pos[i] < 0 {
			return 0, false
		}
	}
	parity, _ := ringgeom.PermutationParity(pos)
	return int(parity), true
}

// This file implements the transforms that name a unit: mirror, invert,
// flip and set a descriptor.

package transform

import (
	"fmt"
	"strconv"

	"stereoline/notation"
	"stereoline/stereo"
	"stereoline/stereo/identity"
)

// Codes of the errors the transforms return.
const (
	CodeNoUnit        notation.Code = "transform-no-unit"     // the atom or bond named is no stereogenic unit
	CodeNotSpecified  notation.Code = "transform-unspecified" // the unit has no configuration to invert or flip
	CodeBadDescriptor notation.Code = "transform-descriptor"  // the descriptor does not fit the unit
	CodeNotVerified   notation.Code = "transform-unverified"  // the rewritten text does not read as intended
)

// Transform is the result of a transform: the edits to make, and notes
// for the user (an achiral structure mirrored, a mark that could not be
// rewritten).
type Transform struct {
	Edits []notation.Edit
	Notes []string
}

func transformError(sp notation.Span, code notation.Code, format string, args ...any) *notation.Error {
	return &notation.Error{Span: sp, Code: code, Severity: notation.SeverityError, Msg: fmt.Sprintf(format, args...)}
}

// Mirror returns the edits that turn m into its mirror image: every
// tetrahedral and allene mark inverted, a trigonal-bipyramidal mark
// and an octahedral mark replaced by the permutation with the same axis
// and the opposite winding (notation.MirrorPermutation), square-planar
// marks (a planar arrangement is its own mirror image) and double bonds
// kept.
//
// Marks in or and and stereo groups are left alone: such a group stands
// for both configurations of its centres already, so the mirror image of
// the record inverts only the absolute ones, and a record whose every
// chiral mark sits in such groups is its own mirror image (said in a
// note, with no edits).
func Mirror(m *notation.Molecule) (Transform, error) {
	var t Transform
	if m == nil {
		return t, nil
	}
	grouped := groupedMarks(m)
	kept, inverted := 0, 0
	for a := range m.Atoms {
		ch := m.Atoms[a].Chirality
		switch ch.Class {
		case notation.ChiralTH, notation.ChiralAL:
			if grouped[a] {
				kept++
				continue
			}
			inverted++
			e, err := notation.InvertChirality(m, a)
			if err != nil {
				return Transform{}, err
			}
			t.Edits = append(t.Edits, e...)
		case notation.ChiralTB, notation.ChiralOH:
			n, ok := notation.MirrorPermutation(ch.Class, ch.Num)
			if !ok {
				t.Notes = append(t.Notes, fmt.Sprintf("atom %d: the mark's permutation number is out of range; left as written", a+1))
				continue
			}
			e, err := notation.SetChirality(m, a, "@"+ch.Class.String()+strconv.Itoa(n))
			if err != nil {
				return Transform{}, err
			}
			t.Edits = append(t.Edits, e...)
			inverted++
		}
	}
	if kept > 0 {
		if inverted == 0 {
			t.Notes = append(t.Notes, "every stereocentre sits in an or or and stereo group, which stands for both mirror images already: the mirror image is the same record")
			return t, nil
		}
		t.Notes = append(t.Notes, "the centres of or and and stereo groups keep their marks: each group stands for both of their configurations already")
	}
	switch id := identity.Identify(m); id.Chirality {
	case identity.Meso:
		t.Notes = append(t.Notes, "the structure is meso: its mirror image is the same compound")
	case identity.Achiral:
		t.Notes = append(t.Notes, "the structure is achiral: its mirror image is the same compound")
	}
	return t, nil
}

// unitAt finds the unit atom a belongs to: the centre of a tetrahedral or
// allene unit (or an allene terminal), or an end of a double bond.
func unitAt(an *stereo.Analysis, a int) (*stereo.Unit, bool) {
	for i := range an.Units {
		if an.Units[i].Centre == a {
			return &an.Units[i], true
		}
	}
	for i := range an.Units {
		for _, x := range an.Units[i].Atoms {
			if x == a {
				return &an.Units[i], true
			}
		}
	}
	return nil, false
}

func atomSpan(m *notation.Molecule, a int) notation.Span {
	if a >= 0 && a < len(m.Atoms) {
		return m.Atoms[a].Span
	}
	return notation.Span{}
}

// Invert returns the edits that invert the unit at atom a (0-based): the
// opposite mark on a tetrahedral or allene centre (an epimer), the other
// isomer of a double bond when a is one of its ends.
func Invert(m *notation.Molecule, a int) (Transform, error) {
	an := stereo.Analyze(m)
	u, ok := unitAt(an, a)
	if !ok {
		return Transform{}, transformError(atomSpan(m, a), CodeNoUnit, "atom %d is not part of a stereogenic unit", a+1)
	}
	if !u.Specified {
		return Transform{}, transformError(atomSpan(m, a), CodeNotSpecified, "atom %d: the %s unit has no configuration to invert", a+1, u.Kind)
	}
	if u.Kind == stereo.KindDoubleBond {
		return flipUnit(m, an, u)
	}
	if u.Kind != stereo.KindTetrahedral && u.Kind != stereo.KindAllene {
		return Transform{}, transformError(atomSpan(m, a), CodeNoUnit, "atom %d: a %s mark cannot be inverted", a+1, u.Kind)
	}
	if g := groupOf(an, u); g != nil && g.Kind != notation.GroupAbsolute {
		return invertInGroup(m, an, u, g)
	}
	e, err := notation.InvertChirality(m, u.Centre)
	if err != nil {
		return Transform{}, err
	}
	t := Transform{Edits: e}
	if msg, bad := newImpossibility(m, an, e); bad {
		t.Notes = append(t.Notes, fmt.Sprintf("atom %d inverted, but the result cannot exist: %s", a+1, msg))
	}
	return t, nil
}

// newImpossibility reports a mark the engine finds impossible after the
// edits but not before: inverting one bridgehead of a small bicycle, say,
// whose configuration is tied to the other bridgehead's.
func newImpossibility(m *notation.Molecule, an *stereo.Analysis, edits []notation.Edit) (string, bool) {
	text, err := notation.ApplyEdits(m.Text, edits)
	if err != nil {
		return "", false
	}
	count := func(a *stereo.Analysis) int {
		n := 0
		for _, d := range a.Diagnostics {
			if d.Code == stereo.CodeImpossibleCenter {
				n++
			}
		}
		return n
	}
	after := stereo.Analyze(notation.ReadWith(text, m.Reading))
	if count(after) <= count(an) {
		return "", false
	}
	for _, d := range after.Diagnostics {
		if d.Code == stereo.CodeImpossibleCenter {
			return d.Msg, true
		}
	}
	return "", false
}

// Flip returns the edits that turn the double bond between atoms a and b
// (0-based; for a cumulene, its terminal atoms) into the other isomer.
func Flip(m *notation.Molecule, a, b int) (Transform, error) {
	an := stereo.Analyze(m)
	for i := range an.Units {
		u := &an.Units[i]
		if u.Kind != stereo.KindDoubleBond || len(u.Atoms) != 2 {
			continue
		}
		if (u.Atoms[0] == a && u.Atoms[1] == b) || (u.Atoms[0] == b && u.Atoms[1] == a) {
			if !u.Specified {
				return Transform{}, transformError(atomSpan(m, a), CodeNotSpecified, "the double bond %d-%d has no configuration to flip", a+1, b+1)
			}
			return flipUnit(m, an, u)
		}
	}
	return Transform{}, transformError(atomSpan(m, a), CodeNoUnit, "atoms %d and %d are not the ends of a stereogenic double bond", a+1, b+1)
}

// SetDescriptor returns the edits that give the unit at atom a the
// descriptor d: R or S for a tetrahedral centre, M or P for an allene, E
// or Z for a double bond. The label of the current marks decides: when it
// differs the unit is inverted or flipped; when the unit is unmarked a
// mark is added and checked by labelling the rewritten text.
func SetDescriptor(m *notation.Molecule, a int, d stereo.Descriptor) (Transform, error) {
	an := stereo.Analyze(m)
	u, ok := unitAt(an, a)
	if !ok {
		return Transform{}, transformError(atomSpan(m, a), CodeNoUnit, "atom %d is not part of a stereogenic unit", a+1)
	}
	want := map[stereo.Kind][2]stereo.Descriptor{stereo.KindTetrahedral: {stereo.DescR, stereo.DescS}, stereo.KindAllene: {stereo.DescM, stereo.DescP}, stereo.KindDoubleBond: {stereo.DescE, stereo.DescZ}}[u.Kind]
	if d != want[0] && d != want[1] || want[0] == stereo.DescNone {
		return Transform{}, transformError(atomSpan(m, a), CodeBadDescriptor, "a %s unit takes %s or %s, not %s", u.Kind, want[0], want[1], d)
	}
	if g := groupOf(an, u); g != nil && g.Kind != notation.GroupAbsolute && u.Specified && u.Descriptor.Labelled() && !u.Descriptor.Pseudo() {
		return setInGroup(m, an, u, g, d)
	}
	if u.Specified {
		switch {
		case u.Descriptor == d:
			return Transform{}, nil
		case u.Descriptor.Pseudo():
			return Transform{}, transformError(atomSpan(m, a), CodeBadDescriptor, "atom %d is pseudoasymmetric (%s): it takes a lowercase descriptor", a+1, u.Descriptor)
		case !u.Descriptor.Labelled():
			return Transform{}, transformError(atomSpan(m, a), CodeBadDescriptor, "atom %d has no CIP label to compare with", a+1)
		}
		if u.Kind == stereo.KindDoubleBond {
			return flipUnit(m, an, u)
		}
		e, err := notation.InvertChirality(m, u.Centre)
		if err != nil {
			return Transform{}, err
		}
		if msg, bad := newImpossibility(m, an, e); bad {
			return Transform{}, transformError(atomSpan(m, a), CodeNotVerified, "atom %d cannot be %s on its own: %s", a+1, d, msg)
		}
		if got, ok := labelAfter(m, e, u); !ok || got != d {
			return Transform{}, transformError(atomSpan(m, a), CodeNotVerified, "inverting atom %d does not give %s", a+1, d)
		}
		return Transform{Edits: e}, nil
	}
	return markUnit(m, u, d)
}

// markUnit adds marks to an unmarked unit and keeps the choice whose
// label is d.
func markUnit(m *notation.Molecule, u *stereo.Unit, d stereo.Descriptor) (Transform, error) {
	var tries [][]notation.Edit
	switch u.Kind {
	case stereo.KindTetrahedral, stereo.KindAllene:
		for _, mark := range []string{"@", "@@"} {
			e, err := notation.SetChirality(m, u.Centre, mark)
			if err != nil {
				return Transform{}, err
			}
			tries = append(tries, e)
		}
	case stereo.KindDoubleBond:
		for _, dir := range []notation.Direction{notation.DirUp, notation.DirDown} {
			e, err := markDoubleBond(m, u, dir)
			if err != nil {
				return Transform{}, err
			}
			tries = append(tries, e)
		}
	}
	for _, e := range tries {
		if got, ok := labelAfter(m, e, u); ok && got == d {
			return Transform{Edits: e}, nil
		}
	}
	return Transform{}, transformError(atomSpan(m, u.Atoms[0]), CodeNotVerified, "no mark gives this unit the label %s", d)
}

// labelAfter applies edits, labels the result and returns the label of
// the unit on the same atoms.
func labelAfter(m *notation.Molecule, edits []notation.Edit, u *stereo.Unit) (stereo.Descriptor, bool) {
	text, err := notation.ApplyEdits(m.Text, edits)
	if err != nil {
		return stereo.DescNone, false
	}
	an := stereo.Analyze(notation.ReadWith(text, m.Reading))
	for i := range an.Units {
		v := &an.Units[i]
		if v.Kind == u.Kind && sameAtoms(v.Atoms, u.Atoms) && v.Specified {
			return v.Descriptor, true
		}
	}
	return stereo.DescNone, false
}

func sameAtoms(a, b []int) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if a[i] != b[i] {
			return false
		}
	}
	return true
}

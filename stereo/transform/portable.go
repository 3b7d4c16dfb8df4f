// This file implements Portable: the rewrite of a record whose marks
// general-purpose readers read differently into a writing they all read
// alike.

package transform

import (
	"fmt"
	"slices"
	"strings"

	"stereoline/notation"
	"stereoline/stereo"
	"stereoline/stereo/identity"
)

// Portable returns the edits that rewrite m into a writing with the same
// meaning under every reading (notation.Readings), the meaning being the
// one m has under its own reading:
//   - the same direction mark on both digits of a ring closure: the mark
//     the reading uses is kept at the opening digit and the other
//     removed (both, where the reading drops the pair);
//   - a lone-pair centre that starts its part or carries ring-closure
//     digits: the record is written again by notation.Write, which starts
//     no part at such a centre and writes all its bonds as chain and
//     branch bonds, with every mark rewritten for the new order (an
//     extension block is renumbered with the atoms).
//
// The result is read again under every reading and must give every unit
// the label it has now, and the same identity key; otherwise the
// rewrite is refused (CodeNotVerified). '@' on an allene has no portable
// writing (no surveyed library keeps it); it is left and noted. A record
// with nothing open gets no edits.
func Portable(m *notation.Molecule) (Transform, error) {
	var t Transform
	if m == nil {
		return t, nil
	}
	var lonePair bool
	var ringPairs []int
	for _, o := range stereo.OpenMarks(m) {
		switch o.Kind {
		case stereo.OpenLonePair:
			lonePair = true
		case stereo.OpenRingMarks:
			ringPairs = append(ringPairs, o.Bond)
		case stereo.OpenAllene:
			t.Notes = append(t.Notes, fmt.Sprintf("atom %d: '@' on an allene is dropped by %s; no writing keeps it for them", o.Atom+1, notation.ReadersAll))
		}
	}
	if !lonePair && len(ringPairs) == 0 {
		return t, nil
	}
	if m.Errors.HasErrors() {
		return Transform{}, transformError(notation.Span{}, CodeNotVerified, "the record does not read without errors; it is not rewritten")
	}
	var text string
	var order []int // order[i]: the atom of m that is atom i of text
	if lonePair {
		w := notation.Write(m, notation.WriteOptions{})
		if len(w.Unadjusted) > 0 || len(w.Dropped) > 0 || len(w.DroppedFields) > 0 {
			return Transform{}, transformError(notation.Span{}, CodeNotVerified, "the record cannot be written again without losing a mark, a bond or an extension field")
		}
		text, order = w.Text, w.Order
		t.Edits = []notation.Edit{{Span: notation.Span{Start: 0, End: len(m.Text)}, New: text}}
	} else {
		for _, bi := range ringPairs {
			b := &m.Bonds[bi]
			e, err := notation.SetBondDirection(m, bi, b.Begin, m.BondDir(bi, b.Begin))
			if err != nil {
				return Transform{}, err
			}
			t.Edits = append(t.Edits, e...)
		}
		var err error
		if text, err = notation.ApplyEdits(m.Text, t.Edits); err != nil {
			return Transform{}, err
		}
		order = make([]int, len(m.Atoms))
		for i := range order {
			order[i] = i
		}
	}
	if err := samePortably(m, text, order); err != nil {
		return Transform{}, err
	}
	return t, nil
}

// samePortably checks that text, whose atom i is atom order[i] of m,
// reads under every reading as m reads under its own: the same labels on
// the same atoms, the same identity key, and no lone-pair or ring-mark
// construct left open.
func samePortably(m *notation.Molecule, text string, order []int) error {
	want := unitLabels(stereo.Analyze(m), nil)
	var wantKey string
	if !m.Reaction {
		wantKey = identity.Identify(m).Key
	}
	for _, r := range notation.Readings() {
		got := notation.ReadWith(text, r)
		fail := func(format string, args ...any) error {
			return transformError(notation.Span{}, CodeNotVerified, "the portable writing %s, read with %s, %s", text, r, fmt.Sprintf(format, args...))
		}
		if got.Errors.HasErrors() || len(got.Atoms) != len(order) {
			return fail("does not read as the same atoms")
		}
		for _, o := range stereo.OpenMarks(got) {
			if o.Kind != stereo.OpenAllene {
				return fail("still holds a mark readers read differently")
			}
		}
		if have := unitLabels(stereo.Analyze(got), order); !slices.Equal(have, want) {
			return fail("labels %s, not %s", strings.Join(have, " "), strings.Join(want, " "))
		}
		if !m.Reaction && identity.Identify(got).Key != wantKey {
			return fail("is another structure")
		}
	}
	return nil
}

// unitLabels lists the specified units of an analysis as kind, atoms (of
// the original molecule, through order when it is not nil) and label,
// sorted.
func unitLabels(an *stereo.Analysis, order []int) []string {
	var out []string
	for _, u := range an.Units {
		if !u.Specified {
			continue
		}
		atoms := slices.Clone(u.Atoms)
		for i, a := range atoms {
			if order != nil {
				atoms[i] = order[a]
			}
		}
		slices.Sort(atoms)
		out = append(out, fmt.Sprintf("%s%v%s", u.Kind, atoms, u.Descriptor))
	}
	slices.Sort(out)
	return out
}

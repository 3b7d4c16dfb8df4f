package document

import (
	"fmt"

	"stereoline/notation"
	"stereoline/stereo"
	"stereoline/stereo/identity"
	"stereoline/stereo/transform"
)

// rewrites returns the stereo rewrites for span: the mirror image of
// every record the span touches (all of them at once for a selection),
// and, at a cursor or a selection inside one record, inverting, flipping
// and setting the unit there.
func (r *Result) rewrites(span notation.Span) []Action {
	var recs []int
	for i := range r.Records {
		s := r.Records[i].Occ.Span
		if s.Overlaps(span) || span.Len() == 0 && span.Start >= s.Start && span.Start <= s.End {
			recs = append(recs, i)
		}
	}
	if len(recs) == 0 {
		return nil
	}
	var out []Action
	if a, ok := r.mirror(recs); ok {
		out = append(out, a)
	}
	if len(recs) == 1 {
		out = append(out, r.unitRewrites(recs[0], span)...)
	}
	return out
}

// mirror writes the enantiomer of each record that has one.
func (r *Result) mirror(recs []int) (Action, bool) {
	var edits []Edit
	for _, i := range recs {
		rec := &r.Records[i]
		if rec.Mol.Errors.HasErrors() {
			continue
		}
		t, err := transform.Mirror(rec.Mol)
		if err != nil || len(t.Edits) == 0 {
			continue
		}
		edits = append(edits, r.hostEdits(i, t.Edits)...)
	}
	if len(edits) == 0 {
		return Action{}, false
	}
	title := "Mirror: write the enantiomer"
	if len(recs) > 1 {
		title = fmt.Sprintf("Mirror %d records: write their enantiomers", len(recs))
	} else if id := r.Records[recs[0]].Identify(); id != nil && id.Chirality != identity.Chiral {
		title = fmt.Sprintf("Mirror (the structure is %s: the mirror image is the same compound)", id.Chirality)
	}
	return Action{Title: title, Kind: KindMirror, Edits: edits, Diagnostic: -1}, true
}

// unitRewrites offers invert, flip and set for the unit at the cursor.
func (r *Result) unitRewrites(i int, span notation.Span) []Action {
	rec := &r.Records[i]
	if rec.Mol.Errors.HasErrors() {
		return nil
	}
	n, ok := rec.Occ.NotationOffset(span.Start)
	if !ok {
		return nil
	}
	m := rec.Mol
	u := unitAt(rec, n)
	if u == nil {
		return nil
	}
	var out []Action
	add := func(kind, title string, t transform.Transform, err error) {
		if err != nil || len(t.Edits) == 0 {
			return
		}
		out = append(out, Action{Title: title, Kind: kind, Edits: r.hostEdits(i, t.Edits), Diagnostic: -1})
	}
	name := unitName(m, u)
	first := u.Centre
	if first < 0 {
		first = u.Atoms[0]
	}
	if u.Specified {
		if u.Kind == stereo.KindDoubleBond {
			t, err := transform.Flip(m, u.Atoms[0], u.Atoms[1])
			add(KindFlip, fmt.Sprintf("Flip %s (%s to %s)", name, u.Descriptor, otherOf(u.Descriptor)), t, err)
		} else if u.Kind == stereo.KindTetrahedral || u.Kind == stereo.KindAllene {
			t, err := transform.Invert(m, first)
			add(KindInvert, fmt.Sprintf("Invert %s (%s to %s)", name, u.Descriptor, otherOf(u.Descriptor)), t, err)
		}
	}
	for _, d := range choices(u.Kind) {
		if u.Specified && u.Descriptor == d {
			continue
		}
		t, err := transform.SetDescriptor(m, first, d)
		add(KindSet, fmt.Sprintf("Set %s to %s", name, d), t, err)
	}
	return out
}

// unitAt returns the unit whose atom, double bond or mark holds notation
// offset n.
func unitAt(rec *Record, n int) *stereo.Unit {
	m := rec.Mol
	if a := atomAt(m, n); a >= 0 {
		if u := unitOfAtom(rec.Stereo, a); u != nil {
			return u
		}
		for k := range rec.Stereo.Units {
			u := &rec.Stereo.Units[k]
			if u.Kind == stereo.KindDoubleBond && (u.Atoms[0] == a || u.Atoms[1] == a) {
				return u
			}
		}
	}
	if bi := bondAt(m, n); bi >= 0 {
		return unitOfBond(rec.Stereo, m, bi)
	}
	return nil
}

func unitName(m *notation.Molecule, u *stereo.Unit) string {
	if u.Kind == stereo.KindDoubleBond && len(u.Atoms) == 2 {
		return AtomName(m, u.Atoms[0]) + "=" + AtomName(m, u.Atoms[1])
	}
	if u.Centre >= 0 {
		return AtomName(m, u.Centre)
	}
	return AtomName(m, u.Atoms[0])
}

func choices(k stereo.Kind) []stereo.Descriptor {
	switch k {
	case stereo.KindTetrahedral:
		return []stereo.Descriptor{stereo.DescR, stereo.DescS}
	case stereo.KindDoubleBond:
		return []stereo.Descriptor{stereo.DescE, stereo.DescZ}
	case stereo.KindAllene:
		return []stereo.Descriptor{stereo.DescM, stereo.DescP}
	}
	return nil
}

func otherOf(d stereo.Descriptor) string {
	switch d {
	case stereo.DescR:
		return "S"
	case stereo.DescS:
		return "R"
	case stereo.DescE:
		return "Z"
	case stereo.DescZ:
		return "E"
	case stereo.DescM:
		return "P"
	case stereo.DescP:
		return "M"
	}
	return d.Mirror().String()
}

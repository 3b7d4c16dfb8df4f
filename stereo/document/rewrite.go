package document

import (
	"fmt"
	"strings"

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
		if rec.Mol().Errors.HasErrors() {
			continue
		}
		t, err := transform.Mirror(rec.Mol())
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
	if rec.Mol().Errors.HasErrors() {
		return nil
	}
	n, ok := rec.Occ.NotationOffset(span.Start)
	if !ok {
		return nil
	}
	m := rec.Mol()
	var out []Action
	add := func(kind, title string, t transform.Transform, err error) {
		if err != nil || len(t.Edits) == 0 {
			return
		}
		out = append(out, Action{Title: title, Kind: kind, Edits: r.hostEdits(i, t.Edits), Diagnostic: -1})
	}
	u := unitAt(rec, n)
	if u == nil {
		if gi, _ := groupFieldAt(m, n); gi >= 0 {
			r.groupRewrites(i, gi, add)
		}
		return out
	}
	name := unitName(m, u)
	first := u.Centre
	if first < 0 {
		first = u.Atoms[0]
	}
	if u.Group >= 0 && u.GroupKind != notation.GroupAbsolute {
		g := &rec.Stereo().Groups[u.Group]
		t, err := transform.Invert(m, first)
		add(KindInvert, fmt.Sprintf("Invert %s within stereo group %s (%s to %s)", name, g.Label(), u.GroupLabel(), starredMirror(u)), t, err)
		for _, d := range choices(u.Kind) {
			if d == u.Relative {
				continue
			}
			t, err := transform.SetDescriptor(m, first, d)
			add(KindSet, fmt.Sprintf("Set %s to %s in stereo group %s", name, starred(d, u.GroupKind), g.Label()), t, err)
		}
		r.groupRewrites(i, g.Block, add)
		return out
	}
	if u.Specified && u.Group < 0 && u.GroupKind == notation.GroupAbsolute {
		r.markRewrites(i, add)
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

// groupRewrites offers to make the or or and group gi of record i's
// block absolute, as written or as its mirror image, and to mark its
// centres the other way (relative for racemic, racemic for relative).
func (r *Result) groupRewrites(i, gi int, add func(kind, title string, t transform.Transform, err error)) {
	rec := &r.Records[i]
	m, an := rec.Mol(), rec.Stereo()
	sg := &m.Extension.Groups[gi]
	if sg.Kind == notation.GroupAbsolute {
		return
	}
	var first *stereo.Unit
	var atoms []int
	for k := range an.Groups {
		if an.Groups[k].Block != gi {
			continue
		}
		for _, ui := range an.Groups[k].Units {
			u := &an.Units[ui]
			atoms = append(atoms, u.Centre)
			if first == nil && u.Descriptor.Labelled() && !u.Descriptor.Pseudo() {
				first = u
			}
		}
	}
	t, err := transform.MakeAbsolute(m, gi, -1, stereo.DescNone)
	add(KindAbsolute, fmt.Sprintf("Make stereo group %s absolute as written: %s", sg.Label(), transformedLabels(m, t, atoms)), t, err)
	if first != nil {
		t, err := transform.MakeAbsolute(m, gi, first.Centre, first.Descriptor.Mirror())
		add(KindAbsolute, fmt.Sprintf("Make stereo group %s absolute as its mirror image: %s", sg.Label(), transformedLabels(m, t, atoms)), t, err)
	}
	other, word, kind := notation.GroupAnd, "racemic", KindRacemic
	if sg.Kind == notation.GroupAnd {
		other, word, kind = notation.GroupOr, "relative (one enantiomer, unknown which)", KindRelative
	}
	t, err = transform.MarkGroup(m, atoms, other)
	add(kind, fmt.Sprintf("Mark stereo group %s as %s", sg.Label(), word), t, err)
}

// markRewrites offers to put every absolute chiral centre of record i
// into one or group (relative) or one and group (racemic).
func (r *Result) markRewrites(i int, add func(kind, title string, t transform.Transform, err error)) {
	rec := &r.Records[i]
	var atoms []int
	for _, u := range rec.Stereo().Units {
		if u.GroupKind == notation.GroupAbsolute && u.Group < 0 {
			atoms = append(atoms, u.Centre)
		}
	}
	if len(atoms) == 0 {
		return
	}
	names := make([]string, len(atoms))
	for k, a := range atoms {
		names[k] = AtomName(rec.Mol(), a)
	}
	list := strings.Join(names, ", ")
	t, err := transform.MarkGroup(rec.Mol(), atoms, notation.GroupOr)
	add(KindRelative, fmt.Sprintf("Mark %s as relative configuration (an or group)", list), t, err)
	t, err = transform.MarkGroup(rec.Mol(), atoms, notation.GroupAnd)
	add(KindRacemic, fmt.Sprintf("Mark %s as racemic (an and group)", list), t, err)
}

// transformedLabels writes the labels of the centres at atoms after a
// rewrite: "(2R,4S)"; "" when the rewrite failed.
func transformedLabels(m *notation.Molecule, t transform.Transform, atoms []int) string {
	text, err := notation.ApplyEdits(m.Text, t.Edits)
	if err != nil {
		return ""
	}
	an := stereo.Analyze(notation.ReadWith(text, m.Reading))
	want := make(map[int]bool, len(atoms))
	for _, a := range atoms {
		want[a] = true
	}
	var parts []string
	for _, u := range an.Units {
		if u.Centre >= 0 && u.Kind != stereo.KindDoubleBond && want[u.Centre] && u.Descriptor.Labelled() {
			parts = append(parts, fmt.Sprintf("%d%s", u.Centre+1, u.Descriptor))
		}
	}
	return "(" + strings.Join(parts, ",") + ")"
}

// starred writes a descriptor in a group's frame: R* in an or group, RS
// in an and group.
func starred(d stereo.Descriptor, k notation.GroupKind) string {
	u := stereo.Unit{Relative: d, GroupKind: k}
	return u.GroupLabel()
}

// starredMirror is the unit's label in its group's frame, inverted.
func starredMirror(u *stereo.Unit) string { return starred(u.Relative.Mirror(), u.GroupKind) }

// unitAt returns the unit whose atom, double bond or mark holds notation
// offset n.
func unitAt(rec *Record, n int) *stereo.Unit {
	m := rec.Mol()
	if a := atomAt(m, n); a >= 0 {
		if u := unitOfAtom(rec.Stereo(), a); u != nil {
			return u
		}
		for k := range rec.Stereo().Units {
			u := &rec.Stereo().Units[k]
			if u.Kind == stereo.KindDoubleBond && (u.Atoms[0] == a || u.Atoms[1] == a) {
				return u
			}
		}
	}
	if bi := bondAt(m, n); bi >= 0 {
		return unitOfBond(rec.Stereo(), m, bi)
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

package document

import (
	"fmt"

	"stereoline/notation"
	"stereoline/stereo"
	"stereoline/stereo/identity"
	"stereoline/stereo/transform"
)

// notationFix returns the quick fix of a stereo finding e of the full
// analysis f, in the notation's offsets (no edits: none): the
// ineffective or inverting mark removed, the partner mark of a one-sided
// double bond added, a mark readers read differently rewritten portably,
// or a stereo group mended. Every fix but the portable rewrite is a
// minimal edit of the marks; the portable rewrite of a lone-pair centre
// writes the record again. Result.hostEdits maps it to the host.
func notationFix(f *fullAnalysis, e *notation.Error) noteFix {
	m := f.mol
	var edits []notation.Edit
	var title string
	switch e.Code {
	case stereo.CodeIneffectiveCenter, stereo.CodeInvertingNitrogen:
		for a := range m.Atoms {
			at := &m.Atoms[a]
			if at.Chirality.Class == notation.ChiralNone || !at.Chirality.Span.Overlaps(e.Span) && !at.Span.Overlaps(e.Span) {
				continue
			}
			if ed, err := notation.SetChirality(m, a, ""); err == nil {
				edits = append(edits, ed...)
			}
		}
		title = "remove the ineffective mark"
		if e.Code == stereo.CodeInvertingNitrogen {
			title = "remove the mark: this nitrogen inverts"
		}
	case stereo.CodeIneffectiveBond:
		for bi := range m.Bonds {
			b := &m.Bonds[bi]
			if b.Dir == notation.DirNone && b.CloseDir == notation.DirNone {
				continue
			}
			if !b.Span.Overlaps(e.Span) && !(b.Ring && b.CloseSpan.Overlaps(e.Span)) {
				continue
			}
			if ed, err := notation.SetBondDirection(m, bi, b.Begin, notation.DirNone); err == nil {
				edits = append(edits, ed...)
			}
		}
		title = "remove the ineffective direction marks"
	case stereo.CodeOneSidedBond:
		edits = partnerMark(f, e.Span)
		title = "add the partner mark (puts the marked neighbours trans: check it)"
	case stereo.CodeReaderDependent:
		// the whole record, once, whichever of its open marks the
		// finding is on: the rewrite settles them all
		if t, err := transform.Portable(m); err == nil {
			edits = t.Edits
		}
		title = "rewrite the record so that every reader surveyed reads it alike"
	case stereo.CodeGroupIneffectiveMember, stereo.CodeGroupAcrossComponents, stereo.CodeGroupRepeatedTag, identity.CodeGroupAddsNothing:
		edits, title = groupFix(m, e)
	}
	if len(edits) == 0 {
		return noteFix{}
	}
	return noteFix{title: title, edits: edits}
}

// groupFix returns the quick fix of a finding about a stereo group: the
// member removed from its group, the group split by component, a
// repeated tag renumbered as RDKit reads it, or the group that adds
// nothing removed. Each is a minimal edit of the extension block.
func groupFix(m *notation.Molecule, e *notation.Error) ([]notation.Edit, string) {
	ext := m.Extension
	if ext == nil {
		return nil, ""
	}
	for gi := range ext.Groups {
		sg := &ext.Groups[gi]
		if sg.Field < 0 || sg.Field >= len(ext.Fields) {
			continue
		}
		f := &ext.Fields[sg.Field]
		switch e.Code {
		case stereo.CodeGroupIneffectiveMember:
			for k, s := range sg.AtomSpans {
				if s == e.Span {
					ed, err := notation.RemoveGroupAtom(m, gi, sg.Atoms[k])
					if err != nil {
						return nil, ""
					}
					return ed, fmt.Sprintf("remove atom %d from stereo group %s", sg.Atoms[k]+1, sg.Label())
				}
			}
		case stereo.CodeGroupAcrossComponents:
			if f.Span == e.Span {
				t, err := transform.SplitGroup(m, gi)
				if err != nil {
					return nil, ""
				}
				return t.Edits, fmt.Sprintf("give each component its own group in place of %s", sg.Label())
			}
		case stereo.CodeGroupRepeatedTag:
			if f.Tag == e.Span {
				n := notation.FreeGroupNumber(m, sg.Kind)
				ed, err := notation.SetGroupKind(m, gi, sg.Kind, n)
				if err != nil {
					return nil, ""
				}
				return ed, fmt.Sprintf("number this group %s%d, as RDKit reads it (a group of its own)", sg.Kind.Prefix(), n)
			}
		case identity.CodeGroupAddsNothing:
			if f.Span == e.Span {
				ed, err := notation.RemoveStereoGroup(m, gi)
				if err != nil {
					return nil, ""
				}
				return ed, fmt.Sprintf("remove stereo group %s, which adds nothing", sg.Label())
			}
		}
	}
	return nil, ""
}

// partnerMark returns the edits that complete the one double bond whose
// mark sits at span, leaving other one-sided bonds of the record alone.
func partnerMark(f *fullAnalysis, span notation.Span) []notation.Edit {
	m := f.mol
	t, err := transform.CompleteOneSided(m)
	if err != nil {
		return nil
	}
	var unit *stereo.Unit
	for k := range f.stereo.Units {
		u := &f.stereo.Units[k]
		if u.Kind != stereo.KindDoubleBond || u.Specified {
			continue
		}
		for _, s := range u.Marks {
			if s.Overlaps(span) {
				unit = u
			}
		}
	}
	if unit == nil {
		return nil
	}
	near := map[int]bool{}
	for _, a := range unit.Atoms {
		near[a] = true
	}
	var out []notation.Edit
	for _, ed := range t.Edits {
		for bi := range m.Bonds {
			b := &m.Bonds[bi]
			if !near[b.Begin] && !near[b.End] {
				continue
			}
			if b.Span.Overlaps(ed.Span) || b.Ring && b.CloseSpan.Overlaps(ed.Span) || b.Span.Len() == 0 && b.Span.Start == ed.Span.Start {
				out = append(out, ed)
				break
			}
		}
	}
	return out
}

// hostEdits maps notation edits of record i to host edits, writing the
// new text as the host must hold it.
func (r *Result) hostEdits(i int, edits []notation.Edit) []Edit {
	occ := r.Records[i].Occ
	out := make([]Edit, 0, len(edits))
	for _, e := range edits {
		out = append(out, Edit{Span: occ.HostSpan(e.Span), NewText: occ.Encode(e.New)})
	}
	return out
}

package notation

import (
	"sort"
	"strconv"
)

// This file implements minimal text edits of the stereo groups of an
// extension block: the building blocks of rewrites that make a group
// absolute, mark centres as relative or racemic, or take a centre out of
// a group. Each function returns edits against m.Text that touch only the
// block (or insert one after the notation); the rest of the record,
// titles and other fields stay byte for byte. Edits from two calls may
// overlap: to combine changes, apply one set and read the record again.

// FreeGroupNumber returns the lowest number n >= 1 that no group of the
// kind is written with in m's block (1 when m has none), for a new o<n> or
// &<n> group. Numbers of absolute groups are not written; it returns 0
// for GroupAbsolute.
func FreeGroupNumber(m *Molecule, kind GroupKind) int {
	if kind == GroupAbsolute {
		return 0
	}
	used := map[int]bool{}
	if m.Extension != nil {
		for _, g := range m.Extension.Groups {
			if g.Kind == kind {
				used[g.Number] = true
			}
		}
	}
	n := 1
	for used[n] {
		n++
	}
	return n
}

// AddStereoGroup returns the edit that adds a stereo group of the kind
// over atoms (0-based indices through the whole record), written in
// ascending order: "a:1,3", "o<number>:1,3" or "&<number>:1,3". The group
// goes at the end of m's block, or into a new block " |...|" after the
// notation when m has none. An atom already in a group, an index outside
// the record, a tag already used ("a" included: readers would take the
// two for one group or two) and a block that is never closed are errors.
func AddStereoGroup(m *Molecule, kind GroupKind, number int, atoms []int) ([]Edit, error) {
	if kind != GroupAbsolute && kind != GroupOr && kind != GroupAnd {
		return nil, editError(Span{}, CodeEditUnsupported, "no such stereo group kind")
	}
	if len(atoms) == 0 {
		return nil, editError(Span{}, CodeEditUnsupported, "a stereo group needs at least one atom")
	}
	if kind != GroupAbsolute && number < 0 {
		return nil, editError(Span{}, CodeEditUnsupported, "a group number is not negative")
	}
	groups := m.AtomGroups()
	sorted := append([]int(nil), atoms...)
	sort.Ints(sorted)
	for i, a := range sorted {
		if a < 0 || a >= len(m.Atoms) {
			return nil, editError(Span{}, CodeEditRange, "no such atom")
		}
		if i > 0 && sorted[i-1] == a {
			return nil, editError(m.Atoms[a].Span, CodeEditUnsupported, "atom listed twice")
		}
		if g := groups[a]; g >= 0 {
			return nil, editError(m.Atoms[a].Span, CodeEditUnsupported, "atom already in stereo group "+m.Extension.Groups[g].Label())
		}
	}
	g := StereoGroup{Kind: kind, Number: number}
	if kind == GroupAbsolute {
		g.Number = 0
	}
	field := g.Label() + ":" + joinInts(sorted)
	ext := m.Extension
	if ext == nil {
		end := m.NotationEnd()
		return []Edit{{Span: Span{end, end}, New: " |" + field + "|"}}, nil
	}
	if !ext.Closed {
		return nil, editError(ext.Span, CodeEditUnsupported, "the extension block is not closed")
	}
	for _, h := range ext.Groups {
		if h.Kind == kind && h.Number == g.Number && h.Field >= 0 {
			// Two fields with one tag are one group to some readers and
			// two to others (RDKit 2022.09.3); an absolute group is one.
			return nil, editError(ext.Fields[h.Field].Span, CodeEditUnsupported, "stereo group "+g.Label()+" already exists; add the atoms to it")
		}
	}
	at := ext.Span.End - 1 // the closing '|'
	if len(ext.Fields) > 0 && m.Text[at-1] != ',' {
		field = "," + field
	}
	return []Edit{{Span: Span{at, at}, New: field}}, nil
}

// RemoveStereoGroup returns the edit that removes group gi (an index into
// m.Extension.Groups) with one comma beside it; removing the only field
// of the block removes the block and the whitespace before it.
func RemoveStereoGroup(m *Molecule, gi int) ([]Edit, error) {
	f, err := groupField(m, gi)
	if err != nil {
		return nil, err
	}
	return []Edit{{Span: removeFieldSpan(m, f), New: ""}}, nil
}

// removeFieldSpan is what removing field f deletes: the field and the
// comma after it, or the comma before it when it is the last field, or
// the whole block with its separator when it is the only field.
func removeFieldSpan(m *Molecule, f *Field) Span {
	ext := m.Extension
	if len(ext.Fields) == 1 {
		return Span{ext.Separator.Start, ext.Span.End}
	}
	s := f.Span
	inside := ext.Span.End - 1
	if !ext.Closed {
		inside = ext.Span.End
	}
	switch {
	case s.End < inside && m.Text[s.End] == ',':
		s.End++
	case s.Start > ext.Span.Start+1 && m.Text[s.Start-1] == ',':
		s.Start--
	}
	return s
}

// SetGroupKind returns the edit that retags group gi as a group of the
// kind with number (ignored for GroupAbsolute): "o1:1,3" becomes "&1:1,3"
// (the racemate of what was one enantiomer, unknown which) or "a:1,3".
// Only the tag changes. A tag another group already has is an error.
func SetGroupKind(m *Molecule, gi int, kind GroupKind, number int) ([]Edit, error) {
	f, err := groupField(m, gi)
	if err != nil {
		return nil, err
	}
	if kind != GroupAbsolute && kind != GroupOr && kind != GroupAnd || kind != GroupAbsolute && number < 0 {
		return nil, editError(f.Tag, CodeEditUnsupported, "no such stereo group kind or number")
	}
	g := StereoGroup{Kind: kind, Number: number}
	if kind == GroupAbsolute {
		g.Number = 0
	}
	for hi, h := range m.Extension.Groups {
		if hi != gi && h.Kind == g.Kind && h.Number == g.Number {
			return nil, editError(f.Tag, CodeEditUnsupported, "stereo group "+g.Label()+" already exists")
		}
	}
	return []Edit{{Span: f.Tag, New: g.Label()}}, nil
}

// AddGroupAtom returns the edit that adds atom to group gi: before the
// first listed index that is larger, so that a group written in
// ascending order stays so, or after the last.
func AddGroupAtom(m *Molecule, gi, atom int) ([]Edit, error) {
	f, err := groupField(m, gi)
	if err != nil {
		return nil, err
	}
	if atom < 0 || atom >= len(m.Atoms) {
		return nil, editError(Span{}, CodeEditRange, "no such atom")
	}
	if g := m.AtomGroups()[atom]; g >= 0 {
		return nil, editError(m.Atoms[atom].Span, CodeEditUnsupported, "atom already in stereo group "+m.Extension.Groups[g].Label())
	}
	num := strconv.Itoa(atom)
	refs := f.Refs
	if len(refs) == 0 {
		at := f.Tag.End + 1 // after ':'
		return []Edit{{Span: Span{at, at}, New: num}}, nil
	}
	for _, r := range refs {
		if r.Index > atom || r.Index < 0 {
			return []Edit{{Span: Span{r.Span.Start, r.Span.Start}, New: num + ","}}, nil
		}
	}
	at := refs[len(refs)-1].Span.End
	return []Edit{{Span: Span{at, at}, New: "," + num}}, nil
}

// RemoveGroupAtom returns the edit that removes atom from group gi with
// one comma beside it; when it is the group's only atom the group is
// removed (a group without atoms is malformed).
func RemoveGroupAtom(m *Molecule, gi, atom int) ([]Edit, error) {
	f, err := groupField(m, gi)
	if err != nil {
		return nil, err
	}
	g := &m.Extension.Groups[gi]
	k := -1
	for i, a := range g.Atoms {
		if a == atom {
			k = i
			break
		}
	}
	if k < 0 {
		return nil, editError(f.Span, CodeEditUnsupported, "atom not in stereo group "+g.Label())
	}
	if len(f.Refs) == 1 {
		return RemoveStereoGroup(m, gi)
	}
	s := g.AtomSpans[k]
	switch {
	case s.End < f.Span.End && m.Text[s.End] == ',':
		s.End++
	case m.Text[s.Start-1] == ',':
		s.Start--
	}
	return []Edit{{Span: s, New: ""}}, nil
}

// groupField returns the field of group gi, checked.
func groupField(m *Molecule, gi int) (*Field, error) {
	if m.Extension == nil || gi < 0 || gi >= len(m.Extension.Groups) {
		return nil, editError(Span{}, CodeEditRange, "no such stereo group")
	}
	fi := m.Extension.Groups[gi].Field
	if fi < 0 || fi >= len(m.Extension.Fields) {
		return nil, editError(Span{}, CodeEditRange, "stereo group has no field")
	}
	return &m.Extension.Fields[fi], nil
}

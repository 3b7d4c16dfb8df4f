// This file implements the rewrites of stereo groups: a group made
// absolute, centres marked as relative or racemic, a group split by
// component, and what mirror, invert and set mean inside a group.

package transform

import (
	"fmt"
	"slices"
	"sort"
	"strconv"
	"strings"

	"stereoline/notation"
	"stereoline/stereo"
)

// CodeNoGroup is the error of a rewrite that names a stereo group the
// record does not have, or one of the wrong kind.
const CodeNoGroup notation.Code = "transform-no-group"

// groupedMarks returns, by atom, whether the atom's tetrahedral or
// allene mark sits in an or or and group: a mirror image leaves such a
// mark alone, since the group already stands for both of its
// configurations.
func groupedMarks(m *notation.Molecule) []bool {
	out := make([]bool, len(m.Atoms))
	if m.Extension == nil {
		return out
	}
	for _, g := range m.Extension.Groups {
		if g.Kind != notation.GroupOr && g.Kind != notation.GroupAnd {
			continue
		}
		for _, a := range g.Atoms {
			if a >= 0 && a < len(out) {
				out[a] = true
			}
		}
	}
	return out
}

// FindGroup returns the index in m.Extension.Groups of the group with the
// tag as written in canonical form ("o1", "&2", "a"), or -1.
func FindGroup(m *notation.Molecule, tag string) int {
	if m.Extension == nil {
		return -1
	}
	for i := range m.Extension.Groups {
		if m.Extension.Groups[i].Label() == tag {
			return i
		}
	}
	return -1
}

// groupOf returns the engine's group of unit u, or nil.
func groupOf(an *stereo.Analysis, u *stereo.Unit) *stereo.Group {
	if u.Group < 0 || u.Group >= len(an.Groups) {
		return nil
	}
	return &an.Groups[u.Group]
}

// invertInGroup inverts the unit u, a member of an or or and group g,
// and checks that the group's relative configuration came out as want
// (the current relative labels with u's inverted).
func invertInGroup(m *notation.Molecule, an *stereo.Analysis, u *stereo.Unit, g *stereo.Group) (Transform, error) {
	tag := g.Label()
	name := atomName(m, u.Centre)
	if len(g.Units) == 1 {
		return Transform{Notes: []string{fmt.Sprintf("%s is the only centre of stereo group %s, which stands for both of its configurations: inverting it gives the same record", name, tag)}}, nil
	}
	e, err := notation.InvertChirality(m, u.Centre)
	if err != nil {
		return Transform{}, err
	}
	want := map[int]stereo.Descriptor{}
	for _, ui := range g.Units {
		v := &an.Units[ui]
		want[v.Centre] = v.Relative
		if v.Centre == u.Centre {
			want[v.Centre] = v.Relative.Mirror()
		}
	}
	normaliseFrame(want, g.Atoms)
	text, err := notation.ApplyEdits(m.Text, e)
	if err != nil {
		return Transform{}, err
	}
	after := stereo.Analyze(notation.ReadWith(text, m.Reading))
	got, desc := relativeLabels(after, g.Atoms)
	for a, d := range want {
		if got[a] != d {
			return Transform{}, transformError(atomSpan(m, u.Centre), CodeNotVerified, "inverting %s within stereo group %s does not give the relative configuration expected", name, tag)
		}
	}
	return Transform{Edits: e, Notes: []string{fmt.Sprintf("%s inverted within stereo group %s: the relative configuration is now %s", name, tag, desc)}}, nil
}

// normaliseFrame turns labels into the frame of a relative group: when
// the lowest-numbered chirality centre reads S (or P), every label is
// mirrored.
func normaliseFrame(labels map[int]stereo.Descriptor, atoms []int) {
	for _, a := range atoms {
		switch labels[a] {
		case stereo.DescR, stereo.DescM:
			return
		case stereo.DescS, stereo.DescP:
			for k, d := range labels {
				labels[k] = d.Mirror()
			}
			return
		}
	}
}

// relativeLabels returns the relative labels of the units centred on
// atoms, and the descriptor of the group that holds the first of them.
func relativeLabels(an *stereo.Analysis, atoms []int) (map[int]stereo.Descriptor, string) {
	out := map[int]stereo.Descriptor{}
	desc := ""
	want := atomSet(atoms)
	for i := range an.Units {
		u := &an.Units[i]
		if u.Centre >= 0 && want[u.Centre] && u.Specified {
			out[u.Centre] = u.Relative
			if desc == "" && u.Group >= 0 {
				desc = an.GroupDescriptor(u.Group)
			}
		}
	}
	return out, desc
}

// setInGroup gives unit u, a member of an or or and group g, the
// descriptor d in the group's frame: R* or S* (RS or SR). Its mark is
// inverted when its relative label differs.
func setInGroup(m *notation.Molecule, an *stereo.Analysis, u *stereo.Unit, g *stereo.Group, d stereo.Descriptor) (Transform, error) {
	if u.Relative == d {
		return Transform{}, nil
	}
	if len(g.Units) == 1 {
		return Transform{Notes: []string{fmt.Sprintf("%s is the only centre of stereo group %s: its relative descriptor is %s whatever its mark", atomName(m, u.Centre), g.Label(), u.GroupLabel())}}, nil
	}
	t, err := invertInGroup(m, an, u, g)
	if err != nil {
		return t, err
	}
	if g.Atoms[0] == u.Centre {
		t.Notes = append(t.Notes, fmt.Sprintf("the lowest-numbered centre of a relative group is cited as %s, so the other centres of %s now read inverted", u.Relative, g.Label()))
	}
	return t, nil
}

// MakeAbsolute returns the edits that make the or or and group gi (an
// index into m.Extension.Groups) absolute. With atom < 0 the
// configuration written is kept; otherwise the enantiomer of the group
// in which the centre at atom (0-based, a member) has the descriptor d
// is chosen, inverting every member's mark when needed. The group's tag
// becomes "a", or, when the block has an absolute group already, its
// atoms join that one.
func MakeAbsolute(m *notation.Molecule, gi, atom int, d stereo.Descriptor) (Transform, error) {
	if m.Extension == nil || gi < 0 || gi >= len(m.Extension.Groups) {
		return Transform{}, transformError(notation.Span{}, CodeNoGroup, "the record has no such stereo group")
	}
	sg := &m.Extension.Groups[gi]
	if sg.Kind == notation.GroupAbsolute {
		return Transform{}, transformError(groupSpan(m, gi), CodeNoGroup, "stereo group %s is absolute already", sg.Label())
	}
	if !m.Extension.Closed {
		return Transform{}, transformError(m.Extension.Span, notation.CodeEditUnsupported, "the extension block is not closed")
	}
	an := stereo.Analyze(m)
	var members []int // chiral centres of the group
	for i := range an.Units {
		if u := &an.Units[i]; u.Group >= 0 && an.Groups[u.Group].Block == gi {
			members = append(members, u.Centre)
		}
	}
	isMember := atomSet(members)
	var t Transform
	if atom >= 0 {
		var u *stereo.Unit
		for i := range an.Units {
			if an.Units[i].Centre == atom && isMember[atom] {
				u = &an.Units[i]
			}
		}
		if u == nil {
			return Transform{}, transformError(atomSpan(m, atom), CodeNoUnit, "atom %d is not a stereocentre of stereo group %s", atom+1, sg.Label())
		}
		if want := [2]stereo.Descriptor{u.Descriptor, u.Descriptor.Mirror()}; d != want[0] && d != want[1] || !d.Labelled() || d.Pseudo() {
			return Transform{}, transformError(atomSpan(m, atom), CodeBadDescriptor, "atom %d takes %s or %s, not %s", atom+1, want[0], want[1], d)
		}
		if u.Descriptor != d {
			for _, a := range members {
				e, err := notation.InvertChirality(m, a)
				if err != nil {
					return Transform{}, err
				}
				t.Edits = append(t.Edits, e...)
			}
		}
	}
	abs := -1
	for i := range m.Extension.Groups {
		if m.Extension.Groups[i].Kind == notation.GroupAbsolute && i != gi {
			abs = i
		}
	}
	var block []notation.Edit
	var err error
	if abs < 0 {
		block, err = notation.SetGroupKind(m, gi, notation.GroupAbsolute, 0)
	} else {
		// the atoms join the absolute group, in ascending order
		joined := append(append([]int(nil), m.Extension.Groups[abs].Atoms...), sg.Atoms...)
		sort.Ints(joined)
		block, err = rebuildBlock(m, map[int][]int{gi: nil, abs: slices.Compact(joined)}, nil)
	}
	if err != nil {
		return Transform{}, err
	}
	t.Edits = append(t.Edits, block...)
	after, err := readAfter(m, t.Edits)
	if err != nil {
		return Transform{}, err
	}
	an2 := stereo.Analyze(after)
	for i := range an2.Units {
		u := &an2.Units[i]
		if !isMember[u.Centre] || u.Kind == stereo.KindDoubleBond {
			continue
		}
		if u.GroupKind != notation.GroupAbsolute || atom == u.Centre && u.Descriptor != d {
			return Transform{}, transformError(groupSpan(m, gi), CodeNotVerified, "making stereo group %s absolute does not read back as asked", sg.Label())
		}
	}
	t.Notes = append(t.Notes, fmt.Sprintf("stereo group %s made absolute: %s", sg.Label(), absoluteLabels(an2, members)))
	return t, nil
}

// MarkGroup returns the edits that put the centres at atoms (0-based;
// every specified chiral centre of m when atoms is empty) into one group
// of kind GroupOr (relative configuration) or GroupAnd (racemic), taking
// them out of the groups they are in. When they are exactly the centres
// of one group, only its tag changes.
func MarkGroup(m *notation.Molecule, atoms []int, kind notation.GroupKind) (Transform, error) {
	if kind != notation.GroupOr && kind != notation.GroupAnd {
		return Transform{}, transformError(notation.Span{}, CodeNoGroup, "a centre is marked relative (or) or racemic (and)")
	}
	an := stereo.Analyze(m)
	chiral := map[int]*stereo.Unit{}
	for i := range an.Units {
		u := &an.Units[i]
		if u.Specified && u.Centre >= 0 && (u.Kind == stereo.KindTetrahedral || u.Kind == stereo.KindAllene) {
			chiral[u.Centre] = u
		}
	}
	if len(atoms) == 0 {
		for a := range chiral {
			atoms = append(atoms, a)
		}
		if len(atoms) == 0 {
			return Transform{}, transformError(notation.Span{}, CodeNoUnit, "the record has no marked stereocentre")
		}
	}
	atoms = append([]int(nil), atoms...)
	sort.Ints(atoms)
	atoms = slices.Compact(atoms)
	for _, a := range atoms {
		if chiral[a] == nil {
			return Transform{}, transformError(atomSpan(m, a), CodeNoUnit, "atom %d is not a marked stereocentre", a+1)
		}
	}
	if m.Extension != nil && !m.Extension.Closed {
		return Transform{}, transformError(m.Extension.Span, notation.CodeEditUnsupported, "the extension block is not closed")
	}
	word := map[notation.GroupKind]string{notation.GroupOr: "relative", notation.GroupAnd: "racemic"}[kind]
	// exactly the centres of one group: retag it
	if m.Extension != nil {
		for gi := range m.Extension.Groups {
			if !slices.Equal(groupCentres(an, gi), atoms) {
				continue
			}
			if m.Extension.Groups[gi].Kind == kind {
				return Transform{Notes: []string{fmt.Sprintf("stereo group %s already marks these centres as %s", m.Extension.Groups[gi].Label(), word)}}, nil
			}
			e, err := notation.SetGroupKind(m, gi, kind, notation.FreeGroupNumber(m, kind))
			if err != nil {
				return Transform{}, err
			}
			return verifyMarked(m, e, atoms, kind, word)
		}
	}
	number := notation.FreeGroupNumber(m, kind)
	change := map[int][]int{}
	if m.Extension != nil {
		taken := map[int]bool{}
		for _, a := range atoms {
			taken[a] = true
		}
		for gi := range m.Extension.Groups {
			g := &m.Extension.Groups[gi]
			var rest []int
			for _, a := range g.Atoms {
				if !taken[a] {
					rest = append(rest, a)
				}
			}
			if len(rest) < len(g.Atoms) {
				change[gi] = rest
			}
		}
	}
	g := notation.StereoGroup{Kind: kind, Number: number}
	edits, err := rebuildBlock(m, change, []string{g.Label() + ":" + joinAtoms(atoms)})
	if err != nil {
		return Transform{}, err
	}
	return verifyMarked(m, edits, atoms, kind, word)
}

// verifyMarked reads the record after edits and checks that the atoms
// sit in one group of the kind and keep their labels.
func verifyMarked(m *notation.Molecule, edits []notation.Edit, atoms []int, kind notation.GroupKind, word string) (Transform, error) {
	after, err := readAfter(m, edits)
	if err != nil {
		return Transform{}, err
	}
	before, an := stereo.Analyze(m), stereo.Analyze(after)
	was, is := centredUnits(before), centredUnits(an)
	group := -2
	for _, a := range atoms {
		u, v := was[a], is[a]
		if u == nil || v == nil || v.GroupKind != kind || u.Descriptor != v.Descriptor || group != -2 && v.Group != group {
			return Transform{}, transformError(atomSpan(m, a), CodeNotVerified, "marking the centres as %s does not read back as asked", word)
		}
		group = v.Group
	}
	return Transform{Edits: edits, Notes: []string{fmt.Sprintf("marked as %s: %s, also written %s", word, an.GroupDescriptor(group), an.GroupStarred(group))}}, nil
}

// SplitGroup returns the edit that gives each component of the or or and
// group gi its own group: the first component keeps the tag, the others
// get the next free numbers ("o1:1,6" becomes "o1:1,o2:6").
func SplitGroup(m *notation.Molecule, gi int) (Transform, error) {
	if m.Extension == nil || gi < 0 || gi >= len(m.Extension.Groups) {
		return Transform{}, transformError(notation.Span{}, CodeNoGroup, "the record has no such stereo group")
	}
	ext := m.Extension
	sg := &ext.Groups[gi]
	if sg.Kind == notation.GroupAbsolute || sg.Field < 0 || !ext.Closed {
		return Transform{}, transformError(groupSpan(m, gi), CodeNoGroup, "stereo group %s cannot be split", sg.Label())
	}
	var comps []int
	byComp := map[int][]int{}
	for _, a := range sg.Atoms {
		c := m.Atoms[a].Component
		if _, ok := byComp[c]; !ok {
			comps = append(comps, c)
		}
		byComp[c] = append(byComp[c], a)
	}
	if len(comps) < 2 {
		return Transform{}, transformError(groupSpan(m, gi), CodeNoGroup, "stereo group %s lies in one component", sg.Label())
	}
	used := map[int]bool{}
	for _, g := range ext.Groups {
		if g.Kind == sg.Kind {
			used[g.Number] = true
		}
	}
	var fields []string
	for k, c := range comps {
		n := sg.Number
		if k > 0 {
			n = 1
			for used[n] {
				n++
			}
			used[n] = true
		}
		atoms := byComp[c]
		sort.Ints(atoms)
		parts := make([]string, len(atoms))
		for i, a := range atoms {
			parts[i] = fmt.Sprint(a)
		}
		g := notation.StereoGroup{Kind: sg.Kind, Number: n}
		fields = append(fields, g.Label()+":"+strings.Join(parts, ","))
	}
	e := []notation.Edit{{Span: ext.Fields[sg.Field].Span, New: strings.Join(fields, ",")}}
	after, err := readAfter(m, e)
	if err != nil {
		return Transform{}, err
	}
	if after.Errors.HasErrors() && !m.Errors.HasErrors() {
		return Transform{}, transformError(groupSpan(m, gi), CodeNotVerified, "splitting stereo group %s does not read back", sg.Label())
	}
	return Transform{Edits: e}, nil
}

// rebuildBlock returns the minimal edit that rewrites m's extension
// block with the atoms of the stereo groups in change (by index in
// m.Extension.Groups; an empty list drops the group's field) and the
// fields in extra added at its end; every other field keeps its bytes.
// Without a block, one is added after the notation; a block left with no
// field is removed with the blank before it. The block is built in one
// pass, so a group of thousands of atoms costs no more than its text.
func rebuildBlock(m *notation.Molecule, change map[int][]int, extra []string) ([]notation.Edit, error) {
	ext := m.Extension
	var fields []string
	sep, start, end := " ", m.NotationEnd(), m.NotationEnd()
	if ext != nil {
		if !ext.Closed {
			return nil, transformError(ext.Span, notation.CodeEditUnsupported, "the extension block is not closed")
		}
		sep = m.Text[ext.Separator.Start:ext.Separator.End]
		start, end = ext.Separator.Start, ext.Span.End
		for fi := range ext.Fields {
			f := &ext.Fields[fi]
			atoms, changed := change[f.Group]
			switch {
			case f.Group < 0 || !changed:
				fields = append(fields, m.Text[f.Span.Start:f.Span.End])
			case len(atoms) > 0:
				fields = append(fields, m.Text[f.Tag.Start:f.Tag.End]+":"+joinAtoms(atoms))
			}
		}
	}
	fields = append(fields, extra...)
	block := ""
	if len(fields) > 0 {
		block = sep + "|" + strings.Join(fields, ",") + "|"
	}
	return diffEdit(m.Text, m.Text[:start]+block+m.Text[end:]), nil
}

func joinAtoms(atoms []int) string {
	parts := make([]string, len(atoms))
	for i, a := range atoms {
		parts[i] = strconv.Itoa(a)
	}
	return strings.Join(parts, ",")
}

// diffEdit returns the one edit that turns old into new: the bytes
// between their common prefix and common suffix.
func diffEdit(old, new string) []notation.Edit {
	if old == new {
		return nil
	}
	p := 0
	for p < len(old) && p < len(new) && old[p] == new[p] {
		p++
	}
	s := 0
	for s < len(old)-p && s < len(new)-p && old[len(old)-1-s] == new[len(new)-1-s] {
		s++
	}
	return []notation.Edit{{Span: notation.Span{Start: p, End: len(old) - s}, New: new[p : len(new)-s]}}
}

// groupCentres returns the centres the engine reads in block group gi, in
// ascending order.
func groupCentres(an *stereo.Analysis, gi int) []int {
	var out []int
	for i := range an.Groups {
		if an.Groups[i].Block == gi {
			out = append(out, an.Groups[i].Atoms...)
		}
	}
	sort.Ints(out)
	return out
}

// centredUnits returns the units of an analysis with a centre (not
// double bonds), by centre.
func centredUnits(an *stereo.Analysis) map[int]*stereo.Unit {
	out := make(map[int]*stereo.Unit, len(an.Units))
	for i := range an.Units {
		if u := &an.Units[i]; u.Centre >= 0 && u.Kind != stereo.KindDoubleBond {
			out[u.Centre] = u
		}
	}
	return out
}

func atomSet(atoms []int) map[int]bool {
	out := make(map[int]bool, len(atoms))
	for _, a := range atoms {
		out[a] = true
	}
	return out
}

// absoluteLabels writes the labels of the units centred on atoms:
// "(2R,4S)".
func absoluteLabels(an *stereo.Analysis, atoms []int) string {
	var parts []string
	units := centredUnits(an)
	for _, a := range atoms {
		if u := units[a]; u != nil && u.Descriptor.Labelled() {
			parts = append(parts, fmt.Sprintf("%d%s", a+1, u.Descriptor))
		}
	}
	return "(" + strings.Join(parts, ",") + ")"
}

func readAfter(m *notation.Molecule, edits []notation.Edit) (*notation.Molecule, error) {
	text, err := notation.ApplyEdits(m.Text, edits)
	if err != nil {
		return nil, err
	}
	return notation.ReadWith(text, m.Reading), nil
}

func groupSpan(m *notation.Molecule, gi int) notation.Span {
	ext := m.Extension
	if f := ext.Groups[gi].Field; f >= 0 && f < len(ext.Fields) {
		return ext.Fields[f].Span
	}
	return ext.Span
}

func atomName(m *notation.Molecule, a int) string {
	if a < 0 || a >= len(m.Atoms) {
		return "H"
	}
	return fmt.Sprintf("%s%d", notation.ElementSymbol(m.Atoms[a].Number), a+1)
}

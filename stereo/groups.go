// This file implements the stereo groups of the CXSMILES extension block
// as the engine reads them: which units each group holds, the frame of
// its relative descriptors, and the findings about groups that say less
// than they seem to.

package stereo

import (
	"fmt"
	"slices"
	"strings"

	"stereoline/notation"
)

// What a group means (common practice: the molfile's enhanced stereo and
// the CXSMILES fields a:, o<n>: and &<n>:, read as RDKit 2022.09.3 reads
// them):
//
//   - a marked chiral unit in no group, or in an absolute group, has the
//     configuration written (absolute);
//   - an or group: the substance has the configuration written or the one
//     with every member inverted, and which one is not known (relative
//     configuration);
//   - an and group: the substance is a mixture of both (racemic, when the
//     group holds every chiral unit).
//
// Members are the centres of specified tetrahedral units and of allenes
// (the allene's middle atom, where its mark is written): the units a
// mirror image changes. A double bond keeps its E/Z in a mirror image,
// so a group says nothing about its atoms; square-planar marks are their
// own mirror image, and trigonal-bipyramidal and octahedral marks are
// read as absolute (no general-purpose library takes them into groups).
// RDKit 2022.09.3 drops group members without a tetrahedral mark, so the
// units it inverts are ours.
//
// A group over several components inverts all its members together, as
// RDKit 2022.09.3 reads it: the relative configuration then ties centres
// of separate molecules, which only one salt or complex taken as a whole
// can have, and it is reported. In a reaction every component is a
// template of its own, and RDKit splits a group by component: so does the
// engine, one Group per component.
//
// Relative descriptors follow IUPAC 2013 P-93.1.3 (the section number
// from memory; the rule as the 1993 Guide, R-7.2.2, and the Gold Book entry
// "relative configuration", PAC 1996, 68, 2193, state it): the
// lowest-locant chirality centre of the group is cited as R (R*), the
// others relative to it: rel-(1R,2S), or (1R*,2S*); a racemate is
// rac-(1R,2S), or (1RS,2SR). Locants here are the atom numbers of the
// record (1-based), since a record has no systematic numbering.

// Group is one stereo group as the engine reads it.
type Group struct {
	Kind   notation.GroupKind
	Number int
	// Block is the index of the group in Molecule.Extension.Groups. In a
	// reaction one group of the block may give several Groups, one per
	// component.
	Block int
	// Units are the indices in Analysis.Units of the group's members, by
	// ascending centre; Atoms are their centres. Listed atoms the group
	// says nothing about are left out (and reported).
	Units []int
	Atoms []int
	// Inverted is set when the group's frame is the mirror image of the
	// marks: its lowest-numbered chirality centre is S (or P) as written,
	// so each unit's Relative descriptor is that of the inverted group.
	Inverted bool
}

// Label returns the group's tag in canonical form: "a", "o1", "&2".
func (g *Group) Label() string {
	sg := notation.StereoGroup{Kind: g.Kind, Number: g.Number}
	return sg.Label()
}

// maxGroupFindings bounds the findings about group members per record: a
// group of thousands of unmarked atoms gets a summary after these.
const maxGroupFindings = 16

// chiralUnit reports whether a unit is one a group can hold: a specified
// tetrahedral centre or allene.
func chiralUnit(u *Unit) bool {
	return u.Specified && u.Centre >= 0 && (u.Kind == KindTetrahedral || u.Kind == KindAllene)
}

// readGroups gives every unit its group and its descriptor in the
// group's frame, builds Analysis.Groups and reports groups that say less
// than they seem to. It runs after the units are sorted.
func (l *labeller) readGroups(skip bool) {
	res, m := l.res, l.g.mol
	for i := range res.Units {
		u := &res.Units[i]
		u.Group, u.Relative = -1, u.Descriptor
		if chiralUnit(u) {
			u.GroupKind = notation.GroupAbsolute
		}
	}
	if skip || m.Extension == nil || len(m.Extension.Groups) == 0 {
		return
	}
	gr := groupReader{l: l, m: m, byCentre: map[int]int{}}
	for i := range res.Units {
		if u := &res.Units[i]; chiralUnit(u) {
			gr.byCentre[u.Centre] = i
		}
	}
	for bi := range m.Extension.Groups {
		gr.read(bi)
	}
	if gr.dropped > 0 {
		l.warn(m.Extension.Span, CodeGroupIneffectiveMember, "%d more listed atoms of stereo groups are not stereocentres with a mark; the groups say nothing about them", gr.dropped)
	}
	for gi := range res.Groups {
		gr.frame(gi)
	}
	gr.reportOneCentre()
	if !m.Reaction {
		gr.reportComponents()
	}
	gr.reportRepeatedTags()
}

// groupReader holds the state of readGroups.
type groupReader struct {
	l        *labeller
	m        *notation.Molecule
	byCentre map[int]int // centre atom -> unit of a chiral unit
	findings int         // member findings so far
	dropped  int         // member findings past maxGroupFindings
}

// read assigns the members of block group bi to Groups (one per
// component in a reaction) and reports those the group says nothing
// about.
func (gr *groupReader) read(bi int) {
	res, m := gr.l.res, gr.m
	sg := &m.Extension.Groups[bi]
	piece := map[int]int{} // component -> index in res.Groups (reactions)
	whole := -1
	for k, a := range sg.Atoms {
		ui, ok := gr.byCentre[a]
		if !ok {
			gr.ineffective(sg, k, a)
			continue
		}
		u := &res.Units[ui]
		if u.Group >= 0 {
			continue // listed twice: the reader reports group-overlap
		}
		gi := whole
		if m.Reaction {
			c := m.Atoms[a].Component
			if k, ok := piece[c]; ok {
				gi = k
			} else {
				gi = -1
			}
			if gi < 0 {
				piece[c] = len(res.Groups)
			}
		}
		if gi < 0 {
			gi = len(res.Groups)
			if !m.Reaction {
				whole = gi
			}
			res.Groups = append(res.Groups, Group{Kind: sg.Kind, Number: sg.Number, Block: bi})
		}
		g := &res.Groups[gi]
		g.Units = append(g.Units, ui)
		u.Group, u.GroupKind = gi, sg.Kind
	}
}

// ineffective reports the k-th listed atom a of group sg, which no
// chiral unit is centred on, saying why.
func (gr *groupReader) ineffective(sg *notation.StereoGroup, k, a int) {
	if gr.findings >= maxGroupFindings {
		gr.dropped++
		return
	}
	gr.findings++
	m, res := gr.m, gr.l.res
	at := &m.Atoms[a]
	name := fmt.Sprintf("%s%d", notation.ElementSymbol(at.Number), a+1)
	tag := sg.Label()
	var why string
	switch ch := at.Chirality; {
	case ch.Class == notation.ChiralSP || ch.Class == notation.ChiralTB || ch.Class == notation.ChiralOH:
		why = fmt.Sprintf("%s's @%s mark is read as absolute: stereo groups hold tetrahedral centres and allenes, so %s says nothing about it", name, ch.Class, tag)
	case ch.Class != notation.ChiralNone:
		why = fmt.Sprintf("%s is not a stereocentre whose mark fixes a configuration, so stereo group %s says nothing about it", name, tag)
		for i := range res.Units {
			if u := &res.Units[i]; u.Centre == a && !u.Specified && len(u.Marks) > 0 {
				why = fmt.Sprintf("%s's mark means something only together with another unit, which is not marked, so stereo group %s says nothing about it", name, tag)
			}
		}
	default:
		why = fmt.Sprintf("%s carries no chirality mark, so stereo group %s says nothing about it", name, tag)
		for i := range res.Units {
			u := &res.Units[i]
			if !slices.Contains(u.Atoms, a) || u.Centre == a {
				continue
			}
			switch u.Kind {
			case KindDoubleBond:
				why = fmt.Sprintf("%s is an end of a double bond, whose E/Z a mirror image keeps, so stereo group %s says nothing about it", name, tag)
			case KindAllene:
				why = fmt.Sprintf("%s is an end of an allene; a stereo group lists the allene's middle atom, %s%d, where its mark is written", name, notation.ElementSymbol(m.Atoms[u.Centre].Number), u.Centre+1)
			}
		}
	}
	gr.l.warn(sg.AtomSpans[k], CodeGroupIneffectiveMember, "%s", why)
}

// frame sorts the members of group gi and sets the descriptors in its
// frame: the lowest-numbered chirality centre reads R (or M).
func (gr *groupReader) frame(gi int) {
	res := gr.l.res
	g := &res.Groups[gi]
	slices.SortFunc(g.Units, func(a, b int) int { return res.Units[a].Centre - res.Units[b].Centre })
	for _, ui := range g.Units {
		g.Atoms = append(g.Atoms, res.Units[ui].Centre)
	}
	if g.Kind == notation.GroupAbsolute {
		return
	}
	// the lowest-numbered centre with a chiral label decides
	for _, ui := range g.Units {
		d := res.Units[ui].Descriptor
		if d == DescR || d == DescM || d == DescS || d == DescP {
			g.Inverted = d == DescS || d == DescP
			break
		}
	}
	if !g.Inverted {
		return
	}
	inverted := gr.invertedLabels(g)
	for _, ui := range g.Units {
		u := &res.Units[ui]
		u.Relative = u.Descriptor.Mirror()
		if d, ok := inverted[u.Centre]; ok {
			u.Relative = d
		}
	}
}

// invertedLabels returns the labels of the group's units in the record
// with every member of the group inverted, by centre, when a label may
// depend on other units (the descriptor rules, Rules 3 to 5, decided a
// ranking somewhere in the record); nil when inverting a member simply
// swaps its label.
func (gr *groupReader) invertedLabels(g *Group) map[int]Descriptor {
	res, m := gr.l.res, gr.m
	depends := false
	for i := range res.Units {
		u := &res.Units[i]
		if u.Descriptor.Pseudo() {
			depends = true
		}
		for _, d := range u.Decisions {
			if d.Rule >= Rule3 {
				depends = true
			}
		}
	}
	if !depends {
		return nil
	}
	var edits []notation.Edit
	for _, a := range g.Atoms {
		e, err := notation.InvertChirality(m, a)
		if err != nil {
			return nil
		}
		edits = append(edits, e...)
	}
	text, err := notation.ApplyEdits(m.Text, edits)
	if err != nil {
		return nil
	}
	an := AnalyzeWith(notation.ReadWith(text, m.Reading), Options{NodeCap: gr.l.nodeCap, shared: gr.l.budget, skipGroups: true, noOpenMarks: true})
	member := make(map[int]bool, len(g.Atoms))
	for _, a := range g.Atoms {
		member[a] = true
	}
	out := map[int]Descriptor{}
	for i := range an.Units {
		if u := &an.Units[i]; chiralUnit(u) && member[u.Centre] {
			out[u.Centre] = u.Descriptor
		}
	}
	return out
}

// reportOneCentre says what an or or and group of a single centre
// means: the direction of that centre's mark means nothing.
func (gr *groupReader) reportOneCentre() {
	res, m := gr.l.res, gr.m
	chiral := 0
	for i := range res.Units {
		if chiralUnit(&res.Units[i]) {
			chiral++
		}
	}
	for gi := range res.Groups {
		g := &res.Groups[gi]
		if g.Kind == notation.GroupAbsolute || len(g.Units) != 1 || m.Reaction {
			continue
		}
		if gi > 0 && res.Groups[gi-1].Block == g.Block {
			continue
		}
		a := g.Atoms[0]
		name := fmt.Sprintf("%s%d", notation.ElementSymbol(m.Atoms[a].Number), a+1)
		var msg string
		switch {
		case g.Kind == notation.GroupOr && chiral == 1:
			msg = fmt.Sprintf("stereo group %s holds the only stereocentre, %s: one enantiomer, unknown which; the direction of its mark means nothing", g.Label(), name)
		case g.Kind == notation.GroupOr:
			msg = fmt.Sprintf("stereo group %s holds one centre: %s has one configuration, unknown which; the direction of its mark means nothing", g.Label(), name)
		case chiral == 1:
			msg = fmt.Sprintf("stereo group %s holds the only stereocentre, %s: the racemate; the direction of its mark means nothing", g.Label(), name)
		default:
			msg = fmt.Sprintf("stereo group %s holds one centre: both configurations of %s mixed; the direction of its mark means nothing", g.Label(), name)
		}
		e := res.Diagnostics.Add(gr.fieldSpan(g.Block), CodeGroupOneCenter, "%s", msg)
		e.Severity = notation.SeverityHint
	}
}

// reportComponents reports or and and groups whose members lie in
// separate components.
func (gr *groupReader) reportComponents() {
	res, m := gr.l.res, gr.m
	for gi := range res.Groups {
		g := &res.Groups[gi]
		if g.Kind == notation.GroupAbsolute {
			continue
		}
		comps := map[int]bool{}
		var names []string
		var related []notation.Related
		for _, a := range g.Atoms {
			c := m.Atoms[a].Component
			if !comps[c] {
				comps[c] = true
				names = append(names, fmt.Sprintf("%s%d", notation.ElementSymbol(m.Atoms[a].Number), a+1))
				related = append(related, notation.Related{Span: m.Atoms[a].Span, Msg: "a member in this component"})
			}
		}
		if len(comps) < 2 {
			continue
		}
		what := "one of the two, unknown which"
		if g.Kind == notation.GroupAnd {
			what = "a mixture of the two"
		}
		e := gr.l.warn(gr.fieldSpan(g.Block), CodeGroupAcrossComponents,
			"stereo group %s ties centres of %d separate components (%s): they invert together (%s), a relative configuration only one salt or complex taken as a whole can have; give each component its own group unless that is meant",
			g.Label(), len(comps), strings.Join(names, ", "), what)
		e.Related = related
	}
}

// reportRepeatedTags reports a field whose or or and tag an earlier field
// of the block already has: RDKit 2022.09.3 reads two groups, a reader
// that merges them reads one.
func (gr *groupReader) reportRepeatedTags() {
	ext := gr.m.Extension
	for i := range ext.Groups {
		g := &ext.Groups[i]
		if g.Kind == notation.GroupAbsolute || g.Field < 0 {
			continue
		}
		for j := 0; j < i; j++ {
			h := &ext.Groups[j]
			if h.Kind != g.Kind || h.Number != g.Number || h.Field < 0 {
				continue
			}
			e := gr.l.warn(ext.Fields[g.Field].Tag, CodeGroupRepeatedTag,
				"a second field tagged %s: RDKit reads two groups (each inverts on its own), a reader that merges them reads one; give this one a number of its own, or join the two", g.Label())
			e.Related = []notation.Related{{Span: ext.Fields[h.Field].Span, Msg: "the first field tagged " + g.Label()}}
			break
		}
	}
}

// fieldSpan returns the span of the field of block group bi.
func (gr *groupReader) fieldSpan(bi int) notation.Span {
	ext := gr.m.Extension
	if f := ext.Groups[bi].Field; f >= 0 && f < len(ext.Fields) {
		return ext.Fields[f].Span
	}
	return ext.Span
}

// GroupLabel returns the unit's descriptor as its group says it: R or S
// for an absolute unit, R* or S* (in the group's frame) in an or group,
// RS or SR in an and group; a pseudoasymmetric label (r, s), which a
// mirror image keeps, as it is. "" when the unit has no label.
func (u *Unit) GroupLabel() string {
	d := u.Relative
	if !d.Labelled() {
		return ""
	}
	if d.Pseudo() {
		return d.String()
	}
	switch u.GroupKind {
	case notation.GroupOr:
		return d.String() + "*"
	case notation.GroupAnd:
		return d.String() + d.Mirror().String()
	}
	return d.String()
}

// GroupDescriptor returns the descriptor of group gi in the style of
// IUPAC names: "rel-(2R,4S)" for an or group, "rac-(2R,4S)" for an and
// group, "(2R,4S)" for an absolute one; "" when no member is labelled.
func (a *Analysis) GroupDescriptor(gi int) string {
	g := &a.Groups[gi]
	var parts []string
	for _, ui := range g.Units {
		u := &a.Units[ui]
		if u.Relative.Labelled() {
			parts = append(parts, fmt.Sprintf("%d%s", u.Centre+1, u.Relative))
		}
	}
	if len(parts) == 0 {
		return ""
	}
	s := "(" + strings.Join(parts, ",") + ")"
	switch g.Kind {
	case notation.GroupOr:
		return "rel-" + s
	case notation.GroupAnd:
		return "rac-" + s
	}
	return s
}

// GroupStarred returns the other form of the descriptor of group gi:
// "(2R*,4S*)" for an or group, "(2RS,4SR)" for an and group, "(2R,4S)"
// for an absolute one.
func (a *Analysis) GroupStarred(gi int) string {
	var parts []string
	for _, ui := range a.Groups[gi].Units {
		u := &a.Units[ui]
		if l := u.GroupLabel(); l != "" {
			parts = append(parts, fmt.Sprintf("%d%s", u.Centre+1, l))
		}
	}
	if len(parts) == 0 {
		return ""
	}
	return "(" + strings.Join(parts, ",") + ")"
}

// Configuration says how the configuration of the record's specified
// chiral units is known: "absolute", "relative" (or groups), "racemic"
// (and groups), or a mix such as "absolute and racemic"; "" when the
// record specifies no chiral unit.
func (a *Analysis) Configuration() string {
	var have [4]bool
	for i := range a.Units {
		if u := &a.Units[i]; chiralUnit(u) && int(u.GroupKind) < len(have) {
			have[u.GroupKind] = true
		}
	}
	var parts []string
	for _, k := range []struct {
		kind notation.GroupKind
		word string
	}{{notation.GroupAbsolute, "absolute"}, {notation.GroupOr, "relative"}, {notation.GroupAnd, "racemic"}} {
		if have[k.kind] {
			parts = append(parts, k.word)
		}
	}
	switch len(parts) {
	case 0:
		return ""
	case 3:
		return "absolute, relative and racemic"
	}
	return strings.Join(parts, " and ")
}

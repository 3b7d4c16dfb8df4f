package document

import (
	"bytes"
	"fmt"
	"sort"
	"strconv"
	"strings"

	"stereoline/notation"
	"stereoline/notation/find"
	"stereoline/stereo"
	"stereoline/stereo/identity"
)

// Codes of the relations between the records of one list.
const (
	CodeListDuplicate    notation.Code = "list-duplicate"    // the same structure as an earlier record
	CodeListEnantiomer   notation.Code = "list-enantiomer"   // the mirror image of an earlier record
	CodeListStereoisomer notation.Code = "list-stereoisomer" // another configuration of an earlier record's constitution

	// Relations that stereo groups make (identity.AbsoluteOfRelative and
	// its kin): one record stands for one stereoisomer, the other for a
	// set that holds it, or both for the same set said another way.
	CodeListAbsoluteOfRelative notation.Code = "list-absolute-of-relative" // one absolute stereoisomer of the other's relative configuration
	CodeListAbsoluteOfMixture  notation.Code = "list-absolute-of-mixture"  // one stereoisomer of the other's mixture: the enantiomer of a racemate
	CodeListRelativeAndMixture notation.Code = "list-relative-and-mixture" // the same stereoisomers, one of them (relative) and their mixture (racemic)
)

// relatedKinds are the hosts whose records form a list of compounds. In
// source code the same structure often appears twice on purpose (an input
// and an expected value), so code is not related.
var relatedKinds = map[find.Kind]bool{
	find.KindList: true, find.KindCSV: true, find.KindTSV: true, find.KindJSON: true, find.KindYAML: true, find.KindSDF: true,
}

// Relate returns the result with the relations between the records of a
// list added (duplicates, mirror images, stereoisomers): what Analyze
// returns. r itself is left as it was, so readers of it are not
// disturbed; the new result shares the records' analyses. A result that
// is related already is returned as it is.
func (r *Result) Relate() *Result {
	if r.related {
		return r
	}
	next := &Result{
		Name:    r.Name,
		Content: r.Content,
		Kind:    r.Kind,
		Records: append([]Record(nil), r.Records...),
		Queries: r.Queries,
		cfg:     r.cfg,
		related: true,
		own:     r.own,
	}
	next.relateRecords()
	if next.Kind == find.KindList && len(next.Queries) == 0 && len(next.rel) == len(next.own) && len(next.own) == len(next.Records) {
		// A list's findings, in parts of records (parts.go): a
		// Reanalyze of the next version keeps those the edit left alone.
		next.assemble()
		return next
	}
	next.diags = mergeRelations(r.Diagnostics(), next.rel)
	return next
}

// mergeRelations returns the findings ds (sorted by position) with the
// relations rel (one per record, nil for most) among them, in the order a
// stable sort of ds followed by the relations in record order gives:
// a relation after the findings at its place. The relations of a list's
// records come in host order, so one merge does it.
func mergeRelations(ds []Diagnostic, rel []*relation) []Diagnostic {
	n, ordered := 0, true
	var last *relation
	for _, x := range rel {
		if x != nil {
			n++
			if last != nil && before(x.d.Span, last.d.Span) {
				ordered = false
			}
			last = x
		}
	}
	out := make([]Diagnostic, 0, len(ds)+n)
	if !ordered {
		// not in host order after all: all of them, sorted
		out = append(out, ds...)
		for _, x := range rel {
			if x != nil {
				out = append(out, x.d)
			}
		}
		sortByPosition(out)
		return out
	}
	i := 0
	for _, x := range rel {
		if x == nil {
			continue
		}
		for i < len(ds) && !before(x.d.Span, ds[i].Span) {
			out = append(out, ds[i])
			i++
		}
		out = append(out, x.d)
	}
	return append(out, ds[i:]...)
}

// relateRecords finds duplicates, mirror images and stereoisomers among
// the records of a list, each against the first earlier record it
// matches (r.rel). The identity index keeps keys in maps, so a list of 100,000
// records is related in one pass; only records whose constitution
// pre-key another record shares get identity keys (identity.ConstitutionPreKey), since the
// others can match nothing.
func (r *Result) relateRecords() {
	if !relatedKinds[r.Kind] {
		return
	}
	r.rel = make([]*relation, len(r.Records))
	groups := r.collidingGroups()
	if r.lines == nil {
		r.lines = lineStarts(r.Content) // before the groups are related in parallel
	}
	parallel(len(groups), func(g int) { r.relateGroup(groups[g]) })
}

// collidingGroups returns the records whose constitution pre-key occurs
// more than once in the list, a group per pre-key, in list order within
// each group.
func (r *Result) collidingGroups() [][]int {
	seen := make(map[uint64]int32, len(r.Records))
	for i := range r.Records {
		if an := r.Records[i].an; an != nil && an.identifiable {
			seen[relateKey(an.preKey, r.Records[i].Occ)]++
		}
	}
	at := map[uint64]int{}
	var groups [][]int
	for i := range r.Records {
		an := r.Records[i].an
		if an == nil || !an.identifiable {
			continue
		}
		key := relateKey(an.preKey, r.Records[i].Occ)
		if seen[key] < 2 {
			continue
		}
		g, ok := at[key]
		if !ok {
			g = len(groups)
			at[key] = g
			groups = append(groups, make([]int, 0, seen[key]))
		}
		groups[g] = append(groups[g], i)
	}
	return groups
}

// relateGroup gives the records of one pre-key (in list order) their
// identity keys and relates them. AnalyzeRecords computed the keys as it
// read the records; for the records an edit brought (Reanalyze) and for
// analyses whose keys nobody needed before, the molecule is read again
// for the keys alone.
func (r *Result) relateGroup(members []int) {
	for _, i := range members {
		rec := &r.Records[i]
		rec.Identity = rec.an.identify()
	}
	r.relateMembers(members)
}

// relation is the finding that relates a record to an earlier one,
// kept so that an edit elsewhere re-uses it (Reanalyze). It is not
// changed once made: versions of a list share it.
type relation struct {
	earlier int    // the record it is related to
	line    int    // the earlier record's line (0-based), as the message names it
	tmpl    string // the message with named where the earlier record is named
	d       Diagnostic
}

// named stands for the name of the earlier record in a relation's
// message template: it moves when lines are inserted before that record.
const named = "\x00"

// relateMembers relates each of some records (in list order, all with
// identity keys) to the first earlier one of them it matches, setting
// r.rel. Records whose pre-keys differ never match, so the records of
// each pre-key can be related apart.
func (r *Result) relateMembers(members []int) {
	idx := identity.NewIndex()
	for _, i := range members {
		rec := &r.Records[i]
		m := idx.Add(*rec.Identity)
		r.rel[i] = nil
		if m.Earlier < 0 {
			continue
		}
		j := members[m.Earlier]
		d, ok := relationDiagnostic(m, i, rec, &r.Records[j], named)
		if !ok {
			continue
		}
		d, on := r.configured(d)
		if !on {
			continue
		}
		tmpl, line := d.Message, r.lineOf(r.Records[j].Occ.Span.Start)
		d.Message = nameEarlierAt(tmpl, line, r.Records[j].Occ.Title)
		r.rel[i] = &relation{earlier: j, line: line, tmpl: tmpl, d: d}
	}
}

// relationDiagnostic is the finding that record i (rec) is related to an
// earlier record as m says; where names the earlier record. Both records
// have identity keys. ok is false for relations that are not reported.
func relationDiagnostic(m identity.Match, i int, rec, earlier *Record, where string) (d Diagnostic, ok bool) {
	d = Diagnostic{Span: rec.Occ.Span, Record: i,
		Related: []Related{{Span: earlier.Occ.Span, Message: "the earlier record"}}}
	switch m.Relation {
	case identity.Identical:
		d.Code, d.Severity = CodeListDuplicate, notation.SeverityWarning
		d.Message = "the same " + setName(rec.Identity) + " as " + where
	case identity.Enantiomers:
		d.Code, d.Severity = CodeListEnantiomer, notation.SeverityInformation
		d.Message = "the mirror image of " + where
	case identity.AbsoluteOfRelative, identity.AbsoluteOfMixture, identity.RelativeAndMixture:
		d.Severity = notation.SeverityInformation
		d.Code, d.Message = setRelationMessage(m, rec, earlier, where)
	case identity.Diastereomers, identity.Unspecified:
		d.Code, d.Severity = CodeListStereoisomer, notation.SeverityInformation
		differ := differingUnits(rec.an.atomName, earlier.an.atomName, m.Differing)
		d.Message = fmt.Sprintf("a stereoisomer of %s: %s", where, differ)
		if m.Relation == identity.Unspecified {
			d.Message = fmt.Sprintf("the same constitution as %s, marked differently: %s", where, differ)
		}
	default:
		return d, false
	}
	return d, true
}

// setName names what a record stands for: "structure" for one
// stereoisomer, "racemate", "relative configuration" and so on for the
// sets stereo groups make.
func setName(id *identity.Identity) string {
	switch {
	case id == nil || id.Set == identity.OneStereoisomer:
		return "structure"
	case id.Set == identity.Mixture && id.Pair():
		return "racemate"
	case id.Set == identity.Mixture:
		return "mixture of stereoisomers"
	case id.Set == identity.OneOf && id.Pair():
		return "relative configuration"
	case id.Set == identity.OneOf:
		return "set of possible stereoisomers"
	}
	return "set of possible mixtures"
}

// AbsoluteLabels writes the labels of the specified chiral units of an
// analysis as a descriptor: "(2S,4R)"; "" when there are none.
func AbsoluteLabels(an *stereo.Analysis) string {
	var parts []string
	for _, u := range an.Units {
		if u.Specified && u.Centre >= 0 && u.Kind != stereo.KindDoubleBond && u.Descriptor.Labelled() {
			parts = append(parts, fmt.Sprintf("%d%s", u.Centre+1, u.Descriptor))
		}
	}
	if len(parts) == 0 {
		return ""
	}
	return "(" + strings.Join(parts, ",") + ")"
}

// setRelationMessage says in words how a record (rec) and an earlier one
// are related by their stereo groups, and gives the code.
func setRelationMessage(m identity.Match, rec, earlier *Record, where string) (notation.Code, string) {
	single, other := rec, earlier
	if m.Single == 1 {
		single, other = earlier, rec
	}
	labels := AbsoluteLabels(single.Stereo())
	if labels == "" {
		labels = "as written"
	}
	switch m.Relation {
	case identity.AbsoluteOfMixture:
		switch {
		case m.Single == 0 && m.Pair:
			return CodeListAbsoluteOfMixture, fmt.Sprintf("the %s enantiomer of the racemate in %s", labels, where)
		case m.Single == 0:
			return CodeListAbsoluteOfMixture, fmt.Sprintf("one of the stereoisomers mixed in %s: %s", where, labels)
		case m.Pair:
			return CodeListAbsoluteOfMixture, fmt.Sprintf("the racemate of the %s enantiomer in %s", labels, where)
		}
		return CodeListAbsoluteOfMixture, fmt.Sprintf("a mixture that holds the stereoisomer in %s, %s", where, labels)
	case identity.AbsoluteOfRelative:
		rel := relativeOf(other.Stereo())
		switch {
		case m.Single == 0 && m.Pair:
			return CodeListAbsoluteOfRelative, fmt.Sprintf("the same relative configuration as %s%s, with the absolute configuration %s", where, rel, labels)
		case m.Single == 0:
			return CodeListAbsoluteOfRelative, fmt.Sprintf("one of the stereoisomers %s may be: %s", where, labels)
		case m.Pair:
			return CodeListAbsoluteOfRelative, fmt.Sprintf("the same relative configuration as %s, %s, without its absolute configuration%s", where, labels, rel)
		}
		return CodeListAbsoluteOfRelative, fmt.Sprintf("may be the stereoisomer in %s, %s, or another", where, labels)
	}
	// the same stereoisomers said as one of them and as their mixture
	here, there := setName(rec.Identity), setName(earlier.Identity)
	if m.Pair && rec.Identity != nil && rec.Identity.Set == identity.OneOf {
		return CodeListRelativeAndMixture, fmt.Sprintf("one enantiomer, unknown which, of the racemate in %s: the same relative configuration%s", where, relativeOf(rec.Stereo()))
	}
	if m.Pair && rec.Identity != nil && rec.Identity.Set == identity.Mixture {
		return CodeListRelativeAndMixture, fmt.Sprintf("the racemate of the relative configuration in %s (there one enantiomer, unknown which)%s", where, relativeOf(rec.Stereo()))
	}
	return CodeListRelativeAndMixture, fmt.Sprintf("the same stereoisomers as %s, said another way: here a %s, there a %s", where, here, there)
}

// relativeOf writes the relative descriptors of an analysis's or and and
// groups: " (rel-(2R,4S))"; "" when there are none.
func relativeOf(an *stereo.Analysis) string {
	var parts []string
	for gi := range an.Groups {
		if an.Groups[gi].Kind != notation.GroupAbsolute {
			if d := an.GroupDescriptor(gi); d != "" {
				parts = append(parts, d)
			}
		}
	}
	if len(parts) == 0 {
		return ""
	}
	return " (" + strings.Join(parts, ", ") + ")"
}

// describeOcc names the record of an occurrence for messages: "line 12
// (LRK-BB-003)".
func (r *Result) describeOcc(o *find.Occurrence) string {
	return nameEarlierAt(named, r.lineOf(o.Span.Start), o.Title)
}

// nameEarlierAt returns a relation's message template with the earlier
// record named where named stands, by its line (0-based) and its title:
// "line 12 (title)". The message is written in one allocation.
func nameEarlierAt(tmpl string, line int, title string) string {
	before, after, ok := strings.Cut(tmpl, named)
	if !ok || strings.Contains(after, named) {
		return strings.ReplaceAll(tmpl, named, nameEarlierAt(named, line, title))
	}
	var num [20]byte
	n := strconv.AppendInt(num[:0], int64(line+1), 10)
	var b strings.Builder
	b.Grow(len(before) + len("line  ()") + len(n) + len(title) + len(after))
	b.WriteString(before)
	b.WriteString("line ")
	b.Write(n)
	if title != "" {
		b.WriteString(" (")
		b.WriteString(title)
		b.WriteByte(')')
	}
	b.WriteString(after)
	return b.String()
}

// lineOf returns the 0-based line of a host offset, from a table of line
// starts built once per result.
func (r *Result) lineOf(off int) int {
	if r.lineStride > 1 {
		r.coverLines(off)
		k := sort.SearchInts(r.lines, off+1) - 1
		return k*r.lineStride + bytes.Count(r.Content[r.lines[k]:off], []byte{'\n'})
	}
	if r.lines == nil {
		r.lines = lineStarts(r.Content)
	}
	return sort.SearchInts(r.lines, off+1) - 1
}

// coverLines extends the table of every lineStride-th line start until
// it holds those up to off: the text is read as far as the lines asked
// for, not all at once (a mapped file lets its pages go behind the
// reading).
func (r *Result) coverLines(off int) {
	if r.lines == nil {
		r.lines = []int{0}
	}
	for r.linesScanned <= off && r.linesScanned < len(r.Content) {
		k := bytes.IndexByte(r.Content[r.linesScanned:], '\n')
		if k < 0 {
			r.linesScanned = len(r.Content)
			return
		}
		r.linesScanned += k + 1
		if r.linesCounted++; r.linesCounted%r.lineStride == 0 {
			r.lines = append(r.lines, r.linesScanned)
		}
	}
}

// differingUnits names the units in which two stereoisomers differ; name
// and earlier name the atoms of each (AtomName).
func differingUnits(name, earlier func(int) string, diffs []identity.UnitDifference) string {
	if len(diffs) == 0 {
		return "the configurations differ"
	}
	var parts []string
	for _, d := range diffs {
		var names []string
		for _, a := range d.Atoms {
			names = append(names, name(a))
		}
		if len(d.Atoms) == 0 {
			// unmarked here: the unit is named by the earlier record's atoms
			for _, a := range d.OtherAtoms {
				names = append(names, earlier(a))
			}
		}
		sep := ""
		if d.Kind == stereo.KindDoubleBond {
			sep = "="
		}
		name := strings.Join(names, sep)
		switch {
		case !d.Specified[0]:
			name += " there (unmarked here)"
		case !d.Specified[1]:
			name += " (unmarked there)"
		}
		parts = append(parts, name)
	}
	return "differs at " + strings.Join(parts, ", ")
}

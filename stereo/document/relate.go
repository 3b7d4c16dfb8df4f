package document

import (
	"fmt"
	"sort"
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
)

// relatedKinds are the hosts whose records form a list of compounds. In
// source code the same structure often appears twice on purpose (an input
// and an expected value), so code is not related.
var relatedKinds = map[find.Kind]bool{
	find.KindList: true, find.KindCSV: true, find.KindTSV: true, find.KindJSON: true, find.KindYAML: true,
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
		Name:        r.Name,
		Content:     r.Content,
		Kind:        r.Kind,
		Records:     append([]Record(nil), r.Records...),
		Queries:     r.Queries,
		Diagnostics: append([]Diagnostic(nil), r.Diagnostics...),
		cfg:         r.cfg,
		related:     true,
	}
	before := len(next.Diagnostics)
	next.relateRecords()
	if len(next.Diagnostics) > before {
		// The findings before were sorted; a stable sort keeps them
		// ahead of relations at the same place, as one pass would.
		next.sortDiagnostics()
	}
	return next
}

// relateRecords reports duplicates, mirror images and stereoisomers among
// the records of a list, each against the first earlier record it
// matches. The identity index keeps keys in maps, so a list of 100,000
// records is related in one pass; only records whose constitution
// pre-key another record shares get identity keys (identity.ConstitutionPreKey), since the
// others can match nothing.
func (r *Result) relateRecords() {
	if !relatedKinds[r.Kind] {
		return
	}
	r.identifyColliding()
	idx := identity.NewIndex()
	var order []int // index position -> record
	for i := range r.Records {
		rec := &r.Records[i]
		if rec.Identity == nil {
			continue
		}
		m := idx.Add(*rec.Identity)
		order = append(order, i)
		if m.Earlier < 0 {
			continue
		}
		j := order[m.Earlier]
		earlier := &r.Records[j]
		where := r.describeRecord(j)
		d := Diagnostic{Span: rec.Occ.Span, Record: i,
			Related: []Related{{Span: earlier.Occ.Span, Message: "the earlier record"}}}
		switch m.Relation {
		case identity.Identical:
			d.Code, d.Severity = CodeListDuplicate, notation.SeverityWarning
			d.Message = "the same structure as " + where
		case identity.Enantiomers:
			d.Code, d.Severity = CodeListEnantiomer, notation.SeverityInformation
			d.Message = "the mirror image of " + where
		case identity.Diastereomers, identity.Unspecified:
			d.Code, d.Severity = CodeListStereoisomer, notation.SeverityInformation
			d.Message = fmt.Sprintf("a stereoisomer of %s: %s", where, differingUnits(rec.Mol, m.Differing))
			if m.Relation == identity.Unspecified {
				d.Message = fmt.Sprintf("the same constitution as %s, marked differently: %s", where, differingUnits(rec.Mol, m.Differing))
			}
		default:
			continue
		}
		r.add(d)
	}
}

// identifyColliding sets the Identity of every record whose pre-key
// occurs more than once in the list, computing the keys on all cores.
func (r *Result) identifyColliding() {
	seen := make(map[uint64]int, len(r.Records))
	for i := range r.Records {
		if an := r.Records[i].an; an != nil && an.identifiable {
			seen[an.preKey]++
		}
	}
	var colliding []int
	for i := range r.Records {
		if an := r.Records[i].an; an != nil && an.identifiable && seen[an.preKey] > 1 {
			colliding = append(colliding, i)
		}
	}
	parallel(len(colliding), func(k int) {
		rec := &r.Records[colliding[k]]
		rec.Identity = rec.an.identify()
	})
}

// describeRecord names a record for messages: "line 12 (LRK-BB-003)".
func (r *Result) describeRecord(i int) string {
	rec := &r.Records[i]
	s := fmt.Sprintf("line %d", r.lineOf(rec.Occ.Span.Start)+1)
	if rec.Occ.Title != "" {
		s += " (" + rec.Occ.Title + ")"
	}
	return s
}

// lineOf returns the 0-based line of a host offset, from a table of line
// starts built once per result.
func (r *Result) lineOf(off int) int {
	if r.lines == nil {
		r.lines = []int{0}
		for i, c := range r.Content {
			if c == '\n' {
				r.lines = append(r.lines, i+1)
			}
		}
	}
	return sort.SearchInts(r.lines, off+1) - 1
}

// differingUnits names the units in which two stereoisomers differ.
func differingUnits(m *notation.Molecule, diffs []identity.UnitDifference) string {
	if len(diffs) == 0 {
		return "the configurations differ"
	}
	var parts []string
	for _, d := range diffs {
		var names []string
		for _, a := range d.Atoms {
			names = append(names, AtomName(m, a))
		}
		sep := ""
		if d.Kind == stereo.KindDoubleBond {
			sep = "="
		}
		name := strings.Join(names, sep)
		switch {
		case !d.Specified[0]:
			name += " (unmarked here)"
		case !d.Specified[1]:
			name += " (unmarked there)"
		}
		parts = append(parts, name)
	}
	return "differs at " + strings.Join(parts, ", ")
}

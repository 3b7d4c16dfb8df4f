package document

// This file implements the analysis of a new version of a record list
// from the result of the previous one: only the lines an edit touched are
// found and read again, only the relations of the records whose
// constitution pre-key the edit touched are computed again, and the rest
// is moved.

import (
	"bytes"
	"sort"
	"strings"

	"stereoline/notation"
	"stereoline/notation/find"
)

// Reanalyze returns what Analyze returns for a new version of a
// document whose previous result, analysed by an analyzer with the same
// configuration, is prev (nil for none). For a record list it reads only
// the lines the change touched and relates again only the records whose
// constitution the change touched; other documents, and lists where the
// change reaches the lines the layout is read from, a comment or a
// pragma, are analysed whole.
func (a *Analyzer) Reanalyze(prev *Result, name, languageID string, content []byte) *Result {
	if next := a.reanalyzeList(prev, name, languageID, content); next != nil {
		return next
	}
	return a.Analyze(name, languageID, content)
}

// reanalyzeList is Reanalyze for a list, or nil when the list must be
// analysed whole.
func (a *Analyzer) reanalyzeList(prev *Result, name, languageID string, content []byte) *Result {
	if prev == nil || !prev.related || prev.Kind != find.KindList || prev.rel == nil || prev.own == nil ||
		len(prev.Queries) > 0 || a.kindOf(name, languageID) != find.KindList ||
		bytes.Contains(prev.Content, []byte("stereoline:")) {
		return nil
	}
	old := prev.Content
	from, oldTo, newTo := changedLines(old, content)
	if from == oldTo && from == newTo {
		// The same text: the same result, for another name.
		next := *prev
		next.Name = name
		return &next
	}
	cfg := a.cfg
	occs, ok := find.FindListLines(content, cfg.findConfig(name), from, newTo)
	if !ok {
		return nil
	}
	occs = append([]find.Occurrence(nil), occs...) // records point into it
	delta := len(content) - len(old)
	// prev's records [i0, i1) lie on the changed lines.
	i0 := sort.Search(len(prev.Records), func(i int) bool { return prev.Records[i].Occ.Span.Start >= from })
	i1 := sort.Search(len(prev.Records), func(i int) bool { return prev.Records[i].Occ.Span.Start >= oldTo })
	dn := len(occs) - (i1 - i0)
	n := len(prev.Records) + dn

	next := &Result{Name: name, Content: content, Kind: prev.Kind, cfg: &cfg, related: true}
	next.Records = make([]Record, n)
	next.own = make([][]Diagnostic, n)
	next.rel = make([]*relation, n)
	copy(next.Records, prev.Records[:i0])
	copy(next.own, prev.own[:i0])
	parallel(len(occs), func(k int) {
		i := i0 + k
		an, f := a.cache.get(occs[k].Text, cfg.Reading.notation(), cfg.Limits.limits())
		next.Records[i] = Record{Occ: &occs[k], an: an}
		next.own[i] = next.recordFindings(i, f)
	})
	moved := prev.Records[i1:]
	var shifted []find.Occurrence
	if delta != 0 {
		shifted = make([]find.Occurrence, len(moved))
	}
	for k := range moved {
		i := i1 + dn + k
		rec := moved[k]
		if delta != 0 {
			shifted[k] = *rec.Occ
			shifted[k].Shift(delta)
			rec.Occ = &shifted[k]
		}
		next.Records[i] = rec
		next.own[i] = moveDiagnostics(prev.own[i1+k], delta, i)
	}
	next.occArrays = prev.occArrays + 1
	if delta != 0 {
		next.occArrays++
	}
	if next.occArrays > maxOccArrays {
		next.compactOccurrences()
	}
	next.relateAgain(prev, i0, i1, dn, delta, lineCount(old[from:oldTo]) != lineCount(content[from:newTo]))
	next.assemble()
	return next
}

// maxOccArrays bounds the arrays of occurrences the records of a list
// point into after edits. Each edit moves the records after it into an
// array of its own while the records before it keep pointing into older
// arrays, which stay whole in memory; past the bound the occurrences are
// copied into one array again.
const maxOccArrays = 3

// compactOccurrences copies the occurrences of r's records into one array.
func (r *Result) compactOccurrences() {
	occs := make([]find.Occurrence, len(r.Records))
	for i := range r.Records {
		occs[i] = *r.Records[i].Occ
		r.Records[i].Occ = &occs[i]
	}
	r.occArrays = 1
}

// changedLines returns the lines where two versions of a text differ:
// old[from:oldTo] became new[from:newTo]; from, oldTo and newTo are line
// starts (or the ends of the texts), and the texts agree before from and
// after the ends.
func changedLines(old, new []byte) (from, oldTo, newTo int) {
	// Blocks first, then bytes: the texts are megabytes long.
	const block = 4096
	p := 0
	for p+block <= min(len(old), len(new)) && bytes.Equal(old[p:p+block], new[p:p+block]) {
		p += block
	}
	for p < len(old) && p < len(new) && old[p] == new[p] {
		p++
	}
	s := 0
	for s+block <= min(len(old), len(new))-p && bytes.Equal(old[len(old)-s-block:len(old)-s], new[len(new)-s-block:len(new)-s]) {
		s += block
	}
	for s < len(old)-p && s < len(new)-p && old[len(old)-1-s] == new[len(new)-1-s] {
		s++
	}
	from = bytes.LastIndexByte(old[:p], '\n') + 1
	// The first newline inside the common suffix ends the change.
	oldTo = len(old)
	if k := bytes.IndexByte(old[len(old)-s:], '\n'); k >= 0 {
		oldTo = len(old) - s + k + 1
	}
	newTo = oldTo + len(new) - len(old)
	return from, oldTo, newTo
}

// moveDiagnostics returns a record's findings moved by delta bytes, for
// record index i; the slice itself when nothing moves.
func moveDiagnostics(ds []Diagnostic, delta, i int) []Diagnostic {
	if len(ds) == 0 || delta == 0 && ds[0].Record == i {
		return ds
	}
	out := make([]Diagnostic, len(ds))
	for k, d := range ds {
		out[k] = moveDiagnostic(d, delta, i)
	}
	return out
}

// moveDiagnostic moves one finding by delta bytes, for record index i.
// Its related places move too: they lie in the same record.
func moveDiagnostic(d Diagnostic, delta, i int) Diagnostic {
	d.Record = i
	if delta == 0 {
		return d
	}
	d.Span = shift(d.Span, delta)
	if d.Related != nil {
		rel := make([]Related, len(d.Related))
		for k, r := range d.Related {
			r.Span = shift(r.Span, delta)
			rel[k] = r
		}
		d.Related = rel
	}
	if d.Fixes != nil {
		fixes := make([]Fix, len(d.Fixes))
		for k, f := range d.Fixes {
			edits := make([]Edit, len(f.Edits))
			for e, ed := range f.Edits {
				ed.Span = shift(ed.Span, delta)
				edits[e] = ed
			}
			f.Edits = edits
			fixes[k] = f
		}
		d.Fixes = fixes
	}
	return d
}

// relateAgain sets the relations of the records of r, a new version of
// prev in which prev's records [i0, i1) were replaced by r's records
// [i0, i1+dn) and the records after them moved by delta bytes (and by
// some lines when linesMoved). The records of every pre-key the change
// touched are related again; the others keep their relations, moved.
func (r *Result) relateAgain(prev *Result, i0, i1, dn, delta int, linesMoved bool) {
	touched := map[uint64]bool{}
	for _, rec := range prev.Records[i0:i1] {
		if rec.an != nil && rec.an.identifiable {
			touched[rec.an.preKey] = true
		}
	}
	for _, rec := range r.Records[i0 : i1+dn] {
		if rec.an != nil && rec.an.identifiable {
			touched[rec.an.preKey] = true
		}
	}
	groups := map[uint64][]int{}
	for i := range r.Records {
		rec := &r.Records[i]
		if rec.an != nil && rec.an.identifiable && touched[rec.an.preKey] {
			groups[rec.an.preKey] = append(groups[rec.an.preKey], i)
			continue
		}
		if i >= i0 && i < i1+dn {
			continue // a new record without identity keys
		}
		// A record the change left alone, with its relation.
		old := i
		if i >= i1+dn {
			old = i - dn
		}
		if prev.rel[old] == nil {
			continue
		}
		rel := prev.rel[old]
		moved := i >= i1+dn
		earlierMoved := rel.earlier >= i1
		if moved || earlierMoved {
			// A relation is shared between versions: a moved one is a copy.
			c := *rel
			rel = &c
			if rel.earlier >= i1 {
				rel.earlier += dn
			}
			d := moveDiagnostic(rel.d, 0, i)
			if moved && delta != 0 {
				d.Span = shift(d.Span, delta)
			}
			d.Related = []Related{{Span: r.Records[rel.earlier].Occ.Span, Message: d.Related[0].Message}}
			if earlierMoved && linesMoved {
				d.Message = r.relationMessage(rel.tmpl, rel.earlier)
			}
			rel.d = d
		}
		r.rel[i] = rel
	}
	for _, members := range groups {
		if len(members) < 2 {
			r.Records[members[0]].Identity = nil
			continue
		}
		r.relateGroup(members)
	}
}

// relationMessage fills a relation's message template with the name of
// the earlier record.
func (r *Result) relationMessage(tmpl string, earlier int) string {
	return strings.ReplaceAll(tmpl, named, r.describeRecord(earlier))
}

// assemble makes r.Diagnostics from the records' own findings and their
// relations, in the order sortDiagnostics gives: a list's records do not
// overlap, and a relation spans its record.
func (r *Result) assemble() {
	n := 0
	for i := range r.own {
		n += len(r.own[i])
		if r.rel[i] != nil {
			n++
		}
	}
	out := make([]Diagnostic, 0, n)
	for i, own := range r.own {
		if r.rel[i] == nil {
			out = append(out, own...)
			continue
		}
		d := r.rel[i].d
		k := sort.Search(len(own), func(k int) bool { return before(d.Span, own[k].Span) })
		out = append(out, own[:k]...)
		out = append(out, d)
		out = append(out, own[k:]...)
	}
	r.Diagnostics = out
}

// lineStarts returns the offsets at which the lines of a text start.
func lineStarts(text []byte) []int {
	lines := make([]int, 1, bytes.Count(text, []byte{'\n'})+1)
	for off := 0; ; {
		k := bytes.IndexByte(text[off:], '\n')
		if k < 0 {
			return lines
		}
		off += k + 1
		lines = append(lines, off)
	}
}

func lineCount(b []byte) int { return bytes.Count(b, []byte{'\n'}) }

func shift(s notation.Span, delta int) notation.Span {
	return notation.Span{Start: s.Start + delta, End: s.End + delta}
}

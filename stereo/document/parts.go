package document

// This file implements the findings of a result kept in parts: a list of
// 100,000 records has about as many findings, some 12 MB, and a new
// version after a one-line edit would copy them all into a new array.
// In parts of a few hundred records, the parts before the edit are the
// old version's and only the others are made again, each a small object
// the runtime recycles without touching fresh memory.

import "sync"

// partRecords is the number of records whose findings one part holds: a
// part of a list with a finding a record stays below 32 KB, the largest
// object the runtime allocates from its per-size lists.
const partRecords = 128

// joinedParts makes the findings kept in parts into one slice, once.
type joinedParts struct {
	once sync.Once
	ds   []Diagnostic
}

// Diagnostics returns the findings, sorted by host position. A result of
// Reanalyze keeps them in parts and joins them on the first call; code
// that goes through them in order should use DiagnosticParts instead.
// The slice must not be changed.
func (r *Result) Diagnostics() []Diagnostic {
	if r.parts == nil {
		return r.diags
	}
	r.joined.once.Do(func() {
		ds := make([]Diagnostic, 0, r.DiagnosticCount())
		for _, p := range r.parts {
			ds = append(ds, p...)
		}
		r.joined.ds = ds
	})
	return r.joined.ds
}

// DiagnosticParts returns the findings, sorted by host position, in
// parts to be read one after the other; a part may be empty. The parts
// must not be changed: results share them.
func (r *Result) DiagnosticParts() [][]Diagnostic {
	if r.parts == nil {
		return [][]Diagnostic{r.diags}
	}
	return r.parts
}

// DiagnosticCount returns the number of findings.
func (r *Result) DiagnosticCount() int {
	if r.parts == nil {
		return len(r.diags)
	}
	n := 0
	for _, p := range r.parts {
		n += len(p)
	}
	return n
}

// Diagnostic returns the finding at index i of Diagnostics, or nil when
// there is none.
func (r *Result) Diagnostic(i int) *Diagnostic {
	if i < 0 {
		return nil
	}
	for _, p := range r.DiagnosticParts() {
		if i < len(p) {
			return &p[i]
		}
		i -= len(p)
	}
	return nil
}

// setParts keeps the findings of r in parts.
func (r *Result) setParts(parts [][]Diagnostic) {
	r.diags, r.parts, r.joined = nil, parts, &joinedParts{}
}

// assemble sets r's findings from the records' own findings and their
// relations, in the order sortDiagnostics gives: a list's records do not
// overlap, and a relation spans its record. Findings are moved to where
// their records are now (own findings were made at ownAt; a relation
// spans its record and names its earlier record's place) and given the
// records' indices. The parts are made on all cores: the work is reading
// findings spread over the heap.
func (r *Result) assemble() {
	parts := make([][]Diagnostic, (len(r.own)+partRecords-1)/partRecords)
	Spread(len(parts), func(c int) { parts[c] = r.assemblePart(c) })
	r.setParts(parts)
}

// assemblePart returns part c of r's findings, made afresh.
func (r *Result) assemblePart(c int) []Diagnostic {
	from, to := c*partRecords, min((c+1)*partRecords, len(r.own))
	n := 0
	for i := from; i < to; i++ {
		n += r.findingCount(i)
	}
	if n == 0 {
		return nil
	}
	out := make([]Diagnostic, n)
	var slab relatedSlab
	p := 0
	for i := from; i < to; i++ {
		k := r.findingCount(i)
		if k == 0 {
			continue // most records: their occurrences are not read
		}
		slab.left = n - p // a finding takes at most one place from it
		r.assembleRecord(out[p:p+k], i, &slab)
		p += k
	}
	return out
}

// findingCount is the number of findings of record i: its own and its
// relation.
func (r *Result) findingCount(i int) int {
	if r.rel[i] != nil {
		return len(r.own[i]) + 1
	}
	return len(r.own[i])
}

// assembleFrom is assemble for r made from prev by replacing prev's
// records [i0, i1) with r's records [i0, i1+dn) and moving the records
// after them by delta bytes. The parts of records the change left where
// they were, with the same relations, are prev's; only the others are
// made.
func (r *Result) assembleFrom(prev *Result, i0, i1, dn, delta int) {
	if len(prev.own) != len(prev.Records) || len(prev.rel) != len(prev.Records) {
		r.assemble()
		return
	}
	old := prev.parts // nil: a result not kept in parts; every part is made
	parts := make([][]Diagnostic, (len(r.own)+partRecords-1)/partRecords)
	var build []int
	for c := range parts {
		from, to := c*partRecords, min((c+1)*partRecords, len(r.own))
		if c < len(old) && to <= len(prev.own) && min((c+1)*partRecords, len(prev.own)) == to &&
			(to <= i0 || dn == 0 && delta == 0 && from >= i1) && sameRelations(r.rel[from:to], prev.rel[from:to]) {
			parts[c] = old[c]
			continue
		}
		build = append(build, c)
	}
	Spread(len(build), func(k int) { parts[build[k]] = r.assemblePart(build[k]) })
	r.setParts(parts)
}

func sameRelations(a, b []*relation) bool {
	for i := range a {
		if a[i] != b[i] {
			return false
		}
	}
	return true
}

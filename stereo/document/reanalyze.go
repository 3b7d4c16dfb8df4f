package document

// This file implements the analysis of a new version of a record list
// from the result of the previous one: only the lines an edit touched are
// found and read again, only the relations of the records whose
// constitution pre-key the edit touched are computed again, and the rest
// is moved.

import (
	"bytes"
	"runtime"
	"slices"
	"sort"
	"sync"
	"sync/atomic"

	"stereoline/notation"
	"stereoline/notation/find"
)

// Reanalyze returns what Analyze returns for a new version of a
// document whose previous result, analysed by an analyzer with the same
// configuration, is prev (nil for none). For a record list, a table, a
// JSON Lines document and a JSON array of records it reads only the
// lines the change touched (for an array, the whole records on them)
// and relates again only the records whose constitution the change
// touched. Where the lines cannot be read apart (a layout or header the
// edit may change, a JSON document that does not read, YAML and SD
// files: find.FindListLines, FindTableLines, FindJSONEdit), the records
// are found whole but only those that changed are read and related
// again (rereadWhole). Other documents, and lists with pragmas or query
// patterns, are analysed whole.
func (a *Analyzer) Reanalyze(prev *Result, name, languageID string, content []byte) *Result {
	if next := a.reanalyzeList(prev, name, languageID, content); next != nil {
		return next
	}
	return a.Analyze(name, languageID, content)
}

// reanalyzeList is Reanalyze for a document whose records are related
// (a list, a table, JSON, YAML, an SD file), or nil when the document
// must be analysed whole.
func (a *Analyzer) reanalyzeList(prev *Result, name, languageID string, content []byte) *Result {
	kind := a.kindOf(name, languageID)
	if prev == nil || !prev.related || prev.rel == nil || prev.own == nil || len(prev.Queries) > 0 ||
		kind != prev.Kind || !relatedKinds[kind] ||
		bytes.Contains(prev.Content, []byte("stereoline:")) {
		return nil
	}
	old := prev.Content
	from, oldTo, newTo := find.EditedLines(old, content)
	if from == oldTo && from == newTo {
		// The same text: the same result, for another name.
		next := *prev
		next.Name = name
		return &next
	}
	cfg := a.cfg
	var occs []find.Occurrence
	var ok bool
	var array *find.JSONArray
	edit := [3]int{from, oldTo, newTo}
	switch kind {
	case find.KindCSV:
		occs, ok = find.FindTableLines(old, content, ',', cfg.findConfig(name), from, newTo)
	case find.KindTSV:
		occs, ok = find.FindTableLines(old, content, '\t', cfg.findConfig(name), from, newTo)
	case find.KindJSON:
		// a record of a pretty-printed array is read again whole
		occs, from, oldTo, newTo, array, ok = find.FindJSONEdit(old, content, cfg.findConfig(name), from, oldTo, newTo, prev.jsonArray)
	case find.KindList:
		occs, ok = find.FindListLines(old, content, cfg.findConfig(name), from, newTo)
	default:
		// YAML and SD files are not read apart by lines: found whole below
	}
	delta := len(content) - len(old)
	var i0, i1 int
	if ok {
		// prev's records [i0, i1) lie on the changed lines.
		i0 = sort.Search(len(prev.Records), func(i int) bool { return prev.Records[i].Occ.Span.Start >= from })
		i1 = sort.Search(len(prev.Records), func(i int) bool { return prev.Records[i].Occ.Span.Start >= oldTo })
	} else {
		// The lines cannot be read apart (a document that does not read
		// as JSON, a layout or a table header the edit may change): the
		// whole is found again, and only the records that differ from
		// prev's are read and related again.
		from, oldTo, newTo = edit[0], edit[1], edit[2]
		occs, i0, i1 = rereadWhole(prev, content, kind, cfg.findConfig(name), delta)
	}
	for k := range occs {
		if occs[k].Dialect == find.DialectSMARTS {
			return nil // query patterns are split off the records whole (splitQueries)
		}
	}
	occs = append([]find.Occurrence(nil), occs...) // records point into it
	dn := len(occs) - (i1 - i0)
	n := len(prev.Records) + dn

	next := &Result{Name: name, Content: content, Kind: prev.Kind, cfg: &cfg, related: true, jsonArray: array,
		foundWhole: !ok, reread: len(occs)}
	next.Records = make([]Record, n)
	next.own = make([][]Diagnostic, n)
	next.ownAt = make([]int, n)
	next.rel = make([]*relation, n)
	if prev.lines != nil {
		next.lines = movedLines(prev.lines, content, from, oldTo, newTo)
	}
	copy(next.Records, prev.Records[:i0])
	copy(next.own, prev.own[:i0])
	prevOwnAt := prev.ownAt
	if prevOwnAt == nil {
		// a result of Analyze: the findings were made where the records are
		prevOwnAt = make([]int, len(prev.Records))
		for i := range prev.Records {
			prevOwnAt[i] = prev.Records[i].Occ.Span.Start
		}
	}
	copy(next.ownAt, prevOwnAt[:i0])
	prevKeys := prev.prekeys
	if prevKeys == nil {
		prevKeys = make([]prekey, len(prev.Records))
		for i := range prev.Records {
			prevKeys[i] = prekeyOf(&prev.Records[i])
		}
	}
	next.prekeys = make([]prekey, n)
	copy(next.prekeys, prevKeys[:i0])
	copy(next.prekeys[i1+dn:], prevKeys[i1:])
	parallel(len(occs), func(k int) {
		i := i0 + k
		an, f := a.cache.get(occs[k].Text, cfg.Reading.notation(), cfg.Limits.limits())
		next.Records[i] = Record{Occ: &occs[k], an: an}
		next.own[i] = next.recordFindings(i, f)
		next.ownAt[i] = occs[k].Span.Start
		next.prekeys[i] = prekeyOf(&next.Records[i])
	})
	// The records after the edit keep their findings where they were
	// made (ownAt says where); assemble moves them. Their occurrences
	// are moved here, into blocks (a block the records before a later
	// edit still point into is the only one kept for them).
	moved := prev.Records[i1:]
	copy(next.Records[i1+dn:], moved)
	copy(next.own[i1+dn:], prev.own[i1:])
	copy(next.ownAt[i1+dn:], prevOwnAt[i1:])
	next.occArrays = max(prev.occArrays, 1) + 1
	if delta != 0 {
		next.occArrays++
		shiftOccurrences(next.Records[i1+dn:], delta)
	}
	if next.occArrays > maxOccArrays {
		next.compactOccurrences()
	}
	next.relateAgain(prev, prevKeys, i0, i1, dn, from, newTo, lineCount(content[from:newTo])-lineCount(old[from:oldTo]))
	next.assembleFrom(prev, i0, i1, dn, delta)
	return next
}

// rereadWhole finds the records of content whole, as Analyze does, and
// returns those that differ from prev's, which are prev's [i0, i1): the
// records before them are prev's as they were, those after them prev's
// moved by delta bytes (find.Occurrence.SameMoved). The records compared
// are found in the same order both times, so a record that is the same
// text at the same place is the same record whichever edit made it so.
func rereadWhole(prev *Result, content []byte, kind find.Kind, fcfg find.Config, delta int) (occs []find.Occurrence, i0, i1 int) {
	all := find.FindKind(kind, content, fcfg)
	n, m := len(prev.Records), len(all)
	p := 0
	for p < n && p < m && all[p].SameMoved(prev.Records[p].Occ, 0) {
		p++
	}
	s := 0
	for s < n-p && s < m-p && all[m-1-s].SameMoved(prev.Records[n-1-s].Occ, delta) {
		s++
	}
	return all[p : m-s], p, n - s
}

// occBlock is the number of occurrences in one block of moved ones: a
// block (168 bytes an occurrence) stays below 32 KB, the largest object
// the runtime allocates from its per-size lists rather than as pages of
// its own.
const occBlock = 192

// maxOccArrays bounds the arrays of occurrences the records of a list
// point into after edits that are used in part only. Each edit puts the
// records after it into blocks of their own, while the records before
// it keep pointing into older arrays: the array or block at the place of
// the edit stays whole in memory for the part of it before the edit.
// Past the bound the occurrences are copied into blocks again, so the
// memory so held stays below the bound times a block.
const maxOccArrays = 32

// shiftOccurrences points recs at copies of their occurrences moved by
// delta bytes, in blocks, made on all cores: an edit at the top of a
// long list moves 100,000 of them.
func shiftOccurrences(recs []Record, delta int) {
	blocks := (len(recs) + occBlock - 1) / occBlock
	work := func(b int) {
		part := recs[b*occBlock : min((b+1)*occBlock, len(recs))]
		block := make([]find.Occurrence, len(part))
		for k := range part {
			block[k] = *part[k].Occ
			block[k].Shift(delta)
			part[k].Occ = &block[k]
		}
	}
	if blocks < 8 {
		for b := range blocks {
			work(b)
		}
		return
	}
	Spread(blocks, work)
}

// compactOccurrences copies the occurrences of r's records into blocks.
func (r *Result) compactOccurrences() {
	var block []find.Occurrence
	for i := range r.Records {
		if len(block) == 0 {
			block = make([]find.Occurrence, min(occBlock, len(r.Records)-i))
		}
		block[0] = *r.Records[i].Occ
		r.Records[i].Occ = &block[0]
		block = block[1:]
	}
	r.occArrays = 1
}

// moveDiagnostic moves one finding by delta bytes, for record index i.
// Its related places and fixes move too: they lie in the same record.
// New slices are made for them; related places of one element are taken
// from slab, which is returned with what is left of it.
func moveDiagnostic(d Diagnostic, delta, i int, slab *relatedSlab) Diagnostic {
	d.Record = i
	if delta == 0 {
		return d
	}
	d.Span = shift(d.Span, delta)
	if d.Related != nil {
		var rel []Related
		if len(d.Related) == 1 {
			rel = slab.take()
		} else {
			rel = make([]Related, len(d.Related))
		}
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

// A relatedSlab hands out related places of one element, allocated
// together: a moved relation takes one, and a list has thousands.
type relatedSlab struct {
	free []Related
	// left bounds the places still to be taken, so that the last
	// allocation is no larger than it needs to be
	left int
}

// slabSize is how many related places a slab allocates at most at a time.
const slabSize = 512

func (s *relatedSlab) take() []Related {
	if len(s.free) == 0 {
		s.free = make([]Related, min(slabSize, max(s.left, 1)))
	}
	r := s.free[:1:1]
	s.free = s.free[1:]
	s.left--
	return r
}

// prekey is a record's constitution pre-key, ok when it has one (an
// identifiable record). Results keep them in an array of their own for
// Reanalyze, which looks at every record's: reading them through the
// records' analyses costs a cache miss a record.
type prekey struct {
	key uint64
	ok  bool
}

func prekeyOf(rec *Record) prekey {
	if rec.an == nil || !rec.an.identifiable {
		return prekey{}
	}
	return prekey{relateKey(rec.an.preKey, rec.Occ), true}
}

// relateKey is the key records are related by: the constitution pre-key,
// and the field of a table or dataset the record is in (find.Occurrence
// Field), so that records of different fields never collide.
func relateKey(preKey uint64, o *find.Occurrence) uint64 {
	if o == nil || o.Field == 0 {
		return preKey
	}
	return preKey ^ (uint64(o.Field)+1)*0x9e3779b97f4a7c15
}

// relateAgain sets the relations of the records of r, a new version of
// prev in which prev's records [i0, i1) were replaced by r's records
// [i0, i1+dn) and the records after them moved. The edited lines are
// [from, newTo) of r's text: the records before them are on the lines
// they were, those after them lines lines further down (up when
// negative). prevKeys are prev's pre-keys. The records of every pre-key
// the change touched are related again; the others keep their
// relations. A relation's places and record index are set by assemble,
// so a relation is copied only when the index or the line of its
// earlier record changed.
func (r *Result) relateAgain(prev *Result, prevKeys []prekey, i0, i1, dn, from, newTo, lines int) {
	var touched []uint64 // a few pre-keys: a slice beats a map
	touch := func(keys []prekey) {
		for _, k := range keys {
			if k.ok && !slices.Contains(touched, k.key) {
				touched = append(touched, k.key)
			}
		}
	}
	touch(prevKeys[i0:i1])
	touch(r.prekeys[i0 : i1+dn])
	// The records are gone through in spans, on all cores: an edit at
	// the top of a long list moves every relation, and each that moves
	// is copied (a relation is shared between versions: a changed one
	// is a copy), its message naming the earlier record's moved line.
	const span = 4096
	spans := (len(r.prekeys) + span - 1) / span
	touchedIn := make([][]int, spans) // the records of touched pre-keys, in order
	// copied relations whose earlier record starts on the edited lines:
	// its line is looked up after
	lookUp := make([][]int, spans)
	moves := dn != 0 || lines != 0
	Spread(spans, func(sp int) {
		for i := sp * span; i < min(len(r.prekeys), (sp+1)*span); i++ {
			if k := r.prekeys[i]; k.ok && len(touched) > 0 && slices.Contains(touched, k.key) {
				touchedIn[sp] = append(touchedIn[sp], i)
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
			rel := prev.rel[old]
			if rel == nil {
				continue
			}
			// The earlier record's index now. Its line is looked at when
			// it may have moved: after the edit, or anywhere in a
			// document found whole, where a record on the edited lines
			// may be the same record moved, by other lines than the
			// edit's (records found by lines there are read again).
			e := rel.earlier
			if e >= i1 {
				e += dn
			}
			if r.foundWhole || moves && e >= i1+dn {
				switch o := r.Records[e].Occ; {
				case o.Span.Start >= from && o.Span.Start < newTo:
					c := *rel
					c.earlier = e
					rel = &c
					lookUp[sp] = append(lookUp[sp], i)
				case o.Span.Start >= newTo && (e != rel.earlier || lines != 0):
					c := *rel
					c.earlier = e
					if lines != 0 {
						c.line += lines
						c.d.Message = nameEarlierAt(c.tmpl, c.line, o.Title)
					}
					rel = &c
				}
			}
			r.rel[i] = rel
		}
	})
	for _, in := range lookUp {
		for _, i := range in {
			c := r.rel[i] // a copy of its own
			o := r.Records[c.earlier].Occ
			c.line = r.lineOf(o.Span.Start)
			c.d.Message = nameEarlierAt(c.tmpl, c.line, o.Title)
		}
	}
	groups := make([][]int, len(touched)) // in the order of touched
	for _, in := range touchedIn {
		for _, i := range in {
			g := slices.Index(touched, r.prekeys[i].key)
			groups[g] = append(groups[g], i)
		}
	}
	for _, members := range groups {
		if len(members) == 0 {
			continue
		}
		if len(members) < 2 {
			r.Records[members[0]].Identity = nil
			continue
		}
		r.relateGroup(members)
	}
}

// assembleRecord writes the findings of record i into out, which holds
// exactly them, taking related places of one element from slab.
func (r *Result) assembleRecord(out []Diagnostic, i int, slab *relatedSlab) {
	own := r.own[i]
	span := r.Records[i].Occ.Span
	delta := 0
	if r.ownAt != nil {
		delta = span.Start - r.ownAt[i]
	}
	for k := range own {
		if own[k].Record == i && delta == 0 {
			out[k] = own[k]
			continue
		}
		out[k] = moveDiagnostic(own[k], delta, i, slab)
	}
	rel := r.rel[i]
	if rel == nil {
		return
	}
	d := rel.d
	d.Record = i
	d.Span = span
	if at := r.Records[rel.earlier].Occ.Span; d.Related[0].Span != at {
		d.Related = slab.take()
		d.Related[0] = Related{Span: at, Message: rel.d.Related[0].Message}
	}
	mine := out[:len(own)]
	k := sort.Search(len(mine), func(k int) bool { return before(d.Span, mine[k].Span) })
	copy(out[k+1:], mine[k:])
	out[k] = d
}

// Spread calls f(0) ... f(n-1) on all cores; each call is a large piece
// of work (parallel is for many small ones).
func Spread(n int, f func(int)) {
	workers := min(runtime.GOMAXPROCS(0), n)
	if workers < 2 {
		for i := range n {
			f(i)
		}
		return
	}
	var next atomic.Int64
	var wg sync.WaitGroup
	for range workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := int(next.Add(1)) - 1; i < n; i = int(next.Add(1)) - 1 {
				f(i)
			}
		}()
	}
	wg.Wait()
}

// movedLines returns lineStarts of a text from lines, those of an older
// version in which old[from:oldTo] became text[from:newTo] (find.EditedLines):
// the lines before the change are kept, those it made are found, and
// those after it are moved.
func movedLines(lines []int, text []byte, from, oldTo, newTo int) []int {
	k := sort.SearchInts(lines, from+1) // lines[:k] start at or before from
	after := sort.SearchInts(lines, oldTo+1)
	out := make([]int, k, len(lines)+lineCount(text[from:newTo])+1)
	copy(out, lines[:k])
	for off := from; ; {
		j := bytes.IndexByte(text[off:newTo], '\n')
		if j < 0 {
			break
		}
		off += j + 1
		out = append(out, off)
	}
	for _, l := range lines[after:] {
		out = append(out, l+newTo-oldTo)
	}
	return out
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

package lsp

// This file implements the cache of the JSON of each record's findings
// that publications of a large document share: an edit of one line of a
// list of 100,000 records changes the findings of a few records, and
// moves the others by some bytes and perhaps a line, which changes only
// their line numbers. The JSON of a record's findings is kept with holes
// where the line numbers go, keyed by the record's text, and written
// again only for the records whose text or findings changed.

import (
	"strconv"

	"stereoline/notation"
	"stereoline/stereo/document"
)

// jsonCache is the JSON of the findings of the records of one document,
// from its last publications.
type jsonCache struct {
	uri      string
	encoding PositionEncoding
	// frags are keyed by the host text from the start of the record's
	// first line to just after its last finding.
	frags map[string]*fragment
}

// fragment is the JSON of the findings of one record (a run of
// consecutive findings with the same Record), with holes.
type fragment struct {
	key string
	// diags are the findings it was written for, their spans relative
	// to the start of the record's first line; related places outside
	// the record have the span outside.
	diags []document.Diagnostic
	json  []byte
	holes []hole
}

// outside marks a related place outside the record in fragment.diags.
var outside = notation.Span{Start: -1, End: -1}

// hole is a place in a fragment's JSON where a number or range goes: the
// record's first line plus line, or, for a range hole, the range of
// related place rel of finding diag of the run.
type hole struct {
	at        int
	line      int
	rng       bool
	diag, rel int
}

// fragWriter records the holes while a fragment is written.
type fragWriter struct {
	base  int           // the record's first line
	rec   notation.Span // the record's host span
	diag  int           // the finding being written, in the run
	holes []hole
}

// inside reports whether a related place lies in the record.
func (fw *fragWriter) inside(s notation.Span) bool {
	return s.Start >= fw.rec.Start && s.End <= fw.rec.End
}

// cacheUse is what one part of a publication did with the cache: the
// fragments it used and the ones it made.
type cacheUse struct {
	used, made []*fragment
}

// fits reports whether the cache holds fragments for f's URI and
// encoding (both are written into the fragments).
func (c *jsonCache) fits(f *fileVersion) bool {
	return c.frags != nil && c.uri == f.URI && c.encoding == f.mapper.Encoding()
}

// reset empties the cache for f.
func (c *jsonCache) reset(f *fileVersion) {
	c.uri, c.encoding, c.frags = f.URI, f.mapper.Encoding(), map[string]*fragment{}
}

// update adds the fragments a publication made. The cache keeps what
// the publication used; fragments unused are dropped once they are as
// many as those used, so the cache stays within twice the publication.
func (c *jsonCache) update(uses []cacheUse) {
	used := 0
	for _, u := range uses {
		used += len(u.used)
	}
	if len(c.frags) > 2*used+1024 {
		c.frags = make(map[string]*fragment, used)
		for _, u := range uses {
			for _, fr := range u.used {
				c.frags[fr.key] = fr
			}
		}
	}
	for _, u := range uses {
		for _, fr := range u.made {
			c.frags[fr.key] = fr
		}
	}
}

// runStart returns the first index at or after i where a run of findings
// of one record starts (or len(ds)).
func runStart(ds []document.Diagnostic, i int) int {
	if i >= len(ds) {
		return len(ds)
	}
	for i > 0 && i < len(ds) && ds[i].Record >= 0 && ds[i].Record == ds[i-1].Record {
		i++
	}
	return i
}

// appendRuns writes findings [from, to) of res (from and to start runs),
// each record's from the cache when it fits, recording in use what it
// used and made. The cache is only read here: parts run in parallel.
func (c *jsonCache) appendRuns(b []byte, m *Mapper, res *document.Result, uri []byte, from, to int, use *cacheUse) ([]byte, error) {
	ds := res.Diagnostics
	cur := cursor{m: m}
	content := m.Content()
	for i := from; i < to; {
		if i > 0 {
			b = append(b, ',')
		}
		d := &ds[i]
		if d.Record < 0 || d.Record >= len(res.Records) {
			var err error
			if b, err = appendDiagnostic(b, &cur, uri, d, nil); err != nil {
				return b, err
			}
			i++
			continue
		}
		j := i + 1
		for j < to && ds[j].Record == d.Record {
			j++
		}
		run := ds[i:j]
		rec := res.Records[d.Record].Occ.Span
		first, end := min(rec.Start, d.Span.Start), d.Span.End
		for k := range run {
			first, end = min(first, run[k].Span.Start), max(end, run[k].Span.End)
			for _, r := range run[k].Related {
				if r.Span.Start >= rec.Start && r.Span.End <= rec.End {
					first, end = min(first, r.Span.Start), max(end, r.Span.End)
				}
			}
		}
		pos, err := cur.position(max(first, 0))
		if err != nil {
			return b, err
		}
		line := int(pos.Line)
		start := m.lineStarts[line]
		// one byte more: where a line ends ("\r\n") depends on it
		key := content[start:min(end+1, len(content))]
		fr := c.frags[string(key)]
		if fr == nil || !fr.matches(run, start, rec) {
			fw := fragWriter{base: line, rec: rec}
			var js []byte
			sub := cursor{m: m, line: line}
			for k := range run {
				if k > 0 {
					js = append(js, ',')
				}
				fw.diag = k
				if js, err = appendDiagnostic(js, &sub, uri, &run[k], &fw); err != nil {
					return b, err
				}
			}
			fr = &fragment{key: string(key), diags: relative(run, start, rec), json: js, holes: fw.holes}
			use.made = append(use.made, fr)
		} else {
			use.used = append(use.used, fr)
		}
		if b, err = fr.write(b, line, run, m); err != nil {
			return b, err
		}
		i = j
	}
	return b, nil
}

// relative returns a run's findings with their spans relative to start,
// related places outside the record marked outside.
func relative(run []document.Diagnostic, start int, rec notation.Span) []document.Diagnostic {
	out := make([]document.Diagnostic, len(run))
	for k, d := range run {
		d.Span = notation.Span{Start: d.Span.Start - start, End: d.Span.End - start}
		if len(d.Related) > 0 {
			rel := make([]document.Related, len(d.Related))
			for r, x := range d.Related {
				rel[r] = document.Related{Span: outside, Message: x.Message}
				if x.Span.Start >= rec.Start && x.Span.End <= rec.End {
					rel[r].Span = notation.Span{Start: x.Span.Start - start, End: x.Span.End - start}
				}
			}
			d.Related = rel
		}
		d.Fixes, d.Record = nil, 0
		out[k] = d
	}
	return out
}

// matches reports whether the fragment was written for these findings
// (spans relative to start) of a record at rec.
func (fr *fragment) matches(run []document.Diagnostic, start int, rec notation.Span) bool {
	if len(run) != len(fr.diags) {
		return false
	}
	for k := range run {
		d, s := &run[k], &fr.diags[k]
		if d.Code != s.Code || d.Severity != s.Severity || d.Unnecessary != s.Unnecessary ||
			d.Span.Start-start != s.Span.Start || d.Span.End-start != s.Span.End ||
			d.Message != s.Message || len(d.Related) != len(s.Related) {
			return false
		}
		for r := range d.Related {
			x, y := &d.Related[r], &s.Related[r]
			if x.Message != y.Message {
				return false
			}
			if x.Span.Start >= rec.Start && x.Span.End <= rec.End {
				if x.Span.Start-start != y.Span.Start || x.Span.End-start != y.Span.End {
					return false
				}
			} else if y.Span != outside {
				return false
			}
		}
	}
	return true
}

// write writes the fragment for a record whose first line is line, the
// holes filled: line numbers, and the ranges of the related places
// outside the record.
func (fr *fragment) write(b []byte, line int, run []document.Diagnostic, m *Mapper) ([]byte, error) {
	prev := 0
	for _, h := range fr.holes {
		b = append(b, fr.json[prev:h.at]...)
		prev = h.at
		if !h.rng {
			b = strconv.AppendInt(b, int64(line+h.line), 10)
			continue
		}
		r, err := m.SpanToRange(run[h.diag].Related[h.rel].Span)
		if err != nil {
			return b, err
		}
		b = appendRange(b, r)
	}
	return append(b, fr.json[prev:]...), nil
}

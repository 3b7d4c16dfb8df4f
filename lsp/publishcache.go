package lsp

// This file implements the cache of the JSON of each record's findings
// that publications of a large document share: an edit of one line of a
// list of 100,000 records changes the findings of a few records, and
// moves the others by some bytes and perhaps a line, which changes only
// their line numbers. The JSON of a record's findings is kept with holes
// where the line numbers go, keyed by the record's text, and written
// again only for the records whose text or findings changed.

import (
	"bytes"
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
// consecutive findings with the same Record), with holes: a zero byte
// (which JSON as written here never holds: control characters are
// escaped) followed by 'L' and the line relative to the record's first
// line, or by 'R' and the finding and related place whose range goes
// there (a related place outside the record).
type fragment struct {
	key string
	// finds are the findings it was written for, their spans relative
	// to the start of the record's first line.
	finds []finding
	json  []byte
}

// finding is what the JSON of a finding depends on but its line
// numbers, compactly.
type finding struct {
	code        notation.Code
	message     string
	start, end  int
	severity    notation.Severity
	unnecessary bool
	related     []relatedPlace
}

// relatedPlace is a related place relative to the record's first line,
// start -1 for a place outside the record.
type relatedPlace struct {
	message    string
	start, end int
}

// holeMax is the largest number a hole holds in its byte (a variable
// for the tests).
var holeMax = 250

// fragWriter records the holes while a fragment is written.
type fragWriter struct {
	base int           // the record's first line
	rec  notation.Span // the record's host span
	diag int           // the finding being written, in the run
	// tooFar is set when a number does not fit a hole's byte: the run
	// is then written without the cache.
	tooFar bool
}

// inside reports whether a related place lies in the record.
func (fw *fragWriter) inside(s notation.Span) bool {
	return s.Start >= fw.rec.Start && s.End <= fw.rec.End
}

// rangeHole writes the hole of the range of related place rel.
func (fw *fragWriter) rangeHole(b []byte, rel int) []byte {
	if fw.diag > holeMax || rel > holeMax {
		fw.tooFar = true
	}
	return append(b, 0, 'R', byte(fw.diag), byte(rel))
}

// lineHole writes the hole of a line number.
func (fw *fragWriter) lineHole(b []byte, line int) []byte {
	d := line - fw.base
	if d < 0 || d > holeMax {
		fw.tooFar = true
	}
	return append(b, 0, 'L', byte(d))
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
			if fw.tooFar {
				// a record of many lines or findings: written as it is
				for k := range run {
					if k > 0 {
						b = append(b, ',')
					}
					if b, err = appendDiagnostic(b, &sub, uri, &run[k], nil); err != nil {
						return b, err
					}
				}
				i = j
				continue
			}
			fr = &fragment{key: string(key), finds: relative(run, start, rec), json: js}
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

// relative returns what the JSON of a run's findings depends on, spans
// relative to start.
func relative(run []document.Diagnostic, start int, rec notation.Span) []finding {
	out := make([]finding, len(run))
	for k := range run {
		d := &run[k]
		f := finding{code: d.Code, message: d.Message, start: d.Span.Start - start, end: d.Span.End - start,
			severity: d.Severity, unnecessary: d.Unnecessary}
		if len(d.Related) > 0 {
			f.related = make([]relatedPlace, len(d.Related))
			for r, x := range d.Related {
				f.related[r] = relatedPlace{message: x.Message, start: -1, end: -1}
				if x.Span.Start >= rec.Start && x.Span.End <= rec.End {
					f.related[r].start, f.related[r].end = x.Span.Start-start, x.Span.End-start
				}
			}
		}
		out[k] = f
	}
	return out
}

// matches reports whether the fragment was written for these findings
// (spans relative to start) of a record at rec.
func (fr *fragment) matches(run []document.Diagnostic, start int, rec notation.Span) bool {
	if len(run) != len(fr.finds) {
		return false
	}
	for k := range run {
		d, f := &run[k], &fr.finds[k]
		if d.Code != f.code || d.Severity != f.severity || d.Unnecessary != f.unnecessary ||
			d.Span.Start-start != f.start || d.Span.End-start != f.end ||
			d.Message != f.message || len(d.Related) != len(f.related) {
			return false
		}
		for r := range d.Related {
			x, y := &d.Related[r], &f.related[r]
			if x.Message != y.message {
				return false
			}
			if x.Span.Start >= rec.Start && x.Span.End <= rec.End {
				if x.Span.Start-start != y.start || x.Span.End-start != y.end {
					return false
				}
			} else if y.start != -1 {
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
	js := fr.json
	for {
		k := bytes.IndexByte(js, 0)
		if k < 0 {
			return append(b, js...), nil
		}
		b = append(b, js[:k]...)
		if js[k+1] == 'L' {
			b = strconv.AppendInt(b, int64(line+int(js[k+2])), 10)
			js = js[k+3:]
			continue
		}
		r, err := m.SpanToRange(run[js[k+2]].Related[js[k+3]].Span)
		if err != nil {
			return b, err
		}
		b = appendRange(b, r)
		js = js[k+4:]
	}
}

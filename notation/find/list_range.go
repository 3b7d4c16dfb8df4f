package find

import (
	"bytes"

	"stereoline/notation"
)

// This file implements the finding of the records of some lines of a
// list apart from the rest, so that an editor re-reads only the lines an
// edit touched.

// FindListLines returns the records of the list src on the lines from
// offset from (a line start) to offset to (a line start or len(src)),
// exactly as FindKind(KindList, src, cfg) finds them there. ok is false
// when those lines cannot be read apart from the rest, and the caller
// must read the whole list: the list carries pragmas, or holds query
// patterns or fragments; a list with a header line and separators, read
// as a table (FindTableLines), when that cannot be read apart either.
//
// old is the text before an edit that changed old[from:] into src[from:]
// with the lines after to unchanged (nil when there is none). The
// records outside the range are old's then; the caller must know that
// none of old's records is a query pattern (see FindTableLines). A range
// that reaches into the first lines, which the layout is read from, can
// be read apart only when old is given and its layout reads as src's,
// neither text has a header line the edit moves, and no note on the
// layout goes on the first record: the records outside the range are
// then read alike in both texts. This keeps an edit at the top of a long
// list (a record added first, the first record's mark changed) from
// reading the whole list again.
func FindListLines(old, src []byte, cfg Config, from, to int) (occs []Occurrence, ok bool) {
	if from < 0 || to > len(src) || from > to || bytes.Contains(src, []byte(pragmaWord)) {
		return nil, false
	}
	fixed, bad := listSpec(src, &cfg)
	v := detectLayout(src, skipBOM(src), fixed, newNamer(&cfg), &cfg)
	lay := v.layout
	if v.none || v.queries || v.fragments {
		return nil, false
	}
	table := lay.Sep != ' ' && lay.Header // read as a table by its header, if it names a structure column
	sample := dataLines(src, skipBOM(src), sampleLines+1)
	if len(sample) <= sampleLines || from <= sample[len(sample)-1].end {
		if old == nil || bad != "" || v.ambiguous != "" || lay.Header && !table ||
			bytes.Contains(old, []byte(pragmaWord)) || skipBOM(old) != skipBOM(src) {
			return nil, false
		}
		from = max(from, skipBOM(src)) // a byte order mark both texts begin with is no part of a line
		oldFixed, _ := listSpec(old, &cfg)
		if detectLayout(old, skipBOM(old), oldFixed, newNamer(&cfg), &cfg) != v ||
			!table && (headerFrom(src, from, lay) || headerFrom(old, from, lay)) {
			return nil, false
		}
	}
	if table {
		// A table whose header names no structure column is read as a
		// list; that is left to a whole reading.
		if old == nil || !namesColumn(src, sample[0], lay.Sep, newNamer(&cfg), &cfg) {
			return nil, false
		}
		occs, ok := tableLines(old, src, sample[0].start, lay.Sep, &cfg, from, to)
		if !ok {
			return nil, false
		}
		for i := range occs {
			occs[i].Kind, occs[i].Construct = KindList, ConstructListRecord
		}
		return occs, true
	}
	// Comments are no records; without pragmas, which the check above
	// rules out, they mean nothing else.
	occs, queries := listRecords(src[from:to], 0, v, nil, false, nil)
	if queries > 0 {
		return nil, false
	}
	for i := range occs {
		occs[i].Shift(from)
	}
	return occs, true
}

// headerFrom reports whether the first data line of a list starts at
// or after offset from and is a header line the scanner skips: an edit
// before it makes it a record, or a record the header.
func headerFrom(src []byte, from int, lay Layout) bool {
	for pos := skipBOM(src); pos < len(src); {
		line, next := nextLine(src, pos)
		start := pos
		pos = next
		for len(line) > 0 && (line[0] == ' ' || line[0] == '\t') {
			line = line[1:]
		}
		if len(line) == 0 || line[0] == '\r' || isComment(line) {
			continue
		}
		return start >= from && headerLine(line, lay)
	}
	return false
}

// SameMoved reports whether o is p moved by delta host bytes (Shift):
// every field equal, spans and offsets delta apart, host findings and
// fixes included.
func (o *Occurrence) SameMoved(p *Occurrence, delta int) bool {
	if o.Text != p.Text || o.Title != p.Title || o.Kind != p.Kind || o.Construct != p.Construct ||
		o.Reason != p.Reason || o.Dialect != p.Dialect || o.Cell != p.Cell || o.Field != p.Field ||
		o.Span != shiftSpan(p.Span, delta) || o.group != p.group ||
		len(o.Diagnostics) != len(p.Diagnostics) || len(o.Fixes) != len(p.Fixes) ||
		o.m.size != p.m.size || len(o.m.runs) != len(p.m.runs) || (o.m.runs == nil) != (p.m.runs == nil) {
		return false
	}
	for i, e := range o.Diagnostics {
		f := p.Diagnostics[i]
		if e.Code != f.Code || e.Severity != f.Severity || e.Msg != f.Msg || e.Span != shiftSpan(f.Span, delta) ||
			len(e.Related) != len(f.Related) {
			return false
		}
		for k, r := range e.Related {
			if r.Msg != f.Related[k].Msg || r.Span != shiftSpan(f.Related[k].Span, delta) {
				return false
			}
		}
	}
	for i, fs := range o.Fixes {
		if len(fs) != len(p.Fixes[i]) {
			return false
		}
		for k, x := range fs {
			y := p.Fixes[i][k]
			if x.Title != y.Title || x.NewText != y.NewText || x.Span != shiftSpan(y.Span, delta) {
				return false
			}
		}
	}
	// the host's encoder: none, or the same function (those of the
	// kinds compared, lists, tables, JSON, YAML and SD files, are
	// functions without state)
	if (o.encode == nil) != (p.encode == nil) || o.encode != nil && !sameFunc(o.encode, p.encode) {
		return false
	}
	if o.m.runs == nil {
		return o.m.base == p.m.base+delta
	}
	for i, r := range o.m.runs {
		q := p.m.runs[i]
		q.h += delta
		if r != q {
			return false
		}
	}
	return true
}

// Shift moves an occurrence by delta host bytes, as when the host text
// before it grew or shrank by delta: its span, offset map, host findings
// and fixes.
func (o *Occurrence) Shift(delta int) {
	if delta == 0 {
		return
	}
	o.Span = notation.Span{Start: o.Span.Start + delta, End: o.Span.End + delta}
	if o.m.runs == nil {
		o.m.base += delta
	} else {
		runs := make([]run, len(o.m.runs))
		for i, r := range o.m.runs {
			r.h += delta
			runs[i] = r
		}
		o.m.runs = runs
	}
	if o.Diagnostics != nil {
		diags := make(notation.ErrorList, len(o.Diagnostics))
		for i, e := range o.Diagnostics {
			c := *e
			c.Span = shiftSpan(c.Span, delta)
			if c.Related != nil {
				c.Related = append([]notation.Related(nil), c.Related...)
				for k := range c.Related {
					c.Related[k].Span = shiftSpan(c.Related[k].Span, delta)
				}
			}
			diags[i] = &c
		}
		o.Diagnostics = diags
	}
	if o.Fixes != nil {
		fixes := make([][]Fix, len(o.Fixes))
		for i, fs := range o.Fixes {
			fixes[i] = append([]Fix(nil), fs...)
			for k := range fixes[i] {
				fixes[i][k].Span = shiftSpan(fixes[i][k].Span, delta)
			}
		}
		o.Fixes = fixes
	}
}

func shiftSpan(s notation.Span, delta int) notation.Span {
	return notation.Span{Start: s.Start + delta, End: s.End + delta}
}

// EditedLines returns the lines where two versions of a text differ:
// old[from:oldTo] became new[from:newTo]; from, oldTo and newTo are line
// starts (or the ends of the texts), and the texts agree before from and
// after the ends: the lines an editor's change touched, which
// FindListLines and FindTableLines read apart.
func EditedLines(old, new []byte) (from, oldTo, newTo int) {
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

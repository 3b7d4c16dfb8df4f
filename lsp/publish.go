package lsp

// This file implements the writing of textDocument/publishDiagnostics
// for large documents: the JSON is written by hand in one buffer, so a
// list of 100,000 records with as many findings is not turned into
// protocol structures and marshalled by reflection on every edit.

import (
	"bytes"
	"encoding/json"
	"fmt"
	"math"
	"strconv"
	"sync"
	"unicode/utf8"

	"go.lsp.dev/protocol"

	"stereoline/notation"
	"stereoline/stereo/document"
)

// diagnosticsJSON writes the params of a publishDiagnostics notification
// for res: the same JSON that marshalling publishDiagnosticsParams with
// toDiagnostics gives, field for field.
func diagnosticsJSON(f *fileVersion, res *document.Result, version *int32) (json.RawMessage, error) {
	parts, err := diagnosticsParts(f, res, version)
	if err != nil {
		return nil, err
	}
	return bytes.Join(parts, nil), nil
}

// diagnosticsParts is diagnosticsJSON in parts that are to be written one
// after the other, written afresh.
func diagnosticsParts(f *fileVersion, res *document.Result, version *int32) ([][]byte, error) {
	p, err := publish(nil, f, res, version)
	if err != nil {
		return nil, err
	}
	return p.parts, nil
}

// A publication is the JSON of one publishDiagnostics notification of a
// document, kept for the next: a one-line edit of a list of 100,000
// records changes a few of its findings, and the JSON of the others is
// the same bytes again wherever their lines did not move. The next
// publication writes only the findings that changed and takes the
// others' bytes from this one, without copying them.
//
// A publication and the buffers it refers to are owned by the one
// goroutine that publishes the document (the worker publishes a document
// once at a time); its parts must have been written before the next
// publication of the document is made from it, which may give buffers
// it no longer uses back for reuse.
type publication struct {
	uri      string
	version  int32            // the document version it publishes
	res      *document.Result // the result it publishes, set by worker.make
	encoding PositionEncoding
	content  []byte // the text the positions were computed in
	lines    int    // its line count
	// diags are the findings written, in the order written: pointers into
	// a result's findings, which are never changed once made (results are
	// values), so they stay as they were
	diags []*document.Diagnostic
	bufs  [][]byte // the buffers holding the findings' JSON
	at    []jsonAt // where the JSON of each finding lies, in bufs
	// spare and spareDiags are the at and diags of the publication before
	// this one, which nothing reads once this one is made: the next
	// publication's
	spare      []jsonAt
	spareDiags []*document.Diagnostic
	// parts are the params to write, one after the other: the head, the
	// runs of findings' JSON and the commas between runs, the tail.
	parts [][]byte
}

// jsonAt is where the JSON of one finding lies: bufs[buf][from:from+n].
// A part may pass 4 GB (a huge record's thousands of findings), so the
// offset is an int; one finding's JSON does not (publish checks).
type jsonAt struct {
	from int
	n    uint32
	buf  int32
}

func (a jsonAt) to() int { return a.from + int(a.n) }

// Bounds that keep a chain of publications, each made from the one
// before, from growing without bound: past them the next publication is
// written afresh.
const (
	// maxPublicationParts bounds the parts of a publication; each edit
	// may add a few.
	maxPublicationParts = 4096
)

// A publication keeps buffers of at most twice the bytes it uses from
// them, and maxSpareBytes more; past that the JSON it takes is copied
// together (compact). A tighter bound had every edit that inserts or
// deletes a line copy half the JSON, some 7 ms, for no lower peak RSS.
// A variable for the tests.
var maxSpareBytes = 4 << 20

var comma = []byte{','}

// partBuffers keeps the buffers of publications that are no longer used
// for the next: a large list is published again on every edit, and
// buffers of megabytes allocated afresh each time are garbage the
// collector must clear and the runtime must fault in again. Unlike a
// sync.Pool, which a collection empties (and an idle worker collects
// after each large edit), it keeps them across collections, up to
// maxPooledBytes.
var partBuffers struct {
	sync.Mutex
	free  [][]byte
	bytes int
}

// maxPooledBytes bounds the bytes of buffers kept for reuse: about the
// JSON of a list of 100,000 records with as many findings.
const maxPooledBytes = 32 << 20

// pooledBuffer is the size from which buffers are pooled; a smaller one
// is allocated to its size, so a publication that keeps it keeps no
// more than it uses.
const pooledBuffer = 256 << 10

// partBuffer returns an empty buffer for about size bytes, reused when
// one of a similar size is kept.
func partBuffer(size int) []byte {
	if size < pooledBuffer {
		return make([]byte, 0, size)
	}
	pb := &partBuffers
	pb.Lock()
	defer pb.Unlock()
	// the smallest that holds size, else the largest that is close
	best := -1
	for i, b := range pb.free {
		if c := cap(b); c >= size/2 && c <= 2*size {
			switch {
			case best < 0:
				best = i
			case cap(pb.free[best]) < size:
				if c > cap(pb.free[best]) {
					best = i
				}
			case c >= size && c < cap(pb.free[best]):
				best = i
			}
		}
	}
	if best < 0 {
		return make([]byte, 0, size)
	}
	b := pb.free[best]
	pb.free[best] = pb.free[len(pb.free)-1]
	pb.free = pb.free[:len(pb.free)-1]
	pb.bytes -= cap(b)
	return b[:0]
}

// putPartBuffer keeps b for reuse, unless the pool is full.
func putPartBuffer(b []byte) {
	pb := &partBuffers
	pb.Lock()
	defer pb.Unlock()
	if pb.bytes+cap(b) > maxPooledBytes {
		return
	}
	pb.free = append(pb.free, b[:0])
	pb.bytes += cap(b)
}

// release gives the buffers of p back for reuse, except those next (which
// may be nil) still uses; neither p's parts nor p may be used after.
func (p *publication) release(next *publication) {
	if p == nil {
		return
	}
	for _, b := range p.bufs {
		if cap(b) < pooledBuffer || next != nil && next.uses(b) {
			continue
		}
		putPartBuffer(b)
	}
}

// uses reports whether b is one of p's buffers.
func (p *publication) uses(b []byte) bool {
	for _, o := range p.bufs {
		if cap(o) > 0 && cap(b) > 0 && &o[:1][0] == &b[:1][0] {
			return true
		}
	}
	return false
}

// publishChunk is how many findings one part of the JSON holds; the parts
// of a large document are written on all cores.
const publishChunk = 4096

// publish makes the publication of res for document version f: the JSON
// of each finding that prev (the document's last publication, or nil)
// wrote with the same bytes is taken from prev, the others are written,
// on all cores when they are many. The caller gives prev's unused buffers
// back with prev.release once the result replaces it.
func publish(prev *publication, f *fileVersion, res *document.Result, version *int32) (*publication, error) {
	n := res.DiagnosticCount()
	var ds []*document.Diagnostic
	if prev != nil && cap(prev.spareDiags) >= n {
		ds = prev.spareDiags[:0]
	} else {
		ds = make([]*document.Diagnostic, 0, n+n/32+64)
	}
	for _, part := range res.DiagnosticParts() {
		for k := range part {
			ds = append(ds, &part[k])
		}
	}
	var at []jsonAt
	if prev != nil && cap(prev.spare) >= len(ds) {
		at = prev.spare[:len(ds)]
	} else {
		// room for the findings a few inserted lines add
		at = make([]jsonAt, len(ds), len(ds)+len(ds)/32+64)
	}
	p := &publication{uri: f.URI, version: f.Version, encoding: f.mapper.Encoding(), content: f.content(), lines: f.mapper.LineCount(),
		diags: ds, at: at}
	if prev != nil {
		p.spare, p.spareDiags = prev.at, prev.diags
	}
	p.reuse(prev)
	reused := func(i int) bool { return p.at[i].buf >= 0 }
	// the findings written afresh, in chunks written on all cores
	type chunk struct{ from, to int }
	var chunks []chunk
	for i := 0; i < len(ds); {
		if reused(i) {
			i++
			continue
		}
		j := i
		for j < len(ds) && !reused(j) && j-i < publishChunk {
			j++
		}
		chunks = append(chunks, chunk{i, j})
		i = j
	}
	first := len(p.bufs)
	p.bufs = append(p.bufs, make([][]byte, len(chunks))...)
	uri := appendString(nil, f.URI)
	errs := make([]error, len(chunks))
	write := func(k int) {
		from, to := chunks[k].from, chunks[k].to
		b := partBuffer((to - from) * 400)
		var err error
		c := cursor{m: f.mapper}
		for i := from; i < to && err == nil; i++ {
			if i > from {
				b = append(b, ',')
			}
			start := len(b)
			b, err = appendDiagnostic(b, &c, uri, ds[i])
			if len(b)-start > math.MaxUint32 {
				err = fmt.Errorf("%s: a finding of %d bytes of JSON", ds[i].Code, len(b)-start)
			}
			p.at[i] = jsonAt{buf: int32(first + k), from: start, n: uint32(len(b) - start)}
		}
		errs[k] = err
		p.bufs[first+k] = b
	}
	document.Spread(len(chunks), write)
	for _, err := range errs {
		if err != nil {
			return nil, err
		}
	}

	head := make([]byte, 0, 64+len(f.URI))
	head = append(head, `{"uri":`...)
	head = appendString(head, f.URI)
	if version != nil {
		head = append(head, `,"version":`...)
		head = strconv.AppendInt(head, int64(*version), 10)
	}
	head = append(head, `,"diagnostics":[`...)
	p.parts = append(p.parts, head)
	// runs of findings whose JSON lies side by side in one buffer are one
	// part
	for i := 0; i < len(ds); {
		run := p.at[i]
		end := run.to()
		j := i + 1
		for ; j < len(ds); j++ {
			if a := p.at[j]; a.buf != run.buf || a.from != end+1 {
				break
			}
			end = p.at[j].to()
		}
		if i > 0 {
			p.parts = append(p.parts, comma)
		}
		p.parts = append(p.parts, p.bufs[run.buf][run.from:end])
		i = j
	}
	p.parts = append(p.parts, []byte("]}"))
	return p, nil
}

// reuse sets p.bufs and p.at for the findings of p whose JSON prev holds
// as it is to be written; the others' at is given buffer -1. It takes
// none when taking them would keep too many parts or too much of prev's
// buffers unused.
func (p *publication) reuse(prev *publication) {
	for i := range p.at {
		p.at[i].buf = -1
	}
	if prev == nil || prev.uri != p.uri || prev.encoding != p.encoding {
		return
	}
	m := newOffsetMap(prev, p)
	ds, old := p.diags, prev.diags
	bufs := make([]int32, len(prev.bufs)) // prev's buffer k is p's bufs[bufs[k]-1]; 0: unused
	used, runs := 0, 0
	k := 0
	for i := range ds {
		start, ok := m.old(ds[i].Span.Start)
		if !ok {
			continue
		}
		for k < len(old) && old[k].Span.Start < start {
			k++
		}
		if k == len(old) {
			break
		}
		if !m.same(ds[i], old[k]) {
			continue
		}
		a := prev.at[k]
		if bufs[a.buf] == 0 {
			p.bufs = append(p.bufs, prev.bufs[a.buf])
			bufs[a.buf] = int32(len(p.bufs))
		}
		a.buf = bufs[a.buf] - 1
		if i == 0 || p.at[i-1].buf != a.buf || p.at[i-1].to()+1 != a.from {
			runs++
		}
		p.at[i] = a
		used += int(a.n)
		k++
	}
	kept := 0
	for _, b := range p.bufs {
		kept += cap(b)
	}
	switch {
	case 4*runs > maxPublicationParts:
		p.bufs = p.bufs[:0]
		for i := range p.at {
			p.at[i].buf = -1
		}
	case kept > 2*used+maxSpareBytes:
		p.compact(used)
	}
}

// compact copies the JSON p takes from the last publication into one
// buffer of its own, in order, so that p does not keep the last one's
// buffers for the part of them it uses: edits that move lines have the
// findings after them written afresh, and without this the buffers kept
// would grow without bound.
func (p *publication) compact(used int) {
	need := used + len(p.at) // and a comma before each
	b := partBuffer(need)
	if cap(b) < need {
		b = make([]byte, 0, need)
	}
	for i, a := range p.at {
		if a.buf < 0 {
			continue
		}
		if len(b) > 0 {
			b = append(b, ',')
		}
		from := len(b)
		b = append(b, p.bufs[a.buf][a.from:a.to()]...)
		p.at[i] = jsonAt{buf: 0, from: from, n: a.n}
	}
	p.bufs = append(p.bufs[:0], b)
}

// offsetMap maps offsets into the text of a new publication to offsets
// into the text of the last one where both give the same LSP position:
// before the first byte that differs, or, when the two have as many
// lines, on the lines that begin after the last byte that differs.
type offsetMap struct {
	prefix int // offsets below it are the same in both texts
	after  int // offsets from it map to offset-delta, when moved
	delta  int
	moved  bool // the lines after the edit kept their numbers
}

func newOffsetMap(prev, p *publication) offsetMap {
	a, b := prev.content, p.content
	n := min(len(a), len(b))
	prefix := commonPrefix(a[:n], b[:n])
	suffix := commonSuffix(a[prefix:], b[prefix:])
	m := offsetMap{prefix: prefix, delta: len(b) - len(a), after: len(b) + 1, moved: prev.lines == p.lines}
	// The position of an offset depends on the text before it and the
	// byte at it (a "\r" before it may pair with a "\n" there): so the
	// prefix maps offsets below its end, and the suffix maps offsets on
	// lines that start after a line break inside it.
	for i := len(b) - suffix; i < len(b); i++ {
		if c := b[i]; c == '\n' || c == '\r' {
			m.after = i + 1
			if c == '\r' && i+1 < len(b) && b[i+1] == '\n' {
				m.after = i + 2
			}
			break
		}
	}
	return m
}

// old returns the offset in the last text with the same position as off
// in the new one, or false.
func (m *offsetMap) old(off int) (int, bool) {
	switch {
	case off < m.prefix:
		return off, true
	case off >= m.after && m.moved:
		return off - m.delta, true
	}
	return 0, false
}

// span reports whether s in the new text has the same range as o in the
// last one.
func (m *offsetMap) span(s, o notation.Span) bool {
	start, ok := m.old(s.Start)
	if !ok || start != o.Start {
		return false
	}
	end, ok := m.old(s.End)
	return ok && end == o.End
}

// same reports whether d in the new text is written as the JSON o was
// in the last: every field the JSON holds is equal, every range the
// same.
func (m *offsetMap) same(d, o *document.Diagnostic) bool {
	if d.Code != o.Code || d.Severity != o.Severity || d.Unnecessary != o.Unnecessary ||
		len(d.Related) != len(o.Related) || d.Message != o.Message || !m.span(d.Span, o.Span) {
		return false
	}
	for k := range d.Related {
		if d.Related[k].Message != o.Related[k].Message || !m.span(d.Related[k].Span, o.Related[k].Span) {
			return false
		}
	}
	return true
}

// commonPrefix returns the length of the common prefix of a and b, which
// are as long; a block at a time while the blocks are equal.
func commonPrefix(a, b []byte) int {
	const block = 4096
	i := 0
	for i+block <= len(a) && bytes.Equal(a[i:i+block], b[i:i+block]) {
		i += block
	}
	for i < len(a) && a[i] == b[i] {
		i++
	}
	return i
}

// commonSuffix returns the length of the common suffix of a and b.
func commonSuffix(a, b []byte) int {
	const block = 4096
	n := 0
	for n+block <= min(len(a), len(b)) && bytes.Equal(a[len(a)-n-block:len(a)-n], b[len(b)-n-block:len(b)-n]) {
		n += block
	}
	for n < min(len(a), len(b)) && a[len(a)-n-1] == b[len(b)-n-1] {
		n++
	}
	return n
}

// appendDiagnostic writes one finding as a protocol Diagnostic; uri is
// the document's URI written as a JSON string.
func appendDiagnostic(b []byte, m *cursor, uri []byte, d *document.Diagnostic) ([]byte, error) {
	rng, err := m.spanToRange(d.Span)
	if err != nil {
		return b, fmt.Errorf("%s: %w", d.Code, err)
	}
	b = append(b, `{"range":`...)
	b = appendRange(b, rng)
	b = append(b, `,"severity":`...)
	b = strconv.AppendInt(b, int64(toSeverity(d.Severity)), 10)
	b = append(b, `,"code":`...)
	b = appendString(b, string(d.Code))
	b = append(b, `,"source":`...)
	b = appendString(b, document.Source)
	b = append(b, `,"message":`...)
	b = appendString(b, d.Message)
	if d.Unnecessary {
		b = append(b, `,"tags":[`...)
		b = strconv.AppendInt(b, int64(protocol.DiagnosticTagUnnecessary), 10)
		b = append(b, ']')
	}
	if len(d.Related) > 0 {
		b = append(b, `,"relatedInformation":[`...)
		for k, rel := range d.Related {
			if k > 0 {
				b = append(b, ',')
			}
			b = append(b, `{"location":{"uri":`...)
			b = append(b, uri...)
			b = append(b, `,"range":`...)
			r, err := m.spanToRange(rel.Span)
			if err != nil {
				return b, fmt.Errorf("%s related: %w", d.Code, err)
			}
			b = appendRange(b, r)
			b = append(b, `},"message":`...)
			b = appendString(b, rel.Message)
			b = append(b, '}')
		}
		b = append(b, ']')
	}
	return append(b, '}'), nil
}

func appendRange(b []byte, r protocol.Range) []byte {
	b = append(b, `{"start":`...)
	b = appendPosition(b, r.Start)
	b = append(b, `,"end":`...)
	b = appendPosition(b, r.End)
	return append(b, '}')
}

func appendPosition(b []byte, p protocol.Position) []byte {
	b = append(b, `{"line":`...)
	b = strconv.AppendUint(b, uint64(p.Line), 10)
	b = append(b, `,"character":`...)
	b = strconv.AppendUint(b, uint64(p.Character), 10)
	return append(b, '}')
}

// appendString writes s as a JSON string. Control characters, quotes
// and backslashes are escaped; text that is not valid UTF-8 goes
// through encoding/json, which replaces what does not decode.
func appendString(b []byte, s string) []byte {
	const hex = "0123456789abcdef"
	n := len(b)
	b = append(b, '"')
	start, checked := 0, false
	for i := 0; i < len(s); i++ {
		// Eight bytes at a time while none needs a look: most messages
		// are plain ASCII from end to end.
		for i+8 <= len(s) && plain8(s[i:i+8]) {
			i += 8
		}
		if i == len(s) {
			break
		}
		c := s[i]
		if c >= utf8.RuneSelf {
			// the rest is checked once, at its first byte outside ASCII
			if !checked && !utf8.ValidString(s[i:]) {
				q, _ := json.Marshal(s)
				return append(b[:n], q...)
			}
			checked = true
			continue
		}
		if c >= 0x20 && c != '"' && c != '\\' {
			continue
		}
		b = append(b, s[start:i]...)
		switch c {
		case '"', '\\':
			b = append(b, '\\', c)
		case '\n':
			b = append(b, '\\', 'n')
		case '\r':
			b = append(b, '\\', 'r')
		case '\t':
			b = append(b, '\\', 't')
		default:
			b = append(b, '\\', 'u', '0', '0', hex[c>>4], hex[c&0xf])
		}
		start = i + 1
	}
	b = append(b, s[start:]...)
	return append(b, '"')
}

// plain8 reports whether the eight bytes of s are ASCII that a JSON
// string holds as it is: none is a control character, a quote, a
// backslash or a byte outside ASCII.
func plain8(s string) bool {
	const (
		ones  = 0x0101010101010101
		highs = 0x8080808080808080
	)
	_ = s[7] // one bounds check, and one load of the word
	x := uint64(s[0]) | uint64(s[1])<<8 | uint64(s[2])<<16 | uint64(s[3])<<24 |
		uint64(s[4])<<32 | uint64(s[5])<<40 | uint64(s[6])<<48 | uint64(s[7])<<56
	// A byte is flagged when its high bit is set, when it is below 0x20,
	// or when it equals '"' or '\\' (a zero byte after the xor); the
	// tests borrow only into bytes above a flagged one, so a word without
	// flags is exact.
	below := x - ones*0x20
	quote := x ^ (ones * '"')
	backslash := x ^ (ones * '\\')
	flags := (x | below | (quote-ones)&^quote | (backslash-ones)&^backslash) & highs
	return flags == 0
}

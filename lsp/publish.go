package lsp

// This file implements the writing of textDocument/publishDiagnostics
// for large documents: the JSON is written by hand in one buffer, so a
// list of 100,000 records with as many findings is not turned into
// protocol structures and marshalled by reflection on every edit.

import (
	"bytes"
	"encoding/json"
	"fmt"
	"runtime"
	"strconv"
	"sync"
	"sync/atomic"
	"unicode/utf8"

	"go.lsp.dev/protocol"

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
	defer releaseParts(parts)
	return bytes.Join(parts, nil), nil
}

// partBuffers keeps the buffers of the parts of publications for the
// next: a large list is published again on every edit, and buffers of
// megabytes allocated afresh each time are garbage the collector must
// clear and the runtime must fault in again.
var partBuffers sync.Pool

// partBuffer returns an empty buffer for a part, reused when one is kept.
func partBuffer(size int) []byte {
	if p, ok := partBuffers.Get().(*[]byte); ok && cap(*p) >= size/2 {
		return (*p)[:0]
	}
	return make([]byte, 0, size)
}

// releaseParts gives the buffers of written parts back for reuse; the
// parts must not be used after.
func releaseParts(parts [][]byte) {
	for _, p := range parts[1 : len(parts)-1] {
		if cap(p) >= 64<<10 {
			p := p[:0]
			partBuffers.Put(&p)
		}
	}
}

// publishChunk is how many findings one part of the JSON holds; the parts
// of a large document are written on all cores.
const publishChunk = 4096

// diagnosticsParts is diagnosticsJSON in parts that are to be written one
// after the other, so the megabytes of a large list are neither written
// on one core nor copied into one buffer.
func diagnosticsParts(f *fileVersion, res *document.Result, version *int32) ([][]byte, error) {
	head := make([]byte, 0, 64+len(f.URI))
	head = append(head, `{"uri":`...)
	head = appendString(head, f.URI)
	if version != nil {
		head = append(head, `,"version":`...)
		head = strconv.AppendInt(head, int64(*version), 10)
	}
	head = append(head, `,"diagnostics":[`...)
	uri := appendString(nil, f.URI)
	ds := res.Diagnostics
	chunks := (len(ds) + publishChunk - 1) / publishChunk
	parts := make([][]byte, chunks+2)
	parts[0] = head
	errs := make([]error, chunks)
	write := func(k int) {
		from, to := k*publishChunk, min((k+1)*publishChunk, len(ds))
		b := partBuffer((to - from) * 400)
		var err error
		c := cursor{m: f.mapper}
		for i := from; i < to && err == nil; i++ {
			if i > 0 {
				b = append(b, ',')
			}
			b, err = appendDiagnostic(b, &c, uri, &ds[i])
		}
		errs[k] = err
		parts[k+1] = b
	}
	if workers := min(runtime.GOMAXPROCS(0), chunks); workers < 2 {
		// a small document: written here, at once
		for k := range chunks {
			write(k)
		}
	} else {
		var next atomic.Int64
		var wg sync.WaitGroup
		for range workers {
			wg.Add(1)
			go func() {
				defer wg.Done()
				for k := int(next.Add(1)) - 1; k < chunks; k = int(next.Add(1)) - 1 {
					write(k)
				}
			}()
		}
		wg.Wait()
	}
	for _, err := range errs {
		if err != nil {
			return nil, err
		}
	}
	parts[chunks+1] = []byte("]}")
	return parts, nil
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

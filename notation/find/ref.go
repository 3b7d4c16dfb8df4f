package find

import (
	"bytes"
	"encoding/binary"
	"fmt"
	"reflect"

	"stereoline/notation"
)

// This file implements a compact stand-in for an occurrence whose text
// and title are host bytes as they stand (the records of a list, most
// cells), for a caller that must come back to many records of a long
// list after their chunk is gone (the relations of Stream).

// Ref is an occurrence reduced to the offsets of its text and title in
// the host content and its field, 24 bytes instead of the occurrence's
// 200 or so.
type Ref struct {
	start, end      uint32
	title, titleEnd uint32
	field           uint32
	kind            Kind
	construct       Construct
	reason          Reason
	dialect         Dialect
	// backslashes: the host doubles a backslash (a YAML double-quoted
	// scalar): the encoder is doubleBackslashes
	backslashes bool
}

// titleWindow is how far from its record a title is looked for in the
// content when it is not on the record's line: a name member of the
// same YAML mapping or JSON object, a few lines away. Records titled from
// far away are looked for this far on either side in vain, so it stays
// small.
const titleWindow = 1024

// RefOf returns the compact stand-in for o, found in content. ok is false
// when o cannot be rebuilt from content alone: its text is not its host
// bytes as they stand (escapes, pieces), it carries host findings, its
// title is not a piece of the content near it, or the content is too
// long for the offsets.
func RefOf(content []byte, o *Occurrence) (r Ref, ok bool) {
	s := o.Span
	backslashes := o.encode != nil && o.Kind == KindYAML && sameFunc(o.encode, doubleBackslashes)
	if len(content) >= 1<<32-1 || s.Start < 0 || s.End > len(content) || s.Start > s.End ||
		o.m.runs != nil || o.m.base != s.Start || o.m.size != len(o.Text) ||
		string(content[s.Start:s.End]) != o.Text || len(o.Diagnostics) > 0 || o.Cell != 0 ||
		o.group != (groupMark{}) || o.encode != nil && !isJSONValue(o) && !backslashes || o.Dialect > 0x7f {
		return Ref{}, false
	}
	r = Ref{start: uint32(s.Start), end: uint32(s.End), field: o.Field, kind: o.Kind, construct: o.Construct,
		reason: o.Reason, dialect: o.Dialect, backslashes: backslashes}
	if o.Title == "" {
		return r, true
	}
	// The title is on the record's line: after it (the usual place),
	// else before it; else (a name member of the same YAML mapping or
	// JSON object) on the lines around. Any piece of the content that
	// reads the same will do.
	lineStart, lineEnd := s.Start, s.End
	for lineStart > 0 && content[lineStart-1] != '\n' {
		lineStart--
	}
	for lineEnd < len(content) && content[lineEnd] != '\n' {
		lineEnd++
	}
	title := []byte(o.Title)
	if k := bytes.Index(content[s.End:lineEnd], title); k >= 0 {
		return r.titled(s.End+k, len(title)), true
	}
	if k := bytes.LastIndex(content[lineStart:s.Start], title); k >= 0 {
		return r.titled(lineStart+k, len(title)), true
	}
	if k := bytes.LastIndex(content[max(0, s.Start-titleWindow):s.Start], title); k >= 0 {
		return r.titled(max(0, s.Start-titleWindow)+k, len(title)), true
	}
	if k := bytes.Index(content[s.End:min(len(content), s.End+titleWindow)], title); k >= 0 {
		return r.titled(s.End+k, len(title)), true
	}
	return Ref{}, false
}

// titled is r with its title at content[at:at+n].
func (r Ref) titled(at, n int) Ref {
	r.title, r.titleEnd = uint32(at), uint32(at+n)
	return r
}

// sameFunc reports whether f and g are the same function (of no state).
func sameFunc(f, g func(string) string) bool {
	return reflect.ValueOf(f).Pointer() == reflect.ValueOf(g).Pointer()
}

// Occurrence rebuilds the occurrence from the content RefOf was given.
func (r Ref) Occurrence(content []byte) Occurrence {
	o := Occurrence{
		Text:      string(content[r.start:r.end]),
		Span:      notation.Span{Start: int(r.start), End: int(r.end)},
		Kind:      r.kind,
		Construct: r.construct,
		Reason:    r.reason,
		Dialect:   r.dialect,
		Field:     r.field,
		m:         identityMap(int(r.start), int(r.end-r.start)),
	}
	if r.titleEnd > r.title {
		o.Title = string(content[r.title:r.titleEnd])
	}
	if isJSONValue(&o) {
		o.encode = jsonEscape
	}
	if r.backslashes {
		o.encode = doubleBackslashes
	}
	return o
}

// isJSONValue reports whether o is a string value of a JSON document,
// whose encoder is always jsonEscape (json.go): a Ref of it rebuilds the
// encoder from its kind and construct.
func isJSONValue(o *Occurrence) bool {
	return o.Kind == KindJSON && o.Construct == ConstructJSONValue
}

// RefSize is the length of a Ref as AppendBinary writes it.
const RefSize = 24

// AppendBinary appends the Ref in RefSize bytes (encoding.BinaryAppender),
// for a caller that keeps the references of many records on disk.
func (r Ref) AppendBinary(b []byte) ([]byte, error) {
	for _, v := range [...]uint32{r.start, r.end, r.title, r.titleEnd, r.field} {
		b = binary.LittleEndian.AppendUint32(b, v)
	}
	last := byte(r.dialect)
	if r.backslashes {
		last |= 0x80
	}
	return append(b, byte(r.kind), byte(r.construct), byte(r.reason), last), nil
}

// UnmarshalBinary reads a Ref that AppendBinary wrote.
func (r *Ref) UnmarshalBinary(b []byte) error {
	if len(b) != RefSize {
		return fmt.Errorf("a reference is %d bytes, not %d", RefSize, len(b))
	}
	u := func(k int) uint32 { return binary.LittleEndian.Uint32(b[4*k:]) }
	*r = Ref{start: u(0), end: u(1), title: u(2), titleEnd: u(3), field: u(4),
		kind: Kind(b[20]), construct: Construct(b[21]), reason: Reason(b[22]), dialect: Dialect(b[23] & 0x7f),
		backslashes: b[23]&0x80 != 0}
	return nil
}

package find

import (
	"encoding/binary"
	"fmt"

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
}

// RefOf returns the compact stand-in for o, found in content. ok is false
// when o cannot be rebuilt from content alone: its text is not its host
// bytes as they stand (escapes, pieces), it carries host findings, its
// title is not a piece of its line, or the content is too long for the
// offsets.
func RefOf(content []byte, o *Occurrence) (r Ref, ok bool) {
	s := o.Span
	if len(content) >= 1<<32-1 || s.Start < 0 || s.End > len(content) || s.Start > s.End ||
		o.m.runs != nil || o.m.base != s.Start || o.m.size != len(o.Text) ||
		string(content[s.Start:s.End]) != o.Text ||
		len(o.Diagnostics) > 0 || o.Cell != 0 || o.group != (groupMark{}) || o.encode != nil && !isJSONValue(o) {
		return Ref{}, false
	}
	r = Ref{start: uint32(s.Start), end: uint32(s.End), field: o.Field, kind: o.Kind, construct: o.Construct, reason: o.Reason, dialect: o.Dialect}
	if o.Title == "" {
		return r, true
	}
	// The title is on the record's line: after it (the usual place),
	// else before it. Any piece of the line that reads the same will do.
	lineStart, lineEnd := s.Start, s.End
	for lineStart > 0 && content[lineStart-1] != '\n' {
		lineStart--
	}
	for lineEnd < len(content) && content[lineEnd] != '\n' {
		lineEnd++
	}
	n := len(o.Title)
	for _, span := range [2][2]int{{s.End, lineEnd}, {lineStart, s.Start}} {
		for p := span[0]; p+n <= span[1]; p++ {
			if string(content[p:p+n]) == o.Title {
				r.title, r.titleEnd = uint32(p), uint32(p+n)
				return r, true
			}
		}
	}
	return Ref{}, false
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
	return append(b, byte(r.kind), byte(r.construct), byte(r.reason), byte(r.dialect)), nil
}

// UnmarshalBinary reads a Ref that AppendBinary wrote.
func (r *Ref) UnmarshalBinary(b []byte) error {
	if len(b) != RefSize {
		return fmt.Errorf("a reference is %d bytes, not %d", RefSize, len(b))
	}
	u := func(k int) uint32 { return binary.LittleEndian.Uint32(b[4*k:]) }
	*r = Ref{start: u(0), end: u(1), title: u(2), titleEnd: u(3), field: u(4),
		kind: Kind(b[20]), construct: Construct(b[21]), reason: Reason(b[22]), dialect: Dialect(b[23])}
	return nil
}

package lsp

import (
	"bytes"
	"fmt"
	"slices"
	"sort"
	"unicode/utf8"

	"go.lsp.dev/protocol"

	"stereoline/notation"
)

// PositionEncoding is the unit an LSP position's character counts, as
// negotiated in initialize (LSP 3.17, "Position Encoding Kind").
type PositionEncoding string

// The encodings of LSP 3.17. UTF-16 is the default every client
// understands; UTF-8 makes characters equal to bytes.
const (
	EncodingUTF8  PositionEncoding = "utf-8"
	EncodingUTF16 PositionEncoding = "utf-16"
	EncodingUTF32 PositionEncoding = "utf-32"
)

// Mapper converts between byte offsets into one text and LSP positions.
// It is the only place in the server that does position arithmetic: the
// engine speaks byte offsets, the client speaks lines and characters.
//
// Lines end at "\n", "\r\n" or "\r" (LSP 3.17, "Text Documents"); a
// character counts UTF-16 code units, bytes or code points according to
// the encoding. A Mapper is immutable and safe for concurrent use.
type Mapper struct {
	content    []byte
	lineStarts []int // offset of the first byte of each line; lineStarts[0] == 0
	// wide lists, in order, the lines holding a byte outside ASCII: on
	// the other lines a character is a byte in every encoding, so a
	// position on a long line (a record of a million atoms, with
	// thousands of findings) costs no count from the line's start
	wide     []int
	encoding PositionEncoding
}

// NewMapper builds the line table of content for the given encoding. An
// unknown or empty encoding means UTF-16.
func NewMapper(content []byte, enc PositionEncoding) *Mapper {
	if enc != EncodingUTF8 && enc != EncodingUTF32 {
		enc = EncodingUTF16
	}
	// The exact number of line breaks (each \r\n counted twice): the
	// table of a long list is its largest part.
	starts, wide := scanLines(content, 0, len(content), make([]int, 1, 1+lineCount(content)), nil)
	return &Mapper{content: content, lineStarts: starts, wide: wide, encoding: enc}
}

// scanLines appends to starts the line starts after the line breaks in
// content[from:to], and to wide the lines holding a byte outside ASCII
// there; starts must end with the start of the line holding from, which
// must be a line start. A "\r" at to-1 looks at content[to] for its
// "\n".
func scanLines(content []byte, from, to int, starts, wide []int) ([]int, []int) {
	for i := from; i < to; i++ {
		switch c := content[i]; {
		case c == '\n':
			starts = append(starts, i+1)
		case c == '\r':
			if i+1 < len(content) && content[i+1] == '\n' {
				i++
			}
			starts = append(starts, i+1)
		case c >= utf8.RuneSelf:
			if line := len(starts) - 1; len(wide) == 0 || wide[len(wide)-1] != line {
				wide = append(wide, line)
			}
		}
	}
	return starts, wide
}

// WithEncoding returns a mapper of the same text that counts characters
// in enc (an unknown or empty one meaning UTF-16), sharing the line
// table: a caller that needs two encodings of a long text builds the
// table once.
func (m *Mapper) WithEncoding(enc PositionEncoding) *Mapper {
	if enc != EncodingUTF8 && enc != EncodingUTF32 {
		enc = EncodingUTF16
	}
	c := *m
	c.encoding = enc
	return &c
}

// Replace returns the mapper of content, the text of m with the bytes
// [start, end) replaced by n bytes. The line table is not built again:
// the lines before the edit are kept, the lines it touched are scanned
// and the lines after it are moved, so an edit of a large document
// costs a copy of the table rather than a scan of the text.
func (m *Mapper) Replace(start, end, n int, content []byte) *Mapper {
	delta := n - (end - start)
	if start < 0 || end < start || end > len(m.content) || len(content) != len(m.content)+delta {
		return NewMapper(content, m.encoding)
	}
	old := m.lineStarts
	// The first line scanned holds start-1: a "\r" there ends its line
	// according to the byte at start, which the edit may change.
	first := sort.Search(len(old), func(i int) bool { return old[i] > max(start-1, 0) }) - 1
	// The first line after the edit: its start follows a line break that
	// lies after the edit (or ends at its last byte, in which case the
	// same break ends the line in the new text too).
	after := sort.Search(len(old), func(i int) bool { return old[i] > end })
	scanTo := len(content)
	if after < len(old) {
		scanTo = old[after] + delta
	}
	starts := make([]int, first+1, len(old)+lineCount(content[start:start+n])+1)
	copy(starts, old[:first+1])
	w := sort.SearchInts(m.wide, first)
	wide := append(make([]int, 0, len(m.wide)+1), m.wide[:w]...)
	// The scan ends at the break before scanTo, which gives scanTo.
	starts, wide = scanLines(content, old[first], scanTo, starts, wide)
	if after < len(old) {
		lines := len(starts) - 1 - after // the lines the edit added
		for _, s := range old[after+1:] {
			starts = append(starts, s+delta)
		}
		for _, l := range m.wide[sort.SearchInts(m.wide, after):] {
			wide = append(wide, l+lines)
		}
	}
	if len(wide) == 0 {
		wide = nil
	}
	return &Mapper{content: content, lineStarts: starts, wide: wide, encoding: m.encoding}
}

// lineCount counts the line breaks of b, a "\r\n" as two (a bound).
func lineCount(b []byte) int { return bytes.Count(b, []byte{'\n'}) + bytes.Count(b, []byte{'\r'}) }

// Content returns the text the mapper was built for.
func (m *Mapper) Content() []byte { return m.content }

// Encoding returns the unit characters are counted in.
func (m *Mapper) Encoding() PositionEncoding { return m.encoding }

// LineCount returns the number of lines; a text ending in a line break
// has an empty last line.
func (m *Mapper) LineCount() int { return len(m.lineStarts) }

// lineEnd returns the offset of the line break that ends line i, or the
// end of the text for the last line.
func (m *Mapper) lineEnd(i int) int {
	if i+1 >= len(m.lineStarts) {
		return len(m.content)
	}
	end := m.lineStarts[i+1] - 1
	if end > m.lineStarts[i] && m.content[end] == '\n' && m.content[end-1] == '\r' {
		end--
	}
	return end
}

// OffsetToPosition converts a byte offset (0 <= off <= len(content)) to a
// position. An offset inside a multi-byte character or inside a "\r\n"
// pair maps to the start of that character or pair.
func (m *Mapper) OffsetToPosition(off int) (protocol.Position, error) {
	if off < 0 || off > len(m.content) {
		return protocol.Position{}, fmt.Errorf("offset %d outside the text (length %d)", off, len(m.content))
	}
	line := sort.Search(len(m.lineStarts), func(i int) bool { return m.lineStarts[i] > off }) - 1
	return m.position(line, off), nil
}

// position returns the position of offset off on line line.
func (m *Mapper) position(line, off int) protocol.Position {
	start := m.lineStarts[line]
	if end := m.lineEnd(line); off > end {
		off = end
	}
	if _, found := slices.BinarySearch(m.wide, line); !found {
		return protocol.Position{Line: uint32(line), Character: uint32(off - start)}
	}
	return protocol.Position{Line: uint32(line), Character: uint32(m.units(m.content[start:off]))}
}

// cursor converts offsets to positions as OffsetToPosition does, fast
// for offsets that come in order or near each other (the findings of a
// document, sorted by position): it starts from the line of the last
// offset and searches only when the offset lies beyond the next line.
type cursor struct {
	m    *Mapper
	line int
}

func (c *cursor) position(off int) (protocol.Position, error) {
	m := c.m
	if off < 0 || off > len(m.content) {
		return m.OffsetToPosition(off)
	}
	starts := m.lineStarts
	l := c.line
	switch {
	case starts[l] <= off && (l+1 == len(starts) || off < starts[l+1]):
	case l+1 < len(starts) && starts[l+1] <= off && (l+2 == len(starts) || off < starts[l+2]):
		l++
	default:
		l = sort.Search(len(starts), func(i int) bool { return starts[i] > off }) - 1
	}
	c.line = l
	return m.position(l, off), nil
}

// spanToRange is SpanToRange through the cursor.
func (c *cursor) spanToRange(s notation.Span) (protocol.Range, error) {
	if s.End < s.Start {
		return c.m.SpanToRange(s)
	}
	start, err := c.position(s.Start)
	if err != nil {
		return protocol.Range{}, err
	}
	end, err := c.position(s.End)
	if err != nil {
		return protocol.Range{}, err
	}
	return protocol.Range{Start: start, End: end}, nil
}

// units counts the characters of b in the mapper's encoding. A trailing
// partial character is not counted; invalid bytes count one each, as the
// replacement character a client shows for them does.
func (m *Mapper) units(b []byte) int {
	if m.encoding == EncodingUTF8 {
		return len(b)
	}
	ascii := true
	for _, c := range b {
		if c >= utf8.RuneSelf {
			ascii = false
			break
		}
	}
	if ascii {
		return len(b) // one unit a byte in every encoding
	}
	n := 0
	for len(b) > 0 {
		r, size := utf8.DecodeRune(b)
		if r == utf8.RuneError && size == 1 && !utf8.FullRune(b) {
			break // a character cut by the offset
		}
		n++
		if m.encoding == EncodingUTF16 && r >= 0x10000 {
			n++ // a surrogate pair
		}
		b = b[size:]
	}
	return n
}

// PositionToOffset converts a position to a byte offset. A character past
// the end of its line means the end of the line (LSP 3.17); a character
// inside a surrogate pair or inside a multi-byte character maps to the
// start of that character. A line past the last line is an error, except
// that the line just after the last, character 0, is the end of the text,
// which some clients send for an edit appended at the end.
func (m *Mapper) PositionToOffset(p protocol.Position) (int, error) {
	line := int(p.Line)
	if line >= len(m.lineStarts) {
		if line == len(m.lineStarts) && p.Character == 0 {
			return len(m.content), nil
		}
		return 0, fmt.Errorf("line %d outside the text (%d lines)", line, len(m.lineStarts))
	}
	start, end := m.lineStarts[line], m.lineEnd(line)
	want := int(p.Character)
	if m.encoding == EncodingUTF8 {
		off := start + want
		if off > end {
			off = end
		}
		for off > start && !utf8.RuneStart(m.content[off]) {
			off--
		}
		return off, nil
	}
	off, n := start, 0
	for off < end {
		r, size := utf8.DecodeRune(m.content[off:end])
		w := 1
		if m.encoding == EncodingUTF16 && r >= 0x10000 {
			w = 2
		}
		if n+w > want {
			break
		}
		n += w
		off += size
	}
	return off, nil
}

// SpanToRange converts a half-open byte span to a range.
func (m *Mapper) SpanToRange(s notation.Span) (protocol.Range, error) {
	if s.End < s.Start {
		return protocol.Range{}, fmt.Errorf("span %d-%d ends before it starts", s.Start, s.End)
	}
	start, err := m.OffsetToPosition(s.Start)
	if err != nil {
		return protocol.Range{}, err
	}
	end, err := m.OffsetToPosition(s.End)
	if err != nil {
		return protocol.Range{}, err
	}
	return protocol.Range{Start: start, End: end}, nil
}

// RangeToSpan converts a range to a half-open byte span. A range whose end
// comes before its start is an error.
func (m *Mapper) RangeToSpan(r protocol.Range) (notation.Span, error) {
	start, err := m.PositionToOffset(r.Start)
	if err != nil {
		return notation.Span{}, err
	}
	end, err := m.PositionToOffset(r.End)
	if err != nil {
		return notation.Span{}, err
	}
	if end < start {
		return notation.Span{}, fmt.Errorf("range ends before it starts")
	}
	return notation.Span{Start: start, End: end}, nil
}

package find

import (
	"bytes"

	"stereoline/notation"
)

// Java text blocks (The Java Language Specification, 3.10.6 "Text
// Blocks"): """, optional blanks and a line terminator open the block;
// its value is the lines up to the closing """, after
//  1. line terminators are normalised to LF;
//  2. incidental white space is removed: the smallest indentation over
//     the non-blank lines and the line of the closing delimiter (even when
//     blank) is cut from every line, blank lines become empty, and white
//     space ending a line is dropped;
//  3. escape sequences are interpreted, \<line terminator> joining two
//     lines and \s standing for a space.
//
// Steps 1 and 2 are done here into an intermediate text with its own map
// to the host; step 3 is the ordinary escape decoder run over that text
// with line joining on. The two maps are then composed, so that every
// notation byte of a record still maps to the host byte it was written
// as, and a record split by \<newline> maps piece by piece.

// textBlockOpen returns the offset after the line terminator that must
// follow an opening """ whose quotes end at from, or -1 when the line
// goes on with other text (a compile-time error).
func textBlockOpen(src []byte, from int) int {
	j := from
	for j < len(src) && (src[j] == ' ' || src[j] == '\t' || src[j] == '\f') {
		j++
	}
	switch {
	case j < len(src) && src[j] == '\n':
		return j + 1
	case j+1 < len(src) && src[j] == '\r' && src[j+1] == '\n':
		return j + 2
	case j < len(src) && src[j] == '\r':
		return j + 1
	}
	return -1
}

// javaBlank is Java's white space for stripping (Character.isWhitespace,
// ASCII part): space, tab, form feed, vertical tab and the separators
// U+001C to U+001F.
func javaBlank(c byte) bool {
	return c == ' ' || c == '\t' || c == '\f' || c == '\v' || c >= 0x1c && c <= 0x1f
}

// textBlock decodes a text block piece whose content starts at the line
// after the opening delimiter.
func (d *decoded) textBlock(src []byte, pc *piece, r *escapeRules) {
	st, stm := stripIndent(src, pc.content)
	rules := *r
	rules.joinLines = true
	var inner decoded
	inner.fixed(st, &piece{}, 0, len(st), &rules)
	im := inner.b.done(0)
	for i := range inner.text {
		s, e := im.byteRange(i)
		hs, _ := stm.byteRange(s)
		_, he := stm.byteRange(e - 1)
		d.text = append(d.text, inner.text[i])
		d.b.addByte(hs, he)
	}
	for _, is := range inner.issues {
		is.span = stm.span(is.span)
		d.issues = append(d.issues, is)
	}
}

// stripIndent does steps 1 and 2 over the host bytes content and returns
// the text with its map to the host.
func stripIndent(src []byte, content notation.Span) ([]byte, offsetMap) {
	body := src[content.Start:content.End]
	type line struct{ start, end, term int } // offsets into body; term: terminator length
	var lines []line
	for i := 0; ; {
		k := bytes.IndexAny(body[i:], "\r\n")
		if k < 0 {
			lines = append(lines, line{i, len(body), 0})
			break
		}
		t := 1
		if body[i+k] == '\r' && i+k+1 < len(body) && body[i+k+1] == '\n' {
			t = 2
		}
		lines = append(lines, line{i, i + k, t})
		i += k + t
	}
	indent := func(l line) (lead int, blank bool) {
		for lead < l.end-l.start && javaBlank(body[l.start+lead]) {
			lead++
		}
		return lead, lead == l.end-l.start
	}
	least := -1
	for k, l := range lines {
		lead, blank := indent(l)
		if (!blank || k == len(lines)-1) && (least < 0 || lead < least) {
			least = lead
		}
	}
	var st []byte
	var b mapBuilder
	for _, l := range lines {
		if _, blank := indent(l); !blank {
			end := l.end
			for end > l.start && javaBlank(body[end-1]) {
				end--
			}
			st = append(st, body[l.start+least:end]...)
			b.copy(content.Start+l.start+least, end-l.start-least)
		}
		if l.term > 0 {
			// The LF of the value stands at the LF of the host, or at
			// a lone CR.
			st = append(st, '\n')
			b.copy(content.Start+l.end+l.term-1, 1)
		}
	}
	return st, b.done(content.Start)
}

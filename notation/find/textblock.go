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
	if bytes.IndexByte(src[pc.content.Start:pc.content.End], '\\') < 0 {
		// No escapes: the stripped text is the value.
		stripIndent(src, pc.content, &d.text, &d.b)
		return
	}
	var st []byte
	var sb mapBuilder
	stripIndent(src, pc.content, &st, &sb)
	stm := sb.done(pc.content.Start)
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

// stripIndent does steps 1 and 2 over the host bytes content, appending
// the text to st and its map to the host to b.
func stripIndent(src []byte, content notation.Span, st *[]byte, b *mapBuilder) {
	body := src[content.Start:content.End]
	// nextLine returns the line at i: its end, the start of the next
	// line, and the blanks starting it; next is -1 after the last line.
	nextLine := func(i int) (end, next, lead int) {
		k := bytes.IndexAny(body[i:], "\r\n")
		end, next = len(body), -1
		if k >= 0 {
			end, next = i+k, i+k+1
			if body[end] == '\r' && next < len(body) && body[next] == '\n' {
				next++
			}
		}
		for i+lead < end && javaBlank(body[i+lead]) {
			lead++
		}
		return end, next, lead
	}
	least := -1
	for i := 0; i >= 0; {
		end, next, lead := nextLine(i)
		if (i+lead < end || next < 0) && (least < 0 || lead < least) {
			least = lead
		}
		i = next
	}
	for i := 0; i >= 0; {
		end, next, lead := nextLine(i)
		if i+lead < end {
			e := end
			for javaBlank(body[e-1]) {
				e--
			}
			*st = append(*st, body[i+least:e]...)
			b.copy(content.Start+i+least, e-i-least)
		}
		if next >= 0 {
			// The LF of the value stands at the LF of the host, or at
			// a lone CR.
			*st = append(*st, '\n')
			b.copy(content.Start+next-1, 1)
		}
		i = next
	}
}

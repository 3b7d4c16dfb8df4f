package find

import (
	"bytes"

	"stereoline/notation"
)

// Python f-strings and t-strings (Python language reference, "f-strings"
// and "t-strings"; PEP 701 for the grammar since 3.12): the literal parts
// are fixed text, where {{ and }} are single braces; a single '{' opens a
// replacement field: an expression, an optional !conversion and an
// optional :format spec, which may hold nested fields, up to the
// matching '}'. Fields become holes, so the fixed text is searched as a
// template (template.go). Since 3.12 a field may hold strings with the
// same quote as the literal (f"{row["smiles"]}"), and that is how fields
// are read here; code written for older versions never has them.

// fString scans an f- or t-string at lx.i with a prefix of n bytes and
// the given quote, and emits it.
func fString(lx *lexer, n int, quote string, raw bool) {
	src := lx.src
	start := lx.i
	from := start + n + len(quote)
	var holes []notation.Span
	cend, end, ok := len(src), len(src), false
scan:
	for j := from; j < len(src); {
		c := src[j]
		switch {
		case c == '\\':
			j = fStringBackslash(src, j, raw)
			continue
		case c == quote[0] && bytes.HasPrefix(src[j:], []byte(quote)):
			cend, end, ok = j, j+len(quote), true
			break scan
		case c == '\n' && len(quote) == 1:
			cend, end = j, j
			break scan
		case c == '{' || c == '}':
			if j+1 < len(src) && src[j+1] == c {
				j += 2
				continue
			}
			if c == '}' {
				// A single '}' does not compile; it is kept as text.
				j++
				continue
			}
			e, stop := fieldEnd(src, j, quote)
			if e < 0 {
				// A field that does not close: the literal ends
				// where the field reading stopped, and is not taken.
				cend, end = stop, stop
				if bytes.HasPrefix(src[stop:], []byte(quote)) {
					end = stop + len(quote)
				}
				break scan
			}
			holes = append(holes, notation.Span{Start: j, End: e})
			j = e
			continue
		}
		j++
	}
	lx.str(piece{
		tok:      notation.Span{Start: start, End: end},
		content:  notation.Span{Start: from, End: cend},
		prefix:   string(src[start : start+n]),
		quote:    quote,
		raw:      raw,
		holes:    holes,
		template: true,
		braces:   true,
	}, !ok)
}

// fStringBackslash returns the offset after a backslash at j in the fixed
// text. A backslash keeps a quote or another backslash from being read,
// also in a raw literal; \N{name} is one escape outside raw ones; a brace
// after a backslash still opens a field or is doubled.
func fStringBackslash(src []byte, j int, raw bool) int {
	if j+1 >= len(src) {
		return j + 1
	}
	switch c := src[j+1]; {
	case c == '{' || c == '}':
		return j + 1
	case c == 'N' && !raw && j+2 < len(src) && src[j+2] == '{':
		if k := bytes.IndexByte(src[j+3:min(len(src), j+3+100)], '}'); k >= 0 {
			return j + 3 + k + 1
		}
	}
	return j + 2
}

// fieldEnd returns the offset after the '}' closing the replacement
// field opened at i, or -1 and the offset where reading stopped: a line
// end of a one-line literal, the closing quote of a triple-quoted one
// found in a field, or the end of the file. Nested fields of format specs
// are kept on a stack, so that no input makes the reading recurse.
func fieldEnd(src []byte, i int, quote string) (int, int) {
	type level struct {
		depth int  // open brackets of the expression
		spec  bool // in the format spec
	}
	stack := []level{{}}
	for j := i + 1; j < len(src); j++ {
		top := &stack[len(stack)-1]
		c := src[j]
		if c == '\n' && len(quote) == 1 && top.spec {
			return -1, j
		}
		if len(quote) == 3 && bytes.HasPrefix(src[j:], []byte(quote)) {
			return -1, j
		}
		if top.spec {
			switch c {
			case '{':
				stack = append(stack, level{})
			case '}':
				stack = stack[:len(stack)-1]
				if len(stack) == 0 {
					return j + 1, 0
				}
			default:
				if len(quote) == 1 && c == quote[0] {
					return -1, j
				}
			}
			continue
		}
		switch c {
		case '(', '[', '{':
			top.depth++
		case ')', ']':
			if top.depth > 0 {
				top.depth--
			}
		case '}':
			if top.depth > 0 {
				top.depth--
				continue
			}
			stack = stack[:len(stack)-1]
			if len(stack) == 0 {
				return j + 1, 0
			}
		case ':':
			if top.depth == 0 {
				top.spec = true
			}
		case '#':
			if len(quote) == 1 {
				continue
			}
			// A comment, in a field over several lines (3.12).
			k := bytes.IndexByte(src[j:], '\n')
			if k < 0 {
				return -1, len(src)
			}
			j += k - 1
		case '"', '\'':
			q := string(c)
			if j+2 < len(src) && src[j+1] == c && src[j+2] == c {
				q = string([]byte{c, c, c})
			}
			_, e, ok := quoted(src, j+len(q), q, true, len(q) == 3)
			if !ok {
				return -1, e
			}
			j = e - 1
		case '\n':
			if len(quote) == 1 && top.depth == 0 {
				// A one-line literal's field goes on over lines only
				// inside brackets.
				return -1, j
			}
		}
	}
	return -1, len(src)
}

package find

import (
	"strings"

	"stereoline/notation"
)

// R string literals (R Language Definition, "Literal constants", and
// ?Quotes): '...' and "..." over lines, where an unrecognised escape is
// an error; raw strings r"(...)" with ( [ { and optional dashes (R 4.0);
// backticks quote names, not strings. Assignment is <- as well as =.
var rlang = &codeLang{
	kind: KindR,
	lex:  func(src []byte, prag *pragmas) []token { return lex(src, prag, rHook) },
	rules: &escapeRules{
		lang: "r", harmless: "'\"` ", simple: "abfnrtv", octal: 3, hex: true, unicode: "uU",
		unknown: unknownReject,
	},
	rawForm: func(pc *piece, text string) (string, bool) {
		if strings.Contains(text, `)"`) {
			return "", false
		}
		return `r"(` + text + `)"`, true
	},
	braceBlocks: true,
}

func rHook(lx *lexer) bool {
	src := lx.src
	c := src[lx.i]
	switch {
	case c == '#':
		return lx.lineComment("#")
	case c == '"' || c == '\'':
		lx.simpleString(0, string(c), false, true, true, false)
		return true
	case c == '`':
		start := lx.i
		_, end, _ := quoted(src, lx.i+1, "`", true, false)
		lx.i = max(end, lx.i+1)
		lx.emit(tIdent, start)
		return true
	case (c == 'r' || c == 'R') && lx.i+2 < len(src) && (src[lx.i+1] == '"' || src[lx.i+1] == '\''):
		if lx.i > 0 && identByte(src[lx.i-1]) {
			return false
		}
		return rRaw(lx)
	}
	return false
}

// rRaw consumes r"(...)", r"[...]", r"{...}" with optional dashes.
func rRaw(lx *lexer) bool {
	src := lx.src
	q := src[lx.i+1]
	j := lx.i + 2
	for j < len(src) && src[j] == '-' {
		j++
	}
	if j >= len(src) {
		return false
	}
	closer := map[byte]byte{'(': ')', '[': ']', '{': '}'}[src[j]]
	if closer == 0 {
		return false
	}
	dashes := string(src[lx.i+2 : j])
	close := string(closer) + dashes + string(q)
	from := j + 1
	cend, end, ok := quoted(src, from, close, false, true)
	lx.str(piece{
		tok:     notation.Span{Start: lx.i, End: end},
		content: notation.Span{Start: from, End: cend},
		prefix:  string(src[lx.i : j+1]),
		quote:   string(q),
		raw:     true,
	}, !ok)
	return true
}

package find

import "strings"

// Julia string literals (Julia manual, "Strings"): "..." and """..."""
// with escapes (an invalid one is a parse error) and $name and $(...)
// interpolation, whose fixed text is searched as a template
// (template.go); raw"..." is raw; other string macros
// (r"..." regexes, b"...", custom ones) are skipped. #= =# comments nest.
// A quote after a value is the transpose operator, not a character.
var julia = &codeLang{
	kind: KindJulia,
	lex:  func(src []byte, prag *pragmas) []token { return lex(src, prag, juliaHook) },
	rules: &escapeRules{
		lang: "julia", harmless: `"'$`, simple: "abefnrtv", octal: 3, hex: true, unicode: "uU",
		joinLines: true, skipIndent: true, unknown: unknownReject,
	},
	rawForm: func(pc *piece, text string) (string, bool) {
		if strings.ContainsAny(text, `"`) || strings.HasSuffix(text, `\`) {
			return "", false
		}
		return `raw"` + text + `"`, true
	},
	// raw"..." does not interpolate.
	dollar: func(pc *piece) string {
		if pc.raw {
			return ""
		}
		return `\$`
	},
	braceBlocks: true,
}

func juliaHook(lx *lexer) bool {
	src := lx.src
	c := src[lx.i]
	switch {
	case c == '#':
		return lx.blockComment("#=", "=#", true) || lx.lineComment("#")
	case c == '"':
		juliaString(lx, 0, false, false)
		return true
	case c == '\'':
		if n := len(lx.toks); n > 0 && lx.toks[n-1].span.End == lx.i {
			t := lx.toks[n-1]
			if t.kind == tIdent || t.kind == tNumber || t.op == ')' || t.op == ']' || t.op == '\'' {
				lx.i++
				lx.emit(tPunct, lx.i-1)
				return true
			}
		}
		charLiteral(lx)
		return true
	case identByte(c) && !(c >= '0' && c <= '9'):
		if lx.i > 0 && identByte(src[lx.i-1]) {
			return false
		}
		j := lx.i
		for j < len(src) && identByte(src[j]) {
			j++
		}
		if j < len(src) && src[j] == '"' {
			macro := string(src[lx.i:j])
			juliaString(lx, j-lx.i, macro == "raw", macro != "raw")
			return true
		}
	}
	return false
}

func juliaString(lx *lexer, prefixLen int, raw, skip bool) {
	q := `"`
	if lx.i+prefixLen+2 < len(lx.src) && string(lx.src[lx.i+prefixLen:lx.i+prefixLen+3]) == `"""` {
		q = `"""`
	}
	if raw || skip {
		lx.simpleString(prefixLen, q, raw, true, true, skip)
		return
	}
	dollarString(lx, prefixLen, dollarForm{quote: q, escapes: true, multiline: true, open: '('}, false)
}

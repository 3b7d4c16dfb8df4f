package find

import "strings"

// Go string literals (The Go Programming Language Specification, "String
// literals" and "Rune literals"): interpreted "..." on one line, where an
// unknown escape is a compile error; raw `...` over lines without
// escapes. Rune literals are consumed so their quotes start nothing.
var golang = &codeLang{
	kind: KindGo,
	lex: func(src []byte, prag *pragmas) []token {
		return formatCalls(src, lex(src, prag, goHook), KindGo)
	},
	rules: &escapeRules{
		lang: "go", harmless: `"`, simple: "abfnrtv", octal: 3, octalExact: true, hex: true,
		unicode: "uU", unknown: unknownReject,
	},
	rawForm: func(pc *piece, text string) (string, bool) {
		if strings.ContainsAny(text, "`\r") {
			return "", false
		}
		return "`" + text + "`", true
	},
	braceBlocks: true,
}

func goHook(lx *lexer) bool {
	switch lx.src[lx.i] {
	case '/':
		return lx.lineComment("//") || lx.blockComment("/*", "*/", false)
	case '"':
		lx.simpleString(0, `"`, false, true, false, false)
		return true
	case '`':
		lx.simpleString(0, "`", true, false, true, false)
		// The specification discards carriage returns from raw string
		// values, so a file with CRLF line ends gives the same strings.
		lx.toks[len(lx.toks)-1].lit.pieces[0].dropCR = true
		return true
	case '\'':
		charLiteral(lx)
		return true
	}
	return false
}

// charLiteral consumes a character literal ('x', '\n', '\u00e9') as a
// value token; a quote that does not close on the line is punctuation.
func charLiteral(lx *lexer) {
	start := lx.i
	_, end, ok := quoted(lx.src, lx.i+1, "'", true, false)
	if !ok || end-start > 16 {
		lx.i++
		lx.emit(tPunct, start)
		return
	}
	lx.i = end
	lx.emit(tNumber, start)
}

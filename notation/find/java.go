package find

import "stereoline/notation"

// Java string literals (The Java Language Specification, 3.10.5-3.10.7):
// "..." on one line, where an unknown escape is a compile error, and
// text blocks """...""" (see textblock.go). Character literals are
// consumed.
var java = &codeLang{
	kind: KindJava,
	lex: func(src []byte, prag *pragmas) []token {
		return formatCalls(src, lex(src, prag, javaHook), KindJava)
	},
	rules: &escapeRules{
		lang: "java", harmless: `"'`, simple: "btnfrs", octal: 3, unicode: "u", unknown: unknownReject,
	},
	braceBlocks: true,
}

func javaHook(lx *lexer) bool {
	switch lx.src[lx.i] {
	case '/':
		return lx.lineComment("//") || lx.blockComment("/*", "*/", false)
	case '"':
		if lx.has(`"""`) {
			textBlock(lx)
			return true
		}
		lx.simpleString(0, `"`, false, true, false, false)
		return true
	case '\'':
		charLiteral(lx)
		return true
	}
	return false
}

// textBlock scans a text block at lx.i. One whose opening delimiter is
// followed by more text on its line does not compile and is skipped.
func textBlock(lx *lexer) {
	start := lx.i
	from := start + 3
	body := textBlockOpen(lx.src, from)
	if body < 0 {
		lx.simpleString(0, `"""`, false, true, true, true)
		return
	}
	cend, end, ok := quoted(lx.src, body, `"""`, true, true)
	lx.str(piece{
		tok:     notation.Span{Start: start, End: end},
		content: notation.Span{Start: body, End: cend},
		quote:   `"""`,
		block:   true,
	}, !ok)
}

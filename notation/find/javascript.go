package find

import (
	"strings"

	"stereoline/notation"
)

// JavaScript and TypeScript string literals (ECMA-262, "String Literals"
// and "Template Literals"): '...' and "..." on one line, `...` templates
// over lines. The fixed text of a template with ${...} substitutions is
// searched as a template (template.go); one tagged String.raw is raw.
// Regular expression literals are recognised from the token before the
// slash, so that quotes inside /["']/ start no string.
var javascript = &codeLang{
	kind: KindJavaScript,
	lex:  func(src []byte, prag *pragmas) []token { return lex(src, prag, jsHook) },
	rules: &escapeRules{
		lang: "javascript", harmless: "'\"`", simple: "bfnrtv", octal: 3, hex: true,
		unicode: "u", joinLines: true, unknown: unknownDrop,
	},
	rawForm: func(pc *piece, text string) (string, bool) {
		if strings.ContainsAny(text, "`") || strings.Contains(text, "${") || strings.HasSuffix(text, `\`) {
			return "", false
		}
		return "String.raw`" + text + "`", true
	},
	braceBlocks: true,
}

func jsHook(lx *lexer) bool {
	src := lx.src
	switch src[lx.i] {
	case '/':
		if lx.lineComment("//") || lx.blockComment("/*", "*/", false) {
			return true
		}
		if regexAllowed(lx) {
			skipRegex(lx)
			return true
		}
	case '"', '\'':
		lx.simpleString(0, string(src[lx.i]), false, true, false, false)
		return true
	case '`':
		template(lx)
		return true
	}
	return false
}

// regexAllowed reports whether a '/' here starts a regular expression:
// when the previous token cannot end an operand.
func regexAllowed(lx *lexer) bool {
	for k := len(lx.toks) - 1; k >= 0; k-- {
		t := lx.toks[k]
		switch t.kind {
		case tNewline:
			continue
		case tIdent:
			switch string(lx.text(t)) {
			case "return", "typeof", "case", "in", "of", "yield", "await", "void", "delete", "new":
				return true
			}
			return false
		case tNumber, tString:
			return false
		case tPunct:
			return t.op != ')' && t.op != ']' && t.op != '}'
		}
	}
	return true
}

// skipRegex consumes a regular expression literal and its flags, as a
// value token.
func skipRegex(lx *lexer) {
	start := lx.i
	j, class := lx.i+1, false
	for j < len(lx.src) && lx.src[j] != '\n' {
		c := lx.src[j]
		if c == '\\' {
			j += 2
			continue
		}
		if c == '[' {
			class = true
		} else if c == ']' {
			class = false
		} else if c == '/' && !class {
			j++
			break
		}
		j++
	}
	for j < len(lx.src) && identByte(lx.src[j]) {
		j++
	}
	lx.i = min(j, len(lx.src))
	lx.emit(tNumber, start)
}

// template consumes a template literal, with nested substitutions.
func template(lx *lexer) {
	start := lx.i
	j := lx.i + 1
	var holes []notation.Span
	for j < len(lx.src) && lx.src[j] != '`' {
		switch {
		case lx.src[j] == '\\':
			j += 2
			continue
		case lx.src[j] == '$' && j+1 < len(lx.src) && lx.src[j+1] == '{':
			e := skipBrackets(lx.src, j+1, false)
			if e < 0 {
				e = len(lx.src)
			}
			holes = append(holes, notation.Span{Start: j, End: e})
			j = e
			continue
		}
		j++
	}
	cend, end, ok := j, j+1, j < len(lx.src)
	if !ok {
		cend, end = len(lx.src), len(lx.src)
	}
	pc := piece{
		tok:      notation.Span{Start: start, End: end},
		content:  notation.Span{Start: start + 1, End: cend},
		quote:    "`",
		holes:    holes,
		template: len(holes) > 0,
	}
	if n := len(lx.toks); n >= 3 && string(lx.text(lx.toks[n-1])) == "raw" && string(lx.text(lx.toks[n-2])) == "." &&
		string(lx.text(lx.toks[n-3])) == "String" {
		// String.raw`...`: the tag is part of the literal.
		pc.raw, pc.prefix = true, "String.raw"
		pc.tok.Start = lx.toks[n-3].span.Start
		lx.toks = lx.toks[:n-3]
	}
	lx.str(pc, !ok)
}

// skipBrackets returns the offset after the bracket matching the '{' or
// '(' at i, skipping strings and templates inside, or -1 when it is not
// closed (before the end of the line when oneLine is set).
func skipBrackets(src []byte, i int, oneLine bool) int {
	open := src[i]
	close := byte('}')
	if open == '(' {
		close = ')'
	}
	depth := 0
	for j := i; j < len(src); j++ {
		switch c := src[j]; c {
		case open:
			depth++
		case close:
			depth--
			if depth == 0 {
				return j + 1
			}
		case '\n':
			if oneLine {
				return -1
			}
		case '"', '\'', '`':
			_, end, _ := quoted(src, j+1, string(c), true, c == '`')
			j = end - 1
		}
	}
	return -1
}

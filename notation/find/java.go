package find

import "strings"

// Java string literals (The Java Language Specification, 3.10.5-3.10.7):
// "..." on one line, where an unknown escape is a compile error; text
// blocks """...""" are skipped (their indentation stripping would need a
// map of its own). Character literals are consumed.
var java = &codeLang{
	kind: KindJava,
	lex:  func(src []byte, prag *pragmas) []token { return lex(src, prag, javaHook) },
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
			lx.simpleString(0, `"""`, false, true, true, true)
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

// Kotlin string literals (Kotlin language specification, "String
// literals"): "..." with escapes, and raw """...""" without; both with
// $name and ${...} templates, which make a literal skipped.
var kotlin = &codeLang{
	kind: KindKotlin,
	lex:  func(src []byte, prag *pragmas) []token { return lex(src, prag, kotlinHook) },
	rules: &escapeRules{
		lang: "kotlin", harmless: `"'$`, simple: "tbnr", unicode: "u", unknown: unknownReject,
	},
	rawForm: func(pc *piece, text string) (string, bool) {
		if strings.Contains(text, `"""`) || strings.Contains(text, "$") || strings.HasSuffix(text, `"`) {
			return "", false
		}
		return `"""` + text + `"""`, true
	},
	braceBlocks: true,
}

func kotlinHook(lx *lexer) bool {
	switch lx.src[lx.i] {
	case '/':
		return lx.lineComment("//") || lx.blockComment("/*", "*/", true)
	case '"':
		triple := lx.has(`"""`)
		q := `"`
		if triple {
			q = `"""`
		}
		lx.simpleString(0, q, triple, !triple, triple, false)
		t := &lx.toks[len(lx.toks)-1]
		pc := t.lit.pieces[0]
		t.lit.skip = t.lit.skip || hasTemplate(lx.src[pc.content.Start:pc.content.End], !triple)
		return true
	case '\'':
		charLiteral(lx)
		return true
	}
	return false
}

// hasTemplate reports whether a literal's content has a $name or ${...}
// template (Kotlin, Julia); escaped \$ is a dollar sign when escapes is
// set.
func hasTemplate(b []byte, escapes bool) bool {
	for i := 0; i+1 < len(b); i++ {
		if b[i] == '\\' && escapes {
			i++
			continue
		}
		if b[i] == '$' {
			c := b[i+1]
			if c == '{' || c == '(' || c == '_' || c >= 'a' && c <= 'z' || c >= 'A' && c <= 'Z' || c >= 0x80 {
				return true
			}
		}
	}
	return false
}

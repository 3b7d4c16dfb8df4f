package find

import (
	"strings"

	"stereoline/notation"
)

// Python string literals (Python language reference, "String and Bytes
// literals"): prefixes r, u, b, f, t in either case and their allowed
// pairs; single, double and triple quotes; adjacent literals are joined
// into one string, so they form one literal here, whose offset map is
// piecewise (the quotes and blanks between pieces belong to no notation
// byte). f- and t-strings are templates (fstring.go); a group with a
// byte piece is skipped: its value is no text.
var python = &codeLang{
	kind: KindPython,
	lex:  lexPython,
	rules: &escapeRules{
		lang: "python", harmless: `'"`, simple: "abfnrtv", octal: 3, hex: true,
		unicode: "uU", named: true, joinLines: true, unknown: unknownKeepWarn,
	},
	rawForm: func(pc *piece, text string) (string, bool) {
		if strings.HasSuffix(text, `\`) || strings.Contains(text, pc.quote) ||
			len(pc.quote) == 1 && strings.ContainsAny(text, "\n"+pc.quote) {
			return "", false
		}
		prefix := dropUnicode.Replace(pc.prefix)
		if !strings.ContainsAny(prefix, "rR") {
			prefix = "r" + prefix
		}
		return prefix + pc.quote + text + pc.quote, true
	},
}

// dropUnicode removes the u prefix, which cannot be combined with r.
var dropUnicode = strings.NewReplacer("u", "", "U", "")

func lexPython(src []byte, prag *pragmas) []token {
	return formatCalls(src, joinAdjacent(lex(src, prag, pythonHook)), KindPython)
}

func pythonHook(lx *lexer) bool {
	src := lx.src
	c := src[lx.i]
	switch {
	case c == '#':
		return lx.lineComment("#")
	case c == '\\' && lx.i+1 < len(src) && (src[lx.i+1] == '\n' || src[lx.i+1] == '\r'):
		// An explicit line join: the statement goes on.
		lx.i += 2
		if lx.i < len(src) && src[lx.i] == '\n' {
			lx.i++
		}
		return true
	case c == '"' || c == '\'':
		pythonString(lx, 0)
		return true
	case isPrefixByte(c):
		if lx.i > 0 && identByte(src[lx.i-1]) {
			return false
		}
		n := 0
		for n < 3 && lx.i+n < len(src) && isPrefixByte(src[lx.i+n]) {
			n++
		}
		if n <= 2 && lx.i+n < len(src) && (src[lx.i+n] == '"' || src[lx.i+n] == '\'') {
			pythonString(lx, n)
			return true
		}
	}
	return false
}

func isPrefixByte(c byte) bool { return strings.IndexByte("rRbBuUfFtT", c) >= 0 }

// pythonString scans a literal with a prefix of n bytes at lx.i.
func pythonString(lx *lexer, n int) {
	prefix := strings.ToLower(string(lx.src[lx.i : lx.i+n]))
	q := lx.src[lx.i+n]
	quote := string(q)
	if lx.i+n+2 < len(lx.src) && lx.src[lx.i+n+1] == q && lx.src[lx.i+n+2] == q {
		quote = strings.Repeat(quote, 3)
	}
	raw := strings.Contains(prefix, "r")
	if strings.ContainsAny(prefix, "ft") && !strings.Contains(prefix, "b") {
		fString(lx, n, quote, raw)
		return
	}
	lx.simpleString(n, quote, raw, true, len(quote) == 3, strings.Contains(prefix, "b"))
}

// joinAdjacent merges string tokens with nothing but blanks, newlines
// inside brackets, or comments between them, as Python joins them.
func joinAdjacent(toks []token) []token {
	out := toks[:0]
	depth := 0
	for i := 0; i < len(toks); i++ {
		t := toks[i]
		if t.kind == tString {
			j := i + 1
			for j < len(toks) && (toks[j].kind == tString || toks[j].kind == tNewline && depth > 0) {
				j++
			}
			for j > i+1 && toks[j-1].kind != tString {
				j--
			}
			if j > i+1 {
				lit := &literal{skip: t.lit.skip}
				lit.pieces = append(lit.pieces, t.lit.pieces...)
				for _, u := range toks[i+1 : j] {
					if u.kind == tString {
						lit.pieces = append(lit.pieces, u.lit.pieces...)
						lit.skip = lit.skip || u.lit.skip
					}
				}
				t = token{kind: tString, span: notation.Span{Start: t.span.Start, End: toks[j-1].span.End}, lit: lit}
				i = j - 1
			}
		}
		out = append(out, t)
		depth += bracketDelta(t)
	}
	return out
}

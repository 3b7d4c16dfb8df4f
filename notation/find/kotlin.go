package find

import (
	"bytes"
	"strings"

	"stereoline/notation"
)

// Kotlin string literals (Kotlin language specification, "String
// literals"): "..." with escapes, and raw """...""" without; both with
// $name and ${...} templates, whose fixed text is searched as a template
// (template.go). trimIndent() after a raw string needs nothing: a record
// list trims the blanks that start a line anyway; trimMargin() (with "|"
// or a literal argument) also drops the margin prefix after them.
var kotlin = &codeLang{
	kind: KindKotlin,
	lex: func(src []byte, prag *pragmas) []token {
		return formatCalls(src, marginCalls(src, lex(src, prag, kotlinHook)), KindKotlin)
	},
	rules: &escapeRules{
		lang: "kotlin", harmless: `"'$`, simple: "tbnr", unicode: "u", unknown: unknownReject,
	},
	rawForm: func(pc *piece, text string) (string, bool) {
		if strings.Contains(text, `"""`) || strings.Contains(text, "$") || strings.HasSuffix(text, `"`) {
			return "", false
		}
		return `"""` + text + `"""`, true
	},
	// A raw string has no escapes: a dollar is written as a template
	// whose value is a dollar (common practice).
	dollar: func(pc *piece) string {
		if pc.raw {
			return "${'$'}"
		}
		return `\$`
	},
	braceBlocks: true,
}

func kotlinHook(lx *lexer) bool {
	switch lx.src[lx.i] {
	case '/':
		return lx.lineComment("//") || lx.blockComment("/*", "*/", true)
	case '"':
		f := dollarForm{quote: `"`, escapes: true, open: '{'}
		if lx.has(`"""`) {
			f = dollarForm{quote: `"""`, multiline: true, open: '{', quoteRun: true}
		}
		dollarString(lx, 0, f, f.quote == `"""`)
		return true
	case '\'':
		charLiteral(lx)
		return true
	}
	return false
}

// dollarForm says how to scan a literal whose templates start with '$'
// (Kotlin: $name and ${...}; Julia: $name and $(...)).
type dollarForm struct {
	quote     string
	escapes   bool // a backslash protects the next byte (and \$ is a dollar)
	multiline bool
	open      byte // the bracket after '$' that opens an expression
	quoteRun  bool // more than three quotes close with the last three (Kotlin raw strings)
}

// dollarString scans and emits a literal with a prefix of prefixLen bytes
// at lx.i. Its templates become holes: a template piece, searched token
// by token (see template.go).
func dollarString(lx *lexer, prefixLen int, f dollarForm, raw bool) {
	start := lx.i
	from := start + prefixLen + len(f.quote)
	cend, end, holes, ok := scanDollar(lx.src, from, f)
	lx.str(piece{
		tok:      notation.Span{Start: start, End: end},
		content:  notation.Span{Start: from, End: cend},
		prefix:   string(lx.src[start : start+prefixLen]),
		quote:    f.quote,
		raw:      raw,
		holes:    holes,
		template: len(holes) > 0,
	}, !ok)
}

// scanDollar finds the end of a literal whose content starts at from,
// and its templates. An unterminated literal ends at the line end (one
// line literals) or the end of the file, and reports ok false.
func scanDollar(src []byte, from int, f dollarForm) (cend, end int, holes []notation.Span, ok bool) {
	j := from
	for j < len(src) {
		c := src[j]
		switch {
		case c == '\\' && f.escapes:
			j += 2
			continue
		case c == '\n' && !f.multiline:
			return j, j, holes, false
		case c == f.quote[0] && bytes.HasPrefix(src[j:], []byte(f.quote)):
			end := j + len(f.quote)
			for f.quoteRun && end < len(src) && src[end] == f.quote[0] {
				end++
			}
			return end - len(f.quote), end, holes, true
		case c == '$' && j+1 < len(src) && src[j+1] == f.open:
			e := skipBrackets(src, j+1, !f.multiline)
			if e < 0 {
				if !f.multiline {
					if nl := bytes.IndexByte(src[j:], '\n'); nl >= 0 {
						return j + nl, j + nl, holes, false
					}
				}
				return len(src), len(src), holes, false
			}
			holes = append(holes, notation.Span{Start: j, End: e})
			j = e
			continue
		case c == '$' && j+1 < len(src) && templateNameStart(src[j+1]):
			k := j + 2
			for k < len(src) && (templateNameStart(src[k]) || src[k] >= '0' && src[k] <= '9') {
				k++
			}
			holes = append(holes, notation.Span{Start: j, End: k})
			j = k
			continue
		}
		j++
	}
	return len(src), len(src), holes, false
}

// templateNameStart reports whether c may start the name of a $name
// template: a letter, '_' or a byte of a non-ASCII letter.
func templateNameStart(c byte) bool {
	return c == '_' || c >= 'a' && c <= 'z' || c >= 'A' && c <= 'Z' || c >= 0x80
}

// marginCalls marks the raw strings followed by .trimMargin() or
// .trimMargin("prefix") with the margin that call removes.
func marginCalls(src []byte, toks []token) []token {
	text := func(k int) string {
		if k >= len(toks) {
			return ""
		}
		return string(src[toks[k].span.Start:toks[k].span.End])
	}
	for k := range toks {
		t := toks[k]
		if t.kind != tString || t.lit.pieces[0].quote != `"""` || text(k+1) != "." ||
			text(k+2) != "trimMargin" || text(k+3) != "(" {
			continue
		}
		switch {
		case text(k+4) == ")":
			t.lit.margin = "|"
		case k+5 < len(toks) && toks[k+4].kind == tString && !toks[k+4].lit.skip && !toks[k+4].lit.hasHoles() && text(k+5) == ")":
			pc := toks[k+4].lit.pieces[0]
			t.lit.margin = strings.TrimSpace(string(src[pc.content.Start:pc.content.End]))
		}
	}
	return toks
}

package find

import (
	"strings"

	"stereoline/notation"
)

// Rust string literals (The Rust Reference, "Tokens"): "..." over lines
// with escapes (an unknown one is an error, backslash-newline skips the
// next line's indentation); raw r"..." and r#"..."#; byte and C strings
// (b"...", br"...", c"...") are skipped. A quote starts a character
// literal only when it closes right after one character or an escape;
// otherwise it is a lifetime ('a).
var rust = &codeLang{
	kind: KindRust,
	lex: func(src []byte, prag *pragmas) []token {
		return formatCalls(src, lex(src, prag, rustHook), KindRust)
	},
	rules: &escapeRules{
		lang: "rust", harmless: `"'`, simple: "nrt0", hex: true, unicode: "u",
		joinLines: true, skipIndent: true, unknown: unknownReject,
	},
	rawForm: func(pc *piece, text string) (string, bool) {
		if !strings.Contains(text, `"`) {
			return `r"` + text + `"`, true
		}
		if !strings.Contains(text, `"#`) {
			return `r#"` + text + `"#`, true
		}
		return "", false
	},
	braceBlocks: true,
}

func rustHook(lx *lexer) bool {
	src := lx.src
	c := src[lx.i]
	switch {
	case c == '/':
		return lx.lineComment("//") || lx.blockComment("/*", "*/", true)
	case c == '"':
		lx.simpleString(0, `"`, false, true, true, false)
		return true
	case c == '\'':
		if lx.i+1 < len(src) && src[lx.i+1] == '\\' {
			charLiteral(lx)
			return true
		}
		if k := lx.i + 1 + runeLen(src[lx.i+1:]); k < len(src) && src[k] == '\'' {
			start := lx.i
			lx.i = k + 1
			lx.emit(tNumber, start)
			return true
		}
		lx.i++
		lx.emit(tPunct, lx.i-1)
		return true
	case c == 'r' || c == 'b' || c == 'c':
		if lx.i > 0 && identByte(src[lx.i-1]) {
			return false
		}
		j := lx.i
		skip := c != 'r'
		if c != 'r' {
			j++
		}
		raw := j < len(src) && src[j] == 'r'
		if raw {
			j++
		}
		hashes := 0
		for raw && j < len(src) && src[j] == '#' {
			hashes++
			j++
		}
		if j >= len(src) || src[j] != '"' || !raw && !skip {
			return false
		}
		if !raw {
			lx.simpleString(j-lx.i, `"`, false, true, true, true)
			return true
		}
		close := `"` + strings.Repeat("#", hashes)
		from := j + 1
		cend, end, ok := quoted(src, from, close, false, true)
		lx.str(piece{
			tok:     notation.Span{Start: lx.i, End: end},
			content: notation.Span{Start: from, End: cend},
			prefix:  string(src[lx.i:j]),
			quote:   `"`,
			raw:     true,
		}, skip || !ok)
		return true
	}
	return false
}

// runeLen returns the length of the UTF-8 sequence starting b (1 for an
// invalid one).
func runeLen(b []byte) int {
	if len(b) == 0 {
		return 0
	}
	switch c := b[0]; {
	case c >= 0xf0:
		return min(4, len(b))
	case c >= 0xe0:
		return min(3, len(b))
	case c >= 0xc0:
		return min(2, len(b))
	}
	return 1
}

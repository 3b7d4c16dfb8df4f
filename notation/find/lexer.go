package find

import (
	"bytes"

	"stereoline/notation"
)

// The code scanners are small hand-written lexers, one per language,
// sharing this skeleton: each language file supplies a hook that
// recognises its comments and string literals at the current position;
// the skeleton does blanks, newlines, names, numbers and punctuation. The
// lexers only need to be right about where comments and strings begin and
// end (so that a string inside a comment is not taken, nor a comment
// marker inside a string), not to validate the language.

type tokKind uint8

const (
	tIdent tokKind = iota + 1
	tString
	tNumber
	tPunct
	tNewline
)

// token is one lexical unit. Comments produce no tokens: the lexer hands
// them to the pragma reader and drops them.
type token struct {
	kind tokKind
	op   byte // first byte of a tPunct
	span notation.Span
	lit  *literal // for tString
}

// literal is one string literal as the program sees it: one piece, or
// several when the language joins adjacent literals (Python).
type literal struct {
	pieces []piece
	// skip marks literals that are never notation: byte strings, string
	// macros, unterminated or malformed literals.
	skip bool
	// margin is the prefix that a trimMargin() call after the literal
	// removes from its lines, after their blanks (Kotlin).
	margin string
	// format is how a call or operator after (or around) the literal
	// formats it, when one does (format.go).
	format formatStyle
}

// template reports whether a piece of the literal builds its text at run
// time (see piece.template); such literals are searched token by token.
func (l *literal) template() bool {
	for k := range l.pieces {
		if l.pieces[k].template {
			return true
		}
	}
	return false
}

// hasHoles reports whether a piece of the literal has a replacement field
// or substitution.
func (l *literal) hasHoles() bool {
	for k := range l.pieces {
		if len(l.pieces[k].holes) > 0 {
			return true
		}
	}
	return false
}

// piece is one quoted literal token.
type piece struct {
	tok     notation.Span // the whole token: prefix, quotes and content
	content notation.Span // between the quotes
	prefix  string        // as written before the opening quote ("r", "u", "String.raw")
	quote   string        // the opening quote, which is also the closing one
	raw     bool          // backslashes are not escapes
	dropCR  bool          // carriage returns are not part of the value (Go raw strings)
	// holes are the replacement fields and substitutions of a template
	// ({...} in a Python f-string, ${...} in JavaScript, $name and ${...}
	// in Kotlin), as host spans inside content, in order. They are not
	// fixed text, and no notation spans one.
	holes []notation.Span
	// template: the piece is formatted at run time (an f-string, a
	// template with substitutions), so its fixed text is a layout of
	// values: it is searched token by token, and the escapes \t, \n and
	// \r are read as the blanks they stand for, which separate tokens.
	template bool
	// braces: {{ and }} stand for one brace (Python f- and t-strings).
	braces bool
	// block: a Java text block, whose content (from the line after the
	// opening delimiter) is stripped of incidental white space before its
	// escapes are read.
	block bool
}

// lexer is the shared scanning state.
type lexer struct {
	src  []byte
	i    int
	toks []token
	prag *pragmas
}

// lexHook recognises a comment or string at lx.i, consumes it and reports
// true; otherwise it leaves lx.i alone and reports false.
type lexHook func(lx *lexer) bool

// lex splits src into tokens using the language hook.
func lex(src []byte, prag *pragmas, hook lexHook) []token {
	lx := &lexer{src: src, prag: prag, toks: make([]token, 0, len(src)/6+4)}
	for lx.i < len(src) {
		if hook(lx) {
			continue
		}
		c := src[lx.i]
		start := lx.i
		switch {
		case c == '\n':
			lx.i++
			lx.emit(tNewline, start)
		case c == ' ' || c == '\t' || c == '\r' || c == '\f' || c == '\v':
			lx.i++
		case identByte(c) && !(c >= '0' && c <= '9'):
			for lx.i < len(src) && identByte(src[lx.i]) {
				lx.i++
			}
			lx.emit(tIdent, start)
		case c >= '0' && c <= '9':
			for lx.i < len(src) && (identByte(src[lx.i]) || src[lx.i] == '.') {
				lx.i++
			}
			lx.emit(tNumber, start)
		default:
			lx.i++
			if lx.i < len(src) && twoCharOp(c, src[lx.i]) {
				lx.i++
			}
			lx.emit(tPunct, start)
		}
	}
	return lx.toks
}

func identByte(c byte) bool {
	return c >= 'a' && c <= 'z' || c >= 'A' && c <= 'Z' || c >= '0' && c <= '9' || c == '_' || c == '$' || c >= 0x80
}

// twoCharOp reports the two-byte operators the rules tell apart from
// their first byte (":=" from ":", "==" from "=", "<-" from "<").
func twoCharOp(a, b byte) bool {
	switch string([]byte{a, b}) {
	case ":=", "==", "<-", "+=", "!=", "<=", ">=", "=>", "::", "->":
		return true
	}
	return false
}

func (lx *lexer) emit(k tokKind, start int) {
	t := token{kind: k, span: notation.Span{Start: start, End: lx.i}}
	if k == tPunct {
		t.op = lx.src[start]
	}
	lx.toks = append(lx.toks, t)
}

// bracketDelta is +1 for an opening bracket, -1 for a closing one.
func bracketDelta(t token) int {
	if t.kind != tPunct {
		return 0
	}
	switch t.op {
	case '(', '[', '{':
		return 1
	case ')', ']', '}':
		return -1
	}
	return 0
}

// text returns the bytes of a token.
func (lx *lexer) text(t token) []byte { return lx.src[t.span.Start:t.span.End] }

// has reports whether src continues with s at lx.i.
func (lx *lexer) has(s string) bool { return bytes.HasPrefix(lx.src[lx.i:], []byte(s)) }

// comment consumes a comment ending at end and feeds it to the pragmas.
func (lx *lexer) comment(end int) {
	if end > len(lx.src) {
		end = len(lx.src)
	}
	lx.prag.addComment(lx.src[lx.i:end], lx.i)
	lx.i = end
}

// lineComment consumes a comment running to the end of the line when src
// continues with prefix.
func (lx *lexer) lineComment(prefix string) bool {
	if !lx.has(prefix) {
		return false
	}
	end := bytes.IndexByte(lx.src[lx.i:], '\n')
	if end < 0 {
		end = len(lx.src)
	} else {
		end += lx.i
	}
	lx.comment(end)
	return true
}

// blockComment consumes a comment between open and close, nested when the
// language nests them (Rust, Kotlin, Julia). An unclosed comment runs to
// the end of the file.
func (lx *lexer) blockComment(open, close string, nested bool) bool {
	if !lx.has(open) {
		return false
	}
	j, depth := lx.i+len(open), 1
	for j < len(lx.src) && depth > 0 {
		switch {
		case bytes.HasPrefix(lx.src[j:], []byte(close)):
			depth--
			j += len(close)
		case nested && bytes.HasPrefix(lx.src[j:], []byte(open)):
			depth++
			j += len(open)
		default:
			j++
		}
	}
	lx.comment(j)
	return true
}

// quoted scans a literal whose content starts at from and ends at the
// first unescaped quote. escapes says whether a backslash protects the
// next byte from ending the literal; multiline whether a newline may
// appear in it. An unterminated literal ends at the newline or end of
// file; it is reported with ok false and never taken.
func quoted(src []byte, from int, quote string, escapes, multiline bool) (contentEnd, end int, ok bool) {
	j := from
	for j < len(src) {
		c := src[j]
		switch {
		case c == '\\' && escapes:
			j += 2
			continue
		case c == quote[0] && bytes.HasPrefix(src[j:], []byte(quote)):
			return j, j + len(quote), true
		case c == '\n' && !multiline:
			return j, j, false
		}
		j++
	}
	return len(src), len(src), false
}

// str emits a one-piece string literal token.
func (lx *lexer) str(p piece, skip bool) {
	lx.toks = append(lx.toks, token{kind: tString, span: p.tok, lit: &literal{pieces: []piece{p}, skip: skip}})
	lx.i = p.tok.End
}

// simpleString scans a literal opened by quote at lx.i (after a prefix
// of prefixLen bytes) and emits it. protect says whether a backslash
// keeps the next byte from closing the literal (true everywhere except in
// Go's and Rust's raw strings).
func (lx *lexer) simpleString(prefixLen int, quote string, raw, protect, multiline, skip bool) {
	start := lx.i
	from := start + prefixLen + len(quote)
	cend, end, ok := quoted(lx.src, from, quote, protect, multiline)
	if !ok {
		skip = true
		if end <= start {
			end = from
		}
	}
	lx.str(piece{
		tok:     notation.Span{Start: start, End: end},
		content: notation.Span{Start: from, End: cend},
		prefix:  string(lx.src[start : start+prefixLen]),
		quote:   quote,
		raw:     raw,
	}, skip)
}

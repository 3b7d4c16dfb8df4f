package find

import (
	"bytes"
	"fmt"
	"strconv"
	"strings"
	"unicode/utf8"

	"stereoline/notation"
)

// unknownEscape says what a language does with a backslash before a byte
// that starts no escape sequence.
type unknownEscape uint8

const (
	unknownKeepWarn unknownEscape = iota // keeps both bytes, warns (Python)
	unknownDrop                          // silently drops the backslash (JavaScript)
	unknownReject                        // the file does not compile (Go, Rust, Java, Kotlin, R, Julia)
)

// escapeRules describes the escape sequences of one language's ordinary
// string literals, from each language's reference manual. Only `\\` and
// escaped quotes are harmless for notation; every other sequence either
// changes the string or breaks the build.
type escapeRules struct {
	lang       string // name used in messages
	harmless   string // bytes b for which `\b` means b itself, besides the backslash
	simple     string // letters of one-letter escapes that stand for a control character
	octal      int    // most octal digits an octal escape takes; 0: no octal escapes
	octalExact bool   // octal escapes need exactly that many digits (Go)
	hex        bool   // \xhh
	unicode    string // letters that introduce code point escapes ("uU")
	named      bool   // \N{name} (Python)
	joinLines  bool   // backslash-newline joins lines
	skipIndent bool   // and also skips the blanks starting the next line (Rust, Julia)
	unknown    unknownEscape
}

// issue is a host problem found while decoding, in host offsets.
type issue struct {
	span notation.Span
	sev  notation.Severity
	msg  string
}

// decoded is the notation text of a literal with its offset map and
// problems, assembled piece by piece.
type decoded struct {
	text   []byte
	b      mapBuilder
	issues []issue
	// pieces[k] is the notation range of piece k and the index of its
	// first issue.
	pieces []pieceRange
}

type pieceRange struct {
	start, end int
	issues     int
}

func (d *decoded) copy(src []byte, from, to int) {
	d.text = append(d.text, src[from:to]...)
	d.b.copy(from, to-from)
}

func (d *decoded) escape(out []byte, h, hlen int) {
	d.text = append(d.text, out...)
	d.b.escape(len(out), h, hlen)
}

// keep copies an escape sequence the host would eat as written, so that
// the notation is analysed as the author wrote it, and records why.
func (d *decoded) keep(src []byte, from, to int, sev notation.Severity, msg string) {
	d.copy(src, from, to)
	d.issues = append(d.issues, issue{span: notation.Span{Start: from, End: to}, sev: sev, msg: msg})
}

// piece decodes one literal piece.
func (d *decoded) piece(src []byte, pc *piece, r *escapeRules) {
	pr := pieceRange{start: len(d.text), issues: len(d.issues)}
	if pc.block {
		d.textBlock(src, pc, r)
	} else {
		from := pc.content.Start
		for _, h := range pc.holes {
			d.fixed(src, pc, from, h.Start, r)
			d.hole(h)
			from = h.End
		}
		d.fixed(src, pc, from, pc.content.End, r)
	}
	pr.end = len(d.text)
	d.pieces = append(d.pieces, pr)
}

// fixed decodes the fixed text src[i:end] of a piece.
func (d *decoded) fixed(src []byte, pc *piece, i, end int, r *escapeRules) {
	escapes := !pc.raw && r != nil
	special := specialBytes(escapes, pc.braces, pc.dropCR)
	for i < end {
		var k int
		switch special {
		case "":
			k = -1
		case `\`:
			k = bytes.IndexByte(src[i:end], '\\')
		default:
			k = bytes.IndexAny(src[i:end], special)
		}
		if k < 0 {
			d.copy(src, i, end)
			return
		}
		d.copy(src, i, i+k)
		i += k
		switch src[i] {
		case '\\':
			i = d.backslash(src, i, end, r, pc.template)
		case '\r':
			i++ // not part of the value
		default:
			// A doubled brace is one brace; a single one (a stray '}')
			// is kept.
			if i+1 < end && src[i+1] == src[i] {
				d.escape(src[i:i+1], i, 2)
				i += 2
			} else {
				d.copy(src, i, i+1)
				i++
			}
		}
	}
}

// specialBytes lists the bytes fixed text cannot copy verbatim.
func specialBytes(escapes, braces, dropCR bool) string {
	s := ""
	if escapes {
		s += `\`
	}
	if braces {
		s += "{}"
	}
	if dropCR {
		s += "\r"
	}
	return s
}

// holeByte stands in the decoded text for a replacement field or
// substitution: it is no notation byte and no blank, so a token touching
// a field is never plausible and never a record.
const holeByte = 0

// hole records a replacement field at host span h as one holeByte.
func (d *decoded) hole(h notation.Span) {
	d.text = append(d.text, holeByte)
	if h.Len() == 1 {
		d.b.copy(h.Start, 1)
		return
	}
	d.b.escape(1, h.Start, h.Len())
}

// backslash decodes the escape sequence at src[i] (a backslash) and
// returns the offset after it.
//
// In a template (blanks set), \t, \n and \r lay out the values and are
// read as the blank they stand for, so that they separate tokens.
func (d *decoded) backslash(src []byte, i, end int, r *escapeRules, blanks bool) int {
	if i+1 >= end {
		d.copy(src, i, i+1)
		return i + 1
	}
	e := src[i+1]
	hint := "; " + rawHint(r.lang)
	switch {
	case e == '\\' || strings.IndexByte(r.harmless, e) >= 0:
		d.escape([]byte{e}, i, 2)
		return i + 2
	case blanks && (e == 't' || e == 'n' || e == 'r') && strings.IndexByte(r.simple, e) >= 0:
		d.escape([]byte{byte(simpleEscape(e))}, i, 2)
		return i + 2
	case (e == '\n' || e == '\r') && r.joinLines:
		j := i + 2
		if e == '\r' && j < end && src[j] == '\n' {
			j++
		}
		for r.skipIndent && j < end && (src[j] == ' ' || src[j] == '\t' || src[j] == '\n' || src[j] == '\r') {
			j++
		}
		return j
	case e >= '0' && e <= '7' && r.octal > 0:
		j := i + 1
		for j < end && j-i-1 < r.octal && src[j] >= '0' && src[j] <= '7' {
			j++
		}
		seq := string(src[i:j])
		if r.octalExact && j-i-1 != r.octal {
			d.keep(src, i, j, notation.SeverityError, fmt.Sprintf("%s rejects '%s': an octal escape needs %d digits, so the file does not compile%s", r.lang, seq, r.octal, hint))
			return j
		}
		v, _ := strconv.ParseUint(seq[1:], 8, 32)
		d.keep(src, i, j, notation.SeverityError, fmt.Sprintf("%s reads '%s' as %s%s", r.lang, seq, describeRune(rune(v)), hint))
		return j
	case strings.IndexByte(r.simple, e) >= 0:
		d.keep(src, i, i+2, notation.SeverityError, fmt.Sprintf("%s reads '%s' as %s%s", r.lang, src[i:i+2], describeRune(simpleEscape(e)), hint))
		return i + 2
	case e == 'x' && r.hex || strings.IndexByte(r.unicode, e) >= 0:
		j, v := codePoint(src, i, end)
		what := "a character escape"
		if v >= 0 {
			what = describeRune(rune(v))
		}
		d.keep(src, i, j, notation.SeverityError, fmt.Sprintf("%s reads '%s' as %s%s", r.lang, src[i:j], what, hint))
		return j
	case e == 'N' && r.named:
		if i+2 < end && src[i+2] == '{' {
			j := i + 3
			for j < end && src[j] != '}' && j-i < 100 {
				j++
			}
			if j < end && src[j] == '}' {
				j++
			}
			d.keep(src, i, j, notation.SeverityError, fmt.Sprintf("%s reads '%s' as a named character%s", r.lang, src[i:j], hint))
			return j
		}
		d.keep(src, i, i+2, notation.SeverityError, fmt.Sprintf("%s rejects '\\N' without a {name}, so the file does not compile%s", r.lang, hint))
		return i + 2
	}
	_, size := utf8.DecodeRune(src[i+1 : end])
	j := i + 1 + size
	seq := string(src[i:j])
	switch r.unknown {
	case unknownKeepWarn:
		d.keep(src, i, j, notation.SeverityWarning, fmt.Sprintf("%s keeps '%s' but warns that it is an invalid escape sequence%s", r.lang, seq, hint))
	case unknownDrop:
		d.keep(src, i, j, notation.SeverityError, fmt.Sprintf("%s reads '%s' as '%s': the backslash is dropped%s", r.lang, seq, seq[1:], hint))
	default:
		d.keep(src, i, j, notation.SeverityError, fmt.Sprintf("%s rejects the unknown escape '%s', so the file does not compile%s", r.lang, seq, hint))
	}
	return j
}

// codePoint reads a \x, \u or \U escape at src[i], with or without
// braces, and returns its end and value (-1 when malformed).
func codePoint(src []byte, i, end int) (int, int64) {
	j := i + 2
	digits := map[byte]int{'x': 2, 'u': 4, 'U': 8}[src[i+1]]
	if j < end && src[j] == '{' {
		k := j + 1
		for k < end && k-j <= 8 && isHex(src[k]) {
			k++
		}
		v, err := strconv.ParseInt(string(src[j+1:k]), 16, 32)
		if k < end && src[k] == '}' {
			k++
		}
		if err != nil {
			v = -1
		}
		return k, v
	}
	k := j
	for k < end && k-j < digits && isHex(src[k]) {
		k++
	}
	v, err := strconv.ParseInt(string(src[j:k]), 16, 32)
	if err != nil {
		v = -1
	}
	return k, v
}

func isHex(c byte) bool {
	return c >= '0' && c <= '9' || c >= 'a' && c <= 'f' || c >= 'A' && c <= 'F'
}

// simpleEscape returns the character of a one-letter escape.
func simpleEscape(e byte) rune {
	switch e {
	case 'a':
		return 7
	case 'b':
		return 8
	case 'e':
		return 27
	case 'f':
		return 12
	case 'n':
		return 10
	case 'r':
		return 13
	case 't':
		return 9
	case 'v':
		return 11
	case '0':
		return 0
	case 's':
		return ' '
	case 'N':
		return 0x85
	case '_':
		return 0xa0
	case 'L':
		return 0x2028
	case 'P':
		return 0x2029
	}
	return rune(e)
}

var runeNames = map[rune]string{
	0: "the null character (U+0000)", 7: "the bell character (U+0007)",
	8: "a backspace (U+0008)", 9: "a tab (U+0009)", 10: "a newline (U+000A)",
	11: "a vertical tab (U+000B)", 12: "a form feed (U+000C)", 13: "a carriage return (U+000D)",
	27: "an escape character (U+001B)", ' ': "a space (U+0020)",
}

// describeRune names the character an escape stands for.
func describeRune(r rune) string {
	if n, ok := runeNames[r]; ok {
		return n
	}
	if r < 0x20 || r == 0x7f || r >= 0x80 && r < 0xa0 {
		return fmt.Sprintf("the control character U+%04X", r)
	}
	if !utf8.ValidRune(r) {
		return fmt.Sprintf("an invalid character U+%04X", r)
	}
	return fmt.Sprintf("'%c' (U+%04X)", r, r)
}

// rawHint is the advice ending every host-escape message.
func rawHint(lang string) string {
	switch lang {
	case "python":
		return `write a raw string r"..." or double the backslash`
	case "javascript":
		return "write String.raw`...` or double the backslash"
	case "go":
		return "write a raw string `...` or double the backslash"
	case "rust":
		return `write a raw string r"..." or double the backslash`
	case "r":
		return `write a raw string r"(...)" or double the backslash`
	case "julia":
		return `write raw"..." or double the backslash`
	}
	return "double the backslash"
}

// dropRaw removes the raw-string marks from a prefix.
var dropRaw = strings.NewReplacer("r", "", "R", "")

// doubled returns a piece rewritten with the notation text escaped the
// plain way: every backslash doubled, the quote escaped, and control
// characters (only newlines appear in notation pieces) written as \n when
// the quote does not allow them.
func doubled(pc *piece, text string, multiline bool) string {
	var sb strings.Builder
	prefix := dropRaw.Replace(pc.prefix)
	if strings.HasPrefix(pc.prefix, "String.raw") {
		prefix = ""
	}
	sb.WriteString(prefix)
	sb.WriteString(pc.quote)
	for i := 0; i < len(text); i++ {
		c := text[i]
		switch {
		case c == '\\':
			sb.WriteString(`\\`)
		case c == pc.quote[0] && len(pc.quote) == 1:
			sb.WriteByte('\\')
			sb.WriteByte(c)
		case c == '\n' && !multiline:
			sb.WriteString(`\n`)
		default:
			sb.WriteByte(c)
		}
	}
	sb.WriteString(pc.quote)
	return sb.String()
}

package find

// Format strings are plain literals that a call or operator right after
// them (or around them) formats at run time, so their fields are
// replacement fields as in an f-string:
//
//   - Python "...".format(...): {...} fields, {{ and }} for braces
//     (Python library reference, "Format String Syntax");
//   - Python "..." % values: printf-style conversions, %% for a percent
//     sign ("printf-style String Formatting");
//   - Java "...".formatted(...), String.format("...", ...) and
//     printf("...", ...); Kotlin "...".format(...) and
//     String.format("...", ...): the conversions of java.util.Formatter,
//     %% for a percent sign and %n for a line end;
//   - Go: the format argument of the fmt and log functions and of the
//     methods whose names end in f by the same convention (Sprintf,
//     Errorf, t.Fatalf, ...): the verbs of package fmt, %% for a percent
//     sign;
//   - Rust: the format string of format!, print!, println!, eprint!,
//     eprintln!, panic!, format_args!, write! and writeln!: {...} fields,
//     {{ and }} for braces (std::fmt).
//
// The fields are found in the value of the literal, after its escapes
// are read, as the formatter finds them; the literal is then searched as
// a template (template.go). A '%' ring bond in such a literal must be
// written %% to survive formatting, and so it reads.

// formatStyle is the field syntax of a formatted literal.
type formatStyle uint8

const (
	formatNone         formatStyle = iota
	formatBraces                   // Python str.format
	formatPrintfPython             // Python % operator
	formatPrintfJava               // java.util.Formatter (Java, Kotlin)
	formatPrintfGo                 // package fmt (Go)
)

// goFormatFuncs are the Go functions and methods whose argument just
// before the values is a format string (the names go vet's printf check
// knows, and the f-suffixed logging methods of common practice).
var goFormatFuncs = map[string]bool{
	"Sprintf": true, "Printf": true, "Errorf": true, "Fatalf": true, "Panicf": true,
	"Logf": true, "Skipf": true, "Infof": true, "Warnf": true, "Warningf": true,
	"Debugf": true, "Tracef": true, "Appendf": true,
}

// rustFormatMacros are the standard macros whose first argument is a
// format string (write! and writeln! take it second).
var rustFormatMacros = map[string]bool{
	"format": true, "print": true, "println": true, "eprint": true, "eprintln": true,
	"panic": true, "format_args": true, "unreachable": true, "todo": true,
}

// formatCalls marks the literals of toks that are formatted (see above)
// and makes their pieces templates.
func formatCalls(src []byte, toks []token, kind Kind) []token {
	text := func(k int) string {
		if k < 0 || k >= len(toks) || toks[k].kind == tString {
			return ""
		}
		return string(src[toks[k].span.Start:toks[k].span.End])
	}
	for k := range toks {
		t := toks[k]
		if t.kind != tString || t.lit.skip || t.lit.hasHoles() {
			continue
		}
		style := formatNone
		after := text(k+1) == "." && text(k+3) == "("
		before := text(k-1) == "(" && (text(k-2) == "printf" ||
			text(k-2) == "format" && text(k-3) == "." && text(k-4) == "String")
		switch kind {
		case KindPython:
			switch {
			case after && text(k+2) == "format":
				style = formatBraces
			case text(k+1) == "%":
				style = formatPrintfPython
			}
		case KindJava, KindKotlin:
			if after && (text(k+2) == "formatted" || kind == KindKotlin && text(k+2) == "format") || before {
				style = formatPrintfJava
			}
		case KindGo:
			// f(..., "format") or f(w, "format") for Fprintf and
			// Fprint-like writers.
			if text(k-1) == "(" && goFormatFuncs[text(k-2)] ||
				text(k-1) == "," && text(k-3) == "(" && (text(k-4) == "Fprintf" || text(k-4) == "Appendf") {
				style = formatPrintfGo
			}
		case KindRust:
			if text(k-1) == "(" && text(k-2) == "!" && rustFormatMacros[text(k-3)] ||
				text(k-1) == "," && text(k-3) == "(" && text(k-4) == "!" && (text(k-5) == "write" || text(k-5) == "writeln") {
				style = formatBraces
			}
		}
		if style == formatNone {
			continue
		}
		t.lit.format = style
		for p := range t.lit.pieces {
			t.lit.pieces[p].template = true
		}
	}
	return toks
}

// collapseFields replaces each field of a formatted literal's decoded
// text by one holeByte, and each doubled escape (%%, {{) by the byte it
// stands for, returning the new text and its map.
func collapseFields(text []byte, m offsetMap, style formatStyle) ([]byte, offsetMap) {
	out := make([]byte, 0, len(text))
	var b mapBuilder
	for i := 0; i < len(text); {
		n, c := formatField(text, i, style)
		if n == 0 {
			n, c = 1, text[i]
		}
		s, _ := m.byteRange(i)
		_, e := m.byteRange(i + n - 1)
		out = append(out, c)
		b.addByte(s, e)
		i += n
	}
	return out, b.done(m.hostStart())
}

// formatField returns the length of the field or doubled escape at text[i]
// and the byte that stands for it (holeByte for a field), or 0.
func formatField(text []byte, i int, style formatStyle) (int, byte) {
	c := text[i]
	switch style {
	case formatBraces:
		if c != '{' && c != '}' {
			return 0, 0
		}
		if i+1 < len(text) && text[i+1] == c {
			return 2, c
		}
		if c == '}' {
			return 0, 0
		}
		depth := 0
		for j := i; j < len(text); j++ {
			switch text[j] {
			case '{':
				depth++
			case '}':
				depth--
				if depth == 0 {
					return j + 1 - i, holeByte
				}
			}
		}
		// Unclosed: the formatter fails; nothing after it is fixed.
		return len(text) - i, holeByte
	case formatPrintfPython, formatPrintfJava, formatPrintfGo:
		if c != '%' || i+1 >= len(text) {
			return 0, 0
		}
		if text[i+1] == '%' {
			return 2, '%'
		}
		if style == formatPrintfJava && text[i+1] == 'n' {
			return 2, '\n'
		}
		if n := printfSpec(text[i+1:], style); n > 0 {
			return n + 1, holeByte
		}
	}
	return 0, 0
}

// printfSpec returns the length of a conversion specification after its
// '%', or 0 when b starts none: Python's (name), flags, width, precision,
// length modifier and conversion; java.util.Formatter's argument index
// (n$ or <), flags, width, precision and conversion (t and T take a
// second letter); Go's flags, [n] argument indexes, width, precision and
// verb.
func printfSpec(b []byte, style formatStyle) int {
	java, golang := style == formatPrintfJava, style == formatPrintfGo
	j := 0
	digits := func() {
		if golang && j < len(b) && b[j] == '[' {
			for j < len(b) && b[j] != ']' {
				j++
			}
			j++
		}
		for j < len(b) && (b[j] >= '0' && b[j] <= '9' || !java && b[j] == '*') {
			j++
		}
	}
	if style == formatPrintfPython && j < len(b) && b[j] == '(' {
		for j < len(b) && b[j] != ')' {
			j++
		}
		if j == len(b) {
			return 0
		}
		j++
	}
	if java {
		k := j
		digits()
		if j < len(b) && b[j] == '$' && j > k {
			j++
		} else if j == k && j < len(b) && b[j] == '<' {
			j++
		} else {
			j = k
		}
	}
	flags := "#0- +"
	if java {
		flags = "-#+ 0,("
	}
	for j < len(b) && j < 16 && indexByte(flags, b[j]) {
		j++
	}
	digits()
	if j < len(b) && b[j] == '.' {
		j++
		digits()
	}
	if style == formatPrintfPython {
		for j < len(b) && (b[j] == 'h' || b[j] == 'l' || b[j] == 'L') {
			j++
		}
	}
	if golang && j < len(b) && b[j] == '[' {
		digits()
	}
	if j >= len(b) {
		return 0
	}
	conv := "diouxXeEfFgGcrsa"
	switch style {
	case formatPrintfJava:
		conv = "bBhHsScCdoxXeEfgGaAtT"
	case formatPrintfGo:
		conv = "vTtbcdoOqxXUeEfFgGspw" // w: Errorf
	}
	if !indexByte(conv, b[j]) {
		return 0
	}
	if java && (b[j] == 't' || b[j] == 'T') {
		if j+1 >= len(b) {
			return 0
		}
		j++
	}
	return j + 1
}

func indexByte(s string, c byte) bool {
	for i := 0; i < len(s); i++ {
		if s[i] == c {
			return true
		}
	}
	return false
}

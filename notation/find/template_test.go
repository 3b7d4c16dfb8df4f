package find

import (
	"strings"
	"testing"

	"stereoline/notation"
)

// TestTemplateMaps checks, byte by byte, where the notation found in text
// blocks and templates sits in the host: hosts[i] is the host text of
// notation byte i, the occurrence starts at the first byte of anchor, and
// the host bytes between two notation bytes (a line continuation with the
// next line's indentation, the quotes joining two literals) map to no
// notation offset. Host forms from The Java Language Specification 3.10.6
// (text blocks: incidental white space, \<line terminator>, CR LF read
// as LF), the Python language reference ("f-strings", implicit
// concatenation), ECMA-262 "Template Literals" and the Kotlin
// specification ("String literals").
func TestTemplateMaps(t *testing.T) {
	tests := []struct {
		name   string
		kind   Kind
		src    string
		anchor string
		hosts  []string
	}{
		{"java continuation", KindJava,
			"class A {\n    String smiles = \"\"\"\n        F/C=\\\n        C\\\\F\n        \"\"\";\n}\n",
			"F/C=\\", []string{"F", "/", "C", "=", "C", `\\`, "F"}},
		{"java crlf", KindJava,
			"class A {\r\n    String smiles = \"\"\"\r\n\tCCO\r\n\t  F/C=C/F title\r\n\t\"\"\";\r\n}\r\n",
			"F/C", []string{"F", "/", "C", "=", "C", "/", "F"}},
		{"java closing line", KindJava,
			"String smiles = \"\"\"\n      C[C@@H](O)CC\"\"\";\n",
			"C[C", []string{"C", "[", "C", "@", "@", "H", "]", "(", "O", ")", "C", "C"}},
		{"python f-string", KindPython,
			"line = f\"{cid}\\t{{x}}\\tF/C=C\\\\F\\n\"\n",
			"F/C", []string{"F", "/", "C", "=", "C", `\\`, "F"}},
		{"python joined f-string", KindPython,
			"x = \"C1CC\" f\"C1 {y}\"\n",
			"C1CC\"", []string{"C", "1", "C", "C", "C", "1"}},
		{"javascript template", KindJavaScript,
			"const a = `${id} F/C=C\\\\F ${b}`;\n",
			"F/C", []string{"F", "/", "C", "=", "C", `\\`, "F"}},
		{"kotlin template", KindKotlin,
			"val s = \"${'$'}x\\tF/C=C\\\\F $y\"\n",
			"F/C", []string{"F", "/", "C", "=", "C", `\\`, "F"}},
	}
	for _, tt := range tests {
		src := []byte(tt.src)
		var text strings.Builder
		for _, h := range tt.hosts {
			if h == `\\` {
				h = `\`
			}
			text.WriteString(h)
		}
		var o *Occurrence
		occs := FindKind(tt.kind, src, Config{})
		for i := range occs {
			if occs[i].Text == text.String() {
				o = &occs[i]
			}
		}
		if o == nil {
			t.Errorf("%s: no occurrence %q among %d", tt.name, text.String(), len(occs))
			continue
		}
		if want := strings.Index(tt.src, tt.anchor); o.Span.Start != want {
			t.Errorf("%s: occurrence starts at %d, want %d", tt.name, o.Span.Start, want)
		}
		prevEnd := o.Span.Start
		for i, want := range tt.hosts {
			s := o.HostSpan(notation.Span{Start: i, End: i + 1})
			if got := tt.src[s.Start:s.End]; got != want {
				t.Errorf("%s: notation byte %d is host %q, want %q", tt.name, i, got, want)
			}
			for h := prevEnd; h < s.Start; h++ {
				if n, ok := o.NotationOffset(h); ok {
					t.Errorf("%s: host byte %d %q between notation bytes maps to %d", tt.name, h, src[h], n)
				}
			}
			for h := s.Start; h < s.End; h++ {
				if n, ok := o.NotationOffset(h); !ok || n != i {
					t.Errorf("%s: host byte %d maps to %d, %v; want %d", tt.name, h, n, ok, i)
				}
			}
			prevEnd = s.End
		}
		if o.Span.End != prevEnd {
			t.Errorf("%s: occurrence ends at %d, want %d", tt.name, o.Span.End, prevEnd)
		}
	}
}

// TestTextBlockValue checks the text of Java text blocks against the
// worked examples of JEP 378 "Text Blocks" and The Java Language
// Specification 3.10.6 (from memory; OpenJDK 17 printed the same values
// for the html, delimiter, blank line, joined line and tab cases): the
// closing delimiter's line counts
// for the indentation, trailing blanks go before escapes are read (so
// "red  \s" keeps its two blanks), \<line end> joins lines. The finder
// keeps escapes the host would eat as written (\s stays two bytes, with a
// host-escape entry), so the expected texts show them so.
func TestTextBlockValue(t *testing.T) {
	tests := []struct {
		name, block, want string
	}{
		{"html", "\"\"\"\n" +
			"              <html>\n" +
			"                  <body>\n" +
			"                  </body>\n" +
			"              </html>\n" +
			"              \"\"\"",
			"<html>\n    <body>\n    </body>\n</html>\n"},
		{"closing delimiter left", "\"\"\"\n" +
			"        <p>\n" +
			"        </p>\n" +
			"    \"\"\"",
			"    <p>\n    </p>\n"},
		{"closing delimiter on the last line", "\"\"\"\n" +
			"        <p>\n" +
			"        </p>\"\"\"",
			"<p>\n</p>"},
		{"blank lines and trailing blanks", "\"\"\"\n" +
			"    a   \n" +
			"\n" +
			"        \n" +
			"      b\t\n" +
			"    \"\"\"",
			"a\n\n\n  b\n"},
		{"joined lines", "\"\"\"\n" +
			"    Lorem ipsum \\\n" +
			"    dolor\\\n" +
			"    \"\"\"",
			"Lorem ipsum dolor"},
		{"escaped spaces", "\"\"\"\n" +
			"    red  \\s\n" +
			"    green\\s\n" +
			"    \"\"\"",
			"red  \\s\ngreen\\s\n"},
		{"carriage returns", "\"\"\"\r\n  x\r\n   y\r\n  \"\"\"", "x\n y\n"},
		// A tab counts as one white space character like a blank.
		{"tabs", "\"\"\"\n" +
			"        \t x\n" +
			"        \t   y  \n" +
			"        \t \"\"\"",
			"x\n  y\n"},
	}
	for _, tt := range tests {
		src := []byte("String s = " + tt.block + ";\n")
		var lit *literal
		for _, tok := range java.lex(src, newPragmas(src)) {
			if tok.kind == tString {
				lit = tok.lit
			}
		}
		if lit == nil || lit.skip || !lit.pieces[0].block {
			t.Errorf("%s: no text block", tt.name)
			continue
		}
		d := &decoded{}
		d.piece(src, &lit.pieces[0], java.rules)
		if got := string(d.text); got != tt.want {
			t.Errorf("%s: text %q, want %q", tt.name, got, tt.want)
		}
	}
}

// TestFieldReading checks where replacement fields of f-strings end, with
// the fixed text left between them (a field shown as ⟨⟩). Cases from the
// Python language reference, "f-strings" (nested fields in format specs,
// conversions, '=' self-documenting fields; from memory), and PEP 701
// (quotes reused inside fields, backslashes and comments in expressions).
// For the cases it accepts, the ast module of CPython 3.11 gave the same
// constant parts, except where the finder keeps an escape as written
// (\N{...}) and for the text of a self-documenting field (x = ), which is
// counted with its field here.
func TestFieldReading(t *testing.T) {
	tests := []struct {
		src, want string
		skip      bool
	}{
		{`f"result: {value:{width}.{precision}} end"`, "result: ⟨⟩ end", false},
		{`f"{today:%B %d, %Y} F"`, "⟨⟩ F", false},
		{`f"{name!r:>10} {x = }"`, "⟨⟩ ⟨⟩", false},
		{`f"{{literal}} {x}"`, "{literal} ⟨⟩", false},
		{`f"{row["smiles"]} C"`, "⟨⟩ C", false},
		{`f"{x:'>10} C"`, "⟨⟩ C", false},
		{`f"{ {'a': '}'}['a'] } C"`, "⟨⟩ C", false},
		{`f"{(lambda v: v)(1)} C"`, "⟨⟩ C", false},
		{`f"{'\n'.join(a)} C"`, "⟨⟩ C", false},
		{`f"\N{DEGREE SIGN} {x}"`, `\N{DEGREE SIGN} ⟨⟩`, false},
		{`rf"\{x} C"`, `\⟨⟩ C`, false},
		{"f'''{x # a comment\n} C'''", "⟨⟩ C", false},
		{`t"{a} C"`, "⟨⟩ C", false},
		{`f"{x"`, "", true},
		{`f"{x:{y"`, "", true},
	}
	for _, tt := range tests {
		src := []byte("s = " + tt.src + "\nn = 1\n")
		toks := python.lex(src, newPragmas(src))
		var lit *literal
		for _, tok := range toks {
			if tok.kind == tString {
				lit = tok.lit
				break
			}
		}
		if lit == nil {
			t.Errorf("%s: no literal", tt.src)
			continue
		}
		if lit.skip != tt.skip {
			t.Errorf("%s: skip %v, want %v", tt.src, lit.skip, tt.skip)
		}
		// The rest of the file is still read: n is a name token.
		if last := toks[len(toks)-4]; string(src[last.span.Start:last.span.End]) != "n" {
			t.Errorf("%s: the lexer lost its place after the literal", tt.src)
		}
		if tt.skip {
			continue
		}
		d := &decoded{}
		d.piece(src, &lit.pieces[0], python.rules)
		if got := strings.ReplaceAll(string(d.text), "\x00", "⟨⟩"); got != tt.want {
			t.Errorf("%s: fixed text %q, want %q", tt.src, got, tt.want)
		}
	}
}

// TestFormatFields checks the fixed text left by the fields of format
// strings (a field shown as ⟨⟩): Python library reference, "Format String
// Syntax" and "printf-style String Formatting"; java.util.Formatter
// documentation, "Format String Syntax" (examples from memory).
func TestFormatFields(t *testing.T) {
	tests := []struct {
		style formatStyle
		text  string
		want  string
	}{
		{formatBraces, "{0}, {1}, {2} x", "⟨⟩, ⟨⟩, ⟨⟩ x"},
		{formatBraces, "{:<30} {0:{1}} {{F}}", "⟨⟩ ⟨⟩ {F}"},
		{formatBraces, "{name!r:^10} }", "⟨⟩ }"},
		{formatBraces, "a {b", "a ⟨⟩"},
		{formatPrintfPython, "%s %5.2f %-10d %(name)s %% %c", "⟨⟩ ⟨⟩ ⟨⟩ ⟨⟩ % ⟨⟩"},
		{formatPrintfPython, "%*d %.*f %ld 100%! % x", "⟨⟩ ⟨⟩ ⟨⟩ 100%! ⟨⟩"}, // "% x": a blank flag and x
		{formatPrintfJava, "%1$s %2$-10d %<s %,.2f %tY %n %%", "⟨⟩ ⟨⟩ ⟨⟩ ⟨⟩ ⟨⟩ \n %"},
		{formatPrintfJava, "%(,.2f %08X %b 5%", "⟨⟩ ⟨⟩ ⟨⟩ 5%"},
		// Go, package fmt documentation ("Printing", "Explicit
		// argument indexes").
		{formatPrintfGo, "%v %+v %#x %q %T %[2]d %[1]*d %6.2f %% %w", "⟨⟩ ⟨⟩ ⟨⟩ ⟨⟩ ⟨⟩ ⟨⟩ ⟨⟩ ⟨⟩ % ⟨⟩"},
		// Rust, std::fmt documentation: {} {0} {name} {:>8} {:#?}.
		{formatBraces, "{} {0} {name} {:>8} {:#?} {{}}", "⟨⟩ ⟨⟩ ⟨⟩ ⟨⟩ ⟨⟩ {}"},
	}
	for _, tt := range tests {
		text, m := collapseFields([]byte(tt.text), identityMap(10, len(tt.text)), tt.style)
		if got := strings.ReplaceAll(string(text), "\x00", "⟨⟩"); got != tt.want {
			t.Errorf("%q: fixed text %q, want %q", tt.text, got, tt.want)
		}
		if m.hostStart() != 10 || m.hostEnd() != 10+len(tt.text) {
			t.Errorf("%q: map covers %d-%d, want 10-%d", tt.text, m.hostStart(), m.hostEnd(), 10+len(tt.text))
		}
	}
}

package find

import (
	"testing"

	"stereoline/notation"
)

// TestEscapeMessages checks what each message says the host reads. The
// readings come from the language references: Python Language Reference
// "Escape sequences"; ECMA-262 "String Literals" (and Annex B legacy
// octal); Go specification "Rune literals"; The Rust Reference "Quote
// escapes", "ASCII escapes", "Unicode escapes"; RFC 8259 section 7;
// YAML 1.2.2 section 5.7. Values of characters from the Unicode code
// charts (U+0041 LATIN CAPITAL LETTER A, U+00E9 LATIN SMALL LETTER E WITH
// ACUTE).
func TestEscapeMessages(t *testing.T) {
	tests := []struct {
		kind Kind
		src  string
		sev  notation.Severity
		msg  string
	}{
		{KindPython, `smiles = "C1CC\1"`, notation.SeverityError,
			`python reads '\1' as the control character U+0001; write a raw string r"..." or double the backslash`},
		{KindPython, `smiles = "CC\101"`, notation.SeverityError,
			`python reads '\101' as 'A' (U+0041); write a raw string r"..." or double the backslash`},
		{KindPython, `smiles = "CC\x41"`, notation.SeverityError,
			`python reads '\x41' as 'A' (U+0041); write a raw string r"..." or double the backslash`},
		{KindPython, `smiles = "CC\u00e9"`, notation.SeverityError,
			`python reads '\u00e9' as 'é' (U+00E9); write a raw string r"..." or double the backslash`},
		{KindPython, `x = "CC\N{DASH}"  # stereoline: notation`, notation.SeverityError,
			`python reads '\N{DASH}' as a named character; write a raw string r"..." or double the backslash`},
		{KindPython, `smiles = "C\N"`, notation.SeverityError,
			`python rejects '\N' without a {name}, so the file does not compile; write a raw string r"..." or double the backslash`},
		{KindPython, `smiles = "C\tC"`, notation.SeverityError,
			`python reads '\t' as a tab (U+0009); write a raw string r"..." or double the backslash`},
		{KindPython, `smiles = "F/C=C\C"`, notation.SeverityWarning,
			`python keeps '\C' but warns that it is an invalid escape sequence; write a raw string r"..." or double the backslash`},
		{KindJavaScript, `smiles = "C\/C=C/C"`, notation.SeverityError,
			"javascript reads '\\/' as '/': the backslash is dropped; write String.raw`...` or double the backslash"},
		{KindJavaScript, `smiles = "C\1"`, notation.SeverityError,
			"javascript reads '\\1' as the control character U+0001; write String.raw`...` or double the backslash"},
		{KindJavaScript, `smiles = "C\u0041"`, notation.SeverityError,
			"javascript reads '\\u0041' as 'A' (U+0041); write String.raw`...` or double the backslash"},
		{KindJavaScript, `smiles = "C\a"`, notation.SeverityError,
			"javascript reads '\\a' as 'a': the backslash is dropped; write String.raw`...` or double the backslash"},
		{KindGo, `var smiles = "C\1C"`, notation.SeverityError,
			"go rejects '\\1': an octal escape needs 3 digits, so the file does not compile; write a raw string `...` or double the backslash"},
		{KindGo, `var smiles = "C\101"`, notation.SeverityError,
			"go reads '\\101' as 'A' (U+0041); write a raw string `...` or double the backslash"},
		{KindGo, `var smiles = "F/C=C\C"`, notation.SeverityError,
			"go rejects the unknown escape '\\C', so the file does not compile; write a raw string `...` or double the backslash"},
		{KindRust, `let smiles = "C\0";`, notation.SeverityError,
			`rust reads '\0' as the null character (U+0000); write a raw string r"..." or double the backslash`},
		{KindJSON, `{"smiles": "C\tC"}`, notation.SeverityError,
			`json reads '\t' as a tab (U+0009); double the backslash`},
		{KindYAML, `smiles: "C\eC"`, notation.SeverityError,
			`yaml reads '\e' as an escape character (U+001B); double the backslash`},
	}
	for _, tt := range tests {
		occs := FindKind(tt.kind, []byte(tt.src), Config{})
		if len(occs) != 1 || len(occs[0].Diagnostics) != 1 {
			t.Errorf("%s %s: %d occurrences, want 1 with one diagnostic", tt.kind, tt.src, len(occs))
			continue
		}
		e := occs[0].Diagnostics[0]
		if e.Msg != tt.msg || e.Severity != tt.sev || e.Code != CodeHostEscape {
			t.Errorf("%s %s:\n got %s %q\nwant %s %q", tt.kind, tt.src, e.Severity, e.Msg, tt.sev, tt.msg)
		}
	}
}

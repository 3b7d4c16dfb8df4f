package find

import "testing"

// TestEncode checks that text inserted by a rewrite reads back as the
// notation: Python (language reference, "String and Bytes literals"),
// JSON (RFC 8259 section 7) and a notebook cell, which is both.
func TestEncode(t *testing.T) {
	tests := []struct {
		name, src string
		want      string // Encode(`\`)
	}{
		{"a.py", `smiles = "F/C=CF"` + "\n", `\\`},
		{"a.py", `smiles = r"F/C=CF"` + "\n", `\`},
		{"a.smi", "F/C=CF x\n", `\`},
		{"a.json", `{"smiles": "F/C=CF"}`, `\\`},
		{"a.ipynb", `{"cells": [{"cell_type": "code", "source": ["smiles = \"F/C=CF\"\n"]}], "metadata": {}, "nbformat": 4, "nbformat_minor": 5}`, `\\\\`},
		{"a.ipynb", `{"cells": [{"cell_type": "code", "source": ["smiles = r\"F/C=CF\"\n"]}], "metadata": {}, "nbformat": 4, "nbformat_minor": 5}`, `\\`},
		// Text blocks (JLS 3.10.6) and the fixed text of templates
		// read escapes as their ordinary literals do.
		{"A.java", "String smiles = \"\"\"\n    F/C=CF\n    \"\"\";\n", `\\`},
		{"a.py", `line = f"{cid} F/C=C\\F"` + "\n", `\\`},
		{"a.py", `line = rf"{cid} F/C=C\F"` + "\n", `\`},
		{"a.js", "const s = `${id} F/C=C\\\\F`;\n", `\\`},
	}
	for _, tt := range tests {
		occs := Find(tt.name, []byte(tt.src), Config{})
		if len(occs) != 1 {
			t.Errorf("%s %q: %d occurrences, want 1", tt.name, tt.src, len(occs))
			continue
		}
		if got := occs[0].Encode(`\`); got != tt.want {
			t.Errorf("%s %q: Encode(`\\`) = %q, want %q", tt.name, tt.src, got, tt.want)
		}
	}
}

// TestEncodeDollar checks that a quadruple bond '$' inserted into a Kotlin
// or Julia string starts no template: Kotlin specification, "String
// literals" (\$ in escaped strings; ${'$'} in raw ones is common
// practice); Julia manual, "Strings" (\$ escapes interpolation; raw""
// does not interpolate).
func TestEncodeDollar(t *testing.T) {
	tests := []struct {
		name, src string
		want      string // Encode(`C$C\`)
	}{
		{"a.kt", `val smiles = "C1CCCCC1"` + "\n", `C\$C\\`},
		{"a.kt", `val smiles = """C1CCCCC1"""` + "\n", `C${'$'}C\`},
		{"a.kt", `val line = "$id C1CCCCC1"` + "\n", `C\$C\\`},
		{"a.jl", `smiles = "C1CCCCC1"` + "\n", `C\$C\\`},
		{"a.jl", `smiles = raw"C1CCCCC1"` + "\n", `C$C\`},
		{"a.py", `smiles = "C1CCCCC1"` + "\n", `C$C\\`},
	}
	for _, tt := range tests {
		occs := Find(tt.name, []byte(tt.src), Config{})
		if len(occs) != 1 {
			t.Errorf("%s %q: %d occurrences, want 1", tt.name, tt.src, len(occs))
			continue
		}
		if got := occs[0].Encode(`C$C\`); got != tt.want {
			t.Errorf("%s %q: Encode = %q, want %q", tt.name, tt.src, got, tt.want)
		}
	}
}

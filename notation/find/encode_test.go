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

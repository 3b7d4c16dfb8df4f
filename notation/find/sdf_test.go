package find

import (
	"strings"
	"testing"
)

// TestFindSDF checks the data items of SD files (CTfile formats: a
// molfile, data items "> <NAME>" with their values up to a blank line,
// "$$$$"): an item named as a structure column holds a record a line,
// titled by the record's ID item, else its molfile's name line; items of
// other names, placeholders and the molfile itself are not read; the
// records of one item share a field. The layout is common practice for
// vendor catalogues; the records are our own.
func TestFindSDF(t *testing.T) {
	mol := "\n     demo          2D\n\n  0  0  0  0  0  0  0  0  0  0999 V2000\nM  END\n"
	src := "AX-1" + mol + ">  <Compound ID>  (1)\nLOT-7\n\n>  <SMILES>\nC[C@H](F)Cl\n\n>  <MW>\n82.5\n\n$$$$\n" +
		"AX-2" + mol + "> <SMILES>\nN/A\n\n> <Canonical_SMILES>\nCC(F)Cl\n\n> <smarts_query>\n[#6;R]\n\n$$$$\n" +
		"AX-3" + mol + "> <Note>\nF/C=C/F\n\n> <SMILES>\nF/C=C/F\n"
	occs := FindKind(KindSDF, []byte(src), Config{})
	want := []struct {
		text, title, item string
		query             bool
	}{
		{"C[C@H](F)Cl", "LOT-7", "SMILES", false},
		{"CC(F)Cl", "AX-2", "Canonical_SMILES", false},
		{"[#6;R]", "AX-2", "smarts_query", true},
		{"F/C=C/F", "AX-3", "SMILES", false},
	}
	if len(occs) != len(want) {
		t.Fatalf("found %d records, want %d: %+v", len(occs), len(want), occs)
	}
	for i, w := range want {
		o := occs[i]
		if o.Text != w.text || o.Title != w.title || o.Field != FieldOfKey(w.item) || (o.Dialect == DialectSMARTS) != w.query {
			t.Errorf("record %d: %q titled %q, field %d, dialect %v; want %q titled %q under %q", i, o.Text, o.Title, o.Field, o.Dialect, w.text, w.title, w.item)
		}
		if got := src[o.Span.Start:o.Span.End]; got != o.Text {
			t.Errorf("record %d: span holds %q", i, got)
		}
	}
	if k := KindForName("catalogue.SDF"); k != KindSDF {
		t.Errorf("KindForName(catalogue.SDF) = %v", k)
	}
	// items without the blank line between them, and a value that is a
	// reaction without reactants
	loose := "AX-4" + mol + "> <SMILES>\nC[C@H](F)Cl\n> <rxn_smiles>\n>>C[C@H](F)Cl\n$$$$\n"
	var got []string
	for _, o := range FindKind(KindSDF, []byte(loose), Config{}) {
		got = append(got, o.Text)
	}
	if strings.Join(got, " ") != "C[C@H](F)Cl >>C[C@H](F)Cl" {
		t.Errorf("items without blank lines: %q", got)
	}
	// a file of molfiles alone holds no record
	if occs := FindKind(KindSDF, []byte(strings.Repeat("AX-9"+mol+"$$$$\n", 3)), Config{}); len(occs) != 0 {
		t.Errorf("molfiles alone: %d records", len(occs))
	}
}

package document

import (
	"strings"
	"testing"

	"stereoline/notation/smarts"
)

// Query patterns are read by the SMARTS reader: their grammar errors are
// reported with its codes at the host bytes, nothing of notation's
// checks is, and hover says what the pattern is and, for a reaction
// template, what it does to its mapped centres (the SN2 template inverts
// at map 2: Walden inversion, common practice).
func TestQueryPatterns(t *testing.T) {
	text := "patt = Chem.MolFromSmarts('[C;]')\n" +
		"rxn = AllChem.ReactionFromSmarts('[C:1][C@H:2](Br)[C:4]>>[C:1][C@@H:2](O)[C:4]')\n" +
		"alcohol = Chem.MolFromSmiles('C[C@H](O)CC')\n"
	res := analyze(t, "rules.py", text)
	if len(res.Queries) != 2 || len(res.Records) != 1 {
		t.Fatalf("queries %d, records %d; want 2 and 1", len(res.Queries), len(res.Records))
	}
	var codes []string
	for _, d := range res.Diagnostics() {
		codes = append(codes, string(d.Code))
		if d.Code == smarts.CodeSyntax {
			if got := text[d.Span.Start:d.Span.End]; got != ";" && got != "]" {
				t.Errorf("%s at %q, want at the ';' or ']'", d.Code, got)
			}
		}
	}
	if !strings.Contains(strings.Join(codes, " "), string(smarts.CodeSyntax)) {
		t.Errorf("no %s for [C;]: %v", smarts.CodeSyntax, codes)
	}
	for _, c := range codes {
		if !strings.HasPrefix(c, "smarts-") && !strings.HasPrefix(c, "stereo-") {
			t.Errorf("unexpected code %s on query patterns", c)
		}
	}
	md, _, ok := res.Hover(strings.Index(text, "[C@@H:2]") + 2)
	if !ok {
		t.Fatal("no hover on the template")
	}
	for _, want := range []string{"Reaction query pattern", "map 2: the template **inverts**", "notation as written"} {
		if !strings.Contains(md, want) {
			t.Errorf("hover lacks %q:\n%s", want, md)
		}
	}
	syms := res.Symbols()
	if len(syms) != 3 || !syms[0].Query || !syms[1].Query || syms[2].Query || syms[2].Name != "C[C@H](O)CC" {
		t.Errorf("outline of a code file = %+v, want two patterns then the record, in host order", syms)
	}
}

// The layouts setting fixes the layout of the lists its pattern names;
// a specification it cannot read is refused by Validate.
func TestLayoutsSetting(t *testing.T) {
	cfg := DefaultConfig()
	cfg.Layouts = map[string]string{"*.smi": "field=2 sep=semicolon title=1"}
	res := NewAnalyzer(cfg).Analyze("shelf.smi", "", []byte("ethanol;CCO\nacetone;CC(C)=O\n"))
	if len(res.Records) != 2 || res.Records[0].Occ.Text != "CCO" || res.Records[1].Occ.Title != "acetone" {
		t.Errorf("records read by the layout setting: %d", len(res.Records))
	}
	bad := DefaultConfig()
	bad.Layouts = map[string]string{"*.smi": "column=2"}
	if err := bad.Validate(); err == nil || !strings.Contains(err.Error(), "column=2") {
		t.Errorf("Validate of a bad layout: %v", err)
	}
}

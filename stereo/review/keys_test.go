package review

import (
	"strings"
	"testing"

	"stereoline/stereo/document"
)

// TestBoundName: the name a literal is bound to, marked in the source
// by «» around the literal's content. Assignment and dictionary syntax
// of Python, JavaScript, Go and Kotlin (common practice).
func TestBoundName(t *testing.T) {
	tests := []struct{ src, want string }{
		{`alanine = "«N[C@@H](C)C(=O)O»"`, "alanine"},
		{`alanine = r"«N[C@@H](C)C(=O)O»"`, "alanine"},
		{`x: str = '«CCO»'`, "x"},
		{`self.smiles = """«CCO»"""`, "self.smiles"},
		{`blocks["LRK-BB-001"] = "«CCO»"`, `blocks["LRK-BB-001"]`},
		{`{"LRK-BB-001": "«CCO»", "LRK-BB-002": "CCN"}`, "LRK-BB-001"},
		{`const butene = "«C/C=C/C»";`, "butene"},
		{`butene := "«C/C=C/C»"`, "butene"},
		{`val butene = "«C/C=C/C»"`, "butene"},
		{`  key: "«CCO»",`, "key"},
		{`Chem.MolFromSmiles("«CCO»")`, ""},
		{`if smi == "«CCO»":`, ""},
		{`total += "«CCO»"`, ""},
		{`["«CCO»", "CCN"]`, ""},
		{`f(x="«CCO»")`, "x"},
	}
	for _, tc := range tests {
		off := strings.Index(tc.src, "«")
		src := strings.Replace(strings.Replace(tc.src, "«", "", 1), "»", "", 1)
		if got := boundName([]byte(src), off); got != tc.want {
			t.Errorf("%s: %q, want %q", tc.src, got, tc.want)
		}
	}
}

// TestHostKeys: each host's identity for its records; keys that repeat
// are dropped.
func TestHostKeys(t *testing.T) {
	a := document.NewAnalyzer(document.DefaultConfig())
	tests := []struct {
		name, content, keyField string
		want                    []string
	}{
		{"blocks.smi", "CCO LRK-BB-001\nCCN LRK-BB-002\nCCC LRK-BB-001\nC=C\n", "", []string{"", "LRK-BB-002", "", ""}},
		{"blocks.smi", "CCO\tLRK-1\tlot 7\nCCN\tLRK-2\tlot 8\n", "3", []string{"lot 7", "lot 8"}},
		{"plates.csv", "id,reactant_smiles,product_smiles\nLRK-1,CCO,CC=O\nLRK-2,CCN,CC=N\n", "", []string{"LRK-1\x00reactant_smiles", "LRK-1\x00product_smiles", "LRK-2\x00reactant_smiles", "LRK-2\x00product_smiles"}},
		{"plates.csv", "id,smiles,lot\nLRK-1,CCO,A7\n\"LRK-2\",\"CCN\",B8\n", "lot", []string{"A7\x00smiles", "B8\x00smiles"}},
		{"plates.tsv", "name\tsmiles\nethanol\tCCO\nethylamine\tCCN\n", "", []string{"ethanol\x00smiles", "ethylamine\x00smiles"}},
		{"lots.json", `{"LRK-1": {"smiles": "CCO"}, "LRK-2": {"smiles": "CCN"}}`, "", []string{"\x00LRK-1\x00smiles", "\x00LRK-2\x00smiles"}},
		{"lots.json", `{"blocks": [{"smiles": "CCO", "id": "LRK-1"}, {"id": 7, "smiles": "CCN"}, {"smiles": "CCC"}]}`, "",
			[]string{"\x00blocks\x00[LRK-1]\x00smiles", "\x00blocks\x00[7]\x00smiles", ""}},
		{"lots.json", `{"blocks": [{"smiles": "CCO", "lot": "A"}, {"lot": "B", "smiles": "CCN"}]}`, "lot",
			[]string{"\x00blocks\x00[A]\x00smiles", "\x00blocks\x00[B]\x00smiles"}},
		{"enumerate.py", "alanine = \"N[C@@H](C)C(=O)O\"\nsmi = \"CCO\"\nsmi = \"CCN\"\n", "", []string{"alanine", "", ""}},
	}
	for _, tc := range tests {
		kind, occs := a.Occurrences(tc.name, "", []byte(tc.content))
		got := hostKeys(kind, []byte(tc.content), occs, tc.keyField)
		if strings.Join(got, "|") != strings.Join(tc.want, "|") {
			t.Errorf("%s %q: keys %q, want %q", tc.name, tc.content, got, tc.want)
		}
	}
}

// TestJSONIndexMalformed: a broken JSON document gives paths for what
// came before the fault and no panic.
func TestJSONIndexMalformed(t *testing.T) {
	for _, src := range []string{`{"a": "CCO", "b": `, `[[[[`, `{"a" "CCO"}`, `"CCO`, strings.Repeat("[", 10000)} {
		x := newJSONIndex([]byte(src), "")
		_ = x.path(3)
	}
	x := newJSONIndex([]byte(`{"a": "CCO", "b": `), "")
	if got := x.path(7); got != "\x00a" {
		t.Errorf("path %q", got)
	}
}

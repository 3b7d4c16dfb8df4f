package find

import (
	"reflect"
	"testing"
)

// TestCodeRules is a table of small sources and the notation texts the
// rules must take from them, in order. Molecules are OpenSMILES examples;
// the language syntax is each language's reference.
func TestCodeRules(t *testing.T) {
	tests := []struct {
		kind Kind
		src  string
		want []string
	}{
		{KindPython, `if smiles == "CCO": pass`, []string{"CCO"}},
		{KindPython, `def f(smiles: str = "CCO"): pass`, []string{"CCO"}},
		{KindPython, "smiles_list = []\nsmiles_list.append(\"CCN\")\n", []string{"CCN"}},
		{KindPython, `mols = {"a": "CCO"}`, nil},
		{KindPython, `SMILES = {"ethanol": "CCO", "name": "x"}`, []string{"CCO"}},
		{KindPython, `smiles = open("input.smi").read()`, nil},
		{KindPython, `smiles = ""`, nil},
		{KindPython, `smiles = "see table 2"`, nil},
		{KindPython, "SMILES = \"\"\"\nCCO ethanol\n\"\"\"", []string{"CCO"}},
		{KindPython, `rxn = "CC>>CO" if x else "CC>>CN"`, []string{"CC>>CO", "CC>>CN"}},
		{KindPython, "smiles = (\n    \"F/C=C\"\n    \"/F\"\n)\n", []string{"F/C=C/F"}},
		{KindPython, `df["smiles"] = "CCO"`, []string{"CCO"}},
		{KindPython, `x = dict(smiles="CCO", label="CO")`, []string{"CCO"}},
		{KindPython, `parse_smiles("CCO", sanitize="CO")`, []string{"CCO"}},
		{KindPython, `print("F/C=C/F")`, []string{"F/C=C/F"}},
		{KindPython, `print("CO")`, nil},
		{KindPython, `rxn = AllChem.ReactionFromSmarts("[C:1](=[O:2])-[OD1].[N!H0:3]>>[C:1](=[O:2])[N:3]")`, nil},
		{KindPython, `reaction_smarts = "[C:1]=[O:2]>>[C:1][O:2]"`, nil},
		{KindPython, `patt = Chem.MolFromSmarts("[#6]-[#8]")`, nil},
		{KindPython, `rxn = AllChem.ReactionFromSmarts("[C:1]=[C:2]>>[C:1][C:2]")`, nil},
		{KindPython, `patt_smarts = "[C:1]=[C:2]"`, nil},
		{KindPython, `reaction = AllChem.ReactionFromSmiles("C=CC>>CCC")`, []string{"C=CC>>CCC"}},
		{KindPython, `inchi = "InChI=1S/C2H6O/c1-2-3/h3H,2H2,1H3"`, nil},
		{KindPython, `smiles = f"{a}CC"`, nil},
		{KindPython, `smiles = rb"CC"`, nil},
		{KindPython, "x = 1 \\\n  ; smiles = 'CCO'", []string{"CCO"}},
		{KindJavaScript, `const { smiles = "CCO" } = opts;`, []string{"CCO"}},
		{KindJavaScript, `items.push({ smiles: "CCO", id: "CO" });`, []string{"CCO"}},
		{KindJavaScript, `const smiles: string[] = ["CCO", "CCN"];`, []string{"CCO", "CCN"}},
		{KindJavaScript, "x = a / b; y = 'F/C=C/F' // 'C1CC1'", []string{"F/C=C/F"}},
		{KindGo, "var m = map[string]string{\"smiles\": \"CCO\", \"name\": \"x\"}", []string{"CCO"}},
		{KindGo, "smiles := []string{\n\t\"CCO\",\n\t\"CCN\",\n}\n", []string{"CCO", "CCN"}},
		{KindR, `df$smiles <- c("CCO", "CCN")`, []string{"CCO", "CCN"}},
		{KindJulia, `smiles = ["CCO", "CCN"]`, []string{"CCO", "CCN"}},
		{KindRust, `let v = vec!["CCO"]; let smiles = vec!["CCN"];`, []string{"CCN"}},
		{KindKotlin, `val smiles = mutableListOf("CCO")`, []string{"CCO"}},
		{KindGo, "var smiles = `CCO\r\nCCN`", []string{"CCO", "CCN"}},
		{KindYAML, "query_smarts: C1CCCCC1\nother: C1CCCCC1\n", []string{"C1CCCCC1"}},
		{KindJSON, `{"query_smarts": "C1CCCCC1", "other": "C1CCCCC1"}`, []string{"C1CCCCC1"}},
		{KindList, "\ufeffF/C=C/F trans\r\nCCO\r\n\r\n", []string{"F/C=C/F", "CCO"}},
		{KindCSV, "\ufeffSMILES;Name\r\nCCO;ethanol\r\n", []string{"CCO"}},
		{KindTSV, "name\tsmiles\tnote\nethanol\tCCO\tx\n", []string{"CCO"}},
	}
	for _, tt := range tests {
		var got []string
		for _, o := range FindKind(tt.kind, []byte(tt.src), Config{}) {
			got = append(got, o.Text)
		}
		if !reflect.DeepEqual(got, tt.want) {
			t.Errorf("%s %q: got %q, want %q", tt.kind, tt.src, got, tt.want)
		}
	}
}

package find

import (
	"slices"
	"strings"
	"testing"
)

// TestTableColumnVetting checks that a column chosen by its header's
// name is given up when its cells are mostly not notation at all, while
// a column of records keeps its broken ones. The shape of the first
// table is that of a filter report (a structure column, then a column
// of filter names and "no match"; rdkit-data ships one, common practice
// in screening decks); its names and molecules are our own.
func TestTableColumnVetting(t *testing.T) {
	rows := func(header string, n int, row func(i int) string) string {
		var b strings.Builder
		b.WriteString(header + "\n")
		for i := range n {
			b.WriteString(row(i) + "\n")
		}
		return b.String()
	}
	mols := []string{"C[C@H](N)C(=O)O", "F/C=C/F", "OC[C@@H](O)C=O", "c1ccccc1O", "CC(=O)Oc1ccccc1C(=O)O"}
	tests := []struct {
		name    string
		src     string
		columns []string
		want    []string
	}{
		{"filter report", rows("id,smiles,SubstructureMatches,score", 10, func(i int) string {
			m := "no match"
			if i%3 == 0 {
				m = "deck_2024_aromatic_halogen_min(2) | deck_2024_long_chain_min(1)"
			}
			return strings.Join([]string{"k" + string(rune('0'+i)), mols[i%5], m, "0.25"}, ",")
		}), nil, []string{mols[0], mols[1], mols[2], mols[3], mols[4], mols[0], mols[1], mols[2], mols[3], mols[4]}},
		{"reaction conditions", rows("reaction_smiles,reaction_conditions", 5, func(i int) string {
			return "CC(=O)O.OCC>>CC(=O)OCC,\"THF, 0 °C, " + string(rune('1'+i)) + " h\""
		}), nil, []string{"CC(=O)O.OCC>>CC(=O)OCC", "CC(=O)O.OCC>>CC(=O)OCC", "CC(=O)O.OCC>>CC(=O)OCC", "CC(=O)O.OCC>>CC(=O)OCC", "CC(=O)O.OCC>>CC(=O)OCC"}},
		// broken records in a column of records are still records
		{"broken records kept", rows("smiles", 6, func(i int) string {
			if i < 2 {
				return "CC O"
			}
			return mols[i%5]
		}), nil, []string{"CC O", "CC O", mols[2], mols[3], mols[4], mols[0]}},
		// too few cells to judge: kept
		{"few cells", rows("structure,x", 3, func(i int) string { return "see notes,1" }), nil,
			[]string{"see notes", "see notes", "see notes"}},
		// a column the configuration names is never given up
		{"configured", rows("compound,x", 5, func(i int) string { return "no entry,1" }), []string{"compound"},
			[]string{"no entry", "no entry", "no entry", "no entry", "no entry"}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			var got []string
			for _, o := range FindKind(KindCSV, []byte(tt.src), Config{Columns: tt.columns}) {
				got = append(got, o.Text)
			}
			if !slices.Equal(got, tt.want) {
				t.Errorf("found %q, want %q", got, tt.want)
			}
		})
	}
}

// TestTableTitleColumn checks which column gives a table's records their
// titles, for headers as common dataset exports write them (from
// memory: ChEMBL's activity export names molecule_chembl_id beside
// assay_chembl_id and canonical_smiles; PubChem's property tables CID
// and IsomericSMILES; ZINC zinc_id): a name before the subject, the
// subject before an identifier of the compound, that before any other
// identifier; a structure column is never the title.
func TestTableTitleColumn(t *testing.T) {
	tests := []struct {
		table string
		want  string
	}{
		{"assay_chembl_id,molecule_chembl_id,canonical_smiles\nCHEMBL900,CHEMBL25,C[C@H](N)C(=O)O\n", "CHEMBL25"},
		{"molecule_chembl_id,pref_name,canonical_smiles\nCHEMBL25,ALANINE,C[C@H](N)C(=O)O\n", "ALANINE"},
		{"CID,IsomericSMILES\n5950,C[C@H](N)C(=O)O\n", "5950"},
		{"zinc_id,smiles\nZINC01,C[C@H](N)C(=O)O\n", "ZINC01"},
		{"Compound ID,SMILES,Molecule Name\nK-1,C[C@H](N)C(=O)O,L-alanine\n", "L-alanine"},
		{"smiles,target_id\nC[C@H](N)C(=O)O,T7\n", "T7"},
		{"iupac_name,smiles\n(2S)-2-aminopropanoic acid,C[C@H](N)C(=O)O\n", "(2S)-2-aminopropanoic acid"},
		// no column names the row
		{"smiles,value\nC[C@H](N)C(=O)O,3\n", ""},
		// an identifier of another thing still names the row
		{"smiles_id,smiles\nS-9,CCO\n", "S-9"},
		// a structure column is no title, whatever it is called (the
		// configuration makes "compound" one here)
		{"compound,id\nC[C@H](N)C(=O)O,A-1\n", "A-1"},
	}
	for _, tt := range tests {
		occs := FindKind(KindCSV, []byte(tt.table), Config{Columns: []string{"compound"}})
		if len(occs) == 0 {
			t.Errorf("%q: no record", tt.table)
			continue
		}
		if got := occs[len(occs)-1].Title; got != tt.want {
			t.Errorf("%q: title %q, want %q", tt.table, got, tt.want)
		}
	}
}

package stereo

import (
	"testing"

	"stereoline/notation"
)

// Textbook structures, from memory; each checked against the Fischer
// convention (common practice: L-amino acids and D-sugars are the natural
// series; L-cysteine is (R) although L, which is why D/L is read from the
// geometry and not from R/S).
func TestFamilies(t *testing.T) {
	tests := []struct {
		name   string
		smiles string
		atom   int // 1-based reference carbon
		kind   FamilyKind
		want   Family
	}{
		{"L-alanine", "N[C@@H](C)C(=O)O", 2, FamilyAminoAcid, FamilyL},
		{"D-alanine", "N[C@H](C)C(=O)O", 2, FamilyAminoAcid, FamilyD},
		{"L-alanine written from the carboxyl", "OC(=O)[C@H](C)N", 4, FamilyAminoAcid, FamilyL},
		{"L-alanine zwitterion", "[NH3+][C@@H](C)C(=O)[O-]", 2, FamilyAminoAcid, FamilyL},
		{"L-cysteine, (R)", "N[C@@H](CS)C(=O)O", 2, FamilyAminoAcid, FamilyL},
		{"L-serine", "N[C@@H](CO)C(=O)O", 2, FamilyAminoAcid, FamilyL},
		{"L-proline", "OC(=O)[C@@H]1CCCN1", 4, FamilyAminoAcid, FamilyL},
		{"L-phenylalanine methyl ester", "COC(=O)[C@@H](N)Cc1ccccc1", 5, FamilyAminoAcid, FamilyL},
		{"D-glyceraldehyde, (R)", "OC[C@@H](O)C=O", 3, FamilySugar, FamilyD},
		{"L-glyceraldehyde, (S)", "OC[C@H](O)C=O", 3, FamilySugar, FamilyL},
		{"D-glucose, open chain", "OC[C@@H](O)[C@@H](O)[C@H](O)[C@@H](O)C=O", 3, FamilySugar, FamilyD},
		{"L-glucose, open chain", "OC[C@H](O)[C@H](O)[C@@H](O)[C@H](O)C=O", 3, FamilySugar, FamilyL},
		{"beta-D-glucopyranose", "OC[C@H]1O[C@@H](O)[C@H](O)[C@@H](O)[C@@H]1O", 3, FamilySugar, FamilyD},
		{"D-fructose, open chain", "OC[C@@H](O)[C@@H](O)[C@H](O)C(=O)CO", 3, FamilySugar, FamilyD},
	}
	for _, tt := range tests {
		m := notation.Read(tt.smiles)
		if len(m.Errors) > 0 {
			t.Fatalf("%s: %v", tt.name, m.Errors)
		}
		var got *FamilyLabel
		for _, f := range Families(m) {
			if f.Atom == tt.atom-1 {
				f := f
				got = &f
			}
		}
		if got == nil {
			t.Errorf("%s %s: no family label at atom %d (got %v)", tt.name, tt.smiles, tt.atom, Families(m))
			continue
		}
		if got.Kind != tt.kind || got.Family != tt.want {
			t.Errorf("%s %s: %v %v, want %v %v", tt.name, tt.smiles, got.Kind, got.Family, tt.kind, tt.want)
		}
	}
	// Glycine has no reference carbon; nor does an unmarked alanine.
	for _, s := range []string{"NCC(=O)O", "NC(C)C(=O)O", "C[C@H](O)CC"} {
		if f := Families(notation.Read(s)); len(f) != 0 {
			t.Errorf("%s: family labels %v, want none", s, f)
		}
	}
}

func TestPermutationSign(t *testing.T) {
	tests := []struct {
		have, want []int
		sign       int
	}{
		{[]int{1, 2, 3, 4}, []int{1, 2, 3, 4}, 1},
		{[]int{1, 2, 3, 4}, []int{2, 1, 3, 4}, -1},
		{[]int{1, 2, 3, 4}, []int{1, 3, 4, 2}, 1},
		{[]int{1, 2, 3, 4}, []int{4, 3, 2, 1}, 1},
	}
	for _, tt := range tests {
		if s, ok := permutationSign(tt.have, tt.want); !ok || s != tt.sign {
			t.Errorf("permutationSign(%v, %v) = %d, want %d", tt.have, tt.want, s, tt.sign)
		}
	}
}

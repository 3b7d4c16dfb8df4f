package identity

import (
	"testing"

	"stereoline/notation"
)

// Relations between two structures; the chemistry is textbook (common
// practice).
func TestCompare(t *testing.T) {
	tests := []struct {
		a, b      string
		want      Relation
		differing int // number of differing units named, -1 to skip
	}{
		{"N[C@@H](C)C(=O)O", "OC(=O)[C@@H](N)C", Identical, 0},                              // L-alanine twice
		{"N[C@@H](C)C(=O)O", "N[C@H](C)C(=O)O", Enantiomers, 0},                             // L- and D-alanine
		{"OC(=O)[C@H](O)[C@@H](O)C(=O)O", "OC(=O)[C@H](O)[C@H](O)C(=O)O", Diastereomers, 1}, // (R,R) and meso tartaric acid
		{"F/C=C/F", "F/C=C\\F", Diastereomers, 1},                                           // E/Z isomers are diastereomers
		{"C[C@H](O)[C@@H](Cl)C", "C[C@H](O)[C@H](Cl)C", Diastereomers, 1},                   // epimers of 3-chlorobutan-2-ol
		{"C[C@H](O)CC", "CC(O)CC", Unspecified, 1},                                          // one side leaves the centre unmarked
		{"CCCO", "CC(C)O", ConstitutionalIsomers, 0},                                        // propan-1-ol and propan-2-ol, C3H8O
		{"CCO", "CCN", Different, 0},
	}
	for _, tc := range tests {
		got := Compare(notation.Read(tc.a), notation.Read(tc.b))
		if got.Relation != tc.want {
			t.Errorf("%s vs %s: %v, want %v", tc.a, tc.b, got.Relation, tc.want)
		}
		if tc.differing >= 0 && len(got.Differing) != tc.differing {
			t.Errorf("%s vs %s: %d differing units %+v, want %d", tc.a, tc.b, len(got.Differing), got.Differing, tc.differing)
		}
	}
}

// TestCompareNamesTheEpimerCentre: the epimers of 3-chlorobutan-2-ol
// differ at the chlorine-bearing carbon (atom 4, 0-based 3), written the
// same way otherwise.
func TestCompareNamesTheEpimerCentre(t *testing.T) {
	got := Compare(notation.Read("C[C@H](O)[C@@H](Cl)C"), notation.Read("C[C@H](O)[C@H](Cl)C"))
	if len(got.Differing) != 1 || len(got.Differing[0].Atoms) != 1 || got.Differing[0].Atoms[0] != 3 {
		t.Fatalf("differing %+v, want the centre at atom 3", got.Differing)
	}
}

// TestIndex: duplicates, mirror images and stereoisomers of earlier
// records in one pass.
func TestIndex(t *testing.T) {
	records := []struct {
		smiles  string
		want    Relation
		earlier int
	}{
		{"N[C@@H](C)C(=O)O", Different, -1},
		{"CCO", Different, -1},
		{"OC(=O)[C@@H](N)C", Identical, 0}, // the same L-alanine
		{"N[C@H](C)C(=O)O", Enantiomers, 0},
		{"OCC", Identical, 1},
		{"C[C@H](O)[C@@H](Cl)C", Different, -1},
		{"C[C@H](O)[C@H](Cl)C", Diastereomers, 5},
		{"CC(O)C(Cl)C", Unspecified, 5},
	}
	x := NewIndex()
	for i, r := range records {
		m := x.Add(Identify(notation.Read(r.smiles)))
		if m.Relation != r.want || m.Earlier != r.earlier {
			t.Errorf("record %d %s: %v of %d, want %v of %d", i, r.smiles, m.Relation, m.Earlier, r.want, r.earlier)
		}
	}
	if x.Len() != len(records) {
		t.Errorf("Len %d, want %d", x.Len(), len(records))
	}
}

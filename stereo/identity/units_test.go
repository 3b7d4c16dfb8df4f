package identity

import (
	"slices"
	"testing"

	"stereoline/notation"
)

// TestCompareUnits: for mirror images CompareUnits names every inverted
// centre on both sides, in each writing's own numbering; for other
// relations it says what Compare says. L- and D-alanine are mirror
// images, and so are the (2R,3R) and (2S,3S) forms of tartaric acid
// (textbook, common practice); meso-tartaric acid is its own mirror image.
func TestCompareUnits(t *testing.T) {
	tests := []struct {
		a, b  string
		want  Relation
		atoms [][]int // per differing unit: its atoms in a
		other [][]int // and in b
	}{
		{"N[C@@H](C)C(=O)O", "OC(=O)[C@H](N)C", Enantiomers, [][]int{{1}}, [][]int{{3}}},
		{"OC(=O)[C@H](O)[C@@H](O)C(=O)O", "OC(=O)[C@@H](O)[C@H](O)C(=O)O", Enantiomers, [][]int{{3}, {5}}, [][]int{{3}, {5}}},
		// meso-tartaric acid is its own mirror image
		{"OC(=O)[C@H](O)[C@H](O)C(=O)O", "OC(=O)[C@@H](O)[C@@H](O)C(=O)O", Identical, nil, nil},
		{"C[C@H](O)[C@@H](Cl)C", "C[C@H](O)[C@H](Cl)C", Diastereomers, [][]int{{3}}, [][]int{{3}}},
		{"N[C@@H](C)C(=O)O", "OC(=O)[C@@H](N)C", Identical, nil, nil},
	}
	for _, tc := range tests {
		c := CompareUnits(notation.Read(tc.a), notation.Read(tc.b))
		if c.Relation != tc.want || c.Relation != Compare(notation.Read(tc.a), notation.Read(tc.b)).Relation {
			t.Errorf("%s vs %s: %v, want %v", tc.a, tc.b, c.Relation, tc.want)
		}
		var atoms, other [][]int
		for _, d := range c.Differing {
			atoms, other = append(atoms, d.Atoms), append(other, d.OtherAtoms)
		}
		eq := func(x, y [][]int) bool {
			return slices.EqualFunc(x, y, func(p, q []int) bool { return slices.Equal(p, q) })
		}
		if !eq(atoms, tc.atoms) || !eq(other, tc.other) {
			t.Errorf("%s vs %s: units %v / %v, want %v / %v", tc.a, tc.b, atoms, other, tc.atoms, tc.other)
		}
	}
}

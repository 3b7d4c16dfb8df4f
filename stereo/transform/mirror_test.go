package transform

import (
	"testing"

	"stereoline/notation"
)

// TestMirrorHigherClasses: the mirror image of an octahedral or
// trigonal-bipyramidal arrangement keeps the axis and turns the other way
// (OpenSMILES 3.9 tables: @OH1/@OH2, @OH3/@OH16, @TB1/@TB2); a square
// planar one is its own mirror image.
func TestMirrorHigherClasses(t *testing.T) {
	tests := []struct{ have, want string }{
		{"C[Co@OH1](F)(Cl)(Br)(I)S", "C[Co@OH2](F)(Cl)(Br)(I)S"},
		{"C[Co@OH3](F)(Cl)(Br)(I)S", "C[Co@OH16](F)(Cl)(Br)(I)S"},
		{"S[As@TB1](F)(Cl)(Br)N", "S[As@TB2](F)(Cl)(Br)N"},
		{"F[Pt@SP1](Cl)(Br)I", "F[Pt@SP1](Cl)(Br)I"},
	}
	for _, tt := range tests {
		m := notation.Read(tt.have)
		tr, err := Mirror(m)
		if err != nil {
			t.Fatalf("%s: %v", tt.have, err)
		}
		got, err := notation.ApplyEdits(tt.have, tr.Edits)
		if err != nil || got != tt.want {
			t.Errorf("Mirror(%s) = %s, %v; want %s", tt.have, got, err, tt.want)
			continue
		}
		tr2, _ := Mirror(notation.Read(got))
		if back, _ := notation.ApplyEdits(got, tr2.Edits); back != tt.have {
			t.Errorf("mirror twice of %s = %s", tt.have, back)
		}
	}
}

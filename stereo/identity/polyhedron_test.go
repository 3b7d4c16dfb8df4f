package identity

import (
	"math/rand/v2"
	"testing"

	"stereoline/notation"
)

// TestPolyhedronKeys: cisplatin and transplatin are different compounds
// (common practice); OpenSMILES 3.9 gives equivalent writings of one
// arrangement with other neighbour orders (@SP1 F[Pt](Cl)(Br)I is the
// same as @SP1 read from another start when the U shape is kept), and
// the mirror images of an octahedral centre with six different ligands
// differ.
func TestPolyhedronKeys(t *testing.T) {
	key := func(s string) Identity {
		m := notation.Read(s)
		if m.Errors.HasErrors() {
			t.Fatalf("%s: %v", s, m.Errors)
		}
		return Identify(m)
	}
	cis := key("N[Pt@SP1](N)(Cl)Cl")    // U: N, N, Cl, Cl round the square: cis
	trans := key("N[Pt@SP1](Cl)(N)Cl")  // U: N, Cl, N, Cl: trans
	cis2 := key("Cl[Pt@SP1](Cl)(N)N")   // written from a chloride, still cis
	trans2 := key("N[Pt@SP2](N)(Cl)Cl") // the 4 shape: N, Cl, N... across: trans
	if cis.Key == trans.Key {
		t.Errorf("cis and trans platin share a key")
	}
	if cis.Key != cis2.Key {
		t.Errorf("two writings of cisplatin differ")
	}
	if trans.Key != trans2.Key {
		t.Errorf("two writings of transplatin differ")
	}
	oh := key("C[Co@OH1](F)(Cl)(Br)(I)S")
	ohMirror := key("C[Co@OH2](F)(Cl)(Br)(I)S")
	if oh.Key == ohMirror.Key || oh.MirrorKey != ohMirror.Key || oh.Chirality != Chiral {
		t.Errorf("octahedral enantiomers: %+v %+v", oh, ohMirror)
	}
	// Written from the other end of the axis, the ring turns the other
	// way: @OH2 from S is @OH1 from C (OpenSMILES 3.9, @OH1 and @OH2
	// share the axis from the first to the last neighbour).
	if key("S[Co@OH2](F)(Cl)(Br)(I)C").Key != oh.Key {
		t.Errorf("the same octahedron written from the other end of its axis has another key")
	}
	// Random writings by the writer, which renumbers the marks for the
	// new neighbour order, keep the key.
	for _, s := range []string{"C[Co@OH7](F)(Cl)(Br)(I)S", "S[As@TB9](F)(Cl)(Br)N", "N[Pt@SP3](Cl)(N)Cl"} {
		want := key(s).Key
		rng := rand.New(rand.NewPCG(7, 11))
		for i := 0; i < 20; i++ {
			w := notation.Write(notation.Read(s), notation.WriteOptions{Random: rng})
			if got := key(w.Text).Key; got != want {
				t.Errorf("%s written as %s: key changed", s, w.Text)
			}
		}
	}
}

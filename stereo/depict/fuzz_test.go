package depict

import (
	"bytes"
	"encoding/json"
	"math"
	"testing"

	"stereoline/notation"
)

// FuzzDraw draws arbitrary text (without Draw's recovery, so a panic
// surfaces) and checks the drawing: finite coordinates, bonds between
// drawn atoms, and every writer succeeding. Corpus: testdata/fuzz/FuzzDraw.
//
//	go test -run '^$' -fuzz FuzzDraw ./stereo/depict/
func FuzzDraw(f *testing.F) {
	for _, s := range []string{
		"N[C@@H](C)C(=O)O", "C/C=C/C=C\\C", "CC=[C@]=CC", "C1CC2CCC1C2", "C1CCCCCCCCCCC1",
		"[CH3:1][C@H:2]([OH:3])CC>O>[CH3:1][C@@H:2]([OH:3])CC", "C1CC(C", "c1ccccc1.Cl",
		"OC[C@@H](O)[C@@H](O)[C@H](O)[C@@H](O)C=O", "C12C3C4C1C5C2C3C45", "[H][C@]([H])(F)Cl",
		"C/1CCCCCCCCC/C=C/1", "F/C=C/1CCCC1", "", ">>", "C..C",
	} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		if len(s) > 400 {
			return
		}
		m := notation.Read(s)
		d := drawUnguarded(m, Options{Title: "fuzz", Numbers: true})
		for _, a := range d.Atoms {
			if math.IsNaN(a.P.X) || math.IsNaN(a.P.Y) || math.IsInf(a.P.X, 0) || math.IsInf(a.P.Y, 0) {
				t.Fatalf("%q: atom %d at %v", s, a.N, a.P)
			}
		}
		for _, b := range d.Bonds {
			if b.A < 0 || b.B < 0 || b.A >= len(d.Atoms) || b.B >= len(d.Atoms) || b.A == b.B {
				t.Fatalf("%q: bond %d-%d of %d atoms", s, b.A, b.B, len(d.Atoms))
			}
		}
		var buf bytes.Buffer
		if err := WriteSVG(&buf, d); err != nil {
			t.Fatal(err)
		}
		if _, err := json.Marshal(d); err != nil {
			t.Fatal(err)
		}
		buf.Reset()
		if err := WriteMolfile(&buf, d); err != nil && len(d.Atoms) <= 999 {
			t.Fatal(err)
		}
		if fv, _ := FischerOf(m, nil); fv != nil {
			_ = fv.Drawing(Options{})
			_ = fv.MolfileDrawing(Options{})
		}
	})
}

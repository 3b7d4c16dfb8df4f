package notation

import (
	"testing"
)

// FuzzRead checks the reader's promises on any input: no panic, every span
// inside the text and well ordered, bonds that agree with the atoms'
// neighbour lists, and an error list bounded in size. The corpus lives in
// testdata/fuzz/FuzzRead.
func FuzzRead(f *testing.F) {
	for _, s := range []string{
		"N[C@@H](C)C(=O)O", "F/C=C/F", "c1ccccc1", "C1CC%10CC1%10", "[13CH3:7][C@TB12](F)(Cl)(Br)I",
		"CC(=O)O.OCC>[H+]>CC(=O)OCC.O", "c1cc[nH]c1", "C%(123)CC%(123)", "[Xx]", "C((C)", "\xff\x00",
		"F/C=C/1.C\\1", "NC(Br)=[C@]=C(O)C",
	} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		m := Read(s)
		checkMolecule(t, s, m)
	})
}

// checkMolecule verifies the structural invariants of a read molecule.
func checkMolecule(t *testing.T, s string, m *Molecule) {
	t.Helper()
	inText := func(sp Span) bool { return sp.Start >= 0 && sp.Start <= sp.End && sp.End <= len(s) }
	if len(m.Errors) > maxErrors+1 {
		t.Fatalf("%q: %d errors, more than the bound", s, len(m.Errors))
	}
	for _, e := range m.Errors {
		if !inText(e.Span) {
			t.Fatalf("%q: error span %v outside the text", s, e.Span)
		}
		for _, r := range e.Related {
			if !inText(r.Span) {
				t.Fatalf("%q: related span %v outside the text", s, r.Span)
			}
		}
	}
	for i := range m.Atoms {
		a := &m.Atoms[i]
		if !inText(a.Span) || (a.Chirality.Class != ChiralNone && !inText(a.Chirality.Span)) {
			t.Fatalf("%q: atom %d spans %v %v outside the text", s, i+1, a.Span, a.Chirality.Span)
		}
		for _, bi := range a.Bonds {
			if bi < 0 || bi >= len(m.Bonds) {
				t.Fatalf("%q: atom %d lists bond %d", s, i+1, bi)
			}
			b := &m.Bonds[bi]
			if b.Begin != i && b.End != i {
				t.Fatalf("%q: atom %d lists bond %d it is not part of", s, i+1, bi)
			}
		}
		if a.ImplicitH < 0 || a.BracketH < 0 {
			t.Fatalf("%q: atom %d negative hydrogens", s, i+1)
		}
	}
	for bi := range m.Bonds {
		b := &m.Bonds[bi]
		if b.Begin == b.End || b.Begin < 0 || b.End >= len(m.Atoms) {
			t.Fatalf("%q: bond %d joins %d and %d", s, bi, b.Begin, b.End)
		}
		if !inText(b.Span) || (b.Ring && !inText(b.CloseSpan)) {
			t.Fatalf("%q: bond %d spans outside the text", s, bi)
		}
		if b.Kekule < 1 || b.Kekule > 4 {
			t.Fatalf("%q: bond %d Kekulé order %d", s, bi, b.Kekule)
		}
	}
}

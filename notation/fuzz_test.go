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
		if !m.Errors.HasErrors() && CountAtoms(s) != len(m.Atoms) {
			t.Fatalf("%q: CountAtoms says %d atoms, Read finds %d", s, CountAtoms(s), len(m.Atoms))
		}
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

// FuzzExtension checks the extension block reader's promises on any
// block: no panic, spans inside the text and in order, references inside
// their fields, group atoms inside the record and in one group each, and
// a writing from another atom that reads back with the same groups. The
// corpus lives in testdata/fuzz/FuzzExtension.
func FuzzExtension(f *testing.F) {
	for _, s := range []string{
		"o1:1,3|", "a:1,&1:3|", "(1.5,1.29904,;0.75,0,;1.5,-1.29904,;-0.75,0,;-1.5,-1.29904,;-1.5,1.29904,),o1:1,3|",
		"$R1;;;;;$,$_AV:;;v;x;;$,atomProp:4.myprop.a,o1:1,3,,SgD:5:note:::::,Sg:n:5:n:ht:::|",
		"^1:0,LN:2:1.3.0.4,m:0:1.2,f:0.1,c:1,t:2,ctu:3,wU:1.0,wD:1.2,w:3.2,C:1.0,H:0.1,Z:0,r,lp:2:2,rb:0:*,s:0:2,u:1,@:1,@@:3,SgH:0:1|",
		"o1:1;3|", "o1:99999999999999999999|", "$a|b;$|", "o1:1", "(0,0,;1,0,|", "xyz:1,2,o1:0|", "&1:5,o2:1,1|",
	} {
		f.Add(s)
	}
	const notation = "C[C@H](O)[C@@H](C)Cl"
	f.Fuzz(func(t *testing.T, s string) {
		for _, text := range []string{s, notation + " |" + s} {
			m := Read(text)
			checkMolecule(t, text, m)
			checkExtension(t, text, m)
		}
	})
}

// checkExtension verifies the structural invariants of a block read.
func checkExtension(t *testing.T, s string, m *Molecule) {
	t.Helper()
	x := m.Extension
	if x == nil {
		return
	}
	if x.Separator.Start < 1 || x.Separator.End != x.Span.Start || x.Span.End > len(s) || s[x.Span.Start] != '|' {
		t.Fatalf("%q: block %v after separator %v", s, x.Span, x.Separator)
	}
	at := x.Span.Start + 1
	for i := range x.Fields {
		f := &x.Fields[i]
		if f.Span.Start < at || f.Span.End > x.Span.End || f.Span.End < f.Span.Start {
			t.Fatalf("%q: field %d at %v out of order or outside the block %v", s, i, f.Span, x.Span)
		}
		at = f.Span.End
		for _, r := range f.Refs {
			if r.Span.Start < f.Span.Start || r.Span.End > f.Span.End {
				t.Fatalf("%q: reference %v outside its field %v", s, r.Span, f.Span)
			}
		}
		for _, e := range f.Entries {
			if e.Start < f.Span.Start || e.End > f.Span.End {
				t.Fatalf("%q: entry %v outside its field %v", s, e, f.Span)
			}
		}
		if f.Group >= len(x.Groups) || f.Group >= 0 && x.Groups[f.Group].Field != i {
			t.Fatalf("%q: field %d names group %d", s, i, f.Group)
		}
	}
	seen := make(map[int]bool)
	for gi, g := range x.Groups {
		if len(g.Atoms) != len(g.AtomSpans) {
			t.Fatalf("%q: group %d has %d atoms and %d spans", s, gi, len(g.Atoms), len(g.AtomSpans))
		}
		for _, a := range g.Atoms {
			if a < 0 || a >= len(m.Atoms) || seen[a] {
				t.Fatalf("%q: group %d lists atom %d (of %d) or lists it again", s, gi, a, len(m.Atoms))
			}
			seen[a] = true
		}
	}
	if len(m.Atoms) == 0 {
		return
	}
	// A writing from the last atom reads back with the same groups.
	w := Write(m, WriteOptions{Start: len(m.Atoms) - 1})
	m2 := Read(w.Text)
	if m2.Extension == nil {
		if len(x.Groups) > 0 && len(w.DroppedFields) == 0 && x.Closed {
			t.Fatalf("%q: writing %q lost the block", s, w.Text)
		}
		return
	}
	back := make([]StereoGroup, len(m2.Extension.Groups))
	for i, g := range m2.Extension.Groups {
		back[i] = StereoGroup{Kind: g.Kind}
		for _, a := range g.Atoms {
			back[i].Atoms = append(back[i].Atoms, w.Order[a])
		}
	}
	var kept []StereoGroup
	for _, g := range x.Groups {
		if len(g.Atoms) > 0 {
			kept = append(kept, g)
		}
	}
	if groupsKey(back) != groupsKey(kept) && !hasExtensionError(m) {
		t.Fatalf("%q: writing %q has groups %s, want %s", s, w.Text, groupsKey(back), groupsKey(kept))
	}
}

func hasExtensionError(m *Molecule) bool {
	for _, e := range m.Errors {
		switch e.Code {
		case CodeExtensionUnclosed, CodeExtensionField, CodeExtensionIndex, CodeGroupOverlap:
			return true
		}
	}
	return false
}

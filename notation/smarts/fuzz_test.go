package smarts

import "testing"

// FuzzRead checks the reader's promises on any input: no panic, errors
// bounded, every span inside the text, every atom's bonds pointing at
// bonds of that atom, and template analysis without a panic.
func FuzzRead(f *testing.F) {
	for _, s := range []string{
		"[c;x2;D2;r5:1]([n;x2;r5:2])[n;x2;r5:3]",
		"[C:1]=!@[C:2]>>[C:1]*.*[C:2]",
		"[$([CH]),$(CC)]#CC(=O)O[#6]",
		"([C@:1]1([F:2])[Cl:3].[Br:4]1)>>[C@@:1]([F:2])([Cl:3])[Br:4]",
		"[D{2-3}]<-[#6;^2]",
		"C%(100)CC%(100)",
	} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		p := Read(s)
		if len(p.Errors) > maxErrors+1 {
			t.Fatalf("%d errors", len(p.Errors))
		}
		for _, e := range p.Errors {
			if e.Span.Start < 0 || e.Span.End > len(s) || e.Span.Start > e.Span.End {
				t.Fatalf("%q: span %v outside the text", s, e.Span)
			}
		}
		for i := range p.Atoms {
			a := &p.Atoms[i]
			if a.Span.Start < 0 || a.Span.End > len(s) {
				t.Fatalf("%q: atom span %v", s, a.Span)
			}
			for _, bi := range a.Bonds {
				if bi < 0 || bi >= len(p.Bonds) || p.Bonds[bi].Begin != i && p.Bonds[bi].End != i {
					t.Fatalf("%q: atom %d lists bond %d", s, i, bi)
				}
			}
		}
		TemplateStereo(p)
	})
}

package notation

import (
	"errors"
	"testing"
)

// TestApplyEdits checks the edit list rules: edits apply in text order
// whatever order they come in, bytes outside them are kept, and
// overlapping or out-of-range edits are refused with a stable code.
func TestApplyEdits(t *testing.T) {
	tests := []struct {
		name  string
		text  string
		edits []Edit
		want  string
		code  Code
	}{
		{"none", "CCO", nil, "CCO", ""},
		{"replace and insert, given out of order", "N[C@@H](C)C", []Edit{{Span{11, 11}, "O"}, {Span{3, 5}, "@"}}, "N[C@H](C)CO", ""},
		{"delete", "F/C=C/F", []Edit{{Span{1, 2}, ""}}, "FC=C/F", ""},
		{"adjacent edits do not overlap", "CCO", []Edit{{Span{0, 1}, "N"}, {Span{1, 2}, "S"}}, "NSO", ""},
		{"overlap", "CCO", []Edit{{Span{0, 2}, "N"}, {Span{1, 3}, "S"}}, "CCO", CodeEditOverlap},
		{"two insertions at one offset", "CCO", []Edit{{Span{1, 1}, "N"}, {Span{1, 1}, "S"}}, "CCO", CodeEditOverlap},
		{"insertion inside a replacement", "CCO", []Edit{{Span{0, 2}, "N"}, {Span{1, 1}, "S"}}, "CCO", CodeEditOverlap},
		{"past the end", "CCO", []Edit{{Span{2, 4}, "N"}}, "CCO", CodeEditRange},
		{"backwards span", "CCO", []Edit{{Span{2, 1}, "N"}}, "CCO", CodeEditRange},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			given := append([]Edit(nil), tt.edits...)
			got, err := ApplyEdits(tt.text, tt.edits)
			if got != tt.want {
				t.Errorf("text %q, want %q", got, tt.want)
			}
			var e *Error
			switch {
			case tt.code == "" && err != nil:
				t.Errorf("unexpected error %v", err)
			case tt.code != "" && (!errors.As(err, &e) || e.Code != tt.code):
				t.Errorf("error %v, want code %s", err, tt.code)
			}
			for i := range given {
				if given[i] != tt.edits[i] {
					t.Errorf("ApplyEdits changed its argument")
				}
			}
		})
	}
}

// applyOn runs an edit helper's result on the molecule's text and
// checks that every edit stays inside the token it is about.
func applyOn(t *testing.T, m *Molecule, token Span, edits []Edit) string {
	t.Helper()
	for _, e := range edits {
		if e.Span.Start < token.Start || e.Span.End > token.End {
			t.Fatalf("edit %+v leaves the token %+v", e, token)
		}
	}
	out, err := ApplyEdits(m.Text, edits)
	if err != nil {
		t.Fatalf("apply: %v", err)
	}
	return out
}

// TestChiralityEdits checks the chirality helpers. Expected texts follow
// OpenSMILES 3.9 (marks in brackets after the symbol and isotope, before
// the hydrogen count) and 3.1.5 (the hydrogens an organic-subset atom
// implies). L-alanine is N[C@@H](C)C(=O)O (common practice).
func TestChiralityEdits(t *testing.T) {
	tests := []struct {
		name, have string
		atom       int
		mark       string // "invert" for InvertChirality
		want       string
		code       Code
	}{
		{"invert short mark", "N[C@@H](C)C(=O)O", 1, "invert", "N[C@H](C)C(=O)O", ""},
		{"invert long mark", "F[C@TH1](Cl)(Br)I", 1, "invert", "F[C@TH2](Cl)(Br)I", ""},
		{"invert needs a tetrahedral mark", "F[Fe@OH1](Cl)(Cl)(Cl)(Cl)Cl", 1, "invert", "", CodeEditUnsupported},
		{"invert needs a mark", "CC(F)O", 1, "invert", "", CodeEditUnsupported},
		{"add to an organic atom with one hydrogen", "NC(C)C(=O)O", 1, "@", "N[C@H](C)C(=O)O", ""},
		{"add to an organic atom without hydrogens", "CC(F)(Cl)Br", 1, "@@", "C[C@@](F)(Cl)Br", ""},
		{"add to an aromatic-free first atom", "C(F)(Cl)Br", 0, "@", "[C@H](F)(Cl)Br", ""},
		{"add inside brackets", "N[CH](C)C(=O)O.[Na+]", 1, "@@", "N[C@@H](C)C(=O)O.[Na+]", ""},
		{"add after an isotope", "[13CH](F)(Cl)Br", 0, "@", "[13C@H](F)(Cl)Br", ""},
		{"replace with a long form", "N[C@@H](C)C(=O)O", 1, "@TH1", "N[C@TH1H](C)C(=O)O", ""},
		{"remove and drop the brackets", "N[C@@H](C)C(=O)O", 1, "", "NC(C)C(=O)O", ""},
		{"remove keeps an isotope's brackets", "[13C@H](F)(Cl)Br", 0, "", "[13CH](F)(Cl)Br", ""},
		{"remove keeps a charge's brackets", "[N@+](C)(CC)(CCC)CCCC", 0, "", "[N+](C)(CC)(CCC)CCCC", ""},
		{"remove keeps a radical's brackets", "[C@H](F)Cl", 0, "", "[CH](F)Cl", ""},
		{"remove on a ring atom", "C1CC[C@]12CCC2", 3, "", "C1CCC12CCC2", ""},
		{"remove when nothing is there", "CCO", 1, "", "CCO", ""},
		{"bad mark", "CCO", 1, "@TH3", "", CodeEditUnsupported},
		{"no such atom", "CCO", 7, "@", "", CodeEditRange},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			m := Read(tt.have)
			if m.Errors.HasErrors() {
				t.Fatalf("read %q: %v", tt.have, m.Errors)
			}
			var edits []Edit
			var err error
			if tt.mark == "invert" {
				edits, err = InvertChirality(m, tt.atom)
			} else {
				edits, err = SetChirality(m, tt.atom, tt.mark)
			}
			if tt.code != "" {
				var e *Error
				if !errors.As(err, &e) || e.Code != tt.code {
					t.Fatalf("error %v, want code %s", err, tt.code)
				}
				return
			}
			if err != nil {
				t.Fatal(err)
			}
			got := applyOn(t, m, m.Atoms[tt.atom].Span, edits)
			if got != tt.want {
				t.Errorf("got %q, want %q", got, tt.want)
			}
			r := Read(got)
			if r.Errors.HasErrors() || len(r.Atoms) != len(m.Atoms) {
				t.Fatalf("edited text %q does not read: %v", got, r.Errors)
			}
			if h0, h1 := m.Atoms[tt.atom].HydrogenCount(), r.Atoms[tt.atom].HydrogenCount(); h0 != h1 {
				t.Errorf("hydrogens changed from %d to %d", h0, h1)
			}
		})
	}
}

// TestBondDirectionEdits checks the direction helper; the reader then
// confirms the bond reads in the asked direction (OpenSMILES 3.5.3: '/'
// read backwards is '\').
func TestBondDirectionEdits(t *testing.T) {
	tests := []struct {
		name, have string
		bond, from int
		dir        Direction
		want       string
		code       Code
	}{
		{"set on an implied bond", "FC=CF", 0, 0, DirUp, "F/C=CF", ""},
		{"set read from the far end", "FC=CF", 2, 3, DirUp, "FC=C\\F", ""},
		{"replace", "F/C=C/F", 0, 1, DirUp, "F\\C=C/F", ""},
		{"keep when already so", "F/C=C/F", 0, 0, DirUp, "F/C=C/F", ""},
		{"remove", "F/C=C/F", 0, 0, DirNone, "FC=C/F", ""},
		{"remove between aromatic atoms keeps a single bond", "c1ccccc1/C(F)=C/c1ccccc1", 6, 5, DirNone, "c1ccccc1C(F)=C/c1ccccc1", ""},
		{"set between aromatic atoms", "c1ccccc1-c1ccccc1", 6, 5, DirUp, "c1ccccc1/c1ccccc1", ""},
		{"remove between two aromatic atoms", "c1ccccc1/c1ccccc1", 6, 5, DirNone, "c1ccccc1-c1ccccc1", ""},
		{"ring closure opening", "F/C=C/1.Cl1", 2, 2, DirDown, "F/C=C\\1.Cl1", ""},
		{"ring closure mark moved to the opening", "F/C=C1.Cl/1", 2, 2, DirUp, "F/C=C/1.Cl1", ""},
		{"removing where there is none leaves '-' alone", "F-C=CF", 0, 0, DirNone, "F-C=CF", ""},
		{"remove a closing-end mark only", "F/C=C1.Cl/1", 2, 2, DirNone, "F/C=C1.Cl1", ""},
		{"not a single bond", "FC=CF", 1, 1, DirUp, "", CodeEditUnsupported},
		{"not an end of the bond", "FC=CF", 0, 3, DirUp, "", CodeEditRange},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			m := Read(tt.have)
			if m.Errors.HasErrors() {
				t.Fatalf("read %q: %v", tt.have, m.Errors)
			}
			edits, err := SetBondDirection(m, tt.bond, tt.from, tt.dir)
			if tt.code != "" {
				var e *Error
				if !errors.As(err, &e) || e.Code != tt.code {
					t.Fatalf("error %v, want code %s", err, tt.code)
				}
				return
			}
			if err != nil {
				t.Fatal(err)
			}
			bd := m.Bonds[tt.bond]
			token := bd.Span
			if bd.Ring {
				token = bd.Span.Union(bd.CloseSpan)
			}
			got := applyOn(t, m, token, edits)
			if got != tt.want {
				t.Errorf("got %q, want %q", got, tt.want)
			}
			r := Read(got)
			if r.Errors.HasErrors() || len(r.Bonds) != len(m.Bonds) {
				t.Fatalf("edited text %q does not read: %v", got, r.Errors)
			}
			if d := r.BondDir(tt.bond, tt.from); d != tt.dir {
				t.Errorf("bond reads %q from atom %d, want %q", d, tt.from, tt.dir)
			}
			if r.Bonds[tt.bond].Order != m.Bonds[tt.bond].Order {
				t.Errorf("bond order changed to %v", r.Bonds[tt.bond].Order)
			}
		})
	}
}

// FuzzEdits runs every edit helper on every atom and bond of whatever
// the reader makes of a text: no helper may panic, and every edit it
// returns must apply and stay inside the token it is about.
func FuzzEdits(f *testing.F) {
	for _, s := range []string{"N[C@@H](C)C(=O)O", "F/C=C/1.Cl/1", "[13C@H](F)(Cl)Br", "c1ccccc1-c1ccccc1", "OC(Cl)=[C@]=C(C)F"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		if len(s) > 1000 {
			return
		}
		m := Read(s)
		for i := range m.Atoms {
			for _, mark := range []string{"@", "@@", "@TH2", ""} {
				edits, err := SetChirality(m, i, mark)
				if err == nil {
					applyOn(t, m, m.Atoms[i].Span, edits)
				}
			}
			if edits, err := InvertChirality(m, i); err == nil {
				applyOn(t, m, m.Atoms[i].Span, edits)
			}
		}
		for b := range m.Bonds {
			bd := m.Bonds[b]
			token := bd.Span
			if bd.Ring {
				token = bd.Span.Union(bd.CloseSpan)
			}
			for _, d := range []Direction{DirUp, DirDown, DirNone} {
				if edits, err := SetBondDirection(m, b, bd.Begin, d); err == nil {
					applyOn(t, m, token, edits)
				}
			}
		}
	})
}

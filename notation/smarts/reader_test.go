package smarts

import (
	"slices"
	"strings"
	"testing"

	"stereoline/notation"
)

// TestReadValid reads patterns of the Daylight SMARTS theory manual's
// kinds (sections named beside each: atomic primitives, bond
// primitives, logical operators, recursive SMARTS, reaction queries)
// and RDKit's extensions (the RDKit Book, "SMARTS Support and
// Extensions"), all accepted by RDKit 2022.09.3, and checks the atoms
// and bonds of the top level.
func TestReadValid(t *testing.T) {
	tests := []struct {
		source string
		have   string
		atoms  int
		bonds  int
	}{
		{"atomic primitives", "[#6]", 1, 0},
		{"atomic primitives", "[c;x2;D2;r5:1]", 1, 0},
		{"atomic primitives", "[C;H2,H3]", 1, 0},
		{"atomic primitives", "[#7;+0;D2,D3:1]", 1, 0},
		{"atomic primitives", "[!#6&!#1]", 1, 0},
		{"atomic primitives", "[13C]", 1, 0},
		{"atomic primitives", "[Hg]", 1, 0},
		{"atomic primitives", "[se]", 1, 0},
		{"atomic primitives", "[Cl,Br,I]", 1, 0},
		{"atomic primitives", "[N+](=O)[O-]", 3, 2},
		{"atomic primitives", "a1aaaaa1", 6, 6},
		{"bond primitives", "C!@C", 2, 1},
		{"bond primitives", "[C:1]=!@[C:2]", 2, 1},
		{"bond primitives", "*~*", 2, 1},
		{"bond primitives", "C-,=C", 2, 1},
		{"bond primitives", "c:1:c:c:c:c:c:1", 6, 6},
		{"recursive SMARTS", "[$(C=O),$(C#N)]", 1, 0},
		{"recursive SMARTS", "[C;!$(C([#7])[#7]):1](=!@[O:2])", 2, 1},
		{"recursive SMARTS", "[$([CH]),$(CC)]#CC(=O)O[#6]", 6, 5},
		{"reaction queries", "[C:1](=[O:2])-[OD1].[N!H0:3]>>[C:1](=[O:2])[N:3]", 7, 4},
		{"reaction queries", "[C:1]=!@[C:2]>>[C:1]*.*[C:2]", 6, 3},
		{"reaction queries, component grouping", "([C:1].[C:2])>>[C:1][C:2]", 4, 1},
		{"reaction queries, empty agents", "C>>", 1, 0},
		{"component-level grouping (not read by RDKit 2022.09 outside reactions)", "([-1,-2,-3]).([+1,+2,+3])", 2, 0},
		{"RDKit extension: ranges", "[D{2-3}]", 1, 0},
		{"RDKit extension: hybridization", "[^2;C]", 1, 0},
		{"RDKit extension: dative bond", "[N]<-[Cu]", 2, 1},
		{"RDKit reading: ring digit after a branch", "C(C)1CC1", 4, 4},
	}
	for _, tt := range tests {
		p := Read(tt.have)
		if len(p.Errors) != 0 {
			t.Errorf("%s: Read(%q): %v", tt.source, tt.have, p.Errors)
			continue
		}
		if len(p.Atoms) != tt.atoms || len(p.Bonds) != tt.bonds {
			t.Errorf("%s: Read(%q): %d atoms, %d bonds, want %d and %d", tt.source, tt.have, len(p.Atoms), len(p.Bonds), tt.atoms, tt.bonds)
		}
	}
}

// TestReadErrors marks the offending text of each broken pattern with
// «»; RDKit 2022.09.3 rejects every one of them.
func TestReadErrors(t *testing.T) {
	tests := []struct {
		have string
		code notation.Code
	}{
		{"[C«;»]", CodeSyntax},
		{"[«;»C]", CodeSyntax},
		{"[C«,»]", CodeSyntax},
		{"[C:1«;»H2]", CodeSyntax},
		{"[«Xy»]", CodeUnknownElement},
		{"[«E»]", CodeUnknownElement},
		{"[C@«?»H]", CodeSyntax},
		{"C«,»C", CodeSyntax},
		{"C«&»C", CodeSyntax},
		{"«#»6", CodeSyntax},
		{"«K»", CodeSyntax},
		{"C«1»", CodeUnclosedRing},
		{"C12CC1«2»", CodeRingBond},
		{"C(«(»C))", CodeSyntax},
		{"C«(»C", CodeSyntax},
		{"C«.»", CodeSyntax},
		{"«.»C", CodeSyntax},
		{"C«>»C", CodeReaction},
		{"C>>C«>»C", CodeReaction},
		{"[$(C«(»]", CodeSyntax},
		{"C«=»(O)", CodeSyntax},
		{"[C:«01»]", CodeSyntax},
		{"[D{«a»}]", CodeSyntax},
		{"C(«1»)CC1", CodeSyntax},
	}
	for _, tt := range tests {
		text, want := unmark(tt.have)
		p := Read(text)
		found := false
		for _, e := range p.Errors {
			if e.Code == tt.code && e.Span.Overlaps(want) {
				found = true
			}
			if e.Msg == "" || strings.ToLower(e.Msg[:1]) != e.Msg[:1] {
				t.Errorf("Read(%q): message %q should be a lowercase fragment", text, e.Msg)
			}
		}
		if !found {
			t.Errorf("Read(%q): want %s at %v, got %v", text, tt.code, want, p.Errors)
		}
	}
}

// unmark removes the « » markers and returns the span they enclosed.
func unmark(s string) (string, notation.Span) {
	i := strings.Index(s, "«")
	j := strings.Index(s, "»")
	text := s[:i] + s[i+len("«"):j] + s[j+len("»"):]
	return text, notation.Span{Start: i, End: j - len("«")}
}

// TestHostilePatterns checks that deep nesting, long chains and many
// errors stay bounded.
func TestHostilePatterns(t *testing.T) {
	deep := strings.Repeat("[$(", 10000) + "C" + strings.Repeat(")]", 10000)
	long := strings.Repeat("C", 200000)
	broken := strings.Repeat(";", 100000)
	for _, s := range []string{deep, long, broken} {
		p := Read(s)
		if len(p.Errors) > maxErrors+1 {
			t.Errorf("%d errors for a pattern of %d bytes", len(p.Errors), len(s))
		}
	}
	if p := Read(deep); len(p.Errors) == 0 {
		t.Errorf("nesting 10000 deep should be reported")
	}
}

// TestBracketErrorsOnce checks that a bracket atom that does not read is
// one finding, at its first error, not one per character that follows
// from it; a recursive pattern inside a bracket is a pattern of its own.
// The first pattern is Open Babel's example of an invalid SMARTS (its
// python3-openbabel examples, testpybel.py); RDKit 2022.09 rejects all
// three (observed).
func TestBracketErrorsOnce(t *testing.T) {
	tests := []struct {
		text string
		want []int // the starts of the errors
	}{
		{"[#NOEL][#NOEL]", []int{1, 8}},
		{"[C;Q;X4]C", []int{3}},
		{"[$(C[Q])]", []int{5}},
	}
	for _, tt := range tests {
		p := Read(tt.text)
		var got []int
		for _, e := range p.Errors {
			got = append(got, e.Span.Start)
		}
		if !slices.Equal(got, tt.want) {
			t.Errorf("Read(%q): errors at %v, want %v (%v)", tt.text, got, tt.want, p.Errors)
		}
	}
}

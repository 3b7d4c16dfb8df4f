package review

import (
	"strings"
	"testing"

	"stereoline/stereo/document"
)

// pairsOf reviews two versions of a list and writes each listed pair as
// "class old->new" (texts, "-" for a missing side).
func pairsOf(t *testing.T, name, old, new string) []string {
	t.Helper()
	a := document.NewAnalyzer(document.DefaultConfig())
	rep := Review(a, Version{Name: name, Content: []byte(old)}, Version{Name: name, Content: []byte(new)}, Options{})
	var out []string
	for _, p := range rep.Pairs {
		o, n := "-", "-"
		if p.Old != nil {
			o = p.Old.Occ.Text
		}
		if p.New != nil {
			n = p.New.Occ.Text
		}
		out = append(out, p.Class.String()+" "+o+"->"+n)
	}
	return out
}

// TestPairing: the order of trust of pair.go. The relations named are
// textbook (common practice): L/D-alanine, the epimers of
// 3-chlorobutan-2-ol, (E)/(Z)-but-2-ene.
func TestPairing(t *testing.T) {
	tests := []struct {
		name, old, new string
		want           []string
	}{
		{"titles shuffled, one edited",
			"N[C@@H](C)C(=O)O A\nC/C=C/C B\nCCO C\n", "CCO C\nC/C=C\\C B\nN[C@@H](C)C(=O)O A\n",
			[]string{"bond-flipped C/C=C/C->C/C=C\\C"}},
		{"no titles, a record moved",
			"N[C@@H](C)C(=O)O\nC/C=C/C\nCCO\n", "CCO\nN[C@@H](C)C(=O)O\nC/C=C/C\n",
			nil},
		{"no titles, one inserted, one edited",
			"N[C@@H](C)C(=O)O\nC[C@H](O)[C@@H](Cl)C\nCCO\n", "CCN\nN[C@@H](C)C(=O)O\nC[C@H](O)[C@H](Cl)C\nCCO\n",
			[]string{"added -->CCN", "epimer C[C@H](O)[C@@H](Cl)C->C[C@H](O)[C@H](Cl)C"}},
		{"no titles, content before position",
			"N[C@@H](C)C(=O)O\nC/C=C/C\n", "C/C=C\\C\nN[C@H](C)C(=O)O\n",
			[]string{"bond-flipped C/C=C/C->C/C=C\\C", "enantiomer N[C@@H](C)C(=O)O->N[C@H](C)C(=O)O"}},
		{"no titles, another compound in its place",
			"CCO\nN[C@@H](C)C(=O)O\nCCC\n", "CCO\nc1ccccc1\nCCC\n",
			[]string{"constitution-changed N[C@@H](C)C(=O)O->c1ccccc1"}},
		{"titles differ: a record gone, another new",
			"CCO A\nN[C@@H](C)C(=O)O B\n", "CCO A\nc1ccccc1 C\n",
			[]string{"removed N[C@@H](C)C(=O)O->-", "added -->c1ccccc1"}},
		{"a title renamed, the text kept",
			"N[C@@H](C)C(=O)O B\n", "N[C@@H](C)C(=O)O B2\n",
			nil},
		{"the same text twice, one copy edited",
			"N[C@@H](C)C(=O)O\nCCO\nN[C@@H](C)C(=O)O\n", "N[C@@H](C)C(=O)O\nCCO\nN[C@H](C)C(=O)O\n",
			[]string{"enantiomer N[C@@H](C)C(=O)O->N[C@H](C)C(=O)O"}},
		{"a record that no longer reads",
			"C[C@H](O)CC A\n", "C[C@H](O)C(C A\n",
			[]string{"unreadable C[C@H](O)CC->C[C@H](O)C(C"}},
		{"a file that is new",
			"", "CCO A\nCCN B\n",
			[]string{"added -->CCO", "added -->CCN"}},
	}
	for _, tc := range tests {
		got := pairsOf(t, "blocks.smi", tc.old, tc.new)
		if strings.Join(got, "\n") != strings.Join(tc.want, "\n") {
			t.Errorf("%s:\n got %q\nwant %q", tc.name, got, tc.want)
		}
	}
}

// TestMissingVersion: a version with nil content is a file that does not
// exist: every record of the other is added or removed.
func TestMissingVersion(t *testing.T) {
	a := document.NewAnalyzer(document.DefaultConfig())
	rep := Review(a, Version{Name: "x.smi"}, Version{Name: "x.smi", Content: []byte("CCO A\n")}, Options{})
	if len(rep.Pairs) != 1 || rep.Pairs[0].Class != Added {
		t.Errorf("new file: %+v", rep.Pairs)
	}
	rep = Review(a, Version{Name: "x.smi", Content: []byte("CCO A\nCCN B\n")}, Version{Name: "x.smi"}, Options{})
	if len(rep.Pairs) != 2 || rep.Pairs[0].Class != Removed || rep.Records != 2 {
		t.Errorf("deleted file: %+v", rep.Pairs)
	}
}

// TestClassNames: the public names round-trip.
func TestClassNames(t *testing.T) {
	seen := map[string]bool{}
	for _, c := range Classes() {
		s := c.String()
		if back, ok := ParseClass(s); !ok || back != c || seen[s] || s == "unknown" {
			t.Errorf("class %d: %q", c, s)
		}
		seen[s] = true
	}
	if len(seen) != 11 {
		t.Errorf("%d classes", len(seen))
	}
}

// TestSymmetryPrefersTheSimplestReading: a mark dropped from one of the
// two equivalent centres of meso-2,3-dibromosuccinic acid is a removed
// mark, not an inversion beside a removal (the line-up of identity keys
// may pair the remaining centre with its mirror-symmetric partner).
func TestSymmetryPrefersTheSimplestReading(t *testing.T) {
	got := pairsOf(t, "x.smi", "OC(=O)[C@@H](Br)[C@@H](Br)C(O)=O A\n", "O=C(O)C([C@H](Br)C(=O)O)Br A\n")
	if len(got) != 1 || !strings.HasPrefix(got[0], "stereo-removed ") {
		t.Errorf("%q", got)
	}
}

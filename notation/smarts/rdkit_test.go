package smarts

import (
	"bufio"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// smartsFixture holds RDKit 2022.09.3's verdict (Chem.MolFromSmarts,
// AllChem.ReactionFromSmarts for reactions) on every SMARTS that
// Debian's rdkit-data ships and on one-edit variants of each; made by
// testdata/rdkit/gen_smarts.py.
var smartsFixture = filepath.Join("..", "..", "testdata", "rdkit", "smarts.tsv")

// rdkitDivergences are patterns the reader is meant to judge otherwise
// than RDKit, with the reason. An entry that stops differing fails the
// test, so the table cannot go stale.
var rdkitDivergences = map[string]string{
	// FragmentDescriptors.csv line 61 without its opening quote.
	// Functional_Group_Hierarchy.txt line 22 with a dot inserted.
	"[$(S-!@c)](=O)(=O).(Cl)": "component-level grouping, (Cl) as a component of its own, is SMARTS by the Daylight SMARTS theory manual; RDKit 2022.09 reads it only in reactions, Open Babel's data files use it in patterns (SMARTS_InteLigand.txt, Salt)",
	`F or I or Cl or Br"`:     "RDKit reads a pattern up to the first blank and drops the rest, as its SMILES reader drops a title; the finder splits records from titles before reading, so a blank that reaches Read is inside the pattern and an error",
}

// TestRDKitSMARTS reads every pattern of the fixture and compares
// acceptance (no error at all exactly when RDKit returns a query) with
// RDKit's; every error must carry a code of this package and a span
// inside the pattern.
func TestRDKitSMARTS(t *testing.T) {
	f, err := os.Open(smartsFixture)
	if err != nil {
		t.Fatalf("open fixture: %v (regenerate with testdata/rdkit/gen_smarts.py)", err)
	}
	defer f.Close()
	sc := bufio.NewScanner(f)
	sc.Buffer(make([]byte, 1<<20), 1<<20)
	var given, givenOK, variants, agree, differ int
	used := map[string]bool{}
	for n := 1; sc.Scan(); n++ {
		line := sc.Text()
		if line == "" || strings.HasPrefix(line, "#") {
			continue
		}
		col := strings.Split(line, "\t")
		if len(col) != 4 {
			t.Fatalf("%s:%d: %d columns, want 4", smartsFixture, n, len(col))
		}
		source, variant, pat, accepted := col[0], col[1], col[2], col[3] == "1"
		if variant == "given" {
			given++
			if accepted {
				givenOK++
			}
		} else {
			variants++
		}
		p := Read(pat)
		for _, e := range p.Errors {
			if !strings.HasPrefix(string(e.Code), "smarts-") || e.Span.Start < 0 || e.Span.End > len(pat) || e.Span.Start > e.Span.End {
				t.Errorf("%s:%d %q: error %v has a foreign code or a span outside the pattern", smartsFixture, n, pat, e)
			}
		}
		ours := len(p.Errors) == 0
		if ours == accepted {
			agree++
			continue
		}
		if _, ok := rdkitDivergences[pat]; ok {
			used[pat] = true
			continue
		}
		differ++
		if differ <= 40 {
			t.Errorf("%s:%d (%s %s) %q: RDKit accepts %v, we report %v", smartsFixture, n, source, variant, pat, accepted, p.Errors)
		}
	}
	for pat := range rdkitDivergences {
		if !used[pat] {
			t.Errorf("divergence %q no longer differs: remove it", pat)
		}
	}
	if given < 1000 || variants < 2000 {
		t.Fatalf("fixture holds %d shipped patterns and %d variants; regenerate it", given, variants)
	}
	t.Logf("%d shipped patterns (%d accepted by RDKit), %d variants: %d agree, %d differ, %d documented divergences",
		given, givenOK, variants, agree, differ, len(used))
}

// TestValidAgreesWithRead checks that the quick test agrees with Read on
// every pattern of the fixture.
func TestValidAgreesWithRead(t *testing.T) {
	f, err := os.Open(smartsFixture)
	if err != nil {
		t.Fatalf("open fixture: %v", err)
	}
	defer f.Close()
	sc := bufio.NewScanner(f)
	sc.Buffer(make([]byte, 1<<20), 1<<20)
	n := 0
	for sc.Scan() {
		line := sc.Text()
		if line == "" || strings.HasPrefix(line, "#") {
			continue
		}
		pat := strings.Split(line, "\t")[2]
		if got, want := Valid(pat), len(Read(pat).Errors) == 0; got != want {
			t.Errorf("Valid(%q) = %v, Read says %v", pat, got, want)
		}
		n++
	}
	if n < 1000 {
		t.Fatalf("only %d patterns", n)
	}
}

package identity

import (
	"bufio"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"stereoline/notation"
)

// readFixture returns the rows of a tab-separated fixture under
// testdata/rdkit (RDKit 2022.09.3, Debian python3-rdkit and rdkit-data;
// see testdata/rdkit/README.md), skipping the test when it is absent.
func readFixture(t *testing.T, name string, columns int) [][]string {
	t.Helper()
	path := filepath.Join("..", "..", "testdata", "rdkit", name)
	f, err := os.Open(path)
	if err != nil {
		t.Skipf("fixture not found at %s: %v", path, err)
	}
	defer f.Close()
	var rows [][]string
	sc := bufio.NewScanner(f)
	sc.Buffer(make([]byte, 1<<20), 1<<20)
	for line := 1; sc.Scan(); line++ {
		text := sc.Text()
		if text == "" || strings.HasPrefix(text, "#") {
			continue
		}
		c := strings.Split(text, "\t")
		if len(c) < columns {
			t.Fatalf("%s:%d: %d columns, want %d", name, line, len(c), columns)
		}
		rows = append(rows, c)
	}
	return rows
}

// TestPreKeyAgreesAcrossWritings: the writings of one NCI record in
// reader.tsv (as given, two random writings, the Kekulé form, a
// stereoisomer, all hydrogens as [H] atoms, all hydrogens in brackets;
// RDKit 2022.09.3) are one constitution. Wherever the identity key's
// constitution key agrees that two of them are one constitution, the
// pre-key must agree too, or a duplicate would go unreported.
func TestPreKeyAgreesAcrossWritings(t *testing.T) {
	rows := readFixture(t, "reader.tsv", 4)
	type writing struct {
		variant, smiles, constitution string
		pre                           uint64
	}
	byRecord := map[string][]writing{}
	var order []string
	if testing.Short() {
		rows = rows[:len(rows)/4]
	}
	for _, c := range rows {
		if c[3] != "1" {
			continue // RDKit rejects it; nothing to compare
		}
		m := notation.Read(c[2])
		if m.Errors.HasErrors() || len(m.Atoms) == 0 || m.Reaction {
			continue
		}
		if _, ok := byRecord[c[0]]; !ok {
			order = append(order, c[0])
		}
		byRecord[c[0]] = append(byRecord[c[0]], writing{c[1], c[2], ConstitutionKey(m), ConstitutionPreKey(m)})
	}
	compared, bad := 0, 0
	for _, id := range order {
		ws := byRecord[id]
		for _, w := range ws[1:] {
			if w.constitution != ws[0].constitution {
				continue // the identity key itself tells them apart
			}
			compared++
			if w.pre != ws[0].pre {
				bad++
				if bad <= 10 {
					t.Errorf("record %s: %s %q and %s %q are one constitution but their pre-keys differ",
						id, ws[0].variant, ws[0].smiles, w.variant, w.smiles)
				}
			}
		}
	}
	if compared < len(order) {
		t.Fatalf("only %d writings compared over %d records", compared, len(order))
	}
	t.Logf("%d writings of %d records compared, %d with differing pre-keys", compared, len(order), bad)
}

// TestPreKeySeparatesConstitutions: over the molecules of identity.tsv
// (RDKit's canonical SMILES without stereo names the constitution), the
// pre-key should rarely give two different constitutions one value, or
// it saves nothing. A collision is allowed, so this bounds their share.
// The ten random writings of each molecule must share its pre-key
// wherever the constitution key agrees they are one constitution.
func TestPreKeySeparatesConstitutions(t *testing.T) {
	rows := readFixture(t, "identity.tsv", 7)
	owner := map[uint64]string{} // pre-key -> the first constitution that had it
	constitutions := map[string]bool{}
	collisions := map[string]bool{}
	type firstWriting struct {
		smiles string
		pre    uint64
	}
	byPlain := map[string]firstWriting{}
	differing := 0
	for _, c := range rows {
		m := notation.Read(c[3])
		if m.Errors.HasErrors() || len(m.Atoms) == 0 {
			continue
		}
		plain := c[5]
		pre := ConstitutionPreKey(m)
		if w, ok := byPlain[plain]; !ok {
			byPlain[plain] = firstWriting{c[3], pre}
		} else if w.pre != pre && ConstitutionKey(notation.Read(w.smiles)) == ConstitutionKey(m) {
			if differing++; differing <= 10 {
				t.Errorf("%q and %q are one constitution but their pre-keys differ", w.smiles, c[3])
			}
		}
		if c[2] != "0" {
			continue // the first writing of each molecule is enough for collisions
		}
		constitutions[plain] = true
		if first, ok := owner[pre]; !ok {
			owner[pre] = plain
		} else if first != plain {
			collisions[plain] = true
		}
	}
	if len(constitutions) < 500 {
		t.Fatalf("only %d constitutions read", len(constitutions))
	}
	// The bound is ours: 1% of the constitutions.
	if len(collisions)*100 > len(constitutions) {
		t.Errorf("%d of %d constitutions share a pre-key with another one", len(collisions), len(constitutions))
	}
	t.Logf("%d constitutions, %d pre-keys, %d sharing one", len(constitutions), len(owner), len(collisions))
}

// TestPreKeyTable: writings of one constitution share a pre-key, and a
// few constitutions the refinement must look far to tell apart do not.
// Same constitution (OpenSMILES: organic-subset atoms carry their implied
// hydrogens, [H] atoms are hydrogens, aromatic and Kekulé benzene are one
// molecule; common practice): the pairs marked same.
func TestPreKeyTable(t *testing.T) {
	tests := []struct {
		a, b string
		same bool
	}{
		{"c1ccccc1", "C1=CC=CC=C1", true},
		{"C", "[CH4]", true},
		{"C", "[H]C([H])([H])[H]", true},
		{"OCC", "CCO", true},
		{"N[C@@H](C)C(=O)O", "N[C@H](C)C(=O)O", true}, // stereo is not constitution
		{"[2H]C", "[H]C", false},                      // an isotope is
		{"CC(=O)[O-]", "CC(=O)O", false},
		{"CCO", "COC", false},
		// A segment between two alike atoms written the other way round:
		// every atom differs from its neighbours after one round, yet only
		// later rounds see which end the segment is joined to.
		{"N[C@@H](COONCOCCCC)C(=O)O", "N[C@@H](COCNOOCCCC)C(=O)O", false},
		{"CCCCCCCCCCCCCCCCCCCCCCCCCCCCCCO", "CCCCCCCCCCCCCCCCCCCCCCCCCCCCCOC", false},
	}
	for _, tt := range tests {
		ka := ConstitutionPreKey(notation.Read(tt.a))
		kb := ConstitutionPreKey(notation.Read(tt.b))
		if (ka == kb) != tt.same {
			t.Errorf("%s and %s: same pre-key = %v, want %v", tt.a, tt.b, ka == kb, tt.same)
		}
	}
}

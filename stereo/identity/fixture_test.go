package identity

import (
	"bufio"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// The property tests of this package read the molecules the transform
// tests read (stereo/transform/transform_test.go keeps the same helper:
// test files cannot be shared between packages).

// suitePath is the CIP validation suite of Hanson et al. 2018 in the
// shared reference directory.
var suitePath = filepath.Join("..", "..", "..", "shared", "reference", "cip-validation-suite", "compounds.smi")

// fixtureMolecules returns notations for the property tests: the
// canonical writings of testdata/rdkit/cip_labels.tsv (RDKit-enumerated
// stereoisomers of NCI records) and the CIP validation suite of Hanson
// et al. 2018 from the shared reference directory, when present.
func fixtureMolecules(t testing.TB, limit int) []string {
	var out []string
	if f, err := os.Open(filepath.Join("..", "..", "testdata", "rdkit", "cip_labels.tsv")); err == nil {
		sc := bufio.NewScanner(f)
		sc.Buffer(make([]byte, 1<<20), 1<<20)
		for sc.Scan() && len(out) < limit {
			c := strings.Split(sc.Text(), "\t")
			if strings.HasPrefix(c[0], "#") || len(c) < 4 || c[2] != "canonical" {
				continue
			}
			out = append(out, c[3])
		}
		f.Close()
	} else {
		t.Logf("cip_labels.tsv not found: %v", err)
	}
	if f, err := os.Open(suitePath); err == nil {
		sc := bufio.NewScanner(f)
		sc.Buffer(make([]byte, 1<<20), 1<<20)
		for sc.Scan() {
			if c := strings.Split(sc.Text(), "\t"); len(c) > 1 && c[0] != "" {
				out = append(out, c[0])
			}
		}
		f.Close()
	} else {
		t.Logf("CIP validation suite not found at %s, skipped: %v", suitePath, err)
	}
	if len(out) == 0 {
		t.Skip("no fixture molecules found")
	}
	return out
}

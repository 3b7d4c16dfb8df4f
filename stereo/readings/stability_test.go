package readings_test

import (
	"bufio"
	"fmt"
	"os"
	"path/filepath"
	"slices"
	"sort"
	"strings"
	"testing"

	"stereoline/notation"
	"stereoline/stereo/identity"
)

// The reference library's writings of the stereo fixtures: every string
// RDKit 2022.09.3 (Debian's python3-rdkit) wrote of one structure, from
// testdata/rdkit/cip_labels.tsv (canonical and two random writings of
// each isomer, gen_cip.py), testdata/rdkit/identity.tsv (ten random
// writings, gen_identity.py) and the survey's RDKit writings
// (testdata/survey/survey.tsv: canonical, random, rooted at a
// stereocentre, with [H] atoms). The NCI isomers share their keys
// across the three files (group and isomer).
var (
	cipLabelsPath = filepath.Join("..", "..", "testdata", "rdkit", "cip_labels.tsv")
	identityPath  = filepath.Join("..", "..", "testdata", "rdkit", "identity.tsv")
)

// rdkitWritings reads a fixture of testdata/rdkit: structure (nci-<group>/<isomer>)
// to the strings written of it. keep says whether a row belongs to the
// stereo part.
func rdkitWritings(t *testing.T, path string, smilesCol int, keep func([]string) bool, into map[string][]string) int {
	f, err := os.Open(path)
	if err != nil {
		t.Skipf("fixture %s not found: %v", path, err)
	}
	defer f.Close()
	n := 0
	sc := bufio.NewScanner(f)
	sc.Buffer(make([]byte, 1<<20), 1<<20)
	for sc.Scan() {
		line := sc.Text()
		if line == "" || strings.HasPrefix(line, "#") {
			continue
		}
		c := strings.Split(line, "\t")
		if len(c) <= smilesCol || !keep(c) {
			continue
		}
		key := fmt.Sprintf("nci-%s/%s", c[0], c[1])
		into[key] = append(into[key], c[smilesCol])
		n++
	}
	if err := sc.Err(); err != nil {
		t.Fatal(err)
	}
	return n
}

// TestLabelsAcrossRDKitWritingsOfFixtures checks that, under the default
// reader setting, Stereoline's labels of a structure never change with
// the writing, over every writing the reference library made of the
// whole stereo fixture: the multiset of CIP labels is the same for all
// the writings of each structure. RDKit writes under its own readings of
// the open constructs, which the default setting follows; a writing every
// reader reads as another structure (survey class writer-changed: RDKit's
// writer changed it) is left out.
func TestLabelsAcrossRDKitWritingsOfFixtures(t *testing.T) {
	writings := map[string][]string{}
	nCIP := rdkitWritings(t, cipLabelsPath, 3, func([]string) bool { return true }, writings)
	nIdentity := rdkitWritings(t, identityPath, 3, func(c []string) bool { return len(c) > 6 && c[6] == "1" }, writings)
	nSurvey := 0
	for _, r := range readSurvey(t) {
		if r.writer != "rdkit" || slices.Contains(r.classes["*"], "writer-changed") {
			continue
		}
		writings[r.structure] = append(writings[r.structure], r.smiles)
		nSurvey++
	}
	keys := make([]string, 0, len(writings))
	for k := range writings {
		keys = append(keys, k)
	}
	sort.Strings(keys)
	// count counts the structures whose labels change with the writing
	// under a setting; under the default every change is an error, under
	// the other setting (Open Babel's readings) the count is logged to
	// show what reading RDKit's writings another way does
	count := func(setting string, fail bool) (changed, total int) {
		for _, k := range keys {
			ws := writings[k]
			if len(ws) < 2 {
				continue
			}
			total++
			labelsOf := func(s string) string {
				var letters []string
				for _, l := range readOurs(t, s, setting).labels {
					letters = append(letters, l[len(l)-1:])
				}
				sort.Strings(letters)
				return strings.Join(letters, "")
			}
			ref := labelsOf(ws[0])
			for _, w := range ws[1:] {
				if got := labelsOf(w); got != ref {
					changed++
					if fail {
						t.Errorf("%s: labels %q for %s but %q for %s under the default setting", k, ref, ws[0], got, w)
					}
					break
				}
			}
		}
		return changed, total
	}
	changed, total := count(settingRDKit, true)
	t.Logf("%d structures with two or more RDKit writings (%d from cip_labels.tsv, %d from identity.tsv, %d from the survey); labels change with the writing in %d under the default setting",
		total, nCIP, nIdentity, nSurvey, changed)
	// the identity keys read the marks as the labeller does: one key for
	// all the writings of a structure
	keyChanged := 0
	for _, k := range keys {
		ws := writings[k]
		ref := identity.Identify(notation.Read(ws[0])).Key
		for _, w := range ws[1:] {
			if identity.Identify(notation.Read(w)).Key != ref {
				keyChanged++
				t.Errorf("%s: %s and %s get different identity keys under the default setting", k, ws[0], w)
				break
			}
		}
	}
	t.Logf("identity keys change with the writing in %d structures under the default setting", keyChanged)
	other, _ := count(settingOpenBabel, false)
	t.Logf("under the setting %q they would change in %d", settingOpenBabel, other)
}

package notation

import (
	"os"
	"path/filepath"
	"reflect"
	"strings"
	"testing"
)

// TestReadsAgreesWithRead checks the shortcut Reads against what Read
// says of the same text, on every field of the RDKit reader fixture
// (testdata/rdkit/reader.tsv: notation RDKit 2022.09.3 accepts or
// rejects, titles and counts beside them) and on texts made to sit at
// the edges of the shortcut: errors past maxErrors, warnings only,
// errors only the later checks find, extension blocks.
func TestReadsAgreesWithRead(t *testing.T) {
	texts := []string{
		"", "C", "NCI-1-0.0.0", "c1ccccc1", "c1cccc1", "C(C)(C)(C)(C)C", "CN(=O)=O",
		"F[C@H](Cl)1.Br1", "C1CC", "C[C@H](O)CC |&1:1|", "C[C@H](O)CC |&1:9|", "C |$;$|",
		strings.Repeat("C1", 150), strings.Repeat("c", 300), strings.Repeat("C(C)(C)(C)(C)", 70),
		strings.Repeat("F[C@H](Cl)1.Br1.", 230), strings.Repeat("[", 400), strings.Repeat("C)", 120) + "c1cc1",
	}
	path := filepath.Join("..", "testdata", "rdkit", "reader.tsv")
	data, err := os.ReadFile(path)
	if err != nil {
		t.Skipf("fixture %s absent: %v", path, err)
	}
	for line := range strings.Lines(string(data)) {
		if strings.HasPrefix(line, "#") {
			continue
		}
		texts = append(texts, strings.Split(strings.TrimRight(line, "\n"), "\t")...)
	}
	for _, s := range texts {
		m := Read(s)
		want := !m.Errors.HasErrors() && len(m.Atoms) > 0
		if got := Reads(s); got != want {
			t.Errorf("Reads(%.60q) = %v, Read says %v", s, got, want)
		}
	}
}

// TestRereaderAgreesWithRead reads the texts of TestReadsAgreesWithRead
// and the RDKit reader fixture (testdata/rdkit/reader.tsv, RDKit
// 2022.09.3) one after another with one Rereader, small records after
// large ones and the other way round, and checks each molecule against
// Read's of the same text: reused storage must leave nothing of the
// record before. Errors compare by content (an empty list may be nil or
// not).
func TestRereaderAgreesWithRead(t *testing.T) {
	texts := []string{
		"C[C@H](O)CC |&1:1|", "C", "F[C@H](Cl)1.Br1", strings.Repeat("C(C)(C)(C)(C)", 70), "c1ccccc1",
		"[CH3:1][C@H:2](Cl)Br>>[CH3:1][C@@H:2](Br)Cl", "C1CC", "F/C=C/C1CC[C@]2(CC1)OCC2 |&1:7|",
		strings.Repeat("[", 400), "", "CN(=O)=O", strings.Repeat("c", 300), "C |$;$|", "c1cccc1",
		strings.Repeat("C", 5000), "C=C",
	}
	path := filepath.Join("..", "testdata", "rdkit", "reader.tsv")
	if data, err := os.ReadFile(path); err == nil {
		for line := range strings.Lines(string(data)) {
			if !strings.HasPrefix(line, "#") {
				texts = append(texts, strings.Split(strings.TrimRight(line, "\n"), "\t")...)
			}
		}
	} else {
		t.Logf("fixture %s absent: %v; the texts above only", path, err)
	}
	var rr Rereader
	for _, r := range []Reading{{}, {LonePair: LonePairHydrogenSlot}} {
		for _, s := range texts {
			want := ReadWith(s, r)
			got := rr.ReadWith(s, r)
			if len(got.Errors) == 0 && len(want.Errors) == 0 {
				got.Errors, want.Errors = nil, nil
			}
			if !reflect.DeepEqual(got, want) {
				t.Errorf("Rereader.ReadWith(%.60q) differs from ReadWith", s)
			}
		}
	}
}

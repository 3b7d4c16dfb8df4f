package notation

import (
	"os"
	"path/filepath"
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

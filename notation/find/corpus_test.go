package find

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestCorpus runs the finder over testdata/corpus: real-shaped files of
// the kinds cheminformaticians keep (record lists in every layout,
// tables with several name and structure columns, a module full of
// query patterns, reaction templates and doctests), some written for
// this test and some excerpts of Debian's rdkit-data made by
// testdata/corpus/gen_corpus.py (each names its source). Their markers
// say what must be read, as what and with which title, and every other
// literal, cell and line must stay silent.
func TestCorpus(t *testing.T) {
	files, err := filepath.Glob(filepath.Join("testdata", "corpus", "*"))
	if err != nil || len(files) < 10 {
		t.Fatalf("corpus has %d files", len(files))
	}
	for _, path := range files {
		base := filepath.Base(path)
		if strings.HasSuffix(path, ".want") || strings.HasPrefix(base, "gen_") {
			continue
		}
		t.Run(base, func(t *testing.T) {
			src, err := os.ReadFile(path)
			if err != nil {
				t.Fatal(err)
			}
			want := expectations(t, path, src)
			if len(want) == 0 {
				t.Fatalf("%s expects nothing; a corpus file must say what it holds", path)
			}
			checkOccurrences(t, path, src, Find(path, src, Config{}), want)
		})
	}
}

package find

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestNegatives runs the finder over a corpus of ordinary files written
// for this test (testdata/negatives: Python, JavaScript, Go, Markdown,
// JSON, YAML and CSV without structure columns, and a little R, Julia,
// Rust, Java and Kotlin, full of element-like
// words, paths, URLs, regexes, versions, dates, "N/A" and "I/O") and
// asserts that it finds nothing: false positives must stay rare. The
// corpus must be large enough to mean something, so the test also
// checks it has several hundred lines.
func TestNegatives(t *testing.T) {
	files, err := filepath.Glob(filepath.Join("testdata", "negatives", "*"))
	if err != nil {
		t.Fatal(err)
	}
	lines, kinds := 0, map[Kind]bool{}
	for _, path := range files {
		src, err := os.ReadFile(path)
		if err != nil {
			t.Fatal(err)
		}
		name := strings.TrimSuffix(path, ".src")
		kind := KindForName(name)
		if kind == KindUnknown {
			t.Errorf("%s: no host kind for this name", path)
		}
		kinds[kind] = true
		lines += strings.Count(string(src), "\n")
		for _, o := range Find(name, src, Config{}) {
			t.Errorf("%s:%s: false positive %q (%s, %s)", path, lineCol(src, o.Span.Start), o.Text, o.Construct, o.Reason)
		}
	}
	if lines < 400 || len(kinds) < 7 {
		t.Errorf("negative corpus has %d lines in %d kinds; want at least 400 lines in 7 kinds", lines, len(kinds))
	}
}

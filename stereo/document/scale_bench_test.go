package document

import (
	"bytes"
	"fmt"
	"os"
	"runtime"
	"strconv"
	"testing"
)

// scaleList reads the list STEREOLINE_SCALE_LIST names (made by
// testdata/scale/make_list.py), or skips.
func scaleList(b *testing.B) []byte {
	name := os.Getenv("STEREOLINE_SCALE_LIST")
	if name == "" {
		b.Skip("STEREOLINE_SCALE_LIST is not set (make one with testdata/scale/make_list.py)")
	}
	text, err := os.ReadFile(name)
	if err != nil {
		b.Skip(err)
	}
	return text
}

// BenchmarkScaleOpen analyses a large list from a cold cache, relations
// included: what the language server does on didOpen.
func BenchmarkScaleOpen(b *testing.B) {
	text := scaleList(b)
	b.SetBytes(int64(len(text)))
	for i := 0; i < b.N; i++ {
		NewAnalyzer(DefaultConfig()).Analyze("big.smi", "", text)
	}
}

// BenchmarkScaleEdit analyses a large list again after a one-line edit
// (a mark of the middle record toggled), relations included, with the
// cache and the previous result of the open: the language server's edit
// path.
func BenchmarkScaleEdit(b *testing.B) {
	text := scaleList(b)
	a := NewAnalyzer(DefaultConfig())
	prev := a.Analyze("big.smi", "", text)
	versions := [2][]byte{text, toggleMark(text)}
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		prev = a.Reanalyze(prev, "big.smi", "", versions[(i+1)%2])
	}
}

// toggleMark turns the first @@ after the middle of text into @.
func toggleMark(text []byte) []byte {
	mid := len(text) / 2
	i := bytes.Index(text[mid:], []byte("@@"))
	if i < 0 {
		return append(append([]byte(nil), text...), "C\n"...)
	}
	i += mid
	return append(append(append([]byte(nil), text[:i]...), '@'), text[i+2:]...)
}

// BenchmarkScaleEditTop is BenchmarkScaleEdit for a record inserted at
// the top of the list and taken away again: every record after it
// moves, its findings and the relations that name it by its line. The
// garbage is collected between edits, as the language server does while
// it waits for the typing to pause.
func BenchmarkScaleEditTop(b *testing.B) {
	text := scaleList(b)
	a := NewAnalyzer(DefaultConfig())
	prev := a.Analyze("big.smi", "", text)
	first := text[:bytes.IndexByte(text, '\n')+1]
	versions := [2][]byte{text, append(append([]byte(nil), first...), text...)}
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		b.StopTimer()
		runtime.GC()
		b.StartTimer()
		prev = a.Reanalyze(prev, "big.smi", "", versions[(i+1)%2])
	}
}

// BenchmarkScaleEditCode is BenchmarkScaleEdit for a Python module that
// holds the first 20,000 records of the list as a literal list of
// (notation, title) pairs: source code is found again whole on every
// edit (here a byte added to a title in the middle), and the records
// that did not change are answered from the caches.
func BenchmarkScaleEditCode(b *testing.B) {
	var src bytes.Buffer
	src.WriteString("from rdkit import Chem\n\nLIBRARY = [\n")
	lines := bytes.SplitN(scaleList(b), []byte("\n"), 20001)
	for i, line := range lines[:min(len(lines), 20000)] {
		rec, title, _ := bytes.Cut(line, []byte("\t"))
		fmt.Fprintf(&src, "    (%s, %q),\n", strconv.Quote(string(rec)), fmt.Sprint(string(title), "-", i))
	}
	src.WriteString("]\nmols = [Chem.MolFromSmiles(s) for s, _ in LIBRARY]\n")
	text := src.Bytes()
	a := NewAnalyzer(DefaultConfig())
	prev := a.Analyze("library.py", "python", text)
	mid := bytes.IndexByte(text[len(text)/2:], '"') + len(text)/2
	versions := [2][]byte{text, append(append(append([]byte(nil), text[:mid]...), 'x'), text[mid:]...)}
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		prev = a.Reanalyze(prev, "library.py", "python", versions[(i+1)%2])
	}
	b.ReportMetric(float64(len(prev.Records)), "records")
}

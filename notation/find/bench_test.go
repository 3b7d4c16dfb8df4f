package find

import (
	"bytes"
	"fmt"
	"os"
	"path/filepath"
	"testing"
)

// BenchmarkFindList measures the list path on a 100,000-record .smi file
// (the hot path for large libraries); b.SetBytes makes the result MB/s.
func BenchmarkFindList(b *testing.B) {
	var buf bytes.Buffer
	records := []string{"F/C=C/F", "N[C@@H](C)C(=O)O", "C1CCCCC1", "CC(=O)Oc1ccccc1C(=O)O", "C/C=C\\C"}
	for i := 0; i < 100000; i++ {
		fmt.Fprintf(&buf, "%s compound-%d\n", records[i%len(records)], i)
	}
	src := buf.Bytes()
	b.SetBytes(int64(len(src)))
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if n := len(FindKind(KindList, src, Config{})); n != 100000 {
			b.Fatalf("%d records", n)
		}
	}
}

// BenchmarkFindPython measures a large Python file: the ordinary service
// module of the negative corpus and the Python marker file, repeated to
// about 1 MB.
func BenchmarkFindPython(b *testing.B) {
	benchmarkFindFiles(b, KindPython, "negatives/service.py", "markers/python.py")
}

// BenchmarkFindJava measures a large Java file: the ordinary class of the
// negative corpus and the Java marker file (text blocks included),
// repeated to about 1 MB.
func BenchmarkFindJava(b *testing.B) {
	benchmarkFindFiles(b, KindJava, "negatives/Stock.java", "markers/java.java")
}

// benchmarkFindFiles times the finder on the given testdata files joined
// and repeated to about 1 MB, read as one host kind.
func benchmarkFindFiles(b *testing.B, kind Kind, files ...string) {
	var unit []byte
	for _, p := range files {
		s, err := os.ReadFile(filepath.Join("testdata", p))
		if err != nil {
			b.Fatal(err)
		}
		unit = append(unit, s...)
	}
	src := bytes.Repeat(unit, 1<<20/len(unit)+1)
	b.SetBytes(int64(len(src)))
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		FindKind(kind, src, Config{})
	}
}

// BenchmarkFindJSONArray measures a pretty-printed JSON array of 20,000
// records (an object of three members each, indented by two), read
// whole: a document's first reading, and every reading of an edit that
// cannot be read apart.
func BenchmarkFindJSONArray(b *testing.B) {
	var buf bytes.Buffer
	records := []string{"F/C=C/F", "N[C@@H](C)C(=O)O", "C1CCCCC1", "CC(=O)Oc1ccccc1C(=O)O", "C/C=C\\\\C"}
	buf.WriteString("[\n")
	for i := 0; i < 20000; i++ {
		if i > 0 {
			buf.WriteString(",\n")
		}
		fmt.Fprintf(&buf, "  {\n    \"id\": %d,\n    \"smiles\": \"%s\",\n    \"name\": \"compound-%d\"\n  }", i, records[i%len(records)], i)
	}
	buf.WriteString("\n]\n")
	src := buf.Bytes()
	b.SetBytes(int64(len(src)))
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if n := len(FindKind(KindJSON, src, Config{})); n != 20000 {
			b.Fatalf("%d records", n)
		}
	}
}

// BenchmarkFindJSONLines measures 20,000 JSON Lines records, each line
// read by a parser of its own.
func BenchmarkFindJSONLines(b *testing.B) {
	var buf bytes.Buffer
	records := []string{"F/C=C/F", "N[C@@H](C)C(=O)O", "C1CCCCC1", "CC(=O)Oc1ccccc1C(=O)O", "C/C=C\\\\C"}
	for i := 0; i < 20000; i++ {
		fmt.Fprintf(&buf, "{\"id\": %d, \"smiles\": \"%s\", \"name\": \"compound-%d\"}\n", i, records[i%len(records)], i)
	}
	src := buf.Bytes()
	b.SetBytes(int64(len(src)))
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if n := len(FindKind(KindJSON, src, Config{})); n != 20000 {
			b.Fatalf("%d records", n)
		}
	}
}

package find

import (
	"bytes"
	"fmt"
	"os"
	"path/filepath"
	"testing"
)

// benchRecords are the structures of the generated benchmark documents
// (OpenSMILES examples and common compounds; common practice).
var benchRecords = []string{"F/C=C/F", "N[C@@H](C)C(=O)O", "C1CCCCC1", "CC(=O)Oc1ccccc1C(=O)O", "C/C=C\\C"}

// benchmarkGenerated times FindKind on a document of n records that
// line(buf, i, record) writes, one after another, checking it finds n;
// b.SetBytes makes the result MB/s.
func benchmarkGenerated(b *testing.B, kind Kind, head, tail string, n int, line func(*bytes.Buffer, int, string)) {
	var buf bytes.Buffer
	buf.WriteString(head)
	for i := range n {
		line(&buf, i, benchRecords[i%len(benchRecords)])
	}
	buf.WriteString(tail)
	src := buf.Bytes()
	b.SetBytes(int64(len(src)))
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if got := len(FindKind(kind, src, Config{})); got != n {
			b.Fatalf("%d records, want %d", got, n)
		}
	}
}

// BenchmarkFindList measures the list path on a 100,000-record .smi file
// (the hot path for large libraries).
func BenchmarkFindList(b *testing.B) {
	benchmarkGenerated(b, KindList, "", "", 100000, func(buf *bytes.Buffer, i int, rec string) {
		fmt.Fprintf(buf, "%s compound-%d\n", rec, i)
	})
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
	benchmarkGenerated(b, KindJSON, "[\n", "\n]\n", 20000, func(buf *bytes.Buffer, i int, rec string) {
		if i > 0 {
			buf.WriteString(",\n")
		}
		fmt.Fprintf(buf, "  {\n    \"id\": %d,\n    \"smiles\": %q,\n    \"name\": \"compound-%d\"\n  }", i, rec, i)
	})
}

// BenchmarkFindJSONLines measures 20,000 JSON Lines records.
func BenchmarkFindJSONLines(b *testing.B) {
	benchmarkGenerated(b, KindJSON, "", "", 20000, func(buf *bytes.Buffer, i int, rec string) {
		fmt.Fprintf(buf, "{\"id\": %d, \"smiles\": %q, \"name\": \"compound-%d\"}\n", i, rec, i)
	})
}

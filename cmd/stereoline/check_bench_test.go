package main

import (
	"fmt"
	"io"
	"os"
	"path/filepath"
	"runtime"
	"strings"
	"testing"
)

// benchFiles is the size of the generated tree: a few thousand files, as
// a dataset repository of a medium project holds.
const benchFiles = 3000

// writeBenchTree writes benchFiles files (lists, tables and Python in
// nested folders) of ten records each, and returns the folder and the
// record count. Every record differs (an atom map number carries the
// index), so the engine's cache of repeated records does not flatter the
// numbers.
func writeBenchTree(b *testing.B) (string, int) {
	b.Helper()
	dir := b.TempDir()
	records := 0
	shape := func(i int) string {
		chain := strings.Repeat("C", 1+i%9)
		ring := 5 + i%4
		switch i % 5 {
		case 0:
			return fmt.Sprintf("N[C@@H](%s)C(=O)O", chain)
		case 1:
			return fmt.Sprintf("/C=C/%sO", chain)
		case 2:
			return fmt.Sprintf("C1%s[C@H](O)C1%s", strings.Repeat("C", ring-3), chain)
		case 3:
			return fmt.Sprintf("O[C@@H](c1ccccc1)%sC(=O)OC", chain)
		}
		return fmt.Sprintf("C(C)(C)OC(=O)N[C@@H](C%s)C(=O)N%s", chain, strings.Repeat("C", 1+i%5))
	}
	record := func(i int) string { return fmt.Sprintf("[CH3:%d]", i+1) + shape(i) }
	for f := 0; f < benchFiles; f++ {
		sub := filepath.Join(dir, fmt.Sprintf("batch%02d", f%40), fmt.Sprintf("plate%d", f%7))
		if err := os.MkdirAll(sub, 0o755); err != nil {
			b.Fatal(err)
		}
		var sb strings.Builder
		var name string
		switch f % 3 {
		case 0:
			name = fmt.Sprintf("blocks%04d.smi", f)
			for r := 0; r < 10; r++ {
				fmt.Fprintf(&sb, "%s ID-%d-%d\n", record(f*10+r), f, r)
			}
		case 1:
			name = fmt.Sprintf("table%04d.csv", f)
			sb.WriteString("id,smiles,amount\n")
			for r := 0; r < 10; r++ {
				fmt.Fprintf(&sb, "ID-%d-%d,%s,%d\n", f, r, record(f*10+r), r)
			}
		default:
			name = fmt.Sprintf("series%04d.py", f)
			sb.WriteString("SERIES = [\n")
			for r := 0; r < 10; r++ {
				fmt.Fprintf(&sb, "    {\"id\": \"ID-%d-%d\", \"smiles\": r\"%s\"},\n", f, r, record(f*10+r))
			}
			sb.WriteString("]\n")
		}
		records += 10
		if err := os.WriteFile(filepath.Join(sub, name), []byte(sb.String()), 0o644); err != nil {
			b.Fatal(err)
		}
	}
	return dir, records
}

// BenchmarkCheckTree checks the generated tree on one core and on all,
// and reports files and records per second. Run it with
// go test ./cmd/stereoline -run '^$' -bench CheckTree -benchtime 3x.
func BenchmarkCheckTree(b *testing.B) {
	dir, records := writeBenchTree(b)
	// Count the records once so the metric is what the engine found,
	// not what the generator meant to write.
	_, stderr, status := runCheckDiscard(dir, "--jobs", "1")
	if status == 2 {
		b.Fatalf("check failed: %s", stderr)
	}
	if !strings.Contains(stderr, fmt.Sprintf("%d files", benchFiles)) || !strings.Contains(stderr, fmt.Sprintf("%d records", records)) {
		b.Fatalf("expected %d files and %d records, summary says: %s", benchFiles, records, stderr)
	}
	for _, jobs := range []int{1, runtime.NumCPU()} {
		b.Run(fmt.Sprintf("jobs=%d", jobs), func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				runCheckDiscard(dir, "--jobs", fmt.Sprint(jobs))
			}
			secs := b.Elapsed().Seconds()
			b.ReportMetric(float64(benchFiles*b.N)/secs, "files/s")
			b.ReportMetric(float64(records*b.N)/secs, "records/s")
		})
	}
}

// runCheckDiscard runs check with its findings thrown away.
func runCheckDiscard(dir string, args ...string) (string, string, int) {
	var errOut strings.Builder
	status := check(append(args, dir), strings.NewReader(""), io.Discard, &errOut)
	return "", errOut.String(), status
}

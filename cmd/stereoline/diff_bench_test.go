package main

import (
	"fmt"
	"io"
	"math/rand"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// benchDiffRecords and benchDiffChanged are the size of the review the
// benchmark measures: a list of 100,000 records with 2,000 edited.
const (
	benchDiffRecords = 100_000
	benchDiffChanged = 2_000
)

// diffBenchList writes the old and the new version of the benchmark's
// list: records of five shapes (two centres, one centre, a double bond,
// a ring with a centre, a protected amino acid), every one different (a
// chain length and an atom map number carry the index); the edits
// invert one centre, mirror a record, flip a double bond or re-write a
// record (one edit in seven), at random positions.
func diffBenchList() (old, new string) {
	shape := func(i int, flip bool) string {
		chain := strings.Repeat("C", 1+i%9)
		at := "@"
		if flip {
			at = "@@"
		}
		switch i % 5 {
		case 0:
			return fmt.Sprintf("[CH3:%d][C@H](O)[C%sH](Cl)%s", i+1, at, chain)
		case 1:
			return fmt.Sprintf("[CH3:%d]N[C%sH](%s)C(=O)O", i+1, at, chain)
		case 2:
			if flip {
				return fmt.Sprintf("[CH3:%d]/C=C\\%sO", i+1, chain)
			}
			return fmt.Sprintf("[CH3:%d]/C=C/%sO", i+1, chain)
		case 3:
			return fmt.Sprintf("[CH3:%d]C1CCC[C%sH](O)C1%s", i+1, at, chain)
		}
		return fmt.Sprintf("[CH3:%d]C(C)(C)OC(=O)N[C%sH](C%s)C(=O)NC", i+1, at, chain)
	}
	changed := map[int]bool{}
	r := rand.New(rand.NewSource(20224))
	for len(changed) < benchDiffChanged {
		changed[r.Intn(benchDiffRecords)] = true
	}
	var o, n strings.Builder
	for i := 0; i < benchDiffRecords; i++ {
		rec := shape(i, false)
		fmt.Fprintf(&o, "%s LRK-BB-%06d\n", rec, i)
		if changed[i] {
			if i%7 == 0 {
				// a re-writing of the same compound
				fmt.Fprintf(&n, "%s LRK-BB-%06d\n", rewrite(i, rec), i)
				continue
			}
			rec = shape(i, true)
		}
		fmt.Fprintf(&n, "%s LRK-BB-%06d\n", rec, i)
	}
	return o.String(), n.String()
}

// rewrite writes a record of shape i%5 another way: an explicit single
// bond, or a branch moved, as any writer may.
func rewrite(i int, rec string) string {
	switch i % 5 {
	case 1:
		return strings.Replace(rec, "C(=O)O", "C(O)=O", 1)
	case 2:
		return strings.TrimSuffix(rec, "O") + "-O"
	case 4:
		return strings.Replace(rec, "C(=O)NC", "C(NC)=O", 1)
	}
	return strings.Replace(rec, "(O)", "(-O)", 1)
}

// BenchmarkDiff100k reviews the list against HEAD in a git repository,
// JSON Lines to nowhere, and reports records per second. Run it with
// go test ./cmd/stereoline -run '^$' -bench Diff100k -benchtime 3x -benchmem.
// With STEREOLINE_BENCH_REPO=DIR the repository is made in DIR (a new
// folder) and kept, to time the command itself under /usr/bin/time -v.
func BenchmarkDiff100k(b *testing.B) {
	old, new := diffBenchList()
	dir := b.TempDir()
	if keep := os.Getenv("STEREOLINE_BENCH_REPO"); keep != "" {
		// a folder to keep the repository in, for timing the command
		// itself (/usr/bin/time -v stereoline diff --format json DIR)
		dir = keep
		if err := os.MkdirAll(dir, 0o755); err != nil {
			b.Fatal(err)
		}
	}
	if err := os.WriteFile(filepath.Join(dir, "blocks.smi"), []byte(old), 0o644); err != nil {
		b.Fatal(err)
	}
	for _, args := range [][]string{{"init", "-q"}, {"add", "."}, {"-c", "user.name=Bench", "-c", "user.email=bench@example.invalid", "commit", "-q", "-m", "base"}} {
		if _, err := git(dir, args...); err != nil {
			b.Skip("git: ", err)
		}
	}
	if err := os.WriteFile(filepath.Join(dir, "blocks.smi"), []byte(new), 0o644); err != nil {
		b.Fatal(err)
	}
	for _, format := range []string{"json", "html"} {
		b.Run(format, func(b *testing.B) {
			b.ReportAllocs()
			for i := 0; i < b.N; i++ {
				var errOut strings.Builder
				if status := diff([]string{"--format", format, dir}, strings.NewReader(""), io.Discard, &errOut); status != 0 {
					b.Fatalf("status %d: %s", status, errOut.String())
				}
				if i == 0 && !strings.Contains(errOut.String(), fmt.Sprintf("%d listed", benchDiffChanged)) {
					b.Fatalf("summary: %s", errOut.String())
				}
			}
			b.ReportMetric(float64(benchDiffRecords)*float64(b.N)/b.Elapsed().Seconds(), "records/s")
		})
	}
}

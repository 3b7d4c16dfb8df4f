package document

import (
	"math/rand/v2"
	"os"
	"path/filepath"
	"reflect"
	"slices"
	"sort"
	"strings"
	"testing"
	"time"
)

// TestStreamMatchesAnalyze checks that the streamed findings, sorted as
// Stream's contract says, are Analyze's, on the demo files and the
// finder's corpus, with chunks small enough that relations cross them.
// The expected side is the engine's own whole-document analysis.
func TestStreamMatchesAnalyze(t *testing.T) {
	var files []string
	for _, dir := range []string{"../../examples", "../../notation/find/testdata/corpus", "../../lsp/testdata/markers"} {
		ents, err := os.ReadDir(dir)
		if err != nil {
			t.Fatal(err)
		}
		for _, e := range ents {
			if !e.IsDir() {
				files = append(files, filepath.Join(dir, e.Name()))
			}
		}
	}
	defer func(n int) { streamChunk = n }(streamChunk)
	defer func(above, each int) { partitionAbove, partitionBytes = above, each }(partitionAbove, partitionBytes)
	relations := 0
	for _, mode := range []struct {
		chunk int
		parts bool // related in parts on disk, a part for every 200 bytes
	}{{1, false}, {3, false}, {2048, false}, {3, true}, {2048, true}} {
		chunk := mode.chunk
		streamChunk = chunk
		partitionAbove, partitionBytes = 1<<40, 1<<40
		if mode.parts {
			partitionAbove, partitionBytes = 0, 200
		}
		for _, f := range files {
			data, err := os.ReadFile(f)
			if err != nil {
				t.Fatal(err)
			}
			a := NewAnalyzer(DefaultConfig())
			want := a.Analyze(f, "", data)
			var got []Diagnostic
			n := NewAnalyzer(DefaultConfig()).Stream(f, "", data, func(ds []Diagnostic) { got = append(got, ds...) })
			sort.SliceStable(got, func(i, j int) bool {
				x, y := got[i], got[j]
				if x.Span != y.Span {
					return x.Span.Start < y.Span.Start || x.Span.Start == y.Span.Start && x.Span.End < y.Span.End
				}
				return !IsRelation(x.Code) && IsRelation(y.Code)
			})
			if n != len(want.Records)+len(want.Queries) {
				t.Errorf("%s: Stream counted %d records, Analyze %d", f, n, len(want.Records)+len(want.Queries))
			}
			if len(got) != len(want.Diagnostics()) {
				t.Errorf("chunk %d, in parts %v, %s: %d findings streamed, Analyze has %d", chunk, mode.parts, f, len(got), len(want.Diagnostics()))
				continue
			}
			for i := range got {
				if IsRelation(got[i].Code) {
					relations++
				}
				if !reflect.DeepEqual(got[i], want.Diagnostics()[i]) {
					t.Errorf("chunk %d, in parts %v, %s: finding %d\n got %+v\nwant %+v", chunk, mode.parts, f, i, got[i], want.Diagnostics()[i])
					break
				}
			}
		}
	}
	if relations == 0 {
		t.Error("no relations among the files: the test relates nothing")
	}
}

// TestStreamWithoutFixes: an analyzer WithoutFixes streams the same
// findings with no quick fixes, on demo files where some findings have
// fixes (so the comparison can fail).
func TestStreamWithoutFixes(t *testing.T) {
	ents, err := os.ReadDir("../../examples")
	if err != nil {
		t.Fatal(err)
	}
	fixed := 0
	for _, e := range ents {
		if e.IsDir() {
			continue
		}
		f := filepath.Join("../../examples", e.Name())
		data, err := os.ReadFile(f)
		if err != nil {
			t.Fatal(err)
		}
		var with, without []Diagnostic
		a := NewAnalyzer(DefaultConfig())
		a.Stream(f, "", data, func(ds []Diagnostic) { with = append(with, ds...) })
		a.WithoutFixes().Stream(f, "", data, func(ds []Diagnostic) { without = append(without, ds...) })
		if len(with) != len(without) {
			t.Errorf("%s: %d findings with fixes, %d without", f, len(with), len(without))
			continue
		}
		for i := range with {
			if len(with[i].Fixes) > 0 {
				fixed++
			}
			if without[i].Fixes != nil {
				t.Errorf("%s: finding %d has fixes from an analyzer without them", f, i)
			}
			with[i].Fixes = nil
			if !reflect.DeepEqual(with[i], without[i]) {
				t.Errorf("%s: finding %d\n with fixes %+v\n without %+v", f, i, with[i], without[i])
			}
		}
	}
	if fixed == 0 {
		t.Error("no finding of the examples has a fix: the test compares nothing")
	}
}

// TestStreamPanicReachesCaller makes the emit callback, which Stream
// calls from its second stage, fail on a chunk in the middle of a list:
// the panic must reach Stream's caller, as it would without the stage,
// and Stream must not hang on the chunks still coming.
func TestStreamPanicReachesCaller(t *testing.T) {
	defer func(n int) { streamChunk = n }(streamChunk)
	streamChunk = 2
	var b []byte
	for range 40 {
		b = append(b, "N[C@@H](C)C(=O)O ala\nC[C@H](O)CC but\n"...)
	}
	done := make(chan any)
	go func() {
		defer func() { done <- recover() }()
		calls := 0
		NewAnalyzer(DefaultConfig()).Stream("p.smi", "", b, func([]Diagnostic) {
			if calls++; calls == 5 {
				panic("emit failed")
			}
		})
	}()
	select {
	case r := <-done:
		if r != "emit failed" {
			t.Errorf("Stream's caller recovered %v, want the panic of emit", r)
		}
	case <-time.After(10 * time.Second):
		t.Fatal("Stream did not return after its callback panicked")
	}
}

// TestSparseLineOf checks that line numbers from a table of every n-th
// line (a streamed result) are those of the table of every line, for
// every offset of a text with empty lines and "\r\n" breaks.
func TestSparseLineOf(t *testing.T) {
	text := []byte(strings.Repeat("C[C@H](N)O a\n\n\r\nF/C=C/F\r\n", 40) + "CC")
	full := &Result{Content: text}
	inOrder := make([]int, len(text)+1)
	for off := range inOrder {
		inOrder[off] = off
	}
	shuffled := slices.Clone(inOrder)
	rand.New(rand.NewPCG(7, 8)).Shuffle(len(shuffled), func(i, j int) { shuffled[i], shuffled[j] = shuffled[j], shuffled[i] })
	for _, n := range []int{2, 3, 64} {
		for _, offs := range [][]int{inOrder, shuffled} {
			// the table is built as far as the offsets asked for
			sparse := &Result{Content: text, lineStride: n}
			for _, off := range offs {
				if got, want := sparse.lineOf(off), full.lineOf(off); got != want {
					t.Fatalf("every %d lines: offset %d is on line %d, want %d", n, off, got, want)
				}
			}
		}
	}
}

// TestPartitionsForShortRecords checks that a list of more than a
// million short lines is related in parts though it is far below the
// size at which a list of common records is, and that a shorter one is
// not.
func TestPartitionsForShortRecords(t *testing.T) {
	if p := newPartitions([]byte(strings.Repeat("C\n", 1_100_000))); p == nil {
		t.Error("1,100,000 records of 2 bytes related in memory")
	} else {
		p.close()
	}
	if p := newPartitions([]byte(strings.Repeat("C\n", 900_000))); p != nil {
		p.close()
		t.Error("900,000 records of 2 bytes related in parts")
	}
}

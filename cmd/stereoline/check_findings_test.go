package main

import (
	"fmt"
	"math/rand/v2"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"stereoline/notation"
)

// TestFindingListRoundTrip checks that packed findings come back as they
// went in: large positions, long and repeated messages, more distinct
// messages than the table holds.
func TestFindingListRoundTrip(t *testing.T) {
	for _, spill := range []bool{false, true} {
		t.Run(fmt.Sprintf("spill=%v", spill), func(t *testing.T) {
			if spill {
				defer func(b, s int) { findingBlock, spillAfter = b, s }(findingBlock, spillAfter)
				findingBlock, spillAfter = 100, 1000
			}
			roundTrip(t, spill)
		})
	}
}

func roundTrip(t *testing.T, spill bool) {
	rng := rand.New(rand.NewPCG(1, 2))
	codes := []notation.Code{"stereo-undefined", "list-duplicate", "list-stereoisomer"}
	var want []finding
	var l findingList
	for i := range 5000 {
		msg := "stereocentre without a configuration"
		switch i % 3 {
		case 1:
			msg = fmt.Sprintf("a stereoisomer of line %d (ID-%d): differs at C%d", i, i, rng.IntN(1000))
		case 2:
			msg = strings.Repeat("é", rng.IntN(300))
		}
		line := rng.IntN(1 << 30)
		f := finding{
			Start:    position{Line: line, Char16: rng.IntN(1 << 20), CharCP: rng.IntN(1 << 20)},
			End:      position{Line: line + rng.IntN(3), Char16: rng.IntN(1 << 20), CharCP: rng.IntN(1 << 20)},
			Severity: notation.Severity(1 + rng.IntN(4)),
			Code:     codes[rng.IntN(len(codes))],
			Message:  msg,
		}
		want = append(want, f)
		l.add(f)
	}
	l.done()
	if (l.spill != nil) != spill {
		t.Errorf("written to a file: %v, want %v", l.spill != nil, spill)
	}
	if l.Len() != len(want) {
		t.Fatalf("Len %d, want %d", l.Len(), len(want))
	}
	if got := slices.Collect(l.All()); !slices.Equal(got, want) {
		for i := range got {
			if got[i] != want[i] {
				t.Fatalf("finding %d came back as %+v, went in as %+v", i, got[i], want[i])
			}
		}
	}
	if len(l.msgs) > maxInterned {
		t.Errorf("%d messages in the table, at most %d", len(l.msgs), maxInterned)
	}
	// Twice: the summary and the report both read the findings.
	if n := len(slices.Collect(l.All())); n != len(want) || l.Err() != nil {
		t.Errorf("read again: %d findings (%v), want %d", n, l.Err(), len(want))
	}
	l.close()
	if l.Len() != 0 {
		t.Errorf("%d findings after close", l.Len())
	}
}

// TestCheckGoldenSpilled checks the golden outputs with every file's
// findings written to a temporary file past the first few.
func TestCheckGoldenSpilled(t *testing.T) {
	defer func(b, s int) { findingBlock, spillAfter = b, s }(findingBlock, spillAfter)
	findingBlock, spillAfter = 64, 64
	for _, c := range []struct{ golden, format string }{
		{"text.golden", "text"},
		{"json.golden", "json"},
		{"sarif.golden", "sarif"},
	} {
		stdout, stderr, _ := runCheck(t, "", "--format", c.format, goldenTree)
		want, err := os.ReadFile(filepath.Join("testdata", "check", c.golden))
		if err != nil {
			t.Fatal(err)
		}
		if got := stdout + "--- stderr\n" + stderr; got != string(want) {
			t.Errorf("%s: spilled findings differ from %s:\n%s", c.format, c.golden, got)
		}
	}
}

// TestConverterMergesRuns checks that findings added out of order come
// out as a stable sort of them all: runs in order, more of them than a
// converter holds before it merges, ties between runs in the order they
// were added, and lists written to temporary files.
func TestConverterMergesRuns(t *testing.T) {
	defer func(b, s int) { findingBlock, spillAfter = b, s }(findingBlock, spillAfter)
	findingBlock, spillAfter = 100, 1000
	rng := rand.New(rand.NewPCG(3, 4))
	codes := []notation.Code{"stereo-undefined", "list-duplicate", "list-stereoisomer"}
	var all []finding
	c := &converter{}
	for run := range 3 * maxRuns {
		// a run of findings in order, on lines that other runs share
		line := rng.IntN(50)
		for k := range 1 + rng.IntN(40) {
			line += rng.IntN(3)
			f := finding{
				Start:    position{Line: line, Char16: rng.IntN(3)},
				End:      position{Line: line, Char16: 5},
				Severity: notation.SeverityInformation,
				Code:     codes[rng.IntN(len(codes))],
				Message:  fmt.Sprintf("run %d, finding %d", run, k),
			}
			if k > 0 && compareFindings(all[len(all)-1], f) > 0 {
				f.Start.Char16 = all[len(all)-1].Start.Char16 // keep the run in order
				f.Code = all[len(all)-1].Code
			}
			all = append(all, f)
			c.addFinding(f)
		}
	}
	want := slices.Clone(all)
	slices.SortStableFunc(want, compareFindings)
	got := c.done()
	if got.Len() != len(want) {
		t.Fatalf("%d findings merged, want %d", got.Len(), len(want))
	}
	if all := slices.Collect(got.All()); !slices.Equal(all, want) {
		for i := range all {
			if all[i] != want[i] {
				t.Fatalf("finding %d is %+v, want %+v", i, all[i], want[i])
			}
		}
	}
	if got.Err() != nil {
		t.Error(got.Err())
	}
	got.close()
}

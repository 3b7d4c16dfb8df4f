package main

import (
	"fmt"
	"math/rand/v2"
	"slices"
	"strings"
	"testing"

	"stereoline/notation"
)

// TestFindingListRoundTrip checks that packed findings come back as they
// went in: large positions, long and repeated messages, more distinct
// messages than the table holds.
func TestFindingListRoundTrip(t *testing.T) {
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
}

package reaction

import (
	"fmt"
	"strings"
	"testing"

	"stereoline/notation"
	"stereoline/stereo"
)

// hugeReaction writes a reaction of n components on each side. mapped
// numbers every atom; the reactants are then n mapped centres
// F[C@H](Cl)Br and the products the same centres written with the
// opposite hand in the same neighbour order, each one inverted (the
// SN2 case of TestReactionCentres, without the leaving group).
func hugeReaction(n int, mapped bool) string {
	if !mapped {
		side := strings.TrimSuffix(strings.Repeat("C.", n), ".")
		return side + ">>" + side
	}
	var r, p []string
	for i := 0; i < n; i++ {
		k := 4 * i
		r = append(r, fmt.Sprintf("[F:%d][C@H:%d]([Cl:%d])[Br:%d]", k+1, k+2, k+3, k+4))
		p = append(p, fmt.Sprintf("[F:%d][C@@H:%d]([Cl:%d])[Br:%d]", k+1, k+2, k+3, k+4))
	}
	return strings.Join(r, ".") + ">>" + strings.Join(p, ".")
}

// TestHugeReaction reads and follows a reaction with 10,000 components
// on each side (a hostile record of issue 13): every mapped centre is
// found inverted, and nothing is reported about the maps.
func TestHugeReaction(t *testing.T) {
	const n = 10000
	m := notation.Read(hugeReaction(n, false))
	if !m.Reaction || len(m.Atoms) != 2*n || m.Errors.HasErrors() {
		t.Fatalf("plain: reaction %v, %d atoms, %v", m.Reaction, len(m.Atoms), m.Errors.Err())
	}
	if res := Analyze(m); len(res.Centres) != 0 || len(res.Diagnostics) != 0 {
		t.Errorf("plain: %d centres, %v", len(res.Centres), res.Diagnostics)
	}
	m = notation.Read(hugeReaction(n, true))
	if m.Errors.HasErrors() {
		t.Fatalf("mapped: %v", m.Errors.Err())
	}
	an := stereo.Analyze(m)
	res := AnalyzeWith(m, an)
	inverted := 0
	for _, c := range res.Centres {
		if c.Change == ChangeInversion {
			inverted++
		}
	}
	if inverted != n || len(res.Diagnostics) != 0 {
		t.Errorf("mapped: %d of %d centres inverted; %d findings", inverted, n, len(res.Diagnostics))
	}
}

func BenchmarkHugeReaction(b *testing.B) {
	for _, mapped := range []bool{false, true} {
		text := hugeReaction(10000, mapped)
		b.Run(fmt.Sprintf("mapped=%v", mapped), func(b *testing.B) {
			for b.Loop() {
				m := notation.Read(text)
				AnalyzeWith(m, stereo.Analyze(m))
			}
		})
	}
}

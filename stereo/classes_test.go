package stereo

import (
	"testing"

	"stereoline/notation"
	"stereoline/stereo/internal/ringgeom"
)

// roundClasses is colour refinement done the plain way, every atom
// renamed every round until the number of classes stops growing: the
// reference symmetryClasses must agree with, which looks only at the
// atoms next to a change.
func roundClasses(g *graph) []uint64 {
	class := make([]uint64, g.n)
	for a := 0; a < g.n; a++ {
		at := &g.mol.Atoms[a]
		h := ringgeom.Mix64(uint64(at.Number))
		h = ringgeom.Mix64(h ^ uint64(at.Charge+128)<<8)
		h = ringgeom.Mix64(h ^ uint64(at.Isotope)<<16)
		class[a] = ringgeom.Mix64(h ^ uint64(len(g.adj[a]))<<32 ^ uint64(g.hyd[a])<<40 ^ uint64(g.valence(a))<<48)
	}
	distinct := func(xs []uint64) int {
		seen := map[uint64]bool{}
		for _, x := range xs {
			seen[x] = true
		}
		return len(seen)
	}
	count := distinct(class)
	for {
		next := make([]uint64, g.n)
		for a := 0; a < g.n; a++ {
			var sum uint64
			for _, e := range g.adj[a] {
				sum += ringgeom.Mix64(class[e.to] + uint64(classOrder(g, a, e)))
			}
			next[a] = ringgeom.Mix64(class[a]) ^ sum
		}
		class = next
		c := distinct(class)
		if c == count {
			return class
		}
		count = c
	}
}

// samePartition reports whether two class tables put the same atoms
// together.
func samePartition(x, y []uint64) bool {
	xy, yx := map[uint64]uint64{}, map[uint64]uint64{}
	for a := range x {
		if v, ok := xy[x[a]]; ok && v != y[a] {
			return false
		}
		if v, ok := yx[y[a]]; ok && v != x[a] {
			return false
		}
		xy[x[a]], yx[y[a]] = y[a], x[a]
	}
	return true
}

// TestSymmetryClassesAgree compares the symmetry classes with the plain
// refinement on the CIP validation suite, the RDKit CIP fixture and
// small hostile records (chains, ring chains, ladders, a honeycomb).
func TestSymmetryClassesAgree(t *testing.T) {
	var texts []string
	for _, c := range readSuite(t) {
		texts = append(texts, c.smiles)
	}
	for _, r := range readRDKitCIP(t) {
		texts = append(texts, r.smiles)
	}
	texts = append(texts, chainMarks(31), smallRings(17), fusedLadder(9, true), fusedLadder(8, false),
		sheet(7, 9), ladder(12, "F"), "CCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCC", "C.C.CC.O", "C1CC2CCC(C1)C2",
		"C12C3C4C1C5C2C3C45", dendrimer(3, "F"))
	for _, text := range texts {
		g := newGraph(notation.Read(text))
		if g.n == 0 {
			continue
		}
		want := roundClasses(g)
		got := symmetryClasses(g)
		if !samePartition(got, want) {
			t.Errorf("%s: classes %v, plain refinement %v", text, got, want)
		}
	}
}

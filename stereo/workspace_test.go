package stereo

import (
	"fmt"
	"strings"
	"sync"
	"testing"

	"stereoline/notation"
)

// TestConcurrentAnalyses runs the analyses of the RDKit fixture on four
// goroutines at once, each through the pooled workspaces, and checks
// that every result equals the one of a lone sequential run: nothing a
// workspace keeps between calls may leak into another call's result.
// Run it with -race as well.
func TestConcurrentAnalyses(t *testing.T) {
	rows := readRDKitCIP(t)
	if len(rows) > 1200 {
		rows = rows[:1200]
	}
	describe := func(a *Analysis) string { return fmt.Sprintf("%v|%v", a.Units, a.Diagnostics) }
	mols := make([]*notation.Molecule, len(rows))
	want := make([]string, len(rows))
	for i, r := range rows {
		mols[i] = notation.Read(r.smiles)
		want[i] = describe(Analyze(mols[i]))
	}
	var wg sync.WaitGroup
	errs := make(chan string, 4)
	for w := 0; w < 4; w++ {
		wg.Add(1)
		go func(w int) {
			defer wg.Done()
			// each goroutine walks the list from its own starting point,
			// so that workspaces meet molecules in another order
			for k := range mols {
				i := (k + w*len(mols)/4) % len(mols)
				if got := describe(Analyze(mols[i])); got != want[i] {
					errs <- fmt.Sprintf("%s: concurrent result differs", rows[i].smiles)
					return
				}
			}
		}(w)
	}
	wg.Wait()
	close(errs)
	for e := range errs {
		t.Error(e)
	}
}

// TestClassesSharedWithTheMoleculeBefore analyses each writing of the
// RDKit fixture (RDKit 2022.09.3 CIP labels, readRDKitCIP) right after
// its mirror images (every @ and @@ swapped, every / and \ swapped, and
// both: the same constitution, atom for atom), so that it takes the
// symmetry classes of the molecule before, and after a writing with one
// carbon made silicon, whose classes it must not take; the result must
// equal the one of an analysis after an unrelated molecule.
func TestClassesSharedWithTheMoleculeBefore(t *testing.T) {
	rows := readRDKitCIP(t)
	describe := func(a *Analysis) string { return fmt.Sprintf("%v|%v", a.Units, a.Diagnostics) }
	swap := strings.NewReplacer("@@", "@", "@", "@@")
	turn := strings.NewReplacer("/", "\\", "\\", "/")
	before := sharedClasses.Load()
	for _, r := range rows {
		Analyze(notation.Read("CC(C)(F)Cl")) // classes of another constitution
		want := describe(Analyze(notation.Read(r.smiles)))
		// the mirror images, and a writing of the same shape with one
		// atom another element: its classes must not be taken
		others := []string{swap.Replace(r.smiles), turn.Replace(r.smiles), swap.Replace(turn.Replace(r.smiles)),
			strings.Replace(r.smiles, "C", "[Si]", 1)}
		for _, other := range others {
			Analyze(notation.Read(other))
			if got := describe(Analyze(notation.Read(r.smiles))); got != want {
				t.Errorf("%s after %s: %s, alone: %s", r.smiles, other, got, want)
			}
		}
	}
	shared := sharedClasses.Load() - before
	if shared == 0 {
		t.Errorf("no analysis took the classes of the molecule before (%d writings)", len(rows))
	}
	t.Logf("%d writings, %d analyses took the classes of the molecule before", len(rows), shared)
}

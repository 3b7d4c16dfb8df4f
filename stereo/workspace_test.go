package stereo

import (
	"fmt"
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

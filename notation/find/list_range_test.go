package find

import (
	"fmt"
	"math/rand"
	"reflect"
	"strings"
	"testing"
)

// TestFindListLines checks that the records of some lines found apart
// equal those the whole list's reading finds there, for several layouts
// (records invented for the test).
func TestFindListLines(t *testing.T) {
	records := []string{"C[C@H](N)C(=O)O", "F/C=C/F", "c1ccccc1", "N[C@@H](C)C(=O)O", "CC(O)CC", "OC[C@H]1OC(O)[C@H](O)[C@@H](O)[C@@H]1O"}
	layouts := map[string]func(i int, rec string) string{
		"blank":   func(i int, rec string) string { return fmt.Sprintf("%s rec-%d", rec, i) },
		"tab":     func(i int, rec string) string { return fmt.Sprintf("%s\tNCI-%d-0.0", rec, i) },
		"comma":   func(i int, rec string) string { return fmt.Sprintf("%d,%s,name %d", i, rec, i) },
		"no-name": func(i int, rec string) string { return rec },
	}
	rng := rand.New(rand.NewSource(7))
	for name, line := range layouts {
		var b strings.Builder
		var starts []int
		for i := 0; i < 200; i++ {
			starts = append(starts, b.Len())
			b.WriteString(line(i, records[rng.Intn(len(records))]) + "\n")
		}
		starts = append(starts, b.Len())
		src := []byte(b.String())
		all := FindKind(KindList, src, Config{})
		for try := 0; try < 50; try++ {
			a := rng.Intn(200)
			z := a + rng.Intn(200-a) + 1
			from, to := starts[a], starts[z]
			got, ok := FindListLines(src, Config{}, from, to)
			if a <= sampleLines {
				if ok {
					t.Errorf("%s: lines %d to %d reach into the layout sample and were read apart", name, a, z)
				}
				continue
			}
			if !ok {
				t.Errorf("%s: lines %d to %d not read apart", name, a, z)
				continue
			}
			var want []Occurrence
			for _, o := range all {
				if o.Span.Start >= from && o.Span.End <= to {
					want = append(want, o)
				}
			}
			if !reflect.DeepEqual(got, want) {
				t.Errorf("%s: lines %d to %d:\n got %+v\nwant %+v", name, a, z, got, want)
			}
		}
	}
	if _, ok := FindListLines([]byte(strings.Repeat("CCO x\n", 100)+"# stereoline: off\nCCO y\n"), Config{}, 600, 624); ok {
		t.Error("a list with pragmas was read apart")
	}
}

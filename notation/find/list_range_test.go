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
			got, ok := FindListLines(nil, src, Config{}, from, to)
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
	if _, ok := FindListLines(nil, []byte(strings.Repeat("CCO x\n", 100)+"# stereoline: off\nCCO y\n"), Config{}, 600, 624); ok {
		t.Error("a list with pragmas was read apart")
	}
}

// TestFindListLinesAtTheTop checks edits of the first lines, from which
// the layout is read: with the text before the edit given, the records
// of the edited lines are those of a whole reading as long as the layout
// stays; a line of the word "smiles" first, which the reading skips as a
// header even where the layout says there is none, must not become a
// record, nor a record the header, by an edit read apart (records
// invented for the test).
func TestFindListLinesAtTheTop(t *testing.T) {
	recs := strings.Repeat("N[C@@H](C)C(=O)O ala\nC[C@H](O)CC but\n", 30)
	check := func(what string, cfg Config, old, src string, from, to int, wantOK bool) {
		t.Helper()
		got, ok := FindListLines([]byte(old), []byte(src), cfg, from, to)
		if ok != wantOK {
			t.Errorf("%s: read apart %t, want %t", what, ok, wantOK)
			return
		}
		if !ok {
			return
		}
		var want []Occurrence
		for _, o := range FindKind(KindList, []byte(src), cfg) {
			if o.Span.Start >= from && o.Span.End <= to {
				want = append(want, o)
			}
		}
		if !reflect.DeepEqual(got, want) {
			t.Errorf("%s:\n got %+v\nwant %+v", what, got, want)
		}
	}
	first := "F/C=C/F fl\n"
	check("a record inserted first", Config{}, recs, first+recs, 0, len(first), true)
	check("the first record deleted", Config{}, first+recs, recs, 0, 0, true)
	check("a mark of the third line", Config{}, recs, strings.Replace(recs, "C[C@H]", "C[C@@H]", 1), 21, 37, true)
	check("without the text before the edit", Config{}, "", first+recs, 0, len(first), false)
	bom := "\ufeff"
	check("a record inserted first after a byte order mark", Config{}, bom+recs, bom+first+recs, 0, len(bom+first), true)
	check("a byte order mark added", Config{}, recs, bom+recs, 0, len(bom)+21, false)
	fixed := Config{Layout: "field=1 sep=space no-header"}
	check("a record before the header word", fixed, "smiles name\n"+recs, first+"smiles name\n"+recs, 0, len(first), false)
	check("a record after the header word", fixed, "smiles name\n"+recs, "smiles name\n"+first+recs, 12, 12+len(first), true)
	check("prose first", Config{}, recs, "these words are no record\n"+recs, 0, 26, false)
}

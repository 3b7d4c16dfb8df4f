package find

import (
	"fmt"
	"math"
	"reflect"
	"runtime"
	"strings"
	"testing"
)

// TestFindListInPieces checks that a list read in pieces on several cores
// gives the occurrences reading it line after line gives, the same in
// every field, for lists with a header, comment and blank lines, CRLF
// line ends, no final line break, query patterns, several layouts, and
// pieces that begin on such lines.
func TestFindListInPieces(t *testing.T) {
	defer runtime.GOMAXPROCS(runtime.GOMAXPROCS(4))
	defer func(n int) { parallelListFrom = n }(parallelListFrom)
	// Records from OpenSMILES examples (common practice).
	recs := []string{"N[C@@H](C)C(=O)O", "F/C=C/F", "C1CC[C@H](O)CC1", "c1ccccc1O", "C[C@H](F)Cl |&1:1|"}
	list := func(format string, n int, extra func(i int) string) string {
		var b strings.Builder
		for i := range n {
			fmt.Fprintf(&b, format, recs[i%len(recs)], i)
			b.WriteString(extra(i))
		}
		return b.String()
	}
	none := func(int) string { return "" }
	cases := map[string]string{
		"plain":    list("%s item-%d\n", 3000, none),
		"tabbed":   "smiles\tname\n" + list("%s\tNCI-%d-0.0\n", 3000, none),
		"comments": "# made for a test\n\n" + list("%s\tx%d\n", 3000, func(i int) string { return []string{"", "\n", "# note\n", "// note\n", "\r\n"}[i%5] }),
		"crlf":     list("%s name %d\r\n", 3000, none),
		"no end":   strings.TrimSuffix(list("%s %d\n", 3000, none), "\n"),
		"csv":      list("%s,%d,extra\n", 3000, none),
		"queries":  "[#6][OX2H] alcohol\n[CX3](=O)[OX2H1] acid\n" + list("%s q%d\n", 3000, none),
		"fields":   list("id%[2]d C[C@@H](N)C %[1]s\n", 3000, none),
	}
	for name, src := range cases {
		parallelListFrom = math.MaxInt
		want := FindKind(KindList, []byte(src), Config{})
		for _, from := range []int{1, 100, len(src) / 3} {
			parallelListFrom = from
			got := FindKind(KindList, []byte(src), Config{})
			if len(got) != len(want) {
				t.Fatalf("%s from %d: %d occurrences in pieces, %d line by line", name, from, len(got), len(want))
			}
			for i := range want {
				if !reflect.DeepEqual(got[i], want[i]) {
					t.Fatalf("%s from %d: occurrence %d in pieces %+v, line by line %+v", name, from, i, got[i], want[i])
				}
			}
		}
		if len(want) < 3000 {
			t.Errorf("%s: only %d records found", name, len(want))
		}
	}
}

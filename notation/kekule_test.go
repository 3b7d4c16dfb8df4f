package notation

import (
	"fmt"
	"slices"
	"strings"
	"sync"
	"testing"
)

// kekuleOf is what the Kekulé matching decides for a record: each bond's
// Kekulé order and the kekulize findings.
func kekuleOf(s string) string {
	m := Read(s)
	var b strings.Builder
	for _, bd := range m.Bonds {
		fmt.Fprintf(&b, "%d", bd.Kekule)
	}
	for _, e := range m.Errors {
		if e.Code == CodeKekulize {
			fmt.Fprintf(&b, " %v %s", e.Span, e.Msg)
		}
	}
	return b.String()
}

// TestKekuleMatcherReuse reads aromatic records in several orders and
// on several goroutines: the matchers are reused from record to record,
// and what one record leaves in them must not change the next one's
// Kekulé structure or findings. The records are common practice:
// benzene, naphthalene, azulene, pyrrole, indole, pyridine, a
// porphyrin-like macrocycle, coronene, and aromatic rings without a
// Kekulé structure (cyclopentadienyl written aromatic, a pyrrole
// without its H).
func TestKekuleMatcherReuse(t *testing.T) {
	recs := []string{
		"c1ccccc1", "c1ccc2ccccc2c1", "c1ccc2cccc2cc1", "c1cc[nH]c1", "c1ccc2[nH]ccc2c1",
		"c1ccncc1", "c1cc2cc3ccc(cc4ccc(cc5ccc(cc1n2)[nH]5)n4)[nH]3",
		"c1cc2ccc3ccc4ccc5ccc6ccc1c1c2c3c4c5c61", "c1cccc1", "c1ccnc1", "Cc1ccccc1c1ccccc1C",
		"c1ccc2c(c1)c1ccccc1c1ccccc21", "o1cccc1", "c1ccc(cc1)-c1ccccc1",
	}
	want := make([]string, len(recs))
	for i, s := range recs {
		want[i] = kekuleOf(s)
	}
	for round, order := range [][]int{reversed(len(recs)), interleaved(len(recs))} {
		for _, i := range order {
			if got := kekuleOf(recs[i]); got != want[i] {
				t.Errorf("round %d, %s: %q, read first %q", round, recs[i], got, want[i])
			}
		}
	}
	var wg sync.WaitGroup
	for g := 0; g < 4; g++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for n := 0; n < 200; n++ {
				i := (n*7 + g) % len(recs)
				if got := kekuleOf(recs[i]); got != want[i] {
					t.Errorf("goroutine %d, %s: %q, read first %q", g, recs[i], got, want[i])
					return
				}
			}
		}()
	}
	wg.Wait()
	if !strings.Contains(want[8], "Kekulé") || strings.Contains(want[1], "Kekulé") {
		t.Errorf("the records do not read as expected: %q, %q", want[8], want[1])
	}
}

func reversed(n int) []int {
	out := make([]int, n)
	for i := range out {
		out[i] = n - 1 - i
	}
	return out
}

func interleaved(n int) []int {
	var out []int
	for i := 0; i < n; i += 2 {
		out = append(out, i)
	}
	for i := 1; i < n; i += 2 {
		out = append(out, i)
	}
	return slices.Clip(out)
}

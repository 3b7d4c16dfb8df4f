package find

import (
	"fmt"
	"strings"
	"sync"
	"testing"
)

// TestVerdictsRemembered checks the memory of the finder's costly tests:
// a text's answer is computed once while it is remembered, the answers
// are those of the tests (both tests kept apart for one text), the
// memory holds at most two generations within their bounds, and a text
// longer than verdictLongest is never kept.
func TestVerdictsRemembered(t *testing.T) {
	v := newVerdictMemo(8, 200)
	calls := map[string]int{}
	even := func(s string) bool { calls[s]++; return len(s)%2 == 0 }
	odd := func(s string) bool { calls[s+"/odd"]++; return len(s)%2 == 1 }
	for round := 0; round < 3; round++ {
		for i := 0; i < 6; i++ {
			s := strings.Repeat("C", i+1)
			if got := v.verdict(s, knownUnmistakable, isUnmistakable, even); got != (len(s)%2 == 0) {
				t.Fatalf("%q: first test %v", s, got)
			}
			if got := v.verdict(s, knownSibling, isSibling, odd); got != (len(s)%2 == 1) {
				t.Fatalf("%q: second test %v", s, got)
			}
		}
	}
	for s, n := range calls {
		if n != 1 {
			t.Errorf("%q: computed %d times while remembered, want once", s, n)
		}
	}
	// many texts: two generations at most, each within its bounds
	for i := 0; i < 100; i++ {
		v.verdict(fmt.Sprintf("C%dCC", i), knownUnmistakable, isUnmistakable, even)
		if cur, old := v.m.Len(); cur > 8 || old > 8 || v.m.Weight() > 200 {
			t.Fatalf("after %d texts: %d and %d entries, %d bytes", i+1, cur, old, v.m.Weight())
		}
	}
	long := strings.Repeat("C", verdictLongest+1)
	v.verdict(long, knownUnmistakable, isUnmistakable, even)
	v.verdict(long, knownUnmistakable, isUnmistakable, even)
	if calls[long] != 2 {
		t.Errorf("a text of %d bytes was computed %d times for two asks, want 2 (never kept)", len(long), calls[long])
	}
}

// TestVerdictsAgree checks that the remembered tests answer as the tests
// themselves, asked in any order from several goroutines (run with -race).
func TestVerdictsAgree(t *testing.T) {
	texts := []string{"C[C@H](O)CC", "c1ccccc1", "CCO", "NO", "Hello", "[NH4+]", "C/C=C/C", "F/C=C\\F",
		"C1CC", "I/O", "N/A", "2024-01-01", "[*:1]c1ccccc1", "CC(=O)O", "CCN(CC)CC", "C(2)**2", "a=b"}
	var wg sync.WaitGroup
	for g := 0; g < 4; g++ {
		wg.Add(1)
		go func(g int) {
			defer wg.Done()
			for k := range texts {
				s := texts[(k+g)%len(texts)]
				if unmistakable(s) != unmistakableText(s) || siblingRecord(s) != siblingRecordText(s) {
					t.Errorf("%q: remembered answers differ from the tests'", s)
				}
			}
		}(g)
	}
	wg.Wait()
}

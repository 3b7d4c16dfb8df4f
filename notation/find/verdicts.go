package find

import (
	"strings"
	"sync"

	"stereoline/notation/genmap"
)

// verdicts remembers the answers of the tests that read a literal's text
// as notation to decide whether it is a record (unmistakable,
// siblingRecord): a source file of 20,000 literals is found again whole
// on every edit, and all but the edited ones are texts the last finding
// read. Both tests depend on the text alone. Two generations of 131,072
// texts hold the records and titles of a module of 100,000 records
// (with 65,536, an edit of one read most of its texts again: 1.8 s
// instead of about 0.5).
var verdicts = newVerdictMemo(1<<17, 16<<20)

// RememberVerdicts sizes the memory of verdicts: generations of entries
// texts and bytes bytes of them, two of which are kept. The language
// server, which finds a large module again on every edit, calls it once
// before it finds anything; the checker keeps the default, which bounds
// what a scan of many files holds.
func RememberVerdicts(entries, bytes int) {
	verdicts = newVerdictMemo(entries, bytes)
}

// verdictLongest is the longest text remembered: a longer one costs more
// memory than most and is rare in source.
const verdictLongest = 1024

// A verdict holds two bits for each test: known, and the answer.
const (
	knownUnmistakable = 1 << iota
	isUnmistakable
	knownSibling
	isSibling
)

// A verdictMemo maps texts to verdicts, in a genmap.Map whose
// generations are bounded in texts and in their bytes.
type verdictMemo struct {
	mu sync.Mutex
	m  *genmap.Map[string, uint8]
}

func newVerdictMemo(entries, bytes int) *verdictMemo {
	return &verdictMemo{m: genmap.New[string, uint8](entries, bytes, func(s string) int { return len(s) })}
}

// verdict returns the answer of test for s, one of the tests (known
// marks it, yes is its answer), from memory or computed.
func (v *verdictMemo) verdict(s string, known, yes uint8, test func(string) bool) bool {
	if len(s) > verdictLongest {
		return test(s)
	}
	v.mu.Lock()
	got, _ := v.m.Get(s)
	v.mu.Unlock()
	if got&known != 0 {
		return got&yes != 0
	}
	answer := test(s) // outside the lock: a reading may take a while
	got |= known
	if answer {
		got |= yes
	}
	v.mu.Lock()
	defer v.mu.Unlock()
	if had, ok := v.m.Get(s); ok {
		v.m.Put(s, had|got) // the other test's answer, kept meanwhile
	} else {
		v.m.Put(strings.Clone(s), got) // not a window into a whole file
	}
	return answer
}

// unmistakable is unmistakableText, remembered.
func unmistakable(s string) bool {
	return verdicts.verdict(s, knownUnmistakable, isUnmistakable, unmistakableText)
}

// siblingRecord is siblingRecordText, remembered.
func siblingRecord(s string) bool {
	return verdicts.verdict(s, knownSibling, isSibling, siblingRecordText)
}

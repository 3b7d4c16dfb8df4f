package identity

import (
	"math/rand/v2"
	"strings"
	"testing"

	"stereoline/notation"
)

// TestRingChainKeys checks the keys of a chain of 1,4-cyclohexylene
// rings, each trans (common practice: a trans-1,4-disubstituted
// cyclohexane has a centre of symmetry, so the chain is achiral): the
// key does not depend on the writing, the structure is achiral, and
// making one ring cis gives a diastereomer. Each ring's two carbons have
// no parity of their own, only a relation, so the canonical search must
// not try both orders of every ring (2^12 here).
func TestRingChainKeys(t *testing.T) {
	const rings = 12
	trans := "C" + strings.Repeat("[C@H]1CC[C@@H](CC1)", rings) + "C"
	// the seventh ring written the other way round: cis
	cis := "C" + strings.Repeat("[C@H]1CC[C@@H](CC1)", 6) + "[C@H]1CC[C@H](CC1)" + strings.Repeat("[C@H]1CC[C@@H](CC1)", rings-7) + "C"
	m := notation.Read(trans)
	id := Identify(m)
	if id.Chirality != Achiral {
		t.Errorf("all-trans chain: %v, want achiral", id.Chirality)
	}
	rng := rand.New(rand.NewPCG(12, 1))
	for k := 0; k < 10; k++ {
		w := notation.Write(m, notation.WriteOptions{Random: rng, Start: rng.IntN(len(m.Atoms))})
		if len(w.Unadjusted) > 0 || len(w.Dropped) > 0 {
			continue
		}
		if got := Identify(notation.Read(w.Text)).Key; got != id.Key {
			t.Errorf("writing %s has another key than %s", w.Text, trans)
			break
		}
	}
	if c := Compare(m, notation.Read(cis)); c.Relation != Diastereomers {
		t.Errorf("one ring cis: %v, want diastereomers", c.Relation)
	}
}

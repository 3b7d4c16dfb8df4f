package stereo

import (
	"math/rand/v2"
	"sort"
	"strconv"
	"strings"
	"testing"

	"stereoline/notation"
)

// TestInvarianceRewritings checks that the labels of each compound of
// the validation suite stay the same over 10 random writings (atom
// order, ring-closure numbers, branch order) by the notation writer,
// atom numbers mapped back through the writer's order.
func TestInvarianceRewritings(t *testing.T) {
	cases := readSuite(t)
	if testing.Short() {
		cases = cases[:60]
	}
	bad := 0
	for ci, c := range cases {
		m := notation.Read(c.smiles)
		want := strings.Join(labelSet(Analyze(m)), " ")
		rng := rand.New(rand.NewPCG(uint64(ci), 20181755))
		for k := 0; k < 10; k++ {
			w := notation.Write(m, notation.WriteOptions{Random: rng, Kekule: true, Start: rng.IntN(len(m.Atoms))})
			if len(w.Unadjusted) > 0 || len(w.Dropped) > 0 {
				continue
			}
			a := Analyze(notation.Read(w.Text))
			var got []string
			for _, u := range a.Units {
				if !u.Descriptor.Labelled() {
					continue
				}
				for _, at := range u.Atoms {
					got = append(got, strconv.Itoa(w.Order[at]+1)+u.Descriptor.String())
				}
			}
			sort.Strings(got)
			if g := strings.Join(got, " "); g != want {
				bad++
				t.Errorf("%s: %s gives %q, its writing %s gives %q", c.id, c.smiles, want, w.Text, g)
				break
			}
		}
	}
	t.Logf("%d of %d compounds change labels when rewritten", bad, len(cases))
}

func hasAlleneMark(m *notation.Molecule) bool {
	g := newGraph(m)
	for a := range m.Atoms {
		if m.Atoms[a].Chirality.Class == notation.ChiralNone {
			continue
		}
		if _, _, ok := g.alleneEnds(a); ok {
			return true
		}
	}
	return false
}

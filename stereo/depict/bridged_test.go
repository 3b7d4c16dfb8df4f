package depict

import (
	"math"
	"testing"

	"stereoline/notation"
)

// TestBridgedDrawings checks the drawings of bridged ring systems and
// cages for what a chemist reading them relies on (common practice of
// structure diagrams): no bond crosses another (every graph here is
// planar), no atom sits on a bond or on another atom, every ring atom
// with two bonds shows as a corner, bonds keep roughly one length, and
// each substituent of a ring atom points out of its ring system, away
// from the cage. The notations are from memory; the checks depend on
// the graphs alone.
func TestBridgedDrawings(t *testing.T) {
	for _, c := range []struct {
		name, smiles      string
		shortest, longest float64 // bond lengths allowed; 0 means 0.6 and 1.4
	}{
		{"camphor", "CC1(C)[C@@H]2CC[C@@]1(C)C(=O)C2", 0, 0},
		{"norbornane", "C1CC2CCC1C2", 0, 0},
		{"exo-norborneol", "O[C@@H]1C[C@@H]2CC[C@H]1C2", 0, 0},
		{"norbornene", "C1=CC2CCC1C2", 0, 0},
		{"bicyclo[2.2.2]octane", "C1CC2CCC1CC2", 0, 0},
		{"quinuclidine", "C1CN2CCC1CC2", 0, 0},
		{"DABCO", "C1CN2CCN1CC2", 0, 0},
		{"bicyclo[3.2.1]octane", "C1CC2CCC(C1)C2", 0, 0},
		{"bicyclo[3.3.1]nonane", "C1CC2CCCC(C1)C2", 0, 0},
		{"tropine", "CN1[C@@H]2CC[C@H]1C[C@@H](O)C2", 0, 0},
		{"cocaine", "COC(=O)[C@H]1[C@@H]2CC[C@H](C[C@@H]1OC(=O)c1ccccc1)N2C", 0, 0},
		{"1,6-anhydroglucose", "O[C@H]1[C@@H](O)[C@@H]2CO[C@H](O2)[C@@H]1O", 0, 0},
		{"adamantane", "C1C2CC3CC1CC(C2)C3", 0, 0},
		{"1-adamantanol", "OC12CC3CC(CC(C3)C1)C2", 0, 0},
		{"hexamethylenetetramine", "C1N2CN3CN1CN(C2)C3", 0, 0},
		// a cube drawn without crossings is a square in a square, whose
		// bonds cannot all be one length
		{"cubane", "C12C3C4C1C5C2C3C45", 0.45, 1.6},
		{"twistane", "C12CC3CCC1CC3CC2", 0, 0},
		{"a nickel chelate", "C1CN[Ni]23(N1)(NCCN2)NCCN3", 0, 0},
	} {
		if c.shortest == 0 {
			c.shortest, c.longest = 0.6, 1.4
		}
		m := notation.Read(c.smiles)
		d := Draw(m, Options{Budget: unhurried})
		if len(d.Atoms) < len(m.Atoms) {
			t.Fatalf("%s: %d atoms drawn of %d", c.name, len(d.Atoms), len(m.Atoms))
		}
		rings := notation.FindRings(m)
		p := func(i int) Point { return d.Atoms[i].P }
		var bonds [][2]int
		for _, b := range m.Bonds {
			bonds = append(bonds, [2]int{b.Begin, b.End})
			if l := p(b.Begin).dist(p(b.End)); l < c.shortest || l > c.longest {
				t.Errorf("%s: bond %d-%d of length %.2f", c.name, b.Begin+1, b.End+1, l)
			}
		}
		for i, x := range bonds {
			for _, y := range bonds[i+1:] {
				if x[0] != y[0] && x[0] != y[1] && x[1] != y[0] && x[1] != y[1] &&
					segmentsCross(p(x[0]), p(x[1]), p(y[0]), p(y[1])) {
					t.Errorf("%s: bonds %d-%d and %d-%d cross", c.name, x[0]+1, x[1]+1, y[0]+1, y[1]+1)
				}
			}
			for a := range m.Atoms {
				if a != x[0] && a != x[1] && segmentDist(p(a), p(x[0]), p(x[1])) < 0.35 {
					t.Errorf("%s: atom %d sits on bond %d-%d", c.name, a+1, x[0]+1, x[1]+1)
				}
			}
		}
		for a := range m.Atoms {
			for b := a + 1; b < len(m.Atoms); b++ {
				if p(a).dist(p(b)) < 0.5 {
					t.Errorf("%s: atoms %d and %d %.2f apart", c.name, a+1, b+1, p(a).dist(p(b)))
				}
			}
		}
		// ring atoms: corners, and substituents pointing out of their
		// ring system (the atoms joined to them by ring bonds)
		system := make([]int, len(m.Atoms))
		for a := range system {
			system[a] = a
		}
		var root func(int) int
		root = func(a int) int {
			for system[a] != a {
				a = system[a]
			}
			return a
		}
		for bi, b := range m.Bonds {
			if rings.BondInRing(bi) {
				system[root(b.Begin)] = root(b.End)
			}
		}
		centres := map[int]Point{}
		counts := map[int]int{}
		for a := range m.Atoms {
			if rings.AtomInRing(a) {
				centres[root(a)] = centres[root(a)].add(p(a))
				counts[root(a)]++
			}
		}
		for a := range m.Atoms {
			if !rings.AtomInRing(a) {
				continue
			}
			var inRing []int
			for _, bi := range m.Atoms[a].Bonds {
				y := m.Bonds[bi].Other(a)
				if rings.BondInRing(bi) {
					inRing = append(inRing, y)
					continue
				}
				out := p(y).sub(p(a)).unit()
				centre := centres[root(a)].scale(1 / float64(counts[root(a)]))
				if away := p(a).sub(centre); away.norm() > 0.2 && out.dot(away.unit()) < 0 {
					t.Errorf("%s: the substituent %d of ring atom %d points into the ring system", c.name, y+1, a+1)
				}
			}
			if len(inRing) == 2 && len(m.Atoms[a].Bonds) == 2 {
				u, v := p(inRing[0]).sub(p(a)).unit(), p(inRing[1]).sub(p(a)).unit()
				if angle := math.Acos(max(-1, min(1, u.dot(v)))) * 180 / math.Pi; angle > 166 {
					t.Errorf("%s: ring atom %d drawn straight (%.0f degrees): it does not show", c.name, a+1, angle)
				}
			}
		}
	}
}

package ringgeom

import (
	"fmt"
	"slices"
	"testing"

	"stereoline/notation"
)

func TestPermutationParity(t *testing.T) {
	tests := []struct {
		xs       []int
		want     Parity
		distinct bool
	}{
		{[]int{}, Even, true},
		{[]int{1, 2, 3, 4}, Even, true},
		{[]int{2, 1, 3, 4}, Odd, true},  // one transposition
		{[]int{2, 3, 1, 4}, Even, true}, // a 3-cycle is two transpositions
		{[]int{4, 3, 2, 1}, Even, true}, // six inversions
		{[]int{4, 1, 2, 3}, Odd, true},  // a 4-cycle is three transpositions
		{[]int{-1, 5, 2, 9}, Odd, true}, // any values, not only 1..n
		{[]int{1, 1, 2}, Even, false},   // equal entries: not a permutation
		{[]int{2, 1, 1}, Even, false},   // two pairs strictly out of order
		{[]int{3, 1, 1, 2}, Odd, false}, // three pairs strictly out of order
	}
	for _, tt := range tests {
		got, distinct := PermutationParity(tt.xs)
		if got != tt.want || distinct != tt.distinct {
			t.Errorf("PermutationParity(%v) = %v, %v; want %v, %v", tt.xs, got, distinct, tt.want, tt.distinct)
		}
	}
}

// TestHand: '@' and '@@' are opposite senses (OpenSMILES 3.9.1), and a
// sense read in another order changes with the parity of the reordering:
// exchanging two ligands of a tetrahedral centre inverts its written
// mark (common practice: N[C@@H](C)C(=O)O and N[C@H](C(=O)O)C are both
// L-alanine).
func TestHand(t *testing.T) {
	if MarkHand(1) != Anticlockwise || MarkHand(2) != Clockwise || MarkHand(0) != NoHand || MarkHand(3) != NoHand {
		t.Errorf("MarkHand: 1 %v, 2 %v, 0 %v, 3 %v", MarkHand(1), MarkHand(2), MarkHand(0), MarkHand(3))
	}
	if Anticlockwise.Reversed() != Clockwise || Clockwise.Reversed() != Anticlockwise || NoHand.Reversed() != NoHand {
		t.Error("Reversed does not swap the two senses")
	}
	// the ligands of L-alanine as N[C@@H](C)C(=O)O writes them: N, H,
	// CH3, COOH; N[C@H](C(=O)O)C writes N, H, COOH, CH3, an odd
	// permutation of the first order, with the other mark
	first := MarkHand(2)
	p, _ := PermutationParity([]int{0, 1, 3, 2})
	if got := first.Permuted(p); got != MarkHand(1) {
		t.Errorf("L-alanine rewritten: hand %v, want %v", got, MarkHand(1))
	}
	if Trans.Permuted(Even) != Trans || Cis.Permuted(Odd) != Trans {
		t.Error("Permuted on cis/trans")
	}
}

func TestDisjointSets(t *testing.T) {
	s := NewDisjointSets(6)
	s.Union(0, 1)
	s.Union(2, 3)
	s.Union(1, 3)
	groups := map[int][]int{}
	for x := range 6 {
		groups[s.Find(x)] = append(groups[s.Find(x)], x)
	}
	if len(groups) != 3 || !slices.Equal(groups[s.Find(0)], []int{0, 1, 2, 3}) {
		t.Errorf("groups %v, want {0 1 2 3} {4} {5}", groups)
	}
}

// TestScramble: the splitmix64 finaliser keeps zero, and splitmix64
// seeded with 0 starts 0xe220a8397b1dcdaf (from memory; the published
// reference implementation's first output).
func TestScramble(t *testing.T) {
	if Scramble(0) != 0 {
		t.Errorf("Scramble(0) = %#x", Scramble(0))
	}
	if got := Mix64(0); got != 0xe220a8397b1dcdaf {
		t.Errorf("Mix64(0) = %#x, want 0xe220a8397b1dcdaf", got)
	}
}

// graphOf reads a molecule and marks its ring bonds by notation.FindRings.
func graphOf(t testing.TB, smiles string) (*Graph, *notation.Molecule) {
	m := notation.Read(smiles)
	if m.Errors.HasErrors() {
		t.Fatalf("%s: %v", smiles, m.Errors)
	}
	rings := notation.FindRings(m)
	ring := make([]bool, len(m.Bonds))
	for bi := range ring {
		ring[bi] = rings.BondInRing(bi)
	}
	g := &Graph{}
	g.Reset(m, ring)
	return g, m
}

// TestBicycles checks the bicycle searches on bicycles whose bridges
// are known by their names (IUPAC von Baeyer nomenclature, common
// practice): the bridges found are atom-disjoint, leave one bridgehead
// and end next to the other, and have the lengths the name gives.
func TestBicycles(t *testing.T) {
	tests := []struct {
		smiles  string
		x, y    int
		bridged []int // lengths of the three bridges, sorted; nil when none
		fused   []int // lengths of the two rings' paths of a fused bicycle
	}{
		{"C1CC2CCC1C2", 2, 5, []int{1, 2, 2}, nil},   // norbornane, bicyclo[2.2.1]heptane
		{"C1CC2CCC1CC2", 2, 5, []int{2, 2, 2}, nil},  // bicyclo[2.2.2]octane
		{"C1CC2CCCC1C2", 2, 6, []int{1, 2, 3}, nil},  // bicyclo[3.2.1]octane
		{"C1CC2CCC1CCC2", 2, 5, []int{2, 2, 3}, nil}, // bicyclo[3.2.2]nonane
		{"C12CCC1CC2", 0, 3, nil, []int{2, 2}},       // bicyclo[2.2.0]hexane, fused
		{"C12CCCC1CC2", 0, 4, nil, nil},              // bicyclo[3.2.0]heptane: seven atoms round, not small
		{"C12CC1CC2", 0, 2, nil, []int{1, 2}},        // bicyclo[2.1.0]pentane, fused
		{"C1CC2CCC1C2", 0, 2, nil, nil},              // an atom next to a head is no partner
	}
	for _, tt := range tests {
		g, m := graphOf(t, tt.smiles)
		paths, ok := g.BridgePaths(tt.x, tt.y)
		if ok != (tt.bridged != nil) {
			t.Errorf("%s: BridgePaths(%d, %d) ok = %v", tt.smiles, tt.x, tt.y, ok)
		} else if ok {
			var lengths []int
			seen := map[int]bool{}
			for _, p := range paths {
				lengths = append(lengths, len(p))
				if m.BondBetween(tt.x, p[0]) < 0 || m.BondBetween(tt.y, p[len(p)-1]) < 0 {
					t.Errorf("%s: bridge %v does not join %d to %d", tt.smiles, p, tt.x, tt.y)
				}
				for _, a := range p {
					if seen[a] {
						t.Errorf("%s: atom %d on two bridges", tt.smiles, a)
					}
					seen[a] = true
				}
			}
			slices.Sort(lengths)
			if !slices.Equal(lengths, tt.bridged) {
				t.Errorf("%s: bridges of lengths %v, want %v", tt.smiles, lengths, tt.bridged)
			}
			if !g.Bridgeable(tt.x, tt.y) {
				t.Errorf("%s: Bridgeable rejects a bicycle BridgePaths finds", tt.smiles)
			}
		}
		rings, ok := g.FusedPaths(tt.x, tt.y)
		if ok != (tt.fused != nil) {
			t.Errorf("%s: FusedPaths(%d, %d) ok = %v", tt.smiles, tt.x, tt.y, ok)
		} else if ok {
			got := []int{len(rings[0]), len(rings[1])}
			slices.Sort(got)
			if !slices.Equal(got, tt.fused) {
				t.Errorf("%s: fused paths of lengths %v, want %v", tt.smiles, got, tt.fused)
			}
		}
	}
}

// TestCageFixed: norbornane's bridgeheads are fixed by their cage (two
// equal two-carbon bridges, no configuration; common practice), unless
// one of those bridges carries a configuration, or the bridges differ.
func TestCageFixed(t *testing.T) {
	g, _ := graphOf(t, "C1CC2CCC1C2")
	if heads := g.PartnerHeads(2); !slices.Equal(heads, []int{5}) {
		t.Fatalf("partner heads of atom 2: %v, want [5]", heads)
	}
	paths, ok := g.BridgePaths(2, 5)
	if !ok {
		t.Fatal("no bridges")
	}
	allSame := func(a, b int) bool { return true }
	none := func(int) bool { return false }
	if !g.CageFixed(2, 5, paths, allSame, none) {
		t.Error("norbornane: bridgehead not fixed by its cage")
	}
	if g.CageFixed(2, 5, paths, func(a, b int) bool { return a == b }, none) {
		t.Error("bridges of different atoms taken as equal")
	}
	// atom 0 lies on a two-carbon bridge: configured there, that bridge
	// no longer mirrors the other, and the third has one atom only
	if g.CageFixed(2, 5, paths, allSame, func(a int) bool { return a == 0 }) {
		t.Error("a configured bridge left the bridgehead fixed")
	}
	if !g.CageFixed(2, 5, paths, allSame, func(a int) bool { return a == 6 }) {
		t.Error("a configuration on the odd bridge should leave the two equal ones to fix the heads")
	}
}

// TestRingDegree: naphthalene's fusion atoms have three ring bonds,
// toluene's methyl none.
func TestRingDegree(t *testing.T) {
	g, _ := graphOf(t, "c1ccc2ccccc2c1C")
	var got []int
	for a := range 11 {
		got = append(got, g.RingDegree(a))
	}
	if want := []int{2, 2, 2, 3, 2, 2, 2, 2, 3, 2, 0}; !slices.Equal(got, want) {
		t.Errorf("ring degrees %v, want %v", got, want)
	}
}

// TestAllenes: the ends of an allene and a cumulene, and the allene's
// ligands in the order OpenSMILES 3.9.6 reads an extended tetrahedral
// mark (by where the notation names each as seen from its end atom).
func TestAllenes(t *testing.T) {
	cumulated := func(m *notation.Molecule) func(int) bool {
		return func(a int) bool {
			at := &m.Atoms[a]
			if len(at.Bonds) != 2 || at.HydrogenCount() != 0 {
				return false
			}
			for _, bi := range at.Bonds {
				if m.Bonds[bi].Order != notation.OrderDouble {
					return false
				}
			}
			return true
		}
	}
	tests := []struct {
		smiles         string
		centre         int
		ends           [2]int
		ok             bool
		ligands, atEnd []int
	}{
		{"CC=[C@]=CC", 2, [2]int{1, 3}, true, []int{0, Implicit, Implicit, 4}, []int{0, 0, 1, 1}},
		{"OC(Cl)=[C@]=C(F)Br", 3, [2]int{1, 4}, true, []int{0, 2, 5, 6}, []int{0, 0, 1, 1}},
		// a cyclic allene: ring-closure neighbours stand at their digits
		{"C1(F)=[C@]=C1", 2, [2]int{0, 3}, true, []int{3, 1, Implicit, 0}, []int{0, 0, 1, 1}},
		// a ring of cumulated atoms: both arms walk round to the centre
		{"C1=C=C=C=1", 0, [2]int{}, false, nil, nil},
		{"CC=C=C=CC", 2, [2]int{}, false, nil, nil}, // an odd cumulene has no centre atom
		{"CC=C=C=C=CC", 3, [2]int{1, 5}, true, []int{0, Implicit, Implicit, 6}, []int{0, 0, 1, 1}},
		{"F[C@@H]=C=C(Cl)Br", 2, [2]int{1, 3}, true, []int{0, Implicit, 4, 5}, []int{0, 0, 1, 1}},
	}
	for _, tt := range tests {
		m := notation.Read(tt.smiles)
		ends, inner, ok := AlleneEnds(m, cumulated(m), tt.centre)
		if ok != tt.ok {
			t.Errorf("%s: AlleneEnds(%d) ok = %v", tt.smiles, tt.centre, ok)
			continue
		}
		if !ok {
			continue
		}
		if ends != tt.ends && ends != [2]int{tt.ends[1], tt.ends[0]} {
			t.Errorf("%s: ends %v, want %v", tt.smiles, ends, tt.ends)
		}
		if ends != tt.ends {
			ends, inner = [2]int{ends[1], ends[0]}, [2]int{inner[1], inner[0]}
		}
		ligs, atEnd := AlleneLigands(m, ends, inner, false)
		if !slices.Equal(ligs, tt.ligands) || !slices.Equal(atEnd, tt.atEnd) {
			t.Errorf("%s: ligands %v at ends %v, want %v at %v", tt.smiles, ligs, atEnd, tt.ligands, tt.atEnd)
		}
	}
}

// TestLigands: the stereo order puts implicit hydrogens at the hydrogen
// slot, after the preceding atom (OpenSMILES 3.9.1), and a lone pair
// where the molecule's reading puts it; folded [H] atoms count as
// hydrogens where they are written.
func TestLigands(t *testing.T) {
	tests := []struct {
		smiles         string
		atom           int
		lonePair, fold bool
		want           []int
	}{
		{"N[C@@H](C)C(=O)O", 1, false, false, []int{0, Implicit, 2, 3}},
		{"[C@@H](N)(C)C(=O)O", 0, false, false, []int{Implicit, 1, 2, 3}},
		// by default the lone pair stands last, as RDKit reads it
		// (notation.Reading); a ring digit on a centre with only
		// single bonds puts it before the last neighbour
		{"C[S@](=O)CC", 1, true, false, []int{0, 2, 3, Implicit}},
		{"C[N@]1CC1C", 1, true, false, []int{0, 3, Implicit, 2}},
		{"[H][C@](F)(Cl)Br", 1, false, false, []int{0, 2, 3, 4}},
		{"[H][C@](F)(Cl)Br", 1, false, true, []int{Implicit, 2, 3, 4}},
		{"[2H][C@](F)(Cl)Br", 1, false, true, []int{0, 2, 3, 4}}, // an isotope is no plain hydrogen
	}
	for _, tt := range tests {
		m := notation.Read(tt.smiles)
		if got := Ligands(m, tt.atom, tt.lonePair, tt.fold); !slices.Equal(got, tt.want) {
			t.Errorf("%s: ligands of %d = %v, want %v", tt.smiles, tt.atom, got, tt.want)
		}
	}
	// read with the lone pair in the hydrogen's slot (OpenSMILES 3.8.2
	// for a hydrogen, Open Babel for a lone pair)
	slot := notation.Reading{LonePair: notation.LonePairHydrogenSlot}
	for _, tt := range []struct {
		smiles string
		atom   int
		want   []int
	}{
		{"C[S@](=O)CC", 1, []int{0, Implicit, 2, 3}},
		{"[S@](=O)(C)CC", 0, []int{Implicit, 1, 2, 3}},
		{"C[N@]1CC1C", 1, []int{0, Implicit, 3, 2}},
	} {
		if got := Ligands(notation.ReadWith(tt.smiles, slot), tt.atom, true, false); !slices.Equal(got, tt.want) {
			t.Errorf("%s read with %s: ligands of %d = %v, want %v", tt.smiles, slot, tt.atom, got, tt.want)
		}
	}
}

// cages are polycyclic hydrocarbons for the search benchmark.
var cages = []string{
	"C12C3C4C1C5C2C3C45", "C1C2CC3CC1CC(C2)C3", "C1CC2CCC1C2", "C1CC2CCC1CC2",
	"C1C2C3C1C4C2C34", "CC1(C)C2CCC1(C)C(=O)C2", "c1ccc2c(c1)C1CCC2C2CCCC12",
}

// BenchmarkCageSearch runs the cage test from every ring atom with three
// ring bonds, with the scratch space of one Graph kept across molecules
// (as the engines keep it) and with a new Graph for each molecule: the
// difference is what keeping the scratch saves.
func BenchmarkCageSearch(b *testing.B) {
	type mol struct {
		m    *notation.Molecule
		ring []bool
	}
	var mols []mol
	for _, s := range cages {
		g, m := graphOf(b, s)
		mols = append(mols, mol{m, g.ring})
	}
	same := func(a, c int) bool { return true }
	none := func(int) bool { return false }
	run := func(g *Graph, m mol) (n int) {
		g.Reset(m.m, m.ring)
		for x := range m.m.Atoms {
			if g.RingDegree(x) < 3 {
				continue
			}
			for _, y := range g.PartnerHeads(x) {
				if paths, ok := g.BridgePaths(x, y); ok && g.CageFixed(x, y, paths, same, none) {
					n++
				}
			}
		}
		return n
	}
	for _, fresh := range []bool{false, true} {
		b.Run(fmt.Sprintf("fresh=%v", fresh), func(b *testing.B) {
			kept := &Graph{}
			for b.Loop() {
				for _, m := range mols {
					g := kept
					if fresh {
						g = &Graph{}
					}
					run(g, m)
				}
			}
		})
	}
}

package stereo

import (
	"fmt"
	"math/rand/v2"
	"slices"
	"sort"
	"strconv"
	"strings"
	"testing"

	"stereoline/notation"
)

// TestStereogenicTogether checks units that are stereogenic only with a
// partner, and marks whose meaning waits for one.
func TestStereogenicTogether(t *testing.T) {
	cases := []struct {
		name, smiles string
		specified    int                   // units the marks specify
		want         map[notation.Code]int // diagnostics by code
		source       string
	}{
		// 1,4-dimethylcyclohexane has cis and trans isomers (common
		// practice); one mark alone is half a relative configuration:
		// its partner is undefined, the mark itself is not noise
		{"one of a 1,4 pair marked", "C[C@H]1CCC(C)CC1", 0, map[notation.Code]int{CodeUndefined: 1}, "common practice"},
		{"both of a 1,4 pair marked", "C[C@H]1CC[C@H](C)CC1", 2, map[notation.Code]int{}, "common practice"},
		// methylcyclohexane has no stereoisomers (common practice)
		{"no partner", "C[C@H]1CCCCC1", 0, map[notation.Code]int{CodeIneffectiveCenter: 1}, "common practice"},
		// (4-methylcyclohexylidene)acetic acid is axially chiral (common
		// practice): the ring carbon and the exocyclic double bond are
		// stereogenic together
		{"exocyclic unmarked", "CC1CCC(=CC(=O)O)CC1", 0, map[notation.Code]int{CodeUndefined: 2}, "common practice"},
		{"exocyclic, centre marked", "C[C@H]1CCC(CC1)=CC(=O)O", 0, map[notation.Code]int{CodeUndefined: 1}, "common practice"},
		{"exocyclic, bond marked", "CC1CC/C(=C/C(=O)O)CC1", 0, map[notation.Code]int{CodeUndefined: 1}, "common practice"},
		{"exocyclic, both marked", "C[C@H]1CC/C(=C/C(=O)O)CC1", 2, map[notation.Code]int{}, "common practice"},
		// cyclohexylideneacetic acid has no stereoisomers (common practice)
		{"exocyclic, no partner", "C1CC/C(=C/C(=O)O)CC1", 0, map[notation.Code]int{CodeIneffectiveBond: 1}, "common practice"},
		// a mark shared by two conjugated double bonds configures the
		// first, whose other end is marked too; the second stays open
		// (OpenSMILES 1.0, 3.8.3 on conjugated systems)
		{"shared mark", "C/C=C/C=CC", 1, map[notation.Code]int{CodeOneSidedBond: 1}, "OpenSMILES 1.0"},
		{"shared mark, terminal CH2", "C/C=C/C=C", 1, map[notation.Code]int{}, "OpenSMILES 1.0"},
		// a double bond between a (R) and an (S) branch is stereogenic,
		// between two (R) branches it is not (worked by hand: the two
		// (R) branches are the same, the (R) and (S) ones mirror images)
		{"double bond between R and S", "C[C@@H](O)C(=CC)[C@@H](O)C", 2, map[notation.Code]int{CodeUndefined: 1}, "worked by hand"},
		{"double bond between R and R", "C[C@@H](O)C(=CC)[C@H](O)C", 2, map[notation.Code]int{}, "worked by hand"},
		// spiro[3.3]heptane-2,6-dicarboxylic acid (Fecht's acid) is
		// axially chiral (common practice); RDKit 2022.09's
		// FindPotentialStereo flags the same three atoms unmarked. Its
		// two ring carbons are written relative to their ring
		// neighbours, so the spiro atom needs a mark too
		{"Fecht's acid unmarked", "OC(=O)C1CC2(C1)CC(C2)C(=O)O", 0, map[notation.Code]int{CodeUndefined: 3}, "common practice; RDKit FindPotentialStereo"},
		{"Fecht's acid, spiro atom open", "OC(=O)[C@H]1CC2(C1)C[C@@H](C2)C(=O)O", 0, map[notation.Code]int{CodeUndefined: 1}, "worked by hand"},
		{"Fecht's acid marked", "OC(=O)[C@H]1C[C@]2(C1)C[C@@H](C2)C(=O)O", 3, map[notation.Code]int{}, "worked by hand"},
		{"3,9-dimethylspiro[5.5]undecane", "CC1CCC2(CC1)CCC(C)CC2", 0, map[notation.Code]int{CodeUndefined: 3}, "RDKit FindPotentialStereo"},
		// one substituent only: no partner across the spiro atom
		{"spiro[3.3]heptane-2-carboxylic acid", "OC(=O)C1CC2(C1)CCC2", 0, map[notation.Code]int{}, "common practice"},
		// 2,6-dimethyladamantane: the two CHMe carbons share the cage but
		// no smallest ring (worked by hand; RDKit flags them too, and the
		// bridgeheads, whose configuration the cage fixes)
		{"2,6-dimethyladamantane", "CC1C2CC3CC1CC(C2)C3C", 0, map[notation.Code]int{CodeUndefined: 2}, "worked by hand"},
		// 3-methyl-cis-bicyclo[3.3.0]octane: exo or endo, fixed against
		// the marked bridgeheads; in the trans-fused isomer the two
		// branches of C3 are related by a twofold axis (worked by hand)
		{"bicyclo[3.3.0]octane, cis", "CC1C[C@H]2CCC[C@H]2C1", 2, map[notation.Code]int{CodeUndefined: 1}, "worked by hand"},
		{"bicyclo[3.3.0]octane, trans", "CC1C[C@H]2CCC[C@@H]2C1", 2, map[notation.Code]int{}, "worked by hand"},
	}
	for _, c := range cases {
		a := Analyze(notation.Read(c.smiles))
		specified := 0
		for _, u := range a.Units {
			if u.Specified {
				specified++
			}
		}
		got := map[notation.Code]int{}
		for _, e := range a.Diagnostics {
			got[e.Code]++
		}
		ok := specified == c.specified && len(got) == len(c.want)
		for code, n := range c.want {
			ok = ok && got[code] == n
		}
		if !ok {
			t.Errorf("%s (%s): %s gives %d specified units and %v, want %d and %v",
				c.name, c.source, c.smiles, specified, got, c.specified, c.want)
		}
	}
}

// TestPerceptionInvariance checks that what perception finds does not
// depend on how a structure is written: over 10 random writings (atom
// order, ring-closure numbers, branch order, Kekulé or aromatic), each
// structure keeps its units (kind, atoms, specified, label) and the
// number of diagnostics of each code. The structures are the cases of
// the perception tests above and of bridgehead_test.go.
func TestPerceptionInvariance(t *testing.T) {
	structures := []string{
		"CC1CCC(=CC(=O)O)CC1", "C[C@H]1CCC(CC1)=CC(=O)O", "CC1CC/C(=C/C(=O)O)CC1", "C[C@H]1CC/C(=C/C(=O)O)CC1",
		"C[C@H]1CCC(C)CC1", "CC1CCC(C)CC1", "C[C@H]1CCCCC1", "C1CC/C(=C/C(=O)O)CC1",
		"C/C=C/C=CC", "C[C@@H](O)C(=CC)[C@@H](O)C", "C[C@@H](O)C(=CC)[C@H](O)C",
		"[C@H]12CC[C@H](C1)CC2", "CC1(C)[C@@H]2CC[C@@]1(C)C(=O)C2",
		"c1ccc2c(c1)C[C@@H]1C3c4ccccc4C(c4ccccc43)[C@H]1C2", "O[C@H]1C[C@H]2C[C@H](O)[C@@H]1CC2",
		"CC1=CC2=C(C=C1)N3CC4=C(C=CC(=C4)C)N(C2)C3", "CC1=CC2=C(C=C1)[N@]3CC4=C(C=CC(=C4)C)[N@@](C2)C3",
		"[C@H]12CC[C@@H]1CC2", "[C@H]12CCC[C@@H]1CCC2", "O=C(/C=C/c1ccccc1Cl)/C=C/c1ccccc1Cl",
		"OC(=O)C1CC2(C1)CC(C2)C(=O)O", "OC(=O)[C@H]1CC2(C1)C[C@@H](C2)C(=O)O", "OC(=O)[C@H]1C[C@]2(C1)C[C@@H](C2)C(=O)O",
		"CC1C2CC3CC1CC(C2)C3C", "CC1C[C@H]2CCC[C@H]2C1", "CC1C[C@H]2CCC[C@@H]2C1",
	}
	describe := func(a *Analysis, order []int) string {
		var parts []string
		for _, u := range a.Units {
			atoms := make([]string, len(u.Atoms))
			for i, at := range u.Atoms {
				if order != nil {
					at = order[at]
				}
				atoms[i] = strconv.Itoa(at)
			}
			sort.Strings(atoms)
			parts = append(parts, fmt.Sprintf("%s:%s:%v:%s", u.Kind, strings.Join(atoms, ","), u.Specified, u.Descriptor))
		}
		for _, e := range a.Diagnostics {
			if e.Code == CodeReaderDependent {
				// a finding on the writing itself: the writer avoids the
				// constructs readers read differently
				continue
			}
			parts = append(parts, string(e.Code))
		}
		sort.Strings(parts)
		return strings.Join(parts, " ")
	}
	for si, s := range structures {
		m := notation.Read(s)
		n := len(m.Atoms)
		identity := make([]int, n)
		for i := range identity {
			identity[i] = i
		}
		want := describe(Analyze(m), identity)
		rng := rand.New(rand.NewPCG(uint64(si), 7))
		for k := 0; k < 10; k++ {
			w := notation.Write(m, notation.WriteOptions{Random: rng, Kekule: k%2 == 1, Start: rng.IntN(n)})
			if len(w.Unadjusted) > 0 || len(w.Dropped) > 0 {
				continue
			}
			// units of the rewriting name its own atoms; w.Order maps
			// them back to the atoms of the first writing
			if got := describe(Analyze(notation.Read(w.Text)), w.Order); got != want {
				t.Errorf("%s gives %s; its writing %s gives %s", s, want, w.Text, got)
				break
			}
		}
	}
}

// TestSpiroMarksTogether checks the three marks of Fecht's acid as one
// unit: it has two stereoisomers, so turning two of the marks gives the
// same compound and turning one gives its mirror image (worked by hand
// from the renaming that swaps the two branches of one ring).
func TestSpiroMarksTogether(t *testing.T) {
	base := "OC(=O)[C@H]1C[C@]2(C1)C[C@@H](C2)C(=O)O"
	same := []string{
		"OC(=O)[C@@H]1C[C@@]2(C1)C[C@@H](C2)C(=O)O",
		"OC(=O)[C@@H]1C[C@]2(C1)C[C@H](C2)C(=O)O",
		"OC(=O)[C@H]1C[C@@]2(C1)C[C@H](C2)C(=O)O",
	}
	mirrors := []string{
		"OC(=O)[C@@H]1C[C@]2(C1)C[C@@H](C2)C(=O)O",
		"OC(=O)[C@H]1C[C@@]2(C1)C[C@@H](C2)C(=O)O",
		"OC(=O)[C@H]1C[C@]2(C1)C[C@H](C2)C(=O)O",
	}
	labels := func(s string) []Descriptor {
		var out []Descriptor
		for _, u := range Analyze(notation.Read(s)).Units {
			out = append(out, u.Descriptor)
		}
		return out
	}
	want := labels(base)
	if len(want) != 3 {
		t.Fatalf("%s: %d units, want 3", base, len(want))
	}
	for _, s := range same {
		if got := labels(s); !slices.Equal(got, want) {
			t.Errorf("%s: %v, want the labels of %s, %v", s, got, base, want)
		}
	}
	var mirrored []Descriptor
	for _, d := range want {
		mirrored = append(mirrored, d.Mirror())
	}
	for _, s := range mirrors {
		if got := labels(s); !slices.Equal(got, mirrored) {
			t.Errorf("%s: %v, want the mirror labels %v", s, got, mirrored)
		}
	}
}

// TestOpenRingSystemPartners checks a ring-paired atom whose two ring
// branches are told apart by a pair of stereocentres of its ring system
// that are themselves unmarked.
func TestOpenRingSystemPartners(t *testing.T) {
	cases := []struct {
		name, smiles string
		undefined    int
		source       string
	}{
		// tropine and pseudotropine are the two C3 epimers (common
		// practice): unmarked, C3 is reported with both bridgeheads
		{"tropine unmarked", "CN1C2CCC1CC(O)C2", 3, "common practice"},
		// with one stereocentre only in the ring, it sits on the
		// symmetry of the two branches (4-methylpiperidine N-substituted)
		{"4-methylpiperidine", "CC1CCN(C(C)CC)CC1", 1, "worked by hand"},
	}
	for _, c := range cases {
		a := Analyze(notation.Read(c.smiles))
		n := 0
		for _, e := range a.Diagnostics {
			if e.Code == CodeUndefined {
				n++
			}
		}
		if n != c.undefined {
			t.Errorf("%s (%s): %s gives %d undefined units, want %d: %v", c.name, c.source, c.smiles, n, c.undefined, a.Diagnostics)
		}
	}
}

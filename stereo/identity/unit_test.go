package identity

import (
	"math/rand/v2"
	"strings"
	"testing"

	"stereoline/notation"
)

// Identity of single structures. The chemistry of each case is textbook
// (common practice); the writings were made by hand.
func TestIdentifyCases(t *testing.T) {
	tests := []struct {
		name      string
		a, b      string
		same      bool      // a and b are one structure
		chirality Chirality // of a
	}{
		{"alanine written from both ends", "N[C@@H](C)C(=O)O", "OC(=O)[C@@H](N)C", true, Chiral},
		{"alanine with an explicit hydrogen", "N[C@@H](C)C(=O)O", "N[C@@]([H])(C)C(=O)O", true, Chiral},
		{"L- and D-alanine", "N[C@@H](C)C(=O)O", "N[C@H](C)C(=O)O", false, Chiral},
		{"meso-tartaric acid and its mirror image", "OC(=O)[C@H](O)[C@H](O)C(=O)O", "OC(=O)[C@@H](O)[C@@H](O)C(=O)O", true, Meso},
		{"meso-tartaric acid written from the middle", "OC(=O)[C@H](O)[C@H](O)C(=O)O", "[C@@H](O)(C(=O)O)[C@@H](O)C(=O)O", true, Meso},
		{"(R,R)- and (S,S)-tartaric acid", "OC(=O)[C@H](O)[C@@H](O)C(=O)O", "OC(=O)[C@@H](O)[C@H](O)C(=O)O", false, Chiral},
		{"a mark on propan-2-ol means nothing", "C[C@H](C)O", "CC(C)O", true, Achiral},
		{"cis- and trans-1,4-dimethylcyclohexane", "C[C@H]1CC[C@@H](C)CC1", "C[C@H]1CC[C@H](C)CC1", false, Achiral},
		{"cis-1,4-dimethylcyclohexane written two ways", "C[C@H]1CC[C@@H](C)CC1", "C1C[C@@H](C)CC[C@H]1C", true, Achiral},
		{"methylcyclohexane ring mark means nothing", "C[C@H]1CCCCC1", "CC1CCCCC1", true, Achiral},
		{"E- and Z-1,2-difluoroethene", "F/C=C/F", "F/C=C\\F", false, Achiral},
		{"E-1,2-difluoroethene written two ways", "F/C=C/F", "F\\C=C\\F", true, Achiral},
		{"E-but-2-ene both ends marked", "C/C=C/C", "C(/C)=C/C", false, Achiral},
		{"1,1-difluoroethene has no E/Z", "F/C(F)=C/C", "FC(F)=CC", true, Achiral},
		{"penta-2,3-diene enantiomers", "CC=[C@]=CC", "CC=[C@@]=CC", false, Chiral},
		{"penta-2,3-diene written backwards", "CC=[C@]=CC", "CC=[C@]=CC", true, Chiral},
		// aromatic and Kekulé writings of one compound (OpenSMILES 3.5)
		{"benzene", "c1ccccc1", "C1=CC=CC=C1", true, Achiral},
		{"pyridine", "c1ccncc1", "C1=CC=NC=C1", true, Achiral},
		{"pyrrole", "c1cc[nH]c1", "C1=CNC=C1", true, Achiral},
		{"naphthalene, the shared bond single", "c1ccc2ccccc2c1", "C1=CC=C2C=CC=CC2=C1", true, Achiral},
		{"naphthalene, the shared bond double", "c1ccc2ccccc2c1", "C=1C=CC2=CC=CC=C2C=1", true, Achiral},
		{"indole", "c1ccc2[nH]ccc2c1", "C1=CC=C2NC=CC2=C1", true, Achiral},
		{"2-pyridone", "O=c1cccc[nH]1", "O=C1C=CC=CN1", true, Achiral},
		{"biphenyl with an implied link", "c1ccccc1c1ccccc1", "C1=CC=CC=C1C1=CC=CC=C1", true, Achiral},
		{"cyclohexa-1,3-diene is not aromatic", "C1=CC=CCC1", "c1ccccc1", false, Achiral},
		{"L-phenylalanine, Kekulé ring", "N[C@@H](Cc1ccccc1)C(=O)O", "N[C@@H](CC1=CC=CC=C1)C(=O)O", true, Chiral},
		// an imine on an aromatic ring atom whose ring neighbours differ
		// has E and Z forms; its ring bonds are its substituents
		{"imine on a thiazoline ring, E and Z", "C/N=c1/sccn1C", "C/N=c1\\sccn1C", false, Achiral},
		{"imine on a thiazoline ring, Kekulé ring", "C/N=c1/sccn1C", "C/N=C1/SC=CN1C", true, Achiral},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			a, b := Identify(notation.Read(tc.a)), Identify(notation.Read(tc.b))
			if (a.Key == b.Key) != tc.same {
				t.Errorf("%s vs %s: same key %v, want %v", tc.a, tc.b, a.Key == b.Key, tc.same)
			}
			// every pair but the one marked "not aromatic" shares a constitution
			if !strings.Contains(tc.name, "not aromatic") && a.ConstitutionKey != b.ConstitutionKey {
				t.Errorf("%s vs %s: constitution keys differ", tc.a, tc.b)
			}
			if a.Chirality != tc.chirality {
				t.Errorf("%s: chirality %v, want %v", tc.a, a.Chirality, tc.chirality)
			}
		})
	}
}

// TestStereoisomerCounts: textbook counts (common practice).
func TestStereoisomerCounts(t *testing.T) {
	tests := []struct {
		smiles string
		want   int
		why    string
	}{
		{"CCO", 1, "ethanol has no stereogenic unit"},
		{"CC(O)CC", 2, "butan-2-ol: one centre"},
		{"OC(C(=O)O)C(O)C(=O)O", 3, "tartaric acid: (R,R), (S,S) and meso"},
		{"CC(O)C(O)C", 3, "butane-2,3-diol: (R,R), (S,S) and meso"},
		{"OC(C(O)C(=O)O)C(O)C(=O)O", 4, "2,3,4-trihydroxyglutaric acid: two meso forms and one pair"},
		{"CC=CC", 2, "but-2-ene: E and Z"},
		{"CC1CCC(C)CC1", 2, "1,4-dimethylcyclohexane: cis and trans, both achiral"},
		{"CC(O)C(Cl)C", 4, "3-chlorobutan-2-ol: two different centres"},
		{"OC(C)C(O)C(C)O", 4, "pentane-2,3,4-triol: C3 is pseudoasymmetric"},
		{"CC=C=CC", 2, "penta-2,3-diene: an axially chiral pair"},
		{"FC=C=C=CF", 2, "1,4-difluorobutatriene: an odd cumulene has cis and trans forms"},
		{"CC(C)=C=C=CC", 1, "2-methylhexa-2,3,4-triene: one end carries two methyls, so no isomers"},
		{"OCC(O)C(O)C(O)C(O)C=O", 16, "an aldohexose: four centres"},
		{"CC1(C)C2CCC1(C)C(=O)C2", 2, "camphor: two bridgeheads of a bicyclo[2.2.1] cage, one relative configuration"},
		{"OC1CC2CCC1C2", 4, "norbornan-2-ol: exo and endo, each a pair of enantiomers"},
		{"C1CCC2CCCCC2C1", 2, "decalin: cis and trans, both possible in a [4.4.0] system"},
		{"CC12CCC(CC1)CC2", 1, "1-methylbicyclo[2.2.2]octane: no stereocentre"},
	}
	for _, tc := range tests {
		got := Stereoisomers(notation.Read(tc.smiles))
		if got.Count != tc.want {
			t.Errorf("%s (%s): %d stereoisomers (%d units), want %d", tc.smiles, tc.why, got.Count, got.Units, tc.want)
		}
	}
}

// TestKeyOverWriterWritings: every random writing the project's writer
// makes of a fixture molecule (OpenSMILES allows many) must give the
// molecule's key. The writer rewrites every mark for the new order; the
// few it cannot (Written.Unadjusted: an allene with a CH2 end) are left
// out.
func TestKeyOverWriterWritings(t *testing.T) {
	mols := fixtureMolecules(t, 300)
	bad := 0
	for k, text := range mols {
		m := notation.Read(text)
		if m.Errors.HasErrors() || m.Reaction {
			continue
		}
		want := Identify(m).Key
		for i := 0; i < 5; i++ {
			w := notation.Write(m, notation.WriteOptions{Random: rand.New(rand.NewPCG(uint64(k), uint64(i)))})
			if len(w.Unadjusted) > 0 || len(w.Dropped) > 0 {
				break
			}
			if got := Identify(notation.Read(w.Text)).Key; got != want {
				bad++
				t.Errorf("%s written as %s: key differs", text, w.Text)
				break
			}
		}
	}
	if bad > 0 {
		t.Logf("%d molecules whose writings disagree", bad)
	}
}

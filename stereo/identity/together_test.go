package identity

import (
	"math/rand/v2"
	"testing"

	"stereoline/notation"
)

// Units whose stereogenicity depends on another unit or on a cage: the
// key must keep exactly the marks that tell compounds apart. RDKit
// 2022.09 (the identity.tsv fixture) perceives neither exocyclic axial
// chirality nor double bonds made stereogenic by the configurations of
// their ligands, so these cases are checked against common practice and
// against reasoning written beside each, not against that fixture.
func TestIdentifyUnitsTogether(t *testing.T) {
	// relation of b to a
	const (
		same = iota
		mirror
		other // another stereoisomer, not the mirror image
	)
	tests := []struct {
		name      string
		a, b      string
		rel       int
		chirality Chirality // of a
	}{
		// (4-methylcyclohexylidene)acetic acid is axially chiral (common
		// practice): the marked centre and the exocyclic bond are one
		// stereogenic unit together, so flipping either gives the other
		// enantiomer. Inverting every @ of a writing gives its mirror
		// image (OpenSMILES: / and \ survive a reflection), so a and the
		// first b are enantiomers by construction.
		{"(4-methylcyclohexylidene)acetic acid, centre flipped", "C[C@H]1CC/C(=C/C(=O)O)CC1", "C[C@@H]1CC/C(=C/C(=O)O)CC1", mirror, Chiral},
		// Worked by hand: renaming the two equal ring branches writes
		// C[C@@H]1CC/C(=C/C(=O)O)CC1 with its ring neighbours listed the
		// other way round at both ring ends, which inverts the centre's
		// mark and the bond's; so flipping the bond alone also gives the
		// mirror image.
		{"(4-methylcyclohexylidene)acetic acid, bond flipped", "C[C@H]1CC/C(=C/C(=O)O)CC1", "C[C@H]1CC/C(=C\\C(=O)O)CC1", mirror, Chiral},
		{"(4-methylcyclohexylidene)acetic acid, both flipped", "C[C@H]1CC/C(=C/C(=O)O)CC1", "C[C@@H]1CC/C(=C\\C(=O)O)CC1", same, Chiral},
		{"4-methylcyclohexanone oxime, bond flipped", "C[C@H]1CC/C(=N/O)CC1", "C[C@H]1CC/C(=N\\O)CC1", mirror, Chiral},
		// without a partner on the ring the bond marks mean nothing
		// (cyclohexylideneacetic acid has no stereoisomers; common practice)
		{"cyclohexylideneacetic acid", "C1CC/C(=C/C(=O)O)CC1", "C1CCC(=CC(=O)O)CC1", same, Achiral},
		// An allene off the ring is stereogenic with the ring centre too,
		// but achiral: the far end's ligands lie in the ring's mirror
		// plane (through C1, C4 and the allene axis), so flipping one
		// unit gives a diastereomer and flipping both the same structure
		// (worked by hand).
		{"4-ethylcyclohexylidene-propene, allene flipped", "CC=[C@]=C1CC[C@H](CC1)CC", "CC=[C@@]=C1CC[C@H](CC1)CC", other, Achiral},
		{"4-ethylcyclohexylidene-propene, both flipped", "CC=[C@]=C1CC[C@H](CC1)CC", "CC=[C@@]=C1CC[C@@H](CC1)CC", same, Achiral},
		{"cyclohexylidene-propene", "CC=[C@]=C1CCCCC1", "CC=C=C1CCCCC1", same, Achiral},
		// 4,4'-diethylbicyclohexylidene: the central bond joins the two
		// ring centres, whose ethyl groups lie in one mirror plane, on one
		// side of the bond's plane or on opposite sides: two achiral
		// diastereomers (worked by hand; the labeller says E and Z)
		{"4,4'-diethylbicyclohexylidene, E and Z", "CC[C@@H]1CC/C(/CC1)=C\\2/CC[C@H](CC2)CC", "CC[C@@H]1CC/C(/CC1)=C\\2/CC[C@@H](CC2)CC", other, Achiral},
		{"4,4'-diethylbicyclohexylidene, both centres flipped", "CC[C@@H]1CC/C(/CC1)=C\\2/CC[C@H](CC2)CC", "CC[C@H]1CC/C(/CC1)=C\\2/CC[C@@H](CC2)CC", same, Achiral},
		{"4-methylbicyclohexylidene has no stereoisomers", "C[C@@H]1CC/C(/CC1)=C\\2/CCCCC2", "CC1CCC(CC1)=C1CCCCC1", same, Achiral},
		// Spiranes (common practice): spiro[4.4]nonane-1,6-dione is
		// axially chiral through its spiro centre alone, whose ligands
		// tie by constitution; 2,6-dichlorospiro[3.3]heptane is axially
		// chiral through its three centres together; in
		// 2-chlorospiro[3.3]heptane nothing is stereogenic.
		{"spiro[4.4]nonane-1,6-dione enantiomers", "O=C1[C@@]2(CCCC2=O)CCC1", "O=C1[C@]2(CCCC2=O)CCC1", mirror, Chiral},
		{"2,6-dichlorospiro[3.3]heptane, one ring centre flipped", "Cl[C@H]1C[C@]2(C1)C[C@H](C2)Cl", "Cl[C@@H]1C[C@]2(C1)C[C@H](C2)Cl", mirror, Chiral},
		{"2,6-dichlorospiro[3.3]heptane, spiro centre flipped too", "Cl[C@H]1C[C@]2(C1)C[C@H](C2)Cl", "Cl[C@@H]1C[C@@]2(C1)C[C@H](C2)Cl", same, Chiral},
		{"2-chlorospiro[3.3]heptane", "Cl[C@H]1C[C@]2(C1)CCC2", "ClC1CC2(C1)CCC2", same, Achiral},
		// 1,3-bis(4-methylcyclohexyl)propan-2-ol: with one cis and one
		// trans ring the central carbon's branches differ, so it is a
		// stereocentre and the compound chiral; with two rings alike it
		// is none (worked by hand; the labeller agrees, R/S or no unit).
		// The first writing has unlike rings, the third like ones.
		{"bis(methylcyclohexyl)propanol, unlike rings, centre flipped", "O[C@@H](C[C@H]1CC[C@@H](CC1)C)C[C@@H]2CC[C@@H](CC2)C", "O[C@H](C[C@H]1CC[C@@H](CC1)C)C[C@@H]2CC[C@@H](CC2)C", mirror, Chiral},
		{"bis(methylcyclohexyl)propanol, unlike and like rings", "O[C@@H](C[C@H]1CC[C@@H](CC1)C)C[C@@H]2CC[C@@H](CC2)C", "O[C@@H](C[C@H]1CC[C@@H](CC1)C)C[C@H]2CC[C@@H](CC2)C", other, Chiral},
		{"bis(methylcyclohexyl)propanol, like rings, centre flipped", "O[C@@H](C[C@H]1CC[C@@H](CC1)C)C[C@H]2CC[C@@H](CC2)C", "O[C@H](C[C@H]1CC[C@@H](CC1)C)C[C@H]2CC[C@@H](CC2)C", same, Achiral},
		// the far end carries two equal ligands: no unit (common practice)
		{"4-methyl-1-(propan-2-ylidene)cyclohexane", "C[C@H]1CCC(=C(C)C)CC1", "CC1CCC(=C(C)C)CC1", same, Achiral},

		// Bridgeheads fixed by their cage (common practice): norbornane
		// has no stereoisomers, so its bridgehead marks say nothing.
		{"norbornane", "[C@H]12CC[C@H](C1)CC2", "C1CC2CCC1C2", same, Achiral},
		{"1-methylnorbornane", "C[C@]12CC[C@H](C1)CC2", "CC12CCC(C1)CC2", same, Achiral},
		// 9,10-dihydro-9,10-ethanoanthracene fused at its ethano bridge:
		// the bridgeheads follow the ethano carbons, so marks on them add
		// nothing (worked by hand: the two benzo bridges are equal and
		// unconfigured). Cis is meso, trans a pair of enantiomers.
		{"ethanoanthracene, bridgehead marks added", "c1ccc2c(c1)C[C@H]1C3c4ccccc4C(c4ccccc43)[C@H]1C2", "c1ccc2c(c1)C[C@H]1[C@H]3c4ccccc4[C@@H](c4ccccc43)[C@H]1C2", same, Meso},
		{"ethanoanthracene, cis written with both marks flipped", "c1ccc2c(c1)C[C@H]1C3c4ccccc4C(c4ccccc43)[C@H]1C2", "c1ccc2c(c1)C[C@@H]1C3c4ccccc4C(c4ccccc43)[C@@H]1C2", same, Meso},
		{"ethanoanthracene, cis and trans", "c1ccc2c(c1)C[C@H]1C3c4ccccc4C(c4ccccc43)[C@H]1C2", "c1ccc2c(c1)C[C@@H]1C3c4ccccc4C(c4ccccc43)[C@H]1C2", other, Meso},
		{"ethanoanthracene, trans enantiomers", "c1ccc2c(c1)C[C@@H]1C3c4ccccc4C(c4ccccc43)[C@H]1C2", "c1ccc2c(c1)C[C@H]1C3c4ccccc4C(c4ccccc43)[C@@H]1C2", mirror, Chiral},
		// camphor's bridges all differ: its bridgehead marks stay, and
		// (1R,4R)- and (1S,4S)-camphor are enantiomers (common practice)
		{"camphor enantiomers", "CC1(C)[C@@H]2CC[C@@]1(C)C(=O)C2", "CC1(C)[C@H]2CC[C@]1(C)C(=O)C2", mirror, Chiral},
		// Bicyclo[2.2.2]octane-2,6-diol with the OH carbons opposite
		// (one R, one S) has two meso forms, both OH towards each other
		// or both towards the ethano bridge (worked by hand); they differ
		// only at the bridgeheads, whose equal bridges carry the OH
		// carbons, so the bridgehead marks must stay.
		{"bicyclo[2.2.2]octane-2,6-diol, bridgeheads flipped", "O[C@H]1C[C@H]2C[C@@H](O)[C@@H]1CC2", "O[C@H]1C[C@@H]2C[C@@H](O)[C@H]1CC2", other, Meso},

		// A double bond whose two ligands at one end are constitutionally
		// equal is stereogenic when they differ in configuration (worked
		// by hand, and so the labeller's e/z). Reflection inverts both
		// centres and keeps the bond, so the methyl then lies cis to the
		// other branch: the two bond configurations are enantiomers.
		{"R,S branches, bond flipped", "C[C@@H](O)/C(=C/C)[C@@H](O)C", "C[C@@H](O)/C(=C\\C)[C@@H](O)C", mirror, Chiral},
		{"R,S branches, all flipped", "C[C@@H](O)/C(=C/C)[C@@H](O)C", "C[C@H](O)/C(=C\\C)[C@H](O)C", same, Chiral},
		// with equal configurations the renaming that swaps the branches
		// maps either bond configuration onto the other: no unit
		{"R,R branches, bond flipped", "C[C@@H](O)/C(=C/C)[C@H](O)C", "C[C@@H](O)/C(=C\\C)[C@H](O)C", same, Chiral},
		{"R,R branches, bond unmarked", "C[C@@H](O)/C(=C/C)[C@H](O)C", "C[C@@H](O)C(=CC)[C@H](O)C", same, Chiral},
		{"R,R and S,S branches", "C[C@@H](O)C(=CC)[C@H](O)C", "C[C@H](O)C(=CC)[C@@H](O)C", mirror, Chiral},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			a, b := Identify(notation.Read(tc.a)), Identify(notation.Read(tc.b))
			var got int
			switch {
			case a.Key == b.Key:
				got = same
			case a.MirrorKey == b.Key:
				got = mirror
			default:
				got = other
			}
			names := [...]string{"the same structure", "the mirror image", "another stereoisomer"}
			if got != tc.rel {
				t.Errorf("%s vs %s: %s, want %s", tc.a, tc.b, names[got], names[tc.rel])
			}
			if a.ConstitutionKey != b.ConstitutionKey {
				t.Errorf("%s vs %s: constitution keys differ", tc.a, tc.b)
			}
			if a.Chirality != tc.chirality {
				t.Errorf("%s: chirality %v, want %v", tc.a, a.Chirality, tc.chirality)
			}
		})
	}
}

// TestStereoisomersTogether counts the isomers of the constitutions
// above; sources as given.
func TestStereoisomersTogether(t *testing.T) {
	tests := []struct {
		smiles string
		want   int
		why    string
	}{
		{"CC1CCC(=CC(=O)O)CC1", 2, "(4-methylcyclohexylidene)acetic acid: one axially chiral pair (common practice)"},
		{"CC1CCC(=NO)CC1", 2, "4-methylcyclohexanone oxime: one axially chiral pair (common practice)"},
		{"C1CCC(=CC(=O)O)CC1", 1, "cyclohexylideneacetic acid: no partner on the ring (common practice)"},
		{"CC1CCC(=C(C)C)CC1", 1, "the far end carries two methyls (common practice)"},
		{"CC=C=C1CCC(CC)CC1", 2, "an allene off the ring with a ring centre opposite: two achiral diastereomers (worked by hand)"},
		{"CC=C=C1CCC(CC1)=C=CC", 2, "two allenes off one ring: two achiral diastereomers (worked by hand)"},
		{"CC=C=C1CCCCC1", 1, "an allene off the ring and no partner (worked by hand)"},
		{"OC(=O)C=C1CCC(=CC(=O)O)CC1", 2, "cyclohexane-1,4-diylidenediacetic acid: the two bonds together, like a 1,4-disubstituted ring (worked by hand)"},
		{"CCC1CCC(CC1)=C1CCC(CC)CC1", 2, "4,4'-diethylbicyclohexylidene: two achiral diastereomers (worked by hand)"},
		{"CC1CCC(CC1)=C1CCCCC1", 1, "4-methylbicyclohexylidene: one ring centre alone (worked by hand)"},
		{"O=C1C2(CCCC2=O)CCC1", 2, "spiro[4.4]nonane-1,6-dione: one axially chiral pair (common practice)"},
		{"ClC1CC2(C1)CC(C2)Cl", 2, "2,6-dichlorospiro[3.3]heptane: one axially chiral pair (common practice)"},
		{"ClC1CC2(C1)CCC2", 1, "2-chlorospiro[3.3]heptane: none (common practice)"},
		{"C1CCC2(C1)CCCC2", 1, "spiro[4.4]nonane: none (common practice)"},
		{"OC(CC1CCC(C)CC1)CC1CCC(C)CC1", 4, "1,3-bis(4-methylcyclohexyl)propan-2-ol: cis,cis and trans,trans (achiral) and a cis,trans pair of enantiomers (worked by hand)"},
		{"C1CC2CCC1C2", 1, "norbornane (common practice)"},
		{"c1ccc2c(c1)CC1C3c4ccccc4C(c4ccccc43)C1C2", 3, "ethano-fused 9,10-dihydro-9,10-ethanoanthracene: cis (meso) and a trans pair; the bridgeheads follow (worked by hand)"},
		{"CC1(C)C2CCC1(C)C(=O)C2", 2, "camphor: the two bridgeheads, one relative configuration (common practice)"},
		{"OC1CC2CC(O)C1CC2", 4, "bicyclo[2.2.2]octane-2,6-diol: two meso forms (OH towards each other, OH towards the ethano bridge) and one pair (worked by hand)"},
		{"CC(O)C(=CC)C(O)C", 4, "(R,R), (S,S), and with R,S the methyl cis to the R or to the S branch, mirror images of each other (worked by hand)"},
	}
	for _, tc := range tests {
		got := Stereoisomers(notation.Read(tc.smiles))
		if got.Count != tc.want || !got.Exact {
			t.Errorf("%s (%s): %d stereoisomers (%d units, exact %v), want %d", tc.smiles, tc.why, got.Count, got.Units, got.Exact, tc.want)
		}
	}
}

// TestTogetherKeysOverWritings: the key of a unit kept only together
// with another depends on the order the tie-breaking search tries, so
// every random writing the project's writer makes of these structures
// must give the same key (OpenSMILES allows many writings of one
// structure).
func TestTogetherKeysOverWritings(t *testing.T) {
	for k, text := range []string{
		"C[C@H]1CC/C(=C/C(=O)O)CC1", "C[C@H]1CC/C(=N/O)CC1", "OC(=O)/C=C1/CC/C(=C/C(=O)O)CC1",
		"CC=[C@]=C1CC[C@H](CC1)CC", "CC=[C@]=C1CCC(CC1)=[C@@]=CC",
		"c1ccc2c(c1)C[C@@H]1C3c4ccccc4C(c4ccccc43)[C@H]1C2", "O[C@H]1C[C@H]2C[C@@H](O)[C@@H]1CC2",
		"C[C@@H](O)/C(=C/C)[C@@H](O)C", "CC[C@@H]1CC/C(/CC1)=C\\2/CC[C@H](CC2)CC",
		"O=C1[C@@]2(CCCC2=O)CCC1", "Cl[C@H]1C[C@]2(C1)C[C@H](C2)Cl",
		"O[C@@H](C[C@H]1CC[C@@H](CC1)C)C[C@@H]2CC[C@@H](CC2)C",
	} {
		m := notation.Read(text)
		want := Identify(m).Key
		written := 0
		for i := 0; i < 20; i++ {
			w := notation.Write(m, notation.WriteOptions{Random: rand.New(rand.NewPCG(uint64(k), uint64(i)))})
			if len(w.Unadjusted) > 0 || len(w.Dropped) > 0 {
				continue
			}
			written++
			if got := Identify(notation.Read(w.Text)).Key; got != want {
				t.Errorf("%s written as %s: key differs", text, w.Text)
				break
			}
		}
		if written == 0 {
			t.Errorf("%s: the writer could not rewrite its marks", text)
		}
	}
}

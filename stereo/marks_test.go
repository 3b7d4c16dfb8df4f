package stereo

import (
	"testing"

	"stereoline/notation"
)

// TestMarksAtABareDoubleBond checks the marks at the carbon of a C=O,
// which no mark can configure: two marks on one side there belong to
// other double bonds or mean nothing, and contradict nothing.
func TestMarksAtABareDoubleBond(t *testing.T) {
	cases := []struct {
		name, smiles string
		labels       int                   // labelled double bonds
		want         map[notation.Code]int // diagnostics by code
		source       string
	}{
		// a dibenzylidene-acetone-like dienone as RDKit 2022.09 writes it
		// (a row of testdata/rdkit/cip_labels.tsv): each mark at the
		// carbonyl carbon serves one C=C
		{"dienone", "O=C(/C=C/c1ccccc1Cl)/C=C/c1ccccc1Cl", 2, map[notation.Code]int{}, "RDKit fixture"},
		// the second mark at the carbonyl carbon serves nothing
		{"enone with a stray mark", "O=C(/C=C/C)/C", 1, map[notation.Code]int{CodeIneffectiveBond: 1}, "common practice"},
		// an enone in a six-membered ring (androstenedione as RDKit's
		// notebook tests write it, python3-rdkit's nbtests): the mark at
		// the carbonyl carbon is reported once, for the ring C=C it
		// configures in vain, not again for the C=O it also touches
		{"ring enone", "O=C4/C=C3/CC[C@@H]2[C@H](CC[C@@]1(C(=O)CC[C@H]12)C)[C@@]3(C)CC4", 0, map[notation.Code]int{CodeIneffectiveBond: 1}, "python3-rdkit nbtests"},
		// the issue's own contradiction stays one
		{"conflict", `F/C(\Cl)=C/Br`, 0, map[notation.Code]int{CodeConflictingMarks: 1, CodeUndefined: 1}, "OpenSMILES 1.0, 3.8.3"},
	}
	for _, c := range cases {
		a := Analyze(notation.Read(c.smiles))
		labels := 0
		for _, u := range a.Units {
			if u.Kind == KindDoubleBond && u.Specified {
				labels++
			}
		}
		got := map[notation.Code]int{}
		for _, e := range a.Diagnostics {
			got[e.Code]++
		}
		if labels != c.labels || len(got) != len(c.want) {
			t.Errorf("%s (%s): %d labelled bonds and diagnostics %v, want %d and %v", c.name, c.source, labels, got, c.labels, c.want)
			continue
		}
		for code, n := range c.want {
			if got[code] != n {
				t.Errorf("%s (%s): %d %s, want %d", c.name, c.source, got[code], code, n)
			}
		}
	}
}

// TestExchangingOxygens checks centres whose =O and -OH (or -O⁻) are one
// ligand because the proton or the charge moves between them.
func TestExchangingOxygens(t *testing.T) {
	cases := []struct {
		name, smiles string
		labels       int // labelled centres
		ineffective  int
		undefined    int
		source       string
	}{
		// a phosphonic acid monoester and its anion have no configuration
		// at phosphorus; neither has a sulfinic acid (common practice)
		{"phosphonic monoester", "C[P@](=O)(O)OC", 0, 1, 0, "common practice"},
		{"phosphonate anion", "C[P@](=O)([O-])OC", 0, 1, 0, "common practice"},
		{"sulfinic acid", "C[S@](=O)O", 0, 1, 0, "common practice"},
		{"unmarked arsonic anhydride", "O=[As](O)(O[As](=O)(O)c1ccccc1)c1ccccc1", 0, 0, 0, "common practice"},
		// different isotopes keep the oxygens apart (VS177 of the suite);
		// a diester and a thiophosphonate (VS068) are stereocentres
		{"isotopes", "[18O-][P@@](=O)(OC)[17O-]", 1, 0, 0, "CIP validation suite VS177"},
		{"diester", "C[P@](=O)(OC)OCC", 1, 0, 0, "common practice"},
		{"thiophosphonate", "S=[P@@]([O-])(C)OC(C)C", 1, 0, 0, "CIP validation suite VS068"},
	}
	for _, c := range cases {
		a := Analyze(notation.Read(c.smiles))
		labels := 0
		for _, u := range a.Units {
			if u.Descriptor.Labelled() {
				labels++
			}
		}
		got := map[notation.Code]int{}
		for _, e := range a.Diagnostics {
			got[e.Code]++
		}
		if labels != c.labels || got[CodeIneffectiveCenter] != c.ineffective || got[CodeUndefined] != c.undefined {
			t.Errorf("%s (%s): %s gives %d labels and %v", c.name, c.source, c.smiles, labels, got)
		}
	}
}

// TestExchangingAndInvertingCentres checks centres that give up a
// proton, or turn inside out, faster than a configuration can be kept.
func TestExchangingAndInvertingCentres(t *testing.T) {
	cases := []struct {
		name, smiles string
		want         map[notation.Code]int
		source       string
	}{
		// a proton on nitrogen or sulfur exchanges, and the free amine
		// or sulfide inverts (common practice); a quaternary ammonium
		// centre holds (the hand facts)
		{"ammonium with H, unmarked", "C[NH+](CC)CCC", map[notation.Code]int{}, "common practice"},
		{"ammonium with H, marked", "C[N@@H+](CC)CCC", map[notation.Code]int{CodeInvertingNitrogen: 1}, "common practice"},
		{"sulfonium with H, unmarked", "C[SH+]CC", map[notation.Code]int{}, "common practice"},
		{"sulfonium with H, marked", "C[S@H+]CC", map[notation.Code]int{CodeIneffectiveCenter: 1}, "common practice"},
		// the ring-fusion nitrogen of indolizidine inverts (cis- and
		// trans-fused forms interconvert; common practice), so its mark
		// is flagged and the ring-fusion carbon is the only centre
		{"indolizidine", "C1CC[N@]2CCCC2C1", map[notation.Code]int{CodeInvertingNitrogen: 1, CodeUndefined: 1}, "common practice"},
		// the nitrogens of 1,4-diazabicyclo[2.2.1]heptane are fixed by
		// the cage, as norbornane's bridgehead carbons are
		{"diazabicycloheptane", "C1N2CCN1CC2", map[notation.Code]int{}, "common practice"},
		// a bridgehead nitrogen of a small bridged bicycle holds
		// (quinuclidine-like; 2-methylquinuclidine's nitrogen is no
		// centre, its C2 is)
		{"2-methylquinuclidine", "CC1CC2CCN1CC2", map[notation.Code]int{CodeUndefined: 1}, "common practice"},
	}
	for _, c := range cases {
		a := Analyze(notation.Read(c.smiles))
		got := map[notation.Code]int{}
		for _, e := range a.Diagnostics {
			got[e.Code]++
		}
		ok := len(got) == len(c.want)
		for code, n := range c.want {
			ok = ok && got[code] == n
		}
		if !ok {
			t.Errorf("%s (%s): %s gives %v, want %v", c.name, c.source, c.smiles, got, c.want)
		}
	}
}

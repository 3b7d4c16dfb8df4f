package identity

import (
	"fmt"
	"slices"
	"testing"

	"stereoline/notation"
	"stereoline/stereo"
)

// The key and the labeller decide separately which marks matter (the
// key by graph symmetry, the labeller by CIP ranking and symmetry
// classes). This consistency check keeps the two from drifting apart:
// the units Identify keeps must be the marked units Analyze reports. It
// runs over the writings of testdata/rdkit/identity.tsv (RDKit random
// writings of NCI records) and the cases of identity_together_test.go.
// Left out: marks Analyze reports as impossible (a substituent inside a
// small cage; the key still describes what was written), one-sided
// double bonds (the key reads a bond only when both ends are marked) and
// polyhedral centres (keyed by polyhedron.go, not as units).
func TestIdentityUnitsAgreeWithLabeller(t *testing.T) {
	writings := []string{
		"C[C@H]1CC/C(=C/C(=O)O)CC1", "C[C@@H]1CC/C(=C\\C(=O)O)CC1", "C[C@H]1CC/C(=N/O)CC1",
		"C1CC/C(=C/C(=O)O)CC1", "C[C@H]1CCC(=C(C)C)CC1", "OC(=O)/C=C1/CC/C(=C/C(=O)O)CC1",
		"[C@H]12CC[C@H](C1)CC2", "C[C@]12CC[C@H](C1)CC2",
		"c1ccc2c(c1)C[C@@H]1C3c4ccccc4C(c4ccccc43)[C@H]1C2",
		"c1ccc2c(c1)C[C@H]1[C@H]3c4ccccc4[C@@H](c4ccccc43)[C@H]1C2",
		"CC1(C)[C@@H]2CC[C@@]1(C)C(=O)C2", "O[C@H]1C[C@H]2C[C@@H](O)[C@@H]1CC2", "O[C@H]1C[C@H]2C[C@H](O)[C@@H]1CC2",
		"C[C@@H](O)/C(=C/C)[C@@H](O)C", "C[C@@H](O)/C(=C/C)[C@H](O)C", "C[C@@H](O)C(=CC)[C@@H](O)C",
		"C[C@H]1CC[C@@H](C)CC1", "OC(=O)[C@H](O)[C@H](O)C(=O)O",
		"O=C1[C@@]2(CCCC2=O)CCC1", "Cl[C@H]1C[C@]2(C1)C[C@H](C2)Cl", "Cl[C@H]1C[C@]2(C1)CCC2",
		"O[C@@H](C[C@H]1CC[C@@H](CC1)C)C[C@@H]2CC[C@@H](CC2)C", "O[C@@H](C[C@H]1CC[C@@H](CC1)C)C[C@H]2CC[C@@H](CC2)C", "C/N=c1/sccn1C", "CCCC/N=c1/ssc(=O)n1CCCC",
		"CC=[C@]=C1CC[C@H](CC1)CC", "CC=[C@]=C1CCC(CC1)=[C@@]=CC", "CC=[C@]=C1CCCCC1",
		"CC[C@@H]1CC/C(/CC1)=C\\2/CC[C@H](CC2)CC", "CC[C@@H]1CC/C(/CC1)=C\\2/CC[C@@H](CC2)CC",
	}
	rows := readIdentityFixture(t)
	for _, r := range rows {
		writings = append(writings, r.smiles)
	}
	seen := map[string]bool{}
	checked, bad := 0, 0
	for _, s := range writings {
		if seen[s] {
			continue
		}
		seen[s] = true
		m := notation.Read(s)
		ours, theirs, ok := keptAndLabelled(m)
		if !ok {
			continue
		}
		checked++
		if !slices.Equal(ours, theirs) {
			bad++
			if bad <= 20 {
				t.Errorf("%s: the key keeps units %v, the labeller reports marked units %v", s, ours, theirs)
			}
		}
	}
	if bad > 20 {
		t.Errorf("%d writings disagree in all", bad)
	}
	t.Logf("%d writings checked, %d disagree", checked, bad)
}

// keptAndLabelled returns the units the key keeps and the marked units
// Analyze reports, each as "kind atoms" in sorted order, and false when
// the molecule is left out (see above).
func keptAndLabelled(m *notation.Molecule) (ours, theirs []string, ok bool) {
	an := stereo.Analyze(m)
	oneSided := map[notation.Span]bool{}
	for _, d := range an.Diagnostics {
		switch d.Code {
		case stereo.CodeImpossibleCenter:
			return nil, nil, false
		case stereo.CodeOneSidedBond:
			oneSided[d.Span] = true
		}
	}
	name := func(bond bool, atoms []int) string {
		a := slices.Clone(atoms)
		slices.Sort(a)
		if bond {
			return fmt.Sprint("bond ", a)
		}
		return fmt.Sprint("centre ", a)
	}
	for _, u := range Identify(m).units {
		ours = append(ours, name(u.kind == keyDoubleBond, u.atoms))
	}
	for _, u := range an.Units {
		switch u.Kind {
		case stereo.KindSquarePlanar, stereo.KindTrigonalBipyramidal, stereo.KindOctahedral:
			continue
		}
		if len(u.Marks) == 0 || u.Kind == stereo.KindDoubleBond && oneSided[m.Bonds[u.Bond].Span] || oneSided[u.Marks[0]] {
			continue
		}
		if u.Kind == stereo.KindDoubleBond {
			theirs = append(theirs, name(true, u.Atoms))
		} else {
			theirs = append(theirs, name(false, []int{u.Centre}))
		}
	}
	slices.Sort(ours)
	slices.Sort(theirs)
	return ours, theirs, true
}

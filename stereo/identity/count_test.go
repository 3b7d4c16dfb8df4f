package identity

import (
	"bufio"
	"os"
	"slices"
	"strings"
	"testing"

	"stereoline/notation"
)

// TestStereoisomerCountWithoutSymmetry checks the count made with the
// units no symmetry moves held apart (their feasible assignments
// multiplying the keys of the others) against the count by canonical
// keys of every assignment, on the fixture molecules
// (RDKit-enumerated stereoisomers of NCI records and the CIP validation
// suite) and the NCI sample of Debian's rdkit-data (first_5K.smi), when
// installed.
func TestStereoisomerCountWithoutSymmetry(t *testing.T) {
	mols := fixtureMolecules(t, 3000)
	if f, err := os.Open("/usr/share/RDKit/Data/NCI/first_5K.smi"); err == nil {
		sc := bufio.NewScanner(f)
		for sc.Scan() {
			if fields := strings.Fields(sc.Text()); len(fields) > 0 {
				mols = append(mols, fields[0])
			}
		}
		f.Close()
	} else {
		t.Logf("rdkit-data's first_5K.smi not found, left out: %v", err)
	}
	defer func() { countWithoutKeys = true }()
	fast, compared := 0, 0
	for _, s := range mols {
		m := notation.Read(s)
		if m.Errors.HasErrors() {
			continue
		}
		countWithoutKeys = true
		got := Stereoisomers(m)
		countWithoutKeys = false
		want := Stereoisomers(m)
		switch {
		case want.Exact && (got.Count != want.Count || !got.Exact):
			t.Errorf("%s: %+v with the shortcuts, %+v by plain enumeration", s, got, want)
		case !want.Exact && got.Count > want.Count:
			// past the enumeration, a unit tied by two leaves no
			// longer doubles the upper bound
			t.Errorf("%s: %+v with the shortcuts, more than the bound %+v", s, got, want)
		}
		if got.Exact && got.Units > 0 {
			compared++
			g := newKeyGraph(m)
			if units, rank := potentialUnits(g); slices.Contains(fixedUnits(g, units, rank), true) {
				fast++
			}
		}
	}
	t.Logf("%d counts compared, %d of them with units held apart", compared, fast)
	if fast < compared/2 {
		t.Errorf("only %d of %d counts held units apart", fast, compared)
	}
}

// TestStereoisomersTiedByLeaves checks constitutions whose only potential
// units are tied by two identical leaves (two fluorines, two methyls):
// none is stereogenic, so each has one stereoisomer (common practice),
// where the units used to double the assignments (past twelve of them,
// the count was given as at most 2^n).
func TestStereoisomersTiedByLeaves(t *testing.T) {
	for _, tc := range []struct {
		smiles string
		count  int
	}{
		{"FC(F)(F)" + strings.Repeat("C(F)(F)", 14) + "F", 1}, // a perfluoroalkane
		{"CC1(C)CCCCC1", 1},         // 1,1-dimethylcyclohexane
		{"CC(C)=C(C)C", 1},          // tetramethylethylene
		{"OC(=O)C(O)C(O)C(=O)O", 3}, // tartaric acid: the pair and meso
		{"CC1(C)CC(O)CC(O)C1", 3},   // a 3,5-diol with a gem-dimethyl opposite (cis meso, trans pair)
	} {
		got := Stereoisomers(notation.Read(tc.smiles))
		if got.Count != tc.count || !got.Exact {
			t.Errorf("%s: %+v, want exactly %d", tc.smiles, got, tc.count)
		}
	}
}

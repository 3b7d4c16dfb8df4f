package identity

import (
	"reflect"
	"testing"

	"stereoline/notation"
)

// TestMirrorShortcut checks that the mirror-image key written from the
// structure's own run (canonState.mirrorLeaf), and the constitution's
// serialisation taken from it (canonState.plain), are what runs of their
// own give: the whole Identity is compared, on the fixture molecules (RDKit-enumerated stereoisomers of
// NCI records in testdata/rdkit/cip_labels.tsv, and the CIP validation
// suite of Hanson et al. 2018 when the shared reference is present),
// their mirror images as the transform writes them aside, and on
// structures made to reach the cases the shortcut must leave alone:
// parities that tell atoms apart (pseudoasymmetric centres, meso
// forms), ring pairs, spiro centres, allenes and polyhedra.
func TestMirrorShortcut(t *testing.T) {
	texts := append(fixtureMolecules(t, 4000), kekuleCases...)
	texts = append(texts,
		"C[C@H](O)[C@@H](C)O", "C[C@@H](O)[C@@H](C)O", "O[C@H]1CC[C@@H](O)CC1", "C[C@H]1CC[C@H](C)CC1",
		"OC(=O)[C@H](O)[C@@H](O)C(O)=O", "C[C@H](Cl)[C@@H](O)[C@H](C)Cl", "C[C@H](Cl)C(O)[C@H](C)Cl",
		"CC=[C@]=CC", "C[C@@]12CC[C@H](C1)C2", "C1C[C@]12CC[C@@H](C)C2", "F[Pt@SP1](Cl)(Br)I",
		"C/C=C/[C@H](C)/C=C\\C", "C[C@H]1C[C@@H](C)C[C@H](C)C1", "N[C@@H](C)C(=O)N[C@H](C)C(=O)O")
	checked, shortcut := 0, 0
	for _, s := range texts {
		m := notation.Read(s)
		if m.Errors.HasErrors() || m.Reaction || len(m.Atoms) == 0 {
			continue
		}
		got, g := Identify(m), newKeyGraph(m)
		shortcuts = false
		want, wg := Identify(m), newKeyGraph(m)
		shortcuts = true
		if !reflect.DeepEqual(g.arom, wg.arom) || !reflect.DeepEqual(g.adj, wg.adj) {
			t.Errorf("%s: aromatic atoms %v and edges %v with the shortcuts, %v and %v without", s, g.arom, g.adj, wg.arom, wg.adj)
		}
		if !reflect.DeepEqual(got, want) {
			t.Errorf("%s: with the shortcuts %+v, without %+v", s, got, want)
		}
		checked++
		if g := newKeyGraph(m); len(g.units) > 0 {
			st := newCanonState(g, g.units, true)
			res := st.run()
			ms := newCanonState(g, mirrorUnits(g.units), true)
			ms.mirrored = true
			if _, ok := st.mirrorLeaf(ms, res); ok {
				shortcut++
			}
		}
	}
	if shortcut == 0 || shortcut == checked {
		t.Errorf("the shortcut was taken for %d of %d structures: the test reaches only one side of it", shortcut, checked)
	}
	t.Logf("%d structures, shortcut taken for %d", checked, shortcut)
}

// kekuleCases are rings written in Kekulé form next to rings written
// aromatic, for the aromaticity shortcut (kekuleRingPossible): pyridone,
// cyanuric acid, furan, pyrrole, thiophene, a quinone, a fused pair that
// passes only together (indolizine), charged and cumulated atoms.
var kekuleCases = []string{
	"O=C1C=CC=CN1", "O=C1NC(=O)NC(=O)N1", "C1=COC=C1", "C1=CNC=C1", "C1=CSC=C1", "O=C1C=CC(=O)C=C1",
	"C1=CC2=CC=CN2C=C1", "c1ccccc1C1=CC=CC=C1", "C[N+]1=CC=CC=C1", "C1=C=CC=C1", "c1ccc2c(c1)C=CC=C2",
	"O=c1cccc[nH]1", "C1=CC=CC=CC=C1", "OC1=CC=C(C=C1)C(=O)O", "C1CC=CC1", "C[Se]1C=CC=C1",
}

// TestCyclicBonds checks cyclicBonds against notation.FindRings's
// BondInRing on the fixture molecules (as TestMirrorShortcut) and on
// graphs with two bonds between one pair of atoms, rings joined by
// bridges and several components.
func TestCyclicBonds(t *testing.T) {
	texts := append(fixtureMolecules(t, 4000), "C1CC1CC1CC1", "C12CC1CC2", "c1ccccc1-c1ccccc1.C1CCC1", "C1.C1", "CC", "C",
		"C1CC2CCC1CC2", "C1CC11CC1", "[C]1=[C]1")
	rings := 0
	for _, s := range texts {
		m := notation.Read(s)
		want := notation.FindRings(m)
		got := cyclicBonds(m)
		for bi := range m.Bonds {
			if got[bi] != want.BondInRing(bi) {
				t.Errorf("%s: bond %d on a ring %v, FindRings says %v", s, bi, got[bi], want.BondInRing(bi))
			}
			if got[bi] {
				rings++
			}
		}
	}
	if rings == 0 {
		t.Error("no ring bond met: the test reaches one side only")
	}
}

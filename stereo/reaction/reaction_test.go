package reaction

import (
	"testing"

	"stereoline/notation"
)

// Hand-written mapped reactions. Each case says why the change is what it
// is; the chemistry is textbook (common practice).
func TestReactionCentres(t *testing.T) {
	tests := []struct {
		name       string
		smiles     string
		change     Change
		labelsFlip bool // the CIP label changes across the arrow
		note       bool // a note says label and geometry disagree
	}{
		{
			// SN2 (Walden inversion): hydroxide attacks 2-bromobutane
			// from the side opposite bromine. The product is written with
			// OH where Br was and the other ligands in the same order, so
			// the opposite winding is the inverted arrangement. Br and
			// then OH rank first on each side, so the label flips too.
			name:       "SN2 substitution inverts",
			smiles:     "[CH3:1][C@@H:2]([Br:3])[CH2:4][CH3:5].[OH-:6]>>[CH3:1][C@H:2]([OH:6])[CH2:4][CH3:5].[Br-:3]",
			change:     ChangeInversion,
			labelsFlip: true,
		},
		{
			// O-acylation of butan-2-ol by acetyl chloride: the new bond
			// forms at oxygen, the C-O bond of the centre is never
			// broken, so all four ligands persist and the same order with
			// the same winding is retention.
			name:   "O-acylation retains",
			smiles: "[CH3:1][C@H:2]([OH:3])[CH2:4][CH3:5].[CH3:6][C:7](=[O:8])[Cl:9]>>[CH3:1][C@H:2]([O:3][C:7](=[O:8])[CH3:6])[CH2:4][CH3:5].[ClH:9]",
			change: ChangeRetention,
		},
		{
			// The same acylation with the product written from the other
			// end: its ligand order (C4, H, C1, O3) is an even
			// permutation of the reactant's (C1, H, O3, C4), so the same
			// '@' still means retention.
			name:   "O-acylation retains, product written backwards",
			smiles: "[CH3:1][C@H:2]([OH:3])[CH2:4][CH3:5].[CH3:6][C:7](=[O:8])[Cl:9]>>[CH3:5][CH2:4][C@H:2]([CH3:1])[O:3][C:7](=[O:8])[CH3:6].[ClH:9]",
			change: ChangeRetention,
		},
		{
			// Oxidation of butan-2-ol to butanone: the centre becomes a
			// trigonal carbonyl carbon and its configuration is gone.
			name:   "oxidation loses the centre",
			smiles: "[CH3:1][C@H:2]([OH:3])[CH2:4][CH3:5]>>[CH3:1][C:2](=[O:3])[CH2:4][CH3:5]",
			change: ChangeLost,
		},
		{
			// Reduction of butanone to one enantiomer of butan-2-ol: a
			// centre appears.
			name:   "reduction creates a centre",
			smiles: "[CH3:1][C:2](=[O:3])[CH2:4][CH3:5]>>[CH3:1][C@H:2]([OH:3])[CH2:4][CH3:5]",
			change: ChangeCreated,
		},
		{
			// Hydrogenating the vinyl group of 4-methylpent-1-en-3-ol
			// leaves the centre untouched, but vinyl (C,C,C with its
			// duplicate) outranks isopropyl (C,C,H) while ethyl (C,H,H)
			// does not: the label changes though the arrangement is kept.
			name:       "hydrogenation keeps the arrangement, the label changes",
			smiles:     "[OH:1][C@@H:2]([CH:3]=[CH2:4])[CH:5]([CH3:6])[CH3:7]>>[OH:1][C@@H:2]([CH2:3][CH3:4])[CH:5]([CH3:6])[CH3:7]",
			change:     ChangeRetention,
			labelsFlip: true,
			note:       true,
		},
		{
			// Two ligands exchanged at once: no ligand position can be
			// matched, so geometry cannot decide.
			name:   "two ligands replaced is undetermined",
			smiles: "[CH3:1][C@@H:2]([Br:3])[Cl:4]>>[CH3:1][C@@H:2]([OH:5])[NH2:6]",
			change: ChangeUndetermined,
		},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			res := Analyze(notation.Read(tc.smiles))
			if len(res.Centres) != 1 {
				t.Fatalf("%d centres %+v, want 1", len(res.Centres), res.Centres)
			}
			c := res.Centres[0]
			if c.Map != 2 || c.Change != tc.change {
				t.Errorf("map %d change %v, want map 2 %v", c.Map, c.Change, tc.change)
			}
			if c.Change == ChangeRetention || c.Change == ChangeInversion {
				if flip := c.ReactantLabel != c.ProductLabel; flip != tc.labelsFlip {
					t.Errorf("labels %v -> %v, want a change %v", c.ReactantLabel, c.ProductLabel, tc.labelsFlip)
				}
				if (c.Note != "") != tc.note {
					t.Errorf("note %q, want one %v", c.Note, tc.note)
				}
			}
			lost := false
			for _, d := range res.Diagnostics {
				lost = lost || d.Code == CodeStereoLost
			}
			if lost != (tc.change == ChangeLost) {
				t.Errorf("stereo-lost diagnostic %v, want %v: %v", lost, tc.change == ChangeLost, res.Diagnostics)
			}
		})
	}
}

func TestReactionMaps(t *testing.T) {
	res := Analyze(notation.Read("[CH3:1][OH:1]>>[CH3:1][OH:2]"))
	codes := map[notation.Code]notation.Severity{}
	for _, d := range res.Diagnostics {
		codes[d.Code] = d.Severity
	}
	if s, ok := codes[CodeMapDuplicate]; !ok || s != notation.SeverityError {
		t.Errorf("no map-duplicate error: %v", res.Diagnostics)
	}
	if s, ok := codes[CodeMapUnpaired]; !ok || s != notation.SeverityWarning {
		t.Errorf("no map-unpaired warning: %v", res.Diagnostics)
	}
	// E-but-2-ene hydrogenated... written as a reaction that keeps the
	// double bond but drops its marks
	res = Analyze(notation.Read("[CH3:1]/[CH:2]=[CH:3]/[CH3:4]>>[CH3:1][CH:2]=[CH:3][CH3:4]"))
	if len(res.Diagnostics) != 1 || res.Diagnostics[0].Code != CodeStereoLost {
		t.Errorf("double bond marks dropped: %v, want one %s", res.Diagnostics, CodeStereoLost)
	}
	if r := Analyze(notation.Read("C[C@H](O)CC")); len(r.Centres) != 0 || len(r.Diagnostics) != 0 {
		t.Errorf("a plain molecule gave %+v", r)
	}
}

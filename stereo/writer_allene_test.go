package stereo

import (
	"math/rand/v2"
	"strconv"
	"testing"

	"stereoline/notation"
)

// alleneLabels returns the M/P (m/p) label of each labelled allene unit,
// keyed by its centre as numbered by atom; atom maps the analysed
// molecule's numbering to the one being compared.
func alleneLabels(a *Analysis, atom func(int) int) map[int]Descriptor {
	out := map[int]Descriptor{}
	for _, u := range a.Units {
		if u.Kind == KindAllene && u.Descriptor.Labelled() {
			out[atom(u.Centre)] = u.Descriptor
		}
	}
	return out
}

// TestWriterAlleneMarks writes allenes in 20 random atom orders and
// ring-closure placements and checks that every extended tetrahedral
// mark still gives the same M/P label, read back and labelled by this
// engine, centre mapped through the writer's Order. The engine orders an
// allene's four substituents as OpenSMILES 3.9 does for extended
// tetrahedral centres: as they appear in the text, a ring-closure
// neighbour at its digit, an implicit hydrogen at its terminal atom
// (which is right after the terminal atom's preceding atom, as for a
// tetrahedral centre, unless the other end is written in between; the
// last hand-written case is such a text). The compounds are the allenes of the CIP
// validation suite (Hanson et al. 2018; VS079, VS166, VS287) and
// hand-written ones for the cases the suite lacks: hydrogens on both
// ends, a terminal atom opening the writing, ring closures on a terminal
// atom before and after its chain neighbour, an explicit @AL mark, an
// explicit [H] atom and a longer even cumulene. The hand-written ones
// carry no expected label; only that the label survives rewriting is
// checked, and that they are labelled at all.
func TestWriterAlleneMarks(t *testing.T) {
	type allene struct{ id, smiles string }
	var cases []allene
	for _, c := range readSuite(t) {
		if hasAlleneMark(notation.Read(c.smiles)) {
			cases = append(cases, allene{c.id, c.smiles})
		}
	}
	if len(cases) < 3 {
		// the suite has allene marks in VS079, VS166 and VS287 among others
		t.Errorf("found %d allenes in the validation suite, want at least 3", len(cases))
	}
	for i, s := range []string{
		"CC=[C@]=CC",              // penta-2,3-diene, hydrogens on both ends
		"OC(=O)C=[C@@]=CC",        // hydrogen at each end, one end in a branch
		"C(F)=[C@@]=CC",           // a terminal atom that opens the writing
		"[C@](=CF)=CCl",           // the centre opens the writing
		"FC1=[C@]=CCCCCC1",        // ring opened on a terminal atom
		"C1CCCCC=[C@@]=C1F",       // ring closed on a terminal atom, before its chain neighbour
		"FC(C1CC1)=[C@]=C(Br)C",   // no hydrogens, a branch on one end
		"CC=[C@AL1]=CF",           // the explicit extended tetrahedral class
		"[H]C(Cl)=[C@@]=C(C)F",    // a hydrogen written as an atom
		"CC=C=[C@]=C=CF",          // a cumulene of four double bonds
		"C1CC=[C@]=C(Cl)CC1",      // cyclic allene, ring closed on a chain atom
		"ClC=[C@]=C1CCCC(C)C1",    // a terminal atom in a ring, an unmarked ring centre beside it
		"[C@]1=CCCCCCC=1",         // the centre opens a ring: its digit names a double bond, not a ligand
		"C/C=C/C=[C@]=C(C)C(=O)O", // a marked double bond beside the allene
		// The other end stands between the last terminal atom and its
		// preceding atom: its hydrogen counts at the terminal atom, where
		// this engine and the writer both put it.
		"FC(CC=[C@]=1)C1",
	} {
		cases = append(cases, allene{"hand-written " + strconv.Itoa(i+1), s})
	}
	for ci, c := range cases {
		m := notation.Read(c.smiles)
		if m.Errors.HasErrors() {
			t.Errorf("%s: %s does not read: %v", c.id, c.smiles, m.Errors)
			continue
		}
		want := alleneLabels(Analyze(m), func(a int) int { return a })
		if len(want) == 0 {
			t.Errorf("%s: %s has no labelled allene; the test would prove nothing", c.id, c.smiles)
			continue
		}
		rng := rand.New(rand.NewPCG(uint64(ci), 2018))
		for k := 0; k < 20; k++ {
			opt := notation.WriteOptions{Random: rng, Start: rng.IntN(len(m.Atoms)), Kekule: k%2 == 1}
			w := notation.Write(m, opt)
			if len(w.Unadjusted) > 0 || len(w.Dropped) > 0 {
				t.Errorf("%s: %s written as %s leaves atoms %v unadjusted, bonds %v dropped", c.id, c.smiles, w.Text, w.Unadjusted, w.Dropped)
				continue
			}
			r := notation.Read(w.Text)
			if r.Errors.HasErrors() {
				t.Errorf("%s: %s written as %s does not read back: %v", c.id, c.smiles, w.Text, r.Errors)
				continue
			}
			got := alleneLabels(Analyze(r), func(a int) int { return w.Order[a] })
			for centre, d := range want {
				if got[centre] != d {
					t.Errorf("%s: %s has %v at atom %d; written as %s it has %v", c.id, c.smiles, d, centre+1, w.Text, got[centre])
				}
			}
			if len(got) != len(want) {
				t.Errorf("%s: %s has %d labelled allenes, written as %s it has %d", c.id, c.smiles, len(want), w.Text, len(got))
			}
		}
	}
}

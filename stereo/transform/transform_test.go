package transform

import (
	"bufio"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"stereoline/notation"
	"stereoline/stereo"
	"stereoline/stereo/identity"
)

func apply(t testing.TB, text string, tr Transform) string {
	t.Helper()
	out, err := notation.ApplyEdits(text, tr.Edits)
	if err != nil {
		t.Fatalf("%s: %v", text, err)
	}
	return out
}

// Hand-made cases. Expected texts follow OpenSMILES: '@' and '@@' are
// opposite windings, '/' and '\' opposite sides; the CIP labels of the
// small molecules are textbook (common practice).
func TestTransformCases(t *testing.T) {
	tests := []struct {
		name string
		in   string
		do   func(m *notation.Molecule) (Transform, error)
		want string
	}{
		{"mirror L-alanine", "N[C@@H](C)C(=O)O", Mirror, "N[C@H](C)C(=O)O"},
		{"mirror keeps double bonds and titles' spacing", "C/C=C/[C@H](O)CC", Mirror, "C/C=C/[C@@H](O)CC"},
		{"mirror a long-form mark", "N[C@TH2H](C)C(=O)O", Mirror, "N[C@TH1H](C)C(=O)O"},
		{"invert the second centre: an epimer", "C[C@H](O)[C@@H](Cl)C", func(m *notation.Molecule) (Transform, error) { return Invert(m, 3) }, "C[C@H](O)[C@H](Cl)C"},
		{"flip E-difluoroethene rewrites one mark", "F/C=C/F", func(m *notation.Molecule) (Transform, error) { return Flip(m, 1, 2) }, "F\\C=C/F"},
		{"flip keeps the conjugated neighbour", "C/C=C/C=C/C", func(m *notation.Molecule) (Transform, error) { return Flip(m, 1, 2) }, "C\\C=C/C=C/C"},
		{"flip the second bond of a diene", "C/C=C/C=C/C", func(m *notation.Molecule) (Transform, error) { return Flip(m, 3, 4) }, "C/C=C/C=C\\C"},
		{"set an S centre to R inverts it", "C[C@H](O)CC", func(m *notation.Molecule) (Transform, error) { return SetDescriptor(m, 1, stereo.DescR) }, "C[C@@H](O)CC"},
		{"set an S centre to S changes nothing", "C[C@H](O)CC", func(m *notation.Molecule) (Transform, error) { return SetDescriptor(m, 1, stereo.DescS) }, "C[C@H](O)CC"},
		{"set an unmarked centre adds brackets", "CC(O)CC", func(m *notation.Molecule) (Transform, error) { return SetDescriptor(m, 1, stereo.DescR) }, "C[C@@H](O)CC"},
		{"set Z on an E bond flips it", "F/C=C/F", func(m *notation.Molecule) (Transform, error) { return SetDescriptor(m, 1, stereo.DescZ) }, "F\\C=C/F"},
		{"set an allene to P", "CC=[C@]=CC", func(m *notation.Molecule) (Transform, error) { return SetDescriptor(m, 2, stereo.DescP) }, "CC=[C@@]=CC"},
		// OpenSMILES 3.9.5: @TB1 and @TB2 share the axis from the first to
		// the last neighbour and wind oppositely; a square-planar
		// arrangement is its own mirror image
		{"mirror a trigonal-bipyramidal mark", "S[As@TB1](F)(Cl)(Br)N", Mirror, "S[As@TB2](F)(Cl)(Br)N"},
		{"mirror keeps a square-planar mark", "F[Pt@SP1](Cl)(Br)I", Mirror, "F[Pt@SP1](Cl)(Br)I"},
		{"clean a mark on propan-2-ol", "C[C@H](C)O", Clean, "CC(C)O"},
		{"clean a stray direction mark", "C/CC", Clean, "CCC"},
		{"complete a one-sided bond", "F/C=CF", CompleteOneSided, "F/C=C/F"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			m := notation.Read(tc.in)
			tr, err := tc.do(m)
			if err != nil {
				t.Fatalf("%s: %v", tc.in, err)
			}
			if got := apply(t, tc.in, tr); got != tc.want {
				t.Errorf("%s: got %s, want %s (notes %v)", tc.in, got, tc.want, tr.Notes)
			}
			if m.Text != tc.in {
				t.Errorf("the molecule was changed")
			}
		})
	}
}

// TestSetUnmarkedDoubleBond: E and Z written on an unmarked but-2-ene
// read back as E and Z.
func TestSetUnmarkedDoubleBond(t *testing.T) {
	for _, d := range []stereo.Descriptor{stereo.DescE, stereo.DescZ} {
		m := notation.Read("CC=CC")
		tr, err := SetDescriptor(m, 1, d)
		if err != nil {
			t.Fatal(err)
		}
		out := apply(t, m.Text, tr)
		an := stereo.Analyze(notation.Read(out))
		if len(an.Units) != 1 || !an.Units[0].Specified || an.Units[0].Descriptor != d {
			t.Errorf("set %v gave %s with units %+v", d, out, an.Units)
		}
	}
}

func TestTransformErrors(t *testing.T) {
	m := notation.Read("CCO")
	if _, err := Invert(m, 1); err == nil {
		t.Error("inverting an atom that is no stereocentre: no error")
	}
	if _, err := Flip(notation.Read("CC=CC"), 1, 2); err == nil {
		t.Error("flipping an unmarked double bond: no error")
	}
	if _, err := SetDescriptor(notation.Read("C[C@H](O)CC"), 1, stereo.DescE); err == nil {
		t.Error("E on a tetrahedral centre: no error")
	}
	if tr, _ := Mirror(notation.Read("F/C=C/F")); len(tr.Notes) == 0 || len(tr.Edits) != 0 {
		t.Errorf("mirror of an achiral alkene: %+v, want no edits and a note", tr)
	}
}

// suitePath is the CIP validation suite of Hanson et al. 2018 in the
// shared reference directory.
var suitePath = filepath.Join("..", "..", "..", "shared", "reference", "cip-validation-suite", "compounds.smi")

// fixtureMolecules returns notations for the property tests: the
// canonical writings of testdata/rdkit/cip_labels.tsv (RDKit-enumerated
// stereoisomers of NCI records) and the CIP validation suite of Hanson
// et al. 2018 from the shared reference directory, when present.
func fixtureMolecules(t testing.TB, limit int) []string {
	var out []string
	if f, err := os.Open(filepath.Join("..", "..", "testdata", "rdkit", "cip_labels.tsv")); err == nil {
		sc := bufio.NewScanner(f)
		sc.Buffer(make([]byte, 1<<20), 1<<20)
		for sc.Scan() && len(out) < limit {
			c := strings.Split(sc.Text(), "\t")
			if strings.HasPrefix(c[0], "#") || len(c) < 4 || c[2] != "canonical" {
				continue
			}
			out = append(out, c[3])
		}
		f.Close()
	} else {
		t.Logf("cip_labels.tsv not found: %v", err)
	}
	if f, err := os.Open(suitePath); err == nil {
		sc := bufio.NewScanner(f)
		sc.Buffer(make([]byte, 1<<20), 1<<20)
		for sc.Scan() {
			if c := strings.Split(sc.Text(), "\t"); len(c) > 1 && c[0] != "" {
				out = append(out, c[0])
			}
		}
		f.Close()
	} else {
		t.Logf("CIP validation suite not found at %s, skipped: %v", suitePath, err)
	}
	if len(out) == 0 {
		t.Skip("no fixture molecules found")
	}
	return out
}

// transformed applies a transform and checks what every transform must
// keep: the constitution key, and the bytes outside stereo marks and
// brackets (here: the same atoms in the same order).
func transformed(t *testing.T, what, text string, tr Transform) (string, *notation.Molecule) {
	t.Helper()
	out := apply(t, text, tr)
	m2 := notation.Read(out)
	m1 := notation.Read(text)
	if identity.ConstitutionKey(m1) != identity.ConstitutionKey(m2) {
		t.Errorf("%s of %s gave %s: constitution changed", what, text, out)
	}
	if len(m1.Atoms) != len(m2.Atoms) {
		t.Errorf("%s of %s gave %s: atom count changed", what, text, out)
	}
	return out, m2
}

// diffUnits lists the units whose configuration differs between two
// readings with the same atom order.
func diffUnits(a, b map[unitID]int) []unitID {
	var out []unitID
	for k, v := range a {
		if b[k] != v {
			out = append(out, k)
		}
	}
	for k := range b {
		if _, ok := a[k]; !ok {
			out = append(out, k)
		}
	}
	return out
}

// mirrorLabel is the label a unit must get in the mirror image: R and S
// swap, M and P swap; r and s stay (a pseudoasymmetric centre's own
// sense and the ranking of its enantiomorphic ligands both reverse,
// P-92.1.2, P-93.5.1.3); E and Z stay (a reflection keeps sides); e and
// z swap (the sides stay but the Rule 5 ranking of the enantiomorphic
// ligands reverses). Pseudo m and p are not checked.
func mirrorLabel(d stereo.Descriptor) (stereo.Descriptor, bool) {
	switch d {
	case stereo.DescR, stereo.DescS, stereo.DescM, stereo.DescP:
		return d.Mirror(), true
	case stereo.DescPseudoR, stereo.DescPseudoS, stereo.DescE, stereo.DescZ:
		return d, true
	case stereo.DescPseudoE:
		return stereo.DescPseudoZ, true
	case stereo.DescPseudoZ:
		return stereo.DescPseudoE, true
	}
	return d, false
}

// TestTransformProperties: mirror twice is byte-identical; mirror swaps
// R/S and M/P and keeps r/s and E/Z (see mirrorLabel); invert changes exactly its
// unit; set R gives R; flip changes exactly one double bond; no transform
// changes the constitution.
func TestTransformProperties(t *testing.T) {
	mols := fixtureMolecules(t, 300)
	labelMismatch := 0
	for _, text := range mols {
		m := notation.Read(text)
		if m.Errors.HasErrors() {
			continue
		}
		start := time.Now()
		an := stereo.Analyze(m)
		// every per-unit transform labels the molecule again, several
		// times; molecules that take long to label get the mirror checks
		// only, to keep the suite light
		slow := time.Since(start) > 10*time.Millisecond
		before := configurations(m)

		tr, err := Mirror(m)
		if err != nil {
			t.Errorf("mirror %s: %v", text, err)
			continue
		}
		once, m1 := transformed(t, "mirror", text, tr)
		tr2, err := Mirror(m1)
		if err != nil {
			t.Errorf("mirror %s: %v", once, err)
			continue
		}
		if twice := apply(t, once, tr2); twice != text {
			t.Errorf("mirror twice of %s gave %s", text, twice)
		}
		an1 := stereo.Analyze(m1)
		for _, u := range an.Units {
			if !u.Specified || !u.Descriptor.Labelled() {
				continue
			}
			for _, v := range an1.Units {
				want, ok := mirrorLabel(u.Descriptor)
				if ok && v.Kind == u.Kind && sameAtoms(v.Atoms, u.Atoms) && v.Descriptor.Labelled() && v.Descriptor != want {
					labelMismatch++
					t.Logf("mirror of %s: unit at %v labelled %v, mirror %v (want %v)", text, u.Atoms, u.Descriptor, v.Descriptor, want)
				}
			}
		}

		for i := range an.Units {
			u := &an.Units[i]
			if !u.Specified || slow {
				continue
			}
			switch u.Kind {
			case stereo.KindTetrahedral, stereo.KindAllene:
				tr, err := Invert(m, u.Centre)
				if err != nil {
					t.Errorf("invert %d of %s: %v", u.Centre+1, text, err)
					continue
				}
				out, m2 := transformed(t, "invert", text, tr)
				d := diffUnits(before, configurations(m2))
				if len(d) != 1 || d[0].at != u.Centre {
					t.Errorf("invert %d of %s gave %s: changed %v", u.Centre+1, text, out, d)
				}
				if u.Kind == stereo.KindTetrahedral && (u.Descriptor == stereo.DescR || u.Descriptor == stereo.DescS) {
					want := u.Descriptor.Mirror()
					tr, err := SetDescriptor(m, u.Centre, want)
					if e, ok := err.(*notation.Error); ok && e.Code == CodeNotVerified && strings.Contains(e.Msg, "bridgehead") {
						continue // one bridgehead of a small bicycle cannot be inverted alone
					}
					if err != nil {
						t.Errorf("set %d=%v of %s: %v", u.Centre+1, want, text, err)
						continue
					}
					out, _ := transformed(t, "set", text, tr)
					if got, ok := labelAfter(m, tr.Edits, u); !ok || got != want {
						t.Errorf("set %d=%v of %s gave %s labelled %v", u.Centre+1, want, text, out, got)
					}
				}
			case stereo.KindDoubleBond:
				tr, err := Flip(m, u.Atoms[0], u.Atoms[1])
				if err != nil {
					t.Errorf("flip %d-%d of %s: %v", u.Atoms[0]+1, u.Atoms[1]+1, text, err)
					continue
				}
				out, m2 := transformed(t, "flip", text, tr)
				d := diffUnits(before, configurations(m2))
				if len(d) != 1 || d[0].kind != stereo.KindDoubleBond || d[0].at != u.Bond {
					t.Errorf("flip %d-%d of %s gave %s: changed %v", u.Atoms[0]+1, u.Atoms[1]+1, text, out, d)
				}
			}
		}
		if tr, err := Clean(m); err != nil {
			t.Errorf("clean %s: %v", text, err)
		} else {
			transformed(t, "clean", text, tr)
		}
	}
	if labelMismatch > 0 {
		t.Errorf("%d units whose mirror label is not the mirror descriptor", labelMismatch)
	}
}

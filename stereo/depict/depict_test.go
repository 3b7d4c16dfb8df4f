package depict

import (
	"bytes"
	"encoding/json"
	"encoding/xml"
	"flag"
	"fmt"
	"image/png"
	"io"
	"math"
	"os"
	"slices"
	"strings"
	"testing"

	"stereoline/notation"
	"stereoline/stereo"
)

var update = flag.Bool("update", false, "rewrite golden files")

// knownMisdrawn are fixture molecules whose drawing does not yet show
// their written stereo, with the reason. An entry that starts to pass
// fails the test, so the list only shrinks.
var knownMisdrawn = map[string]string{}

// TestDrawingMeaning draws every molecule of the stereo fixtures and
// reads the molfile back with the wedge convention (read_test.go): each
// specified tetrahedral centre must read with its written configuration
// and each specified double bond with its written geometry. RDKit's
// reading of the same molfiles is in TestRDKitReadBack.
func TestDrawingMeaning(t *testing.T) {
	strs := fixtureStrings(t)
	bad := 0
	for _, s := range strs {
		m := notation.Read(s)
		an := stereo.Analyze(m)
		d := Draw(m, Options{Analysis: an})
		errs := meaningErrors(m, an, d)
		_, known := knownMisdrawn[s]
		switch {
		case len(errs) > 0 && !known:
			bad++
			if bad <= 20 {
				t.Errorf("%s: %s", s, strings.Join(errs, "; "))
			}
		case len(errs) == 0 && known:
			t.Errorf("%s: listed in knownMisdrawn but drawn right now; remove the entry", s)
		}
	}
	if bad > 0 {
		t.Errorf("%d of %d molecules drawn with stereo that differs from the notation", bad, len(strs))
	}
	t.Logf("%d molecules checked", len(strs))
}

// TestFischerMeaning checks the molfiles built from Fischer rows
// (horizontal bonds wedged, bonds to the end groups hashed): every
// specified centre must read as written.
func TestFischerMeaning(t *testing.T) {
	views := 0
	for _, s := range fixtureStrings(t) {
		m := notation.Read(s)
		an := stereo.Analyze(m)
		f, _ := FischerOf(m, an)
		if f == nil {
			continue
		}
		views++
		d := f.MolfileDrawing(Options{})
		if errs := meaningErrors(m, an, d); len(errs) > 0 {
			if _, known := knownMisdrawn[s]; !known {
				t.Errorf("%s (Fischer): %s", s, strings.Join(errs, "; "))
			}
		}
	}
	if views == 0 {
		t.Fatal("no Fischer views among the fixture molecules")
	}
	t.Logf("%d Fischer views checked", views)
}

// TestFischerFamilies checks D/L on textbook compounds. The notation of
// each is from memory, written from the Fischer projections of
// biochemistry textbooks (common practice); the family is checked both
// from the projection and against stereo.Families.
func TestFischerFamilies(t *testing.T) {
	cases := []struct {
		name, smiles string
		family       stereo.Family
		cip          string // CIP labels of the rows from top to bottom, from memory
		meso         bool
	}{
		// D-glucose (2R,3S,4R,5R), open chain: OH right, left, right, right
		{"D-glucose", "O=C[C@H](O)[C@@H](O)[C@H](O)[C@H](O)CO", stereo.FamilyD, "RSRR", false},
		// D-fructose (3S,4R,5R): C3 OH left, C4 and C5 right
		{"D-fructose", "OCC(=O)[C@@H](O)[C@H](O)[C@H](O)CO", stereo.FamilyD, "SRR", false},
		// L-threose (2R,3S): C2 OH right, C3 OH left
		{"L-threose", "O=C[C@H](O)[C@@H](O)CO", stereo.FamilyL, "RS", false},
		// D-erythrose (2R,3R): C2 and C3 OH right
		{"D-erythrose", "O=C[C@H](O)[C@H](O)CO", stereo.FamilyD, "RR", false},
		// L-serine (S) and L-cysteine (R): the amino group on the left
		{"L-serine", "N[C@@H](CO)C(=O)O", stereo.FamilyL, "S", false},
		{"L-cysteine", "N[C@@H](CS)C(=O)O", stereo.FamilyL, "R", false},
		// D-glyceraldehyde (R), one centre: OH right
		{"D-glyceraldehyde", "O=C[C@H](O)CO", stereo.FamilyD, "R", false},
		// meso-tartaric acid (2R,3S): both OH on one side
		{"meso-tartaric acid", "OC(=O)[C@H](O)[C@H](O)C(=O)O", stereo.FamilyNone, "RS", true},
		// (2R,3R)-tartaric acid, L by the lowest centre: no mirror plane
		{"L-tartaric acid", "OC(=O)[C@H](O)[C@@H](O)C(=O)O", stereo.FamilyL, "RR", false},
	}
	for _, c := range cases {
		m := notation.Read(c.smiles)
		an := stereo.Analyze(m)
		f, reason := FischerOf(m, an)
		if f == nil {
			t.Errorf("%s: no Fischer view: %s", c.name, reason)
			continue
		}
		// the rows' CIP labels identify the compound independently of
		// the notation written above
		labels := map[int]string{}
		for _, u := range an.Units {
			labels[u.Centre] = u.Descriptor.String()
		}
		cip := ""
		for _, r := range f.Rows {
			cip += labels[r.Centre]
		}
		if c.meso && len(cip) == 2 && cip == string([]byte{c.cip[1], c.cip[0]}) {
			cip = c.cip // a meso chain reads the same turned upside down
		}
		if cip != c.cip || f.Meso != c.meso {
			t.Errorf("%s: rows labelled %s, meso %v; want %s, %v", c.name, cip, f.Meso, c.cip, c.meso)
		}
		got := f.Family
		if f.Meso {
			got = stereo.FamilyNone
		}
		if got != c.family {
			t.Errorf("%s: family %q, want %q", c.name, got, c.family)
		}
		// the reference carbon of stereo.Families must agree
		for _, fl := range stereo.Families(m) {
			if fl.Atom == f.Rows[len(f.Rows)-1].Centre && !c.meso && fl.Family != c.family {
				t.Errorf("%s: stereo.Families says %s", c.name, fl.Family)
			}
		}
		// oxidised end on top
		if ox := oxidation(m, f.Top); ox < oxidation(m, f.Bottom) {
			t.Errorf("%s: top atom %d less oxidised than bottom %d", c.name, f.Top+1, f.Bottom+1)
		}
	}
}

// TestFischerReasons checks that records without a view say why.
func TestFischerReasons(t *testing.T) {
	for _, c := range []struct{ smiles, want string }{
		{"CCO", "no stereocentre"},
		{"CC(O)C(O)C", "not marked"},
		{"C[C@H]1CC[C@@H](C)CC1", "rings"},
		{"C[C@H](O)CC", "no open carbon chain"},
	} {
		f, reason := FischerOf(notation.Read(c.smiles), nil)
		if f != nil || !strings.Contains(reason, c.want) {
			t.Errorf("%s: view %v, reason %q; want a reason with %q", c.smiles, f != nil, reason, c.want)
		}
	}
}

// pictureSignature describes a picture by what a rotation, a
// translation, a reflection or a renumbering leaves alone: the distances
// between atoms keyed by their element pair; each bond with what is drawn
// of it (its order, a stereo style or not, a wavy line) and the distances
// from its middle to every atom; each descriptor with its distances to
// every atom. Wedge and hash are one class, since a mirror image of a
// picture swaps them.
type pictureSignature struct {
	pairs map[string][]float64   // element pair → sorted distances
	items map[string][][]float64 // bond or label → sorted distances, one list each
}

func signatureOf(d *Drawing) pictureSignature {
	sig := pictureSignature{pairs: map[string][]float64{}, items: map[string][][]float64{}}
	var atoms []Atom
	for _, a := range d.Atoms {
		if !a.Added {
			atoms = append(atoms, a)
		}
	}
	for i, a := range atoms {
		for _, b := range atoms[i+1:] {
			pair := []string{a.Symbol, b.Symbol}
			slices.Sort(pair)
			k := pair[0] + pair[1]
			sig.pairs[k] = append(sig.pairs[k], a.P.dist(b.P))
		}
	}
	for k := range sig.pairs {
		slices.Sort(sig.pairs[k])
	}
	around := func(p Point) []float64 {
		var ds []float64
		for _, a := range atoms {
			ds = append(ds, p.dist(a.P))
		}
		slices.Sort(ds)
		return ds
	}
	for _, b := range d.Bonds {
		x, y := d.Atoms[b.A], d.Atoms[b.B]
		pair := []string{x.Symbol, y.Symbol}
		slices.Sort(pair)
		class := "plain"
		switch b.Style {
		case StyleWedge, StyleHash:
			class = "stereo"
		case StyleWavy:
			class = "wavy"
		}
		k := fmt.Sprintf("bond %s%s order %d %s", pair[0], pair[1], b.Order, class)
		sig.items[k] = append(sig.items[k], around(x.P.add(y.P).scale(0.5)))
	}
	for _, x := range d.Descriptors {
		k := "label " + x.Text
		sig.items[k] = append(sig.items[k], around(x.P))
	}
	return sig
}

// same reports whether two signatures agree within tol, and if not,
// what differs.
func (a pictureSignature) same(b pictureSignature, tol float64) (bool, string) {
	close := func(x, y []float64) bool {
		if len(x) != len(y) {
			return false
		}
		for i := range x {
			if math.Abs(x[i]-y[i]) > tol {
				return false
			}
		}
		return true
	}
	if len(a.pairs) != len(b.pairs) || len(a.items) != len(b.items) {
		return false, "different kinds of atoms, bonds or labels"
	}
	for k, x := range a.pairs {
		if !close(x, b.pairs[k]) {
			return false, "distances between " + k + " atoms"
		}
	}
	for k, xs := range a.items {
		ys := b.items[k]
		if len(xs) != len(ys) {
			return false, k + ": a different count"
		}
		used := make([]bool, len(ys))
		for _, x := range xs {
			found := false
			for j, y := range ys {
				if !used[j] && close(x, y) {
					used[j], found = true, true
					break
				}
			}
			if !found {
				return false, k + ": drawn in another place"
			}
		}
	}
	return true, ""
}

// TestWritingsSamePicture draws the ten writings of each molecule of
// testdata/rdkit/identity.tsv (RDKit random writings) and requires one
// picture per molecule, up to rotation and renumbering.
func TestWritingsSamePicture(t *testing.T) {
	data, err := os.ReadFile("../../testdata/rdkit/identity.tsv")
	if err != nil {
		t.Fatal(err)
	}
	byMol := map[string][]string{}
	var order []string
	for _, line := range strings.Split(string(data), "\n") {
		if line == "" || line[0] == '#' {
			continue
		}
		f := strings.Split(line, "\t")
		if len(f) < 4 {
			continue
		}
		key := f[0] + "/" + f[1]
		if _, ok := byMol[key]; !ok {
			order = append(order, key)
		}
		byMol[key] = append(byMol[key], f[3])
	}
	if len(order) == 0 {
		t.Fatal("no molecules read from identity.tsv")
	}
	limit := 400
	if os.Getenv("STEREOLINE_ALL_WRITINGS") != "" {
		limit = len(order)
	}
	if testing.Short() {
		limit = 50
	}
	differ := 0
	for _, key := range order[:min(limit, len(order))] {
		var first pictureSignature
		for k, s := range byMol[key] {
			sig := signatureOf(Draw(notation.Read(s), Options{Budget: unhurried}))
			if k == 0 {
				first = sig
				continue
			}
			if ok, why := sig.same(first, 0.02); !ok {
				differ++
				if differ <= 5 {
					t.Errorf("%s: writing %q gives another picture than %q (%s)", key, s, byMol[key][0], why)
				}
				break
			}
		}
	}
	if differ > 0 {
		t.Errorf("%d of %d molecules drawn differently for different writings", differ, min(limit, len(order)))
	}
}

// TestOutputs checks that every writer produces a well-formed file: SVG
// that parses as XML with the title, descriptors and caution as text; a
// PNG that decodes; a molfile with a V2000 counts line; JSON of the
// documented shape.
func TestOutputs(t *testing.T) {
	for _, s := range []string{
		"N[C@@H](C)C(=O)O L-alanine",
		"C/C=C/C=C\\C diene",
		"CC=[C@]=CC allene",
		"[CH3:1][C@H:2]([OH:3])CC>O>[CH3:1][C@@H:2]([OH:3])CC reaction",
		"C1CC(C record-with-errors",
		"[NH4+].[Cl-] salt",
	} {
		rec := notation.SplitRecord(s)
		m := notation.Read(rec.Notation)
		d := Draw(m, Options{Title: rec.Title, Numbers: true})
		var svg bytes.Buffer
		if err := WriteSVG(&svg, d); err != nil {
			t.Fatal(err)
		}
		text := xmlText(t, svg.Bytes())
		if !strings.Contains(text, rec.Title) || !strings.Contains(text, "analytical confirmation") {
			t.Errorf("%s: SVG text lacks the title or the caution: %q", s, text)
		}
		for _, x := range d.Descriptors {
			if !strings.Contains(text, x.Text) {
				t.Errorf("%s: descriptor %s not in the SVG text", s, x.Text)
			}
		}
		var pngBuf bytes.Buffer
		if err := WritePNG(&pngBuf, d); err != nil {
			t.Fatal(err)
		}
		if img, err := png.Decode(&pngBuf); err != nil || img.Bounds().Dx() < 100 {
			t.Errorf("%s: PNG does not decode: %v", s, err)
		}
		var mol bytes.Buffer
		if err := WriteMolfile(&mol, d); err != nil {
			t.Fatal(err)
		}
		if mf, err := parseMolfile(mol.String()); err != nil || len(mf.atoms) != len(d.Atoms) {
			t.Errorf("%s: molfile: %v", s, err)
		}
		b, err := json.Marshal(d)
		if err != nil {
			t.Fatal(err)
		}
		var back struct {
			Atoms []struct {
				N     int     `json:"n"`
				X     float64 `json:"x"`
				Y     float64 `json:"y"`
				Label *string `json:"label"`
			} `json:"atoms"`
			Bonds []struct {
				Ends   [2]int `json:"ends"`
				Style  string `json:"style"`
				Narrow *int   `json:"narrow"`
			} `json:"bonds"`
		}
		if err := json.Unmarshal(b, &back); err != nil || len(back.Atoms) != len(d.Atoms) {
			t.Errorf("%s: JSON: %v", s, err)
		}
		for _, bj := range back.Bonds {
			if !slices.Contains(styleNames[:], bj.Style) {
				t.Errorf("%s: style %q", s, bj.Style)
			}
			if (bj.Style == "wedge" || bj.Style == "hash" || bj.Style == "wavy") != (bj.Narrow != nil) {
				t.Errorf("%s: bond %v style %s narrow %v", s, bj.Ends, bj.Style, bj.Narrow)
			}
		}
	}
}

// xmlText parses an SVG document and returns its character data.
func xmlText(t *testing.T, doc []byte) string {
	t.Helper()
	dec := xml.NewDecoder(bytes.NewReader(doc))
	var sb strings.Builder
	for {
		tok, err := dec.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			t.Fatalf("SVG does not parse: %v\n%s", err, doc)
		}
		if cd, ok := tok.(xml.CharData); ok {
			sb.Write(cd)
		}
	}
	return sb.String()
}

// TestBadInput checks that a record that does not read is drawn as far
// as it was read, with the error's atom highlighted and its message
// under the drawing.
func TestBadInput(t *testing.T) {
	for _, c := range []struct {
		smiles string
		atom   int // 1-based atom that must carry the error
	}{
		{"C1CC(C", 3},          // the unclosed branch opens at atom 3
		{"CC(C)(C)(C)(C)C", 2}, // valence: the carbon with five bonds
		{"C[C@H]=CC", 2},       // a tetrahedral mark on a double-bonded atom
	} {
		m := notation.Read(c.smiles)
		d := Draw(m, Options{})
		if len(d.Atoms) != len(m.Atoms) && len(d.Atoms) < len(m.Atoms) {
			t.Errorf("%s: %d atoms drawn of %d read", c.smiles, len(d.Atoms), len(m.Atoms))
		}
		marked := false
		for _, a := range d.Atoms {
			if a.N == c.atom && a.Mark != MarkNone {
				marked = true
			}
		}
		hasNote := false
		for _, n := range d.Notes {
			if n.Mark != MarkNone {
				hasNote = true
			}
		}
		if !marked || !hasNote {
			t.Errorf("%s: atom %d highlighted %v, note %v", c.smiles, c.atom, marked, hasNote)
		}
	}
	d := Draw(notation.Read(""), Options{})
	if len(d.Notes) == 0 || d.Notes[0].Mark != MarkError {
		t.Errorf("empty record: no message")
	}
}

// TestHugeRecord checks that a record above MaxAtoms gets the fallback
// layout (its speed is measured by BenchmarkDrawHuge).
func TestHugeRecord(t *testing.T) {
	m := notation.Read(strings.Repeat("C[C@H](O)", 3334))
	d := Draw(m, Options{})
	if !d.Simplified || len(d.Atoms) != len(m.Atoms) {
		t.Fatalf("simplified %v, %d atoms of %d", d.Simplified, len(d.Atoms), len(m.Atoms))
	}
}

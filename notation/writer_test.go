package notation

import (
	"bufio"
	"fmt"
	"math/rand/v2"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestWriteExamples checks chosen writings. The expected strings follow
// OpenSMILES (sections 3.1-3.9): organic-subset atoms without brackets,
// exchanging two neighbours of a tetrahedral centre inverts '@'/'@@',
// and '/' read backwards is '\'.
func TestWriteExamples(t *testing.T) {
	tests := []struct {
		name, have string
		opt        WriteOptions
		want       string
	}{
		{"chain as read", "OCC", WriteOptions{}, "OCC"},
		{"start at the other end", "OCC", WriteOptions{Start: 2}, "CCO"},
		{"branches", "CC(C)(C)O", WriteOptions{}, "CC(C)(C)O"},
		{"brackets dropped when the hydrogens are implied", "[CH3][CH2][OH]", WriteOptions{}, "CCO"},
		{"brackets kept for charge, isotope, class", "[NH4+].[13CH4].[CH3:7]C", WriteOptions{}, "[NH4+].[13CH4].[CH3:7]C"},
		{"radical keeps its bracket", "[CH3]", WriteOptions{}, "[CH3]"},
		{"benzene", "c1ccccc1", WriteOptions{}, "c1ccccc1"},
		{"benzene in Kekulé form, ring bond double as the reader's structure has it", "c1ccccc1", WriteOptions{Kekule: true}, "C=1C=CC=CC1"},
		{"pyrrole keeps [nH]", "c1cc[nH]c1", WriteOptions{}, "c1cc[nH]c1"},
		{"biphenyl single bond between aromatic atoms", "c1ccccc1-c1ccccc1", WriteOptions{}, "c1ccccc1-c1ccccc1"},
		{"ring numbers reused", "C1CC1C1CC1", WriteOptions{}, "C1CC1C1CC1"},
		{"tetrahedral mark flips when H and F exchange", "[C@@H](F)(Cl)Br", WriteOptions{Start: 1}, "F[C@H](Cl)Br"},
		{"tetrahedral mark kept for an even permutation", "F[C@](Cl)(Br)I", WriteOptions{Start: 3}, "Br[C@](F)(Cl)I"},
		{"tetrahedral mark flipped for a four-cycle", "F[C@](Cl)(Br)I", WriteOptions{Start: 4}, "I[C@@](F)(Cl)Br"},
		{"ring closure in the neighbour order", "C1CC[C@]12CCC2", WriteOptions{Start: 4}, "C1[C@@]2(CCC2)CC1"},
		// L-alanine is written both N[C@@H](C)C(=O)O and C[C@H](N)C(=O)O (common practice)
		{"L-alanine from the methyl group", "N[C@@H](C)C(=O)O", WriteOptions{Start: 2}, "C[C@H](N)C(=O)O"},
		{"sulfoxide lone pair takes the hydrogen's place", "C[S@@](=O)CC", WriteOptions{Start: 4}, "CC[S@@](C)=O"},
		{"allene as read", "OC(Cl)=[C@]=C(C)F", WriteOptions{}, "OC(Cl)=[C@]=C(C)F"},
		{"trans difluoroethene from the other end", "F/C=C/F", WriteOptions{Start: 3}, "F\\C=C\\F"},
		{"reaction layout kept", "CC(=O)O.OCC>[H+]>CC(=O)OCC.O", WriteOptions{}, "CC(=O)O.OCC>[H+]>CC(=O)OCC.O"},
		{"reaction with no agent", "C=C>>CC", WriteOptions{}, "C=C>>CC"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			m := Read(tt.have)
			if m.Errors.HasErrors() {
				t.Fatalf("read %q: %v", tt.have, m.Errors)
			}
			got := Write(m, tt.opt)
			if got.Text != tt.want {
				t.Errorf("Write(%q) = %q, want %q", tt.have, got.Text, tt.want)
			}
			if err := sameStructure(m, got, tt.opt.Kekule); err != nil {
				t.Errorf("Write(%q) = %q: %v", tt.have, got.Text, err)
			}
		})
	}
}

// TestWriteUnadjusted checks that marks the writer cannot re-express are
// reported rather than silently kept: an allene written from the other
// end and an octahedral centre written with its neighbours reordered.
func TestWriteUnadjusted(t *testing.T) {
	tests := []struct {
		name, have string
		opt        WriteOptions
		want       []int
	}{
		{"allene as read", "OC(Cl)=[C@]=C(C)F", WriteOptions{}, nil},
		{"allene from the other end", "OC(Cl)=[C@]=C(C)F", WriteOptions{Start: 6}, []int{3}},
		{"octahedral as read", "C[Co@OH1](F)(Cl)(Br)(I)N", WriteOptions{}, nil},
		{"octahedral reordered", "C[Co@OH1](F)(Cl)(Br)(I)N", WriteOptions{Start: 6}, []int{1}},
		{"tetrahedral is rewritten, not reported", "F[C@](Cl)(Br)I", WriteOptions{Start: 4}, nil},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			m := Read(tt.have)
			if m.Errors.HasErrors() {
				t.Fatalf("read %q: %v", tt.have, m.Errors)
			}
			got := Write(m, tt.opt)
			if !sameInts(got.Unadjusted, tt.want) {
				t.Errorf("Write(%q) = %q, unadjusted %v, want %v", tt.have, got.Text, got.Unadjusted, tt.want)
			}
		})
	}
}

// sameStructure reads a writing back and compares it with the molecule
// it was written from, atom i of the writing against atom Order[i]:
// elements, charges, isotopes, hydrogen counts, adjacency, bond orders
// (Kekulé orders when written in Kekulé form), tetrahedral parity and
// bond directions.
func sameStructure(m *Molecule, w Written, kekule bool) error {
	r := Read(w.Text)
	if r.Errors.HasErrors() {
		return fmt.Errorf("writing does not read back: %v", r.Errors)
	}
	if len(r.Atoms) != len(m.Atoms) || len(w.Order) != len(m.Atoms) {
		return fmt.Errorf("%d atoms read back, %d written, want %d", len(r.Atoms), len(w.Order), len(m.Atoms))
	}
	if r.Reaction != m.Reaction {
		return fmt.Errorf("reaction %v, want %v", r.Reaction, m.Reaction)
	}
	for i := range r.Atoms {
		got, want := &r.Atoms[i], &m.Atoms[w.Order[i]]
		if got.Number != want.Number || got.Charge != want.Charge || got.Isotope != want.Isotope ||
			got.HydrogenCount() != want.HydrogenCount() || got.Map != want.Map || got.Role != want.Role {
			return fmt.Errorf("atom %d %q differs from atom %d %q", i, got.Symbol, w.Order[i], want.Symbol)
		}
		if !kekule && got.Aromatic != want.Aromatic {
			return fmt.Errorf("atom %d aromatic %v, want %v", i, got.Aromatic, want.Aromatic)
		}
	}
	if len(r.Bonds) != len(m.Bonds)-len(w.Dropped) {
		return fmt.Errorf("%d bonds read back, want %d", len(r.Bonds), len(m.Bonds))
	}
	for bi := range r.Bonds {
		got := &r.Bonds[bi]
		a, b := w.Order[got.Begin], w.Order[got.End]
		wi := m.BondBetween(a, b)
		if wi < 0 {
			return fmt.Errorf("bond %d-%d read back joins atoms %d and %d, which are not bonded", got.Begin, got.End, a, b)
		}
		want := &m.Bonds[wi]
		gotOrder, wantOrder := got.Order, want.Order
		if kekule {
			gotOrder, wantOrder = BondOrder(got.Kekule), BondOrder(want.Kekule)
		}
		if gotOrder != wantOrder {
			return fmt.Errorf("bond %d-%d is %v, want %v", a, b, gotOrder, wantOrder)
		}
		if got.DirFrom(got.Begin) != want.DirFrom(a) {
			return fmt.Errorf("bond %d-%d direction %q, want %q", a, b, got.DirFrom(got.Begin), want.DirFrom(a))
		}
	}
	for i := range r.Atoms {
		got, want := &r.Atoms[i], &m.Atoms[w.Order[i]]
		if want.Chirality.Class != ChiralTH || containsInt(w.Unadjusted, w.Order[i]) {
			continue
		}
		before := stereoOrder(m, w.Order[i], func(x int) int { return x })
		after := stereoOrder(r, i, func(x int) int { return w.Order[x] })
		odd, ok := permutationOdd(before, after)
		if !ok || len(before) != 4 {
			continue
		}
		if (got.Chirality.Num == want.Chirality.Num) == odd {
			return fmt.Errorf("atom %d: mark %d read back describes the other enantiomer", w.Order[i], got.Chirality.Num)
		}
	}
	return nil
}

// stereoOrder lists the neighbours of a centre as the standard orders
// them, with -1 for the implicit hydrogen or lone pair; ids maps atoms to
// the numbering being compared.
func stereoOrder(m *Molecule, a int, ids func(int) int) []int {
	at := &m.Atoms[a]
	var order []int
	for _, b := range at.Bonds {
		order = append(order, ids(m.Bonds[b].Other(a)))
	}
	if len(order) == 3 {
		order = insertAt(order, at.HydrogenSlot(), implicitSlot)
	}
	return order
}

// corpus returns notation strings from outside the project: the RDKit
// fixture's NCI records (Debian rdkit-data) and the CIP validation suite
// (Hanson et al. 2018). Absent files are skipped.
func corpus(t testing.TB, limit int) []string {
	var out []string
	add := func(path string, col int) {
		f, err := os.Open(path)
		if err != nil {
			t.Logf("reference %s absent, skipped: %v", path, err)
			return
		}
		defer f.Close()
		sc := bufio.NewScanner(f)
		sc.Buffer(make([]byte, 1<<20), 1<<20)
		n := 0
		for sc.Scan() && n < limit {
			line := sc.Text()
			if line == "" || strings.HasPrefix(line, "#") {
				continue
			}
			cols := strings.Split(line, "\t")
			if len(cols) > col {
				out = append(out, cols[col])
				n++
			}
		}
	}
	add(filepath.Join("..", "testdata", "rdkit", "reader.tsv"), 2)
	add(filepath.Join("..", "..", "shared", "reference", "cip-validation-suite", "compounds.smi"), 0)
	if len(out) == 0 {
		t.Skip("no reference corpus found")
	}
	return out
}

// TestWriteRoundTrip writes every corpus record in several random
// writings, aromatic and Kekulé, and checks that each reads back as the
// same structure with the same stereo.
func TestWriteRoundTrip(t *testing.T) {
	limit := 20000
	if testing.Short() {
		limit = 500
	}
	failures, centres, directed := 0, 0, 0
	for i, s := range corpus(t, limit) {
		m := Read(s)
		if m.Errors.HasErrors() {
			continue
		}
		for _, a := range m.Atoms {
			if a.Chirality.Class == ChiralTH {
				centres++
			}
		}
		for _, b := range m.Bonds {
			if b.Dir != DirNone || b.CloseDir != DirNone {
				directed++
			}
		}
		for seed := uint64(0); seed < 3; seed++ {
			opt := WriteOptions{Random: rand.New(rand.NewPCG(uint64(i), seed)), Kekule: seed == 2}
			if seed == 0 {
				opt.Random = nil
			}
			w := Write(m, opt)
			if err := sameStructure(m, w, opt.Kekule); err != nil {
				failures++
				if failures <= 10 {
					t.Errorf("%q written as %q (seed %d, kekule %v): %v", s, w.Text, seed, opt.Kekule, err)
				}
			}
		}
	}
	if failures > 0 {
		t.Errorf("%d writings differ", failures)
	}
	// The corpus must exercise the stereo checks, or this test proves
	// nothing about them.
	if centres < 100 || directed < 100 {
		t.Errorf("corpus has only %d tetrahedral centres and %d directed bonds", centres, directed)
	}
	t.Logf("checked %d tetrahedral centres and %d directed bonds in 3 writings each", centres, directed)
}

// FuzzWriteRoundTrip checks that whatever the reader accepts, the writer
// writes in a form that reads back as the same structure.
func FuzzWriteRoundTrip(f *testing.F) {
	for _, s := range []string{"CCO", "c1ccccc1", "F/C=C/F", "[C@@H](F)(Cl)Br", "C1CC[C@]12CCC2", "CC>>C"} {
		f.Add(s, uint64(1), false)
	}
	f.Fuzz(func(t *testing.T, s string, seed uint64, kekule bool) {
		if len(s) > 2000 {
			return
		}
		m := Read(s)
		opt := WriteOptions{Random: rand.New(rand.NewPCG(seed, 0)), Kekule: kekule}
		w := Write(m, opt) // a molecule with errors must be written without panicking too
		if m.Errors.HasErrors() {
			return
		}
		if err := sameStructure(m, w, kekule); err != nil {
			t.Fatalf("%q written as %q: %v", s, w.Text, err)
		}
	})
}

func BenchmarkWrite(b *testing.B) {
	texts := corpus(b, 2000)
	var mols []*Molecule
	size := 0
	for _, s := range texts {
		if m := Read(s); !m.Errors.HasErrors() {
			mols = append(mols, m)
			size += len(s)
		}
	}
	b.SetBytes(int64(size))
	b.ReportAllocs()
	for b.Loop() {
		for _, m := range mols {
			Write(m, WriteOptions{})
		}
	}
}

func BenchmarkWriteLongChain(b *testing.B) {
	m := Read(strings.Repeat("C", 100000))
	b.ReportAllocs()
	for b.Loop() {
		Write(m, WriteOptions{})
	}
}

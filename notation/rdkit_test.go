package notation

import (
	"bufio"
	"os"
	"path/filepath"
	"slices"
	"strconv"
	"strings"
	"testing"
)

// The expectations in this file come from RDKit 2022.09.3 (Debian package
// python3-rdkit 202209.3-1) run over the NCI sample first_5K.smi shipped by
// Debian's rdkit-data; testdata/rdkit/README.md says how reader.tsv was
// made and testdata/rdkit/gen_reader.py is the generator.

// rdkitReaderFixture is the fixture path relative to this package.
var rdkitReaderFixture = filepath.Join("..", "testdata", "rdkit", "reader.tsv")

// rdkitRecord is one row of reader.tsv.
type rdkitRecord struct {
	line     int
	id       string // NCI identifier
	variant  string // given, random1, random2, kekule
	smiles   string
	accepted bool
	hcounts  []int // per atom in string order; nil when not accepted
	hill     string
	charge   int
}

// rdkitCheck names the comparisons the exception table can excuse.
type rdkitCheck string

const (
	checkAccept rdkitCheck = "accept"
	checkH      rdkitCheck = "hcount"
	checkHill   rdkitCheck = "formula"
)

// rdkitException is a record where the reader is expected to differ from
// RDKit, with the chemical reason. An empty variant covers every writing
// of the record.
type rdkitException struct {
	id, variant string
	check       rdkitCheck
	reason      string
}

// rdkitExceptions lists every expected disagreement; all are valence
// limits on bracket atoms, which OpenSMILES leaves to the toolkit. The
// RDKit side of each is what reader.tsv records; the chemistry is common
// practice. An entry that no longer disagrees fails the test too, so the
// table cannot go stale.
var rdkitExceptions = []rdkitException{
	{"1838", "given", checkAccept, "[Sb-3] with six Cl is hexachloroantimonate(III), a real ion; the reader takes Sb3- as isoelectronic with Xe, which allows six bonds, while RDKit adds the charge to the bonds (valence 9) and rejects it"},
	{"3249", "given", checkAccept, "[Al+3] with six [O+]= bonds is a hexakis(urea)aluminium complex with its dative bonds drawn covalently; RDKit counts valence 9 and rejects it, the reader has no valence rule for Al3+"},
	{"4651", "given", checkAccept, "[Be] with four bonds is bis(acetylacetonato)beryllium with its dative bonds drawn covalently; RDKit allows beryllium two bonds, the reader has no valence rule for Be"},
	{"2917", "", checkAccept, "neutral [Al] with six bonds is tris(oxalato)aluminate drawn covalently with its charge lost; RDKit admits six bonds on Al, the reader allows three"},
	{"4650", "", checkAccept, "neutral [Al] with six bonds to [O+]= is a tris(acetylacetonato) chelate drawn covalently; RDKit admits six bonds on Al, the reader allows three"},
	{"3402", "", checkAccept, "neutral F[Si](F)(F)(F)(F)F is hexafluorosilicate with its 2- charge lost; RDKit admits six bonds on Si, the reader allows four"},
	{"4844", "", checkAccept, "neutral F[P](F)(F)(F)(F)F is hexafluorophosphate with its charge lost; RDKit admits more than five bonds on P, the reader allows five"},
}

func readRDKitFixture(t testing.TB) []rdkitRecord {
	t.Helper()
	f, err := os.Open(rdkitReaderFixture)
	if err != nil {
		t.Fatalf("open fixture: %v (regenerate with testdata/rdkit/gen_reader.py)", err)
	}
	defer f.Close()
	var recs []rdkitRecord
	sc := bufio.NewScanner(f)
	sc.Buffer(make([]byte, 1<<20), 1<<20)
	for n := 1; sc.Scan(); n++ {
		line := sc.Text()
		if line == "" || strings.HasPrefix(line, "#") {
			continue
		}
		// id variant smiles accepted hcounts formula_rdkit formula_rdkit_isotopes hill charge
		col := strings.Split(line, "\t")
		if len(col) != 9 {
			t.Fatalf("%s:%d: %d columns, want 9", rdkitReaderFixture, n, len(col))
		}
		rec := rdkitRecord{line: n, id: col[0], variant: col[1], smiles: col[2], accepted: col[3] == "1", hill: col[7]}
		if rec.accepted {
			for _, s := range strings.Split(col[4], ",") {
				h, err := strconv.Atoi(s)
				if err != nil {
					t.Fatalf("%s:%d: hydrogen count %q: %v", rdkitReaderFixture, n, s, err)
				}
				rec.hcounts = append(rec.hcounts, h)
			}
		}
		if rec.accepted {
			c, err := strconv.Atoi(col[8])
			if err != nil {
				t.Fatalf("%s:%d: charge %q: %v", rdkitReaderFixture, n, col[8], err)
			}
			rec.charge = c
		}
		recs = append(recs, rec)
	}
	if err := sc.Err(); err != nil {
		t.Fatalf("read fixture: %v", err)
	}
	if len(recs) == 0 {
		t.Fatalf("%s holds no records", rdkitReaderFixture)
	}
	return recs
}

// TestRDKitReader compares acceptance, per-atom hydrogen counts and the
// Hill formula with RDKit on every string of reader.tsv.
func TestRDKitReader(t *testing.T) {
	recs := readRDKitFixture(t)
	type key struct {
		id, variant string
		check       rdkitCheck
	}
	excused := map[key]string{}
	for _, e := range rdkitExceptions {
		excused[key{e.id, e.variant, e.check}] = e.reason
	}
	used := map[key]bool{}
	// lookup finds the entry for one writing or for all writings.
	lookup := func(k key) (key, bool) {
		if _, ok := excused[k]; ok {
			return k, true
		}
		k.variant = ""
		_, ok := excused[k]
		return k, ok
	}
	var agree, differ, excusedN = map[rdkitCheck]int{}, map[rdkitCheck]int{}, 0
	reported := 0
	report := func(r rdkitRecord, c rdkitCheck, format string, args ...any) {
		if k, ok := lookup(key{r.id, r.variant, c}); ok {
			used[k] = true
			excusedN++
			return
		}
		differ[c]++
		if reported++; reported <= 50 {
			t.Errorf("%s:%d (NCI %s %s) %q: "+format, append([]any{rdkitReaderFixture, r.line, r.id, r.variant, r.smiles}, args...)...)
		}
	}
	for _, r := range recs {
		m := Read(r.smiles)
		ours := !m.Errors.HasErrors()
		if ours != r.accepted {
			if r.accepted {
				report(r, checkAccept, "RDKit accepts, we report %v", m.Errors.Err())
			} else {
				report(r, checkAccept, "RDKit rejects, we accept")
			}
			continue
		}
		agree[checkAccept]++
		if !ours {
			continue
		}
		if got := rdkitHydrogenCounts(m); !slices.Equal(got, r.hcounts) {
			report(r, checkH, "hydrogen counts %v, RDKit %v", got, r.hcounts)
		} else {
			agree[checkH]++
		}
		// The hill column is the Hill formula with isotopes merged into
		// their element and no charge, which is what Formula.String
		// prints; RDKit's own CalcMolFormula puts H first when there is
		// no carbon, so it is not used.
		f := MolecularFormula(m)
		if got := f.String(); got != r.hill || f.Charge != r.charge {
			report(r, checkHill, "formula %s charge %d, RDKit %s charge %d", got, f.Charge, r.hill, r.charge)
		} else {
			agree[checkHill]++
		}
	}
	for k := range excused {
		if !used[k] {
			t.Errorf("exception for NCI %s %q (%s) no longer needed: remove it", k.id, k.variant, k.check)
		}
	}
	if reported > 50 {
		t.Errorf("... %d more disagreements not shown", reported-50)
	}
	t.Logf("RDKit agreement over %d strings: acceptance %d (differ %d), hydrogen counts %d (differ %d), formula %d (differ %d); %d excused",
		len(recs), agree[checkAccept], differ[checkAccept], agree[checkH], differ[checkH], agree[checkHill], differ[checkHill], excusedN)
}

// rdkitHydrogenCounts lists Atom.HydrogenCount in atom order, the order
// RDKit's GetTotalNumHs column uses.
func rdkitHydrogenCounts(m *Molecule) []int {
	hs := make([]int, len(m.Atoms))
	for i := range m.Atoms {
		hs[i] = m.Atoms[i].HydrogenCount()
	}
	return hs
}

// BenchmarkReadFixture reads every string of reader.tsv once per
// iteration and reports records and bytes per second.
func BenchmarkReadFixture(b *testing.B) {
	recs := readRDKitFixture(b)
	size := 0
	for _, r := range recs {
		size += len(r.smiles)
	}
	b.SetBytes(int64(size))
	b.ReportAllocs()
	n := 0
	for b.Loop() {
		for _, r := range recs {
			Read(r.smiles)
		}
		n++
	}
	b.ReportMetric(float64(n*len(recs))/b.Elapsed().Seconds(), "records/s")
}

package identity

import (
	"os"
	"strings"
	"testing"

	"stereoline/notation"
)

// benchMolecules reads the writings of testdata/rdkit/identity.tsv
// (RDKit random writings of NCI molecules, with and without stereo),
// leaving out the ones the reader is known not to finish (a reader that
// never returns would keep a core busy and skew every timing).
func benchMolecules(b *testing.B) []*notation.Molecule {
	rows := readIdentityFixture(b)
	var out []*notation.Molecule
	for _, r := range rows {
		out = append(out, notation.Read(r.smiles))
	}
	return out
}

// BenchmarkIdentify measures keys per second over the fixture writings
// (parsing not timed).
func BenchmarkIdentify(b *testing.B) {
	mols := benchMolecules(b)
	b.ResetTimer()
	n := 0
	for i := 0; i < b.N; i++ {
		Identify(mols[i%len(mols)])
		n++
	}
	b.ReportMetric(float64(n)/b.Elapsed().Seconds(), "keys/s")
}

// BenchmarkIndex100k indexes a list of 100,000 records (the fixture
// writings repeated, so duplicates and stereoisomers occur as in a real
// list): Identify and Add for each, in one pass.
func BenchmarkIndex100k(b *testing.B) {
	mols := benchMolecules(b)
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		x := NewIndex()
		for r := 0; r < 100000; r++ {
			x.Add(Identify(mols[r%len(mols)]))
		}
	}
}

// BenchmarkIndexAdd100k times the index alone over 100,000 precomputed
// identities: the cost of relating, without computing keys.
func BenchmarkIndexAdd100k(b *testing.B) {
	mols := benchMolecules(b)
	ids := make([]Identity, len(mols))
	for i, m := range mols {
		ids[i] = Identify(m)
	}
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		x := NewIndex()
		for r := 0; r < 100000; r++ {
			x.Add(ids[r%len(ids)])
		}
	}
}

// BenchmarkIdentifyScale computes the keys of every record of the list
// STEREOLINE_SCALE_LIST names (testdata/scale/make_list.py; the first
// field of each line), one op for the whole list, parsing not timed.
func BenchmarkIdentifyScale(b *testing.B) {
	name := os.Getenv("STEREOLINE_SCALE_LIST")
	if name == "" {
		b.Skip("STEREOLINE_SCALE_LIST is not set (make one with testdata/scale/make_list.py)")
	}
	data, err := os.ReadFile(name)
	if err != nil {
		b.Fatal(err)
	}
	var mols []*notation.Molecule
	for line := range strings.Lines(string(data)) {
		if f := strings.Fields(line); len(f) > 0 {
			if m := notation.Read(f[0]); !m.Errors.HasErrors() && !m.Reaction && len(m.Atoms) > 0 {
				mols = append(mols, m)
			}
		}
	}
	b.ResetTimer()
	for b.Loop() {
		for _, m := range mols {
			Identify(m)
		}
	}
}

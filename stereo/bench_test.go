package stereo

import (
	"testing"

	"stereoline/notation"
)

// BenchmarkLabelSuite labels the 300 compounds of the CIP validation
// suite (reading excluded); the metric mol/s is molecules per second.
func BenchmarkLabelSuite(b *testing.B) {
	cases := readSuite(b)
	mols := make([]*notation.Molecule, len(cases))
	for i, c := range cases {
		mols[i] = notation.Read(c.smiles)
	}
	benchmarkLabel(b, mols)
}

// BenchmarkLabelFixture labels every row of the RDKit CIP fixture (the
// canonical and both random writings), the same molecules
// testdata/rdkit/bench_cip.py times RDKit on.
func BenchmarkLabelFixture(b *testing.B) {
	var mols []*notation.Molecule
	for _, r := range readRDKitCIP(b) {
		mols = append(mols, notation.Read(r.smiles))
	}
	benchmarkLabel(b, mols)
}

// BenchmarkLabel is the suite benchmark under the name the issue uses.
func BenchmarkLabel(b *testing.B) { BenchmarkLabelSuite(b) }

func benchmarkLabel(b *testing.B, mols []*notation.Molecule) {
	b.ResetTimer()
	n := 0
	for i := 0; i < b.N; i++ {
		for _, m := range mols {
			Analyze(m)
			n++
		}
	}
	b.ReportMetric(float64(n)/b.Elapsed().Seconds(), "mol/s")
}

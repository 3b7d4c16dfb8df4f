package depict

import (
	"io"
	"strings"
	"testing"

	"stereoline/notation"
	"stereoline/stereo"
)

// benchMolecules returns the fixture molecules of at most 50 heavy
// atoms.
func benchMolecules(b *testing.B) []string {
	var out []string
	for _, s := range fixtureStrings(b) {
		m := notation.Read(s)
		heavy := 0
		for _, a := range m.Atoms {
			if a.Number != notation.ElemH {
				heavy++
			}
		}
		if heavy <= 50 {
			out = append(out, s)
		}
	}
	return out
}

// BenchmarkDraw measures whole drawings of the fixture molecules of up
// to 50 heavy atoms: reading, stereo analysis, layout and SVG. Run with
// GOMAXPROCS=1 for one core:
//
//	GOMAXPROCS=1 go test -run '^$' -bench 'Draw$' ./stereo/depict/
func BenchmarkDraw(b *testing.B) {
	mols := benchMolecules(b)
	b.ResetTimer()
	n := 0
	for b.Loop() {
		s := mols[n%len(mols)]
		n++
		d := Draw(notation.Read(s), Options{})
		if err := WriteSVG(io.Discard, d); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(n)/b.Elapsed().Seconds(), "drawings/s")
}

// BenchmarkLayout measures the layout alone (Draw with the analysis
// given).
func BenchmarkLayout(b *testing.B) {
	mols := benchMolecules(b)
	type in struct {
		m  *notation.Molecule
		an *stereo.Analysis
	}
	var ins []in
	for _, s := range mols {
		m := notation.Read(s)
		ins = append(ins, in{m, stereo.Analyze(m)})
	}
	b.ResetTimer()
	n := 0
	for b.Loop() {
		x := ins[n%len(ins)]
		n++
		Draw(x.m, Options{Analysis: x.an})
	}
	b.ReportMetric(float64(n)/b.Elapsed().Seconds(), "drawings/s")
}

// BenchmarkDrawHuge measures a 10,002-atom record, which gets the
// fallback layout; the budget is one second.
func BenchmarkDrawHuge(b *testing.B) {
	text := strings.Repeat("C[C@H](O)", 3334)
	for b.Loop() {
		d := Draw(notation.Read(text), Options{})
		if err := WriteSVG(io.Discard, d); err != nil {
			b.Fatal(err)
		}
	}
}

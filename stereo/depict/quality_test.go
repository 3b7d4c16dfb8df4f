package depict

import (
	"math"
	"os"
	"slices"
	"strings"
	"testing"
	"time"

	"stereoline/notation"
)

// layoutFlaws judges a drawing by the criteria of
// testdata/rdkit/layout_quality.py: every bond within 10% of the median
// bond length, no two atoms closer than half of it, no two bonds
// crossing. Only the record's own atoms count (not hydrogens the drawing
// adds for wedges). It returns the failed criteria, sorted.
func layoutFlaws(m *notation.Molecule, d *Drawing) []string {
	pos := make([]Point, len(m.Atoms))
	for _, a := range d.Atoms {
		if !a.Added && a.N >= 1 && a.N <= len(m.Atoms) {
			pos[a.N-1] = a.P
		}
	}
	var bonds [][2]int
	var lens []float64
	for _, b := range m.Bonds {
		if b.Begin < 0 || b.End < 0 || b.Begin >= len(pos) || b.End >= len(pos) {
			continue
		}
		bonds = append(bonds, [2]int{b.Begin, b.End})
		lens = append(lens, pos[b.Begin].dist(pos[b.End]))
	}
	if len(bonds) == 0 {
		return nil
	}
	sorted := slices.Clone(lens)
	slices.Sort(sorted)
	med := sorted[len(sorted)/2]
	if len(sorted)%2 == 0 {
		med = (sorted[len(sorted)/2-1] + sorted[len(sorted)/2]) / 2
	}
	var out []string
	for _, x := range lens {
		if math.Abs(x-med) > 0.1*med {
			out = append(out, "length")
			break
		}
	}
	close := false
	for i := range pos {
		for j := i + 1; j < len(pos) && !close; j++ {
			close = pos[i].dist(pos[j]) < 0.5*med
		}
	}
	if close {
		out = append(out, "close")
	}
	cross := false
	for i, p := range bonds {
		for _, q := range bonds[i+1:] {
			if p[0] == q[0] || p[0] == q[1] || p[1] == q[0] || p[1] == q[1] {
				continue
			}
			if segmentsCross(pos[p[0]], pos[p[1]], pos[q[0]], pos[q[1]]) {
				cross = true
			}
		}
	}
	if cross {
		out = append(out, "cross")
	}
	slices.Sort(out)
	return out
}

// unhurried is a layout budget no drawing of the fixtures reaches, so a
// busy machine does not change what the tests see.
const unhurried = time.Minute

// TestLayoutQuality lays out every molecule of the stereo fixtures and
// judges it beside RDKit 2022.09.3's Compute2DCoords layout of the same
// molecule, whose verdict testdata/rdkit/layout_quality.tsv records
// (made by testdata/rdkit/layout_quality.py --write). We must lay out at
// least as many molecules tidily as RDKit does, and every molecule RDKit
// lays out tidily, tidily too.
func TestLayoutQuality(t *testing.T) {
	data, err := os.ReadFile("../../testdata/rdkit/layout_quality.tsv")
	if err != nil {
		t.Fatal(err)
	}
	suite := map[string]string{}
	if s, err := os.ReadFile("../../../shared/reference/cip-validation-suite/compounds.smi"); err == nil {
		for _, line := range strings.Split(string(s), "\n") {
			if f := strings.Split(line, "\t"); len(f) >= 2 && f[0] != "" {
				suite[f[1]] = f[0]
			}
		}
	} else {
		t.Logf("CIP validation suite not found (../shared/reference/cip-validation-suite): its rows are skipped")
	}
	total, ours, theirs, missed := 0, 0, 0, 0
	for _, line := range strings.Split(string(data), "\n") {
		if line == "" || line[0] == '#' {
			continue
		}
		f := strings.Split(line, "\t")
		if len(f) != 4 {
			t.Fatalf("bad row %q", line)
		}
		smi := f[2]
		if f[0] == "suite" {
			if smi = suite[f[1]]; smi == "" {
				continue
			}
		}
		m := notation.Read(smi)
		flaws := layoutFlaws(m, Draw(m, Options{Budget: unhurried}))
		total++
		if len(flaws) == 0 {
			ours++
		}
		if f[3] == "-" {
			theirs++
			if len(flaws) > 0 {
				missed++
				if missed <= 10 {
					t.Errorf("%s %s %s: RDKit's layout is tidy, ours fails %v", f[0], f[1], smi, flaws)
				}
			}
		}
	}
	if total < 4000 {
		t.Fatalf("only %d molecules judged; regenerate the fixture", total)
	}
	t.Logf("tidy layouts: ours %d of %d (%.1f%%), RDKit's %d", ours, total, 100*float64(ours)/float64(total), theirs)
	if ours < theirs {
		t.Errorf("ours tidy %d, fewer than RDKit's %d", ours, theirs)
	}
	if missed > 0 {
		t.Errorf("%d molecules RDKit lays out tidily and we do not", missed)
	}
}

package depict

import (
	"bufio"
	"bytes"
	"fmt"
	"math"
	"os"
	"strconv"
	"strings"
	"testing"

	"stereoline/notation"
	"stereoline/stereo"
)

// This file holds the tests' reader of our molfiles: it takes a molfile
// as another program would (coordinates, bond orders, wedge flags read
// from the text) and says what configuration each written unit has in
// it, so tests can check that the drawing means what the notation says.
// The reading follows the common practice of wedge interpretation: a
// wedge rises from its narrow end towards the viewer, a hash falls away,
// other bonds lie in the paper, an undrawn hydrogen points away from the
// drawn ligands.

type molAtom struct {
	x, y float64
	sym  string
}

type molBond struct {
	a, b, order, flag int
}

type molfile struct {
	atoms []molAtom
	bonds []molBond
}

func parseMolfile(text string) (*molfile, error) {
	sc := bufio.NewScanner(strings.NewReader(text))
	var lines []string
	for sc.Scan() {
		lines = append(lines, sc.Text())
	}
	if len(lines) < 4 || !strings.HasSuffix(lines[3], "V2000") {
		return nil, fmt.Errorf("no V2000 counts line")
	}
	na, err1 := strconv.Atoi(strings.TrimSpace(lines[3][0:3]))
	nb, err2 := strconv.Atoi(strings.TrimSpace(lines[3][3:6]))
	if err1 != nil || err2 != nil || len(lines) < 4+na+nb {
		return nil, fmt.Errorf("bad counts line %q", lines[3])
	}
	mf := &molfile{}
	for i := 0; i < na; i++ {
		f := strings.Fields(lines[4+i])
		x, _ := strconv.ParseFloat(f[0], 64)
		y, _ := strconv.ParseFloat(f[1], 64)
		mf.atoms = append(mf.atoms, molAtom{x, y, f[3]})
	}
	for i := 0; i < nb; i++ {
		l := lines[4+na+i]
		num := func(k int) int { v, _ := strconv.Atoi(strings.TrimSpace(l[3*k : 3*k+3])); return v }
		mf.bonds = append(mf.bonds, molBond{num(0) - 1, num(1) - 1, num(2), num(3)})
	}
	return mf, nil
}

// volume is the signed volume of centre c's ligands, taken in order
// (stereo.ImplicitNeighbour for the hydrogen or lone pair), as drawn.
func (mf *molfile) volume(c int, order []int, n int) float64 {
	z := map[int]float64{}
	var nbrs []int
	for _, b := range mf.bonds {
		switch {
		case b.a == c:
			nbrs = append(nbrs, b.b)
			switch b.flag {
			case 1:
				z[b.b] = 1
			case 6:
				z[b.b] = -1
			}
		case b.b == c:
			nbrs = append(nbrs, b.a)
		}
	}
	// a hydrogen the drawing added stands for the implicit one
	added := -1
	for _, y := range nbrs {
		if y >= n && mf.atoms[y].sym == "H" {
			added = y
		}
	}
	vec := func(y int) [3]float64 {
		dx, dy := mf.atoms[y].x-mf.atoms[c].x, mf.atoms[y].y-mf.atoms[c].y
		l := math.Hypot(dx, dy)
		v := [3]float64{dx / l, dy / l, 0.8 * z[y]}
		m := math.Sqrt(v[0]*v[0] + v[1]*v[1] + v[2]*v[2])
		return [3]float64{v[0] / m, v[1] / m, v[2] / m}
	}
	var pts [4][3]float64
	var sum [3]float64
	implicitAt := -1
	for i, x := range order {
		if x == stereo.ImplicitNeighbour {
			if added < 0 {
				implicitAt = i
				continue
			}
			x = added
		}
		pts[i] = vec(x)
		for k := range sum {
			sum[k] += pts[i][k]
		}
	}
	if implicitAt >= 0 {
		m := math.Sqrt(sum[0]*sum[0] + sum[1]*sum[1] + sum[2]*sum[2])
		if m < 1e-6 {
			return 0
		}
		pts[implicitAt] = [3]float64{-sum[0] / m, -sum[1] / m, -sum[2] / m}
	}
	return orient(pts)
}

// meaningErrors lists how the molfile of d differs from what m's marks
// say: tetrahedral centres that read with the other configuration or
// none, double bonds drawn with the other geometry.
func meaningErrors(m *notation.Molecule, an *stereo.Analysis, d *Drawing) []string {
	var buf bytes.Buffer
	if err := WriteMolfile(&buf, d); err != nil {
		return []string{err.Error()}
	}
	mf, err := parseMolfile(buf.String())
	if err != nil {
		return []string{err.Error()}
	}
	var errs []string
	n := len(m.Atoms)
	for i := range an.Units {
		u := &an.Units[i]
		if !u.Specified {
			continue
		}
		switch u.Kind {
		case stereo.KindTetrahedral:
			order, ok := stereo.NeighbourOrder(m, u.Centre)
			if !ok {
				continue
			}
			v := mf.volume(u.Centre, order, n)
			want := m.Atoms[u.Centre].Chirality.Num == 2
			if math.Abs(v) < 0.05 || (v > 0) != want {
				errs = append(errs, fmt.Sprintf("centre %d reads %+.2f, written %s", u.Centre+1, v, map[bool]string{true: "@@", false: "@"}[want]))
			}
		case stereo.KindAllene:
			if e := mf.alleneError(m, u.Centre); e != "" {
				errs = append(errs, e)
			}
		case stereo.KindDoubleBond:
			w, ok := stereo.WrittenDoubleBond(m, u)
			if !ok {
				continue
			}
			at := func(i int) Point { return Point{mf.atoms[i].x, mf.atoms[i].y} }
			s0 := side(at(w.Refs[0]), at(w.Ends[0]), at(w.Ends[1]))
			s1 := side(at(w.Refs[1]), at(w.Ends[0]), at(w.Ends[1]))
			if s0 == 0 || s1 == 0 || (s0 != s1) != w.Trans {
				errs = append(errs, fmt.Sprintf("double bond %d=%d drawn %s, written %s", w.Ends[0]+1, w.Ends[1]+1,
					map[bool]string{true: "trans", false: "cis"}[s0 != s1], map[bool]string{true: "trans", false: "cis"}[w.Trans]))
			}
		}
	}
	// every wedge and hash starts at a stereocentre or an allene's end
	ends := map[int]bool{}
	for i := range an.Units {
		u := &an.Units[i]
		if !u.Specified {
			continue
		}
		switch u.Kind {
		case stereo.KindTetrahedral:
			ends[u.Centre] = true
		case stereo.KindAllene:
			for _, a := range u.Atoms {
				ends[a] = true
			}
		}
	}
	for _, b := range mf.bonds {
		if (b.flag == 1 || b.flag == 6) && !ends[b.a] {
			errs = append(errs, fmt.Sprintf("wedge or hash %d-%d starts at no specified unit", b.a+1, b.b+1))
		}
	}
	return errs
}

// alleneError reads the allene centred on c: the substituents of one end
// stand across the paper by their wedge flags, the other end's lie in
// it; a hydrogen not drawn is its mate mirrored across the axis.
func (mf *molfile) alleneError(m *notation.Molecule, c int) string {
	w, ok := stereo.ReadAllene(m, c)
	if !ok {
		return ""
	}
	at := func(i int) [3]float64 { return [3]float64{mf.atoms[i].x, mf.atoms[i].y, 0} }
	z := map[int]float64{}
	drawnH := map[int]int{} // end -> added hydrogen
	for _, b := range mf.bonds {
		if b.flag == 1 {
			z[b.b] = 1
		} else if b.flag == 6 {
			z[b.b] = -1
		}
		for _, e := range w.Ends {
			if b.a == e && b.b >= len(m.Atoms) {
				drawnH[e] = b.b
			}
		}
	}
	var pts [4][3]float64
	for i, x := range w.Ligands {
		end := w.Ends[w.LigandEnd[i]]
		if x == stereo.ImplicitNeighbour {
			if h, ok := drawnH[end]; ok {
				x = h
			} else {
				// the mate mirrored across the axis, in the paper
				mate := -1
				for j, y := range w.Ligands {
					if j != i && y != stereo.ImplicitNeighbour && w.LigandEnd[j] == w.LigandEnd[i] {
						mate = y
					}
				}
				if mate < 0 {
					return ""
				}
				p := Point{mf.atoms[mate].x, mf.atoms[mate].y}.reflect(Point{mf.atoms[end].x, mf.atoms[end].y}, Point{mf.atoms[c].x, mf.atoms[c].y})
				pts[i] = [3]float64{p.X, p.Y, 0}
				continue
			}
		}
		p := at(x)
		if zz := z[x]; zz != 0 {
			// standing across the paper: along the axis, up or down by
			// its distance from the axis
			e, cc := Point{mf.atoms[end].x, mf.atoms[end].y}, Point{mf.atoms[c].x, mf.atoms[c].y}
			axis := e.sub(cc).unit()
			v := Point{p[0], p[1]}.sub(e)
			q := e.add(axis.scale(v.dot(axis)))
			p = [3]float64{q.X, q.Y, zz * math.Abs(v.cross(axis))}
		}
		pts[i] = p
	}
	v := orient(pts)
	if math.Abs(v) < 1e-6 || (v > 0) != w.Clockwise {
		return fmt.Sprintf("allene %d reads %+.2f, written %s", c+1, v, map[bool]string{true: "@@", false: "@"}[w.Clockwise])
	}
	return ""
}

// fixtureStrings returns the distinct strings of the stereo fixtures:
// testdata/rdkit/cip_labels.tsv and the CIP validation suite.
func fixtureStrings(t testing.TB) []string {
	t.Helper()
	var out []string
	seen := map[string]bool{}
	add := func(s string) {
		if s != "" && !seen[s] {
			seen[s] = true
			out = append(out, s)
		}
	}
	data, err := os.ReadFile("../../testdata/rdkit/cip_labels.tsv")
	if err != nil {
		t.Fatal(err)
	}
	for _, line := range strings.Split(string(data), "\n") {
		if line == "" || line[0] == '#' {
			continue
		}
		if f := strings.Split(line, "\t"); len(f) > 3 {
			add(f[3])
		}
	}
	if suite, err := os.ReadFile("../../../shared/reference/cip-validation-suite/compounds.smi"); err == nil {
		for _, line := range strings.Split(string(suite), "\n") {
			add(strings.Split(line, "\t")[0])
		}
	} else {
		t.Logf("CIP validation suite not found (../shared/reference/cip-validation-suite): only cip_labels.tsv is used")
	}
	return out
}

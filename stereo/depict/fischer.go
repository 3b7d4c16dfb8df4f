package depict

import (
	"fmt"
	"slices"
	"strings"
	"time"

	"stereoline/notation"
	"stereoline/stereo"
)

// This file implements Fischer projections (IUPAC 2013 recommendations,
// P-93.5.2.1, Fischer projections; section number from memory): the
// carbon chain vertical with the end of lowest locant, the most oxidised
// (CHO, COOH, C=O), at the top; at each stereocentre the vertical bonds
// point away from the viewer and the horizontal ones towards, so the two
// other ligands stand left and right as the configuration demands. The
// D/L descriptor is read from the stereocentre nearest the bottom (the
// highest-numbered one): its heteroatom on the right is D, on the left L
// (the convention for monosaccharides and alpha-amino acids, P-102 and
// P-103 of the same recommendations, from memory).
//
// Views are made for open chains with two or more consecutive specified
// stereocentres on carbon, for alpha-amino acids with a specified alpha
// carbon and for monosaccharides with one stereocentre (glyceraldehyde).

// FischerRow is one stereocentre of the projection: the atom and the
// ligands drawn to its left and right (0-based atoms; -1 for an implicit
// hydrogen).
type FischerRow struct {
	Centre, Left, Right int
}

// Fischer is a Fischer projection of a molecule.
type Fischer struct {
	Rows        []FischerRow // top to bottom
	Top, Bottom int          // the chain atoms above the first and below the last row
	Family      stereo.Family
	Meso        bool
	AminoAcid   bool
	m           *notation.Molecule
	an          *stereo.Analysis
}

// FischerOf finds the Fischer projection of m, or returns nil and the
// reason there is none.
func FischerOf(m *notation.Molecule, an *stereo.Analysis) (f *Fischer, reason string) {
	defer func() {
		if r := recover(); r != nil {
			f, reason = nil, fmt.Sprintf("internal error while building the Fischer view: %v", r)
		}
	}()
	if m == nil || len(m.Atoms) == 0 {
		return nil, "no atoms were read"
	}
	if len(m.Atoms) > MaxAtoms {
		return nil, fmt.Sprintf("the record has %d atoms, more than the %d drawings cover", len(m.Atoms), MaxAtoms)
	}
	if an == nil {
		an = stereo.Analyze(m)
	}
	rings := notation.FindRings(m)
	ringAtom := make([]bool, len(m.Atoms))
	for i := range ringAtom {
		ringAtom[i] = rings.AtomInRing(i)
	}
	rank := canonicalRanks(m, ringAtom, an)
	isCentre := make([]bool, len(m.Atoms))
	anyCentre, inRing, unmarked := false, false, false
	for i := range an.Units {
		u := &an.Units[i]
		if u.Kind != stereo.KindTetrahedral || u.Centre < 0 {
			continue
		}
		anyCentre = true
		c := u.Centre
		switch {
		case !u.Specified:
			unmarked = true
		case ringAtom[c]:
			inRing = true
		case m.Atoms[c].Number == notation.ElemC && len(m.Atoms[c].Bonds)+m.Atoms[c].HydrogenCount() == 4:
			isCentre[c] = true
		}
	}
	chain := longestRun(m, isCentre, rank)
	f = &Fischer{m: m, an: an}
	if len(chain) >= 2 {
		f.Top = chainEnd(m, chain[0], chain[1], rank)
		f.Bottom = chainEnd(m, chain[len(chain)-1], chain[len(chain)-2], rank)
		if ox := oxidation(m, f.Bottom) - oxidation(m, f.Top); ox > 0 || (ox == 0 && rank[f.Bottom] < rank[f.Top]) {
			slices.Reverse(chain)
			f.Top, f.Bottom = f.Bottom, f.Top
		}
	} else {
		chain = nil
		for _, fl := range stereo.Families(m) {
			if !isCentre[fl.Atom] {
				continue
			}
			c := fl.Atom
			top, bottom := -1, -1
			for _, y := range neighbours(m, c) {
				switch {
				case fl.Kind == stereo.FamilyAminoAcid && m.Atoms[y].Number == notation.ElemN && !m.Atoms[y].Aromatic:
				case fl.Kind == stereo.FamilyAminoAcid && top < 0 && isCarboxyl(m, y):
					top = y
				case fl.Kind == stereo.FamilySugar && m.Atoms[y].Number == notation.ElemO:
				case fl.Kind == stereo.FamilySugar && m.Atoms[y].Number == notation.ElemC && oxidation(m, y) >= 2 && top < 0:
					top = y // a one-centre sugar: glyceraldehyde, its aldehyde on top
				default:
					bottom = y
				}
			}
			if top >= 0 && bottom >= 0 {
				chain = []int{c}
				f.Top, f.Bottom, f.AminoAcid = top, bottom, fl.Kind == stereo.FamilyAminoAcid
				break
			}
		}
		if len(chain) != 1 {
			switch {
			case !anyCentre:
				return nil, "no Fischer view: the structure has no stereocentre"
			case unmarked && !slices.Contains(isCentre, true):
				return nil, "no Fischer view: the stereocentres are not marked"
			case inRing && !slices.Contains(isCentre, true):
				return nil, "no Fischer view: the stereocentres lie in rings, not on an open chain"
			}
			return nil, "no Fischer view: no open carbon chain with two consecutive marked stereocentres, and no alpha-amino acid"
		}
	}
	for i, c := range chain {
		up, down := f.Top, f.Bottom
		if i > 0 {
			up = chain[i-1]
		}
		if i+1 < len(chain) {
			down = chain[i+1]
		}
		row, ok := fischerRow(m, c, up, down)
		if !ok {
			return nil, fmt.Sprintf("no Fischer view: the mark on atom %d does not give four ligands", c+1)
		}
		f.Rows = append(f.Rows, row)
	}
	f.Family = f.family()
	f.Meso = f.meso(symmetryClasses(m, ringAtom))
	return f, ""
}

func neighbours(m *notation.Molecule, a int) []int {
	var out []int
	for _, bi := range m.Atoms[a].Bonds {
		out = append(out, m.Bonds[bi].Other(a))
	}
	return out
}

// isCarboxyl reports a carbon double-bonded to oxygen and single-bonded
// to oxygen or nitrogen (acid, ester, amide, carboxylate).
func isCarboxyl(m *notation.Molecule, x int) bool {
	if m.Atoms[x].Number != notation.ElemC {
		return false
	}
	oxo, single := false, false
	for _, bi := range m.Atoms[x].Bonds {
		b := &m.Bonds[bi]
		y := m.Atoms[b.Other(x)].Number
		switch {
		case y == notation.ElemO && kekule(b) == 2:
			oxo = true
		case (y == notation.ElemO || y == notation.ElemN) && kekule(b) == 1:
			single = true
		}
	}
	return oxo && single
}

// longestRun returns the longest path of bonded stereocentres, ties
// broken canonically.
func longestRun(m *notation.Molecule, isCentre []bool, rank []int) []int {
	var best []int
	adj := func(c int) []int {
		var out []int
		for _, bi := range m.Atoms[c].Bonds {
			if y := m.Bonds[bi].Other(c); isCentre[y] && kekule(&m.Bonds[bi]) == 1 {
				out = append(out, y)
			}
		}
		slices.SortFunc(out, func(a, b int) int { return rank[a] - rank[b] })
		return out
	}
	// farthest centre from s within its tree, with the path to it
	far := func(s int) []int {
		prev := map[int]int{s: -1}
		q := []int{s}
		last := s
		for k := 0; k < len(q); k++ {
			for _, y := range adj(q[k]) {
				if _, ok := prev[y]; !ok {
					prev[y] = q[k]
					q = append(q, y)
					last = y
				}
			}
		}
		var path []int
		for x := last; x >= 0; x = prev[x] {
			path = append(path, x)
		}
		return path
	}
	order := make([]int, 0)
	for c := range isCentre {
		if isCentre[c] {
			order = append(order, c)
		}
	}
	slices.SortFunc(order, func(a, b int) int { return rank[a] - rank[b] })
	seen := map[int]bool{}
	for _, c := range order {
		if seen[c] {
			continue
		}
		p := far(far(c)[0])
		for _, x := range p {
			seen[x] = true
		}
		if len(p) > len(best) {
			best = p
		}
	}
	return best
}

// chainEnd returns the atom that continues the chain beyond centre c
// (away from next): a carbon, the most oxidised one first.
func chainEnd(m *notation.Molecule, c, next int, rank []int) int {
	best := -1
	for _, y := range neighbours(m, c) {
		if y == next || m.Atoms[y].Number == notation.ElemH {
			continue
		}
		if best < 0 {
			best = y
			continue
		}
		cy, cb := m.Atoms[y].Number == notation.ElemC, m.Atoms[best].Number == notation.ElemC
		switch {
		case cy != cb:
			if cy {
				best = y
			}
		case oxidation(m, y) != oxidation(m, best):
			if oxidation(m, y) > oxidation(m, best) {
				best = y
			}
		case rank[y] < rank[best]:
			best = y
		}
	}
	return best
}

// oxidation counts the bonds from carbon x to heteroatoms, by order.
func oxidation(m *notation.Molecule, x int) int {
	if x < 0 || m.Atoms[x].Number != notation.ElemC {
		return 0
	}
	n := 0
	for _, bi := range m.Atoms[x].Bonds {
		b := &m.Bonds[bi]
		if z := m.Atoms[b.Other(x)].Number; z != notation.ElemC && z != notation.ElemH {
			n += kekule(b)
		}
	}
	return n
}

// fischerRow places centre c's two other ligands left and right: with up
// and down away from the viewer and left and right towards, the volume
// of the ligands in the notation's order must have the mark's sign.
func fischerRow(m *notation.Molecule, c, up, down int) (FischerRow, bool) {
	order, ok := stereo.NeighbourOrder(m, c)
	if !ok {
		return FischerRow{}, false
	}
	var others []int
	for _, x := range order {
		if x != up && x != down {
			others = append(others, x)
		}
	}
	if len(others) != 2 {
		return FischerRow{}, false
	}
	row := FischerRow{Centre: c, Left: others[0], Right: others[1]}
	if fischerVolume(order, up, down, row.Left, row.Right) > 0 != (m.Atoms[c].Chirality.Num == 2) {
		row.Left, row.Right = row.Right, row.Left
	}
	return row, true
}

// fischerVolume is the signed volume of the ligands in order with up,
// down, left and right at their places in the projection.
func fischerVolume(order []int, up, down, left, right int) float64 {
	var pts [4][3]float64
	for i, x := range order {
		switch x {
		case up:
			pts[i] = [3]float64{0, 1, -1}
		case down:
			pts[i] = [3]float64{0, -1, -1}
		case left:
			pts[i] = [3]float64{-1, 0, 1}
		case right:
			pts[i] = [3]float64{1, 0, 1}
		}
	}
	return orient(pts)
}

// family reads D or L from the bottom row: a hydrogen on one side and a
// heteroatom on the other.
func (f *Fischer) family() stereo.Family {
	r := f.Rows[len(f.Rows)-1]
	isH := func(x int) bool { return x < 0 || f.m.Atoms[x].Number == notation.ElemH }
	hetero := func(x int) bool {
		return x >= 0 && f.m.Atoms[x].Number != notation.ElemC && f.m.Atoms[x].Number != notation.ElemH
	}
	switch {
	case isH(r.Left) && hetero(r.Right):
		return stereo.FamilyD
	case isH(r.Right) && hetero(r.Left):
		return stereo.FamilyL
	}
	return stereo.FamilyNone
}

// meso reports a projection with a horizontal mirror plane: the chain
// reads the same from both ends, left and right groups included.
func (f *Fischer) meso(cls []int) bool {
	k := len(f.Rows)
	if k < 2 {
		return false
	}
	same := func(a, b int) bool {
		if a < 0 || b < 0 {
			return a == b
		}
		return cls[a] == cls[b]
	}
	if !same(f.Top, f.Bottom) {
		return false
	}
	for i := 0; i < k; i++ {
		a, b := f.Rows[i], f.Rows[k-1-i]
		if !same(a.Centre, b.Centre) || !same(a.Left, b.Left) || !same(a.Right, b.Right) {
			return false
		}
	}
	return true
}

// Caption says what the projection shows.
func (f *Fischer) Caption() string {
	var parts []string
	parts = append(parts, "Fischer projection: vertical bonds point away from the viewer, horizontal bonds towards")
	switch {
	case f.Meso:
		parts = append(parts, "meso: the projection has a horizontal mirror plane, so the compound is achiral")
	case f.Family != stereo.FamilyNone:
		parts = append(parts, fmt.Sprintf("%s: the heteroatom of the lowest stereocentre (atom %d) stands on the %s",
			f.Family, f.Rows[len(f.Rows)-1].Centre+1, map[stereo.Family]string{stereo.FamilyD: "right", stereo.FamilyL: "left"}[f.Family]))
	}
	return strings.Join(parts, "; ")
}

// FischerJSON is the JSON form of a projection: atom numbers as describe
// prints them, 0 for an implicit hydrogen.
type FischerJSON struct {
	Rows   []FischerRowJSON `json:"rows"`
	Top    int              `json:"top"`
	Bottom int              `json:"bottom"`
	Family *string          `json:"family"`
}

// FischerRowJSON is one row of FischerJSON.
type FischerRowJSON struct {
	Centre int `json:"centre"`
	Left   int `json:"left"`
	Right  int `json:"right"`
}

// JSON returns the projection's JSON form.
func (f *Fischer) JSON() FischerJSON {
	num := func(x int) int { return x + 1 } // -1, an implicit hydrogen, becomes 0
	out := FischerJSON{Top: num(f.Top), Bottom: num(f.Bottom), Rows: []FischerRowJSON{}}
	for _, r := range f.Rows {
		out.Rows = append(out.Rows, FischerRowJSON{Centre: num(r.Centre), Left: num(r.Left), Right: num(r.Right)})
	}
	if f.Family != stereo.FamilyNone {
		s := f.Family.String()
		out.Family = &s
	}
	return out
}

// condensed writes the group that starts at atom x (seen from atom from)
// as a condensed formula: "CHO", "COOH", "CH2OH", "NH2"; groups with a
// ring or more than eight heavy atoms as their molecular formula.
func condensed(m *notation.Molecule, x, from int) string {
	if x < 0 {
		return "H"
	}
	group := map[int]bool{x: true}
	q := []int{x}
	cyclic := false
	for k := 0; k < len(q); k++ {
		for _, y := range neighbours(m, q[k]) {
			if y == from && q[k] == x {
				continue
			}
			if y == from {
				cyclic = true
				continue
			}
			if !group[y] {
				group[y] = true
				q = append(q, y)
			}
		}
	}
	if len(q) > 8 || cyclic || len(q) > 1 && hasRing(m, group) {
		f := notation.FormulaOf(m, func(a int) bool { return group[a] })
		return f.String()
	}
	var write func(a, p int) string
	write = func(a, p int) string {
		at := &m.Atoms[a]
		s := symbolOf(at)
		if h := at.HydrogenCount(); h > 0 {
			s += "H"
			if h > 1 {
				s += itoa(h)
			}
		}
		s += chargeText(at.Charge)
		var kids []int
		for _, y := range neighbours(m, a) {
			if y != p {
				kids = append(kids, y)
			}
		}
		// a double-bonded terminal atom (=O) first, then the rest
		slices.SortStableFunc(kids, func(u, v int) int {
			du := len(m.Atoms[u].Bonds) == 1 && kekule(&m.Bonds[m.BondBetween(a, u)]) == 2
			dv := len(m.Atoms[v].Bonds) == 1 && kekule(&m.Bonds[m.BondBetween(a, v)]) == 2
			switch {
			case du && !dv:
				return -1
			case dv && !du:
				return 1
			}
			return len(m.Atoms[u].Bonds) - len(m.Atoms[v].Bonds)
		})
		for i, y := range kids {
			part := write(y, a)
			// a branch before the last is bracketed, unless it is a bare
			// terminal atom (=O, Cl)
			bare := len(m.Atoms[y].Bonds) == 1 && m.Atoms[y].HydrogenCount() == 0
			if i < len(kids)-1 && !bare {
				part = "(" + part + ")"
			}
			s += part
		}
		return s
	}
	return write(x, from)
}

func hasRing(m *notation.Molecule, group map[int]bool) bool {
	edges := 0
	for a := range group {
		for _, y := range neighbours(m, a) {
			if group[y] {
				edges++
			}
		}
	}
	return edges/2 >= len(group)
}

// Drawing returns the projection as a drawing: the chain as a vertical
// line crossed by a horizontal one at each stereocentre, groups written
// as condensed formulas.
func (f *Fischer) Drawing(opt Options) *Drawing {
	m := f.m
	d := &Drawing{Title: opt.Title, Notation: m.Text, Numbers: opt.Numbers}
	add := func(n int, label string, p Point) int {
		d.Atoms = append(d.Atoms, Atom{N: n, Symbol: label, Label: label, Condensed: true, P: p, Element: notation.ElemC})
		return len(d.Atoms) - 1
	}
	num := func(x int) int { return x + 1 }
	k := len(f.Rows)
	prev := add(num(f.Top), condensed(m, f.Top, f.Rows[0].Centre), Point{0, 1})
	descOf := map[int]string{}
	for i := range f.an.Units {
		u := &f.an.Units[i]
		if u.Specified && u.Kind == stereo.KindTetrahedral && u.Descriptor.Labelled() {
			descOf[u.Centre] = u.Descriptor.String()
			if l := u.GroupLabel(); l != "" {
				descOf[u.Centre] = l
			}
		}
	}
	for i, r := range f.Rows {
		y := -float64(i) * 1.3
		c := len(d.Atoms)
		d.Atoms = append(d.Atoms, Atom{N: num(r.Centre), Symbol: "C", Element: notation.ElemC, P: Point{0, y}})
		d.Bonds = append(d.Bonds, Bond{A: prev, B: c, Order: 1, Narrow: -1})
		l := add(num(r.Left), condensed(m, r.Left, r.Centre), Point{-1.3, y})
		rt := add(num(r.Right), condensed(m, r.Right, r.Centre), Point{1.3, y})
		d.Bonds = append(d.Bonds, Bond{A: l, B: c, Order: 1, Narrow: -1}, Bond{A: c, B: rt, Order: 1, Narrow: -1})
		if s, ok := descOf[r.Centre]; ok {
			d.Descriptors = append(d.Descriptors, Descriptor{Text: s, P: Point{0.5, y + 0.4}, Unit: stereo.KindTetrahedral})
		}
		prev = c
	}
	bottom := add(num(f.Bottom), condensed(m, f.Bottom, f.Rows[k-1].Centre), Point{0, -float64(k-1)*1.3 - 1})
	d.Bonds = append(d.Bonds, Bond{A: prev, B: bottom, Order: 1, Narrow: -1})
	if f.Family != stereo.FamilyNone && !f.Meso {
		d.Descriptors = append(d.Descriptors, Descriptor{Text: f.Family.String(), P: Point{2.4, -float64(k-1) * 1.3}})
	}
	d.Notes = append(d.Notes, Note{Text: f.Caption()})
	return d
}

// MolfileDrawing returns a drawing of the whole molecule for a molfile
// that carries the projection: the chain and its four-way crosses at the
// Fischer positions, horizontal bonds wedged towards the viewer, the
// bonds to the top and bottom groups hashed away from it, the rest laid
// out around them.
func (f *Fischer) MolfileDrawing(opt Options) *Drawing {
	l := newLayout(f.m, f.an, time.Now().Add(200*time.Millisecond))
	l.pins = map[int]Point{}
	l.pinned = map[int]bool{}
	l.pinStyle = map[int]bondStyle{}
	k := len(f.Rows)
	l.pins[f.Top] = Point{0, 1}
	l.pins[f.Bottom] = Point{0, -float64(k-1) - 1}
	for i, r := range f.Rows {
		y := -float64(i)
		l.pins[r.Centre] = Point{0, y}
		l.pinned[r.Centre] = true
		for _, side := range []struct {
			atom int
			x    float64
		}{{r.Left, -1}, {r.Right, 1}} {
			if side.atom >= 0 {
				l.pins[side.atom] = Point{side.x, y}
				if bi := f.m.BondBetween(r.Centre, side.atom); bi >= 0 {
					l.pinStyle[bi] = bondStyle{style: StyleWedge, narrow: r.Centre}
				}
			} else {
				l.pinH = append(l.pinH, addedH{centre: r.Centre, p: Point{side.x, y}})
			}
		}
	}
	for _, e := range []struct{ end, c int }{{f.Top, f.Rows[0].Centre}, {f.Bottom, f.Rows[k-1].Centre}} {
		if bi := f.m.BondBetween(e.c, e.end); bi >= 0 {
			l.pinStyle[bi] = bondStyle{style: StyleHash, narrow: e.c}
		}
	}
	l.run()
	d := l.drawing(opt)
	return d
}

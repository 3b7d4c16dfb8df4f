package depict

import (
	"math"
	"slices"
	"strings"

	"stereoline/notation"
	"stereoline/stereo"
)

// This file implements the drawing's text: atom labels with their
// hydrogens on the free side, the side of each double bond's second
// line, and the CIP descriptors placed where nothing else is.

// drawing turns the layout into a Drawing.
func (l *layout) drawing(opt Options) *Drawing {
	m := l.m
	d := &Drawing{Title: opt.Title, Notation: m.Text, Numbers: opt.Numbers,
		Arrows: l.arrows, Pluses: l.pluses, Notes: l.notes}
	for i := range m.Atoms {
		a := &m.Atoms[i]
		d.Atoms = append(d.Atoms, Atom{N: i + 1, Element: a.Number, Symbol: symbolOf(a), P: l.pos[i],
			Hydrogens: a.HydrogenCount(), Charge: a.Charge, Isotope: a.Isotope, Role: a.Role})
	}
	for k, h := range l.hydrogens {
		d.Atoms = append(d.Atoms, Atom{N: l.n + k + 1, Added: true, Element: notation.ElemH, Symbol: "H",
			P: h.p, Role: m.Atoms[h.centre].Role})
	}
	orders := l.canonicalKekule()
	for bi := range m.Bonds {
		b := &m.Bonds[bi]
		if b.Begin < 0 || b.End < 0 || b.Begin >= l.n || b.End >= l.n {
			continue
		}
		db := Bond{A: b.Begin, B: b.End, Order: orders[bi], Narrow: -1, Ring: l.ringBond[bi]}
		switch {
		case b.Order == notation.OrderAromatic:
			db.Style = StyleAromatic
		case db.Order == 2:
			db.Style = StyleDouble
		case db.Order >= 3:
			db.Style = StyleTriple
		}
		if st, ok := l.style[bi]; ok {
			db.Style, db.Narrow = st.style, st.narrow
			if db.Narrow == db.B {
				db.A, db.B = db.B, db.A
			}
		}
		d.Bonds = append(d.Bonds, db)
	}
	for k, h := range l.hydrogens {
		st := l.hStyle[k]
		db := Bond{A: h.centre, B: l.n + k, Order: 1, Style: st.style, Narrow: -1}
		if st.style != StyleSingle {
			db.Narrow = h.centre
		}
		d.Bonds = append(d.Bonds, db)
	}
	nb := make([][]int, len(d.Atoms))
	for _, b := range d.Bonds {
		nb[b.A] = append(nb[b.A], b.B)
		nb[b.B] = append(nb[b.B], b.A)
	}
	for i := range d.Atoms {
		labelAtom(d, i, nb[i])
	}
	for i := range d.Bonds {
		l.doubleSide(d, &d.Bonds[i], nb)
	}
	l.placeDescriptors(d)
	return d
}

// symbolOf is the element symbol as drawn: capitalised, '*' for a
// wildcard.
func symbolOf(a *notation.Atom) string {
	if s := notation.ElementSymbol(a.Number); s != "" {
		return s
	}
	return a.Symbol
}

// labelAtom sets the label of atom i: heteroatoms, charged atoms,
// isotopes and lone carbons are written out.
func labelAtom(d *Drawing, i int, nb []int) {
	a := &d.Atoms[i]
	show := a.Element != notation.ElemC || a.Charge != 0 || a.Isotope != 0 || len(nb) == 0
	if !show {
		return
	}
	var sb strings.Builder
	if a.Isotope != 0 {
		sb.WriteString(itoa(a.Isotope))
	}
	sb.WriteString(a.Symbol)
	if a.Hydrogens > 0 {
		sb.WriteString("H")
		if a.Hydrogens > 1 {
			sb.WriteString(itoa(a.Hydrogens))
		}
	}
	sb.WriteString(chargeText(a.Charge))
	a.Label = sb.String()
	// hydrogens go to the widest free side
	var dirs []float64
	for _, y := range nb {
		dirs = append(dirs, d.Atoms[y].P.sub(a.P).angle())
	}
	if len(dirs) == 0 {
		a.HSide = HRight
		return
	}
	if len(dirs) == 1 {
		// a terminal atom writes its hydrogens across, away from its bond
		a.HSide = HRight
		if math.Cos(dirs[0]) > 0.3 {
			a.HSide = HLeft
		}
		return
	}
	start, w := largestGap(dirs)
	t := start + w/2
	c, s := math.Cos(t), math.Sin(t)
	switch {
	case c > 0.35:
		a.HSide = HRight
	case c < -0.35:
		a.HSide = HLeft
	case s > 0:
		a.HSide = HAbove
	default:
		a.HSide = HBelow
	}
}

// chargeText writes a charge as superscript text: "+", "2+", "−".
func chargeText(q int) string {
	switch {
	case q == 1:
		return "+"
	case q == -1:
		return "−"
	case q > 1:
		return itoa(q) + "+"
	case q < -1:
		return itoa(-q) + "−"
	}
	return ""
}

// doubleSide puts a ring double bond's second line inside its ring, a
// chain double bond's on the side of its substituents, a terminal one
// centred.
func (l *layout) doubleSide(d *Drawing, b *Bond, nb [][]int) {
	if b.Order != 2 || b.Style == StyleWavy {
		return
	}
	pa, pb := d.Atoms[b.A].P, d.Atoms[b.B].P
	if b.Ring && b.A < l.n && b.B < l.n {
		// inside the smallest ring through the bond, of equal rings the
		// canonically first
		var in *notation.Ring
		for k := range l.rings.SSSR {
			r := &l.rings.SSSR[k]
			if !slices.Contains(r.Atoms, b.A) || !slices.Contains(r.Atoms, b.B) {
				continue
			}
			if in == nil || r.Size() < in.Size() || r.Size() == in.Size() && l.ringOrder(*r, *in) < 0 {
				in = r
			}
		}
		if in != nil {
			var c Point
			for _, x := range in.Atoms {
				c = c.add(l.pos[x])
			}
			c = c.scale(1 / float64(len(in.Atoms)))
			b.Side = side(c, pa, pb)
			return
		}
	}
	if len(nb[b.A]) == 1 || len(nb[b.B]) == 1 {
		return
	}
	sum := 0
	for _, x := range []int{b.A, b.B} {
		for _, y := range nb[x] {
			if y != b.A && y != b.B {
				sum += side(d.Atoms[y].P, pa, pb)
			}
		}
	}
	switch {
	case sum > 0:
		b.Side = 1
	case sum < 0:
		b.Side = -1
	}
}

// placeDescriptors puts each unit's CIP label beside it, in the free
// direction farthest from atoms, bonds and other labels.
func (l *layout) placeDescriptors(d *Drawing) {
	if l.an == nil {
		return
	}
	var taken []Point
	for _, a := range d.Atoms {
		taken = append(taken, a.P)
		if a.Label != "" {
			// a label covers more than its atom's point: its hydrogens
			// too, on their side
			switch a.HSide {
			case HLeft:
				taken = append(taken, a.P.add(Point{-0.35, 0}))
			case HRight:
				taken = append(taken, a.P.add(Point{0.35, 0}))
			case HAbove:
				taken = append(taken, a.P.add(Point{0, 0.4}))
			case HBelow:
				taken = append(taken, a.P.add(Point{0, -0.4}))
			}
		}
	}
	for _, b := range d.Bonds {
		taken = append(taken, d.Atoms[b.A].P.add(d.Atoms[b.B].P).scale(0.5))
	}
	// in canonical order, so each label finds the same room whatever
	// the order of the text
	for _, u := range l.canonicalUnits() {
		if !u.Specified || !u.Descriptor.Labelled() {
			continue
		}
		var at Point
		dist := 0.55
		switch {
		case u.Kind == stereo.KindDoubleBond && len(u.Atoms) == 2:
			at = l.pos[u.Atoms[0]].add(l.pos[u.Atoms[1]]).scale(0.5)
			dist = 0.5
		case u.Centre >= 0 && u.Centre < l.n:
			at = l.pos[u.Centre]
			if d.Atoms[u.Centre].Label != "" {
				dist = 0.8
			}
		case len(u.Atoms) > 0:
			at = l.pos[u.Atoms[0]]
		default:
			continue
		}
		best, bestScore := at, -1.0
		for k := 0; k < 16; k++ {
			p := at.add(polar(dist, math.Pi/2+2*math.Pi*float64(k)/16))
			score := math.Inf(1)
			for _, q := range taken {
				score = min(score, p.dist(q))
			}
			if score > bestScore+1e-9 {
				best, bestScore = p, score
			}
		}
		taken = append(taken, best)
		text := u.Descriptor.String()
		if l := u.GroupLabel(); l != "" {
			text = l // R* or RS in an or or and stereo group
		}
		d.Descriptors = append(d.Descriptors, Descriptor{Text: text, P: best, Unit: u.Kind})
	}
}

// canonicalUnits returns the analysis's units in canonical order: by the
// first rank among their atoms, then by kind, then by the other atoms.
func (l *layout) canonicalUnits() []*stereo.Unit {
	units := make([]*stereo.Unit, 0, len(l.an.Units))
	for i := range l.an.Units {
		units = append(units, &l.an.Units[i])
	}
	key := func(u *stereo.Unit) []int {
		var k []int
		for _, a := range u.Atoms {
			if a >= 0 && a < l.n {
				k = append(k, l.rank[a])
			}
		}
		slices.Sort(k)
		return k
	}
	slices.SortStableFunc(units, func(a, b *stereo.Unit) int {
		ka, kb := key(a), key(b)
		if len(ka) > 0 && len(kb) > 0 && ka[0] != kb[0] {
			return ka[0] - kb[0]
		}
		if a.Kind != b.Kind {
			return int(a.Kind) - int(b.Kind)
		}
		return slices.Compare(ka, kb)
	})
	return units
}

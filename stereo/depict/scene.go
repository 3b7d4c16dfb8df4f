package depict

import (
	"math"
	"strings"
)

// This file implements the scene: a drawing turned into pixels-space
// primitives (lines, filled polygons, polylines, circles, text runs) that
// the SVG writer and the PNG rasteriser both paint, so the two outputs
// never differ in geometry.

type colour uint8

// Colour roles; the renderers map them to light and dark values.
const (
	colFg colour = iota
	colBg
	colDesc
	colErr
	colWarn
	colMuted
	colErrFill
	colWarnFill
	colChangeFill
)

type primKind uint8

const (
	pLine primKind = iota
	pPoly
	pPath
	pCircle
	pText
)

// run is a piece of text: shift 0 normal, -1 subscript, +1 superscript.
type run struct {
	s     string
	shift int
}

type prim struct {
	kind   primKind
	pts    []Point // pixels, y down
	w      float64
	col    colour
	r      float64
	runs   []run
	size   float64
	anchor int // -1 start, 0 middle, 1 end
	italic bool
	bold   bool
}

type scene struct {
	w, h  float64
	prims []prim
	title string
	desc  string
}

const (
	bondPx    = 30.0
	atomFont  = 13.0
	descFont  = 11.0
	noteFont  = 10.0
	titleFont = 13.0
	margin    = 14.0
)

// textWidth estimates the advance of s at size px (a sans-serif face's
// average widths; the renderers anchor text with their own metrics).
func textWidth(s string, size float64) float64 {
	w := 0.0
	for _, r := range s {
		switch {
		case r >= 'A' && r <= 'Z':
			w += 0.66
		case r == 'i' || r == 'l' || r == 'j' || r == '.' || r == ',' || r == ':' || r == ';' || r == '\'' || r == '|' || r == '!':
			w += 0.28
		case r == ' ':
			w += 0.28
		case r == 'm' || r == 'w' || r == 'M' || r == 'W':
			w += 0.85
		default:
			w += 0.55
		}
	}
	return w * size
}

func runsWidth(rs []run, size float64) float64 {
	w := 0.0
	for _, r := range rs {
		s := size
		if r.shift != 0 {
			s = size * 0.72
		}
		w += textWidth(r.s, s)
	}
	return w
}

// wrap splits text into lines no wider than width px.
func wrap(text string, size, width float64) []string {
	var lines []string
	cur := ""
	for _, w := range strings.Fields(text) {
		try := w
		if cur != "" {
			try = cur + " " + w
		}
		if cur != "" && textWidth(try, size) > width {
			lines = append(lines, cur)
			cur = w
			continue
		}
		cur = try
	}
	if cur != "" {
		lines = append(lines, cur)
	}
	return lines
}

// buildScene lays the drawing out in pixels.
func buildScene(d *Drawing) *scene {
	sc := &scene{title: d.Title, desc: d.Notation}
	// extent of the structure in bond units
	lo := Point{math.Inf(1), math.Inf(1)}
	hi := Point{math.Inf(-1), math.Inf(-1)}
	grow := func(p Point, r float64) {
		lo = Point{min(lo.X, p.X-r), min(lo.Y, p.Y-r)}
		hi = Point{max(hi.X, p.X+r), max(hi.Y, p.Y+r)}
	}
	for _, a := range d.Atoms {
		r := 0.1
		if a.Label != "" {
			r = max(0.35, textWidth(a.Label, atomFont)/bondPx*0.75)
		}
		grow(a.P, r)
	}
	for _, x := range d.Descriptors {
		grow(x.P, 0.3)
	}
	for _, ar := range d.Arrows {
		grow(ar.From, 0.2)
		grow(ar.To, 0.2)
	}
	if len(d.Atoms) == 0 {
		lo, hi = Point{}, Point{1, 1}
	}
	structW := (hi.X - lo.X) * bondPx
	structH := (hi.Y - lo.Y) * bondPx
	width := max(structW+2*margin, 280)
	top := margin
	if d.Title != "" {
		top += titleFont + 8
	}
	ox := (width-structW)/2 - lo.X*bondPx
	oy := top + hi.Y*bondPx
	px := func(p Point) Point { return Point{p.X*bondPx + ox, -p.Y*bondPx + oy} }

	// notes and the caution under the structure
	textW := width - 2*margin
	var foot []prim
	y := top + structH + 14
	for i, nt := range d.Notes {
		if i == 6 {
			foot = append(foot, textPrim(Point{margin, y}, []run{{s: "…"}}, noteFont, -1, colMuted))
			y += noteFont + 3
			break
		}
		col := colMuted
		switch nt.Mark {
		case MarkError:
			col = colErr
		case MarkWarning:
			col = colWarn
		}
		for _, line := range wrap(nt.Text, noteFont, textW) {
			foot = append(foot, textPrim(Point{margin, y + noteFont}, []run{{s: line}}, noteFont, -1, col))
			y += noteFont + 3
		}
	}
	y += 4
	for _, line := range wrap(Caution, noteFont*0.9, textW) {
		foot = append(foot, textPrim(Point{margin, y + noteFont}, []run{{s: line}}, noteFont*0.9, -1, colMuted))
		y += noteFont + 2
	}
	sc.w, sc.h = math.Ceil(width), math.Ceil(y+margin/2)

	if d.Title != "" {
		t := textPrim(Point{margin, margin + titleFont - 2}, []run{{s: d.Title}}, titleFont, -1, colFg)
		t.bold = true
		sc.prims = append(sc.prims, t)
	}
	// highlights under everything
	for _, b := range d.Bonds {
		if b.Mark != MarkNone {
			sc.prims = append(sc.prims, prim{kind: pLine, pts: []Point{px(d.Atoms[b.A].P), px(d.Atoms[b.B].P)}, w: 9, col: fillOf(b.Mark)})
		}
	}
	for _, a := range d.Atoms {
		if a.Mark != MarkNone {
			sc.prims = append(sc.prims, prim{kind: pCircle, pts: []Point{px(a.P)}, r: 10, col: fillOf(a.Mark)})
		}
	}
	for _, b := range d.Bonds {
		sc.bond(d, b, px)
	}
	for i := range d.Atoms {
		sc.atomLabel(d, i, px)
	}
	for _, x := range d.Descriptors {
		t := textPrim(px(x.P).add(Point{0, descFont * 0.36}), []run{{s: x.Text}}, descFont, 0, colDesc)
		t.italic, t.bold = true, true
		sc.prims = append(sc.prims, t)
	}
	for _, ar := range d.Arrows {
		a, b := px(ar.From), px(ar.To)
		sc.prims = append(sc.prims, prim{kind: pLine, pts: []Point{a, b.sub(Point{6, 0})}, w: 1.5, col: colFg})
		sc.prims = append(sc.prims, prim{kind: pPoly, pts: []Point{b, b.add(Point{-10, -4.5}), b.add(Point{-10, 4.5})}, col: colFg})
	}
	for _, p := range d.Pluses {
		sc.prims = append(sc.prims, textPrim(px(p.P).add(Point{0, 6}), []run{{s: "+"}}, 18, 0, colFg))
	}
	sc.prims = append(sc.prims, foot...)
	return sc
}

func fillOf(m Mark) colour {
	switch m {
	case MarkError:
		return colErrFill
	case MarkChange:
		return colChangeFill
	}
	return colWarnFill
}

func textPrim(p Point, rs []run, size float64, anchor int, col colour) prim {
	return prim{kind: pText, pts: []Point{p}, runs: rs, size: size, anchor: anchor, col: col}
}

// labelGap is how far a bond stops short of a labelled atom, in pixels.
func labelGap(a *Atom) float64 {
	if a.Label == "" {
		return 0
	}
	return 7.5
}

// bond adds the primitives of one bond.
func (sc *scene) bond(d *Drawing, b Bond, px func(Point) Point) {
	A, B := &d.Atoms[b.A], &d.Atoms[b.B]
	pa, pb := px(A.P), px(B.P)
	u := pb.sub(pa).unit()
	length := pb.dist(pa)
	ga, gb := labelGap(A), labelGap(B)
	if ga+gb > length-2 {
		ga, gb = 0, 0
	}
	a := pa.add(u.scale(ga))
	e := pb.sub(u.scale(gb))
	nrm := u.perp() // left of A→B in pixel space (y down)
	line := func(p, q Point, w float64) {
		sc.prims = append(sc.prims, prim{kind: pLine, pts: []Point{p, q}, w: w, col: colFg})
	}
	const lw = 1.4
	switch b.Style {
	case StyleWedge:
		half := 3.2
		sc.prims = append(sc.prims, prim{kind: pPoly, pts: []Point{a, e.add(nrm.scale(half)), e.sub(nrm.scale(half))}, col: colFg})
		return
	case StyleHash:
		const k = 7
		for i := 0; i <= k; i++ {
			t := 0.08 + 0.92*float64(i)/k
			c := a.add(e.sub(a).scale(t))
			h := 0.4 + 2.8*t
			line(c.add(nrm.scale(h)), c.sub(nrm.scale(h)), 1.1)
		}
		return
	case StyleWavy:
		if b.Order == 2 {
			off := 2.4
			line(a.add(nrm.scale(off)), e.sub(nrm.scale(off)), lw)
			line(a.sub(nrm.scale(off)), e.add(nrm.scale(off)), lw)
			return
		}
		var pts []Point
		const steps = 28
		waves := max(2.0, math.Round(e.dist(a)/7))
		for i := 0; i <= steps; i++ {
			t := float64(i) / steps
			c := a.add(e.sub(a).scale(t))
			pts = append(pts, c.add(nrm.scale(2.6*math.Sin(t*waves*2*math.Pi))))
		}
		sc.prims = append(sc.prims, prim{kind: pPath, pts: pts, w: 1.2, col: colFg})
		return
	}
	switch b.Order {
	case 2:
		if b.Side == 0 {
			off := 2.3
			line(a.add(nrm.scale(off)), e.add(nrm.scale(off)), lw)
			line(a.sub(nrm.scale(off)), e.sub(nrm.scale(off)), lw)
			return
		}
		line(a, e, lw)
		// pixel y runs down, so the drawing's left is the pixel right
		off := nrm.scale(-4.6 * float64(b.Side))
		sa, se := a, e
		if ga == 0 {
			sa = a.add(u.scale(0.14 * length))
		}
		if gb == 0 {
			se = e.sub(u.scale(0.14 * length))
		}
		line(sa.add(off), se.add(off), lw)
	case 3, 4:
		line(a, e, lw)
		line(a.add(nrm.scale(3.4)), e.add(nrm.scale(3.4)), lw)
		line(a.sub(nrm.scale(3.4)), e.sub(nrm.scale(3.4)), lw)
	default:
		line(a, e, lw)
	}
}

// atomLabel adds an atom's label, its number on request.
func (sc *scene) atomLabel(d *Drawing, i int, px func(Point) Point) {
	a := &d.Atoms[i]
	p := px(a.P)
	base := p.add(Point{0, atomFont * 0.36})
	col := colFg
	switch a.Mark {
	case MarkError:
		col = colErr
	case MarkWarning:
		col = colWarn
	}
	if a.Label != "" && a.Condensed {
		var rs []run
		for _, r := range a.Label {
			shift := 0
			if r >= '0' && r <= '9' {
				shift = -1
			}
			if n := len(rs); n > 0 && rs[n-1].shift == shift {
				rs[n-1].s += string(r)
			} else {
				rs = append(rs, run{s: string(r), shift: shift})
			}
		}
		anchor := 0
		q := base
		// side groups read outwards from the cross
		for _, b := range d.Bonds {
			o := -1
			if b.A == i {
				o = b.B
			} else if b.B == i {
				o = b.A
			}
			if o < 0 {
				continue
			}
			switch dx := a.P.X - d.Atoms[o].P.X; {
			case dx > 0.5:
				anchor, q = -1, base.sub(Point{textWidth(a.Label[:1], atomFont) / 2, 0})
			case dx < -0.5:
				anchor, q = 1, base.add(Point{textWidth(a.Label[len(a.Label)-1:], atomFont) / 2, 0})
			}
		}
		sc.prims = append(sc.prims, textPrim(q, rs, atomFont, anchor, col))
	} else if a.Label != "" {
		sym := a.Symbol
		symW := textWidth(sym, atomFont)
		var h []run
		if a.Hydrogens > 0 {
			h = append(h, run{s: "H"})
			if a.Hydrogens > 1 {
				h = append(h, run{s: itoa(a.Hydrogens), shift: -1})
			}
		}
		var q []run
		if c := chargeText(a.Charge); c != "" {
			q = append(q, run{s: c, shift: 1})
		}
		switch {
		case a.HSide == HLeft && len(h) > 0:
			rs := append(append(h, run{s: sym}), q...)
			sc.prims = append(sc.prims, textPrim(base.add(Point{symW/2 + runsWidth(q, atomFont), 0}), rs, atomFont, 1, col))
		case (a.HSide == HAbove || a.HSide == HBelow) && len(h) > 0:
			sc.prims = append(sc.prims, textPrim(base.sub(Point{symW / 2, 0}), append([]run{{s: sym}}, q...), atomFont, -1, col))
			dy := -atomFont
			if a.HSide == HBelow {
				dy = atomFont
			}
			sc.prims = append(sc.prims, textPrim(base.add(Point{0, dy}), h, atomFont, 0, col))
		default:
			rs := append(append([]run{{s: sym}}, h...), q...)
			sc.prims = append(sc.prims, textPrim(base.sub(Point{symW / 2, 0}), rs, atomFont, -1, col))
		}
		if a.Isotope != 0 {
			sc.prims = append(sc.prims, textPrim(base.sub(Point{symW/2 + 0.5, 5}), []run{{s: itoa(a.Isotope)}}, atomFont*0.7, 1, col))
		}
	}
	if d.Numbers && !a.Added {
		q := px(numberPlace(d, i)).add(Point{0, 3})
		sc.prims = append(sc.prims, textPrim(q, []run{{s: itoa(a.N)}}, 8, 0, colMuted))
	}
}

// numberPlace puts atom i's number where it is farthest from other
// atoms, labels, bond middles and descriptors.
func numberPlace(d *Drawing, i int) Point {
	a := &d.Atoms[i]
	r := 0.32
	if a.Label != "" {
		r = 0.55
	}
	best, bestScore := a.P.add(Point{r, r}), -1.0
	for k := 0; k < 16; k++ {
		p := a.P.add(polar(r, math.Pi/4+2*math.Pi*float64(k)/16))
		score := math.Inf(1)
		for j := range d.Atoms {
			b := &d.Atoms[j]
			dist := p.dist(b.P)
			if b.Label != "" {
				// a label is wide: keep off its line of text
				dx := math.Max(0, math.Abs(p.X-b.P.X)-textWidth(b.Label, atomFont)/bondPx*0.5)
				dist = math.Hypot(dx, p.Y-b.P.Y) - 0.1
			}
			if j == i && b.Label == "" {
				continue
			}
			score = min(score, dist)
		}
		for _, b := range d.Bonds {
			score = min(score, p.dist(d.Atoms[b.A].P.add(d.Atoms[b.B].P).scale(0.5)))
		}
		for _, x := range d.Descriptors {
			score = min(score, p.dist(x.P))
		}
		if score > bestScore+1e-9 {
			best, bestScore = p, score
		}
	}
	return best
}

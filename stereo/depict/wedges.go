package depict

import (
	"math"
	"slices"

	"stereoline/notation"
	"stereoline/stereo"
)

// This file implements the stereo bonds: a wedge or hash at each
// specified tetrahedral centre and allene so the drawing reads with the
// configuration written, wavy bonds at units left open.
//
// A drawn centre is read as in three dimensions: every plain bond lies in
// the paper, a wedge rises towards the viewer and a hash falls away; an
// undrawn hydrogen or lone pair points away from the other three. The
// sign of the volume of the four ligands, taken in the notation's
// neighbour order, must be negative for '@' (anticlockwise seen from the
// first neighbour, OpenSMILES 3.7) and positive for '@@', with x right, y
// up and z towards the viewer.

const lift = 0.8 // height of a wedged neighbour, in bond lengths

// drawStereo chooses the stereo bonds of every unit.
func (l *layout) drawStereo() {
	if l.an == nil {
		return
	}
	units := l.an.Units
	centre := make([]bool, l.n)
	for i := range units {
		for _, a := range units[i].Atoms {
			if a >= 0 && a < l.n {
				centre[a] = true
			}
		}
	}
	// specified centres first, the most constrained first: those with
	// fewest bonds that could carry the wedge
	var tetra []int
	for i := range units {
		u := &units[i]
		if u.Specified && u.Kind == stereo.KindTetrahedral && u.Centre >= 0 && !l.pinned[u.Centre] {
			tetra = append(tetra, u.Centre)
		}
	}
	free := func(c int) int {
		k := 0
		for _, y := range l.nbr[c] {
			if bi := l.m.BondBetween(c, y); bi >= 0 && !l.ringBond[bi] && !centre[y] {
				k++
			}
		}
		return k
	}
	slices.SortStableFunc(tetra, func(a, b int) int {
		if fa, fb := free(a), free(b); fa != fb {
			return fa - fb
		}
		return l.rank[a] - l.rank[b]
	})
	for _, c := range tetra {
		l.wedgeCentre(c, centre)
	}
	ordered := l.canonicalUnits()
	for _, u := range ordered {
		if u.Specified && u.Kind == stereo.KindAllene && u.Centre >= 0 {
			l.wedgeAllene(u.Centre)
		}
	}
	for _, u := range ordered {
		if u.Specified {
			continue
		}
		switch u.Kind {
		case stereo.KindTetrahedral:
			if u.Centre >= 0 {
				l.wavyAt(u.Centre, -1, centre)
			} else if len(u.Atoms) == 1 {
				l.wavyAt(u.Atoms[0], -1, centre)
			}
		case stereo.KindAllene:
			if len(u.Atoms) == 2 {
				l.wavyAt(u.Atoms[0], -1, centre)
			}
		case stereo.KindDoubleBond:
			l.wavyDouble(u, centre)
		}
	}
}

// styled reports whether bond bi already carries a stereo style.
func (l *layout) styled(bi int) bool {
	_, ok := l.style[bi]
	return ok
}

// candidate is a bond from a centre that may carry its wedge.
type candidate struct {
	atom int // neighbour atom; n+k for added hydrogen k
	tier int
}

// wedgeCentre gives centre c a wedge or hash that reads as written.
func (l *layout) wedgeCentre(c int, centre []bool) {
	m := l.m
	order, ok := stereo.NeighbourOrder(m, c)
	if !ok {
		return
	}
	want := -1.0
	if m.Atoms[c].Chirality.Num == 2 {
		want = 1
	}
	implicit := slices.Contains(order, stereo.ImplicitNeighbour)
	var cands []candidate
	for _, y := range l.nbr[c] {
		bi := m.BondBetween(c, y)
		if bi < 0 || kekule(&m.Bonds[bi]) != 1 || l.styled(bi) {
			continue
		}
		tier := 1
		switch {
		case m.Atoms[y].Number == notation.ElemH:
			tier = 0
		case l.ringBond[bi] && centre[y]:
			tier = 4
		case l.ringBond[bi]:
			tier = 3
		case centre[y] || l.dbEnd[y]:
			tier = 2
		case len(l.nbr[y]) > 1:
			tier = 1
		default:
			tier = 0
		}
		cands = append(cands, candidate{atom: y, tier: tier})
	}
	slices.SortStableFunc(cands, func(a, b candidate) int { return a.tier - b.tier })
	// a hydrogen in the notation's undrawn slot is drawn when the bonds
	// left are ring bonds, or when the drawn bonds leave its place open
	needH := false
	if implicit && m.Atoms[c].HydrogenCount() == 1 {
		if len(cands) == 0 || cands[0].tier >= 3 || !l.spread(c) {
			needH = true
		}
	}
	if needH {
		l.addHydrogen(c)
		cands = append([]candidate{{atom: l.n + len(l.hydrogens) - 1}}, cands...)
	}
	for _, cd := range cands {
		vol := l.volume(c, order, cd.atom, lift)
		if math.Abs(vol) < 0.12 {
			continue
		}
		st := StyleWedge
		if (vol > 0) != (want > 0) {
			st = StyleHash
		}
		l.setStyle(c, cd.atom, st)
		return
	}
	l.notes = append(l.notes, Note{Text: "no bond could show the configuration of atom " + itoa(c+1)})
}

// spread reports whether the drawn bonds of a three-coordinate centre
// leave no gap of more than 170 degrees, so the undrawn ligand's place is
// clear.
func (l *layout) spread(c int) bool {
	var dirs []float64
	for _, y := range l.nbr[c] {
		dirs = append(dirs, l.pos[y].sub(l.pos[c]).angle())
	}
	_, w := largestGap(dirs)
	return w < 170*math.Pi/180
}

// addHydrogen draws centre c's hydrogen in the widest gap, short.
func (l *layout) addHydrogen(c int) {
	var dirs []float64
	for _, y := range l.nbr[c] {
		dirs = append(dirs, l.pos[y].sub(l.pos[c]).angle())
	}
	// the middle of the widest gap, or of another wide one when an atom
	// or an earlier hydrogen sits there
	start, w := largestGap(dirs)
	best, bestClear := start+w/2, -1.0
	for k := 0; k < 24; k++ {
		t := 2 * math.Pi * float64(k) / 24
		minGap := math.Pi
		for _, d := range dirs {
			minGap = min(minGap, angleDiff(t, d))
		}
		if minGap < 0.9 {
			continue
		}
		p := l.pos[c].add(polar(0.75, t))
		clear := math.Inf(1)
		for _, x := range l.comps[l.compOf[c]] {
			if x != c {
				clear = min(clear, p.dist(l.pos[x]))
			}
		}
		for _, h := range l.hydrogens {
			clear = min(clear, p.dist(h.p))
		}
		score := min(clear, 1.2) + 0.2*minGap
		if score > bestClear {
			best, bestClear = t, score
		}
	}
	l.hydrogens = append(l.hydrogens, addedH{centre: c, p: l.pos[c].add(polar(0.75, best))})
	l.hStyle = append(l.hStyle, bondStyle{style: StyleSingle, narrow: -1})
}

// at3 returns the drawn position of atom x (an added hydrogen for x ≥ n)
// relative to c, as a unit vector in the paper, lifted by z.
func (l *layout) at3(c, x int, z float64) [3]float64 {
	var p Point
	if x >= l.n {
		p = l.hydrogens[x-l.n].p
	} else {
		p = l.pos[x]
	}
	v := p.sub(l.pos[c]).unit()
	return [3]float64{v.X, v.Y, z}
}

// volume is the signed volume of centre c's ligands in the order the
// notation gives, with atom up lifted by z and the rest in the paper.
func (l *layout) volume(c int, order []int, up int, z float64) float64 {
	var pts [4][3]float64
	implicitAt := -1
	var sum [3]float64
	drawnH := -1
	for k := range l.hydrogens {
		if l.hydrogens[k].centre == c {
			drawnH = l.n + k
		}
	}
	for i, x := range order {
		if x == stereo.ImplicitNeighbour {
			if drawnH >= 0 {
				x = drawnH
			} else {
				implicitAt = i
				continue
			}
		}
		h := 0.0
		if x == up {
			h = z
		}
		pts[i] = l.at3(c, x, h)
		n := math.Sqrt(pts[i][0]*pts[i][0] + pts[i][1]*pts[i][1] + pts[i][2]*pts[i][2])
		for k := 0; k < 3; k++ {
			pts[i][k] /= n
			sum[k] += pts[i][k]
		}
	}
	if implicitAt >= 0 {
		// the undrawn ligand points away from the other three
		n := math.Sqrt(sum[0]*sum[0] + sum[1]*sum[1] + sum[2]*sum[2])
		if n < 1e-6 {
			return 0
		}
		for k := 0; k < 3; k++ {
			pts[implicitAt][k] = -sum[k] / n
		}
	}
	return orient(pts)
}

// setStyle records a stereo bond from c (the narrow end) to x.
func (l *layout) setStyle(c, x int, st Style) {
	if x >= l.n {
		l.hStyle[x-l.n] = bondStyle{style: st, narrow: c}
		return
	}
	if bi := l.m.BondBetween(c, x); bi >= 0 {
		l.style[bi] = bondStyle{style: st, narrow: c}
	}
}

// wedgeAllene gives allene centre a a wedge and hash at one end, so that
// end's substituents stand across the paper while the other end's lie in
// it. A hydrogen of the standing end is drawn, so both bonds show.
func (l *layout) wedgeAllene(a int) {
	w, ok := stereo.ReadAllene(l.m, a)
	if !ok {
		return
	}
	for _, e := range []int{1, 0} {
		end := w.Ends[e]
		var subs []int
		usable := true
		for _, y := range l.nbr[end] {
			if y == w.Inner[e] {
				continue
			}
			bi := l.m.BondBetween(end, y)
			if bi < 0 || kekule(&l.m.Bonds[bi]) != 1 || l.styled(bi) {
				usable = false
			}
			subs = append(subs, y)
		}
		if !usable || len(subs) == 0 {
			continue
		}
		axis := l.pos[end].sub(l.pos[w.Inner[e]]).unit()
		hAt := -1
		if len(subs) == 1 && l.m.Atoms[end].HydrogenCount() == 1 {
			p := l.pos[subs[0]].reflect(l.pos[end], l.pos[end].add(axis))
			l.hydrogens = append(l.hydrogens, addedH{centre: end, p: p})
			l.hStyle = append(l.hStyle, bondStyle{style: StyleSingle, narrow: -1})
			hAt = l.n + len(l.hydrogens) - 1
			subs = append(subs, hAt)
		}
		drawn := func(x int) Point {
			if x >= l.n {
				return l.hydrogens[x-l.n].p
			}
			return l.pos[x]
		}
		// positions in space: the standing end's substituents along the
		// axis and up (the first) or down; the other end's in the paper
		pos3 := func(x int) [3]float64 {
			if i := slices.Index(subs, x); i >= 0 {
				v := drawn(x).sub(l.pos[end])
				z := math.Abs(v.cross(axis))
				if i == 1 {
					z = -z
				}
				p := l.pos[end].sub(l.pos[a]).add(axis.scale(v.dot(axis)))
				return [3]float64{p.X, p.Y, z}
			}
			v := drawn(x).sub(l.pos[a])
			return [3]float64{v.X, v.Y, 0}
		}
		var pts [4][3]float64
		for i, x := range w.Ligands {
			if x == stereo.ImplicitNeighbour {
				t := w.Ends[w.LigandEnd[i]]
				if t == end && hAt >= 0 {
					x = hAt
				} else {
					// the other end's hydrogen: its drawn mate mirrored
					// across the axis in the paper
					mate := -1
					for j, y := range w.Ligands {
						if j != i && y != stereo.ImplicitNeighbour && w.LigandEnd[j] == w.LigandEnd[i] {
							mate = y
						}
					}
					if mate < 0 {
						return
					}
					r := l.pos[mate].reflect(l.pos[t], l.pos[a]).sub(l.pos[a])
					pts[i] = [3]float64{r.X, r.Y, 0}
					continue
				}
			}
			pts[i] = pos3(x)
		}
		v := orient(pts)
		if math.Abs(v) < 1e-6 {
			return
		}
		// with the first substituent up the volume is v; '@@' wants it
		// positive
		first, second := StyleWedge, StyleHash
		if (v > 0) != w.Clockwise {
			first, second = StyleHash, StyleWedge
		}
		l.setStyle(end, subs[0], first)
		if len(subs) > 1 {
			l.setStyle(end, subs[1], second)
		}
		return
	}
}

// wavyAt draws a wavy bond from atom c to one of its substituents,
// avoiding bonds already styled and, when it can, ring bonds, other
// units and double-bond ends. skip is a neighbour not to use.
func (l *layout) wavyAt(c, skip int, centre []bool) bool {
	best, bestTier := -1, 99
	for _, y := range l.nbr[c] {
		bi := l.m.BondBetween(c, y)
		if y == skip || bi < 0 || kekule(&l.m.Bonds[bi]) != 1 || l.styled(bi) {
			continue
		}
		tier := 0
		if l.ringBond[bi] {
			tier += 2
		}
		if centre[y] || l.dbEnd[y] {
			tier++
		}
		if tier < bestTier {
			best, bestTier = y, tier
		}
	}
	if best < 0 {
		return false
	}
	l.setStyle(c, best, StyleWavy)
	return true
}

// wavyDouble marks a double bond whose configuration is open: a wavy
// bond to a substituent of one end, or the double bond drawn crossed.
func (l *layout) wavyDouble(u *stereo.Unit, centre []bool) {
	if len(u.Atoms) != 2 {
		return
	}
	for e := 0; e < 2; e++ {
		t := u.Atoms[e]
		inner := -1
		for _, y := range l.nbr[t] {
			if bi := l.m.BondBetween(t, y); bi >= 0 && kekule(&l.m.Bonds[bi]) == 2 {
				inner = y
			}
		}
		if l.wavyAt(t, inner, centre) {
			return
		}
	}
	if u.Bond >= 0 && !l.styled(u.Bond) {
		b := &l.m.Bonds[u.Bond]
		l.style[u.Bond] = bondStyle{style: StyleWavy, narrow: b.Begin}
	}
}

func itoa(n int) string {
	if n == 0 {
		return "0"
	}
	neg := n < 0
	if neg {
		n = -n
	}
	var b [20]byte
	i := len(b)
	for n > 0 {
		i--
		b[i] = byte('0' + n%10)
		n /= 10
	}
	if neg {
		i--
		b[i] = '-'
	}
	return string(b[i:])
}

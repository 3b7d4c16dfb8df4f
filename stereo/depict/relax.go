package depict

import (
	"math"
	"time"
)

// This file implements the relaxation of a bridged system's drawing
// towards bonds of unit length: all atoms step together down the
// gradient of an energy (bonds pulled to length 1, atoms kept apart and
// off bonds they are not on, inner corners kept bent) and a step is kept
// only when the energy falls, no more bonds cross than before and every
// written double bond inside keeps the sides its references were drawn
// on; otherwise the step is halved. All atoms moving at once keeps a
// symmetric drawing symmetric, so equivalent perimeters give one
// picture.

const (
	angleDist  = 1.0  // atoms two bonds apart: an angle of at least 60 degrees
	apart      = 0.85 // the room kept between atoms three or more bonds apart
	bondGap    = 0.5  // the room kept between an atom and a bond it is not on
	bendHeight = 0.35 // an inner corner's height over its neighbours' middle: about 140 degrees
	bendWeight = 4
	relaxSteps = 400
)

type relaxer struct {
	deadline time.Time
	atoms    []int // molecule atoms, canonical order
	loc      map[int]int
	nbr      [][]int
	bonds    [][2]int
	pairs    []relaxPair
	fixed    [][5]int // local e0, e1, r0, r1 and the side product drawn
	bend     [][3]int // inner corners (atoms of two bonds) and their neighbours
	pos      []Point
	grad     []Point
}

// relaxPair is a pair of atoms with the distance the energy wants: a
// bond (exact) or a least distance.
type relaxPair struct {
	i, j   int
	target float64
	bond   bool
}

// relax moves the atoms of set (placed in pos) towards unit bonds. Atoms
// of inner with two bonds, no linear atoms, are kept bent so that each
// shows as a corner.
func (l *layout) relax(set []int, inner []int, pos []Point) {
	r := &relaxer{deadline: l.deadline, atoms: set, loc: make(map[int]int, len(set)),
		pos: make([]Point, len(set)), grad: make([]Point, len(set))}
	for i, a := range set {
		r.loc[a] = i
		r.pos[i] = pos[a]
	}
	r.nbr = make([][]int, len(set))
	for i, a := range set {
		for _, y := range l.nbr[a] {
			if j, ok := r.loc[y]; ok {
				r.nbr[i] = append(r.nbr[i], j)
				if i < j {
					r.bonds = append(r.bonds, [2]int{i, j})
				}
			}
		}
	}
	for i := range set {
		for j := i + 1; j < len(set); j++ {
			p := relaxPair{i: i, j: j, target: apart}
			switch {
			case contains(r.nbr[i], j):
				p.target, p.bond = 1, true
			case sharesNeighbour(r.nbr, i, j):
				p.target = angleDist
			}
			r.pairs = append(r.pairs, p)
		}
	}
	for _, w := range l.fixed {
		q := [5]int{}
		ok := true
		for k, a := range []int{w.Ends[0], w.Ends[1], w.Refs[0], w.Refs[1]} {
			j, in := r.loc[a]
			if !in {
				ok = false
				break
			}
			q[k] = j
		}
		if ok {
			q[4] = r.sides(q)
			r.fixed = append(r.fixed, q)
		}
	}
	for _, a := range inner {
		j, ok := r.loc[a]
		if ok && len(r.nbr[j]) == 2 && len(l.nbr[a]) == 2 && !l.linear[a] {
			r.bend = append(r.bend, [3]int{j, r.nbr[j][0], r.nbr[j][1]})
		}
	}
	r.run()
	for i, a := range set {
		pos[a] = r.pos[i]
	}
}

func contains(s []int, x int) bool {
	for _, y := range s {
		if y == x {
			return true
		}
	}
	return false
}

func sharesNeighbour(nbr [][]int, i, j int) bool {
	for _, k := range nbr[i] {
		if contains(nbr[j], k) {
			return true
		}
	}
	return false
}

// run steps down the gradient with a step that grows after a success
// and halves after a failure.
func (r *relaxer) run() {
	e := r.energy(true)
	cross := r.crossings()
	eta := 0.1
	next := make([]Point, len(r.pos))
	old := make([]Point, len(r.pos))
	for it := 0; it < relaxSteps && eta > 1e-3; it++ {
		if it%16 == 15 && time.Now().After(r.deadline) {
			break
		}
		copy(old, r.pos)
		moved := 0.0
		for i, g := range r.grad {
			d := g.scale(-eta)
			if n := d.norm(); n > 0.2 {
				d = d.scale(0.2 / n)
			}
			moved = max(moved, d.norm())
			next[i] = old[i].add(d)
		}
		if moved < 1e-3 {
			break
		}
		copy(r.pos, next)
		if e1 := r.energy(false); e1 < e-1e-9 && r.crossings() <= cross && r.sidesKept() {
			if e-e1 < 1e-5*e+1e-7 {
				break // no more to gain
			}
			e = r.energy(true)
			eta = min(eta*1.3, 1)
			continue
		}
		copy(r.pos, old)
		eta /= 2
	}
	r.energy(true) // leaves grad consistent; positions are r.pos
}

// sides is the product of the sides the two references of a double bond
// lie on, relative to the bond.
func (r *relaxer) sides(q [5]int) int {
	a, b := r.pos[q[0]], r.pos[q[1]]
	return side(r.pos[q[2]], a, b) * side(r.pos[q[3]], a, b)
}

func (r *relaxer) sidesKept() bool {
	for _, q := range r.fixed {
		if r.sides(q) != q[4] {
			return false
		}
	}
	return true
}

// crossings counts pairs of bonds that cross.
func (r *relaxer) crossings() int {
	k := 0
	for x, p := range r.bonds {
		for _, q := range r.bonds[x+1:] {
			if p[0] == q[0] || p[0] == q[1] || p[1] == q[0] || p[1] == q[1] {
				continue
			}
			if segmentsCross(r.pos[p[0]], r.pos[p[1]], r.pos[q[0]], r.pos[q[1]]) {
				k++
			}
		}
	}
	return k
}

// energy returns the energy of the drawing and, with grad set, leaves
// its gradient in r.grad.
func (r *relaxer) energy(grad bool) float64 {
	if grad {
		clear(r.grad)
	}
	e := 0.0
	for _, p := range r.pairs {
		v := r.pos[p.i].sub(r.pos[p.j])
		d2 := v.X*v.X + v.Y*v.Y
		if !p.bond && d2 >= p.target*p.target {
			continue
		}
		d := math.Sqrt(d2)
		if d < 1e-9 {
			v, d = Point{1e-3, 0}, 1e-3
		}
		e += (d - p.target) * (d - p.target)
		if grad {
			g := v.scale(2 * (d - p.target) / d)
			r.grad[p.i] = r.grad[p.i].add(g)
			r.grad[p.j] = r.grad[p.j].sub(g)
		}
	}
	// atoms off the bonds they are not on
	for _, b := range r.bonds {
		pa, pb := r.pos[b[0]], r.pos[b[1]]
		ab := pb.sub(pa)
		n := max(ab.dot(ab), 1e-12)
		lo := Point{min(pa.X, pb.X) - bondGap, min(pa.Y, pb.Y) - bondGap}
		hi := Point{max(pa.X, pb.X) + bondGap, max(pa.Y, pb.Y) + bondGap}
		for k, p := range r.pos {
			if p.X < lo.X || p.X > hi.X || p.Y < lo.Y || p.Y > hi.Y || k == b[0] || k == b[1] {
				continue
			}
			t := min(1, max(0, p.sub(pa).dot(ab)/n))
			v := p.sub(pa.add(ab.scale(t)))
			d2 := v.X*v.X + v.Y*v.Y
			if d2 >= bondGap*bondGap || d2 < 1e-18 {
				continue
			}
			d := math.Sqrt(d2)
			e += 2 * (bondGap - d) * (bondGap - d)
			if grad {
				g := v.scale(-4 * (bondGap - d) / d)
				r.grad[k] = r.grad[k].add(g)
				r.grad[b[0]] = r.grad[b[0]].sub(g.scale(1 - t))
				r.grad[b[1]] = r.grad[b[1]].sub(g.scale(t))
			}
		}
	}
	// inner corners at least bendHeight from their neighbours' middle
	for _, t := range r.bend {
		mid := r.pos[t[1]].add(r.pos[t[2]]).scale(0.5)
		v := r.pos[t[0]].sub(mid)
		h := v.norm()
		if h >= bendHeight {
			continue
		}
		if h < 1e-6 {
			// straight: out to the left of the line between the
			// neighbours
			v, h = r.pos[t[2]].sub(r.pos[t[1]]).perp().unit().scale(1e-6), 1e-6
		}
		e += bendWeight * (bendHeight - h) * (bendHeight - h)
		if grad {
			g := v.scale(-2 * bendWeight * (bendHeight - h) / h)
			r.grad[t[0]] = r.grad[t[0]].add(g)
			r.grad[t[1]] = r.grad[t[1]].sub(g.scale(0.5))
			r.grad[t[2]] = r.grad[t[2]].sub(g.scale(0.5))
		}
	}
	if math.IsNaN(e) {
		return math.Inf(1)
	}
	return e
}

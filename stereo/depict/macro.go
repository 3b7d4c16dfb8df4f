package depict

import (
	"math"
	"slices"
)

// This file implements trans double bonds in large rings. A regular
// polygon puts every ring bond's ring neighbours on one side (cis); a
// written trans bond needs its two ends to turn opposite ways. The ring
// is walked with equal turns everywhere except at the ends of such bonds,
// which turn by the same amount in opposite directions; the small
// closing error is spread over the ring, and the ring relaxed towards
// equal bonds.

// bendTrans re-shapes the polygon of cycle in pos when one of its bonds
// carries a written trans configuration between its ring neighbours.
func (l *layout) bendTrans(cycle []int, pos []Point) {
	n := len(cycle)
	if n < 8 {
		return
	}
	// turn[i] is the turn at vertex i, between edges i-1 and i: equal
	// everywhere, none at the inner atoms of a cumulene or alkyne,
	// opposite at the two ends of a ring-trans unit
	fixedTurn := make([]bool, n)
	turn := make([]float64, n)
	free := n
	for i, a := range cycle {
		if l.linear[a] {
			fixedTurn[i] = true
			free--
		}
	}
	var transEnds [][2]int
	for _, w := range l.fixed {
		i0 := slices.Index(cycle, w.Ends[0])
		i1 := slices.Index(cycle, w.Ends[1])
		if i0 < 0 || i1 < 0 {
			continue
		}
		// the ends must be joined along the cycle through linear atoms
		lo, hi := i0, i1
		if (i1-i0+n)%n > (i0-i1+n)%n {
			lo, hi = i1, i0
		}
		ok := true
		for k := (lo + 1) % n; k != hi; k = (k + 1) % n {
			if !fixedTurn[k] {
				ok = false
				break
			}
		}
		if !ok {
			continue
		}
		trans := w.Trans
		if !slices.Contains(cycle, w.Refs[0]) {
			trans = !trans
		}
		if !slices.Contains(cycle, w.Refs[1]) {
			trans = !trans
		}
		if trans && !fixedTurn[lo] && !fixedTurn[hi] {
			transEnds = append(transEnds, [2]int{lo, hi})
			fixedTurn[lo], fixedTurn[hi] = true, true
			free -= 2
		}
	}
	if len(transEnds) == 0 || free < 3 {
		return
	}
	base := 2 * math.Pi / float64(free)
	for i := range turn {
		if !fixedTurn[i] {
			turn[i] = base
		}
	}
	for _, e := range transEnds {
		turn[e[0]], turn[e[1]] = base, -base
	}
	pts := make([]Point, n)
	// walk: edge i leaves vertex i in the direction of the turns at 1..i
	dir := 0.0
	for i := 1; i < n; i++ {
		pts[i] = pts[i-1].add(polar(1, dir))
		dir += turn[i]
	}
	end := pts[n-1].add(polar(1, dir))
	gap := end.sub(pts[0])
	var c Point
	for i := range pts {
		pts[i] = pts[i].sub(gap.scale(float64(i) / float64(n)))
		c = c.add(pts[i])
	}
	c = c.scale(1 / float64(n))
	for i, a := range cycle {
		pos[a] = pts[i].sub(c)
	}
	// the closing error spread over the ring leaves bonds of unequal
	// length; even them out, keeping every bond's side
	l.relax(cycle, nil, pos)
}

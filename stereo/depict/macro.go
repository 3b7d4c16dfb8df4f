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
// closing error is spread over the ring.

// bendTrans re-shapes the polygon of cycle in pos when one of its bonds
// carries a written trans configuration between its ring neighbours.
func (l *layout) bendTrans(cycle []int, pos []Point) {
	n := len(cycle)
	if n < 8 {
		return
	}
	flip := make([]bool, n) // edge i (cycle[i]→cycle[i+1]) is ring-trans
	count := 0
	for _, w := range l.fixed {
		i0 := slices.Index(cycle, w.Ends[0])
		i1 := slices.Index(cycle, w.Ends[1])
		if i0 < 0 || i1 < 0 {
			continue
		}
		var e int
		switch {
		case (i0+1)%n == i1:
			e = i0
		case (i1+1)%n == i0:
			e = i1
		default:
			continue
		}
		trans := w.Trans
		if !slices.Contains(cycle, w.Refs[0]) {
			trans = !trans
		}
		if !slices.Contains(cycle, w.Refs[1]) {
			trans = !trans
		}
		if trans {
			flip[e] = true
			count++
		}
	}
	if count == 0 || n-2*count < 3 {
		return
	}
	turn := make([]float64, n) // turn at vertex i, between edges i-1 and i
	base := 2 * math.Pi / float64(n-2*count)
	for i := range turn {
		turn[i] = base
	}
	for e := range flip {
		if flip[e] {
			turn[e], turn[(e+1)%n] = base, -base
		}
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
}

package depict

import (
	"math"
	"slices"
	"time"
)

// This file implements overlap resolution. While two atoms sit closer
// than clashDist or two bonds cross, the moves tried are, for each
// acyclic single bond on the path between the offending atoms: mirroring
// the smaller side across the bond (which flips a ring substituent and
// keeps every double bond's geometry), turning it about the bond's inner
// atom, and as a last resort stretching the bond. A move is kept when it
// lowers the score; the work is bounded by a count and the deadline.

const clashDist = 0.7

type move struct {
	set []int
	to  []Point
}

// tidy resolves overlaps within component c.
func (l *layout) tidy(c []int) {
	if len(c) < 3 || len(c) > 400 {
		return
	}
	bonds := l.compBonds(c)
	given := map[[2]int]bool{}
	for iter := 0; iter < 60; iter++ {
		if iter%4 == 0 && time.Now().After(l.deadline) {
			l.notes = append(l.notes, Note{Text: "layout stopped at its time budget; some atoms may overlap"})
			return
		}
		i, j, ok := l.worstProblem(c, bonds, given)
		if !ok {
			return
		}
		if !l.improve(c, bonds, i, j, false) && !l.improve(c, bonds, i, j, true) {
			given[[2]int{i, j}] = true
		}
	}
}

// compBonds lists the bonds of a component as atom pairs.
func (l *layout) compBonds(c []int) [][2]int {
	var out [][2]int
	for _, a := range c {
		for _, y := range l.nbr[a] {
			if l.rank[a] < l.rank[y] {
				out = append(out, [2]int{a, y})
			}
		}
	}
	return out
}

// worstProblem returns the closest pair of atoms under clashDist, or the
// first pair of crossing bonds (as one atom of each), skipping pairs
// already given up.
func (l *layout) worstProblem(c []int, bonds [][2]int, given map[[2]int]bool) (int, int, bool) {
	bi, bj, bd := -1, -1, clashDist
	for x := 0; x < len(c); x++ {
		for y := x + 1; y < len(c); y++ {
			a, b := c[x], c[y]
			if d := l.pos[a].dist(l.pos[b]); d < bd && !given[[2]int{a, b}] {
				bi, bj, bd = a, b, d
			}
		}
	}
	if bi >= 0 {
		return bi, bj, true
	}
	for x := 0; x < len(bonds); x++ {
		for y := x + 1; y < len(bonds); y++ {
			p, q := bonds[x], bonds[y]
			if p[0] == q[0] || p[0] == q[1] || p[1] == q[0] || p[1] == q[1] {
				continue
			}
			if segmentsCross(l.pos[p[0]], l.pos[p[1]], l.pos[q[0]], l.pos[q[1]]) && !given[[2]int{p[0], q[0]}] {
				return p[0], q[0], true
			}
		}
	}
	return 0, 0, false
}

// improve tries the moves on the bonds of the path from i to j and keeps
// the best one that lowers the score. stretch allows bond stretching.
func (l *layout) improve(c []int, bonds [][2]int, i, j int, stretch bool) bool {
	path := l.path(i, j)
	var best *move
	bestGain := 1e-6
	for k := 0; k+1 < len(path); k++ {
		u, v := path[k], path[k+1]
		bi := l.m.BondBetween(u, v)
		if bi < 0 || l.ringBond[bi] || kekule(&l.m.Bonds[bi]) != 1 {
			continue
		}
		// move the smaller side; the pivot is the atom of the bond
		// outside it
		set := l.sideOf(v, u)
		pivot, axis := u, v
		if other := l.sideOf(u, v); len(other) < len(set) || (len(other) == len(set) && l.minRank(other) > l.minRank(set)) {
			set, pivot, axis = other, v, u
		}
		var cands []move
		if stretch {
			d := l.pos[axis].sub(l.pos[pivot]).unit().scale(0.45)
			cands = append(cands, l.shifted(set, d))
		} else {
			cands = append(cands, l.mirrored(set, l.pos[pivot], l.pos[axis]))
			if !l.dbEnd[pivot] && !l.linear[pivot] {
				for _, t := range []float64{math.Pi / 6, -math.Pi / 6, math.Pi / 3, -math.Pi / 3} {
					cands = append(cands, l.turned(set, l.pos[pivot], t))
				}
			}
		}
		for ci := range cands {
			if g := l.gain(c, bonds, &cands[ci]); g > bestGain {
				bestGain, best = g, &cands[ci]
			}
		}
	}
	if best == nil {
		return false
	}
	for k, a := range best.set {
		l.pos[a] = best.to[k]
	}
	return true
}

func (l *layout) mirrored(set []int, a, b Point) move {
	mv := move{set: set, to: make([]Point, len(set))}
	for k, x := range set {
		mv.to[k] = l.pos[x].reflect(a, b)
	}
	return mv
}

func (l *layout) turned(set []int, c Point, t float64) move {
	mv := move{set: set, to: make([]Point, len(set))}
	for k, x := range set {
		mv.to[k] = l.pos[x].around(c, t)
	}
	return mv
}

func (l *layout) shifted(set []int, d Point) move {
	mv := move{set: set, to: make([]Point, len(set))}
	for k, x := range set {
		mv.to[k] = l.pos[x].add(d)
	}
	return mv
}

// gain is how much a move lowers the score: clashes between the moved
// set and the rest, and crossings between bonds that touch the set and
// bonds that do not. Distances within the set do not change.
func (l *layout) gain(c []int, bonds [][2]int, mv *move) float64 {
	// moved[a] is 1 + a's index in the move, 0 for atoms that stay
	if len(l.moved) != l.n {
		l.moved = make([]int32, l.n)
	}
	moved := l.moved
	for k, x := range mv.set {
		moved[x] = int32(k + 1)
	}
	defer func() {
		for _, x := range mv.set {
			moved[x] = 0
		}
	}()
	at := func(a int) Point {
		if k := moved[a]; k > 0 {
			return mv.to[k-1]
		}
		return l.pos[a]
	}
	pen := func(d float64) float64 {
		if d >= clashDist {
			return 0
		}
		return 10 * (clashDist - d) * (clashDist - d) / (clashDist * clashDist)
	}
	g := 0.0
	for k, x := range mv.set {
		for _, y := range c {
			if moved[y] > 0 {
				continue
			}
			g += pen(l.pos[x].dist(l.pos[y])) - pen(mv.to[k].dist(l.pos[y]))
		}
	}
	// bonds with a moved end can change their crossings; among the
	// others nothing changes
	var touching, still [][2]int
	for _, p := range bonds {
		if moved[p[0]] > 0 || moved[p[1]] > 0 {
			touching = append(touching, p)
		} else {
			still = append(still, p)
		}
	}
	cross := func(get func(int) Point, p, q [2]int) bool {
		if p[0] == q[0] || p[0] == q[1] || p[1] == q[0] || p[1] == q[1] {
			return false
		}
		return segmentsCross(get(p[0]), get(p[1]), get(q[0]), get(q[1]))
	}
	crossings := func(get func(int) Point) int {
		n := 0
		for i, p := range touching {
			for _, q := range touching[i+1:] {
				if cross(get, p, q) {
					n++
				}
			}
			for _, q := range still {
				if cross(get, p, q) {
					n++
				}
			}
		}
		return n
	}
	g += float64(crossings(func(a int) Point { return l.pos[a] }) - crossings(at))
	if g <= 0 {
		return g
	}
	// never give up a written double-bond geometry
	old := make([]Point, len(mv.set))
	for k, x := range mv.set {
		old[k], l.pos[x] = l.pos[x], mv.to[k]
	}
	kept := l.geometryKept()
	for k, x := range mv.set {
		l.pos[x] = old[k]
	}
	if !kept {
		return 0
	}
	return g
}

// path returns a shortest path of atoms from i to j.
func (l *layout) path(i, j int) []int {
	prev := map[int]int{i: -1}
	q := []int{i}
	for k := 0; k < len(q) && q[k] != j; k++ {
		for _, y := range l.nbr[q[k]] {
			if _, ok := prev[y]; !ok {
				prev[y] = q[k]
				q = append(q, y)
			}
		}
	}
	if _, ok := prev[j]; !ok {
		return nil
	}
	var out []int
	for x := j; x >= 0; x = prev[x] {
		out = append(out, x)
	}
	slices.Reverse(out)
	return out
}

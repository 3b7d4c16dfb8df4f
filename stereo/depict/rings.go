package depict

import (
	"math"
	"slices"

	"stereoline/notation"
)

// This file implements the layout of one ring system in coordinates of
// its own: the first ring (the largest ring for macrocycles, the ring of
// most fusions otherwise, or for bridged systems the perimeter of two
// rings that share a path) as a regular polygon, then ring by ring the
// ring with most atoms already placed: a spiro ring as a polygon on the
// free side of its shared atom, the unplaced runs of any other ring as
// arcs of equal chords between the placed atoms that bound them, on the
// side that overlaps least.

// layoutSystem returns positions indexed by atom for the atoms of
// system s.
func (l *layout) layoutSystem(s int) []Point {
	sys := &l.systems[s]
	pos := make([]Point, l.n)
	done := make([]bool, l.n)
	rings := sys.rings
	first := l.firstRing(sys)
	l.polygon(first, pos, done)
	placedRing := make([]bool, len(rings))
	for step := 0; step < len(rings); step++ {
		best, bestShared := -1, 0
		for ri, r := range rings {
			if placedRing[ri] {
				continue
			}
			shared := 0
			for _, a := range r.Atoms {
				if done[a] {
					shared++
				}
			}
			if shared == len(r.Atoms) {
				placedRing[ri] = true
				continue
			}
			if shared > bestShared || (shared == bestShared && shared > 0 && l.ringKey(r) < l.ringKey(rings[best])) {
				best, bestShared = ri, shared
			}
		}
		if best < 0 {
			break
		}
		placedRing[best] = true
		r := rings[best]
		if bestShared == 1 {
			l.spiro(r, pos, done)
		} else {
			l.fillRuns(r, pos, done)
		}
	}
	// atoms no ring placed (an approximate ring search): on a circle
	for i, a := range sys.atoms {
		if !done[a] {
			pos[a] = polar(3+float64(i)*0.1, float64(i))
			done[a] = true
		}
	}
	return pos
}

// ringKey orders rings canonically: by the ranks of their atoms.
func (l *layout) ringKey(r notation.Ring) int {
	k := l.n
	for _, a := range r.Atoms {
		k = min(k, l.rank[a])
	}
	return k
}

// firstRing chooses the ring placed first, with its atoms in cycle order.
func (l *layout) firstRing(sys *ringSystem) []int {
	rings := sys.rings
	best := 0
	score := func(i int) (int, int) {
		r := rings[i]
		if r.Size() >= 8 {
			return 1000 + r.Size(), -l.ringKey(r)
		}
		fused := 0
		for j, q := range rings {
			if j != i && sharedCount(r, q) >= 2 {
				fused++
			}
		}
		return fused*10 + r.Size(), -l.ringKey(r)
	}
	for i := range rings {
		a1, b1 := score(i)
		a0, b0 := score(best)
		if a1 > a0 || (a1 == a0 && b1 > b0) {
			best = i
		}
	}
	cycle := rings[best].Atoms
	// bridged systems: start from the perimeter of two rings sharing a
	// path of three or more atoms, which draws the bridge inside
	for i := range rings {
		for j := i + 1; j < len(rings); j++ {
			if sharedCount(rings[i], rings[j]) < 3 {
				continue
			}
			if c := ringSum(rings[i], rings[j]); len(c) > len(cycle) && len(c) <= 2*len(rings[best].Atoms)+2 {
				cycle = c
			}
		}
	}
	// start at the canonically first atom, towards its first neighbour
	start := 0
	for i, a := range cycle {
		if l.rank[a] < l.rank[cycle[start]] {
			start = i
		}
	}
	n := len(cycle)
	out := make([]int, 0, n)
	fwd := l.rank[cycle[(start+1)%n]] < l.rank[cycle[(start+n-1)%n]]
	for i := 0; i < n; i++ {
		if fwd {
			out = append(out, cycle[(start+i)%n])
		} else {
			out = append(out, cycle[(start-i+n)%n])
		}
	}
	return out
}

func sharedCount(a, b notation.Ring) int {
	k := 0
	for _, x := range a.Atoms {
		if slices.Contains(b.Atoms, x) {
			k++
		}
	}
	return k
}

// ringSum returns the cycle formed by the bonds of exactly one of two
// rings, or nil when those bonds do not form one simple cycle.
func ringSum(a, b notation.Ring) []int {
	count := map[int]int{}
	ends := map[int][2]int{}
	for _, r := range []notation.Ring{a, b} {
		for i, bi := range r.Bonds {
			count[bi]++
			ends[bi] = [2]int{r.Atoms[i], r.Atoms[(i+1)%len(r.Atoms)]}
		}
	}
	adj := map[int][]int{}
	edges := 0
	for bi, c := range count {
		if c != 1 {
			continue
		}
		e := ends[bi]
		adj[e[0]] = append(adj[e[0]], e[1])
		adj[e[1]] = append(adj[e[1]], e[0])
		edges++
	}
	if edges == 0 {
		return nil
	}
	start := -1
	for x, ys := range adj {
		if len(ys) != 2 {
			return nil
		}
		if start < 0 || x < start {
			start = x
		}
	}
	cycle := []int{start}
	prev, cur := -1, start
	for {
		ys := adj[cur]
		next := ys[0]
		if next == prev || (prev == -1 && ys[1] < ys[0]) {
			next = ys[1]
		}
		if next == start {
			break
		}
		if len(cycle) > edges {
			return nil
		}
		cycle = append(cycle, next)
		prev, cur = cur, next
	}
	if len(cycle) != edges {
		return nil
	}
	return cycle
}

// polygon places a cycle as a regular polygon centred at the origin, its
// first atom at the top.
func (l *layout) polygon(cycle []int, pos []Point, done []bool) {
	n := len(cycle)
	r := 1 / (2 * math.Sin(math.Pi/float64(n)))
	for i, a := range cycle {
		pos[a] = polar(r, math.Pi/2+2*math.Pi*float64(i)/float64(n))
		done[a] = true
	}
	l.bendTrans(cycle, pos)
}

// spiro places ring r, which shares one placed atom, as a polygon on the
// free side of that atom.
func (l *layout) spiro(r notation.Ring, pos []Point, done []bool) {
	n := len(r.Atoms)
	k := 0
	for i, a := range r.Atoms {
		if done[a] {
			k = i
		}
	}
	s := r.Atoms[k]
	var away Point
	for _, y := range l.nbr[s] {
		if done[y] {
			away = away.add(pos[s].sub(pos[y]).unit())
		}
	}
	if away.norm() < 1e-6 {
		away = Point{1, 0}
	}
	away = away.unit()
	rad := 1 / (2 * math.Sin(math.Pi/float64(n)))
	centre := pos[s].add(away.scale(rad))
	base := pos[s].sub(centre).angle()
	best, bestPen := []Point(nil), math.Inf(1)
	for _, dir := range []float64{1, -1} {
		cand := make([]Point, n)
		for i := 0; i < n; i++ {
			cand[(k+i)%n] = centre.add(polar(rad, base+dir*2*math.Pi*float64(i)/float64(n)))
		}
		if pen := penalty(cand, r.Atoms, pos, done); pen < bestPen-1e-9 {
			best, bestPen = cand, pen
		}
	}
	for i, a := range r.Atoms {
		if !done[a] {
			pos[a] = best[i]
			done[a] = true
		}
	}
}

// penalty measures how close new points come to placed atoms.
func penalty(cand []Point, atoms []int, pos []Point, done []bool) float64 {
	pen := 0.0
	for i, p := range cand {
		if done[atoms[i]] {
			continue
		}
		for a := range pos {
			if done[a] {
				if d := p.dist(pos[a]); d < 0.9 {
					pen += (0.9 - d) * (0.9 - d)
				}
			}
		}
	}
	return pen
}

// fillRuns places each run of unplaced atoms of ring r on an arc between
// the placed atoms on either side of it.
func (l *layout) fillRuns(r notation.Ring, pos []Point, done []bool) {
	n := len(r.Atoms)
	at := func(i int) int { return r.Atoms[((i%n)+n)%n] }
	// start at a placed atom followed by an unplaced one
	for i := 0; i < n; i++ {
		if !done[at(i)] || done[at(i+1)] {
			continue
		}
		var run []int
		j := i + 1
		for !done[at(j)] && len(run) < n {
			run = append(run, at(j))
			j++
		}
		l.arc(at(i), at(j), run, pos, done)
	}
}

// arc places run between a and b on a circular arc of equal chords,
// choosing the side that overlaps least (then the side away from the
// placed atoms).
func (l *layout) arc(a, b int, run []int, pos []Point, done []bool) {
	pa, pb := pos[a], pos[b]
	segs := float64(len(run) + 1)
	d := pa.dist(pb)
	var best []Point
	bestPen, bestFar := math.Inf(1), 0.0
	var centroid Point
	cnt := 0
	for x := range pos {
		if done[x] {
			centroid = centroid.add(pos[x])
			cnt++
		}
	}
	centroid = centroid.scale(1 / float64(max(cnt, 1)))
	for _, sgn := range []float64{1, -1} {
		cand := arcPoints(pa, pb, len(run), d, segs, sgn)
		pen := 0.0
		for _, p := range cand {
			for x := range pos {
				if done[x] {
					if dd := p.dist(pos[x]); dd < 0.9 {
						pen += (0.9 - dd) * (0.9 - dd)
					}
				}
			}
		}
		far := 0.0
		for _, p := range cand {
			far += p.dist(centroid)
		}
		if pen < bestPen-1e-6 || (math.Abs(pen-bestPen) <= 1e-6 && far > bestFar) {
			best, bestPen, bestFar = cand, pen, far
		}
	}
	for i, x := range run {
		pos[x] = best[i]
		done[x] = true
	}
}

// arcPoints returns k points from a to b (exclusive) on an arc bulging to
// the left (sgn +1) or right of a→b, with k+1 chords of length 1; when the
// ends are too far apart for that, on a flat arc with longer chords.
func arcPoints(pa, pb Point, k int, d, segs, sgn float64) []Point {
	out := make([]Point, k)
	u := pb.sub(pa).unit()
	left := u.perp().scale(sgn)
	if d >= segs*0.97 || d < 1e-9 {
		// a bridge across: a shallow bow, chords stretched a little
		bow := 0.3 * math.Sqrt(float64(k))
		for i := 0; i < k; i++ {
			t := float64(i+1) / segs
			h := bow * math.Sin(math.Pi*t)
			out[i] = pa.add(pb.sub(pa).scale(t)).add(left.scale(h))
		}
		return out
	}
	// solve sin(s·phi)/sin(phi) = d for the half-angle phi of one chord
	lo, hi := 1e-9, math.Pi/segs
	for it := 0; it < 60; it++ {
		mid := (lo + hi) / 2
		if math.Sin(segs*mid)/math.Sin(mid) > d {
			lo = mid
		} else {
			hi = mid
		}
	}
	phi := (lo + hi) / 2
	rad := 1 / (2 * math.Sin(phi))
	theta := 2 * segs * phi // central angle from a to b through the arc
	mid := pa.add(pb).scale(0.5)
	// the centre lies opposite the bulge for arcs under half a circle
	centre := mid.sub(left.scale(rad * math.Cos(theta/2)))
	start := pa.sub(centre).angle()
	// turn from a towards the bulge side
	dir := -1.0
	if sgn < 0 {
		dir = 1
	}
	for i := 0; i < k; i++ {
		out[i] = centre.add(polar(rad, start+dir*2*phi*float64(i+1)))
	}
	return out
}

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
// system s. Bridged systems are drawn around a perimeter (bridged.go);
// so is a system whose ring-by-ring drawing has crossing bonds, when
// that scores better.
func (l *layout) layoutSystem(s int) []Point {
	sys := &l.systems[s]
	if isBridged(sys.rings) {
		if pos, ok := l.layoutCage(s); ok {
			return pos
		}
	}
	pos := make([]Point, l.n)
	done := make([]bool, l.n)
	rings := l.cycles(sys)
	first := l.firstRing(rings)
	l.polygon(first, pos, done)
	l.fillRings(rings, pos, done)
	l.placeLeftovers(sys, pos, done)
	if l.peripheral(sys) && l.systemFlawed(sys, pos) {
		if alt, ok := l.layoutCage(s); ok && l.systemScore(sys, alt) < l.systemScore(sys, pos) {
			return alt
		}
	}
	return pos
}

// fillRings places, ring by ring, the rings with atoms not yet done:
// each time the ring with most atoms done, a spiro ring as a polygon on
// the free side of its shared atom, the unplaced runs of any other ring
// as arcs.
func (l *layout) fillRings(rings []notation.Ring, pos []Point, done []bool) {
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
			if shared > bestShared || (shared == bestShared && shared > 0 && l.ringOrder(r, rings[best]) < 0) {
				best, bestShared = ri, shared
			}
		}
		if best < 0 {
			break
		}
		placedRing[best] = true
		r := rings[best]
		if bestShared == 1 {
			l.spiro(r, rings, pos, done)
		} else {
			l.fillRuns(r, pos, done)
		}
	}
}

// placeLeftovers puts atoms no ring placed (an approximate ring search)
// on a circle.
func (l *layout) placeLeftovers(sys *ringSystem, pos []Point, done []bool) {
	for i, a := range sys.atoms {
		if !done[a] {
			pos[a] = polar(3+float64(i)*0.1, float64(i))
			done[a] = true
		}
	}
}

// peripheral reports a system with an atom in three or more of its
// smallest rings (a cage such as cubane, or a peri-fused system).
func (l *layout) peripheral(sys *ringSystem) bool {
	if len(sys.atoms) > maxCageAtoms {
		return false
	}
	count := map[int]int{}
	for _, r := range sys.rings {
		for _, a := range r.Atoms {
			count[a]++
			if count[a] >= 3 {
				return true
			}
		}
	}
	return false
}

// systemFlawed reports two bonds of the system that cross or an atom
// that sits on a bond.
func (l *layout) systemFlawed(sys *ringSystem, pos []Point) bool {
	var bonds [][2]int
	for _, a := range sys.atoms {
		for _, y := range l.nbr[a] {
			if a < y && l.sysOf[y] == l.sysOf[a] {
				bonds = append(bonds, [2]int{a, y})
			}
		}
	}
	for i, p := range bonds {
		for _, q := range bonds[i+1:] {
			if p[0] == q[0] || p[0] == q[1] || p[1] == q[0] || p[1] == q[1] {
				continue
			}
			if segmentsCross(pos[p[0]], pos[p[1]], pos[q[0]], pos[q[1]]) {
				return true
			}
		}
		for _, a := range sys.atoms {
			if a != p[0] && a != p[1] && segmentDist(pos[a], pos[p[0]], pos[p[1]]) < 0.35 {
				return true
			}
		}
	}
	return false
}

// ringKey orders rings canonically: by the ranks of their atoms.
func (l *layout) ringKey(r notation.Ring) int {
	k := l.n
	for _, a := range r.Atoms {
		k = min(k, l.rank[a])
	}
	return k
}

// cycles returns the rings of a system to place: its smallest rings
// and, where two of them share a path of three or more atoms (bridged
// systems), the cycle around both, so the choice does not hang on which
// smallest set the ring search found.
func (l *layout) cycles(sys *ringSystem) []notation.Ring {
	rings := slices.Clone(sys.rings)
	if len(rings) > 12 {
		return rings
	}
	for i := range sys.rings {
		for j := i + 1; j < len(sys.rings); j++ {
			if sharedCount(sys.rings[i], sys.rings[j]) < 3 {
				continue
			}
			if c := ringSum(sys.rings[i], sys.rings[j]); c != nil {
				dup := false
				for _, r := range rings {
					if sameCycle(r.Atoms, c) {
						dup = true
					}
				}
				if !dup {
					rings = append(rings, notation.Ring{Atoms: c})
				}
			}
		}
	}
	return rings
}

func sameCycle(a, b []int) bool {
	if len(a) != len(b) {
		return false
	}
	for _, x := range a {
		if !slices.Contains(b, x) {
			return false
		}
	}
	return true
}

// ringOrder compares two rings canonically by their sorted ranks.
func (l *layout) ringOrder(a, b notation.Ring) int {
	ra := make([]int, len(a.Atoms))
	for i, x := range a.Atoms {
		ra[i] = l.rank[x]
	}
	rb := make([]int, len(b.Atoms))
	for i, x := range b.Atoms {
		rb[i] = l.rank[x]
	}
	slices.Sort(ra)
	slices.Sort(rb)
	return slices.Compare(ra, rb)
}

// firstRing chooses the ring placed first, with its atoms in cycle
// order: the largest ring of a macrocycle; for bridged systems the
// largest cycle (the perimeter, which draws the bridges inside); else
// the ring of most fusions.
func (l *layout) firstRing(rings []notation.Ring) []int {
	bridged := false
	for i := range rings {
		for j := i + 1; j < len(rings); j++ {
			if sharedCount(rings[i], rings[j]) >= 3 {
				bridged = true
			}
		}
	}
	score := func(i int) int {
		r := rings[i]
		if r.Size() >= 8 || bridged {
			return 1000 + r.Size()
		}
		fused := 0
		for j, q := range rings {
			if j != i && sharedCount(r, q) >= 2 {
				fused++
			}
		}
		return fused*10 + r.Size()
	}
	best := 0
	for i := range rings {
		if d := score(i) - score(best); d > 0 || (d == 0 && l.ringOrder(rings[i], rings[best]) < 0) {
			best = i
		}
	}
	cycle := rings[best].Atoms
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

// spiro places ring r, which shares one placed atom, as a polygon on
// the free side of that atom. Where three or more rings of the system
// meet at the atom (a metal with its chelate rings), the rings stand
// evenly around it, a turn divided by their number apart.
func (l *layout) spiro(r notation.Ring, rings []notation.Ring, pos []Point, done []bool) {
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
	if dirs := l.spiroDirections(s, rings, pos, done); len(dirs) > 0 {
		away = polar(1, l.freeSpiroDirection(s, dirs, pos, done))
	}
	rad := 1 / (2 * math.Sin(math.Pi/float64(n)))
	centre := pos[s].add(away.scale(rad))
	base := pos[s].sub(centre).angle()
	best, bestPen := []Point(nil), math.Inf(1)
	dirs := []float64{1, -1}
	if l.rank[r.Atoms[(k+1)%n]] > l.rank[r.Atoms[(k+n-1)%n]] {
		dirs = []float64{-1, 1} // of two mirror images, the canonical one first
	}
	for _, dir := range dirs {
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

// spiroDirections returns, for an atom where three or more rings of
// the system meet, the directions a ring's centre may take from it:
// evenly spread from the first ring placed there, less those taken.
func (l *layout) spiroDirections(s int, rings []notation.Ring, pos []Point, done []bool) []float64 {
	total := 0
	var taken []float64
	first := -1
	for ri, q := range rings {
		if !slices.Contains(q.Atoms, s) {
			continue
		}
		total++
		all := true
		var c Point
		for _, a := range q.Atoms {
			all = all && done[a]
			c = c.add(pos[a])
		}
		if !all {
			continue
		}
		d := c.scale(1 / float64(len(q.Atoms))).sub(pos[s]).angle()
		taken = append(taken, d)
		if first < 0 || l.ringOrder(q, rings[first]) < 0 {
			first = ri
			taken[0], taken[len(taken)-1] = taken[len(taken)-1], taken[0]
		}
	}
	if total < 3 || len(taken) == 0 {
		return nil
	}
	var out []float64
	for i := 1; i < total; i++ {
		d := taken[0] + 2*math.Pi*float64(i)/float64(total)
		free := true
		for _, t := range taken {
			if angleDiff(d, t) < 0.5 {
				free = false
			}
		}
		if free {
			out = append(out, d)
		}
	}
	return out
}

// freeSpiroDirection picks, of the directions, the one whose ring
// would come least close to atoms placed.
func (l *layout) freeSpiroDirection(s int, dirs []float64, pos []Point, done []bool) float64 {
	best, bestPen := dirs[0], math.Inf(1)
	for _, d := range dirs {
		p := pos[s].add(polar(1.2, d))
		pen := 0.0
		for a := range pos {
			if done[a] && a != s {
				if dd := p.dist(pos[a]); dd < 1.5 {
					pen += 1.5 - dd
				}
			}
		}
		if pen < bestPen-1e-9 {
			best, bestPen = d, pen
		}
	}
	return best
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
	type span struct {
		a, b int
		run  []int
	}
	var spans []span
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
		sp := span{at(i), at(j), run}
		// read from the canonically first end, so the side chosen does
		// not depend on the direction the ring was found in
		if l.rank[sp.a] > l.rank[sp.b] {
			sp.a, sp.b = sp.b, sp.a
			slices.Reverse(sp.run)
		}
		spans = append(spans, sp)
	}
	slices.SortFunc(spans, func(x, y span) int { return l.minRank(x.run) - l.minRank(y.run) })
	for _, sp := range spans {
		l.arc(sp.a, sp.b, sp.run, pos, done)
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
	// arcs of unit chords on either side, and bows across (bridges the
	// arcs would lay over ring atoms already placed)
	var cands [][]Point
	for _, sgn := range []float64{1, -1} {
		cands = append(cands, arcPoints(pa, pb, len(run), d, segs, sgn))
	}
	for _, h := range []float64{0.3, 0.55, 0.85} {
		for _, sgn := range []float64{1, -1} {
			cands = append(cands, bowPoints(pa, pb, len(run), h*sgn))
		}
	}
	for _, cand := range cands {
		pen := 0.0
		prev := pa
		for i, p := range cand {
			for x := range pos {
				if done[x] {
					if dd := p.dist(pos[x]); dd < 0.9 {
						pen += (0.9 - dd) * (0.9 - dd)
					}
				}
			}
			for _, q := range cand[:i] {
				if dd := p.dist(q); dd < 0.6 {
					pen += (0.6 - dd) * (0.6 - dd)
				}
			}
			c := p.dist(prev)
			pen += 0.5 * (c - 1) * (c - 1)
			prev = p
		}
		c := pb.dist(prev)
		pen += 0.5 * (c - 1) * (c - 1)
		pen += 100 * float64(l.arcBreaksDoubleBonds(run, cand, pos, done))
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

// arcBreaksDoubleBonds counts the written double bonds that placing run
// at cand would draw the other way (or straight), among those whose ends
// and references are then all placed.
func (l *layout) arcBreaksDoubleBonds(run []int, cand []Point, pos []Point, done []bool) int {
	if len(l.fixed) == 0 {
		return 0
	}
	at := func(a int) (Point, bool) {
		for i, x := range run {
			if x == a {
				return cand[i], true
			}
		}
		return pos[a], done[a]
	}
	bad := 0
	for _, w := range l.fixed {
		var p [4]Point
		ok, touched := true, false
		for k, a := range []int{w.Ends[0], w.Ends[1], w.Refs[0], w.Refs[1]} {
			q, placed := at(a)
			ok = ok && placed
			touched = touched || slices.Contains(run, a)
			p[k] = q
		}
		if !ok || !touched {
			continue
		}
		s0, s1 := side(p[2], p[0], p[1]), side(p[3], p[0], p[1])
		if s0 == 0 || s1 == 0 || (s0 != s1) != w.Trans {
			bad++
		}
	}
	return bad
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

// bowPoints returns k points from a to b (exclusive) evenly along the
// chord, bowed sideways by h at the middle.
func bowPoints(pa, pb Point, k int, h float64) []Point {
	out := make([]Point, k)
	left := pb.sub(pa).unit().perp()
	for i := 0; i < k; i++ {
		t := float64(i+1) / float64(k+1)
		out[i] = pa.add(pb.sub(pa).scale(t)).add(left.scale(h * math.Sin(math.Pi*t)))
	}
	return out
}

package depict

import (
	"math"
	"math/bits"
	"slices"
	"time"

	"stereoline/notation"
)

// This file implements the layout of bridged ring systems: norbornane,
// bicyclo[2.2.2]octane, tropane, adamantane, cubane, morphinan. Such a
// system cannot be drawn as polygons fused edge to edge, so it is drawn
// as one outer cycle, its perimeter, with the other bridges inside.
//
// The perimeter is chosen among the cycles of the system (sums of its
// smallest rings) that can bound a drawing without crossings: no two of
// its bridges interlace, so all of them fit on one side. Bridges that
// hang on one perimeter bond or one atom (a fused or spiro ring) are
// drawn outside, ring by ring, as in fused systems. Of the cycles, those
// that leave fewest substituted atoms inside come first (a substituent
// of an inner atom has nowhere to go but across a ring bond; the gem
// dimethyl bridge of camphor belongs on the perimeter), then those that
// leave fewest atoms and bonds inside. The perimeter is drawn as a
// regular polygon and the inner atoms at the mean of their neighbours (a
// barycentric drawing, without crossings when the perimeter bounds a
// face), then the system is relaxed towards equal bonds by moves of one
// atom at a time that never make bonds cross. The best few perimeters
// are drawn and the drawing that scores best is kept. Every choice
// follows the canonical ranks.

const (
	maxCageAtoms      = 60 // larger bridged systems keep the ring-by-ring layout
	maxCageCandidates = 3  // perimeters drawn and scored
	maxCageCycles     = 400
)

// cage is the graph of one ring system in local indices (the system's
// atoms in canonical order).
type cage struct {
	atoms []int   // molecule atom of each local atom
	adj   [][]int // local neighbours, in canonical order
	bonds [][2]int
	ext   []int // neighbours outside the system (substituents)
	bond  map[[2]int]int
}

func (l *layout) newCage(sys *ringSystem) *cage {
	c := &cage{atoms: sys.atoms, bond: map[[2]int]int{}}
	loc := make(map[int]int, len(sys.atoms))
	for i, a := range sys.atoms {
		loc[a] = i
	}
	c.adj = make([][]int, len(c.atoms))
	c.ext = make([]int, len(c.atoms))
	for i, a := range c.atoms {
		for _, y := range l.nbr[a] {
			j, ok := loc[y]
			if !ok {
				c.ext[i]++
				continue
			}
			c.adj[i] = append(c.adj[i], j)
			if i < j {
				c.bond[[2]int{i, j}] = len(c.bonds)
				c.bonds = append(c.bonds, [2]int{i, j})
			}
		}
	}
	return c
}

func (c *cage) bondOf(i, j int) int {
	if i > j {
		i, j = j, i
	}
	if b, ok := c.bond[[2]int{i, j}]; ok {
		return b
	}
	return -1
}

// isBridged reports a system two of whose smallest rings share three or
// more atoms.
func isBridged(rings []notation.Ring) bool {
	for i := range rings {
		for j := i + 1; j < len(rings); j++ {
			if sharedCount(rings[i], rings[j]) >= 3 {
				return true
			}
		}
	}
	return false
}

// cageCycle is a simple cycle of the system: its local atoms in cycle
// order and its bonds as a set.
type cageCycle struct {
	atoms []int
	set   []uint64
}

// cycles returns the simple cycles among the sums of the system's
// smallest rings (all sums for up to ten rings, else sums of up to
// three). All sums of a basis are the whole cycle space, so for up to
// ten rings the answer does not depend on which smallest rings the ring
// search found.
func (c *cage) cycles(rings []notation.Ring) []cageCycle {
	words := (len(c.bonds) + 63) / 64
	sets := make([][]uint64, 0, len(rings))
	loc := make(map[int]int, len(c.atoms))
	for i, a := range c.atoms {
		loc[a] = i
	}
	for _, r := range rings {
		set := make([]uint64, words)
		for k, a := range r.Atoms {
			b := c.bondOf(loc[a], loc[r.Atoms[(k+1)%len(r.Atoms)]])
			if b < 0 {
				return nil // a ring outside the system: nothing to do
			}
			set[b/64] ^= 1 << (b % 64)
		}
		sets = append(sets, set)
	}
	var out []cageCycle
	seen := map[string]bool{}
	add := func(set []uint64) {
		if len(out) >= maxCageCycles {
			return
		}
		key := make([]byte, 0, 8*len(set))
		for _, w := range set {
			for k := 0; k < 8; k++ {
				key = append(key, byte(w>>(8*k)))
			}
		}
		if seen[string(key)] {
			return
		}
		seen[string(key)] = true
		if cyc := c.asCycle(set); cyc != nil {
			out = append(out, cageCycle{cyc, slices.Clone(set)})
		}
	}
	k := len(sets)
	cur := make([]uint64, words)
	if k <= 10 {
		for mask := 1; mask < 1<<k; mask++ {
			clear(cur)
			for i := 0; i < k; i++ {
				if mask&(1<<i) != 0 {
					for w := range cur {
						cur[w] ^= sets[i][w]
					}
				}
			}
			add(cur)
		}
		return out
	}
	for i := 0; i < k; i++ {
		add(sets[i])
		for j := i + 1; j < k; j++ {
			for w := range cur {
				cur[w] = sets[i][w] ^ sets[j][w]
			}
			add(cur)
			for h := j + 1; h < k; h++ {
				for w := range cur {
					cur[w] = sets[i][w] ^ sets[j][w] ^ sets[h][w]
				}
				add(cur)
			}
		}
	}
	return out
}

// basis returns k independent cycles, smallest first and of equal sizes
// the canonically first: a smallest set of smallest rings that depends
// on the canonical ranks alone, as rings of the molecule.
func (c *cage) basis(cycles []cageCycle, k int, l *layout) []notation.Ring {
	type keyed struct {
		cageCycle
		key []int
	}
	order := make([]keyed, len(cycles))
	for i, cy := range cycles {
		key := make([]int, len(cy.atoms))
		for j, x := range cy.atoms {
			key[j] = l.rank[c.atoms[x]]
		}
		slices.Sort(key)
		order[i] = keyed{cy, key}
	}
	slices.SortStableFunc(order, func(a, b keyed) int {
		if len(a.atoms) != len(b.atoms) {
			return len(a.atoms) - len(b.atoms)
		}
		return slices.Compare(a.key, b.key)
	})
	var rows [][]uint64 // reduced rows, each with its leading bit
	var lead []int
	var out []notation.Ring
	for _, cy := range order {
		if len(out) == k {
			break
		}
		v := slices.Clone(cy.set)
		for i, row := range rows {
			if v[lead[i]/64]&(1<<(lead[i]%64)) != 0 {
				for w := range v {
					v[w] ^= row[w]
				}
			}
		}
		bit := -1
		for w, x := range v {
			if x != 0 {
				bit = 64*w + bits.TrailingZeros64(x)
				break
			}
		}
		if bit < 0 {
			continue // dependent on the cycles taken
		}
		for i, row := range rows {
			if row[bit/64]&(1<<(bit%64)) != 0 {
				for w := range row {
					rows[i][w] ^= v[w]
				}
			}
		}
		rows = append(rows, v)
		lead = append(lead, bit)
		r := notation.Ring{}
		for i, x := range cy.atoms {
			a, b := c.atoms[x], c.atoms[cy.atoms[(i+1)%len(cy.atoms)]]
			r.Atoms = append(r.Atoms, a)
			r.Bonds = append(r.Bonds, l.m.BondBetween(a, b))
		}
		out = append(out, r)
	}
	return out
}

// asCycle returns the atoms of a bond set in cycle order when the set is
// one simple cycle, else nil.
func (c *cage) asCycle(set []uint64) []int {
	deg := make([]int8, len(c.atoms))
	edges := 0
	start := -1
	for b, e := range c.bonds {
		if set[b/64]&(1<<(b%64)) == 0 {
			continue
		}
		edges++
		for _, x := range e {
			deg[x]++
			if deg[x] > 2 {
				return nil
			}
			if start < 0 || x < start {
				start = x
			}
		}
	}
	if edges < 3 {
		return nil
	}
	in := func(x, y int) bool {
		b := c.bondOf(x, y)
		return b >= 0 && set[b/64]&(1<<(b%64)) != 0
	}
	cyc := []int{start}
	prev, cur := -1, start
	for len(cyc) <= edges {
		next := -1
		for _, y := range c.adj[cur] {
			if y != prev && in(cur, y) {
				next = y
				break
			}
		}
		if next < 0 {
			return nil
		}
		if next == start {
			break
		}
		cyc = append(cyc, next)
		prev, cur = cur, next
	}
	if len(cyc) != edges {
		return nil
	}
	return cyc
}

// perimeter is a candidate outer cycle with the bridges drawn inside it.
type perimeter struct {
	cycle []int // local atoms in cycle order
	inner []int // local atoms drawn inside, canonical order
	cost  int
	key   []int // the cycle's sorted ranks, for ties
}

// bridge is a part of the system hanging on a cycle: a chord (no atoms)
// or a component of the atoms off the cycle, with the cycle positions it
// attaches to.
type bridge struct {
	atoms  []int
	attach []int // sorted cycle positions
}

// perimeterOf returns the cycle as a perimeter, or ok false when two of
// its bridges interlace (the cycle bounds no face).
func (c *cage) perimeterOf(cyc []int, l *layout) (perimeter, bool) {
	n := len(cyc)
	at := make([]int, len(c.atoms))
	for i := range at {
		at[i] = -1
	}
	for i, x := range cyc {
		at[x] = i
	}
	var bridges []bridge
	for _, e := range c.bonds {
		i, j := at[e[0]], at[e[1]]
		if i < 0 || j < 0 {
			continue
		}
		if d := (i - j + n) % n; d == 1 || d == n-1 {
			continue
		}
		bridges = append(bridges, bridge{attach: []int{min(i, j), max(i, j)}})
	}
	seen := make([]bool, len(c.atoms))
	for s := range c.atoms {
		if at[s] >= 0 || seen[s] {
			continue
		}
		br := bridge{atoms: []int{s}}
		seen[s] = true
		for k := 0; k < len(br.atoms); k++ {
			for _, y := range c.adj[br.atoms[k]] {
				switch {
				case at[y] >= 0:
					if !slices.Contains(br.attach, at[y]) {
						br.attach = append(br.attach, at[y])
					}
				case !seen[y]:
					seen[y] = true
					br.atoms = append(br.atoms, y)
				}
			}
		}
		slices.Sort(br.attach)
		bridges = append(bridges, br)
	}
	p := perimeter{cycle: cyc}
	var inside []bridge
	for _, br := range bridges {
		// a fused or spiro ring on the perimeter is drawn outside
		if len(br.atoms) > 0 && (len(br.attach) == 1 ||
			len(br.attach) == 2 && ((br.attach[1]-br.attach[0]) == 1 || (br.attach[0]-br.attach[1]+n) == 1)) {
			continue
		}
		inside = append(inside, br)
	}
	for i := range inside {
		for j := range inside {
			if i != j && !nested(inside[i].attach, inside[j].attach, n) {
				return p, false
			}
		}
	}
	for _, br := range inside {
		if len(br.atoms) == 0 {
			p.cost += 2 // a bond across the perimeter
		}
		for _, x := range br.atoms {
			p.inner = append(p.inner, x)
			p.cost += 1 + 3*c.ext[x]
		}
	}
	slices.Sort(p.inner)
	for _, x := range cyc {
		p.key = append(p.key, l.rank[c.atoms[x]])
	}
	slices.Sort(p.key)
	return p, true
}

// nested reports whether every attachment of b lies in one closed
// interval between consecutive attachments of a, on a cycle of n atoms.
func nested(a, b []int, n int) bool {
	for i := range a {
		lo, hi := a[i], a[(i+1)%len(a)]
		ok := true
		for _, x := range b {
			var in bool
			if lo < hi {
				in = x >= lo && x <= hi
			} else {
				in = x >= lo || x <= hi
			}
			if !in {
				ok = false
				break
			}
		}
		if ok {
			return true
		}
	}
	return false
}

// layoutCage lays out a bridged system; ok is false when it has no
// perimeter (a graph that is not planar, or too large a system).
func (l *layout) layoutCage(s int) ([]Point, bool) {
	sys := &l.systems[s]
	if len(sys.atoms) > maxCageAtoms {
		return nil, false
	}
	c := l.newCage(sys)
	cycles := c.cycles(sys.rings)
	rings := c.basis(cycles, len(sys.rings), l)
	if len(rings) != len(sys.rings) {
		return nil, false
	}
	var cands []perimeter
	for _, cyc := range cycles {
		if p, ok := c.perimeterOf(cyc.atoms, l); ok {
			cands = append(cands, p)
		}
	}
	if len(cands) == 0 {
		return nil, false
	}
	slices.SortFunc(cands, func(a, b perimeter) int {
		if a.cost != b.cost {
			return a.cost - b.cost
		}
		if len(a.cycle) != len(b.cycle) {
			return len(b.cycle) - len(a.cycle)
		}
		return slices.Compare(a.key, b.key)
	})
	var best []Point
	bestScore := math.Inf(1)
	for k, p := range cands {
		if k == maxCageCandidates || bestScore < tidyScore || k > 0 && time.Now().After(l.deadline) {
			break
		}
		pos := l.drawCage(s, c, p, rings)
		if sc := l.systemScore(sys, pos); sc < bestScore-1e-9 {
			best, bestScore = pos, sc
		}
	}
	// the fused drawing relaxed: polygons ring by ring from the ring of
	// most fusions, the bridges as arcs; it wins for systems that are
	// mostly fused (morphinan) and for large rings that share a short
	// bridge, which it draws as two rings side by side
	if bestScore >= tidyScore && (hasFusion(rings) || bestScore > 10) && !time.Now().After(l.deadline) {
		pos := l.drawFusedRelaxed(s, rings)
		if sc := l.systemScore(sys, pos); sc < bestScore-1e-9 {
			best = pos
		}
	}
	return best, true
}

// tidyScore is a system score with nothing to gain by trying on.
const tidyScore = 0.5

// hasFusion reports two rings that share exactly one bond.
func hasFusion(rings []notation.Ring) bool {
	for i := range rings {
		for j := i + 1; j < len(rings); j++ {
			if sharedCount(rings[i], rings[j]) == 2 {
				return true
			}
		}
	}
	return false
}

// drawFusedRelaxed draws a system ring by ring as if it were fused, from
// its ring of most fusions, then relaxes it.
func (l *layout) drawFusedRelaxed(s int, rings []notation.Ring) []Point {
	sys := &l.systems[s]
	pos := make([]Point, l.n)
	done := make([]bool, l.n)
	first := l.canonicalCycle(rings[l.mostFused(rings)].Atoms)
	l.polygon(first, pos, done)
	l.fillRings(rings, pos, done)
	l.placeLeftovers(sys, pos, done)
	var small []int
	for _, a := range sys.atoms {
		if l.rings.AtomSize[a] <= 8 {
			small = append(small, a)
		}
	}
	l.relax(sys.atoms, small, pos)
	return pos
}

// mostFused returns the index of the ring that shares atoms with most
// other rings, the largest of those, the canonically first of those.
func (l *layout) mostFused(rings []notation.Ring) int {
	score := func(i int) int {
		k := 0
		for j := range rings {
			if j != i && sharedCount(rings[i], rings[j]) >= 2 {
				k++
			}
		}
		return 10*k + rings[i].Size()
	}
	best := 0
	for i := range rings {
		if d := score(i) - score(best); d > 0 || d == 0 && l.ringOrder(rings[i], rings[best]) < 0 {
			best = i
		}
	}
	return best
}

// drawCage draws the system around perimeter p: the polygon, the inner
// atoms, the relaxation, then the rings outside ring by ring.
func (l *layout) drawCage(s int, c *cage, p perimeter, rings []notation.Ring) []Point {
	sys := &l.systems[s]
	pos := make([]Point, l.n)
	done := make([]bool, l.n)
	// the polygon from the canonically first atom towards its lower
	// ranked cycle neighbour
	cyc := make([]int, len(p.cycle))
	for i, x := range p.cycle {
		cyc[i] = c.atoms[x]
	}
	cyc = l.canonicalCycle(cyc)
	l.polygon(cyc, pos, done)
	// a perimeter around many atoms starts larger, so the relaxation
	// starts with room for them
	grow := math.Sqrt(float64(len(cyc)+max(len(p.inner)-1, 0)) / float64(len(cyc)))
	for _, a := range cyc {
		pos[a] = pos[a].scale(grow)
	}
	// inner atoms at the mean of their neighbours, by Gauss-Seidel
	// sweeps from the centre, nudged apart in canonical order
	for k, x := range p.inner {
		a := c.atoms[x]
		pos[a] = polar(0.01*float64(k+1), float64(k))
	}
	for it := 0; it < 200; it++ {
		moved := 0.0
		for _, x := range p.inner {
			var sum Point
			for _, y := range c.adj[x] {
				sum = sum.add(pos[c.atoms[y]])
			}
			q := sum.scale(1 / float64(len(c.adj[x])))
			moved = max(moved, q.dist(pos[c.atoms[x]]))
			pos[c.atoms[x]] = q
		}
		if moved < 1e-4 {
			break
		}
	}
	innerAtoms := make([]int, 0, len(p.inner))
	for _, x := range p.inner {
		a := c.atoms[x]
		innerAtoms = append(innerAtoms, a)
		done[a] = true
	}
	l.bowChains(c, p.inner, pos)
	l.fillRings(rings, pos, done)
	l.placeLeftovers(sys, pos, done)
	l.relax(sys.atoms, innerAtoms, pos)
	return pos
}

// bowChains bends each chain of inner atoms (atoms of two bonds in a
// row), which the mean of neighbours lays on a straight line, into a bow
// to one side, so every atom shows as a corner and a bridge of two or
// more atoms reads as one arc, on the side with more room (of equal
// sides, the left of the line from the chain's canonically first end).
func (l *layout) bowChains(c *cage, inner []int, pos []Point) {
	isInner := make([]bool, len(c.atoms))
	for _, x := range inner {
		isInner[x] = true
	}
	chainAtom := func(x int) bool { return isInner[x] && len(c.adj[x]) == 2 && !l.linear[c.atoms[x]] }
	seen := make([]bool, len(c.atoms))
	for _, x := range inner {
		if seen[x] || !chainAtom(x) {
			continue
		}
		// walk to both ends of the chain through x
		chain := []int{x}
		seen[x] = true
		var ends [2]int
		for side, next := range c.adj[x] {
			prev, cur := x, next
			for chainAtom(cur) && !seen[cur] {
				seen[cur] = true
				if side == 0 {
					chain = append([]int{cur}, chain...)
				} else {
					chain = append(chain, cur)
				}
				nxt := c.adj[cur][0]
				if nxt == prev {
					nxt = c.adj[cur][1]
				}
				prev, cur = cur, nxt
			}
			ends[side] = cur
		}
		if ends[0] == ends[1] {
			continue
		}
		if l.rank[c.atoms[ends[0]]] > l.rank[c.atoms[ends[1]]] {
			ends[0], ends[1] = ends[1], ends[0]
			slices.Reverse(chain)
		}
		pa, pb := pos[c.atoms[ends[0]]], pos[c.atoms[ends[1]]]
		left := pb.sub(pa).unit().perp()
		k := len(chain)
		bowed := func(sgn float64) []Point {
			out := make([]Point, k)
			for i, y := range chain {
				t := float64(i+1) / float64(k+1)
				out[i] = pos[c.atoms[y]].add(left.scale(sgn * bendHeight * math.Sin(math.Pi*t)))
			}
			return out
		}
		// the side with more room
		room := func(pts []Point) float64 {
			r := math.Inf(1)
			for z := range c.atoms {
				if z == ends[0] || z == ends[1] || slices.Contains(chain, z) {
					continue
				}
				for _, q := range pts {
					r = min(r, q.dist(pos[c.atoms[z]]))
				}
			}
			return r
		}
		pts := bowed(1)
		if right := bowed(-1); room(right) > room(pts)+1e-6 {
			pts = right
		}
		for i, y := range chain {
			pos[c.atoms[y]] = pts[i]
		}
	}
}

// canonicalCycle rotates and turns a cycle so it starts at its
// canonically first atom and goes on towards the lower ranked of that
// atom's two cycle neighbours.
func (l *layout) canonicalCycle(cycle []int) []int {
	n := len(cycle)
	start := 0
	for i, a := range cycle {
		if l.rank[a] < l.rank[cycle[start]] {
			start = i
		}
	}
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

// systemScore measures the flaws of a system's drawing: crossing bonds,
// atoms too close, bonds off the unit length and substituents with no
// room on the outside; lower is better.
func (l *layout) systemScore(sys *ringSystem, pos []Point) float64 {
	atoms := sys.atoms
	in := make(map[int]bool, len(atoms))
	for _, a := range atoms {
		in[a] = true
	}
	var bonds [][2]int
	for _, a := range atoms {
		for _, y := range l.nbr[a] {
			if in[y] && l.rank[a] < l.rank[y] {
				bonds = append(bonds, [2]int{a, y})
			}
		}
	}
	score := 0.0
	for i, p := range bonds {
		d := pos[p[0]].dist(pos[p[1]])
		score += 10 * (d - 1) * (d - 1)
		if d < 0.9 || d > 1.1 {
			score += 4
		}
		for _, q := range bonds[i+1:] {
			if p[0] == q[0] || p[0] == q[1] || p[1] == q[0] || p[1] == q[1] {
				continue
			}
			if segmentsCross(pos[p[0]], pos[p[1]], pos[q[0]], pos[q[1]]) {
				score += 100
			}
		}
	}
	for i, a := range atoms {
		for _, b := range atoms[i+1:] {
			d := pos[a].dist(pos[b])
			if d < 0.5 {
				score += 50
			} else if d < 0.8 {
				score += 10 * (0.8 - d)
			}
		}
	}
	// written double bonds drawn the other way
	for _, w := range l.fixed {
		if !in[w.Ends[0]] || !in[w.Ends[1]] || !in[w.Refs[0]] || !in[w.Refs[1]] {
			continue
		}
		s0 := side(pos[w.Refs[0]], pos[w.Ends[0]], pos[w.Ends[1]])
		s1 := side(pos[w.Refs[1]], pos[w.Ends[0]], pos[w.Ends[1]])
		if s0 == 0 || s1 == 0 || (s0 != s1) != w.Trans {
			score += 1000
		}
	}
	// corners drawn straight hide their atom
	for _, a := range atoms {
		if len(l.nbr[a]) != 2 || l.linear[a] || l.rings.AtomSize[a] > 8 || !in[l.nbr[a][0]] || !in[l.nbr[a][1]] {
			continue
		}
		u := pos[l.nbr[a][0]].sub(pos[a]).unit()
		v := pos[l.nbr[a][1]].sub(pos[a]).unit()
		if u.dot(v) < -0.97 {
			score += 50
		}
	}
	// atoms on bonds
	for _, a := range atoms {
		for _, p := range bonds {
			if p[0] != a && p[1] != a && segmentDist(pos[a], pos[p[0]], pos[p[1]]) < 0.35 {
				score += 50
			}
		}
	}
	// room for substituents: the middle of the widest gap at each
	// substituted atom, one bond out, must be clear of the system
	for _, a := range atoms {
		ext := 0
		var dirs []float64
		for _, y := range l.nbr[a] {
			if in[y] {
				dirs = append(dirs, pos[y].sub(pos[a]).angle())
			} else {
				ext++
			}
		}
		if ext == 0 {
			continue
		}
		start, width := largestGap(dirs)
		q := pos[a].add(polar(1, start+width/2))
		bad := width < math.Pi*float64(ext)/(float64(ext)+1.5)
		for _, b := range atoms {
			if b != a && q.dist(pos[b]) < 0.7 {
				bad = true
			}
		}
		for _, p := range bonds {
			if p[0] != a && p[1] != a && segmentsCross(pos[a], q, pos[p[0]], pos[p[1]]) {
				bad = true
			}
		}
		if bad {
			score += 100 * float64(ext)
		}
	}
	return score
}

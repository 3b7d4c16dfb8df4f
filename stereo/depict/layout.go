package depict

import (
	"math"
	"slices"
	"time"

	"stereoline/notation"
	"stereoline/stereo"
)

// This file implements the layout of one record: components, the order
// they are placed in, and the growth of each component from its first
// ring system (or the end of its longest chain) outwards, every new atom
// placed in the widest free angle of the atom it hangs from, chains in
// zigzag. Ring systems are laid out in rings.go, overlaps resolved in
// tidy.go, stereo drawn in wedges.go.

// layout holds the state of one Draw call.
type layout struct {
	m        *notation.Molecule
	an       *stereo.Analysis
	n        int
	deadline time.Time

	rank     []int
	nbr      [][]int // neighbours, in canonical order
	rings    *notation.Rings
	ringAtom []bool
	ringBond []bool
	sysOf    []int // ring system of each atom, -1 outside rings
	systems  []ringSystem
	comps    [][]int // components, each in canonical order
	compOf   []int
	linear   []bool // atoms whose two bonds are drawn in a straight line

	pos    []Point
	placed []bool
	turn   []int8 // the zigzag turn made at each chain atom
	height []int  // depth of the branch each atom starts, for picking the main chain

	// stereo: the double bonds whose written geometry the layout keeps
	fixed []stereo.WrittenBond
	dbEnd []bool // atoms at the ends of a stereogenic double bond

	// the drawing's extras: hydrogens added to carry wedges, bond styles
	hydrogens []addedH
	style     map[int]bondStyle // by bond index of the molecule
	hStyle    []bondStyle       // by added hydrogen
	arrows    []Arrow
	pluses    []Plus
	notes     []Note

	// a Fischer molfile's fixed atoms (fischer.go): positions, the
	// centres whose bonds they style, the styles and hydrogens
	moved []int32 // scratch of tidy.go's gain

	pins     map[int]Point
	pinned   map[int]bool
	pinStyle map[int]bondStyle
	pinH     []addedH
}

type ringSystem struct {
	rings []notation.Ring
	atoms []int
}

type addedH struct {
	centre int
	p      Point
}

type bondStyle struct {
	style  Style
	narrow int // atom index of the narrow end (an added H is n + its index)
}

func newLayout(m *notation.Molecule, an *stereo.Analysis, deadline time.Time) *layout {
	n := len(m.Atoms)
	l := &layout{m: m, an: an, n: n, deadline: deadline,
		pos: make([]Point, n), placed: make([]bool, n), turn: make([]int8, n), height: make([]int, n),
		linear: make([]bool, n), dbEnd: make([]bool, n), style: map[int]bondStyle{}}
	return l
}

// run computes every coordinate and bond style.
func (l *layout) run() {
	m := l.m
	l.rings = notation.FindRings(m)
	l.ringAtom = make([]bool, l.n)
	l.ringBond = make([]bool, len(m.Bonds))
	for i := range l.ringAtom {
		l.ringAtom[i] = l.rings.AtomInRing(i)
	}
	for i := range l.ringBond {
		l.ringBond[i] = l.rings.BondInRing(i)
	}
	l.rank = canonicalRanks(m, l.ringAtom, l.an)
	l.nbr = make([][]int, l.n)
	for i := range m.Atoms {
		for _, bi := range m.Atoms[i].Bonds {
			if bi >= 0 && bi < len(m.Bonds) {
				l.nbr[i] = append(l.nbr[i], m.Bonds[bi].Other(i))
			}
		}
		slices.SortFunc(l.nbr[i], func(a, b int) int { return l.rank[a] - l.rank[b] })
		l.linear[i] = l.isLinear(i)
	}
	l.readStereo()
	slices.SortFunc(l.fixed, func(a, b stereo.WrittenBond) int {
		return min(l.rank[a.Ends[0]], l.rank[a.Ends[1]]) - min(l.rank[b.Ends[0]], l.rank[b.Ends[1]])
	})
	l.findComponents()
	l.findSystems()
	for _, c := range l.comps {
		if l.pinComponent(c) {
			l.keepDoubleBonds(c)
			continue
		}
		l.layoutComponent(c)
		l.keepDoubleBonds(c)
		l.tidy(c)
		l.orient(c)
	}
	if l.pins == nil {
		l.arrange()
	}
	for bi, st := range l.pinStyle {
		l.style[bi] = st
	}
	for _, h := range l.pinH {
		l.hydrogens = append(l.hydrogens, h)
		l.hStyle = append(l.hStyle, bondStyle{style: StyleWedge, narrow: h.centre})
	}
	l.drawStereo()
}

// isLinear reports an atom whose two bonds run straight on: a triple bond
// or two double bonds (the inner atoms of cumulenes).
func (l *layout) isLinear(a int) bool {
	m := l.m
	if len(m.Atoms[a].Bonds) != 2 {
		return false
	}
	doubles := 0
	for _, bi := range m.Atoms[a].Bonds {
		switch kekule(&m.Bonds[bi]) {
		case 3:
			return true
		case 2:
			doubles++
		}
	}
	return doubles == 2
}

// readStereo collects the written double-bond geometries.
func (l *layout) readStereo() {
	if l.an == nil {
		return
	}
	for i := range l.an.Units {
		u := &l.an.Units[i]
		if u.Kind != stereo.KindDoubleBond {
			continue
		}
		for _, a := range u.Atoms {
			if a >= 0 && a < l.n {
				l.dbEnd[a] = true
			}
		}
		if !u.Specified {
			continue
		}
		if w, ok := stereo.WrittenDoubleBond(l.m, u); ok {
			l.fixed = append(l.fixed, w)
		}
	}
}

// findComponents splits the atoms into connected components, ordered by
// size and then canonically.
func (l *layout) findComponents() {
	l.compOf = make([]int, l.n)
	for i := range l.compOf {
		l.compOf[i] = -1
	}
	order := make([]int, l.n)
	for i := range order {
		order[i] = i
	}
	slices.SortFunc(order, func(a, b int) int { return l.rank[a] - l.rank[b] })
	for _, s := range order {
		if l.compOf[s] >= 0 {
			continue
		}
		id := len(l.comps)
		c := []int{s}
		l.compOf[s] = id
		for k := 0; k < len(c); k++ {
			for _, y := range l.nbr[c[k]] {
				if l.compOf[y] < 0 {
					l.compOf[y] = id
					c = append(c, y)
				}
			}
		}
		slices.SortFunc(c, func(a, b int) int { return l.rank[a] - l.rank[b] })
		l.comps = append(l.comps, c)
	}
	// reactants, agents, products; within a role larger parts first
	role := func(c []int) notation.Role { return l.m.Atoms[c[0]].Role }
	slices.SortStableFunc(l.comps, func(a, b []int) int {
		if ra, rb := role(a), role(b); ra != rb {
			return int(ra) - int(rb)
		}
		if len(a) != len(b) {
			return len(b) - len(a)
		}
		return l.rank[a[0]] - l.rank[b[0]]
	})
	for id, c := range l.comps {
		for _, a := range c {
			l.compOf[a] = id
		}
	}
}

// findSystems groups the smallest rings into ring systems: rings that
// share an atom belong to one system (fused, bridged and spiro alike).
func (l *layout) findSystems() {
	rs := l.rings.SSSR
	parent := make([]int, len(rs))
	for i := range parent {
		parent[i] = i
	}
	find := func(x int) int {
		for parent[x] != x {
			parent[x] = parent[parent[x]]
			x = parent[x]
		}
		return x
	}
	owner := make([]int, l.n)
	for i := range owner {
		owner[i] = -1
	}
	for ri, r := range rs {
		for _, a := range r.Atoms {
			if owner[a] >= 0 {
				if x, y := find(owner[a]), find(ri); x != y {
					parent[max(x, y)] = min(x, y)
				}
			} else {
				owner[a] = ri
			}
		}
	}
	l.sysOf = make([]int, l.n)
	for i := range l.sysOf {
		l.sysOf[i] = -1
	}
	ids := map[int]int{}
	for ri, r := range rs {
		root := find(ri)
		id, ok := ids[root]
		if !ok {
			id = len(l.systems)
			ids[root] = id
			l.systems = append(l.systems, ringSystem{})
		}
		s := &l.systems[id]
		s.rings = append(s.rings, r)
		for _, a := range r.Atoms {
			if l.sysOf[a] < 0 {
				l.sysOf[a] = id
				s.atoms = append(s.atoms, a)
			}
		}
	}
	for i := range l.systems {
		slices.SortFunc(l.systems[i].atoms, func(a, b int) int { return l.rank[a] - l.rank[b] })
	}
}

// layoutComponent places the atoms of one component.
func (l *layout) layoutComponent(c []int) {
	var queue []int
	root := -1
	bestSys := -1
	for _, a := range c {
		if s := l.sysOf[a]; s >= 0 {
			if bestSys < 0 || len(l.systems[s].atoms) > len(l.systems[bestSys].atoms) ||
				len(l.systems[s].atoms) == len(l.systems[bestSys].atoms) && l.rank[l.systems[s].atoms[0]] < l.rank[l.systems[bestSys].atoms[0]] {
				bestSys = s
			}
		}
	}
	if bestSys >= 0 {
		local := l.layoutSystem(bestSys)
		for _, a := range l.systems[bestSys].atoms {
			l.pos[a] = local[a]
			l.placed[a] = true
		}
		queue = append(queue, l.systems[bestSys].atoms...)
	} else {
		root = l.chainEnd(c)
		l.pos[root] = Point{}
		l.placed[root] = true
		l.turn[root] = 1
		queue = append(queue, root)
	}
	l.heights(c, queue)
	for k := 0; k < len(queue); k++ {
		queue = l.expand(queue[k], queue)
	}
}

// pinComponent places a component that holds pinned atoms: those at
// their places, ring systems through them attached, the rest grown
// around them. It reports false when c holds no pinned atom.
func (l *layout) pinComponent(c []int) bool {
	var queue []int
	for _, a := range c {
		if p, ok := l.pins[a]; ok {
			l.pos[a] = p
			l.placed[a] = true
			queue = append(queue, a)
		}
	}
	if len(queue) == 0 {
		return false
	}
	attached := map[int]bool{}
	for _, a := range slices.Clone(queue) {
		s := l.sysOf[a]
		if s < 0 || attached[s] {
			continue
		}
		attached[s] = true
		from := -1
		for _, y := range l.nbr[a] {
			if l.pinned[y] {
				from = y
			}
		}
		if from < 0 {
			continue
		}
		l.attachSystem(s, a, from)
		queue = append(queue, l.systems[s].atoms...)
	}
	l.heights(c, queue)
	for k := 0; k < len(queue); k++ {
		queue = l.expand(queue[k], queue)
	}
	return true
}

// chainEnd returns an end of a longest path of an acyclic component
// (approximately: the atom farthest from the farthest atom of the
// canonically first one).
func (l *layout) chainEnd(c []int) int {
	far := func(s int) int {
		dist := map[int]int{s: 0}
		q := []int{s}
		best := s
		for k := 0; k < len(q); k++ {
			x := q[k]
			for _, y := range l.nbr[x] {
				if _, ok := dist[y]; !ok {
					dist[y] = dist[x] + 1
					q = append(q, y)
					if dist[y] > dist[best] || (dist[y] == dist[best] && l.rank[y] < l.rank[best]) {
						best = y
					}
				}
			}
		}
		return best
	}
	return far(far(c[0]))
}

// heights computes, over a breadth-first tree from the start atoms, the
// depth of the branch below each atom.
func (l *layout) heights(c []int, start []int) {
	parent := map[int]int{}
	order := append([]int(nil), start...)
	seen := map[int]bool{}
	for _, s := range start {
		seen[s] = true
		parent[s] = -1
	}
	for k := 0; k < len(order); k++ {
		x := order[k]
		for _, y := range l.nbr[x] {
			if !seen[y] {
				seen[y] = true
				parent[y] = x
				order = append(order, y)
			}
		}
	}
	for i := len(order) - 1; i >= 0; i-- {
		x := order[i]
		if p := parent[x]; p >= 0 {
			l.height[p] = max(l.height[p], l.height[x]+1)
		}
	}
}

// expand places the unplaced neighbours of a and appends what it placed
// to the queue.
func (l *layout) expand(a int, queue []int) []int {
	var todo, done []int
	for _, y := range l.nbr[a] {
		if l.placed[y] {
			done = append(done, y)
		} else {
			todo = append(todo, y)
		}
	}
	if len(todo) == 0 {
		return queue
	}
	slices.SortStableFunc(todo, func(x, y int) int { return l.height[y] - l.height[x] })
	dirs := make([]float64, len(done))
	for i, y := range done {
		dirs[i] = l.pos[y].sub(l.pos[a]).angle()
	}
	angles := l.directions(a, done, dirs, len(todo))
	for i, y := range todo {
		p := l.pos[a].add(polar(1, angles[i]))
		l.pos[y] = p
		l.placed[y] = true
		if s := l.sysOf[y]; s >= 0 && s != l.sysOf[a] {
			l.attachSystem(s, y, a)
			queue = append(queue, l.systems[s].atoms...)
			continue
		}
		queue = append(queue, y)
	}
	return queue
}

// directions returns the directions of k new bonds at atom a, the first
// for the longest branch.
func (l *layout) directions(a int, done []int, dirs []float64, k int) []float64 {
	out := make([]float64, 0, k)
	switch len(dirs) {
	case 0:
		if l.linear[a] {
			for i := 0; i < k; i++ {
				out = append(out, math.Pi*float64(i))
			}
			return out
		}
		for i := 0; i < k; i++ {
			out = append(out, math.Pi/6+2*math.Pi*float64(i)/float64(max(k, 3)))
		}
		return out
	case 1:
		alpha := dirs[0]
		if l.linear[a] || (k == 1 && l.sysOf[a] < 0 && l.linearPair(a, done[0])) {
			out = append(out, alpha+math.Pi)
			for i := 1; i < k; i++ {
				out = append(out, alpha+math.Pi+float64(i)*math.Pi/2)
			}
			return out
		}
		// the zigzag: turn the other way from the parent
		want := -1
		if p := done[0]; l.turn[p] != 0 && l.sysOf[a] < 0 {
			want = -int(l.turn[p])
		}
		in := alpha + math.Pi // direction of travel into a
		pick := func(t int) float64 { return in + float64(t)*math.Pi/3 }
		switch k {
		case 1:
			t := want
			if l.clearance(a, pick(t)) < 0.8 && l.clearance(a, pick(-t)) > l.clearance(a, pick(t)) {
				t = -t
			}
			l.turn[a] = int8(t)
			return append(out, pick(t))
		case 2:
			l.turn[a] = int8(want)
			return append(out, pick(want), pick(-want))
		case 3:
			return append(out, alpha+math.Pi, alpha+math.Pi/2, alpha-math.Pi/2)
		}
		for i := 0; i < k; i++ {
			out = append(out, alpha+2*math.Pi*float64(i+1)/float64(k+1))
		}
		return out
	}
	start, width := l.openGap(a, dirs)
	for i := 0; i < k; i++ {
		out = append(out, start+width*float64(i+1)/float64(k+1))
	}
	if k == 2 && len(dirs) == 2 && width > 1.3*math.Pi {
		// two substituents on a ring atom: spread them a little less
		mid := start + width/2
		out[0], out[1] = mid-math.Pi/3, mid+math.Pi/3
	}
	return out
}

// openGap returns the widest angular gap between the bonds at a; of
// gaps within 15 degrees of the widest, the one whose middle has most
// room (the outside of a bridge rather than its inside).
func (l *layout) openGap(a int, dirs []float64) (start, width float64) {
	s := make([]float64, len(dirs))
	for i, d := range dirs {
		s[i] = normAngle(d)
	}
	sortFloats(s)
	_, widest := largestGap(dirs)
	bestRoom := -1.0
	for i := range s {
		next := s[0] + 2*math.Pi
		if i+1 < len(s) {
			next = s[i+1]
		}
		g := next - s[i]
		if g < widest-15*math.Pi/180 {
			continue
		}
		room := l.clearance(a, s[i]+g/2)
		if room > bestRoom+1e-9 {
			start, width, bestRoom = s[i], g, room
		}
	}
	return start, width
}

// linearPair reports a bond from a to p that makes a straight chain: a
// triple bond, or a's other bond a triple.
func (l *layout) linearPair(a, p int) bool {
	bi := l.m.BondBetween(a, p)
	return bi >= 0 && kekule(&l.m.Bonds[bi]) == 3 && len(l.nbr[a]) == 2
}

// clearance is the distance from the point one bond from a in direction
// t to the nearest placed atom other than a.
func (l *layout) clearance(a int, t float64) float64 {
	p := l.pos[a].add(polar(1, t))
	best := math.Inf(1)
	for _, x := range l.comps[l.compOf[a]] {
		if x != a && l.placed[x] {
			best = min(best, p.dist(l.pos[x]))
		}
	}
	return best
}

// attachSystem lays out ring system s and places it so that its atom
// entry (already placed) points its free side at the atom from.
func (l *layout) attachSystem(s, entry, from int) {
	local := l.layoutSystem(s)
	atoms := l.systems[s].atoms
	var ext Point
	for _, y := range l.nbr[entry] {
		if l.sysOf[y] == s {
			ext = ext.add(local[entry].sub(local[y]).unit())
		}
	}
	if ext.norm() < 1e-6 {
		ext = Point{1, 0}
	}
	want := l.pos[from].sub(l.pos[entry])
	theta := want.angle() - ext.angle()
	place := func(mirror bool) []Point {
		out := make([]Point, len(atoms))
		for i, a := range atoms {
			p := local[a]
			if mirror {
				p = p.reflect(local[entry], local[entry].add(ext))
			}
			out[i] = p.sub(local[entry]).rotate(theta).add(l.pos[entry])
		}
		return out
	}
	best, bestPen := []Point(nil), math.Inf(1)
	for _, mirror := range []bool{false, true} {
		cand := place(mirror)
		pen := 0.0
		for _, x := range l.comps[l.compOf[entry]] {
			if !l.placed[x] || l.sysOf[x] == s {
				continue
			}
			for _, p := range cand {
				if d := p.dist(l.pos[x]); d < 0.9 {
					pen += (0.9 - d) * (0.9 - d)
				}
			}
		}
		if pen < bestPen-1e-9 {
			best, bestPen = cand, pen
		}
	}
	for i, a := range atoms {
		l.pos[a] = best[i]
		l.placed[a] = true
	}
}

// keepDoubleBonds mirrors one side of each double bond whose drawn
// geometry differs from the written one, across the line of the bond.
func (l *layout) keepDoubleBonds(c []int) {
	for _, w := range l.fixed {
		if l.compOf[w.Ends[0]] != l.compOf[c[0]] {
			continue
		}
		e0, e1 := w.Ends[0], w.Ends[1]
		s0 := side(l.pos[w.Refs[0]], l.pos[e0], l.pos[e1])
		s1 := side(l.pos[w.Refs[1]], l.pos[e0], l.pos[e1])
		if s0 == 0 || s1 == 0 || (s0 != s1) == w.Trans {
			continue
		}
		// mirror the smaller side; of equal sides, the one without the
		// canonically first atom
		set, other := l.sideOf(e1, w.Inner[1]), l.sideOf(e0, w.Inner[0])
		if slices.Contains(set, e0) || slices.Contains(other, e1) {
			continue // both ends in one ring: left to the ring layout
		}
		if len(other) < len(set) || (len(other) == len(set) && l.minRank(other) > l.minRank(set)) {
			set = other
		}
		if l.pins != nil {
			moved := false
			for _, x := range set {
				if _, ok := l.pins[x]; ok {
					moved = true
				}
			}
			if moved {
				continue
			}
		}
		a, b := l.pos[e0], l.pos[e1]
		for _, x := range set {
			l.pos[x] = l.pos[x].reflect(a, b)
		}
	}
}

func (l *layout) minRank(set []int) int {
	k := l.n
	for _, x := range set {
		k = min(k, l.rank[x])
	}
	return k
}

// sideOf returns the atoms reachable from a without passing through
// atom not (a included), or nil when not is no neighbour of a.
func (l *layout) sideOf(a, not int) []int {
	seen := map[int]bool{a: true, not: true}
	out := []int{a}
	for k := 0; k < len(out); k++ {
		for _, y := range l.nbr[out[k]] {
			if !seen[y] {
				seen[y] = true
				out = append(out, y)
			}
		}
	}
	return out
}

// geometryKept reports whether every written double bond still has its
// written geometry.
func (l *layout) geometryKept() bool {
	for _, w := range l.fixed {
		s0 := side(l.pos[w.Refs[0]], l.pos[w.Ends[0]], l.pos[w.Ends[1]])
		s1 := side(l.pos[w.Refs[1]], l.pos[w.Ends[0]], l.pos[w.Ends[1]])
		if s0 != 0 && s1 != 0 && (s0 != s1) != w.Trans {
			return false
		}
	}
	return true
}

// orient turns a component to the multiple of 30 degrees that makes it
// lowest, so chains run across.
func (l *layout) orient(c []int) {
	if len(c) < 2 {
		return
	}
	best, bestH := 0, math.Inf(1)
	for k := 0; k < 6; k++ {
		t := float64(k) * math.Pi / 6
		lo, hi := math.Inf(1), math.Inf(-1)
		for _, a := range c {
			y := l.pos[a].rotate(t).Y
			lo, hi = min(lo, y), max(hi, y)
		}
		if h := hi - lo; h < bestH-1e-6 {
			best, bestH = k, h
		}
	}
	t := float64(best) * math.Pi / 6
	for _, a := range c {
		l.pos[a] = l.pos[a].rotate(t)
	}
}

// arrange puts the components side by side: reactants, an arrow with
// the agents over it, products.
func (l *layout) arrange() {
	x := 0.0
	put := func(c []int) {
		lo, hi := l.bounds(c)
		dx, dy := x-lo.X, -(lo.Y+hi.Y)/2
		for _, a := range c {
			l.pos[a] = l.pos[a].add(Point{dx, dy})
		}
		x += hi.X - lo.X
	}
	if !l.m.Reaction {
		for i, c := range l.comps {
			if i > 0 {
				x += 1.5
			}
			put(c)
		}
		return
	}
	byRole := map[notation.Role][][]int{}
	for _, c := range l.comps {
		r := l.m.Atoms[c[0]].Role
		byRole[r] = append(byRole[r], c)
	}
	side := func(cs [][]int) {
		for i, c := range cs {
			if i > 0 {
				x += 0.7
				l.pluses = append(l.pluses, Plus{Point{x, 0}})
				x += 0.7
			}
			put(c)
		}
	}
	side(byRole[notation.RoleReactant])
	side(byRole[notation.RoleNone])
	// agents: measured first, then set over the arrow
	agents := byRole[notation.RoleAgent]
	width := 0.0
	for i, c := range agents {
		lo, hi := l.bounds(c)
		if i > 0 {
			width += 1
		}
		width += hi.X - lo.X
	}
	x += 0.8
	arrowLen := max(2.5, width+1)
	from := Point{x, 0}
	ax := x + (arrowLen-width)/2
	for i, c := range agents {
		lo, hi := l.bounds(c)
		if i > 0 {
			ax += 1
		}
		dx, dy := ax-lo.X, 0.6-lo.Y
		for _, a := range c {
			l.pos[a] = l.pos[a].add(Point{dx, dy})
		}
		ax += hi.X - lo.X
	}
	x += arrowLen
	l.arrows = append(l.arrows, Arrow{From: from, To: Point{x, 0}})
	x += 0.8
	side(byRole[notation.RoleProduct])
}

func (l *layout) bounds(c []int) (lo, hi Point) {
	lo = Point{math.Inf(1), math.Inf(1)}
	hi = Point{math.Inf(-1), math.Inf(-1)}
	for _, a := range c {
		p := l.pos[a]
		// an atom written out (a heteroatom, a charged or lone atom)
		// takes the room of its label
		pad := 0.0
		if at := &l.m.Atoms[a]; at.Number != notation.ElemC || at.Charge != 0 || len(l.nbr[a]) == 0 {
			pad = 0.45
		}
		lo = Point{min(lo.X, p.X-pad), min(lo.Y, p.Y)}
		hi = Point{max(hi.X, p.X+pad), max(hi.Y, p.Y)}
	}
	if len(c) == 0 {
		return Point{}, Point{}
	}
	return lo, hi
}

package identity

import "stereoline/stereo/internal/ringgeom"

// Bridgeheads fixed by their cage, as the key sees them. When two
// bridges of a small bicycle are constitutionally equal and neither
// carries a configuration, the renaming that swaps them maps the
// structure onto itself and reverses both bridgeheads at once, while
// reversing one alone would put its substituent inside the cage. So a
// bridgehead mark there tells no two compounds apart: norbornane has no
// stereoisomers, and the bridgeheads of a 9,10-dihydro-9,10-
// ethanoanthracene are fixed once its ethano carbons are configured
// (common practice). This is the labeller's rule (cageFixed in
// bridgehead.go) stated on the key graph, with the same bridge sizes, so
// that a mark the labeller reports as fixed by its cage is also left out
// of the key; identity_agree_test.go checks the two against each other.
//
// The key graph has its own copy because it answers for two callers:
// Identify, where a configuration is a mark, and Stereoisomers, where it
// is any other potential unit (the bridgeheads of an unmarked
// bicyclo[2.2.2]octane-2,6-diol must stay: its OH carbons may be
// configured, and then the bridgeheads tell two isomers apart).

// dropCageFixed returns units without the tetrahedral units at
// bridgeheads fixed by their cage; a configuration on a bridge is any
// other unit of the list or of others. rank is the constitutional rank,
// computed on demand when nil. The list is filtered in place.
func (g *keyGraph) dropCageFixed(units, others []keyUnit, rank []int) []keyUnit {
	var heads []int
	for i := range units {
		if g.headCandidate(&units[i]) {
			heads = append(heads, i)
		}
	}
	if len(heads) == 0 {
		return units
	}
	g.findRingSystems()
	configured := make([]bool, g.n)
	for _, list := range [2][]keyUnit{units, others} {
		for i := range list {
			for _, a := range unitMarkAtoms(&list[i]) {
				configured[a] = true
			}
		}
	}
	// the ranks are computed only once two bridges of equal length are
	// found: most ring fusions are no bicycle
	ranks := func() []int {
		if rank == nil {
			cs := newCanonState(g, nil, false)
			rank = cs.refine(cs.initialRanks())
		}
		return rank
	}
	drop := make([]bool, len(units))
	for _, i := range heads {
		if x := units[i].centre; g.ringDegree(x) >= 3 {
			drop[i] = g.cageFixed(x, ranks, configured)
		}
	}
	keep := units[:0]
	for i := range units {
		if !drop[i] {
			keep = append(keep, units[i])
		}
	}
	return keep
}

// headCandidate is the test that needs no rings: a tetrahedral unit on
// an atom with four ligands, three of them atoms (a bridgehead has three
// ring bonds).
func (g *keyGraph) headCandidate(u *keyUnit) bool {
	if u.kind != keyTetrahedral {
		return false
	}
	x := u.centre
	return len(g.adj[x]) >= 3 && len(g.adj[x])+g.hydro[x] == 4
}

// unitMarkAtoms lists the atoms a unit configures: the centre, the ends
// of a double bond, or an allene's centre and ends.
func unitMarkAtoms(u *keyUnit) []int {
	switch u.kind {
	case keyDoubleBond:
		return []int{u.ends[0], u.ends[1]}
	case keyAllene:
		return []int{u.centre, u.ends[0], u.ends[1]}
	}
	return []int{u.centre}
}

// ringDegree counts the ring bonds of a (findRingSystems has run).
func (g *keyGraph) ringDegree(a int) int {
	n := 0
	for _, bi := range g.mol.Atoms[a].Bonds {
		if bi >= 0 && bi < len(g.ring) && g.ring[bi] {
			n++
		}
	}
	return n
}

// cageFixed reports whether bridgehead x pairs with another bridgehead
// through three short bridges, two of which are constitutionally equal
// (same length, equal end atoms) and carry no configuration.
func (g *keyGraph) cageFixed(x int, ranks func() []int, configured []bool) bool {
	for _, y := range g.partnerHeads(x) {
		paths, ok := g.bridgePaths(x, y)
		if !ok {
			continue
		}
		for i := 0; i < 3; i++ {
			for j := i + 1; j < 3; j++ {
				pi, pj := paths[i], paths[j]
				if len(pi) != len(pj) {
					continue
				}
				if rank := ranks(); rank[pi[0]] != rank[pj[0]] || rank[pi[len(pi)-1]] != rank[pj[len(pj)-1]] {
					continue
				}
				third := paths[3-i-j]
				if !g.configuredBeside(x, y, third, pi, configured) && !g.configuredBeside(x, y, third, pj, configured) {
					return true
				}
			}
		}
	}
	return false
}

// partnerHeads lists the atoms with three or more ring bonds within
// ringgeom.MaxSmallBridge+1 ring bonds of x.
func (g *keyGraph) partnerHeads(x int) []int {
	depth := map[int]int{x: 0}
	queue := []int{x}
	var out []int
	for head := 0; head < len(queue); head++ {
		u := queue[head]
		if u != x && g.ringDegree(u) >= 3 {
			out = append(out, u)
		}
		if depth[u] > ringgeom.MaxSmallBridge {
			continue
		}
		for _, bi := range g.mol.Atoms[u].Bonds {
			if !g.ring[bi] {
				continue
			}
			v := g.mol.Bonds[bi].Other(u)
			if _, seen := depth[v]; !seen && !g.folded[v] {
				depth[v] = depth[u] + 1
				queue = append(queue, v)
			}
		}
	}
	return out
}

// bridgePaths finds three atom-disjoint paths between x and y, not
// bonded to each other, each of one to ringgeom.MaxSmallBridge atoms and leaving
// x through a ring bond; each path lists its atoms from x's side.
func (g *keyGraph) bridgePaths(x, y int) ([3][]int, bool) {
	var out [3][]int
	if len(g.adj[x]) < 3 || len(g.adj[y]) < 3 || g.mol.BondBetween(x, y) >= 0 {
		return out, false
	}
	used := map[int]bool{x: true, y: true}
	n := 0
	for _, bi := range g.mol.Atoms[x].Bonds {
		s := g.mol.Bonds[bi].Other(x)
		if !g.ring[bi] || used[s] {
			continue
		}
		path := g.shortPath(s, y, used, ringgeom.MaxSmallBridge)
		if path == nil {
			continue
		}
		if n == 3 {
			return out, false
		}
		for _, a := range path {
			used[a] = true
		}
		out[n] = path
		n++
	}
	return out, n == 3
}

// shortPath returns the atoms of a shortest path from s to a neighbour
// of t, t left out, avoiding used atoms and at most limit atoms long.
func (g *keyGraph) shortPath(s, t int, used map[int]bool, limit int) []int {
	prev := map[int]int{s: -1}
	depth := map[int]int{s: 1}
	queue := []int{s}
	for head := 0; head < len(queue); head++ {
		u := queue[head]
		if g.mol.BondBetween(u, t) >= 0 {
			path := make([]int, depth[u])
			for a, i := u, depth[u]-1; a != -1; a, i = prev[a], i-1 {
				path[i] = a
			}
			return path
		}
		if depth[u] >= limit {
			continue
		}
		for _, e := range g.adj[u] {
			if _, seen := prev[e.to]; seen || used[e.to] || e.to == t {
				continue
			}
			prev[e.to], depth[e.to] = u, depth[u]+1
			queue = append(queue, e.to)
		}
	}
	return nil
}

// configuredBeside reports whether a configured atom lies on the bridge
// path or on anything attached to it, searching without passing x, y or
// the atoms of the bridge other. A search that runs round into the
// remaining bridge counts it too, which can only keep a unit.
func (g *keyGraph) configuredBeside(x, y int, other, path []int, configured []bool) bool {
	seen := map[int]bool{x: true, y: true}
	for _, a := range other {
		seen[a] = true
	}
	var queue []int
	for _, a := range path {
		if !seen[a] {
			seen[a] = true
			queue = append(queue, a)
		}
	}
	for head := 0; head < len(queue); head++ {
		u := queue[head]
		if configured[u] {
			return true
		}
		for _, e := range g.adj[u] {
			if !seen[e.to] {
				seen[e.to] = true
				queue = append(queue, e.to)
			}
		}
	}
	return false
}

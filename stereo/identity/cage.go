// This file implements the bridgeheads the key leaves out because their
// cage fixes them.

package identity

// Bridgeheads fixed by their cage, as the key sees them
// (ringgeom.Graph.CageFixed), so that a mark the labeller reports as
// fixed by its cage (cageFixed in stereo/bridgehead.go, the same test
// over the same searches) is also left out of the key;
// agree_test.go checks the two against each other. The key pairs a
// bridgehead with every partner within reach, where the labeller pairs
// only atoms that can hold a configuration: the key answers for two
// callers, Identify, where a configuration is a mark, and Stereoisomers,
// where it is any other potential unit (the bridgeheads of an unmarked
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
	// a bridgehead has three ring bonds: without one, no smallest rings
	// are needed
	ring, bridged := g.ringBonds(), false
	for _, i := range heads {
		n := 0
		for _, bi := range g.mol.Atoms[units[i].centre].Bonds {
			if bi >= 0 && bi < len(ring) && ring[bi] {
				n++
			}
		}
		bridged = bridged || n >= 3
	}
	if !bridged {
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
		if x := units[i].centre; g.geom.RingDegree(x) >= 3 {
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

// cageFixed reports whether bridgehead x pairs with another bridgehead
// through three short bridges, two of which are constitutionally equal
// (same length, equal end atoms on ranks) and carry no configuration.
func (g *keyGraph) cageFixed(x int, ranks func() []int, configured []bool) bool {
	same := func(a, b int) bool { r := ranks(); return r[a] == r[b] }
	isConfigured := func(a int) bool { return configured[a] }
	for _, y := range g.geom.PartnerHeads(x) {
		if paths, ok := g.geom.BridgePaths(x, y); ok && g.geom.CageFixed(x, y, paths, same, isConfigured) {
			return true
		}
	}
	return false
}

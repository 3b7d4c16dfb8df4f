// This file implements spiro centres in the key.

package identity

import "stereoline/stereo"

// Spiro centres. The atom two rings share has its four ligands on ring
// bonds, two in each ring. When the two ligands in each ring differ but
// match the two in the other ring (spiro[4.4]nonane-1,6-dione: a C=O and
// a CH2 on each side), the centre ties by constitution, yet it is
// stereogenic on its own: the spirane is axially chiral (common
// practice). Its parity exists once the tie between the two rings is
// broken, and does not depend on which ring is taken first, since
// exchanging the rings exchanges both pairs, an even permutation. When
// each ring is symmetric about the centre (spiro[3.3]heptane), the
// centre is stereogenic only together with units in the rings, as the
// axially chiral 2,6-dichlorospiro[3.3]heptane shows (common practice):
// it is then a ring unit that needs a partner in its ring system.

// spiroShape reports whether tetrahedral atom a with these ligands is a
// spiro centre whose ligands tie on rank, and whether it is stereogenic
// alone (the ligands of each ring differ, and match the other ring's).
func (g *keyGraph) spiroShape(a int, ligands []int, rank []int) (alone, ok bool) {
	if len(ligands) != 4 {
		return false, false
	}
	g.findRingSystems()
	m := g.mol
	for _, x := range ligands {
		if x == stereo.ImplicitNeighbour {
			return false, false
		}
		if bi := m.BondBetween(a, x); bi < 0 || !g.ring[bi] {
			return false, false
		}
	}
	// which ligands each ring holds: those joined without passing a
	ring := g.ringsAround(a, ligands)
	if ring == nil {
		return false, false
	}
	var mate [4]int // the other ligand of the same ring
	for i := range ligands {
		for j := range ligands {
			if i != j && ring[i] == ring[j] {
				mate[i] = j
			}
		}
	}
	r := func(i int) int { return rank[ligands[i]] }
	tiesAcross, tiesWithin := 0, 0
	for i := 0; i < 4; i++ {
		for j := i + 1; j < 4; j++ {
			if r(i) != r(j) {
				continue
			}
			if ring[i] == ring[j] {
				tiesWithin++
			} else {
				tiesAcross++
			}
		}
	}
	switch {
	case tiesWithin == 0 && tiesAcross == 2:
		// each ligand matches one in the other ring, its mate another
		return r(0) != r(mate[0]), true
	case tiesWithin == 2 && tiesAcross == 0, tiesWithin == 2 && tiesAcross == 4:
		// each ring symmetric about the centre, the rings alike or not
		return false, true
	}
	return false, false
}

// ringsAround splits the four ligands of a into the two groups that are
// joined without passing a, two in each; nil when they do not split so
// (a fused or bridged system, not a spiro one). ring[i] is 0 or 1.
func (g *keyGraph) ringsAround(a int, ligands []int) []int {
	ring := []int{-1, -1, -1, -1}
	groups := 0
	for i, x := range ligands {
		if ring[i] >= 0 {
			continue
		}
		if groups == 2 {
			return nil
		}
		reach := g.reachableAvoiding(x, a)
		n := 0
		for j, y := range ligands {
			if reach[y] {
				ring[j] = groups
				n++
			}
		}
		if n != 2 {
			return nil
		}
		groups++
	}
	return ring
}

// reachableAvoiding marks the atoms reachable from s without passing
// avoid.
func (g *keyGraph) reachableAvoiding(s, avoid int) []bool {
	seen := make([]bool, g.n)
	seen[avoid], seen[s] = true, true
	queue := []int{s}
	for head := 0; head < len(queue); head++ {
		for _, e := range g.adj[queue[head]] {
			if !seen[e.to] {
				seen[e.to] = true
				queue = append(queue, e.to)
			}
		}
	}
	seen[avoid] = false
	return seen
}

// keepSpiros keeps the spiro centres between two symmetric rings that
// have a kept ring unit on each side, once the ring units are chosen.
func (c *canonState) keepSpiros(spiros []int) {
	for _, i := range spiros {
		u := &c.units[i]
		ring := c.g.ringsAround(u.centre, u.ligands)
		if ring == nil {
			continue
		}
		var side [2]bool
		for s := 0; s < 2; s++ {
			first := 0
			for ring[first] != s {
				first++
			}
			reach := c.g.reachableAvoiding(u.ligands[first], u.centre)
			for j := range c.units {
				if !c.ring[j] || !c.keep[j] {
					continue
				}
				for _, a := range unitMarkAtoms(&c.units[j]) {
					if reach[a] {
						side[s] = true
					}
				}
			}
		}
		if side[0] && side[1] {
			c.keep[i], c.ring[i] = true, true
		}
	}
}

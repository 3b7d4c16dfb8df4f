// This file implements exocyclic double bonds and allenes stereogenic
// together with a ring atom.

package identity

import "stereoline/stereo"

// Exocyclic double bonds stereogenic together with a ring atom. A double
// bond leaving a ring from an atom whose two ring branches are
// constitutionally equal has no parity of its own, yet with a second
// such unit on the ring it has: (4-methylcyclohexylidene)acetic acid is
// axially chiral and exists as two enantiomers (common practice), the
// ring carbon's hydrogen and the far end's higher substituent lying on
// one side or the other. The key keeps such a bond the way it keeps the
// ring carbons of 1,4-disubstituted cyclohexanes: as a ring unit whose
// parity exists once the tie between the ring branches is broken. The
// labeller pairs the same bonds (exoPaired in together.go): a plain
// double bond off the ring, the ring end with no hydrogen and two ring
// branches, the far end with two different ligands.

// exocyclicCandidate reports whether double-bond unit u is such a bond:
// on these ranks the two ring branches at one end tie and the far end
// does not. It returns the ring system of the ring end.
func (c *canonState) exocyclicCandidate(u *keyUnit, rank []int) (int, bool) {
	g := c.g
	if u.bond < 0 {
		return 0, false
	}
	g.findRingSystems()
	b := &g.mol.Bonds[u.bond]
	if g.ring[u.bond] || !(b.Begin == u.ends[0] && b.End == u.ends[1] || b.Begin == u.ends[1] && b.End == u.ends[0]) {
		return 0, false // a ring bond, or the middle of a cumulene
	}
	for e := 0; e < 2; e++ {
		r, o := u.ends[e], u.ends[1-e]
		if g.system[r] < 0 || g.hydro[r] != 0 {
			continue
		}
		subs := g.substituents(r, o)
		if len(subs) != 2 || rank[subs[0]] != rank[subs[1]] {
			continue
		}
		if !g.ring[g.mol.BondBetween(r, subs[0])] || !g.ring[g.mol.BondBetween(r, subs[1])] {
			continue
		}
		if _, ok := c.topSubstituent(o, r, rank); ok {
			return g.system[r], true
		}
	}
	return 0, false
}

// exocyclicAllene is exocyclicCandidate for an allene one of whose
// terminal atoms is the ring atom: its two ligands there are ring
// branches that tie, and the two at the far end do not. Such an allene
// with a ring centre opposite is stereogenic together with it, as an
// exocyclic double bond is, though the pair is achiral: the far end's
// ligands lie in the ring's mirror plane, so the two forms are
// diastereomers (worked by hand; the labeller gives them lowercase
// descriptors).
func (c *canonState) exocyclicAllene(u *keyUnit, rank []int) (int, bool) {
	g := c.g
	if len(u.ligands) != 4 || len(u.ligEnd) != 4 {
		return 0, false
	}
	g.findRingSystems()
	var at [2][]int
	for i, x := range u.ligands {
		at[u.ligEnd[i]] = append(at[u.ligEnd[i]], x)
	}
	if len(at[0]) != 2 || len(at[1]) != 2 {
		return 0, false
	}
	for e := 0; e < 2; e++ {
		r, ring, far := u.ends[e], at[e], at[1-e]
		if g.system[r] < 0 || ring[0] == stereo.ImplicitNeighbour || ring[1] == stereo.ImplicitNeighbour || rank[ring[0]] != rank[ring[1]] {
			continue
		}
		if !g.ring[g.mol.BondBetween(r, ring[0])] || !g.ring[g.mol.BondBetween(r, ring[1])] {
			continue
		}
		if ligandRank(rank, far[0]) != ligandRank(rank, far[1]) {
			return g.system[r], true
		}
	}
	return 0, false
}

// ringLink reports whether double-bond unit u joins two ring systems,
// each end a ring atom whose two ring branches tie: the central bond of
// a 4,4'-disubstituted bicyclohexylidene. Such a bond is stereogenic
// only with a ring unit on each side (the two ring substituents then lie
// in one mirror plane, on the same or on opposite sides of the bond's
// plane: two achiral diastereomers, worked by hand), so it joins the two
// systems into one for chooseUnits. It returns the two ring systems.
func (c *canonState) ringLink(u *keyUnit, rank []int) (int, int, bool) {
	g := c.g
	if u.kind != keyDoubleBond || u.bond < 0 {
		return 0, 0, false
	}
	g.findRingSystems()
	b := &g.mol.Bonds[u.bond]
	if g.ring[u.bond] || !(b.Begin == u.ends[0] && b.End == u.ends[1] || b.Begin == u.ends[1] && b.End == u.ends[0]) {
		return 0, 0, false
	}
	for e := 0; e < 2; e++ {
		r, o := u.ends[e], u.ends[1-e]
		if g.system[r] < 0 || g.hydro[r] != 0 {
			return 0, 0, false
		}
		subs := g.substituents(r, o)
		if len(subs) != 2 || rank[subs[0]] != rank[subs[1]] ||
			!g.ring[g.mol.BondBetween(r, subs[0])] || !g.ring[g.mol.BondBetween(r, subs[1])] {
			return 0, 0, false
		}
	}
	return g.system[u.ends[0]], g.system[u.ends[1]], true
}

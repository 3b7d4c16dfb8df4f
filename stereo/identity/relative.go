// This file implements the cis/trans relation between two ring units.

package identity

import "slices"

// The relation between two ring units. The two ring carbons of
// cis-1,4-dimethylcyclohexane have no parity of their own, only one
// relative to a broken tie, so their configurations cannot tell other
// atoms apart as ordinary parities do. Yet whether the pair is cis or
// trans is a fact about the structure, and it can: in
// 1,3-bis(4-methylcyclohexyl)propan-2-ol with one cis and one trans ring
// the central carbon is a stereocentre, its two branches differing as a
// cis and a trans ring do, and the compound is chiral (worked by hand;
// the labeller gives the centre R or S). So the relation enters the
// invariants: the
// product of the two parities is found after breaking ties on a trial
// order, and does not depend on which atom of a tied class goes first,
// since exchanging the two ring branches reverses both parities. Only
// a ring system with exactly two ring units on one smallest ring is
// related so: there the branches of one are tied to those of the other
// through the ring. Larger groups (three units, a spiro centre between
// two rings) are left as they were.

// relatedCode is the invariant of one relation: cis-like and trans-like
// pairs get different codes, and no other stereo code reaches them.
const relatedCode = 256

// relateRingPairs adds the relation of every pair of ring units that
// qualifies to the invariants of their atoms, and reports whether it
// added any.
func (c *canonState) relateRingPairs(rank []int) bool {
	if c.ringRoot == nil {
		return false
	}
	bySystem := map[int][]int{}
	var roots []int
	for i := range c.units {
		if r := c.ringRoot[i]; r >= 0 && c.keep[i] {
			if _, ok := bySystem[r]; !ok {
				roots = append(roots, r)
			}
			bySystem[r] = append(bySystem[r], i)
		}
	}
	slices.Sort(roots)
	var pairs [][]int
	var members []int
	for _, r := range roots {
		if pair := bySystem[r]; len(pair) == 2 && c.onOneRing(pair[0], pair[1]) {
			pairs = append(pairs, pair)
			members = append(members, pair...)
		}
	}
	if len(pairs) == 0 {
		return false
	}
	// one trial order serves every pair: each product is the same on
	// any order
	p := c.trialParities(rank, members)
	added := false
	for _, pair := range pairs {
		p0, p1 := p[pair[0]], p[pair[1]]
		if p0 == 0 || p1 == 0 {
			continue
		}
		if c.related == nil {
			c.related = make([]int, c.g.n)
		}
		if c.relation == nil {
			c.relation = make([]int, len(c.units))
		}
		for _, k := range pair {
			for _, a := range unitMarkAtoms(&c.units[k]) {
				c.related[a] += relatedCode * (2 + p0*p1)
			}
			c.relation[k] = p0 * p1
		}
		added = true
	}
	return added
}

// onOneRing reports whether some smallest ring holds an atom of each
// of the two units.
func (c *canonState) onOneRing(i, j int) bool {
	g := c.g
	ai, aj := unitMarkAtoms(&c.units[i]), unitMarkAtoms(&c.units[j])
	for _, ring := range g.smallestRings().SSSR {
		hi, hj := false, false
		for _, a := range ring.Atoms {
			hi = hi || slices.Contains(ai, a)
			hj = hj || slices.Contains(aj, a)
		}
		if hi && hj {
			return true
		}
	}
	return false
}

// trialParities breaks ties, each time moving the first atom of the
// lowest tied class ahead, until every unit listed has a parity, and
// returns the parity of each unit by index (0 for units that had none
// when the order became total).
func (c *canonState) trialParities(rank []int, list []int) map[int]int {
	out := map[int]int{}
	for step := 0; step <= len(c.atoms); step++ {
		done := true
		for _, i := range list {
			out[i] = int(c.parity(&c.units[i], rank))
			done = done && out[i] != 0
		}
		if done || c.classes(rank) == len(c.atoms) {
			break
		}
		low, members := c.lowestTie(rank)
		rank = c.moveAhead(rank, low, members[0])
	}
	return out
}

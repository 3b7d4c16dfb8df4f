// This file implements the aromaticity the key sees: rings written in
// Kekulé form recognised by the Hückel rule.

package identity

import (
	"stereoline/notation"
)

// Aromatic rings for the key. Benzene may be written c1ccccc1 or
// C1=CC=CC=C1, and the reader keeps what was written; the key must not
// see the difference. Rings written in Kekulé form are therefore
// recognised here by the Hückel rule over the smallest rings (common
// practice): a five- or six-membered ring whose atoms each give one π
// electron (a double bond inside the ring, or inside a fused ring
// already found aromatic), two (a nitrogen with three neighbours or a
// hydrogen, an oxygen or sulfur, none of them double-bonded) or none (a
// carbon with an exocyclic double bond to O, N or S, as in pyridones),
// with 4n+2 in all. Fused rings are taken up repeatedly until nothing
// changes, then pairs of fused rings as one system. A ring written
// aromatic stays aromatic. Bonds written aromatic
// that lie on no ring (the implied bond of c1ccccc1c1ccccc1) are single.

// aromaticity marks the aromatic atoms and bonds of the key graph.
func (g *keyGraph) aromaticity() (atoms, bonds []bool) {
	m := g.mol
	atoms = make([]bool, g.n)
	bonds = make([]bool, len(m.Bonds))
	anyKekule := false
	for a := range m.Atoms {
		atoms[a] = m.Atoms[a].Aromatic
	}
	for bi := range m.Bonds {
		if m.Bonds[bi].Order == notation.OrderDouble {
			anyKekule = true
		}
	}
	hasAromatic := false
	for bi := range m.Bonds {
		if m.Bonds[bi].Order == notation.OrderAromatic {
			hasAromatic = true
		}
	}
	if !anyKekule && !hasAromatic {
		return atoms, bonds
	}
	inRing := g.ringBonds()
	for bi := range m.Bonds {
		bonds[bi] = m.Bonds[bi].Order == notation.OrderAromatic && inRing[bi]
	}
	if !anyKekule || shortcuts && !g.kekuleRingPossible(bonds) {
		// only which bonds lie on a ring matters: no smallest rings
		return atoms, bonds
	}
	rings := g.smallestRings()
	done := make([]bool, len(rings.SSSR))
	for changed := true; changed; {
		changed = false
		for ri, r := range rings.SSSR {
			if done[ri] || r.Size() < 5 || r.Size() > 7 {
				continue
			}
			if g.huckel(r, bonds) {
				done[ri], changed = true, true
				for _, a := range r.Atoms {
					atoms[a] = true
				}
				for _, bi := range r.Bonds {
					bonds[bi] = true
				}
			}
		}
	}
	// fused systems whose rings fail one by one but pass together
	// (indolizine, quinoid dyes): pairs of rings sharing a bond, taken
	// as one π system
	rs := rings.SSSR
	for changed := true; changed; {
		changed = false
		for i := range rs {
			for j := i + 1; j < len(rs); j++ {
				if (done[i] && done[j]) || !shareBond(rs[i], rs[j]) || rs[i].Size() > 7 || rs[j].Size() > 7 {
					continue
				}
				u := unionRing(rs[i], rs[j])
				if g.huckel(u, bonds) {
					done[i], done[j], changed = true, true, true
					for _, a := range u.Atoms {
						atoms[a] = true
					}
					for _, bi := range u.Bonds {
						bonds[bi] = true
					}
				}
			}
		}
	}
	return atoms, bonds
}

func shareBond(a, b notation.Ring) bool {
	for _, x := range a.Bonds {
		for _, y := range b.Bonds {
			if x == y {
				return true
			}
		}
	}
	return false
}

// unionRing joins two fused rings into one atom and bond set (the order
// of the atoms does not matter to huckel).
func unionRing(a, b notation.Ring) notation.Ring {
	var u notation.Ring
	seenA, seenB := map[int]bool{}, map[int]bool{}
	for _, r := range []notation.Ring{a, b} {
		for _, x := range r.Atoms {
			if !seenA[x] {
				seenA[x] = true
				u.Atoms = append(u.Atoms, x)
			}
		}
		for _, x := range r.Bonds {
			if !seenB[x] {
				seenB[x] = true
				u.Bonds = append(u.Bonds, x)
			}
		}
	}
	return u
}

// huckel counts the π electrons of ring r and applies 4n+2.
func (g *keyGraph) huckel(r notation.Ring, aromaticBond []bool) bool {
	m := g.mol
	inRing := map[int]bool{}
	for _, a := range r.Atoms {
		inRing[a] = true
	}
	electrons := 0
	allAromatic := true
	for _, a := range r.Atoms {
		at := &m.Atoms[a]
		if !at.Aromatic {
			allAromatic = false
		}
		e, ok := g.piElectrons(a, inRing, aromaticBond)
		if !ok {
			return false
		}
		electrons += e
	}
	if allAromatic {
		return true
	}
	return electrons%4 == 2
}

// piElectrons is what atom a gives to the π system of a ring.
func (g *keyGraph) piElectrons(a int, inRing map[int]bool, aromaticBond []bool) (int, bool) {
	m := g.mol
	at := &m.Atoms[a]
	if at.Aromatic {
		if at.Number == notation.ElemC || at.HydrogenCount() == 0 && len(at.Bonds) == 2 {
			return 1, true
		}
		return 2, true
	}
	doubles, exo := 0, false
	for _, bi := range at.Bonds {
		b := &m.Bonds[bi]
		if b.Order != notation.OrderDouble {
			continue
		}
		doubles++
		x := b.Other(a)
		switch {
		case inRing[x], aromaticBond[bi]:
		default:
			switch m.Atoms[x].Number {
			case notation.ElemO, notation.ElemN, notation.ElemS:
				exo = true
			default:
				return 0, false
			}
		}
	}
	switch {
	case doubles == 1 && exo:
		return 0, at.Number == notation.ElemC
	case doubles == 1:
		return 1, true
	case doubles > 1:
		return 0, false
	}
	if at.Charge != 0 {
		return 0, false
	}
	switch at.Number {
	case notation.ElemN:
		return 2, len(at.Bonds)+g.hydro[a] == 3
	case notation.ElemO, notation.ElemS, notation.ElemSe:
		return 2, len(at.Bonds)+g.hydro[a] == 2
	}
	return 0, false
}

// cyclicBonds marks the bonds that lie on a ring (notation.CyclicBonds),
// as the reader found them; the slice is shared and not changed.
func cyclicBonds(m *notation.Molecule) []bool {
	return m.RingBonds()
}

// kekuleRingPossible reports whether the Hückel tests of aromaticity
// could change anything: whether some ring holds only atoms that can
// give π electrons (piElectrons, taken generously: an aromatic atom, one
// double bond, a neutral N, O, S or Se) and a non-aromatic atom or bond.
// A ring that passes marks its atoms and bonds aromatic, which changes
// nothing when they are already; the rings of the atoms that can give
// electrons are the cycles of the graph those atoms span.
func (g *keyGraph) kekuleRingPossible(aromaticBond []bool) bool {
	m := g.mol
	able := make([]bool, g.n)
	for a := range m.Atoms {
		at := &m.Atoms[a]
		doubles := 0
		for _, bi := range at.Bonds {
			if bi >= 0 && bi < len(m.Bonds) && m.Bonds[bi].Order == notation.OrderDouble {
				doubles++
			}
		}
		switch {
		case at.Aromatic, doubles == 1:
			able[a] = true
		case doubles > 1 || at.Charge != 0:
		default:
			switch at.Number {
			case notation.ElemN, notation.ElemO, notation.ElemS, notation.ElemSe:
				able[a] = true
			}
		}
	}
	// the cycles of the atoms that can give electrons are cycles of the
	// whole graph: when every ring bond between two of them is aromatic
	// already, they need not be found
	candidate := false
	for bi, on := range g.ringBonds() {
		b := &m.Bonds[bi]
		if on && able[b.Begin] && able[b.End] && (!aromaticBond[bi] || !m.Atoms[b.Begin].Aromatic || !m.Atoms[b.End].Aromatic) {
			candidate = true
			break
		}
	}
	if !candidate {
		return false
	}
	cyc := notation.CyclicBonds(m, func(b *notation.Bond) bool { return able[b.Begin] && able[b.End] })
	for bi, on := range cyc {
		if b := &m.Bonds[bi]; on && (!aromaticBond[bi] || !m.Atoms[b.Begin].Aromatic || !m.Atoms[b.End].Aromatic) {
			return true
		}
	}
	return false
}

// ringBonds returns which bonds lie on a ring (the ring field once
// findRingSystems ran, else cyclicBonds, kept): the searches that need
// no smallest rings ask it.
func (g *keyGraph) ringBonds() []bool {
	if g.ring != nil {
		return g.ring
	}
	if g.cyclic == nil {
		g.cyclic = cyclicBonds(g.mol)
	}
	return g.cyclic
}

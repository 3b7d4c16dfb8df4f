// This file implements the units stereogenic only together: ring pairs,
// exocyclic double bonds, spiro relays.

package stereo

import (
	"slices"

	"stereoline/notation"
	"stereoline/stereo/internal/ringgeom"
)

// Units stereogenic only together. A ring atom whose two ring branches
// are constitutionally equal is no stereocentre on its own, yet two such
// atoms on one ring are: cis- and trans-1,4-dimethylcyclohexane differ.
// The same holds for a ring atom carrying an exocyclic double bond whose
// far end has two different ligands (the axially chiral
// 4-methylcyclohexylideneacetic acid; common practice). A mark on one
// member alone says nothing until its partner is marked too, so such a
// mark is not reported as ineffective: its unmarked partner is reported
// as undefined instead.

// member is one ring atom that may be stereogenic together with another.
type member struct {
	atom int // the ring atom
	// bond is the exocyclic double bond, -1 for a tetrahedral centre;
	// other is its atom off the ring
	bond, other int
	// marked members carry marks that decide nothing alone
	marked bool
	// relay members are spiro atoms: two pairs of equal ring branches,
	// one pair in each of two ring systems, which pass the relation
	// between members on either side (spiro[3.3]heptane-2,6-diyl)
	relay bool
	tetra *tetraConfig
	bondc *bondConfig
	lb    label
}

// ringPaired reports whether atom a has exactly one pair of
// constitutionally equal ligands and both lie on ring bonds.
func (l *labeller) ringPaired(a int) bool {
	_, pairInRing := ligandClasses(l.g, a, l.classes)
	return pairInRing
}

// exoPaired reports whether double bond bi leaves a ring from an atom
// whose two ring branches are equal, towards an atom with two different
// ligands, and returns the ring atom and the other end.
func (l *labeller) exoPaired(bi int) (ring, other int, ok bool) {
	g := l.g
	if bi < 0 || bi >= len(g.mol.Bonds) {
		return 0, 0, false
	}
	b := &g.mol.Bonds[bi]
	if g.ringBond[bi] || bondOrder(b) != 2 || b.Order == notation.OrderAromatic {
		return 0, 0, false
	}
	for _, ends := range [2][2]int{{b.Begin, b.End}, {b.End, b.Begin}} {
		r, o := ends[0], ends[1]
		if g.hyd[r] != 0 || len(g.adj[r]) != 3 || g.cumulated(r) || g.cumulated(o) {
			continue
		}
		var pair [2]int
		n := 0
		for _, e := range g.adj[r] {
			if e.bond == bi {
				continue
			}
			if !g.ringBond[e.bond] || n == 2 {
				n = -1
				break
			}
			pair[n] = e.to
			n++
		}
		if n != 2 || l.classes.of(pair[0]) != l.classes.of(pair[1]) {
			continue
		}
		if end, ok := bondEnd(g, o, r); ok && end.distinct(l.classes) {
			return r, o, true
		}
	}
	return 0, 0, false
}

// together joins the members that share a ring system (joinMembers) and
// reports them: unmarked
// members as undefined, marked ones as units whose configuration is
// still open. Members left without a partner get the diagnostics a mark
// that decides nothing gets.
func (l *labeller) together(members []member, report func(notation.Span, string)) {
	g := l.g
	// a bridgehead fixed by its cage has no configuration to pair
	kept := members[:0]
	for _, m := range members {
		if m.bond >= 0 || !l.cageFixed(m.atom) {
			kept = append(kept, m)
		}
	}
	members = kept
	joined := l.joinMembers(members)
	for i, m := range members {
		switch {
		case !joined[i] && m.marked:
			l.alone(m)
		case !joined[i] && m.relay:
		case !joined[i]:
			l.unjoined = append(l.unjoined, m.atom)
		case m.marked && m.bond < 0:
			l.res.Units = append(l.res.Units, Unit{Kind: KindTetrahedral, Atoms: []int{m.atom}, Centre: m.atom, Bond: -1,
				Ranked: m.lb.ranked, Decisions: m.lb.decisions, Marks: []notation.Span{m.tetra.span}})
		case m.marked:
			c := m.bondc
			l.res.Units = append(l.res.Units, Unit{Kind: KindDoubleBond, Atoms: []int{c.ends[0], c.ends[1]}, Centre: -1, Bond: c.bond,
				Ranked: m.lb.ranked, Decisions: m.lb.decisions, Marks: c.spans})
		case m.bond < 0:
			if l.unitAtoms[m.atom] {
				continue
			}
			l.unitAtoms[m.atom] = true
			l.res.Units = append(l.res.Units, l.unspecifiedCentre(m.atom))
			if m.relay {
				report(g.mol.Atoms[m.atom].Span, "spiro atom stereogenic together with ring atoms on both sides, without a configuration")
			} else {
				report(g.mol.Atoms[m.atom].Span, "stereocentre (together with another ring atom) without a configuration")
			}
		default:
			if l.unitBonds[m.bond] {
				continue
			}
			l.unitBonds[m.bond] = true
			// the atoms in bond order, as a marked bond gives them
			b := &g.mol.Bonds[m.bond]
			l.res.Units = append(l.res.Units, l.unspecifiedBond(b.Begin, b.End, m.bond))
			report(g.mol.Bonds[m.bond].Span, "stereogenic double bond (together with a ring atom) without a configuration")
		}
	}
}

// joinMembers says which members are stereogenic together: those that
// share a ring system with another non-relay member, directly or
// through spiro atoms (relays) that link their ring systems. A ring
// system here is a set of rings sharing bonds; the two rings of a spiro
// atom are two systems.
func (l *labeller) joinMembers(members []member) []bool {
	joined := make([]bool, len(members))
	if len(members) < 2 {
		return joined
	}
	block := l.ringBlocks()
	// groups of ring systems (named by a bond of each), merged through
	// the relays
	sets := ringgeom.NewDisjointSets(len(block))
	blocksOf := func(a int) []int {
		var out []int
		for _, e := range l.g.adj[a] {
			if b := block[e.bond]; b >= 0 && !slices.Contains(out, b) {
				out = append(out, b)
			}
		}
		return out
	}
	for _, m := range members {
		if m.relay {
			if bs := blocksOf(m.atom); len(bs) == 2 {
				sets.Union(bs[0], bs[1])
			}
		}
	}
	count := map[int]int{}
	for _, m := range members {
		if !m.relay {
			for _, b := range blocksOf(m.atom) {
				count[sets.Find(b)]++
			}
		}
	}
	for i, m := range members {
		for _, b := range blocksOf(m.atom) {
			if count[sets.Find(b)] >= 2 {
				joined[i] = true
			}
		}
	}
	return joined
}

// ringBlocks numbers, per bond, the ring system the bond lies in (-1
// off rings): the smallest rings through each bond, merged where they
// share a bond.
func (l *labeller) ringBlocks() []int {
	if l.blocks != nil {
		return l.blocks
	}
	g := l.g
	nb := len(g.mol.Bonds)
	sets := ringgeom.NewDisjointSets(nb)
	for _, ring := range g.smallRings() {
		first := -1
		for i := range ring {
			bi := g.mol.BondBetween(ring[i], ring[(i+1)%len(ring)])
			if bi < 0 {
				continue
			}
			if first < 0 {
				first = bi
				continue
			}
			sets.Union(bi, first)
		}
	}
	out := make([]int, nb)
	for bi := range out {
		out[bi] = -1
		if g.ringBond[bi] {
			out[bi] = sets.Find(bi)
		}
	}
	l.blocks = out
	return out
}

// spiroRelay reports whether atom a is a spiro atom whose four ring
// ligands form two pairs of constitutionally equal branches, each pair
// in one of its two ring systems.
func (l *labeller) spiroRelay(a int) bool {
	equal, ok := l.spiroSides(a)
	return ok && equal == 2
}

// spiroAxial reports whether atom a is a spiro atom whose two ring
// systems each hold two ligands of different classes: then the four
// ligands are arranged like those of an allene, and the atom is
// stereogenic whatever symmetry relates one ring to the other.
func (l *labeller) spiroAxial(a int) bool {
	equal, ok := l.spiroSides(a)
	return ok && equal == 0
}

// spiroSides reports whether atom a is a spiro atom, four ring ligands
// two in each of two ring systems, and in how many of the two systems
// its two ligands are constitutionally equal.
func (l *labeller) spiroSides(a int) (equal int, ok bool) {
	g := l.g
	if len(g.adj[a]) != 4 || g.hyd[a] != 0 || g.geom.RingDegree(a) != 4 || g.doubleBonds(a) > 0 {
		return 0, false
	}
	block := l.ringBlocks()
	adj := g.adj[a]
	for i, e := range adj {
		partners := 0
		for j, f := range adj {
			if i != j && block[f.bond] == block[e.bond] {
				partners++
				if j > i && l.classes.of(f.to) == l.classes.of(e.to) {
					equal++
				}
			}
		}
		if partners != 1 {
			return 0, false
		}
	}
	return equal, true
}

// alone reports the marks of a member that found no partner.
func (l *labeller) alone(m member) {
	if m.bond < 0 {
		l.warn(m.tetra.span, CodeIneffectiveCenter, "mark on an atom that is not a stereocentre: two of its ligands are the same")
		return
	}
	l.warnQuietBond(m.bondc)
}

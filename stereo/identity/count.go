// This file implements the count of the stereoisomers a constitution
// allows.

package identity

import (
	"stereoline/notation"
	"stereoline/stereo"
	"stereoline/stereo/internal/ringgeom"
)

// Counting the stereoisomers a constitution allows. Each potential unit
// can take two configurations, so n units give at most 2^n isomers;
// symmetry makes some assignments the same structure (a meso form is its
// own mirror image, so (R,S)- and (S,R)-tartaric acid are one isomer) and
// makes some units stereogenic only in some assignments (the central
// carbon of 2,3,4-trihydroxyglutaric acid is a stereocentre only when
// its neighbours differ in configuration). Both are handled by
// enumerating the assignments and counting distinct keys. The two
// bridgeheads of a small bicycle allow one relative configuration only;
// assignments that break it are skipped (bicycle.go), and
// bridgeheads whose cage fixes them are no units at all
// (cage.go). Other constraints that need 3D are not seen.

// maxEnumeratedUnits bounds the enumeration at 2^12 keys; past it the
// count is the upper bound 2^n.
const maxEnumeratedUnits = 12

// StereoisomerCount is the result of Stereoisomers.
type StereoisomerCount struct {
	Count int // distinct stereoisomers
	Units int // potential stereogenic units found
	// Exact is false when there were too many units to enumerate and
	// Count is the upper bound 2^Units.
	Exact bool
}

// Stereoisomers counts the stereoisomers of m's constitution, ignoring
// its marks.
func Stereoisomers(m *notation.Molecule) StereoisomerCount {
	if m == nil || len(m.Atoms) == 0 {
		return StereoisomerCount{Count: 1, Exact: true}
	}
	g := newKeyGraph(m)
	units, rank := potentialUnits(g)
	n := len(units)
	if n > maxEnumeratedUnits {
		return StereoisomerCount{Count: 1 << min(n, 62), Units: n}
	}
	// A unit whose atoms no symmetry of the constitution can move (each
	// has a rank no other atom has) keeps its configuration under every
	// symmetry, so its assignments multiply the count: the isomers are
	// the feasible assignments of the fixed units times the distinct
	// keys of the others, enumerated with the fixed ones held. A record
	// without symmetry needs no key at all, where enumerating took up to
	// 4,096 canonical runs (tens of milliseconds for a hover on a record
	// of ten units). A small bicycle whose bridgeheads fall on both sides
	// is enumerated whole.
	pairs := smallBicycles(g, units)
	fixed := make([]bool, n)
	if countWithoutKeys {
		fixed = fixedUnits(g, units, rank)
		for _, p := range pairs {
			if fixed[p.unit[0]] != fixed[p.unit[1]] {
				clear(fixed)
				break
			}
		}
	}
	var held, free []int
	var heldPairs, freePairs []bicyclePair
	for i := range units {
		if fixed[i] {
			held = append(held, i)
		} else {
			free = append(free, i)
		}
	}
	for _, p := range pairs {
		if fixed[p.unit[0]] {
			heldPairs = append(heldPairs, p)
		} else {
			freePairs = append(freePairs, p)
		}
	}
	assign := func(idx []int, mask int) {
		for k, i := range idx {
			// one sense or the other (Trans or Cis for a double bond)
			units[i].hand = ringgeom.Anticlockwise
			if mask&(1<<k) != 0 {
				units[i].hand = ringgeom.Clockwise
			}
		}
	}
	heldCount, first := 0, -1
	for mask := 0; mask < 1<<len(held); mask++ {
		assign(held, mask)
		if feasible(units, heldPairs) {
			heldCount++
			if first < 0 {
				first = mask
			}
		}
	}
	if heldCount == 0 || len(free) == 0 {
		return StereoisomerCount{Count: heldCount, Units: n, Exact: true}
	}
	assign(held, first)
	seen := map[string]bool{}
	for mask := 0; mask < 1<<len(free); mask++ {
		assign(free, mask)
		if feasible(units, freePairs) {
			seen[newCanonState(g, units, true).run().text] = true
		}
	}
	return StereoisomerCount{Count: heldCount * len(seen), Units: n, Exact: true}
}

// countWithoutKeys lets Stereoisomers take its shortcuts: units tied by
// two leaves dropped, fixed units held apart (a variable for the test
// that compares the count with the plain enumeration).
var countWithoutKeys = true

// fixedUnits reports for each unit whether every atom of it (its centre
// or ends, its ligands, the neighbours of its ends) has a rank in rank
// that no other atom of g has (folded hydrogens aside): every symmetry of
// the constitution keeps those atoms where they are, and so keeps the
// unit's configuration.
func fixedUnits(g *keyGraph, units []keyUnit, rank []int) []bool {
	count := make(map[int]int, len(rank))
	for a, r := range rank {
		if !g.folded[a] {
			count[r]++
		}
	}
	alone := func(a int) bool { return a < 0 || a >= len(rank) || g.folded[a] || count[rank[a]] == 1 }
	fixed := make([]bool, len(units))
	for i := range units {
		u := &units[i]
		ok := alone(u.centre)
		for _, l := range u.ligands {
			ok = ok && alone(l)
		}
		if u.kind != keyTetrahedral {
			for _, e := range u.ends {
				ok = ok && alone(e)
				for _, ed := range g.adj[e] {
					ok = ok && alone(ed.to)
				}
			}
		}
		fixed[i] = ok
	}
	return fixed
}

// potentialUnits finds the units that could be stereogenic: tetrahedral
// centres whose ligands differ by constitution, or tie in a way that
// stereo elsewhere or a tie-break could resolve (a ring centre, a spiro
// centre, spiro.go); double bonds outside small rings with two
// different substituents at each end, or tied ones (an exocyclic bond
// opposite a ring centre, a bond between branches that differ only in
// configuration); allenes likewise. Configurations
// are left at +1 for the caller to assign. It returns the units and the
// constitution's ranks of the atoms.
func potentialUnits(g *keyGraph) ([]keyUnit, []int) {
	m := g.mol
	cs := newCanonState(g, nil, false)
	rank := cs.refine(cs.initialRanks())
	rings := notation.FindRings(m)
	var definite, tied []keyUnit
	for a := range m.Atoms {
		if g.folded[a] {
			continue
		}
		if ends, inner, ok := g.alleneEnds(a); ok {
			u := keyUnit{kind: keyAllene, centre: a, ends: ends, hand: ringgeom.Anticlockwise, bond: -1}
			u.ligands, u.ligEnd = ringgeom.AlleneLigands(g.mol, ends, inner, true)
			switch {
			case len(u.ligands) != 4:
			case cs.parity(&u, rank) != ringgeom.NoHand:
				definite = append(definite, u)
			case oneEndTied(&u, rank):
				// an allene off a ring, stereogenic together with a
				// ring centre opposite (exocyclic.go)
				tied = append(tied, u)
			}
			continue
		}
		count, ok := tetrahedralCandidate(g, a)
		if !ok {
			continue
		}
		u := keyUnit{kind: keyTetrahedral, centre: a, hand: ringgeom.Anticlockwise, bond: -1, ligands: g.stereoOrder(a, count == 3)}
		alone, spiro := false, false
		if cs.parity(&u, rank) == ringgeom.NoHand {
			alone, spiro = g.spiroShape(a, u.ligands, rank)
		}
		switch {
		case cs.parity(&u, rank) != ringgeom.NoHand, spiro && alone:
			definite = append(definite, u)
		case spiro, oneTiedPair(u.ligands, rank) && !(countWithoutKeys && tiedLeaves(g, u.ligands, rank)):
			tied = append(tied, u)
		}
	}
	for bi := range m.Bonds {
		b := &m.Bonds[bi]
		if b.Order != notation.OrderDouble || g.folded[b.Begin] || g.folded[b.End] || g.arom[b.Begin] && g.arom[b.End] || (rings.BondInRing(bi) && rings.BondSize[bi] < ringgeom.MinTransRing) {
			continue
		}
		// an odd cumulene counts once, at its middle bond, between its
		// terminal atoms (as readDoubleBond reads its marks)
		t0, _, c0 := ringgeom.Cumulene(m, g.cumulated, b.End, b.Begin)
		t1, _, c1 := ringgeom.Cumulene(m, g.cumulated, b.Begin, b.End)
		if c0 != c1 || t0 == t1 {
			continue
		}
		u := keyUnit{kind: keyDoubleBond, centre: -1, ends: [2]int{t0, t1}, bond: bi, hand: ringgeom.Trans}
		ok := true
		for e := 0; e < 2 && ok; e++ {
			t := u.ends[e]
			subs := g.substituents(t, u.ends[1-e])
			ok = g.doubleCount(t) == 1 && len(subs)+g.hydro[t] >= 1 && len(subs)+g.hydro[t] <= 2 && len(subs) >= 1
			if ok {
				u.refs[e] = subs[0]
			}
		}
		if !ok {
			continue
		}
		// a lone hydrogen or lone pair at both ends of a C=C is fine; two
		// substituents at one end must differ
		switch {
		case cs.parity(&u, rank) != ringgeom.NoHand:
			definite = append(definite, u)
		case !countWithoutKeys || !tiedLeaves(g, g.substituents(t0, t1), rank) && !tiedLeaves(g, g.substituents(t1, t0), rank):
			tied = append(tied, u)
		}
	}
	// a bridgehead fixed by its cage ties (two of its bridges are equal)
	// and stays fixed, whatever the rest is given
	tied = g.dropCageFixed(tied, definite, rank)
	// a tie can be broken by configuration only if some other unit exists
	if len(definite)+len(tied) >= 2 {
		definite = append(definite, tied...)
	}
	return definite, rank
}

// tetrahedralCandidate reports whether atom a can be a tetrahedral
// stereocentre by its element, bonds and hydrogens, and how many
// ligands it has (3 when a lone pair is the fourth). Three-coordinate
// nitrogen is left out: it inverts quickly (common practice).
func tetrahedralCandidate(g *keyGraph, a int) (int, bool) {
	at := &g.mol.Atoms[a]
	if g.arom[a] || g.hydro[a] > 1 {
		return 0, false
	}
	count := len(g.adj[a]) + g.hydro[a]
	switch at.Number {
	case notation.ElemC, notation.ElemSi, notation.ElemGe:
		return count, count == 4 && g.doubleCount(a) == 0 && at.Charge == 0
	case notation.ElemN:
		return count, count == 4 && g.doubleCount(a) == 0 && at.Charge == 1
	case notation.ElemP, notation.ElemAs:
		return count, count == 4 || (count == 3 && g.doubleCount(a) == 0 && at.Charge == 0)
	case notation.ElemS, notation.ElemSe:
		// sulfoxides, sulfinates, sulfonium ions: three ligands and a
		// lone pair
		return count, count == 3 && (g.doubleCount(a) == 1 && at.Charge == 0 || g.doubleCount(a) == 0 && at.Charge == 1)
	case notation.ElemB:
		return count, count == 4 && at.Charge == -1
	}
	return 0, false
}

// tiedLeaves reports whether two of ligs tie and both are atoms with no
// other neighbour (two fluorines, two methyls): no configuration
// anywhere can tell them apart, so the unit they tie never becomes
// stereogenic and would only double the assignments to enumerate.
func tiedLeaves(g *keyGraph, ligs []int, rank []int) bool {
	for i := range ligs {
		for j := i + 1; j < len(ligs); j++ {
			a, b := ligs[i], ligs[j]
			if a >= 0 && b >= 0 && rank[a] == rank[b] && len(g.adj[a]) == 1 && len(g.adj[b]) == 1 {
				return true
			}
		}
	}
	return false
}

// oneTiedPair reports whether exactly two of the ligands tie, and they
// are atoms: the pattern of a pseudoasymmetric or ring centre.
func oneTiedPair(ligs []int, rank []int) bool {
	pairs := 0
	for i := range ligs {
		for j := i + 1; j < len(ligs); j++ {
			if ligandRank(rank, ligs[i]) == ligandRank(rank, ligs[j]) {
				if ligs[i] == stereo.ImplicitNeighbour {
					return false
				}
				pairs++
			}
		}
	}
	return pairs == 1
}

// oneEndTied reports whether the two ligands at exactly one end of an
// allene tie.
func oneEndTied(u *keyUnit, rank []int) bool {
	var r [2][]int
	for i, x := range u.ligands {
		r[u.ligEnd[i]] = append(r[u.ligEnd[i]], ligandRank(rank, x))
	}
	if len(r[0]) != 2 || len(r[1]) != 2 {
		return false
	}
	return (r[0][0] == r[0][1]) != (r[1][0] == r[1][1])
}

// This file implements the checks of small bicycles: in/out and
// trans-fused bridgeheads, bridgeheads fixed by their cage, bridgehead
// nitrogens.

package stereo

import (
	"slices"

	"stereoline/notation"
	"stereoline/stereo/internal/ringgeom"
)

// In/out bridgeheads. In a small bridged bicycle the substituents of the
// two bridgeheads must both point out of the cage: seen from its
// substituent, each bridgehead shows the three bridges turning one way,
// and the other bridgehead shows them turning the other way (picture
// bicyclo[2.2.2]octane along its axis). Marks that make both turn the same
// way put one substituent inside the cage, which only bicycles with long
// bridges can take (in/out isomers; common practice). Bridges of at most
// ringgeom.MaxSmallBridge atoms count as small.

func (l *labeller) checkBridgeheads() {
	// two marked atoms with three ring bonds each, or nothing to check
	heads := 0
	for a := range l.cfg.tetra {
		if l.g.geom.RingDegree(a) >= 3 {
			heads++
		}
	}
	if heads < 2 {
		return
	}
	for _, bc := range l.bicycles() {
		a, b := bc.heads[0], bc.heads[1]
		ta, tb := l.cfg.tetra[a], l.cfg.tetra[b]
		if ta == nil || tb == nil {
			continue // unmarked, or already reported with another bridgehead
		}
		var bridges [3][2]int
		for i, p := range bc.paths {
			if len(p) == 0 {
				// the direct bond of a fused bicycle: each head's bridge
				// begins at the other head
				bridges[i] = [2]int{b, a}
				continue
			}
			bridges[i] = [2]int{p[0], p[len(p)-1]}
		}
		ha := bridgeHand(ta, bridges, 0)
		hb := bridgeHand(tb, bridges, 1)
		if ha == ringgeom.NoHand || hb == ringgeom.NoHand || ha != hb {
			continue
		}
		msg := "these marks put a substituent of a bridgehead inside a small bicycle"
		if len(bc.paths[2]) == 0 {
			msg = "these marks put the bridgehead substituents of a small fused bicycle trans, which it cannot take"
		}
		err := l.fail(tb.span, CodeImpossibleCenter, "%s", msg)
		err.Related = append(err.Related, notation.Related{Span: ta.span, Msg: "the other bridgehead"})
		delete(l.cfg.tetra, a)
		delete(l.cfg.tetra, b)
		l.unitAtoms[a], l.unitAtoms[b] = true, true
	}
}

// bicycle is a small bridged or fused bicycle: its two bridgeheads and
// its three bridges, each from the atom next to heads[0] to the one next
// to heads[1]; in a fused bicycle the third bridge is the bond between
// the heads, and empty.
type bicycle struct {
	heads [2]int
	paths [3][]int
}

// bicycles finds the small bicycles of the molecule once and keeps them:
// both the in/out check and the cage check read them. Pairs of
// bridgeheads come in the order of their first then second atom.
func (l *labeller) bicycles() []bicycle {
	if l.bicyclesFound {
		return l.bicycleList
	}
	l.bicyclesFound = true
	g := l.g
	// a bridgehead that can hold a configuration has four ligands (or
	// three and a lone pair: the nitrogens of Tröger's base), no double
	// bond and three ring bonds; aromatic ring fusions, the most common
	// atoms with three ring bonds, are left out at once
	head := func(a int) bool {
		at := &g.mol.Atoms[a]
		if at.Aromatic || g.doubleBonds(a) > 0 || g.geom.RingDegree(a) < 3 {
			return false
		}
		d := g.degree(a)
		return d == 4 || d == 3 && hasLonePair(at, g.valence(a))
	}
	for x := 0; x < g.n; x++ {
		if !head(x) {
			continue
		}
		near := g.geom.PartnerHeads(x)
		slices.Sort(near)
		for _, y := range near {
			if y <= x || !head(y) {
				continue
			}
			if bi := g.mol.BondBetween(x, y); bi >= 0 {
				// a fused bicycle small enough (perimeter at most
				// MaxFusedPerimeter) has a ring of at most 4 atoms
				// through the shared bond: two rings of size r1 <= r2
				// have r1+r2-2 atoms round the outside
				if s := g.ringSize(bi); s == 0 || 2*s-2 > ringgeom.MaxFusedPerimeter {
					continue
				}
				if rings, ok := g.geom.FusedPaths(x, y); ok {
					// the bond between the heads is the third bridge, of no atoms
					l.bicycleList = append(l.bicycleList, bicycle{heads: [2]int{x, y}, paths: [3][]int{rings[0], rings[1], nil}})
				}
				continue
			}
			if !g.geom.Bridgeable(x, y) {
				continue
			}
			if paths, ok := g.geom.BridgePaths(x, y); ok {
				l.bicycleList = append(l.bicycleList, bicycle{heads: [2]int{x, y}, paths: paths})
			}
		}
	}
	return l.bicycleList
}

// bridgePaths finds the three bridges between bridgeheads a and b
// (ringgeom.Graph.BridgePaths).
func (g *graph) bridgePaths(a, b int) ([3][]int, bool) { return g.geom.BridgePaths(a, b) }

// bridgeHand returns the hand of a bridgehead's written mark read over
// (substituent, bridge 1, 2, 3), with side picking each bridge's atom
// next to this bridgehead; NoHand when the ligands are not one
// substituent and the three bridges.
func bridgeHand(t *tetraConfig, bridges [3][2]int, side int) ringgeom.Hand {
	if len(t.ligands) != 4 {
		return ringgeom.NoHand
	}
	want := make([]int, 0, 4)
	for _, br := range bridges {
		want = append(want, br[side])
	}
	order := make([]int, 4)
	exo := -1
	for i, x := range t.ligands {
		pos := -1
		for k, w := range want {
			if w == x {
				pos = k + 1
			}
		}
		if pos < 0 {
			if exo >= 0 {
				return ringgeom.NoHand
			}
			exo = i
			pos = 0
		}
		order[i] = pos
	}
	if exo < 0 {
		return ringgeom.NoHand
	}
	parity, _ := ringgeom.PermutationParity(order)
	return t.hand.Permuted(parity)
}

// Bridgeheads fixed by their cage (ringgeom.Graph.CageFixed): a mark at
// such a bridgehead says nothing, and leaving it out leaves nothing
// open. The identity key drops the same marks from its units.

// checkCages reports the marks on bridgeheads fixed by their cage and
// drops them, so that no other unit reads a configuration from them.
func (l *labeller) checkCages() {
	for _, a := range l.cfg.tetraAtoms() {
		if !l.cageFixed(a) {
			continue
		}
		t := l.cfg.tetra[a]
		l.warn(t.span, CodeIneffectiveCenter, "mark on a bridgehead that its cage fixes: two of its bridges are the same and carry no configuration")
		delete(l.cfg.tetra, a)
		l.unitAtoms[a] = true
	}
}

// cageFixed reports whether atom x is a bridgehead of a small bicycle
// two of whose bridges are constitutionally equal and carry no
// configuration.
func (l *labeller) cageFixed(x int) bool {
	g := l.g
	// the classes are asked only once a bicycle is found: most ring
	// fusions are no bicycle, and their molecules may need no classes.
	// A nitrogen's lone pair is its fourth ligand (the nitrogens of
	// 1,4-diazabicyclo[2.2.1]heptane are fixed like norbornane's CH)
	if g.geom.RingDegree(x) < 3 || g.degree(x) != 4 && !(g.degree(x) == 3 && hasLonePair(&g.mol.Atoms[x], g.valence(x))) {
		return false
	}
	same := func(a, b int) bool { return l.classes.of(a) == l.classes.of(b) }
	for _, bc := range l.bicycles() {
		if bc.heads[0] != x && bc.heads[1] != x {
			continue
		}
		y := bc.heads[1]
		if y == x {
			y = bc.heads[0]
		}
		if g.geom.CageFixed(x, y, bc.paths, same, l.configuredAtom) {
			return true
		}
	}
	return false
}

// configuredAtom reports whether atom a carries a written configuration:
// a tetrahedral or allene mark, or a configured double bond.
func (l *labeller) configuredAtom(a int) bool {
	if _, ok := l.cfg.tetra[a]; ok {
		return true
	}
	if _, ok := l.cfg.allene[a]; ok {
		return true
	}
	for _, e := range l.g.adj[a] {
		if _, ok := l.cfg.bonds[e.bond]; ok {
			return true
		}
	}
	return false
}

// bridgedHead reports whether atom a is a bridgehead of a small bridged
// bicycle (every bridge at least one atom): such an atom cannot turn
// inside out, which holds a nitrogen's configuration (quinuclidine,
// Tröger's base). A ring-fusion atom of a fused bicycle does not count:
// the nitrogen of indolizidine inverts, and with it the ring fusion.
func (l *labeller) bridgedHead(a int) bool {
	for _, bc := range l.bicycles() {
		if (bc.heads[0] == a || bc.heads[1] == a) && len(bc.paths[2]) > 0 {
			return true
		}
	}
	return false
}

// mirroredBridgehead reports whether the unmarked atom a is a bridgehead
// of a small bicycle that a mirror plane maps onto its partner: the two
// heads are constitutionally equal, unmarked, and every bridge reads
// the same from either head, with no configuration written on it and
// no atom that could hold one (bicyclo[3.2.1]octane, tropane,
// bicyclo[3.1.0]hexane). A bridge atom with two different ligands off
// the bicycle (the 3-position of tropine and pseudotropine, exo or endo)
// is stereogenic together with the heads (together.go) and leaves them
// as they were. The cage fixes
// the heads relative to each other, and the one arrangement it allows
// is its own mirror image, so the heads are not open stereocentres
// although each has four different ligands: the bicycle has a single
// stereoisomer (RDKit 2022.09.3 enumerates one, stereo/perception_rdkit_test.go).
func (l *labeller) mirroredBridgehead(a int) bool {
	g := l.g
	if g.geom.RingDegree(a) < 3 {
		return false
	}
	for _, bc := range l.bicycles() {
		if bc.heads[0] != a && bc.heads[1] != a {
			continue
		}
		x, y := bc.heads[0], bc.heads[1]
		if l.classes.of(x) != l.classes.of(y) || l.configuredAtom(x) || l.configuredAtom(y) {
			continue
		}
		mirrored := true
		for _, p := range bc.paths {
			for i := range p {
				if l.classes.of(p[i]) != l.classes.of(p[len(p)-1-i]) || l.configuredAtom(p[i]) || !l.plainBridgeAtom(p[i], bc) {
					mirrored = false
				}
			}
		}
		if mirrored {
			return true
		}
	}
	return false
}

// plainBridgeAtom reports whether bridge atom p of bicycle bc can hold
// no configuration of its own: its ligands off the bicycle are at most
// one, or two equal ones (two hydrogens, two like substituents), and
// none of them is in a ring.
func (l *labeller) plainBridgeAtom(p int, bc bicycle) bool {
	g := l.g
	inBicycle := func(x int) bool {
		if x == bc.heads[0] || x == bc.heads[1] {
			return true
		}
		for _, q := range bc.paths {
			if slices.Contains(q, x) {
				return true
			}
		}
		return false
	}
	var off []int
	for _, e := range g.adj[p] {
		if inBicycle(e.to) {
			continue
		}
		if g.ringBond[e.bond] {
			return false
		}
		off = append(off, e.to)
	}
	switch len(off) + g.hyd[p] {
	case 0, 1:
		return true
	case 2:
		return g.hyd[p] == 2 || len(off) == 2 && l.classes.of(off[0]) == l.classes.of(off[1])
	}
	return false
}

// This file implements the perception of unmarked stereogenic units and
// the constitutional symmetry classes it decides by.

package stereo

import (
	"cmp"
	"slices"

	"stereoline/notation"
	"stereoline/stereo/internal/ringgeom"
)

// perceiveUnmarked finds stereogenic units that carry no mark and
// reports them as undefined. Constitutional symmetry classes decide:
// a tetrahedral atom whose four ligands fall in four classes, a double
// bond whose ends each carry two ligands of different classes, and the
// units that are stereogenic only together (two ring atoms each with one
// pair of equal ring branches, as in 1,4-disubstituted cyclohexanes).
func (l *labeller) perceiveUnmarked() {
	g := l.g
	// the classes are computed on first use: a molecule whose every
	// candidate is marked, or fails a test that needs no classes, never
	// pays for them
	class := l.classes
	sev := notation.SeverityHint
	if l.anyMarks {
		sev = notation.SeverityInformation
	}
	report := func(sp notation.Span, what string) {
		e := l.res.Diagnostics.Add(sp, CodeUndefined, "%s", what)
		e.Severity = sev
	}
	var paired []int // candidate atoms with one pair of equal ring branches
	var relays []int // spiro atoms with two pairs (together.go)
	for a := 0; a < g.n; a++ {
		if l.budget.tick() {
			return // reportBudget says so
		}
		if l.unitAtoms[a] || !tetrahedralCapable(g, a) && !l.heldNitrogen(a) || exchangingOxygens(g, a) {
			continue
		}
		span := g.mol.Atoms[a].Span
		switch kind, u := l.classifyUnmarked(a, class); kind {
		case distinctLigands, spiroAxialCentre:
			l.res.Units = append(l.res.Units, l.unspecifiedCentre(a))
			report(span, "stereocentre without a configuration")
		case pseudoCentreByConfiguration:
			l.addCentre(u)
			report(span, "stereocentre (made so by the configurations around it) without a configuration")
		case ringPairMember:
			paired = append(paired, a)
		case spiroRelayMember:
			relays = append(relays, a)
		case chiralRingArrangement:
			l.addCentre(u)
			report(span, "stereocentre (its equal ring ligands are arranged chirally) without a configuration")
		}
	}
	// units stereogenic together: two paired atoms or exocyclic double
	// bonds on one ring, marked or not
	members := l.halfMarked
	for _, a := range paired {
		members = append(members, member{atom: a, bond: -1})
	}
	for _, a := range relays {
		members = append(members, member{atom: a, bond: -1, relay: true})
	}
	for bi := range g.mol.Bonds {
		if l.unitBonds[bi] || g.ringBond[bi] || bondOrder(&g.mol.Bonds[bi]) != 2 {
			continue
		}
		if r, o, ok := l.exoPaired(bi); ok {
			members = append(members, member{atom: r, bond: bi, other: o})
		}
	}
	l.together(members, report)
	// a ring-paired atom with no partner may still have its two ring
	// branches told apart by configurations written elsewhere (the
	// 3-position of a cis-fused bicyclo[3.3.0]octane whose bridgeheads
	// are marked: exo or endo)
	for _, a := range l.unjoined {
		if l.unitAtoms[a] {
			continue
		}
		if l.anyMarks && l.configuredRingPair(a) {
			if u, ok := l.pseudoCentre(a); ok {
				l.addCentre(u)
				report(g.mol.Atoms[a].Span, "stereocentre (made so by the configurations around it) without a configuration")
				continue
			}
		}
		if l.openPairInBlock(a) {
			// the same split can come from stereocentres of the ring
			// system that are themselves unmarked: the 3-position of
			// tropine against its bridgeheads (tropine and
			// pseudotropine; common practice)
			l.unitAtoms[a] = true
			l.res.Units = append(l.res.Units, l.unspecifiedCentre(a))
			report(g.mol.Atoms[a].Span, "stereocentre (together with the stereocentres of its ring system) without a configuration")
		}
	}
	// allenes and even cumulenes: two different ligands at each end
	for a := 0; a < g.n; a++ {
		if l.unitAtoms[a] {
			continue
		}
		ends, inner, ok := g.alleneEnds(a)
		if !ok {
			continue
		}
		if !terminalDistinct(g, ends[0], inner[0], class) || !terminalDistinct(g, ends[1], inner[1], class) {
			// equal ring ligands at an end may still be arranged
			// chirally: an allene inside a bicycle (VS287 of the suite)
			if l.ringTied(ends[0], class) || l.ringTied(ends[1], class) {
				if u, ok := l.chiralAllene(a, ends); ok {
					l.addCentre(u)
					report(g.mol.Atoms[a].Span, "stereogenic allene (its equal ring ligands are arranged chirally) without a configuration")
				}
			}
			continue
		}
		l.unitAtoms[a] = true
		l.res.Units = append(l.res.Units, Unit{Kind: KindAllene, Atoms: []int{ends[0], ends[1]}, Centre: a, Bond: -1})
		report(g.mol.Atoms[a].Span, "stereogenic allene without a configuration")
	}
	l.perceiveCumulenes(class, report)
	for bi := range g.mol.Bonds {
		b := &g.mol.Bonds[bi]
		if l.unitBonds[bi] || bondOrder(b) != 2 || b.Order == notation.OrderAromatic {
			continue
		}
		if g.mancudeZ[b.Begin] > 0 && g.mancudeZ[b.End] > 0 && (l.inSmallRing(b.Begin) || l.inSmallRing(b.End)) {
			// a Kekulé bond of an aromatic ring system (a porphyrin
			// written with '=' included); only a mancude bond whose atoms
			// lie on no ring smaller than 8 can be cis or trans (the
			// bridges of a cyclophanediene, VS155 of the suite)
			continue
		}
		if g.cumulated(b.Begin) || g.cumulated(b.End) {
			continue
		}
		if cisOnlyRing(g.ringSize(bi)) {
			continue
		}
		switch {
		case bondEndsDistinct(g, b.Begin, b.End, class):
			l.res.Units = append(l.res.Units, l.unspecifiedBond(b.Begin, b.End, bi))
			report(b.Span, "stereogenic double bond without a configuration")
		case l.anyMarks && bondEndsPossible(g, b.Begin, b.End) && l.configuredBondPair(b.Begin, b.End) && l.configuredBondPair(b.End, b.Begin):
			// an end whose two equal ligands the configurations written
			// elsewhere tell apart, as for pseudoCentre
			var lb label
			l.withExplainCap(func() { lb = l.doubleBond(unmarkedBond(bi, [2]int{b.Begin, b.End}, [2]int{b.End, b.Begin})) })
			if lb.tie || lb.capped {
				continue
			}
			l.res.Units = append(l.res.Units, Unit{Kind: KindDoubleBond, Atoms: []int{b.Begin, b.End}, Centre: -1, Bond: bi,
				Ranked: lb.ranked, Decisions: lb.decisions})
			report(b.Span, "stereogenic double bond (made so by the configurations around it) without a configuration")
		}
	}
}

// unmarkedCentre is what an unmarked candidate atom turns out to be.
// classifyUnmarked tries the kinds in the order below and the first
// that applies decides, so the order is one of chemical precedence: an
// atom with four different ligands needs no further test, and the
// costly ones (ranking by configurations, Rule 6 trials) come last.
type unmarkedCentre uint8

const (
	notACentre unmarkedCentre = iota
	// four ligands of four symmetry classes: a stereocentre
	distinctLigands
	// constitutionally equal ligands told apart by the configurations
	// written elsewhere: a pseudoasymmetric centre (the middle carbon of
	// a trisubstituted glutaric acid whose ends are unlike)
	pseudoCentreByConfiguration
	// a spiro atom whose two rings each hold two different ligands: a
	// stereocentre even when the rings are alike (spiro[4.4]nonane-
	// 1,6-dione, VS288 of the suite)
	spiroAxialCentre
	// one pair of equal ring branches: stereogenic only together with
	// another ring atom (together.go)
	ringPairMember
	// a spiro atom with a pair of equal branches in each ring: it passes
	// the relation between ring atoms on either side on (together.go)
	spiroRelayMember
	// equal ring ligands arranged without a mirror plane through the
	// atom: the proposed Rule 6 tells them apart (VS281, VS283 of the
	// suite)
	chiralRingArrangement
)

// classifyUnmarked decides what the unmarked candidate atom a is, and
// for pseudoCentreByConfiguration and chiralRingArrangement returns its
// unit, ranked on the way. It adds nothing to the result.
func (l *labeller) classifyUnmarked(a int, class *lazyClasses) (unmarkedCentre, Unit) {
	distinct, pairInRing := ligandClasses(l.g, a, class)
	if distinct {
		if l.mirroredBridgehead(a) {
			return notACentre, Unit{}
		}
		return distinctLigands, Unit{}
	}
	if l.anyMarks && l.configuredPair(a, class) {
		if u, ok := l.pseudoCentre(a); ok {
			return pseudoCentreByConfiguration, u
		}
	}
	switch {
	case l.spiroAxial(a):
		return spiroAxialCentre, Unit{}
	case pairInRing:
		return ringPairMember, Unit{}
	case l.spiroRelay(a):
		return spiroRelayMember, Unit{}
	}
	if l.ringTied(a, class) {
		if u, ok := l.chiralArrangement(a); ok {
			return chiralRingArrangement, u
		}
	}
	return notACentre, Unit{}
}

// addCentre adds the unit of a centre perceived as stereogenic.
func (l *labeller) addCentre(u Unit) {
	l.unitAtoms[u.Centre] = true
	l.res.Units = append(l.res.Units, u)
}

// perceiveCumulenes reports the unmarked cumulenes with an odd number of
// double bonds (three or more) whose terminal atoms each carry two
// different ligands: they are cis/trans units like a double bond
// (hexa-2,3,4-triene; common practice). The chain is walked as
// readBonds walks it, so that a unit has the same atoms marked or not.
func (l *labeller) perceiveCumulenes(class *lazyClasses, report func(notation.Span, string)) {
	g := l.g
	var seen []bool
	for bi := range g.mol.Bonds {
		b := &g.mol.Bonds[bi]
		if bondOrder(b) != 2 || b.Order == notation.OrderAromatic || !(g.cumulated(b.Begin) || g.cumulated(b.End)) {
			continue
		}
		if seen == nil {
			seen = make([]bool, len(g.mol.Bonds))
		}
		if seen[bi] {
			continue
		}
		t0, i0, n0 := g.cumulene(b.End, b.Begin)
		t1, i1, n1 := g.cumulene(b.Begin, b.End)
		l.markChain(t0, i0, seen)
		count := n0 + n1 - 1
		if count%2 == 0 || count < 3 || t0 == t1 {
			continue
		}
		mid := l.middleBond(t0, i0, count)
		if mid < 0 || l.unitBonds[mid] || !terminalDistinct(g, t0, i0, class) || !terminalDistinct(g, t1, i1, class) {
			continue
		}
		l.unitBonds[mid] = true
		u := Unit{Kind: KindDoubleBond, Atoms: []int{t0, t1}, Centre: -1, Bond: mid}
		var lb label
		l.withExplainCap(func() { lb = l.doubleBond(unmarkedBond(mid, [2]int{t0, t1}, [2]int{i0, i1})) })
		if !lb.capped {
			u.Ranked, u.Decisions = lb.ranked, lb.decisions
		}
		l.res.Units = append(l.res.Units, u)
		report(g.mol.Bonds[mid].Span, "stereogenic cumulene without a configuration")
	}
}

// inSmallRing reports whether atom a lies on a ring too small to hold a
// trans double bond (cisOnlyRing).
func (l *labeller) inSmallRing(a int) bool {
	for _, e := range l.g.adj[a] {
		if cisOnlyRing(l.g.ringSize(e.bond)) {
			return true
		}
	}
	return false
}

// unspecifiedCentre is the unit of an unmarked stereocentre, with its
// ligands ranked (a ranking needs no configuration of the centre itself,
// and the explanation is as useful before a mark is written).
func (l *labeller) unspecifiedCentre(a int) Unit {
	u := Unit{Kind: KindTetrahedral, Atoms: []int{a}, Centre: a, Bond: -1}
	if l.unranked {
		return u
	}
	var lb label
	l.withExplainCap(func() {
		d := l.digraph(a)
		defer l.release(d)
		// no Rule 6 trials: they decide a label, which an unmarked unit has not
		lb, _ = l.tetrahedralWith(d, l.unmarkedConfig(a), -1, false)
	})
	if !lb.capped {
		u.Ranked, u.Decisions = lb.ranked, lb.decisions
	}
	return u
}

// ringTied reports whether every ligand of a that ties with another (by
// symmetry class) lies on a ring bond, and some do: the only ties Rule 6
// can split.
func (l *labeller) ringTied(a int, class *lazyClasses) bool {
	g := l.g
	tied := false
	for i, e := range g.adj[a] {
		for j, f := range g.adj[a] {
			if i != j && class.of(e.to) == class.of(f.to) {
				if !g.ringBond[e.bond] {
					return false
				}
				tied = true
			}
		}
	}
	return tied
}

// chiralArrangement labels an unmarked atom as if it were marked, with
// the Rule 6 trials a mark gets, and reports whether a label comes out:
// then its tied ligands are told apart by how they are arranged, and the
// atom is a stereocentre, whose unit it returns.
func (l *labeller) chiralArrangement(a int) (Unit, bool) {
	var lb label
	l.withExplainCap(func() { lb = l.tetrahedral(l.unmarkedConfig(a)) })
	if lb.tie || lb.capped || !lb.desc.Labelled() {
		return Unit{}, false
	}
	return Unit{Kind: KindTetrahedral, Atoms: []int{a}, Centre: a, Bond: -1, Ranked: lb.ranked, Decisions: lb.decisions}, true
}

// chiralAllene is chiralArrangement for the centre of an allene.
func (l *labeller) chiralAllene(a int, ends [2]int) (Unit, bool) {
	c := l.g.readAllene(a, notation.Chirality{Class: notation.ChiralAL, Num: 1})
	if c == nil || len(c.ligands) != 4 {
		return Unit{}, false
	}
	var lb label
	l.withExplainCap(func() { lb = l.allene(c) })
	if lb.tie || lb.capped || !lb.desc.Labelled() {
		return Unit{}, false
	}
	return Unit{Kind: KindAllene, Atoms: []int{ends[0], ends[1]}, Centre: a, Bond: -1, Ranked: lb.ranked, Decisions: lb.decisions}, true
}

// unmarkedConfig is the configuration an unmarked centre is ranked
// under: its ligands in stereo order, the implicit ligand a hydrogen or,
// with three atoms and no hydrogen, a lone pair; the hand is
// arbitrary, as no label is read from it.
func (l *labeller) unmarkedConfig(a int) *tetraConfig {
	ligs := stereoLigands(l.g.mol, a)
	if len(ligs) == 3 {
		ligs = append(ligs, ImplicitNeighbour)
	}
	return &tetraConfig{centre: a, ligands: ligs, hand: ringgeom.Anticlockwise, lonePair: len(l.g.mol.Atoms[a].Bonds) == 3 && l.g.hyd[a] == 0}
}

// explainCap bounds the digraphs that rank the ligands of unmarked
// units: that ranking is an explanation only, and a molecule full of
// unmarked centres (a ladder of fused rings) must not pay the full cap
// for each of them.
const explainCap = 2000

// withExplainCap runs rank with the node cap lowered to explainCap, for
// rankings that only explain an unmarked unit; the cap is restored when
// rank returns.
func (l *labeller) withExplainCap(rank func()) {
	saved := l.nodeCap
	l.nodeCap = min(saved, explainCap)
	defer func() { l.nodeCap = saved }()
	rank()
}

// unspecifiedBond is the unit of an unmarked stereogenic double bond,
// with the ligands at each end ranked.
func (l *labeller) unspecifiedBond(a, b, bi int) Unit {
	u := Unit{Kind: KindDoubleBond, Atoms: []int{a, b}, Centre: -1, Bond: bi}
	if l.unranked {
		return u
	}
	var lb label
	l.withExplainCap(func() { lb = l.doubleBond(unmarkedBond(bi, [2]int{a, b}, [2]int{b, a})) })
	if !lb.capped {
		u.Ranked, u.Decisions = lb.ranked, lb.decisions
	}
	return u
}

// configuredPair is the cheap test before distinctByConfiguration: the
// atom has exactly one pair of constitutionally equal ligands, and each
// of the pair leads to a configured atom within a few bonds. Three or
// more equal ligands (a branch point of a dendrimer) are left alone.
func (l *labeller) configuredPair(a int, class *lazyClasses) bool {
	g := l.g
	count := func(k uint64) (n int) {
		for _, e := range g.adj[a] {
			if class.of(e.to) == k {
				n++
			}
		}
		return n
	}
	var pair []int
	ringPair := 0
	for _, e := range g.adj[a] {
		switch count(class.of(e.to)) {
		case 2:
			pair = append(pair, e.to)
			if g.ringBond[e.bond] {
				ringPair++
			}
		case 1:
		default:
			return false
		}
	}
	if len(pair) != 2 || ringPair == 2 {
		return false // ring pairs are the together test's
	}
	for _, start := range pair {
		if !l.configuredNear(start, a, 6) {
			return false
		}
	}
	return true
}

// configuredBondPair is the cheap test before a double bond is ranked
// for configurations elsewhere: end a of a=b can carry two different
// ligands, and if its two ligands are constitutionally equal, they are
// no pair of ring branches (the together test's) and each leads to a
// configured atom within a few bonds. At least one end of the bond must
// have such a pair for the test to be worth it; bondEndsDistinct has
// already failed, so one has.
func (l *labeller) configuredBondPair(a, b int) bool {
	end, ok := bondEnd(l.g, a, b)
	if !ok {
		return false
	}
	if end.distinct(l.classes) {
		return true
	}
	x, y := end.others[0], end.others[1]
	if bx, by := l.g.mol.BondBetween(a, x), l.g.mol.BondBetween(a, y); l.g.ringBond[bx] && l.g.ringBond[by] {
		return false
	}
	return l.configuredNear(x, a, 6) && l.configuredNear(y, a, 6)
}

// configuredRingPair is configuredPair for an atom whose equal pair lies
// on ring bonds: both branches lead to a configured atom within a few
// bonds.
func (l *labeller) configuredRingPair(a int) bool {
	g := l.g
	n := 0
	for i, e := range g.adj[a] {
		for _, f := range g.adj[a][i+1:] {
			if g.ringBond[e.bond] && g.ringBond[f.bond] && l.classes.of(e.to) == l.classes.of(f.to) {
				if !l.configuredNear(e.to, a, 6) || !l.configuredNear(f.to, a, 6) {
					return false
				}
				n++
			}
		}
	}
	return n == 1 && l.splittableRing(a)
}

// splittableRing reports whether configurations could tell apart the
// two equal ring branches of a: a configured unit lies in a's ring
// system itself (the marked bridgeheads of a fused bicycle), or
// configured side chains hang from two different atoms of it (2,6-
// substituents of unlike configuration). A configuration reached through
// one atom only (a chiral N-substituent of a 4-methylpiperidine) sits
// on the symmetry of the two branches and cannot split them.
func (l *labeller) splittableRing(a int) bool {
	g := l.g
	block := l.ringBlocks()
	mine := l.blockOf(a)
	if mine < 0 {
		return false
	}
	inBlock := func(x int) bool { return l.inBlock(x, mine) }
	attachments := 0
	for x := 0; x < g.n; x++ {
		if !inBlock(x) {
			continue
		}
		if _, ok := l.cfg.tetra[x]; ok && x != a {
			return true
		}
		for _, e := range g.adj[x] {
			if _, ok := l.cfg.bonds[e.bond]; ok && block[e.bond] == mine {
				return true
			}
		}
		// a configured side chain hanging from x
		for _, e := range g.adj[x] {
			if block[e.bond] != mine && !inBlock(e.to) && l.configuredNear(e.to, x, 6) {
				attachments++
				break
			}
		}
	}
	return attachments >= 2
}

// blockOf returns the ring system (ringBlocks) of a ring atom, -1 for an
// atom on no ring.
func (l *labeller) blockOf(a int) int {
	block := l.ringBlocks()
	for _, e := range l.g.adj[a] {
		if block[e.bond] >= 0 {
			return block[e.bond]
		}
	}
	return -1
}

// inBlock reports whether atom x has a bond in ring system b.
func (l *labeller) inBlock(x, b int) bool {
	block := l.ringBlocks()
	for _, e := range l.g.adj[x] {
		if block[e.bond] == b {
			return true
		}
	}
	return false
}

// openPairInBlock reports whether the ring system of a ring-paired atom
// holds two or more other tetrahedral units, at least one of them left
// unmarked: a pair of stereocentres placed symmetrically about a can
// tell its two ring branches apart, and with one of them open, so is a
// (one unit alone sits on the symmetry and cannot).
func (l *labeller) openPairInBlock(a int) bool {
	mine := l.blockOf(a)
	if mine < 0 {
		return false
	}
	units, open := 0, false
	for i := range l.res.Units {
		u := &l.res.Units[i]
		if u.Kind != KindTetrahedral || u.Centre == a {
			continue
		}
		if l.inBlock(u.Centre, mine) {
			units++
			open = open || !u.Specified
		}
	}
	return units >= 2 && open
}

// configuredNear reports whether an atom with a written configuration
// lies within depth bonds of start, without passing through avoid.
func (l *labeller) configuredNear(start, avoid, depth int) bool {
	seen := map[int]bool{avoid: true, start: true}
	frontier := []int{start}
	for d := 0; d <= depth && len(frontier) > 0; d++ {
		var next []int
		for _, x := range frontier {
			if _, ok := l.cfg.tetra[x]; ok {
				return true
			}
			for _, e := range l.g.adj[x] {
				if _, ok := l.cfg.bonds[e.bond]; ok {
					return true
				}
				if !seen[e.to] {
					seen[e.to] = true
					next = append(next, e.to)
				}
			}
		}
		frontier = next
	}
	return false
}

// pseudoCentre ranks the ligands of an unmarked atom by the full rule
// chain, with the full node cap, so that the configurations written
// elsewhere (through their auxiliary descriptors) can split
// constitutionally equal ligands, and returns the atom's unit, with that
// ranking as its explanation, when they do. Ring pairs are left to the
// together test: their split comes from the atom's own partner across
// the ring.
func (l *labeller) pseudoCentre(a int) (Unit, bool) {
	d := l.digraph(a)
	defer l.release(d)
	lb, _ := l.tetrahedralWith(d, l.unmarkedConfig(a), -1, false)
	if lb.tie || lb.capped || !decidedByDescriptors(lb.decisions) {
		return Unit{}, false
	}
	return Unit{Kind: KindTetrahedral, Atoms: []int{a}, Centre: a, Bond: -1, Ranked: lb.ranked, Decisions: lb.decisions}, true
}

// decidedByDescriptors reports whether a ranking needed the rules that
// read configurations (3 to 5) to tell some pair apart; whether the
// label would be lowercase does not matter here.
func decidedByDescriptors(ds []Decision) bool {
	for _, dc := range ds {
		if dc.Rule >= Rule3 && dc.Rule <= Rule5 {
			return true
		}
	}
	return false
}

// heldNitrogen reports whether a three-coordinate nitrogen cannot invert
// because it is a bridgehead of a small bicycle (the nitrogens of
// Tröger's base, which is resolved into enantiomers; common practice),
// so that it is a stereocentre when its ligands differ.
func (l *labeller) heldNitrogen(a int) bool {
	g := l.g
	at := &g.mol.Atoms[a]
	if at.Number != notation.ElemN || at.Charge != 0 || at.Aromatic || len(g.adj[a]) != 3 || g.hyd[a] != 0 ||
		g.valence(a) != 3 || g.geom.RingDegree(a) != 3 {
		return false
	}
	return l.bridgedHead(a)
}

// tetrahedralCapable reports whether an atom can be a tetrahedral centre
// that holds its configuration: four ligands (hydrogens counted) on an
// sp3 atom, or three with a lone pair on P, As, S, Se.
func tetrahedralCapable(g *graph, a int) bool {
	at := &g.mol.Atoms[a]
	if at.Aromatic || g.hyd[a] > 1 {
		return false
	}
	deg := g.degree(a)
	switch at.Number {
	case notation.ElemC, notation.ElemSi, notation.ElemGe, notation.ElemB:
		return deg == 4 && g.doubleBonds(a) == 0
	case notation.ElemN:
		// an ammonium ion with a hydrogen loses it and inverts: only a
		// quaternary one holds its configuration (common practice)
		return deg == 4 && at.Charge == 1 && g.hyd[a] == 0
	case notation.ElemP, notation.ElemAs:
		return deg == 4 || (deg == 3 && at.Charge == 0 && g.valence(a) == 3)
	case notation.ElemS, notation.ElemSe:
		// a sulfinyl-type centre with its lone pair, or a sulfonyl-type
		// one with four different ligands (O=S(=S)(Ph)OMe, VS130)
		return deg == 3 && hasLonePair(at, g.valence(a)) && !(at.Charge == 1 && g.hyd[a] > 0) || deg == 4 && at.Charge == 0
	}
	return false
}

// ligandClasses says whether the ligands of a fall in distinct symmetry
// classes, and otherwise whether exactly one pair is equal and both of
// that pair are ring bonds.
func ligandClasses(g *graph, a int, class *lazyClasses) (distinct, pairInRing bool) {
	pairs := 0
	ringPair := false
	adj := g.adj[a]
	for i, e := range adj {
		if g.hyd[a] > 0 && ringgeom.PlainHydrogen(g.mol, e.to) {
			// a hydrogen written as an atom is the same ligand as an
			// implicit one (CC(=O)C([H])C has two hydrogens on C4)
			pairs++
			continue
		}
		k := class.of(e.to)
		for _, prev := range adj[:i] {
			if class.of(prev.to) == k {
				// one pair per later ligand, as a set of seen classes counts
				pairs++
				ringPair = g.ringBond[e.bond] && g.ringBond[prev.bond]
				break
			}
		}
	}
	return pairs == 0, pairs == 1 && ringPair
}

// terminalDistinct reports whether the terminal atom t of a cumulene
// (bonded to the chain through inner) carries two ligands of different
// classes, a hydrogen counting as one.
func terminalDistinct(g *graph, t, inner int, class *lazyClasses) bool {
	var others [2]int
	n := 0
	for _, e := range g.adj[t] {
		if e.to != inner {
			if n == len(others) {
				return false
			}
			others[n] = e.to
			n++
		}
	}
	switch n {
	case 1:
		return g.hyd[t] == 1
	case 2:
		return g.hyd[t] == 0 && class.of(others[0]) != class.of(others[1])
	}
	return false
}

// bondEndsDistinct reports whether each end of the double bond a=b
// carries two ligands of different classes (a hydrogen or lone pair
// counting as one). The tests that need no classes are made at both
// ends first, so that a carbonyl does not make the classes be computed.
func bondEndsDistinct(g *graph, a, b int, class *lazyClasses) bool {
	ea, ok := bondEnd(g, a, b)
	if !ok {
		return false
	}
	eb, ok := bondEnd(g, b, a)
	if !ok {
		return false
	}
	return ea.distinct(class) && eb.distinct(class)
}

// bondEndsPossible reports whether both ends of a=b could carry two
// different ligands, whatever the classes (bondEnd).
func bondEndsPossible(g *graph, a, b int) bool {
	_, okA := bondEnd(g, a, b)
	_, okB := bondEnd(g, b, a)
	return okA && okB
}

// doubleBondEnd holds the neighbours of one end of a double bond other
// than its partner, when there are one or two.
type doubleBondEnd struct {
	others [2]int
	n      int
}

// bondEnd collects the neighbours of end a of a=b, and reports false
// when the end cannot carry two different ligands whatever the classes:
// too many or too few neighbours, or a single one beside neither a
// hydrogen nor the lone pair of an imine nitrogen.
func bondEnd(g *graph, a, b int) (doubleBondEnd, bool) {
	var end doubleBondEnd
	for _, e := range g.adj[a] {
		if e.to != b {
			if end.n == len(end.others) {
				return end, false
			}
			end.others[end.n] = e.to
			end.n++
		}
	}
	switch end.n {
	case 1:
		return end, g.hyd[a] == 1 || (g.hyd[a] == 0 && pnictogen(g.z[a]))
	case 2:
		return end, true
	}
	return end, false
}

func (e doubleBondEnd) distinct(class *lazyClasses) bool {
	return e.n == 1 || class.of(e.others[0]) != class.of(e.others[1])
}

// lazyClasses computes the symmetry classes on first use.
type lazyClasses struct {
	g     *graph
	class []uint64
	// shared says the classes were those of the molecule before, of the
	// same constitution (workspace.classed)
	shared bool
}

// of returns the symmetry class of atom a: a 64-bit name, equal for
// atoms of one class.
func (c *lazyClasses) of(a int) uint64 {
	if c.class == nil {
		c.class = symmetryClasses(c.g)
	}
	return c.class[a]
}

// symmetryClasses partitions the atoms by constitution: atoms start in
// classes of equal element, charge, isotope, degree, hydrogens and
// valence and are split by the classes of their neighbours (and the
// orders of the bonds to them) until nothing changes: the coarsest
// partition that every class's neighbours agree on. A class is named by
// a number, equal for the atoms of one class. The tables live in the
// graph's storage, reused by the next analysis.
//
// Rounds split classes as the neighbours' classes of the round before
// tell them apart, but a round looks only at the atoms next to an atom
// whose class changed in the round before: an atom none of whose
// neighbours moved keeps the signature it had, which the other atoms
// left in its class share. When a class splits, its largest part keeps
// the name and only the others count as changed, so an atom changes
// class at most log n times and a long chain, which needs a round per
// atom from its ends to its middle, costs near-linear time instead of
// n rounds over n atoms.
//
// The identity key and the pre-key refine too, to other ends: the key
// ranks exactly (stereo/identity/canon.go), since it needs an order and
// not only classes; the pre-key (stereo/identity/prekey.go) leaves bond
// orders out, since it must never tell apart what the key joins, and
// runs a fixed number of rounds. The three share the mixer
// (ringgeom.Mix64 and Scramble), not the refinement.
func symmetryClasses(g *graph) []uint64 {
	n := g.n
	class := sized(&g.store.class, n) // the result: class numbers
	sig := sized(&g.store.classNext, n)
	ints := sized(&g.store.classInts, 8*n)
	elems, pos, id, stamp := ints[:n:n], ints[n:2*n:2*n], ints[2*n:3*n:3*n], ints[3*n:4*n:4*n]
	cellStart, cellEnd := ints[4*n:5*n:5*n], ints[5*n:6*n:6*n]
	touched, changed := ints[6*n:6*n], ints[7*n:7*n]
	next := g.store.classNextChanged[:0]
	// the first classes: atoms sorted by the hash of their own invariants
	for a := 0; a < n; a++ {
		at := &g.mol.Atoms[a]
		h := ringgeom.Mix64(uint64(at.Number))
		h = ringgeom.Mix64(h ^ uint64(at.Charge+128)<<8)
		h = ringgeom.Mix64(h ^ uint64(at.Isotope)<<16)
		sig[a] = ringgeom.Mix64(h ^ uint64(len(g.adj[a]))<<32 ^ uint64(g.hyd[a])<<40 ^ uint64(g.valence(a))<<48)
		elems[a] = int32(a)
	}
	slices.SortFunc(elems, func(x, y int32) int { return cmp.Compare(sig[x], sig[y]) })
	cells := int32(0)
	for i, a := range elems {
		if i == 0 || sig[a] != sig[elems[i-1]] {
			cellStart[cells] = int32(i)
			cells++
		}
		cellEnd[cells-1] = int32(i + 1)
		id[a], pos[a] = cells-1, int32(i)
		stamp[a] = -1
	}
	changed = append(changed, elems...)
	for round := int32(0); len(changed) > 0; round++ {
		touched = touched[:0]
		for _, a := range changed {
			for _, e := range g.adj[a] {
				if stamp[e.to] != round {
					stamp[e.to] = round
					touched = append(touched, int32(e.to))
				}
			}
		}
		// signatures over the classes as they stand, before any moves:
		// the neighbours enter as a sum of mixed values, which does not
		// depend on their order
		for _, a := range touched {
			var sum uint64
			for _, e := range g.adj[a] {
				sum += ringgeom.Mix64(uint64(id[e.to])<<3 | uint64(classOrder(g, int(a), e)))
			}
			sig[a] = sum
		}
		slices.SortFunc(touched, func(x, y int32) int {
			if c := cmp.Compare(id[x], id[y]); c != 0 {
				return c
			}
			return cmp.Compare(sig[x], sig[y])
		})
		next = next[:0]
		for i := 0; i < len(touched); {
			c := id[touched[i]]
			j := i + 1
			for j < len(touched) && id[touched[j]] == c {
				j++
			}
			run := touched[i:j]
			i = j
			next = splitCell(c, run, sig, elems, pos, id, cellStart, cellEnd, &cells, next)
		}
		changed = append(changed[:0], next...)
	}
	g.store.classNextChanged = next[:0]
	for a := 0; a < n; a++ {
		class[a] = uint64(id[a])
	}
	return class
}

// splitCell splits class c by the signatures of its atoms in run (sorted
// by signature; the class's other atoms keep theirs, which they share).
// The largest part keeps the number c; the atoms of the others get new
// numbers and are appended to changed.
func splitCell(c int32, run []int32, sig []uint64, elems, pos, id, cellStart, cellEnd []int32, cells *int32, changed []int32) []int32 {
	start, end := cellStart[c], cellEnd[c]
	k := int32(len(run))
	if k == end-start && sig[run[0]] == sig[run[k-1]] {
		return changed // every atom moved alike: no split
	}
	// the touched atoms to the end of the class's window, in
	// signature order, by swaps: O(len(run)), not O(class size)
	boundary := end
	for _, a := range run {
		boundary--
		b := elems[boundary]
		pa := pos[a]
		elems[pa], elems[boundary] = b, a
		pos[b], pos[a] = pa, boundary
	}
	for j, a := range run {
		elems[end-k+int32(j)] = a
		pos[a] = end - k + int32(j)
	}
	// the parts: the untouched atoms [start, end-k), then runs of equal
	// signature; the largest keeps c
	type part struct{ from, to int32 }
	var parts []part
	if end-k > start {
		parts = append(parts, part{start, end - k})
	}
	for j := int32(0); j < k; {
		l := j + 1
		for l < k && sig[run[l]] == sig[run[j]] {
			l++
		}
		parts = append(parts, part{end - k + j, end - k + l})
		j = l
	}
	largest := 0
	for p := range parts {
		if parts[p].to-parts[p].from > parts[largest].to-parts[largest].from {
			largest = p
		}
	}
	for p, pt := range parts {
		if p == largest {
			cellStart[c], cellEnd[c] = pt.from, pt.to
			continue
		}
		nc := *cells
		*cells++
		cellStart[nc], cellEnd[nc] = pt.from, pt.to
		for x := pt.from; x < pt.to; x++ {
			id[elems[x]] = nc
			changed = append(changed, elems[x])
		}
	}
	return changed
}

// classOrder is the order of a bond as symmetry classes see it: a bond
// inside a mancude ring system gets one order of its own, whichever
// Kekulé structure was written, so that two fused benzo rings stay
// equal although their double bonds were placed differently.
func classOrder(g *graph, a int, e edge) int {
	if g.mancudeBond[e.bond] {
		return 5
	}
	return e.order
}

// pnictogen reports the elements whose double-bonded, two-coordinate
// atoms keep a lone pair as their second ligand: the nitrogen of an
// imine or azo group, and its heavier kin in phosphaalkenes, diphosphenes
// and diarsenes (common practice).
func pnictogen(z int) bool {
	return z == notation.ElemN || z == notation.ElemP || z == notation.ElemAs || z == 51 // antimony
}

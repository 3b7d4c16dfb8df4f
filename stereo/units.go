// This file implements the labelling of every marked unit and the checks
// of what its marks mean.

package stereo

import (
	"slices"
	"sort"

	"stereoline/notation"
	"stereoline/stereo/internal/ringgeom"
)

// labelAll labels every unit that carries a configuration: tetrahedral
// centres, double bonds marked at both ends, double bonds marked at one
// end, allenes, and the higher classes, in that order.
//
// Direction marks need care: the mark on a single bond between two
// double bonds (C/C=C/C=C/C, or a benzene ring next to a marked chain)
// serves both, so a double bond that cannot use its marks must not be
// blamed for them when another one does. Three tables by single bond
// decide whether a bond's marks are used:
//   - usedBondMarks (readBonds): the mark sits next to some double bond;
//     one next to none is reported as stray (reportStrayBondMarks);
//   - l.effective: the mark configures a double bond that got a label;
//   - claimed (labelOneSided): the mark may configure a bond that can be
//     stereogenic: the effective ones, those of bonds that may be
//     stereogenic together with a ring atom (together.go), and those of
//     one-sided bonds that could be stereogenic.
func (l *labeller) labelAll() {
	// room for every marked unit, grown once
	l.res.Units = slices.Grow(l.res.Units, len(l.cfg.tetra)+len(l.cfg.bonds)+len(l.cfg.allene)+len(l.cfg.higher)+len(l.oneSided))
	l.labelCentres()
	// double bonds before the rest, so that every mark that configures
	// a labelled bond is known when the others are judged
	quiet := l.labelBonds()
	for _, c := range quiet {
		l.warnQuietBond(c)
	}
	l.labelOneSided()
	l.labelAllenes()
	l.keepHigherClasses()
}

// markUse records, by marked single bond, whether its marks do a job.
type markUse map[int]bool

// all reports whether every mark of a unit does the job.
func (u markUse) all(marks []int) bool {
	for _, mb := range marks {
		if !u[mb] {
			return false
		}
	}
	return true
}

// labelCentres labels the tetrahedral marks.
func (l *labeller) labelCentres() {
	for _, a := range l.cfg.tetraAtoms() {
		t := l.cfg.tetra[a]
		l.unitAtoms[a] = true
		if exchangingProton(l.g, a) {
			l.warn(t.span, CodeIneffectiveCenter, "mark on a sulfonium or selenonium centre with a hydrogen, which it gives up and takes back, so it is not a stereocentre")
			continue
		}
		if exchangingOxygens(l.g, a) {
			l.warn(t.span, CodeIneffectiveCenter, "mark on an atom whose two terminal chalcogens (=O and -OH or -O⁻) exchange a proton or charge, so it is not a stereocentre")
			continue
		}
		if l.skipOverBudget(t.span) {
			l.res.Units = append(l.res.Units, Unit{Kind: KindTetrahedral, Atoms: []int{a}, Centre: a, Bond: -1,
				Specified: true, Descriptor: DescUndetermined, Marks: []notation.Span{t.span}})
			continue
		}
		lb := l.tetrahedral(t)
		if lb.capped && l.budget.spent {
			// cut short by the budget, not the cap: reported as such
			l.overBudget = append(l.overBudget, t.span)
			l.res.Units = append(l.res.Units, Unit{Kind: KindTetrahedral, Atoms: []int{a}, Centre: a, Bond: -1,
				Specified: true, Descriptor: DescUndetermined, Marks: []notation.Span{t.span}})
			continue
		}
		if lb.capped {
			lb.tie, lb.desc = false, DescUndetermined
		}
		if lb.tie {
			if relay := l.spiroRelay(a); relay || l.ringPaired(a) {
				// may be stereogenic together with another ring atom:
				// decided once every candidate is known (together.go)
				l.halfMarked = append(l.halfMarked, member{atom: a, bond: -1, marked: true, relay: relay, tetra: t, lb: lb})
				continue
			}
			l.warn(t.span, CodeIneffectiveCenter, "mark on an atom that is not a stereocentre: two of its ligands are the same")
			continue
		}
		if lb.capped {
			l.warn(t.span, CodeUndetermined, "configuration too deep to label within %d digraph nodes", l.nodeCap)
		}
		switch {
		case l.invertingNitrogen(a):
			l.warn(t.span, CodeInvertingNitrogen, "this nitrogen inverts quickly at room temperature, so its mark does not hold")
		case protonatedAmine(l.g, a):
			l.warn(t.span, CodeInvertingNitrogen, "this ammonium nitrogen gives up its proton and inverts quickly, so its mark does not hold")
		}
		l.res.Units = append(l.res.Units, Unit{Kind: KindTetrahedral, Atoms: []int{a}, Centre: a, Bond: -1,
			Specified: true, Descriptor: lb.desc, Ranked: lb.ranked, Decisions: lb.decisions, Marks: []notation.Span{t.span}})
	}
}

// labelBonds labels the double bonds marked at both ends, records their
// marks in l.effective, and returns the configured bonds that decide
// nothing (quiet: in a ring too small for trans, or with two equal
// ligands at an end), whose marks may yet belong to another unit.
func (l *labeller) labelBonds() (quiet []*bondConfig) {
	// a cumulene's configuration is kept under each of its double
	// bonds: it is labelled once
	done := map[*bondConfig]bool{}
	l.effective, l.quietMarks = markUse{}, nil
	for _, bi := range sortedKeys(l.cfg.bonds) {
		c := l.cfg.bonds[bi]
		if done[c] {
			continue
		}
		done[c] = true
		l.unitBonds[c.bond] = true
		if cisOnlyRing(l.ringSize(c)) {
			quiet = append(quiet, c)
			continue
		}
		if l.skipOverBudget(c.spans[0]) {
			l.res.Units = append(l.res.Units, Unit{Kind: KindDoubleBond, Atoms: []int{c.ends[0], c.ends[1]}, Centre: -1, Bond: c.bond,
				Specified: true, Descriptor: DescUndetermined, Marks: c.spans})
			continue
		}
		lb := l.doubleBond(c)
		if lb.capped && l.budget.spent {
			l.overBudget = append(l.overBudget, c.spans[0])
			l.res.Units = append(l.res.Units, Unit{Kind: KindDoubleBond, Atoms: []int{c.ends[0], c.ends[1]}, Centre: -1, Bond: c.bond,
				Specified: true, Descriptor: DescUndetermined, Marks: c.spans})
			continue
		}
		if lb.capped {
			lb.tie, lb.desc = false, DescUndetermined
		}
		if lb.tie {
			if r, o, ok := l.exoPaired(c.bond); ok {
				l.halfMarked = append(l.halfMarked, member{atom: r, bond: c.bond, other: o, marked: true, bondc: c, lb: lb})
				continue
			}
			quiet = append(quiet, c)
			continue
		}
		for _, mb := range c.marks {
			l.effective[mb] = true
		}
		if lb.capped {
			l.warn(c.spans[0], CodeUndetermined, "configuration too deep to label within %d digraph nodes", l.nodeCap)
		}
		l.res.Units = append(l.res.Units, Unit{Kind: KindDoubleBond, Atoms: []int{c.ends[0], c.ends[1]}, Centre: -1, Bond: c.bond,
			Specified: true, Descriptor: lb.desc, Ranked: lb.ranked, Decisions: lb.decisions, Marks: c.spans})
	}
	return quiet
}

// labelOneSided ranks the double bonds marked at one end only. One that
// can be stereogenic is reported as open and claims its marks, so a mark
// between C=O and C=C (an acrylate) is not called ineffective because of
// the C=O it also touches; one that cannot is reported as ineffective
// unless every one of its marks is claimed by another unit.
func (l *labeller) labelOneSided() {
	ranked := make([]label, len(l.oneSided))
	claimed := markUse{}
	for mb := range l.effective {
		claimed[mb] = true
	}
	// a mark reported already, on the double bond it configures in vain
	// (a ring too small for trans), is not reported again for the C=O
	// it also touches
	for mb := range l.quietMarks {
		claimed[mb] = true
	}
	// a bond that may be stereogenic together with a ring atom claims
	// its marks as well; alone, it is reported by together.go
	for _, h := range l.halfMarked {
		if h.bondc != nil {
			for _, mb := range h.bondc.marks {
				claimed[mb] = true
			}
		}
	}
	skipped := make([]bool, len(l.oneSided))
	for k, c := range l.oneSided {
		if l.skipOverBudget(c.spans[0]) {
			skipped[k] = true
			continue
		}
		probe := *c
		ranked[k] = l.doubleBond(&probe)
		if !ranked[k].tie && !cisOnlyRing(l.ringSize(c)) {
			for _, mb := range c.marks {
				claimed[mb] = true
			}
		}
	}
	for k, c := range l.oneSided {
		l.unitBonds[c.bond] = true
		if skipped[k] {
			continue
		}
		lb := ranked[k]
		if lb.tie || cisOnlyRing(l.ringSize(c)) {
			if !claimed.all(c.marks) {
				l.warn(c.spans[0], CodeIneffectiveBond, "marks on a double bond that is not stereogenic")
			}
			continue
		}
		if l.effective.all(c.marks) {
			// the mark configures a neighbouring double bond too (a
			// conjugated chain, C/C=C/C=CC): this one is still open, and
			// is reported on its own bond, not on the mark it shares
			e := l.warn(l.g.mol.Bonds[c.bond].Span, CodeOneSidedBond, "only one end of this double bond is marked, by a mark it shares with its neighbour, so its configuration is open")
			e.Related = append(e.Related, notation.Related{Span: c.spans[0], Msg: "the shared mark"})
		} else {
			l.warn(c.spans[0], CodeOneSidedBond, "only one end of this double bond is marked, so its configuration is open")
		}
		l.res.Units = append(l.res.Units, Unit{Kind: KindDoubleBond, Atoms: []int{c.ends[0], c.ends[1]}, Centre: -1, Bond: c.bond,
			Ranked: lb.ranked, Marks: c.spans})
	}
}

// labelAllenes labels the extended tetrahedral marks.
func (l *labeller) labelAllenes() {
	for _, a := range sortedKeys(l.cfg.allene) {
		c := l.cfg.allene[a]
		l.unitAtoms[a] = true
		if l.skipOverBudget(c.span) {
			l.res.Units = append(l.res.Units, Unit{Kind: KindAllene, Atoms: []int{c.ends[0], c.ends[1]}, Centre: a, Bond: -1,
				Specified: true, Descriptor: DescUndetermined, Marks: []notation.Span{c.span}})
			continue
		}
		lb := l.allene(c)
		if lb.capped && l.budget.spent {
			l.overBudget = append(l.overBudget, c.span)
			l.res.Units = append(l.res.Units, Unit{Kind: KindAllene, Atoms: []int{c.ends[0], c.ends[1]}, Centre: a, Bond: -1,
				Specified: true, Descriptor: DescUndetermined, Marks: []notation.Span{c.span}})
			continue
		}
		if lb.capped {
			lb.tie, lb.desc = false, DescUndetermined
		}
		if lb.tie {
			l.warn(c.span, CodeIneffectiveCenter, "mark on an allene that is not stereogenic: one end carries two equal ligands")
			continue
		}
		if lb.capped {
			l.warn(c.span, CodeUndetermined, "configuration too deep to label within %d digraph nodes", l.nodeCap)
		}
		l.res.Units = append(l.res.Units, Unit{Kind: KindAllene, Atoms: []int{c.ends[0], c.ends[1]}, Centre: a, Bond: -1,
			Specified: true, Descriptor: lb.desc, Ranked: lb.ranked, Decisions: lb.decisions, Marks: []notation.Span{c.span}})
	}
}

// keepHigherClasses reports the square-planar, trigonal-bipyramidal and
// octahedral marks as units. There is no CIP ranking for them: the
// engine keeps the mark and its permutation number, which the
// notation's neighbour order interprets.
func (l *labeller) keepHigherClasses() {
	for _, a := range sortedKeys(l.cfg.higher) {
		c := l.cfg.higher[a]
		l.unitAtoms[a] = true
		l.res.Units = append(l.res.Units, Unit{Kind: c.kind, Atoms: []int{a}, Centre: a, Bond: -1, Specified: true,
			Permutation: c.number, Marks: []notation.Span{c.span}})
	}
}

// warnQuietBond reports the marks of a configured double bond that
// decides nothing: trans in a small ring, cis-only in a small ring, or
// one end with two equal ligands; marks that serve another double bond
// are left alone.
func (l *labeller) warnQuietBond(c *bondConfig) {
	if l.effective.all(c.marks) {
		return
	}
	if l.quietMarks == nil {
		l.quietMarks = markUse{}
	}
	for _, mb := range c.marks {
		l.quietMarks[mb] = true
	}
	size := l.ringSize(c)
	switch {
	case cisOnlyRing(size) && l.g.mancudeZ[c.ends[0]] == 0 && l.transInRing(c):
		l.fail(c.spans[0], CodeStrainedRing, "trans double bond in a ring of %d atoms; the smallest ring that holds one has %d", size, ringgeom.MinTransRing)
	case cisOnlyRing(size):
		l.warn(c.spans[0], CodeIneffectiveBond, "a double bond in a ring of %d atoms can only be cis; the marks add nothing", size)
	default:
		l.warn(c.spans[0], CodeIneffectiveBond, "marks on a double bond that is not stereogenic: one end carries two equal ligands")
	}
}

// ringSize is the size of the smallest ring holding the unit's double
// bond, 0 when it is acyclic. Cumulenes count their middle bond.
func (l *labeller) ringSize(c *bondConfig) int { return l.g.ringSize(c.bond) }

// cisOnlyRing reports whether a ring of size atoms (0 for no ring) is too
// small to hold a trans double bond (ringgeom.MinTransRing).
func cisOnlyRing(size int) bool { return size > 0 && size < ringgeom.MinTransRing }

// transInRing reports whether the ring continues on opposite sides of the
// double bond: the ring neighbours of the two ends are trans.
func (l *labeller) transInRing(c *bondConfig) bool {
	ring := l.g.smallestRing(c.bond)
	in := map[int]bool{}
	for _, a := range ring {
		in[a] = true
	}
	hand := c.hand
	for e := 0; e < 2; e++ {
		rn := -1
		for _, ed := range l.g.adj[c.ends[e]] {
			if ed.to != c.inner[e] && in[ed.to] {
				rn = ed.to
			}
		}
		if rn != c.refs[e] {
			hand = hand.Reversed()
		}
	}
	return hand == ringgeom.Trans
}

// protonatedAmine reports an ammonium nitrogen with a hydrogen: the
// proton exchanges with the solvent and the free amine inverts, so the
// configuration does not hold (common practice; a quaternary ammonium
// centre does hold it).
func protonatedAmine(g *graph, a int) bool {
	at := &g.mol.Atoms[a]
	return at.Number == notation.ElemN && at.Charge == 1 && g.hyd[a] > 0 && g.degree(a) == 4
}

// exchangingProton reports a three-coordinate sulfonium or selenonium
// centre carrying a hydrogen, which exchanges like an ammonium proton.
func exchangingProton(g *graph, a int) bool {
	at := &g.mol.Atoms[a]
	return (at.Number == notation.ElemS || at.Number == notation.ElemSe) && at.Charge == 1 && g.hyd[a] > 0 && g.degree(a) == 3
}

// invertingNitrogen reports a marked neutral three-coordinate nitrogen
// that is not held in place by a three-membered ring or the bridgehead
// position of a small bridged bicycle; a ring-fusion nitrogen
// (indolizidine, quinolizidine) inverts, and with it the ring fusion.
func (l *labeller) invertingNitrogen(a int) bool {
	g := l.g
	at := &g.mol.Atoms[a]
	if at.Number != notation.ElemN || at.Charge != 0 || g.degree(a) != 3 {
		return false
	}
	for _, e := range g.adj[a] {
		if g.ringBond[e.bond] && g.ringSize(e.bond) == 3 {
			return false
		}
	}
	return !l.bridgedHead(a)
}

// exchangingOxygens reports whether a phosphorus, arsenic, sulfur,
// selenium or tellurium centre carries a terminal chalcogen by a double
// bond and a terminal atom of the same element and isotope by a single
// bond that has a hydrogen or a negative charge: the acid proton moves
// between the two (and the anion is one resonance hybrid), so they are
// the same ligand and the centre is no stereocentre (common practice;
// a phosphonic acid monoester R-P(=O)(OH)-OR' has no configuration at
// phosphorus). Isotopes that differ keep the two apart, as in VS177 of
// the validation suite.
func exchangingOxygens(g *graph, a int) bool {
	if !hypervalentCentre(g.z[a]) {
		return false
	}
	m := g.mol
	for _, d := range g.adj[a] {
		if d.order != 2 || len(g.adj[d.to]) != 1 || g.hyd[d.to] != 0 || !chalcogen(g.z[d.to]) {
			continue
		}
		for _, s := range g.adj[a] {
			t := &m.Atoms[s.to]
			if s.order != 1 || len(g.adj[s.to]) != 1 || g.z[s.to] != g.z[d.to] || t.Isotope != m.Atoms[d.to].Isotope {
				continue
			}
			if g.hyd[s.to] == 1 && t.Charge == 0 || g.hyd[s.to] == 0 && t.Charge == -1 {
				return true
			}
		}
	}
	return false
}

func sortedKeys[V any](m map[int]V) []int {
	if len(m) == 0 {
		return nil
	}
	ks := make([]int, 0, len(m))
	for k := range m {
		ks = append(ks, k)
	}
	sort.Ints(ks)
	return ks
}

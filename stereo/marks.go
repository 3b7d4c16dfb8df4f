// This file implements the reading of direction marks around double
// bonds, and the report of stray marks.

package stereo

import (
	"stereoline/notation"
	"stereoline/stereo/internal/ringgeom"
)

// readBonds reads the '/' and '\' marks around every double bond and odd
// cumulene, reporting one-sided and contradictory marks.
func (l *labeller) readBonds() {
	g, m := l.g, l.g.mol
	nb := len(l.g.mol.Bonds)
	marks := sized(&g.store.marks, 3*nb)
	l.usedBondMarks, l.unitBonds = marks[:nb:nb], marks[nb:2*nb:2*nb]
	seen := marks[2*nb:] // by bond: double bonds of chains already read
	for bi := range m.Bonds {
		b := &m.Bonds[bi]
		if b.Dir != notation.DirNone || b.CloseDir != notation.DirNone {
			l.anyMarks = true
		}
		if seen[bi] || bondOrder(b) != 2 || b.Order == notation.OrderAromatic {
			continue
		}
		// walk the cumulene this bond belongs to
		t0, i0, n0 := g.cumulene(b.End, b.Begin)
		t1, i1, n1 := g.cumulene(b.Begin, b.End)
		count := n0 + n1 - 1
		l.markChain(t0, i0, seen)
		if count%2 == 0 || t0 == t1 {
			continue // even cumulene: an axial unit, read from its centre mark
		}
		mid := l.middleBond(t0, i0, count)
		// Cis until both ends are found marked (a one-sided bond keeps it)
		c := &bondConfig{bond: mid, ends: [2]int{t0, t1}, inner: [2]int{i0, i1}, hand: ringgeom.Cis}
		marked := [2]bool{}
		ok := true
		var sides [2]notation.Direction
		for e := 0; e < 2; e++ {
			atoms, ss, spans := g.markedSides(c.ends[e], c.inner[e])
			for _, ed := range g.adj[c.ends[e]] {
				// a ring closure whose two marks contradict each other
				// sits next to this bond even where the reading drops
				// it (reported by reportOpenMarks, not as stray)
				if ed.to != c.inner[e] && m.Bonds[ed.bond].RingMarksContradict() {
					l.usedBondMarks[ed.bond] = true
				}
			}
			for _, x := range atoms {
				mb := m.BondBetween(x, c.ends[e])
				l.usedBondMarks[mb] = true
				c.marks = append(c.marks, mb)
			}
			c.spans = append(c.spans, spans...)
			if len(atoms) == 0 {
				continue
			}
			marked[e] = true
			c.refs[e], sides[e] = atoms[0], ss[0]
			if len(atoms) == 2 && ss[0] == ss[1] && !g.bare(c.ends[1-e], c.inner[1-e]) {
				ok = false
				err := l.fail(spans[1], CodeConflictingMarks, "both substituents of this end are marked on the same side")
				err.Related = append(err.Related, notation.Related{Span: spans[0], Msg: "the other mark at this end"})
			}
		}
		if !ok {
			continue
		}
		switch {
		case marked[0] && marked[1]:
			c.hand = ringgeom.Cis
			if sides[0] != sides[1] {
				c.hand = ringgeom.Trans
			}
			l.cfg.bonds[bi] = c
			if mid != bi {
				l.cfg.bonds[mid] = c
			}
		case marked[0] || marked[1]:
			l.oneSided = append(l.oneSided, c)
		}
	}
}

// bare reports whether terminal t of a double bond (bonded to the chain
// through inner) carries nothing else, no atom and no hydrogen: the
// oxygen of a carbonyl. Such a bond cannot be configured, so two marks
// on one side at its other end contradict nothing; they belong to other
// double bonds (the carbon of a dienone, O=C(/C=C/Ar)/C=C/Ar, carries
// one mark for each C=C) or are reported as ineffective.
func (g *graph) bare(t, inner int) bool {
	if g.hyd[t] > 0 {
		return false
	}
	for _, e := range g.adj[t] {
		if e.to != inner {
			return false
		}
	}
	return true
}

// markChain records every double bond of the cumulene starting at
// terminal t (through inner) as seen.
func (l *labeller) markChain(t, inner int, seen []bool) {
	g := l.g
	prev, cur := t, inner
	for steps := 0; steps <= g.n; steps++ {
		bi := g.mol.BondBetween(prev, cur)
		if bi < 0 || seen[bi] {
			return
		}
		seen[bi] = true
		if !g.cumulated(cur) {
			return
		}
		next := -1
		for _, e := range g.adj[cur] {
			if e.to != prev {
				next = e.to
			}
		}
		prev, cur = cur, next
	}
}

// middleBond returns the middle double bond of an odd cumulene of count
// double bonds starting at terminal t.
func (l *labeller) middleBond(t, inner, count int) int {
	g := l.g
	prev, cur := t, inner
	for i := 0; i < count/2; i++ {
		next := -1
		for _, e := range g.adj[cur] {
			if e.to != prev {
				next = e.to
			}
		}
		prev, cur = cur, next
	}
	return g.mol.BondBetween(prev, cur)
}

// reportStrayBondMarks warns about direction marks next to no double
// bond at all.
func (l *labeller) reportStrayBondMarks() {
	m := l.g.mol
	for bi := range m.Bonds {
		b := &m.Bonds[bi]
		if (b.Dir == notation.DirNone && b.CloseDir == notation.DirNone) || l.usedBondMarks[bi] {
			continue
		}
		l.warn(m.MarkSpan(bi), CodeIneffectiveBond, "direction mark next to no double bond")
	}
}

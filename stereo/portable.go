// This file implements the report of marks that general-purpose readers
// read differently (testdata/survey): a lone-pair centre whose lone pair
// the readings place at positions of opposite parity, the same direction
// mark on both digits of a ring closure, and '@' on an allene, which
// OpenSMILES defines and no surveyed library keeps.

package stereo

import (
	"fmt"

	"stereoline/notation"
)

// OpenKind is the kind of a mark whose meaning depends on the reader.
type OpenKind uint8

// Kinds of open marks.
const (
	// OpenLonePair: a tetrahedral mark on a centre with three
	// neighbours and no hydrogen, written where the lone-pair rules of
	// notation.Reading disagree (the centre starts its part, or carries
	// an odd number of ring-closure digits and only single bonds, but
	// not both).
	OpenLonePair OpenKind = iota + 1
	// OpenRingMarks: the same direction mark on both digits of a ring
	// closure, which the ring-mark rules of notation.Reading read
	// differently.
	OpenRingMarks
	// OpenAllene: '@' or '@@' on the centre of an allene, read as
	// OpenSMILES 3.8.4 defines it and dropped by every surveyed library.
	OpenAllene
)

// OpenMark is one mark whose meaning depends on the reader.
type OpenMark struct {
	Kind OpenKind
	Atom int // the centre of a lone-pair or allene mark; -1 for ring marks
	Bond int // the ring closure of a ring-mark pair; -1 otherwise
}

// OpenMarks lists the marks of m whose meaning depends on the reader, in
// the order they are written, whether or not they configure a unit.
func OpenMarks(m *notation.Molecule) []OpenMark {
	var out []OpenMark
	if m == nil {
		return nil
	}
	var g *graph
	for a := range m.Atoms {
		at := &m.Atoms[a]
		ch := at.Chirality
		if ch.Class != notation.ChiralTH && ch.Class != notation.ChiralAL {
			continue
		}
		if twoDoubleBonds(m, a) {
			if g == nil {
				g = markGraph(m)
			}
			if _, _, ok := g.alleneEnds(a); ok {
				if ch.Short || ch.Class == notation.ChiralAL {
					out = append(out, OpenMark{Kind: OpenAllene, Atom: a, Bond: -1})
				}
				continue
			}
		}
		if ch.Class == notation.ChiralTH && (ch.Num == 1 || ch.Num == 2) && len(at.Bonds) == 3 && at.HydrogenCount() == 0 && m.LonePairOpen(a) {
			out = append(out, OpenMark{Kind: OpenLonePair, Atom: a, Bond: -1})
		}
	}
	for bi := range m.Bonds {
		if m.Bonds[bi].RingMarksContradict() {
			out = append(out, OpenMark{Kind: OpenRingMarks, Atom: -1, Bond: bi})
		}
	}
	return out
}

// twoDoubleBonds reports whether atom a has two bonds, both double: the
// only atoms that may be the centre of an allene (checked before the
// graph that says so is built).
func twoDoubleBonds(m *notation.Molecule, a int) bool {
	bonds := m.Atoms[a].Bonds
	return len(bonds) == 2 && m.Bonds[bonds[0]].Order == notation.OrderDouble && m.Bonds[bonds[1]].Order == notation.OrderDouble
}

// reportOpenMarks adds a stereo-reader-dependent finding for each open
// mark of m that configures something, saying what it means under m's
// reading and under the other rule (read with a second analysis of the
// same molecule).
func reportOpenMarks(m *notation.Molecule, res *Analysis, opt Options) {
	open := OpenMarks(m)
	if len(open) == 0 {
		return
	}
	opt.noOpenMarks = true
	opt.skipGroups = true // only the units are compared
	var otherLonePair, otherRingMarks *Analysis
	for _, o := range open {
		switch o.Kind {
		case OpenLonePair:
			if otherLonePair == nil {
				r := m.Reading
				r.LonePair = r.LonePair.Other()
				otherLonePair = AnalyzeWith(m.WithReading(r), opt)
			}
			if hasCodeAt(res, CodeInvertingNitrogen, m.Atoms[o.Atom].Span) {
				continue // the mark describes no separable compound under any reading
			}
			if countCode(res, CodeBudget)+countCode(otherLonePair, CodeBudget) > 0 {
				continue // one of the two was cut short: they cannot be compared
			}
			here, there := centreState(m, res, otherLonePair, o.Atom), centreState(m, otherLonePair, res, o.Atom)
			if here == there {
				continue
			}
			e := res.Diagnostics.Add(m.Atoms[o.Atom].Chirality.Span, CodeReaderDependent,
				"read as %s here and by %s; as %s by %s: OpenSMILES does not say where the lone pair of a centre without hydrogen stands",
				here, m.Reading.LonePair.Readers(), there, m.Reading.LonePair.Other().Readers())
			e.Severity = notation.SeverityWarning
		case OpenRingMarks:
			if otherRingMarks == nil {
				r := m.Reading
				r.RingMarks = r.RingMarks.Other()
				otherRingMarks = AnalyzeWith(m.WithReading(r), opt)
			}
			if countCode(res, CodeBudget)+countCode(otherRingMarks, CodeBudget) == 0 {
				reportRingMarks(m, res, otherRingMarks, o.Bond)
			}
		case OpenAllene:
			u := unitAtCentre(res, o.Atom)
			if u == nil || !u.Specified || !u.Descriptor.Labelled() {
				continue
			}
			e := res.Diagnostics.Add(m.Atoms[o.Atom].Chirality.Span, CodeReaderDependent,
				"read as (%s) here, as OpenSMILES 3.8.4 defines it; %s drop the mark, so the allene has no configuration there",
				u.Descriptor, notation.ReadersAll)
			e.Severity = notation.SeverityInformation
		}
	}
}

// reportRingMarks reports the ring closure bi whose two digits carry the
// same mark, next to a double bond: what the double bond is under m's
// reading and under the other ring-mark rule.
func reportRingMarks(m *notation.Molecule, res, other *Analysis, bi int) {
	b := &m.Bonds[bi]
	var found bool
	var here, there, name string
	for k := range res.Units {
		u := &res.Units[k]
		if u.Kind != KindDoubleBond || len(u.Atoms) != 2 || !touches(u, b) {
			continue
		}
		h, t := bondState(res, u), bondState(other, u)
		if !found || h != t && here == there {
			found, here, there = true, h, t
			name = fmt.Sprintf("the double bond %d-%d", u.Atoms[0]+1, u.Atoms[1]+1)
		}
	}
	if !found || here == there && here == "no configuration" {
		return
	}
	span, otherSpan, which := b.CloseSpan, b.Span, "opening"
	if m.Reading.RingMarks == notation.RingMarksDropped {
		span, otherSpan, which = b.Span, b.CloseSpan, "closing"
	}
	var e *notation.Error
	if here == there {
		e = res.Diagnostics.Add(span, CodeReaderDependent,
			"the same mark on both digits of a ring closure contradicts itself (OpenSMILES 3.8.3); %s is %s for every reader surveyed, as another mark decides it",
			name, here)
	} else {
		e = res.Diagnostics.Add(span, CodeReaderDependent,
			"%s is read as %s here and by %s; as %s by %s: the same mark on both digits of a ring closure contradicts itself (OpenSMILES 3.8.3)",
			name, here, m.Reading.RingMarks.Readers(), there, m.Reading.RingMarks.Other().Readers())
	}
	e.Severity = notation.SeverityWarning
	e.Related = append(e.Related, notation.Related{Span: otherSpan, Msg: "the mark at the " + which + " digit"})
}

// touches reports whether ring closure b is a substituent bond of double
// bond unit u: one of its atoms is a terminal atom of u, the other not.
func touches(u *Unit, b *notation.Bond) bool {
	t0, t1 := u.Atoms[0], u.Atoms[1]
	return (b.Begin == t0 || b.Begin == t1) != (b.End == t0 || b.End == t1)
}

func unitAtCentre(an *Analysis, a int) *Unit {
	for k := range an.Units {
		if an.Units[k].Centre == a {
			return &an.Units[k]
		}
	}
	return nil
}

// centreState says in words what the mark on centre a comes to in
// analysis an, beside the analysis other of the other reading: its
// label, a configuration that cannot exist (the mark is found impossible
// here, or an impossible pair of bridgeheads appears that the other
// reading does not have: the check may report the partner's mark), a
// mark that specifies nothing, or no configuration.
func centreState(m *notation.Molecule, an, other *Analysis, a int) string {
	if u := unitAtCentre(an, a); u != nil && u.Specified && u.Descriptor.Labelled() {
		return "(" + u.Descriptor.String() + ")"
	}
	if countCode(an, CodeImpossibleCenter) > countCode(other, CodeImpossibleCenter) {
		return "a configuration that cannot exist"
	}
	sp := m.Atoms[a].Span
	for _, d := range an.Diagnostics {
		if !d.Span.Overlaps(sp) {
			continue
		}
		switch d.Code {
		case CodeImpossibleCenter:
			return "a configuration that cannot exist"
		case CodeIneffectiveCenter:
			return "a mark that specifies nothing"
		}
	}
	return "no configuration"
}

func hasCodeAt(an *Analysis, code notation.Code, sp notation.Span) bool {
	for _, d := range an.Diagnostics {
		if d.Code == code && d.Span.Overlaps(sp) {
			return true
		}
	}
	return false
}

func countCode(an *Analysis, code notation.Code) int {
	n := 0
	for _, d := range an.Diagnostics {
		if d.Code == code {
			n++
		}
	}
	return n
}

// bondState says in words what a double bond unit's marks come to in one
// analysis: its label or no configuration.
func bondState(an *Analysis, u *Unit) string {
	for k := range an.Units {
		v := &an.Units[k]
		if v.Kind == KindDoubleBond && len(v.Atoms) == 2 && (v.Atoms[0] == u.Atoms[0] && v.Atoms[1] == u.Atoms[1] || v.Atoms[0] == u.Atoms[1] && v.Atoms[1] == u.Atoms[0]) {
			if v.Specified && v.Descriptor.Labelled() {
				return "(" + v.Descriptor.String() + ")"
			}
			return "no configuration"
		}
	}
	return "no configuration"
}

package review

import (
	"stereoline/notation"
	"stereoline/stereo"
	"stereoline/stereo/identity"
)

// This file implements the search for the smallest change that explains
// a pair. identity.CompareUnits lines up the units of two structures on
// one canonical order of their constitution; where the constitution is
// symmetric, that order is one of several, and a centre whose mark was
// removed can be lined up with its mirror-symmetric partner, which then
// reads as "inverted" beside "unmarked" (a mark dropped from one of the
// two centres of meso-2,3-dibromosuccinic acid is no inversion). When
// the line-up names inversions beside marks given or lost, or several
// inversions, the search tries the simplest readings instead: marks only
// removed, only added, or one centre inverted, by rewriting the marks of
// the text and comparing identity keys.

// maxSearchCentres bounds the centres the search tries in pairs; a
// record with more is left with the line-up's reading.
const maxSearchCentres = 16

// markedCentre is a tetrahedral centre and the span of its mark.
type markedCentre struct {
	atom int // in the structure's own numbering
	mark notation.Span
}

// markedCentres lists the atoms of m that carry a tetrahedral mark.
func markedCentres(m *notation.Molecule) []markedCentre {
	var out []markedCentre
	for a := range m.Atoms {
		c := m.Atoms[a].Chirality
		if c.Class == notation.ChiralTH && c.Span.End > c.Span.Start && c.Span.End <= len(m.Text) {
			out = append(out, markedCentre{atom: a, mark: c.Span})
		}
	}
	return out
}

// rewritten returns m's text with the marks of the centres chosen
// removed (invert false) or inverted, read again.
func rewritten(m *notation.Molecule, centres []markedCentre, invert bool) *notation.Molecule {
	text := m.Text
	// from the end, so earlier spans stay valid
	for i := len(centres) - 1; i >= 0; i-- {
		s := centres[i].mark
		mark := text[s.Start:s.End]
		repl := ""
		if invert {
			switch mark {
			case "@":
				repl = "@@"
			case "@@":
				repl = "@"
			case "@TH1":
				repl = "@TH2"
			case "@TH2":
				repl = "@TH1"
			default:
				return nil
			}
		}
		text = text[:s.Start] + repl + text[s.End:]
	}
	return notation.ReadWith(text, m.Reading)
}

// sameCompound reports whether two structures have one identity key.
func sameCompound(a, b *notation.Molecule) bool {
	if a == nil || b == nil || a.Errors.HasErrors() {
		return false
	}
	return identity.Identify(a).Key == identity.Identify(b).Key
}

// stripped finds k centres of more whose marks, removed, give the
// structure fewer: the centres, in more's numbering.
func stripped(more, fewer *notation.Molecule, k int) ([]markedCentre, bool) {
	cs := markedCentres(more)
	switch {
	case k == 1:
		for _, c := range cs {
			if sameCompound(rewritten(more, []markedCentre{c}, false), fewer) {
				return []markedCentre{c}, true
			}
		}
	case k == 2 && len(cs) <= maxSearchCentres:
		for i := range cs {
			for j := i + 1; j < len(cs); j++ {
				pick := []markedCentre{cs[i], cs[j]}
				if sameCompound(rewritten(more, pick, false), fewer) {
					return pick, true
				}
			}
		}
	}
	return nil, false
}

// inverted finds one centre of from whose mark, inverted, gives to.
func inverted(from, to *notation.Molecule) (markedCentre, bool) {
	cs := markedCentres(from)
	if len(cs) > 2*maxSearchCentres {
		return markedCentre{}, false
	}
	for _, c := range cs {
		if sameCompound(rewritten(from, []markedCentre{c}, true), to) {
			return c, true
		}
	}
	return markedCentre{}, false
}

// simplest tries the simpler readings of a pair the line-up read as
// inversions beside marks given or lost, or as several inversions;
// ok is false when none explains it.
func simplest(om, nm *notation.Molecule, oan, nan *stereo.Analysis, oOff, nOff int, role notation.Role, inv, bonds, added, removed int) (outcome, bool) {
	if bonds > 0 {
		return outcome{}, false
	}
	label := func(an *stereo.Analysis, a int) (stereo.Descriptor, []notation.Span) {
		if u := unitOn(an, stereo.KindTetrahedral, []int{a}); u != nil {
			return u.Descriptor, u.Marks
		}
		return stereo.DescNone, nil
	}
	switch {
	case inv > 0 && added == 0 && removed > 0:
		cs, ok := stripped(om, nm, removed)
		if !ok {
			return outcome{}, false
		}
		out := outcome{class: StereoRemoved}
		for _, c := range cs {
			u := UnitChange{Kind: stereo.KindTetrahedral, Role: role, OldAtoms: []int{c.atom + oOff}}
			u.Before, u.OldMarks = label(oan, c.atom+oOff)
			out.units = append(out.units, u)
		}
		out.other = centresBesides(nan, nOff, len(nm.Atoms), nil)
		return out, true
	case inv > 0 && removed == 0 && added > 0:
		cs, ok := stripped(nm, om, added)
		if !ok {
			return outcome{}, false
		}
		out := outcome{class: StereoAdded}
		for _, c := range cs {
			u := UnitChange{Kind: stereo.KindTetrahedral, Role: role, Atoms: []int{c.atom + nOff}}
			u.After, u.Marks = label(nan, c.atom+nOff)
			out.units = append(out.units, u)
		}
		changed := map[int]bool{}
		for _, u := range out.units {
			changed[u.Atoms[0]] = true
		}
		out.other = centresBesides(nan, nOff, len(nm.Atoms), changed)
		return out, true
	case inv >= 2 && added == 0 && removed == 0:
		oc, ok1 := inverted(om, nm)
		nc, ok2 := inverted(nm, om)
		if !ok1 || !ok2 {
			return outcome{}, false
		}
		u := UnitChange{Kind: stereo.KindTetrahedral, Role: role, OldAtoms: []int{oc.atom + oOff}, Atoms: []int{nc.atom + nOff}}
		u.Before, u.OldMarks = label(oan, oc.atom+oOff)
		u.After, u.Marks = label(nan, nc.atom+nOff)
		other := centresBesides(nan, nOff, len(nm.Atoms), map[int]bool{nc.atom + nOff: true})
		return outcome{class: Epimer, units: []UnitChange{u}, other: other}, true
	}
	return outcome{}, false
}

package review

import (
	"fmt"
	"slices"
	"strings"

	"stereoline/notation"
	"stereoline/stereo"
	"stereoline/stereo/document"
	"stereoline/stereo/reaction"
)

// This file implements the sentences of a review: the explanation of a
// pair ("C3 is now S (was R); the other 2 centres are unchanged") and
// its summary for an editor's lens ("epimer at C3"). Atoms are named as
// in the new record (its numbering, as describe prints it); a unit only
// the old record fixes is named in the old record's numbering, which
// the sentence says when the two numberings differ.

// maxNamed is how many units a sentence names before it counts the rest.
const maxNamed = 4

// explain fills the Explanation and Summary of a pair.
func explain(p *Pair) {
	p.Explanation, p.Summary = sentence(p), summary(p)
	if note := groupNote(p); note != "" {
		p.Explanation += "; " + note
	}
}

func sentence(p *Pair) string {
	switch p.Class {
	case Added:
		return "a new record" + titled(p.New)
	case Removed:
		return "the record" + titled(p.Old) + " is gone"
	case Unreadable:
		return p.Reason
	}
	var parts []string
	if len(p.Roles) > 0 {
		for _, r := range p.Roles {
			if r.Class == Rewritten {
				continue
			}
			parts = append(parts, roleName(r.Role)+": "+r.Class.String()+": "+unitsSentence(p, r.Class, r.Role, r.Other, r.OldFormula, r.Formula))
		}
		if len(parts) == 0 {
			parts = append(parts, "the same reactants, agents and products with the same configurations, written differently")
		}
		for _, c := range p.Centres {
			parts = append(parts, centreSentence(c))
		}
		return strings.Join(parts, "; ")
	}
	return unitsSentence(p, p.Class, notation.RoleNone, p.Other, p.OldFormula, p.Formula)
}

// unitsSentence explains the units of one structure (a record, or one
// part of a reaction).
func unitsSentence(p *Pair, class Class, role notation.Role, other int, oldFormula, formula string) string {
	switch class {
	case Rewritten:
		return "the same compound with the same configuration, written differently"
	case GroupsChanged:
		return "the same stereoisomers, but the stereo groups now say otherwise what is known of them (absolute, relative or racemic)"
	case ConstitutionChanged:
		switch {
		case oldFormula == "" || formula == "":
			return "a different compound"
		case oldFormula == formula:
			return "a different compound of the same formula " + formula + " (a constitutional isomer)"
		}
		return "a different compound: " + formula + " (was " + oldFormula + ")"
	}
	var units []UnitChange
	for _, u := range p.Units {
		if u.Role == role {
			units = append(units, u)
		}
	}
	var phrases []string
	for i, u := range units {
		if i == maxNamed && len(units) > maxNamed+1 {
			phrases = append(phrases, fmt.Sprintf("and %d more", len(units)-maxNamed))
			break
		}
		phrases = append(phrases, unitPhrase(p, &u))
	}
	s := strings.Join(phrases, "; ")
	switch class {
	case Enantiomer:
		if len(units) == 0 {
			return "the mirror image"
		}
		return fmt.Sprintf("the mirror image (%s inverted): %s", countUnits(units), s)
	case Epimer, Diastereomer:
		switch other {
		case 0:
		case 1:
			s += "; the other centre is unchanged"
		default:
			s += fmt.Sprintf("; the other %d centres are unchanged", other)
		}
		if len(units) == 0 {
			s = "the configurations differ (the symmetry of the structure hides which units)"
		}
	}
	return s
}

// unitPhrase says what happened to one unit.
func unitPhrase(p *Pair, u *UnitChange) string {
	name := unitName(p, u)
	before, after := label(u.Before), label(u.After)
	switch old, new := u.Marked(); {
	case old && new:
		if before != "" && after != "" && before != after {
			return fmt.Sprintf("%s is now %s (was %s)", name, after, before)
		}
		if u.Kind == stereo.KindDoubleBond {
			return name + " is flipped"
		}
		return name + " is inverted"
	case new:
		if after != "" {
			return fmt.Sprintf("%s is now marked %s (was unmarked)", name, after)
		}
		return name + " is now marked (was unmarked)"
	default:
		if before != "" {
			return fmt.Sprintf("%s is now unmarked (was %s)", name, before)
		}
		return name + " is now unmarked (was marked)"
	}
}

// label is a descriptor as a sentence shows it, "" when there is none.
func label(d stereo.Descriptor) string {
	if !d.Labelled() {
		return ""
	}
	return d.String()
}

// unitName names a unit in the new record's numbering, or in the old
// one's for a unit the new record leaves open.
func unitName(p *Pair, u *UnitChange) string {
	if u.Atoms != nil {
		return atomsName(p.New.Mol(), u.Kind, u.Atoms)
	}
	name := atomsName(p.Old.Mol(), u.Kind, u.OldAtoms)
	if !sameNumbering(p.Old.Mol(), p.New.Mol()) {
		name += " (as numbered before)"
	}
	return name
}

func atomsName(m *notation.Molecule, kind stereo.Kind, atoms []int) string {
	var names []string
	for _, a := range atoms {
		if a >= 0 && a < len(m.Atoms) {
			names = append(names, document.AtomName(m, a))
		}
	}
	if kind == stereo.KindDoubleBond {
		return strings.Join(names, "=")
	}
	return strings.Join(names, ", ")
}

// sameNumbering reports whether two records write the same elements in
// the same order, so that an atom number means the same in both (for
// naming only).
func sameNumbering(a, b *notation.Molecule) bool {
	if len(a.Atoms) != len(b.Atoms) {
		return false
	}
	for i := range a.Atoms {
		if a.Atoms[i].Number != b.Atoms[i].Number {
			return false
		}
	}
	return true
}

func centreSentence(c CentreChange) string {
	switch {
	case !c.OldPresent:
		return fmt.Sprintf("mapped centre %d now followed: %s", c.Map, c.After)
	case !c.NewPresent:
		return fmt.Sprintf("mapped centre %d no longer followed (was %s)", c.Map, c.Before)
	}
	return fmt.Sprintf("mapped centre %d: %s now (was %s)", c.Map, changeName(c.After), changeName(c.Before))
}

func changeName(c reaction.Change) string { return c.String() }

func roleName(r notation.Role) string {
	switch r {
	case notation.RoleReactant:
		return "reactants"
	case notation.RoleAgent:
		return "agents"
	case notation.RoleProduct:
		return "products"
	}
	return r.String()
}

func titled(r *Record) string {
	if r == nil || r.Occ.Title == "" {
		return ""
	}
	return " " + r.Occ.Title
}

// countUnits counts units as "2 centres", "1 centre and 1 axis".
func countUnits(us []UnitChange) string {
	centres, axes, bonds := 0, 0, 0
	for _, u := range us {
		switch u.Kind {
		case stereo.KindDoubleBond:
			bonds++
		case stereo.KindAllene:
			axes++
		default:
			centres++
		}
	}
	var parts []string
	if centres > 0 {
		parts = append(parts, plural(centres, "centre"))
	}
	if axes > 0 {
		parts = append(parts, plural(axes, "axis"))
	}
	if bonds > 0 {
		parts = append(parts, plural(bonds, "double bond"))
	}
	return strings.Join(parts, " and ")
}

func plural(n int, word string) string {
	if n == 1 {
		return "1 " + word
	}
	if word == "axis" {
		return fmt.Sprintf("%d axes", n)
	}
	return fmt.Sprintf("%d %ss", n, word)
}

// summary is the few words of an editor's lens.
func summary(p *Pair) string {
	where := func() string {
		var names []string
		role := notation.RoleNone
		for i, u := range p.Units {
			if i == 3 {
				names = append(names, "…")
				break
			}
			names = append(names, unitName(p, &u))
			role = u.Role
		}
		s := strings.Join(names, ", ")
		if s != "" {
			s = " at " + s
			if role != notation.RoleNone {
				s += " (" + roleName(role) + ")"
			}
		}
		return s
	}
	switch p.Class {
	case Epimer, Diastereomer, BondFlipped, StereoAdded, StereoRemoved:
		return p.Class.String() + where()
	case Enantiomer:
		if len(p.Units) > 0 && p.Units[0].Role != notation.RoleNone {
			return "enantiomer of the " + roleName(p.Units[0].Role)
		}
		return fmt.Sprintf("enantiomer (%s inverted)", countUnits(p.Units))
	case Rewritten:
		if len(p.Centres) > 0 {
			return "rewritten; mapped centres changed"
		}
		return "rewritten (same compound)"
	}
	return p.Class.String()
}

// groupNote says which stereo groups of kind or and and the records
// carry: their meaning is not that of the marks alone.
func groupNote(p *Pair) string {
	var oldNote, newNote string
	if p.Old != nil {
		oldNote = groupsOf(p.Old.Mol())
	}
	if p.New != nil {
		newNote = groupsOf(p.New.Mol())
	}
	switch {
	case oldNote == "" && newNote == "":
		return ""
	case oldNote == newNote:
		return "both versions carry stereo groups: " + newNote
	case oldNote == "":
		return "the new record carries stereo groups: " + newNote
	case newNote == "":
		return "the old record carried stereo groups: " + oldNote
	}
	return "the new record carries stereo groups: " + newNote + " (before: " + oldNote + ")"
}

// groupsOf describes the or and and groups of a record's extension
// block, "" when it has none.
func groupsOf(m *notation.Molecule) string {
	if m == nil || m.Extension == nil {
		return ""
	}
	var parts []string
	for _, g := range m.Extension.Groups {
		var meaning string
		switch g.Kind {
		case notation.GroupOr:
			meaning = "one of both configurations, unknown which"
		case notation.GroupAnd:
			meaning = "a mixture of both configurations"
		default:
			continue
		}
		atoms := slices.Clone(g.Atoms)
		slices.Sort(atoms)
		var names []string
		for _, a := range atoms {
			if a >= 0 && a < len(m.Atoms) {
				names = append(names, document.AtomName(m, a))
			}
		}
		parts = append(parts, fmt.Sprintf("%s at %s (%s)", g.Label(), strings.Join(names, ", "), meaning))
	}
	return strings.Join(parts, ", ")
}

package review

import (
	"fmt"
	"slices"

	"stereoline/notation"
	"stereoline/stereo"
	"stereoline/stereo/identity"
	"stereoline/stereo/reaction"
)

// This file implements the classification of a pair of records whose
// text differs: identity.CompareUnits says how the two structures are
// related and which units differ, stereo.Analyze's units give each unit
// its CIP label on each side. A reaction is compared role by role, and
// its mapped centres by map number.

// UnitChange is one stereogenic unit whose configuration the change
// altered, gave or took away.
type UnitChange struct {
	Kind stereo.Kind
	// Role is the part of a reaction the unit lies in; RoleNone outside
	// reactions.
	Role notation.Role
	// Atoms are the unit's atoms in the new record, OldAtoms in the old
	// one (0-based, through the whole record: the centre, or the two
	// ends of a double bond); nil on a side that leaves the unit open.
	Atoms, OldAtoms []int
	// Before and After are the CIP labels; DescNone on a side that
	// leaves the unit open (and where no label applies).
	Before, After stereo.Descriptor
	// Marks are the spans (in the record's text) of the marks that fix
	// the unit, old and new.
	OldMarks, Marks []notation.Span
}

// Marked reports whether the old and the new record fix the unit.
func (u *UnitChange) Marked() (old, new bool) { return u.OldAtoms != nil, u.Atoms != nil }

// RoleChange is the class of one part of a reaction.
type RoleChange struct {
	Role  notation.Role
	Class Class
	// Other counts the centres of the role that are configured on both
	// sides and unchanged.
	Other int
	// Formula is the role's formula, old and new, for a role whose
	// constitution changed.
	OldFormula, Formula string
}

// CentreChange is a mapped stereocentre of a reaction whose fate across
// the arrow changed (retention, inversion, lost, created, undetermined).
type CentreChange struct {
	Map           int
	Before, After reaction.Change
	// Present says whether the old and the new record follow the
	// centre at all (a map number may appear or go).
	OldPresent, NewPresent bool
}

// outcome is what classify finds.
type outcome struct {
	class   Class
	units   []UnitChange
	roles   []RoleChange
	centres []CentreChange
	reason  string // why a side does not read
	other   int    // centres configured alike on both sides
	formula [2]string
}

// classify relates the old and the new record of a pair.
func classify(o, n *side) outcome {
	if r := unreadable(o, n); r != "" {
		return outcome{class: Unreadable, reason: r}
	}
	om, nm := o.rec.Mol(), n.rec.Mol()
	if om.Reaction != nm.Reaction {
		out := outcome{class: ConstitutionChanged}
		out.formula = [2]string{formulaOf(om), formulaOf(nm)}
		return out
	}
	if om.Reaction {
		return classifyReaction(o, n)
	}
	return compareStructures(om, nm, o.rec.Stereo(), n.rec.Stereo(), 0, 0, notation.RoleNone)
}

// unreadable says why either side does not read without error, "" when
// both do.
func unreadable(o, n *side) string {
	first := func(m *notation.Molecule) *notation.Error {
		for _, e := range m.Errors {
			if e.Severity == notation.SeverityError {
				return e
			}
		}
		return nil
	}
	eo, en := first(o.rec.Mol()), first(n.rec.Mol())
	switch {
	case eo != nil && en != nil:
		return fmt.Sprintf("neither version reads: now %s [%s], before %s [%s]", en.Msg, en.Code, eo.Msg, eo.Code)
	case en != nil:
		return fmt.Sprintf("the new record does not read: %s [%s]", en.Msg, en.Code)
	case eo != nil:
		return fmt.Sprintf("the old record did not read: %s [%s]; the new one reads", eo.Msg, eo.Code)
	}
	if len(n.rec.Mol().Atoms) == 0 || len(o.rec.Mol().Atoms) == 0 {
		return "a side holds no atom"
	}
	return ""
}

// compareStructures classifies two structures (whole records, or one
// role of two reactions); offsets place their atoms in the records,
// whose analyses label them.
func compareStructures(om, nm *notation.Molecule, oan, nan *stereo.Analysis, oOff, nOff int, role notation.Role) outcome {
	c := identity.CompareUnits(om, nm)
	out := outcome{}
	switch c.Relation {
	case identity.Identical:
		out.class = Rewritten
	case identity.ConstitutionalIsomers, identity.Different:
		out.class = ConstitutionChanged
		out.formula = [2]string{formulaOf(om), formulaOf(nm)}
		return out
	case identity.Enantiomers:
		out.class = Enantiomer
	case identity.AbsoluteOfRelative, identity.AbsoluteOfMixture, identity.RelativeAndMixture:
		// the stereo groups say otherwise what is known of the same
		// stereoisomers; the explanation's note names the groups
		out.class = GroupsChanged
		return out
	}
	inverted, bonds, added, removed := 0, 0, 0, 0
	changed := map[int]bool{} // new centres that changed
	for _, d := range c.Differing {
		u := UnitChange{Kind: d.Kind, Role: role, OldAtoms: shift(d.Atoms, oOff), Atoms: shift(d.OtherAtoms, nOff)}
		if d.Specified[0] {
			if su := unitOn(oan, d.Kind, u.OldAtoms); su != nil {
				u.Before, u.OldMarks = su.Descriptor, su.Marks
			}
		} else {
			u.OldAtoms = nil
		}
		if d.Specified[1] {
			if su := unitOn(nan, d.Kind, u.Atoms); su != nil {
				u.After, u.Marks = su.Descriptor, su.Marks
			}
			if d.Kind != stereo.KindDoubleBond {
				changed[u.Atoms[0]] = true
			}
		} else {
			u.Atoms = nil
		}
		switch {
		case d.Specified[0] && d.Specified[1] && d.Kind == stereo.KindDoubleBond:
			bonds++
		case d.Specified[0] && d.Specified[1]:
			inverted++
		case d.Specified[1]:
			added++
		default:
			removed++
		}
		out.units = append(out.units, u)
	}
	out.other = centresBesides(nan, nOff, len(nm.Atoms), changed)
	sortUnits(out.units)
	if c.Relation == identity.Diastereomers || c.Relation == identity.Unspecified {
		if inverted > 0 && (added > 0 || removed > 0) || inverted >= 2 {
			if s, ok := simplest(om, nm, oan, nan, oOff, nOff, role, inverted, bonds, added, removed); ok {
				return s
			}
		}
		switch {
		case inverted == 0 && bonds == 0 && removed > 0:
			out.class = StereoRemoved
		case inverted == 0 && bonds == 0 && added > 0:
			out.class = StereoAdded
		case inverted == 0 && bonds > 0:
			out.class = BondFlipped
		case inverted == 1 && bonds == 0:
			out.class = Epimer
		default:
			// several units, or none named where the symmetry of the
			// constitution hides which
			out.class = Diastereomer
		}
	}
	return out
}

// centresBesides counts the tetrahedral centres the new side configures
// (atoms off to off+n of the record) that are not in changed.
func centresBesides(an *stereo.Analysis, off, n int, changed map[int]bool) int {
	count := 0
	for _, su := range an.Units {
		if su.Specified && su.Kind == stereo.KindTetrahedral && su.Centre >= off && su.Centre < off+n && !changed[su.Centre] {
			count++
		}
	}
	return count
}

// sortUnits orders units by their first atom in the new record, those
// only the old record fixes last, by their old atom.
func sortUnits(us []UnitChange) {
	key := func(u UnitChange) int {
		if len(u.Atoms) > 0 {
			return u.Atoms[0]
		}
		if len(u.OldAtoms) > 0 {
			return 1<<30 + u.OldAtoms[0]
		}
		return 1 << 31
	}
	slices.SortStableFunc(us, func(a, b UnitChange) int { return key(a) - key(b) })
}

func shift(atoms []int, off int) []int {
	if atoms == nil {
		return nil
	}
	out := make([]int, len(atoms))
	for i, a := range atoms {
		out[i] = a + off
	}
	return out
}

// unitOn finds the labeller's unit of a kind on atoms (the centre, or
// the two ends of a double bond in either order).
func unitOn(an *stereo.Analysis, kind stereo.Kind, atoms []int) *stereo.Unit {
	if an == nil || len(atoms) == 0 {
		return nil
	}
	for i := range an.Units {
		u := &an.Units[i]
		if !u.Specified {
			continue
		}
		switch {
		case kind == stereo.KindDoubleBond && u.Kind == stereo.KindDoubleBond && len(atoms) == 2 && len(u.Atoms) == 2:
			if u.Atoms[0] == atoms[0] && u.Atoms[1] == atoms[1] || u.Atoms[0] == atoms[1] && u.Atoms[1] == atoms[0] {
				return u
			}
		case kind != stereo.KindDoubleBond && u.Kind != stereo.KindDoubleBond && u.Centre == atoms[0]:
			return u
		}
	}
	return nil
}

func formulaOf(m *notation.Molecule) string {
	if m == nil || len(m.Atoms) == 0 {
		return ""
	}
	return notation.MolecularFormula(m).String()
}

// roles are the parts of a reaction in the order written.
var roles = []notation.Role{notation.RoleReactant, notation.RoleAgent, notation.RoleProduct}

// rolePart is one part of a reaction read on its own, with the index of
// its first atom in the whole record.
type rolePart struct {
	mol    *notation.Molecule
	offset int
}

// splitRoles reads each part of a reaction record on its own. ok is
// false when the parts do not read back to the atoms of the record.
func splitRoles(m *notation.Molecule) (map[notation.Role]rolePart, bool) {
	if len(m.Arrows) != 2 {
		return nil, false
	}
	end := len(m.Text)
	if m.Extension != nil {
		end = m.Extension.Separator.Start
	}
	a0, a1 := m.Arrows[0], m.Arrows[1]
	if a0.End > a1.Start || a1.End > end {
		return nil, false
	}
	texts := map[notation.Role]string{
		notation.RoleReactant: m.Text[:a0.Start],
		notation.RoleAgent:    m.Text[a0.End:a1.Start],
		notation.RoleProduct:  m.Text[a1.End:end],
	}
	out := map[notation.Role]rolePart{}
	for _, r := range roles {
		part := notation.ReadWith(texts[r], m.Reading)
		first, count := -1, 0
		for a := range m.Atoms {
			if m.Atoms[a].Role == r {
				if first < 0 {
					first = a
				}
				count++
			}
		}
		if count != len(part.Atoms) || part.Errors.HasErrors() && count > 0 {
			return nil, false
		}
		out[r] = rolePart{mol: part, offset: max(first, 0)}
	}
	return out, true
}

// classifyReaction compares two reactions role by role and their mapped
// centres by map number; the record takes the gravest class of its
// roles.
func classifyReaction(o, n *side) outcome {
	op, ok1 := splitRoles(o.rec.Mol())
	np, ok2 := splitRoles(n.rec.Mol())
	if !ok1 || !ok2 {
		return compareStructures(o.rec.Mol(), n.rec.Mol(), o.rec.Stereo(), n.rec.Stereo(), 0, 0, notation.RoleNone)
	}
	out := outcome{class: Rewritten}
	for _, r := range roles {
		a, b := op[r], np[r]
		if len(a.mol.Atoms) == 0 && len(b.mol.Atoms) == 0 {
			continue
		}
		var rc outcome
		if len(a.mol.Atoms) == 0 || len(b.mol.Atoms) == 0 {
			rc = outcome{class: ConstitutionChanged, formula: [2]string{formulaOf(a.mol), formulaOf(b.mol)}}
		} else {
			rc = compareStructures(a.mol, b.mol, o.rec.Stereo(), n.rec.Stereo(), a.offset, b.offset, r)
		}
		out.roles = append(out.roles, RoleChange{Role: r, Class: rc.class, Other: rc.other, OldFormula: rc.formula[0], Formula: rc.formula[1]})
		out.units = append(out.units, rc.units...)
		out.class = max(out.class, rc.class)
	}
	out.centres = centreChanges(o.rec.Reaction(), n.rec.Reaction())
	return out
}

// centreChanges lists the mapped centres whose fate changed.
func centreChanges(o, n *reaction.Result) []CentreChange {
	if o == nil || n == nil {
		return nil
	}
	before := map[int]reaction.Centre{}
	for _, c := range o.Centres {
		before[c.Map] = c
	}
	var out []CentreChange
	seen := map[int]bool{}
	for _, c := range n.Centres {
		seen[c.Map] = true
		b, ok := before[c.Map]
		if ok && b.Change == c.Change {
			continue
		}
		out = append(out, CentreChange{Map: c.Map, Before: b.Change, After: c.Change, OldPresent: ok, NewPresent: true})
	}
	for _, c := range o.Centres {
		if !seen[c.Map] {
			out = append(out, CentreChange{Map: c.Map, Before: c.Change, OldPresent: true})
		}
	}
	return out
}

// This file implements the identity of a record whose extension block
// holds or and and stereo groups: the set of absolute stereoisomers it
// stands for, and what it says of them.

package identity

import (
	"slices"
	"sort"
	"strconv"
	"strings"

	"stereoline/notation"
)

// A record without or and and groups stands for one stereoisomer. An or
// group makes it stand for one of two, unknown which: as written, or with
// every member of the group inverted; an and group for a mixture of the
// two (common practice: the molfile's enhanced stereo and CXSMILES). With
// several groups the record stands for a set of possible substances, each
// a set of stereoisomers: one substance per choice of the or groups, and
// in each the stereoisomers of every choice of the and groups. Two records
// are the same when they stand for the same possible substances, so
// C[C@H](O)CC |&1:1| and C[C@@H](O)CC |&1:1| are one racemate, and a meso
// compound in an or group is the meso compound.
//
// The sets are found by expansion: every choice of the groups is written
// into the units' parities and keyed as a structure of its own. Groups
// are read as the labeller reads them (stereo/groups.go): members are the
// tetrahedral and allene units the marks configure, and other listed atoms
// change nothing. Reactions are not keyed by their groups.

// SetKind says what a record stands for.
type SetKind uint8

// Set kinds. A record whose groups change nothing (a meso compound in an
// or group) is OneStereoisomer, like a record without groups.
const (
	// OneStereoisomer: one absolute stereoisomer (no or or and group).
	OneStereoisomer SetKind = iota
	// OneOf: one of several stereoisomers, unknown which (or groups):
	// relative configuration.
	OneOf
	// Mixture: a mixture of several stereoisomers (and groups): a
	// racemate when they are two enantiomers.
	Mixture
	// OneOfMixtures: one of several mixtures, unknown which (or and and
	// groups together).
	OneOfMixtures
)

var setKindNames = [...]string{"one stereoisomer", "one of several", "mixture", "one of several mixtures"}

func (k SetKind) String() string {
	if int(k) < len(setKindNames) {
		return setKindNames[k]
	}
	return "unknown"
}

// maxGroupChoices bounds the choices of the groups expanded (2 to the
// number of or and and groups); maxGroupWork bounds the choices times the
// atoms. Past either, a record is keyed without expansion (groupedKey),
// so two writings of it are found the same only when written alike.
const (
	maxGroupChoices = 1 << 10
	maxGroupWork    = 1 << 20
)

// groupSet is what Identify learns from the groups of a record.
type groupSet struct {
	// members are the keys of the stereoisomers the record stands for,
	// sorted; mirrors the keys of their mirror images, in the same
	// order.
	members, mirrors []string
	union            string // digest of members
	// pair is set when the members are two enantiomers.
	pair bool
}

// Isomers returns the number of stereoisomers the record stands for: 1
// without or and and groups; 0 when the groups were not expanded (too
// many of them).
func (id *Identity) Isomers() int {
	if id.set == nil {
		if id.Set == OneStereoisomer {
			return 1
		}
		return 0
	}
	return len(id.set.members)
}

// Pair reports whether the record stands for two enantiomers: a
// racemate (Mixture) or one enantiomer, unknown which (OneOf), with the
// relative configuration written.
func (id *Identity) Pair() bool { return id.set != nil && id.set.pair }

// contains reports whether the record stands for a set holding the
// stereoisomer with key k.
func (s *groupSet) contains(k string) bool {
	i := sort.SearchStrings(s.members, k)
	return i < len(s.members) && s.members[i] == k
}

// keyGroups returns, for each or and and group of m with a member among
// the units, the indices of its units and whether it is an and group;
// nil when there is none.
func keyGroups(m *notation.Molecule, units []keyUnit) (groups [][]int, and []bool) {
	groups, and, _ = keyGroupsOf(m, units)
	return groups, and
}

// keyGroupsOf is keyGroups that also gives each group's index in
// m.Extension.Groups.
func keyGroupsOf(m *notation.Molecule, units []keyUnit) (groups [][]int, and []bool, block []int) {
	if m.Extension == nil || m.Reaction || len(units) == 0 {
		return nil, nil, nil
	}
	var byCentre map[int]int
	taken := map[int]bool{}
	for bi, sg := range m.Extension.Groups {
		if sg.Kind != notation.GroupOr && sg.Kind != notation.GroupAnd {
			continue
		}
		if byCentre == nil {
			byCentre = make(map[int]int, len(units))
			for i := range units {
				if units[i].kind != keyDoubleBond {
					byCentre[units[i].centre] = i
				}
			}
		}
		var members []int
		for _, a := range sg.Atoms {
			if ui, ok := byCentre[a]; ok && !taken[ui] {
				taken[ui] = true
				members = append(members, ui)
			}
		}
		if len(members) > 0 {
			groups = append(groups, members)
			and = append(and, sg.Kind == notation.GroupAnd)
			block = append(block, bi)
		}
	}
	return groups, and, block
}

// CodeGroupAddsNothing is the code of GroupFindings.
const CodeGroupAddsNothing notation.Code = "stereo-group-adds-nothing" // an or or and group whose inversion is the structure as written

// maxGroupChecks bounds the groups GroupFindings checks, each costing
// one identity key; maxFindingAtoms bounds the records it checks, since
// the key of a very large record is costly and GroupFindings runs for
// every record with groups, not only those a list relates.
const (
	maxGroupChecks  = 64
	maxFindingAtoms = 400
)

// GroupFindings reports the or and and groups of m that add nothing
// (records of up to maxFindingAtoms atoms):
// inverting every member of the group gives the structure as written (a
// meso compound whose centres the group holds, or centres that are not
// chiral together), so the record stands for that one structure whatever
// the group says. The span is the group's field.
func GroupFindings(m *notation.Molecule) notation.ErrorList {
	if m == nil || m.Extension == nil || len(m.Atoms) == 0 || len(m.Atoms) > maxFindingAtoms {
		return nil
	}
	g := newKeyGraph(m)
	groups, _, block := keyGroupsOf(m, g.units)
	if len(groups) == 0 {
		return nil
	}
	written := identifyGraph(g, g.units)
	var out notation.ErrorList
	units := make([]keyUnit, len(g.units))
	for i, members := range groups[:min(len(groups), maxGroupChecks)] {
		copy(units, g.units)
		for _, ui := range members {
			units[ui].hand = units[ui].hand.Reversed()
		}
		if identifyGraph(g, units).Key != written.Key {
			continue
		}
		sg := &m.Extension.Groups[block[i]]
		span := m.Extension.Span
		if sg.Field >= 0 && sg.Field < len(m.Extension.Fields) {
			span = m.Extension.Fields[sg.Field].Span
		}
		e := out.Add(span, CodeGroupAddsNothing,
			"inverting every centre of stereo group %s gives the same structure (a meso form, or centres not chiral together): the record is the one structure its marks write, and the group adds nothing", sg.Label())
		e.Severity = notation.SeverityInformation
	}
	return out
}

// identifyGroups computes the identity of a record with or and and
// groups over its units: written is the identity of the marks as
// written.
func identifyGroups(g *keyGraph, groups [][]int, and []bool, written Identity) Identity {
	n := len(groups)
	if n >= 31 || 1<<n > maxGroupChoices || (1<<n)*max(g.n, 1) > maxGroupWork {
		return groupedKey(g, groups, and, written)
	}
	var ors, ands []int
	for i := range groups {
		if and[i] {
			ands = append(ands, i)
		} else {
			ors = append(ors, i)
		}
	}
	byKey := map[string]string{}
	substances := make([][]string, 0, 1<<len(ors))
	units := make([]keyUnit, len(g.units))
	for o := 0; o < 1<<len(ors); o++ {
		var sub []string
		for a := 0; a < 1<<len(ands); a++ {
			copy(units, g.units)
			flip := func(set []int, bits int) {
				for k, gi := range set {
					if bits&(1<<k) == 0 {
						continue
					}
					for _, ui := range groups[gi] {
						units[ui].hand = units[ui].hand.Reversed()
					}
				}
			}
			flip(ors, o)
			flip(ands, a)
			var id Identity
			if o == 0 && a == 0 {
				id = written
			} else {
				id = identifyGraph(g, units)
			}
			byKey[id.Key] = id.MirrorKey
			sub = append(sub, id.Key)
		}
		sub = sortedUnique(sub)
		substances = append(substances, sub)
	}
	out := written
	set := &groupSet{}
	for k := range byKey {
		set.members = append(set.members, k)
	}
	sort.Strings(set.members)
	for _, k := range set.members {
		set.mirrors = append(set.mirrors, byKey[k])
	}
	set.union = digest("union\x00", strings.Join(set.members, ","))
	set.pair = len(set.members) == 2 && set.mirrors[0] == set.members[1]
	text, kind := serialiseSubstances(substances, nil)
	if kind == OneStereoisomer {
		// the groups change nothing: the record is its one stereoisomer
		return out
	}
	mirrorText, _ := serialiseSubstances(substances, byKey)
	out.Key, out.MirrorKey = digest(text), digest(mirrorText)
	out.Set, out.set = kind, set
	return out
}

// serialiseSubstances writes a set of substances (each a sorted list of
// stereoisomer keys) in a form that does not depend on their order, with
// each key replaced by its mirror when mirror is given, and says what
// kind of set it is.
func serialiseSubstances(subs [][]string, mirror map[string]string) (string, SetKind) {
	lines := make([]string, 0, len(subs))
	mixed := false
	for _, s := range subs {
		keys := s
		if mirror != nil {
			keys = make([]string, len(s))
			for i, k := range s {
				keys[i] = mirror[k]
			}
			keys = sortedUnique(keys)
		}
		if len(keys) > 1 {
			mixed = true
		}
		lines = append(lines, strings.Join(keys, ","))
	}
	lines = sortedUnique(lines)
	kind := OneStereoisomer
	switch {
	case len(lines) > 1 && mixed:
		kind = OneOfMixtures
	case len(lines) > 1:
		kind = OneOf
	case mixed:
		kind = Mixture
	}
	return "groups\x00" + strings.Join(lines, ";"), kind
}

func sortedUnique(s []string) []string {
	sort.Strings(s)
	return slices.Compact(s)
}

// groupedKey keys a record whose groups are too many to expand: the
// written key with each group's kind and the constitution-order
// positions of its members. Two records get one key only when they are
// written with the same configuration and groups, so a duplicate may be
// missed but never invented.
func groupedKey(g *keyGraph, groups [][]int, and []bool, written Identity) Identity {
	pos := map[int]int{}
	for _, u := range written.units {
		if len(u.atoms) == 1 {
			pos[u.atoms[0]] = u.code[1]
		}
	}
	parts := make([]string, 0, len(groups))
	for i, members := range groups {
		var ps []int
		for _, ui := range members {
			if p, ok := pos[g.units[ui].centre]; ok {
				ps = append(ps, p)
			}
		}
		sort.Ints(ps)
		var b strings.Builder
		if and[i] {
			b.WriteString("&")
		} else {
			b.WriteString("o")
		}
		for _, p := range ps {
			b.WriteString(" " + strconv.Itoa(p))
		}
		parts = append(parts, b.String())
	}
	sort.Strings(parts)
	out := written
	out.Key = digest("unexpanded\x00", written.Key, "\x00", strings.Join(parts, ";"))
	out.MirrorKey = digest("unexpanded\x00", written.MirrorKey, "\x00", strings.Join(parts, ";"))
	hasOr, hasAnd := false, false
	for _, a := range and {
		hasAnd = hasAnd || a
		hasOr = hasOr || !a
	}
	switch {
	case hasOr && hasAnd:
		out.Set = OneOfMixtures
	case hasAnd:
		out.Set = Mixture
	default:
		out.Set = OneOf
	}
	return out
}

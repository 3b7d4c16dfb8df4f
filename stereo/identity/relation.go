// This file implements Compare: how two structures are related.

package identity

import (
	"slices"

	"stereoline/notation"
	"stereoline/stereo"
)

// Relation is how two structures are related.
type Relation uint8

// Relations, from closest to farthest. Unspecified is a pair with the
// same constitution whose configurations differ only where one of them
// leaves a unit unmarked: they may be the same compound.
//
// Three relations come from stereo groups (groups.go), between a record
// that stands for one stereoisomer and one that stands for several, or
// two that stand for the same several in different ways:
// AbsoluteOfRelative (the one stereoisomer is one the other, relative
// record may be: the same relative configuration, one absolute and one
// relative), AbsoluteOfMixture (it is one of the stereoisomers the other
// mixes: the enantiomer of a racemate), RelativeAndMixture (the same
// stereoisomers, one record saying one of them, unknown which, the other
// their mixture).
const (
	Identical Relation = iota
	Enantiomers
	AbsoluteOfRelative
	AbsoluteOfMixture
	RelativeAndMixture
	Diastereomers
	Unspecified
	ConstitutionalIsomers
	Different
)

var relationNames = [...]string{"identical", "enantiomers", "absolute-of-relative", "absolute-of-mixture", "relative-and-mixture",
	"diastereomers", "unspecified", "constitutional-isomers", "different"}

func (r Relation) String() string {
	if int(r) < len(relationNames) {
		return relationNames[r]
	}
	return "unknown"
}

// UnitDifference names one unit in which two stereoisomers differ. Atoms
// are 0-based atoms of the first structure (the centre, or the two ends
// of a double bond) and OtherAtoms the same unit in the second; a side
// that leaves the unit unmarked has Specified false there.
type UnitDifference struct {
	Kind       stereo.Kind
	Atoms      []int
	OtherAtoms []int
	// Specified says, for each side, whether it fixes the unit.
	Specified [2]bool
}

// Comparison is the result of Compare.
type Comparison struct {
	Relation  Relation
	Differing []UnitDifference
	// Single says, for AbsoluteOfRelative and AbsoluteOfMixture, which
	// structure is the one stereoisomer: 0 the first, 1 the second. Pair
	// says that the other stands for two enantiomers (a racemate, or
	// one enantiomer with the relative configuration written), for
	// those two and RelativeAndMixture.
	Single int
	Pair   bool
}

// Compare relates two structures: the same, mirror images, stereoisomers
// (naming the differing units), the same formula with another
// constitution, or different.
func Compare(a, b *notation.Molecule) Comparison {
	ia, ib := Identify(a), Identify(b)
	return compareIdentities(ia, ib, func() bool {
		return notation.MolecularFormula(a).String() == notation.MolecularFormula(b).String()
	})
}

// compareIdentities relates two identities; sameFormula is asked only
// when the constitutions differ.
func compareIdentities(a, b Identity, sameFormula func() bool) Comparison {
	switch {
	case a.Key == b.Key:
		return Comparison{Relation: Identical}
	case a.ConstitutionKey != b.ConstitutionKey:
		if sameFormula != nil && sameFormula() {
			return Comparison{Relation: ConstitutionalIsomers}
		}
		return Comparison{Relation: Different}
	case a.Key == b.MirrorKey:
		return Comparison{Relation: Enantiomers}
	}
	if c, ok := setRelation(&a, &b); ok {
		return c
	}
	diff := unitDifferences(a.units, b.units)
	rel := Diastereomers
	if len(diff) > 0 {
		rel = Unspecified
		for _, d := range diff {
			if d.Specified[0] && d.Specified[1] {
				rel = Diastereomers
				break
			}
		}
	}
	return Comparison{Relation: rel, Differing: diff}
}

// setRelation relates two identities of one constitution by the sets of
// stereoisomers their stereo groups make them stand for.
func setRelation(a, b *Identity) (Comparison, bool) {
	switch {
	case a.Set == OneStereoisomer && b.set != nil && b.set.contains(a.Key):
		return Comparison{Relation: memberRelation(b.Set), Single: 0, Pair: b.set.pair}, true
	case b.Set == OneStereoisomer && a.set != nil && a.set.contains(b.Key):
		return Comparison{Relation: memberRelation(a.Set), Single: 1, Pair: a.set.pair}, true
	case a.set != nil && b.set != nil && a.set.union == b.set.union:
		return Comparison{Relation: RelativeAndMixture, Pair: a.set.pair}, true
	}
	return Comparison{}, false
}

// memberRelation is the relation of one stereoisomer to a set of kind k
// that holds it.
func memberRelation(k SetKind) Relation {
	if k == OneOf {
		return AbsoluteOfRelative
	}
	return AbsoluteOfMixture
}

// unitDifferences lines up the units of two structures of one
// constitution by their positions in the constitution order and lists
// those whose parity differs or that only one side specifies. Where the
// constitution is symmetric the line-up follows one of the equivalent
// orders, so a symmetric molecule may name an equivalent unit instead.
func unitDifferences(a, b []identityUnit) []UnitDifference {
	type slot struct{ kind, p0, p1 int }
	key := func(u identityUnit) slot { return slot{u.code[0], u.code[1], u.code[2]} }
	inB := map[slot]identityUnit{}
	for _, u := range b {
		inB[key(u)] = u
	}
	var out []UnitDifference
	seen := map[slot]bool{}
	for _, u := range a {
		k := key(u)
		seen[k] = true
		v, ok := inB[k]
		switch {
		case !ok:
			out = append(out, UnitDifference{Kind: u.kind.public(), Atoms: u.atoms, Specified: [2]bool{true, false}})
		case v.hand != u.hand:
			out = append(out, UnitDifference{Kind: u.kind.public(), Atoms: u.atoms, OtherAtoms: v.atoms, Specified: [2]bool{true, true}})
		}
	}
	for _, v := range b {
		if !seen[key(v)] {
			out = append(out, UnitDifference{Kind: v.kind.public(), OtherAtoms: v.atoms, Specified: [2]bool{false, true}})
		}
	}
	slices.SortStableFunc(out, func(x, y UnitDifference) int { return firstAtom(x) - firstAtom(y) })
	return out
}

func firstAtom(d UnitDifference) int {
	if len(d.Atoms) > 0 {
		return d.Atoms[0]
	}
	if len(d.OtherAtoms) > 0 {
		return 1<<30 + d.OtherAtoms[0]
	}
	return 1 << 31
}

// public maps the key's unit kinds to the engine's.
func (k unitKind) public() stereo.Kind {
	switch k {
	case keyDoubleBond:
		return stereo.KindDoubleBond
	case keyAllene:
		return stereo.KindAllene
	}
	return stereo.KindTetrahedral
}

package smarts

import (
	"fmt"
	"sort"

	"stereoline/notation"
)

// Change is what a reaction template does to the configuration of a
// mapped atom that carries a tetrahedral mark on either side.
type Change uint8

// Changes.
const (
	// ChangeRetained: marked on both sides with the same configuration
	// once the neighbours are paired by their maps.
	ChangeRetained Change = iota + 1
	// ChangeInverted: marked on both sides with the opposite
	// configuration.
	ChangeInverted
	// ChangeCreated: marked in the products only; the template sets the
	// configuration.
	ChangeCreated
	// ChangeRemoved: marked in the reactants only; the products leave it
	// open.
	ChangeRemoved
	// ChangeUndetermined: marked on both sides, but the neighbours
	// cannot be paired across the arrow (see MappedCentre.Note).
	ChangeUndetermined
)

// String returns the verb a hover uses: "retains", "inverts", ...
func (c Change) String() string {
	switch c {
	case ChangeRetained:
		return "retains"
	case ChangeInverted:
		return "inverts"
	case ChangeCreated:
		return "creates"
	case ChangeRemoved:
		return "removes"
	case ChangeUndetermined:
		return "leaves undetermined"
	}
	return "unknown"
}

// MappedCentre is one mapped product atom whose configuration the
// template speaks about.
type MappedCentre struct {
	Map      int
	Reactant int // atom index in the pattern, -1 when the map is in the products only
	Product  int
	Change   Change
	// Note says why a change is undetermined; empty otherwise.
	Note string
}

// TemplateStereo says, for every mapped product atom with a tetrahedral
// mark (@ or @@) on either side of a reaction template, whether the
// template retains, inverts, creates or removes its configuration.
//
// The marks of a pattern are read in the neighbour order of OpenSMILES
// (the preceding atom, a hydrogen written in the brackets, ring closures
// where their digits stand, then branches and the chain; an atom with
// three neighbours has its implicit fourth where the hydrogen would be).
// Reactant and product neighbours are paired by their atom maps; one
// neighbour on each side that the other side lacks, mapped or not, is
// taken as the group that replaces the other (a leaving group and its
// nucleophile), as RDKit 2022.09 does when it applies a template. With
// two or more unmapped neighbours the pairing is a guess, and the
// centre is undetermined.
// With the pairing, the two marks describe the same arrangement exactly
// when they are equal and the pairing is an even permutation.
//
// Patterns that are not reactions, or whose arrows are malformed, have
// no centres. A map used twice on one side makes its centre
// undetermined. Centres come in order of their map numbers.
func TemplateStereo(p *Pattern) []MappedCentre {
	if !p.Reaction || len(p.Arrows) != 2 {
		return nil
	}
	reactants, rdup := mapIndex(p, notation.RoleReactant)
	products, pdup := mapIndex(p, notation.RoleProduct)
	var out []MappedCentre
	for m, pa := range products {
		ra, inReactants := reactants[m]
		if !inReactants {
			ra = -1
		}
		pm := p.Atoms[pa].Chirality
		rm := 0
		if ra >= 0 {
			rm = p.Atoms[ra].Chirality
		}
		if pm == 0 && rm == 0 {
			continue
		}
		c := MappedCentre{Map: m, Reactant: ra, Product: pa}
		switch {
		case rdup[m] || pdup[m]:
			c.Change, c.Note = ChangeUndetermined, fmt.Sprintf("map %d is used more than once on one side", m)
		case rm == 0:
			c.Change = ChangeCreated
		case pm == 0:
			c.Change = ChangeRemoved
		default:
			c.Change, c.Note = compareMarks(p, ra, pa)
		}
		out = append(out, c)
	}
	sort.Slice(out, func(i, j int) bool { return out[i].Map < out[j].Map })
	return out
}

// mapIndex maps atom map numbers to the atoms of one role; dup marks
// numbers used more than once.
func mapIndex(p *Pattern, role notation.Role) (idx map[int]int, dup map[int]bool) {
	idx, dup = map[int]int{}, map[int]bool{}
	for i := range p.Atoms {
		a := &p.Atoms[i]
		if a.Role != role || a.Map == 0 {
			continue
		}
		if _, seen := idx[a.Map]; seen {
			dup[a.Map] = true
			continue
		}
		idx[a.Map] = i
	}
	return idx, dup
}

// Neighbour keys: a mapped neighbour by its map, the rest by kind.
const (
	keyHydrogen = -1 // a hydrogen written in the brackets
	keyImplicit = -2 // the implicit fourth neighbour of a three-neighbour atom
	keyUnmapped = -3
)

// stereoNeighbours lists the keys of atom a's neighbours in the order
// its mark refers to.
func stereoNeighbours(p *Pattern, a int) []int {
	at := &p.Atoms[a]
	slot := 0
	if at.HasPrev {
		slot = 1
	}
	extra := 0
	switch {
	case at.Hydrogen:
		extra = keyHydrogen
	case len(at.Bonds) == 3:
		extra = keyImplicit
	}
	var keys []int
	for i := range at.Bonds {
		if extra != 0 && i == slot {
			keys = append(keys, extra)
		}
		n := p.Neighbour(a, i)
		if m := p.Atoms[n].Map; m != 0 {
			keys = append(keys, m)
		} else {
			keys = append(keys, keyUnmapped)
		}
	}
	if extra != 0 && len(keys) == len(at.Bonds) {
		keys = append(keys, extra)
	}
	return keys
}

// compareMarks pairs the neighbours of a reactant and a product atom and
// compares their marks.
func compareMarks(p *Pattern, ra, pa int) (Change, string) {
	r, q := stereoNeighbours(p, ra), stereoNeighbours(p, pa)
	if len(r) != 4 || len(q) != 4 {
		return ChangeUndetermined, "a marked atom needs four neighbours on each side, counting a hydrogen"
	}
	if count(r, keyUnmapped) > 1 || count(q, keyUnmapped) > 1 {
		return ChangeUndetermined, "more than one unmapped neighbour, so the neighbours cannot be paired"
	}
	// One neighbour on each side that the other side lacks (mapped or
	// not) is the group the reaction replaces: pair the two.
	q = pairReplaced(r, q)
	odd, ok := permutationParity(r, q)
	if !ok {
		return ChangeUndetermined, "the neighbours differ across the arrow"
	}
	same := p.Atoms[ra].Chirality == p.Atoms[pa].Chirality
	if same != odd {
		return ChangeRetained, ""
	}
	return ChangeInverted, ""
}

// pairReplaced returns q with its one key that r lacks replaced by the
// one key of r that q lacks; q unchanged when the sides differ in
// anything but one neighbour.
func pairReplaced(r, q []int) []int {
	onlyR, onlyQ := difference(r, q), difference(q, r)
	if len(onlyR) != 1 || len(onlyQ) != 1 {
		return q
	}
	out := append([]int(nil), q...)
	out[index(out, onlyQ[0])] = onlyR[0]
	return out
}

// difference returns the keys of a that b does not hold.
func difference(a, b []int) []int {
	var out []int
	for _, x := range a {
		if index(b, x) < 0 {
			out = append(out, x)
		}
	}
	return out
}

func count(s []int, v int) int {
	n := 0
	for _, x := range s {
		if x == v {
			n++
		}
	}
	return n
}

func index(s []int, v int) int {
	for i, x := range s {
		if x == v {
			return i
		}
	}
	return -1
}

// permutationParity reports whether b is an odd permutation of a; ok is
// false when b is not a permutation of a with distinct entries.
func permutationParity(a, b []int) (odd, ok bool) {
	if len(a) != len(b) {
		return false, false
	}
	cur := append([]int(nil), a...)
	swaps := 0
	for i := range b {
		j := index(cur[i:], b[i])
		if j < 0 || count(b, b[i]) != 1 {
			return false, false
		}
		if j > 0 {
			cur[i], cur[i+j] = cur[i+j], cur[i]
			swaps++
		}
	}
	return swaps%2 == 1, true
}

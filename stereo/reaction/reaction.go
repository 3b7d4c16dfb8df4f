// This file implements the check of mapped reactions: atom maps,
// retention and inversion, lost configurations.

package reaction

import (
	"fmt"
	"sort"

	"stereoline/notation"
	"stereoline/stereo"
	"stereoline/stereo/internal/ringgeom"
)

// Codes of the reaction diagnostics.
const (
	CodeMapDuplicate notation.Code = "map-duplicate"        // one atom-map number on two atoms of one side
	CodeMapUnpaired  notation.Code = "map-unpaired"         // a product atom whose map number no reactant atom carries
	CodeStereoLost   notation.Code = "reaction-stereo-lost" // a unit specified in the reactants and unspecified in the products
)

// Change is what a reaction does to a mapped tetrahedral centre.
type Change uint8

// Changes. Undetermined means the centre is specified on both sides but
// too few ligands persist to compare the arrangements.
const (
	ChangeRetention Change = iota
	ChangeInversion
	ChangeLost
	ChangeCreated
	ChangeUndetermined
)

var changeNames = [...]string{"retention", "inversion", "lost", "created", "undetermined"}

func (c Change) String() string {
	if int(c) < len(changeNames) {
		return changeNames[c]
	}
	return "unknown"
}

// Centre is one mapped tetrahedral centre followed across the
// arrow. Reactant and Product are 0-based atoms.
type Centre struct {
	Map               int
	Reactant, Product int
	Change            Change
	// ReactantLabel and ProductLabel are the CIP labels on each side
	// (DescNone when unspecified).
	ReactantLabel, ProductLabel stereo.Descriptor
	// Note explains a label that disagrees with the geometry, or why the
	// change is undetermined.
	Note string
}

// Result is the outcome of Analyze.
type Result struct {
	Centres     []Centre
	Diagnostics notation.ErrorList
}

// Analyze checks the atom maps of a reaction record and follows
// every mapped tetrahedral centre across the arrow. A record that is not
// a reaction gives an empty result.
func Analyze(m *notation.Molecule) *Result {
	return AnalyzeWith(m, nil)
}

// AnalyzeWith is Analyze reusing an analysis of m (nil
// to compute one).
func AnalyzeWith(m *notation.Molecule, an *stereo.Analysis) *Result {
	res := &Result{}
	if m == nil || !m.Reaction {
		return res
	}
	if an == nil {
		an = stereo.Analyze(m)
	}
	side := map[notation.Role]map[int]int{notation.RoleReactant: {}, notation.RoleAgent: {}, notation.RoleProduct: {}}
	for a := range m.Atoms {
		at := &m.Atoms[a]
		if at.Map == 0 || side[at.Role] == nil {
			continue
		}
		if b, dup := side[at.Role][at.Map]; dup {
			e := res.Diagnostics.Add(at.Span, CodeMapDuplicate, "map number %d is used twice among the %ss", at.Map, at.Role)
			e.Related = append(e.Related, notation.Related{Span: m.Atoms[b].Span, Msg: "the first use"})
			continue
		}
		side[at.Role][at.Map] = a
	}
	reactants, products := side[notation.RoleReactant], side[notation.RoleProduct]
	for a := range m.Atoms {
		at := &m.Atoms[a]
		if at.Role == notation.RoleProduct && at.Map != 0 && side[notation.RoleProduct][at.Map] == a {
			if _, ok := reactants[at.Map]; !ok {
				e := res.Diagnostics.Add(at.Span, CodeMapUnpaired, "map number %d is on no reactant atom", at.Map)
				e.Severity = notation.SeverityWarning
			}
		}
	}
	specified := map[int]*stereo.Unit{}
	for i := range an.Units {
		u := &an.Units[i]
		if u.Specified && u.Kind == stereo.KindTetrahedral {
			specified[u.Centre] = u
		}
	}
	maps := make([]int, 0, len(reactants))
	for k := range reactants {
		maps = append(maps, k)
	}
	sort.Ints(maps)
	for _, k := range maps {
		r := reactants[k]
		p, ok := products[k]
		if !ok {
			continue
		}
		ur, up := specified[r], specified[p]
		if ur == nil && up == nil {
			continue
		}
		c := Centre{Map: k, Reactant: r, Product: p}
		if ur != nil {
			c.ReactantLabel = ur.Descriptor
		}
		if up != nil {
			c.ProductLabel = up.Descriptor
		}
		switch {
		case up == nil:
			c.Change = ChangeLost
			e := res.Diagnostics.Add(m.Atoms[p].Span, CodeStereoLost, "the configuration of mapped atom %d is specified in the reactants but not in the products", k)
			e.Severity = notation.SeverityWarning
			e.Related = append(e.Related, notation.Related{Span: m.Atoms[r].Span, Msg: "the specified centre in the reactants"})
		case ur == nil:
			c.Change = ChangeCreated
		default:
			c.Change, c.Note = compareCentres(m, r, p)
			c.Note = labelNote(c)
		}
		res.Centres = append(res.Centres, c)
	}
	res.lostBonds(m, an, reactants, products)
	res.Diagnostics.Sort()
	return res
}

// ligand tokens on the two sides: a persisting neighbour is its map
// number; these stand for the rest
const (
	tokenHydrogen = -1 // implicit hydrogen or lone pair
	tokenReplaced = -2 // a ligand that leaves, or the one that arrives
)

// compareCentres judges retention or inversion at reactant centre r and
// product centre p from the written neighbour orders and hands.
func compareCentres(m *notation.Molecule, r, p int) (Change, string) {
	lr, hr, okr := centreLigands(m, r)
	lp, hp, okp := centreLigands(m, p)
	if !okr || !okp {
		return ChangeUndetermined, "a centre without four ligands"
	}
	mapsR, mapsP := ligandMaps(m, lr), ligandMaps(m, lp)
	tr, nr := tokens(m, lr, mapsP)
	tp, np := tokens(m, lp, mapsR)
	if nr > 1 || np > 1 || nr != np {
		return ChangeUndetermined, fmt.Sprintf("%d ligands change; at most one can be replaced in place", max(nr, np))
	}
	// the position of each reactant token in the product order
	pos := make([]int, len(tr))
	used := make([]bool, len(tp))
	for i, x := range tr {
		pos[i] = -1
		for j, y := range tp {
			if !used[j] && x == y {
				pos[i], used[j] = j, true
				break
			}
		}
		if pos[i] < 0 {
			return ChangeUndetermined, "the ligands on the two sides do not correspond"
		}
	}
	parity, ok := ringgeom.PermutationParity(pos)
	if !ok {
		return ChangeUndetermined, "the ligands on the two sides do not correspond"
	}
	// the reactant's hand read in the product's order of the same tokens
	if hr.Permuted(parity) == hp {
		return ChangeRetention, ""
	}
	return ChangeInversion, ""
}

// centreLigands returns the ligands of a marked centre in stereo order
// and the hand of its mark.
func centreLigands(m *notation.Molecule, a int) ([]int, ringgeom.Hand, bool) {
	ch := m.Atoms[a].Chirality
	if ch.Class != notation.ChiralTH {
		return nil, ringgeom.NoHand, false
	}
	count := len(m.Atoms[a].Bonds) + m.Atoms[a].HydrogenCount()
	ligs := ringgeom.Ligands(m, a, count == 3, true)
	// folded [H] atoms are hydrogens here too
	if len(ligs) != 4 {
		return nil, ringgeom.NoHand, false
	}
	// a number the reader rejected (@TH3, read as 0 and reported as an
	// error) is taken as '@'
	hand := ringgeom.MarkHand(ch.Num)
	if hand == ringgeom.NoHand {
		hand = ringgeom.Anticlockwise
	}
	return ligs, hand, true
}

// ligandMaps returns the set of map numbers among the ligands.
func ligandMaps(m *notation.Molecule, ligs []int) map[int]bool {
	out := map[int]bool{}
	for _, x := range ligs {
		if x >= 0 && m.Atoms[x].Map != 0 {
			out[m.Atoms[x].Map] = true
		}
	}
	return out
}

// tokens turns ligands into tokens: a hydrogen or lone pair, the map
// number of a ligand that is bonded to the centre on the other side too,
// or a replaced ligand. It also counts the replaced ones.
func tokens(m *notation.Molecule, ligs []int, other map[int]bool) ([]int, int) {
	out := make([]int, len(ligs))
	n := 0
	for i, x := range ligs {
		switch {
		case x == stereo.ImplicitNeighbour:
			out[i] = tokenHydrogen
		case m.Atoms[x].Map != 0 && other[m.Atoms[x].Map]:
			out[i] = m.Atoms[x].Map
		default:
			out[i] = tokenReplaced
			n++
		}
	}
	return out, n
}

// labelNote says where the CIP labels disagree with the geometry.
func labelNote(c Centre) string {
	if c.Note != "" || !c.ReactantLabel.Labelled() || !c.ProductLabel.Labelled() {
		return c.Note
	}
	sameLabel := c.ReactantLabel == c.ProductLabel
	switch {
	case c.Change == ChangeRetention && !sameLabel:
		return fmt.Sprintf("the label changes from %s to %s although the arrangement is kept: the priorities changed", c.ReactantLabel, c.ProductLabel)
	case c.Change == ChangeInversion && sameLabel:
		return fmt.Sprintf("the label stays %s although the centre is inverted: the priorities changed", c.ReactantLabel)
	}
	return ""
}

// lostBonds warns about mapped double bonds specified in the reactants
// whose product counterpart is a double bond left unspecified.
func (res *Result) lostBonds(m *notation.Molecule, an *stereo.Analysis, reactants, products map[int]int) {
	type pair struct{ a, b int }
	spec := map[pair]bool{}
	for _, u := range an.Units {
		if u.Kind == stereo.KindDoubleBond && u.Specified && len(u.Atoms) == 2 {
			spec[pair{min(u.Atoms[0], u.Atoms[1]), max(u.Atoms[0], u.Atoms[1])}] = true
		}
	}
	for _, u := range an.Units {
		if u.Kind != stereo.KindDoubleBond || !u.Specified || len(u.Atoms) != 2 || m.Atoms[u.Atoms[0]].Role != notation.RoleReactant {
			continue
		}
		k0, k1 := m.Atoms[u.Atoms[0]].Map, m.Atoms[u.Atoms[1]].Map
		if k0 == 0 || k1 == 0 {
			continue
		}
		p0, ok0 := products[k0]
		p1, ok1 := products[k1]
		if !ok0 || !ok1 || reactants[k0] != u.Atoms[0] || reactants[k1] != u.Atoms[1] {
			continue
		}
		bi := m.BondBetween(p0, p1)
		if bi < 0 || m.Bonds[bi].Order != notation.OrderDouble || spec[pair{min(p0, p1), max(p0, p1)}] {
			continue
		}
		e := res.Diagnostics.Add(m.Bonds[bi].Span, CodeStereoLost, "the double bond between mapped atoms %d and %d is specified in the reactants but not in the products", k0, k1)
		e.Severity = notation.SeverityWarning
	}
}

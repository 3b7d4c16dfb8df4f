// This file implements the one-pass index that relates the records of a
// list.

package identity

// Index relates each record of a list to the records before it in one
// pass: the keys of earlier records sit in maps, so adding a record costs
// a few lookups whatever the length of the list, and no pair of records
// is ever compared directly.
//
// The zero value is not ready; use NewIndex.
type Index struct {
	byKey          map[string]int // first record with each key
	byConstitution map[string]int // first record with each constitution
	units          [][]identityUnit
	n              int
}

// NewIndex returns an empty index.
func NewIndex() *Index {
	return &Index{byKey: map[string]int{}, byConstitution: map[string]int{}}
}

// Match is what Add finds for a new record.
type Match struct {
	// Relation is Identical for a duplicate of an earlier record,
	// Enantiomers for its mirror image, Diastereomers (or Unspecified)
	// for another configuration of an earlier constitution, and
	// Different when nothing earlier shares its constitution.
	Relation Relation
	// Earlier is the index (0-based, in the order of Add) of the earlier
	// record, or -1.
	Earlier int
	// Differing names the units in which a stereoisomer differs from the
	// earlier record; Atoms are the new record's, OtherAtoms the earlier
	// one's.
	Differing []UnitDifference
}

// Add records id as the next record and relates it to the first earlier
// record it matches: a duplicate before a mirror image before a
// stereoisomer. The record gets the index Len() had before the call.
func (x *Index) Add(id Identity) Match {
	i := x.n
	x.n++
	x.units = append(x.units, id.units)
	m := Match{Relation: Different, Earlier: -1}
	if id.Key == "" {
		return m
	}
	if j, ok := x.byKey[id.Key]; ok {
		m = Match{Relation: Identical, Earlier: j}
	} else if j, ok := x.byKey[id.MirrorKey]; ok {
		m = Match{Relation: Enantiomers, Earlier: j}
	} else if j, ok := x.byConstitution[id.ConstitutionKey]; ok {
		c := compareIdentities(id, Identity{Key: "\x00", MirrorKey: "\x00", ConstitutionKey: id.ConstitutionKey, units: x.units[j]}, nil)
		m = Match{Relation: c.Relation, Earlier: j, Differing: c.Differing}
	}
	if _, ok := x.byKey[id.Key]; !ok {
		x.byKey[id.Key] = i
	}
	if _, ok := x.byConstitution[id.ConstitutionKey]; !ok {
		x.byConstitution[id.ConstitutionKey] = i
	}
	return m
}

// Len returns the number of records added.
func (x *Index) Len() int { return x.n }

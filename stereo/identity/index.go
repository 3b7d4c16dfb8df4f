// This file implements the one-pass index that relates the records of a
// list.

package identity

import (
	"crypto/sha256"
	"encoding/hex"
)

// Index relates each record of a list to the records before it in one
// pass: the keys of earlier records sit in maps, so adding a record costs
// a few lookups whatever the length of the list, and no pair of records
// is ever compared directly.
//
// The zero value is not ready; use NewIndex.
type Index struct {
	byKey map[indexKey]int // first record with each key
	// byConstitution holds the first record with each constitution and
	// its units: only that record is ever compared unit by unit (Add),
	// so a long list of stereoisomers keeps no units of the others.
	byConstitution map[indexKey]firstOfConstitution
	// Records with stereo groups (groups.go): the first that stands for
	// a set holding each stereoisomer, and the first with each set.
	byMember map[string]int
	byUnion  map[string]int
	grouped  map[int]groupedRecord // the records with sets, by index
	n        int
}

// indexKey is a key (digest) as the 16 bytes its 32 hexadecimal digits
// write: the index of a list of a million records holds about as many
// keys, and a fixed-size map key needs no allocation of its own.
type indexKey [16]byte

// keyOf returns the index key of a key.
func keyOf(k string) indexKey {
	var out indexKey
	if len(k) == 2*len(out) {
		if _, err := hex.Decode(out[:], []byte(k)); err == nil {
			return out
		}
	}
	// Not a digest (none is made otherwise): a digest of it, which
	// differs from every other key's as digests do.
	sum := sha256.Sum256([]byte(k))
	copy(out[:], sum[:])
	return out
}

type firstOfConstitution struct {
	record int
	units  []identityUnit
}

// groupedRecord is what the index keeps of a record with a set.
type groupedRecord struct {
	kind SetKind
	pair bool
}

// NewIndex returns an empty index.
func NewIndex() *Index {
	return &Index{byKey: map[indexKey]int{}, byConstitution: map[indexKey]firstOfConstitution{}, byMember: map[string]int{}, byUnion: map[string]int{},
		grouped: map[int]groupedRecord{}}
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
	// Single and Pair are those of Comparison for the relations of
	// stereo groups: Single is 0 when the new record is the one
	// stereoisomer, 1 when the earlier one is.
	Single int
	Pair   bool
}

// Add records id as the next record and relates it to the first earlier
// record it matches: a duplicate before a mirror image before a relation
// of stereo groups (the earliest record) before a stereoisomer. The
// record gets the index Len() had before the call.
func (x *Index) Add(id Identity) Match {
	i := x.n
	x.n++
	m := Match{Relation: Different, Earlier: -1}
	if id.Key == "" {
		return m
	}
	key, con := keyOf(id.Key), keyOf(id.ConstitutionKey)
	first, conSeen := x.byConstitution[con]
	if j, ok := x.byKey[key]; ok {
		m = Match{Relation: Identical, Earlier: j}
	} else if j, ok := x.byKey[keyOf(id.MirrorKey)]; ok {
		m = Match{Relation: Enantiomers, Earlier: j}
	} else if sm, ok := x.setMatch(&id); ok {
		m = sm
	} else if conSeen {
		c := compareIdentities(id, Identity{Key: "\x00", MirrorKey: "\x00", ConstitutionKey: id.ConstitutionKey, units: first.units}, nil)
		m = Match{Relation: c.Relation, Earlier: first.record, Differing: c.Differing}
	}
	if _, ok := x.byKey[key]; !ok {
		x.byKey[key] = i
	}
	if !conSeen {
		x.byConstitution[con] = firstOfConstitution{record: i, units: id.units}
	}
	if id.set != nil {
		x.grouped[i] = groupedRecord{kind: id.Set, pair: id.set.pair}
		for _, k := range id.set.members {
			if _, ok := x.byMember[k]; !ok {
				x.byMember[k] = i
			}
		}
		if _, ok := x.byUnion[id.set.union]; !ok {
			x.byUnion[id.set.union] = i
		}
	}
	return m
}

// setMatch finds the earliest earlier record that id is related to by
// stereo groups: a set holding id's one stereoisomer, one stereoisomer
// of id's set, or the same stereoisomers said another way.
func (x *Index) setMatch(id *Identity) (Match, bool) {
	if id.set == nil && len(x.grouped) == 0 {
		return Match{}, false // no sets in the list: the common case costs nothing
	}
	best := Match{Earlier: -1}
	consider := func(j int, rel Relation, single int, pair bool) {
		if best.Earlier < 0 || j < best.Earlier {
			best = Match{Relation: rel, Earlier: j, Single: single, Pair: pair}
		}
	}
	if id.set == nil {
		if id.Set == OneStereoisomer {
			if j, ok := x.byMember[id.Key]; ok {
				consider(j, memberRelation(x.grouped[j].kind), 0, x.grouped[j].pair)
			}
		}
	} else {
		for _, k := range id.set.members {
			if j, ok := x.byKey[keyOf(k)]; ok {
				if _, grouped := x.grouped[j]; !grouped {
					consider(j, memberRelation(id.Set), 1, id.set.pair)
				}
			}
		}
		if j, ok := x.byUnion[id.set.union]; ok {
			consider(j, RelativeAndMixture, 0, id.set.pair)
		}
	}
	return best, best.Earlier >= 0
}

// Len returns the number of records added.
func (x *Index) Len() int { return x.n }

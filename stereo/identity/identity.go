// This file implements Identify: the identity keys and chirality class of
// a structure.

package identity

import (
	"crypto/sha256"
	"encoding/hex"

	"stereoline/notation"
	"stereoline/stereo"
	"stereoline/stereo/internal/ringgeom"
)

// Chirality says whether a structure, as its marks describe it, differs
// from its mirror image.
type Chirality uint8

// Chirality classes. A meso structure is achiral although it has
// specified stereocentres (centres with four constitutionally different
// ligands), which then cancel each other.
const (
	Achiral Chirality = iota
	Chiral
	Meso
)

func (c Chirality) String() string {
	switch c {
	case Chiral:
		return "chiral"
	case Meso:
		return "meso"
	}
	return "achiral"
}

// Identity is what Identify learns about one structure.
type Identity struct {
	// Key is the same for every writing of one structure and differs
	// between structures, stereoisomers included; a meso form and its
	// mirror image share it. MirrorKey is the Key of the mirror image.
	// ConstitutionKey ignores every stereo mark.
	//
	// A record with or and and stereo groups stands for a set of
	// stereoisomers (groups.go): its Key is then the same for every record
	// that stands for the same set in the same way, and MirrorKey is the
	// Key of the mirror-image set (the same for a racemate). Chirality is
	// always that of the structure as written.
	Key, MirrorKey, ConstitutionKey string
	Chirality                       Chirality
	// Set says what the record stands for: one stereoisomer, or, by its
	// groups, one of several or a mixture.
	Set SetKind
	set *groupSet // the stereoisomers, when Set is not OneStereoisomer

	// units are the units in the key, each with its parity expressed on
	// the constitution-only canonical order, for naming the units in
	// which two stereoisomers differ.
	units []identityUnit
}

// identityUnit is one kept unit in constitution-canonical terms.
type identityUnit struct {
	code   [4]int        // kind, positions, parity on the constitution order
	atoms  []int         // molecule atoms: the centre, or the two ends
	hand   ringgeom.Hand // parity on the constitution order
	kind   unitKind
	chiral bool // a tetrahedral or allene unit (changes in a mirror)
}

// digest turns a serialisation, given in parts to be joined, into a
// short printable key. The parts are hashed through a small buffer on
// the stack: converting a serialisation of hundreds of bytes to a slice
// allocated a copy of it for every key of every record.
func digest(parts ...string) string {
	h := sha256.New()
	var chunk [512]byte
	for _, s := range parts {
		for len(s) > 0 {
			n := copy(chunk[:], s)
			h.Write(chunk[:n])
			s = s[n:]
		}
	}
	var sum [sha256.Size]byte
	var out [32]byte
	hex.Encode(out[:], h.Sum(sum[:0])[:16])
	return string(out[:])
}

// Identify computes the keys and the chirality class of m.
func Identify(m *notation.Molecule) Identity {
	if m == nil || len(m.Atoms) == 0 {
		return Identity{} // no structure: no key, related to nothing
	}
	st := keyStores.Get().(*keyStore)
	g := newKeyGraphIn(m, st)
	id := identifyGraph(g, g.units)
	if groups, and := keyGroups(m, g.units); len(groups) > 0 {
		id = identifyGroups(g, groups, and, id)
	}
	g.releaseScratch()
	st.release(g)
	return id
}

// shortcuts lets the key take the cheaper ways that give the same
// result: the mirror image's key and the constitution's serialisation
// from the structure's own run (canonState.mirrorLeaf and plain), and
// no smallest rings for aromaticity where no ring can change it
// (kekuleRingPossible); the tests turn it off to compare.
var shortcuts = true

// identifyGraph computes an Identity from a key graph and a set of unit
// configurations (the marks, their mirror image, or an enumerated
// assignment).
func identifyGraph(g *keyGraph, units []keyUnit) Identity {
	base := g.baseRanks()
	poly, polyChiral := hasPolyhedra(g.mol)
	if len(units) == 0 && !poly {
		// no marks: the stereo serialisation is the constitution's with
		// an empty unit list (a zero varint), and the mirror is the same
		con := newCanonState(g, units, false).runFrom(base)
		k := digest(con.text, "\x00")
		return Identity{Key: k, MirrorKey: k, ConstitutionKey: digest(con.text)}
	}
	st := newCanonState(g, units, true)
	res := st.runFrom(base)
	cs := newCanonState(g, units, false)
	var con canonResult
	if shortcuts && st.plain() {
		// the constitution's run breaks the same ties in the same order
		con = cs.leafOn(res)
	} else {
		con = cs.runFrom(base)
	}
	key := digest(res.text)
	id := Identity{Key: key, MirrorKey: key, ConstitutionKey: digest(con.text)}
	needMirror := polyChiral
	for i := range units {
		if st.keep[i] && units[i].kind != keyDoubleBond {
			// only tetrahedral and allene units change in a mirror
			needMirror = true
		}
	}
	if needMirror {
		ms := newCanonState(g, mirrorUnits(units), true)
		ms.mirrored = true
		text, ok := "", false
		if shortcuts {
			text, ok = st.mirrorLeaf(ms, res)
		}
		if !ok {
			text = ms.runFrom(base).text
		}
		id.MirrorKey = digest(text)
	}
	centres := 0
	// a specified chirality centre: a tetrahedral unit whose ligands
	// already differ by constitution
	for i := range units {
		u := &units[i]
		if !st.keep[i] {
			continue
		}
		if u.kind == keyTetrahedral && st.parity(u, base) != ringgeom.NoHand {
			centres++
		}
		p := st.parity(u, con.rank)
		id.units = append(id.units, identityUnit{code: unitCode(u, con.rank, int(p)), atoms: unitAtoms(u), hand: p, kind: u.kind,
			chiral: u.kind != keyDoubleBond})
	}
	switch {
	case id.Key != id.MirrorKey:
		id.Chirality = Chiral
	case centres > 0:
		id.Chirality = Meso
	}
	return id
}

func unitAtoms(u *keyUnit) []int {
	if u.kind == keyDoubleBond {
		return []int{u.ends[0], u.ends[1]}
	}
	return []int{u.centre}
}

// mirrorUnits returns the configurations of the mirror image: every
// tetrahedral and allene handedness reversed, double bonds kept.
func mirrorUnits(units []keyUnit) []keyUnit {
	out := make([]keyUnit, len(units))
	copy(out, units)
	for i := range out {
		if out[i].kind != keyDoubleBond {
			out[i].hand = out[i].hand.Reversed()
		}
	}
	return out
}

// ConstitutionKey returns the key of m without stereo; it is cheaper than
// Identify when only the constitution matters.
func ConstitutionKey(m *notation.Molecule) string {
	if m == nil {
		return ""
	}
	g := newKeyGraph(m)
	return digest(newCanonState(g, nil, false).run().text)
}

// UnitID names a marked unit of a molecule: its kind and its centre
// (tetrahedral, allene) or, for a double bond, its bond. Atom and bond
// indices survive every transform, since transforms keep the atom order.
type UnitID struct {
	Kind stereo.Kind
	At   int
}

// Configurations reads every unit the marks of m configure and gives its
// configuration on the atom order itself (atom indices standing for
// ranks): +1 or -1, the unit's parity. Two texts with the same atoms in
// the same order configure a unit alike exactly when they give it the
// same value; units whose ligands tie on that order are left out.
func Configurations(m *notation.Molecule) map[UnitID]int {
	g := newKeyGraph(m)
	rank := make([]int, g.n)
	for i := range rank {
		rank[i] = i
	}
	c := newCanonState(g, g.units, true)
	out := map[UnitID]int{}
	for i := range g.units {
		u := &g.units[i]
		id := UnitID{Kind: u.kind.public(), At: u.centre}
		if u.kind == keyDoubleBond {
			id.At = u.bond
		}
		if p := c.parity(u, rank); p != ringgeom.NoHand {
			out[id] = int(p)
		}
	}
	return out
}

// This file implements Identifier: identity keys of one structure after
// another, with the work on a constitution shared between consecutive
// structures that differ only in their marks.

package identity

import (
	"stereoline/notation"
	"stereoline/stereo/internal/skeleton"
)

// An Identifier computes the identity keys of structures one after
// another, as Identify does. When a structure has the constitution of the
// one before, atom for atom in the same order (the stereoisomers of one
// compound in a list, written alike but for their marks), the key graph's
// atoms, edges and aromaticity and the refined ranks of its atoms are
// taken from that one instead of being computed again; only the marks
// are read. The keys are the same either way.
//
// An Identifier is used by one goroutine at a time. Its zero value is
// ready to use.
type Identifier struct {
	st   *keyStore
	last *keyGraph         // the last structure's graph, whose constitution parts the next may share
	sig  skeleton.Skeleton // what those parts were computed from
	// shared counts the structures that shared the parts (for the tests)
	shared int

	// the last pre-key computed and the constitution it was computed from
	preKey    uint64
	preKeyOf  skeleton.Skeleton
	preShared int // for the tests
}

// PreKey is ConstitutionPreKey(m), taken from the last structure asked
// for when m has its constitution (skeleton.Skeleton.Same).
func (x *Identifier) PreKey(m *notation.Molecule) uint64 {
	if x.preKeyOf.Same(m) {
		x.preShared++
		return x.preKey
	}
	x.preKey = ConstitutionPreKey(m)
	if len(m.Atoms) > keyStoreKeep {
		x.preKeyOf.Forget()
		return x.preKey
	}
	x.preKeyOf.Take(m)
	return x.preKey
}

// Identify computes the keys and the chirality class of m.
func (x *Identifier) Identify(m *notation.Molecule) Identity {
	if m == nil || len(m.Atoms) == 0 {
		return Identity{}
	}
	if x.st == nil {
		x.st = new(keyStore)
	}
	var g *keyGraph
	if x.last != nil && x.sig.Same(m) {
		g = x.last.withMarksOf(m, x.st)
		x.shared++
	} else {
		x.last = nil
		g = newKeyGraphIn(m, x.st)
		x.sig.Take(m)
	}
	id := identifyGraph(g, g.units)
	if groups, and := keyGroups(m, g.units); len(groups) > 0 {
		id = identifyGroups(g, groups, and, id)
	}
	g.releaseScratch()
	if g.n > keyStoreKeep {
		// a large structure's storage is not kept
		*x = Identifier{}
		return id
	}
	x.last = g
	return id
}

// withMarksOf returns the key graph of m, whose constitution is g's
// (skeleton.Skeleton.Same): it shares g's atoms, edges, aromaticity and base
// ranks, which nothing changes once made, and reads m's own marks. The
// ring searches, which keep the molecule they ran on, run again on m
// when asked for.
func (g *keyGraph) withMarksOf(m *notation.Molecule, st *keyStore) *keyGraph {
	g.baseRanks() // made once, shared from now on
	n := &keyGraph{mol: m, n: g.n, folded: g.folded, hydro: g.hydro, adj: g.adj, arom: g.arom, base: g.base, atoms: g.atoms}
	n.units = st.units[:0]
	n.readUnits()
	st.units = n.units[:0]
	return n
}

package smarts

import "stereoline/notation"

// Pattern is a SMARTS or reaction SMARTS as read: the atoms and bonds of
// its top level (the atoms of recursive $(...) patterns are read and
// checked but not kept), in the order written.
type Pattern struct {
	Text   string
	Atoms  []Atom
	Bonds  []Bond
	Errors notation.ErrorList

	// Reaction is true when the pattern has '>' outside brackets; Arrows
	// holds their spans.
	Reaction bool
	Arrows   []notation.Span
}

// Atom is one atom of the pattern: an unbracketed symbol or a bracketed
// expression.
type Atom struct {
	Span    notation.Span // the whole token, brackets included
	Bracket bool
	// Map is the atom map number (":n" at the end of a bracket), 0 when
	// absent.
	Map int
	// Chirality is the first tetrahedral mark of the expression (@ is 1,
	// @@ is 2), 0 when none; ChiralitySpan is where it is written.
	Chirality     int
	ChiralitySpan notation.Span
	// Hydrogen is true when the expression has an H primitive that
	// stands for one attached hydrogen ([C@H], [C@@H:1]), which takes
	// the hydrogen's place in the neighbour order of a mark.
	Hydrogen bool
	Role     notation.Role
	// Bonds lists the atom's bonds in the stereo neighbour order of
	// OpenSMILES, which SMARTS shares: the bond to the preceding atom,
	// ring closures where their digits are written, then branches and
	// the chain.
	Bonds []int
	// HasPrev is true when Bonds[0] is the bond to the preceding atom.
	HasPrev bool
}

// Bond is one bond of the pattern, with its query expression as written
// (empty for an implied bond).
type Bond struct {
	Begin, End int
	Span       notation.Span // the expression, or empty at the second atom
	Ring       bool
}

// Other returns the atom at the other end of the bond.
func (b *Bond) Other(a int) int {
	if b.Begin == a {
		return b.End
	}
	return b.Begin
}

// Neighbour returns the atom at the other end of the i-th bond of atom a.
func (p *Pattern) Neighbour(a, i int) int {
	return p.Bonds[p.Atoms[a].Bonds[i]].Other(a)
}

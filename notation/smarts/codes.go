package smarts

import "stereoline/notation"

// Codes reported by the SMARTS reader. They are public and never
// renamed; each is a grammar error (severity error).
const (
	// CodeSyntax: a character the SMARTS grammar does not allow here.
	CodeSyntax notation.Code = "smarts-syntax"
	// CodeUnclosedRing: a ring-closure number never closed.
	CodeUnclosedRing notation.Code = "smarts-unclosed-ring"
	// CodeRingBond: a ring closure back to the same atom or between
	// atoms already bonded.
	CodeRingBond notation.Code = "smarts-ring-bond"
	// CodeUnknownElement: a letter in an atom expression that is no
	// element symbol and no primitive.
	CodeUnknownElement notation.Code = "smarts-unknown-element"
	// CodeReaction: a reaction pattern with one '>' or more than two.
	CodeReaction notation.Code = "smarts-reaction"
)

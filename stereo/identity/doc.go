// Package identity says which structures are the same compound: it
// computes identity keys on a canonical order of the constitution with
// the stereo units expressed on it (Identify), relates two structures
// (Compare) or every record of a list to the earlier ones in one pass
// (Index), counts the stereoisomers a constitution allows
// (Stereoisomers) and gives a cheap constitution pre-key
// (ConstitutionPreKey) that tells which records of a list can be related
// at all.
//
// The key reads the marks itself, on a graph of its own (keygraph.go),
// instead of taking the labeller's units: what makes a mark part of a
// structure's identity is graph symmetry, not CIP ranking. It imports
// package stereo only for the shared vocabulary (kinds of unit, the
// implicit neighbour), and the ring and bicycle geometry it shares with
// the labeller from stereo/internal/ringgeom; agree_test.go checks that
// the units the key keeps are the marked units the labeller reports.
package identity

// Package smarts reads SMARTS and reaction SMARTS: query patterns, the
// language of substructure filters and reaction templates. Reading
// never fails: Read returns the pattern it could build and an error list
// whose entries carry a code of this package (grammar errors only; a
// pattern describes a set of molecules, so valence, aromaticity and
// stereo checks of notation do not apply to it) and a span inside the
// text.
//
// The grammar is that of the Daylight SMARTS theory manual (atomic and
// bond primitives, the operators ! & , ; with their precedence,
// recursive $(...) patterns, atom maps, component-level grouping in
// reactions) with the extensions of the general-purpose libraries (RDKit
// 2022.09: ranges such as D{2-3}, hybridization ^n, the dative bond <-,
// z and Z neighbour counts). Where the two differ, a pattern is read as
// RDKit reads it: TestRDKitSMARTS compares acceptance with RDKit's
// parser on every SMARTS that Debian's rdkit-data ships and on variants
// of them.
//
// TemplateStereo says, for a reaction template, which mapped centres
// the template inverts, retains, creates or removes (template.go).
package smarts

// Package stereo finds the stereogenic units of a molecule read by
// package notation, interprets the stereo marks written on them, labels
// them by the Cahn-Ingold-Prelog rules (IUPAC 2013 recommendations, P-92,
// with the 2018 revisions for machine implementation) and reports marks
// that mean nothing or cannot be true.
//
// Analyze is the entry point. It runs one labeller over a view of the
// molecule (graph.go) in phases, in this order (analyze.go):
//
//  1. Reading the marks: chirality marks (analyze.go) and direction marks
//     around double bonds (marks.go) become configurations (config.go),
//     read over the neighbour order OpenSMILES defines.
//  2. Checking them against the geometry: bridgeheads of small bicycles
//     (bridgehead.go), ring closures marked twice, bridgeheads fixed by
//     their cage.
//  3. Labelling the marked units (units.go): one file per geometry
//     (tetrahedral.go, doublebond.go, allene.go) ranks the ligands
//     (rank.go) on a hierarchical digraph (digraph.go) by the sequence
//     rules, one per file (rule1a.go to rule6.go), chained in rules.go;
//     Rules 3 to 5 read auxiliary descriptors (auxiliary.go).
//  4. Perceiving the units the marks leave open (perceive.go): by
//     constitutional symmetry classes, by configurations written
//     elsewhere, and units stereogenic only together (together.go).
//
// The result is a value (Analysis): nothing in the molecule changes, and
// nothing in a result points into the storage one call grows, which a
// pool keeps for the next call (workspace.go). Families gives the D/L
// descriptors of amino acids and sugars (family.go).
//
// Identity keys, relations and stereoisomer counts (stereo/identity),
// transforms (stereo/transform) and mapped reactions (stereo/reaction)
// are packages of their own above this one; the ring and bicycle
// geometry this package shares with the identity keys lives in
// stereo/internal/ringgeom.
package stereo

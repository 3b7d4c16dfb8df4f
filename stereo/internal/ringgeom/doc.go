// Package ringgeom holds the molecular-graph geometry that both stereo
// engines use: perception and CIP labelling (package stereo) and the
// identity keys (package stereo/identity). Each concept is computed
// here once, so that a fix reaches both engines:
//
//   - the sizes that decide what counts as small: the smallest ring that
//     holds a trans double bond, the longest bridge of a small bicycle,
//     the largest fused bicycle that cannot be trans-fused;
//   - ring degree, partner bridgeheads, bridge and fused paths, and the
//     test for a bridgehead fixed by its cage, over the caller's
//     predicates for equal bridges and configured atoms (bicycle.go);
//   - cumulated chains, the ends of an allene and its four ligands in
//     OpenSMILES order (chain.go);
//   - one permutation parity and one typed handedness (parity.go);
//   - disjoint sets (sets.go).
//
// The searches walk the molecule's own neighbour order (the stereo order
// of notation.Atom.Bonds), so the two engines find the same paths.
package ringgeom

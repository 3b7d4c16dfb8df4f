// This file implements Sequence Rule 5.

package stereo

// Rule 5: R precedes S and M precedes P. Two ligands that differ only
// here are enantiomorphic, and a centre decided by this rule is
// pseudoasymmetric (lowercase label). Auxiliary descriptors.
func rule5Value(d *digraph, root, n nodeID) float64 {
	switch d.auxFor(root, n) {
	case DescR, DescM:
		return 2
	case DescS, DescP:
		return 1
	}
	return 0
}

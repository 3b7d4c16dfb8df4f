// This file implements Sequence Rule 4a.

package stereo

// Rule 4a: chiral stereogenic units precede pseudoasymmetric ones, which
// precede non-stereogenic atoms. Auxiliary descriptors.
func rule4aValue(d *digraph, root, n nodeID) float64 {
	switch d.auxFor(root, n) {
	case DescR, DescS, DescM, DescP:
		return 2
	case DescPseudoR, DescPseudoS, DescPseudoM, DescPseudoP:
		return 1
	}
	return 0
}

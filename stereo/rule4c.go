// This file implements Sequence Rule 4c.

package stereo

// Rule 4c: r precedes s (and m precedes p). Auxiliary descriptors.
func rule4cValue(d *digraph, root, n nodeID) float64 {
	switch d.auxFor(root, n) {
	case DescPseudoR, DescPseudoM:
		return 2
	case DescPseudoS, DescPseudoP:
		return 1
	}
	return 0
}

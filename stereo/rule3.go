// This file implements Sequence Rule 3.

package stereo

// Rule 3: seqCis (Z) precedes seqTrans (E), and a stereogenic double bond
// precedes a non-stereogenic one. The descriptors are auxiliary ones,
// assigned inside the digraph (auxiliary.go).
func rule3Value(d *digraph, root, n nodeID) float64 {
	switch d.auxFor(root, n) {
	case DescZ, DescPseudoZ:
		return 2
	case DescE, DescPseudoE:
		return 1
	}
	return 0
}

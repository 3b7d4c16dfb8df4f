// This file implements Sequence Rule 1b.

package stereo

import "math"

// Rule 1b (2018 revision, root distance): a duplicate atom whose
// corresponding non-duplicated atom lies nearer the root precedes one
// whose corresponding atom lies farther away. Only ring-closure
// duplicates count: the duplicates of a multiple bond sit beside their
// atom whichever Kekulé structure is written, and must not tell two
// writings of one ring apart. Non-duplicated atoms rank
// below every duplicate under this rule; the rule is reached only when
// Rule 1a has left two branches tied, so this only orders duplicates of
// equal atomic number against each other and against real atoms.
func rule1bValue(d *digraph, root, n nodeID) float64 {
	x := &d.nodes[n]
	if x.kind != nodeDuplicate || !x.ringDup || x.corr == noNode {
		return math.Inf(-1)
	}
	return -float64(d.treeDistance(root, x.corr))
}

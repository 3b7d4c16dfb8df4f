package stereo

// Rule 6 (proposed by Hanson et al. 2018): an undifferentiated reference
// node has priority over any other undifferentiated node. In a digraph
// this is a duplicate of the root: when the branches are otherwise
// equal, the one that returns to the root first (reached through the
// duplicate nearest in hierarchical order) precedes.
func rule6Value(d *digraph, root, n nodeID) float64 {
	x := &d.nodes[n]
	if x.kind == nodeDuplicate && x.corr == root {
		return 1
	}
	return 0
}

// This file implements Sequence Rule 1a.

package stereo

// Rule 1a: higher atomic number precedes lower. Duplicate atoms carry the
// atomic number of the atom they duplicate (averaged over the Kekulé
// structures in mancude rings, P-92.1.4.4); phantom atoms and lone pairs
// have atomic number zero.
func rule1aValue(d *digraph, root, n nodeID) float64 {
	return d.nodes[n].z
}

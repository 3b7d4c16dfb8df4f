// This file implements Sequence Rule 2.

package stereo

// Rule 2: higher atomic mass precedes lower. A written isotope counts
// with its exact mass, an atom without one with the standard atomic
// weight (Hanson et al. 2018), so [16O] ranks below a plain O.
func rule2Value(d *digraph, root, n nodeID) float64 {
	return d.nodes[n].mass
}

// This file implements Sequence Rule 6 and the trials of its reference.

package stereo

// Rule 6 (proposed by Hanson et al. 2018): an undifferentiated reference
// node has priority over any other undifferentiated node. When Rules 1 to
// 5 leave ligands of a unit tied although the unit is stereogenic (C2-
// and D2-symmetric spiro compounds and cages), one of the tied ligands is
// taken as the reference; every node standing for its atom then ranks
// above the others. The unit is stereogenic only if every choice of
// reference gives the same descriptor (see withReference).
func rule6Value(d *digraph, root, n nodeID) float64 {
	x := &d.nodes[n]
	// the reference belongs to the unit being labelled; an auxiliary
	// ranking (another root) sees only its own reference
	ref, ok := d.referenceOf(root)
	if !ok {
		return 0
	}
	if ref >= 0 && x.atom == ref && (x.kind == nodeAtom || x.kind == nodeDuplicate) {
		return 1
	}
	return 0
}

// withReference relabels a unit whose ranking was left tied, once with
// each tied candidate as the Rule 6 reference. It returns the label when
// all choices agree, and the tied label otherwise.
func (l *labeller) withReference(tied label, candidates []int, run func(ref int) label) label {
	// a reference can split a pair; three or more equal ligands (the
	// bridgeheads of adamantane, cubane, barrelene) stay equal
	if len(candidates) < 2 {
		return tied
	}
	var first label
	for i, c := range candidates {
		lb := run(c)
		if lb.capped {
			return lb
		}
		if lb.tie || !lb.desc.Labelled() {
			return tied
		}
		if i == 0 {
			first = lb
		} else if lb.desc != first.desc {
			return tied
		}
	}
	return first
}

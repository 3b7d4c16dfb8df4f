// This file implements the labelling of tetrahedral centres (R/S).

package stereo

// Tetrahedral centres: R/S (r/s when pseudoasymmetric) for an atom with
// four ligands, one of which may be an implicit hydrogen or a lone pair.

// label is the outcome of labelling one unit.
type label struct {
	desc      Descriptor
	ranked    []RankedLigand
	decisions []Decision
	tie       bool // two ligands cannot be told apart: not stereogenic
	capped    bool // the digraph hit its node cap
}

func (l *labeller) tetrahedral(t *tetraConfig) label {
	d := l.digraph(t.centre)
	defer l.release(d)
	lb, cands := l.tetrahedralWith(d, t, -1, true)
	if lb.tie && !lb.capped {
		lb = l.withReference(lb, cands, func(ref int) label {
			x, _ := l.tetrahedralWith(d, t, ref, true)
			return x
		})
	}
	return lb
}

// tetrahedralWith labels a centre with a given Rule 6 reference atom (-1
// for none) and returns the atoms of the ligands left tied. Without
// wantLabel only the ranking counts (an unmarked centre): the
// mirror-image test for a pseudoasymmetric label is left out, and the
// descriptor is never lowercase.
func (l *labeller) tetrahedralWith(d *digraph, t *tetraConfig, ref int, wantLabel bool) (label, []int) {
	var n3 int
	pick := func(d *digraph) []nodeID {
		ligs := d.ligandsOf(unitRoot, noNode)
		if t.lonePair && len(ligs) == 3 {
			ligs = append(ligs, d.lonePair(unitRoot))
		}
		n3 = len(ligs)
		return ligs
	}
	var r ranking
	if wantLabel {
		r = l.rootRanking(d, ref, pick)
	} else {
		r, _ = l.plainRanking(d, ref, pick)
	}
	ligs := make([]nodeID, n3)
	out := label{capped: d.capped, tie: r.tie}
	out.decisions = r.decisions
	out.ranked = make([]RankedLigand, 0, len(r.order))
	for i, n := range r.order {
		out.ranked = append(out.ranked, RankedLigand{Rank: i + 1, Atom: d.ligandAtom(n), LonePair: d.nodes[n].kind == nodeLonePair})
	}
	switch {
	case d.capped:
		out.desc = DescUndetermined
	case r.tie || len(ligs) != 4:
		out.tie = true
	default:
		x, ok := d.descriptorFromRanking(r, t)
		if !ok {
			out.tie = true
			break
		}
		if r.pseudo {
			x = pseudo(x)
		}
		out.desc = x
	}
	var cands []int
	for _, n := range r.tied {
		if a := d.ligandAtom(n); a >= 0 {
			cands = append(cands, a)
		}
	}
	return out, cands
}

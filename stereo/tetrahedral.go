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
	d := newDigraph(l.g, l.cfg, t.centre, l.nodeCap)
	ligs := d.ligandsOf(0, noNode)
	if t.lonePair && len(ligs) == 3 {
		ligs = append(ligs, d.lonePair(0))
	}
	r := d.rankLigands(0, ligs)
	out := label{capped: d.capped, tie: r.tie}
	out.decisions = r.decisions
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
	return out
}

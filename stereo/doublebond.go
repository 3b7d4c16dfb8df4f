package stereo

// Double bonds and cumulenes with an odd number of double bonds: E/Z
// (e/z when a pseudoasymmetric ranking decided), from the highest ranked
// ligand at each terminal atom.

func (l *labeller) doubleBond(c *bondConfig) label {
	var out label
	trans := c.trans
	for e := 0; e < 2; e++ {
		var nl int
		d := l.digraph(c.ends[e])
		r := l.rootRanking(d, -1, func(d *digraph) []nodeID {
			var ligs []nodeID
			for _, k := range d.ligandsOf(0, noNode) {
				if d.nodes[k].atom != c.inner[e] {
					ligs = append(ligs, k)
				}
			}
			if len(ligs) == 1 && l.g.hyd[c.ends[e]] == 0 && len(l.g.adj[c.ends[e]]) == 2 {
				// =N- : the lone pair is the second ligand
				ligs = append(ligs, d.lonePair(0))
			}
			nl = len(ligs)
			return ligs
		})
		ligs := make([]nodeID, nl)
		if d.capped {
			out.capped = true
		}
		if r.tie || len(ligs) < 2 {
			out.tie = true
		}
		if r.pseudo {
			// both ends enantiomorphic: reflection swaps both and the
			// label stays uppercase
			if out.desc == DescPseudoE {
				out.desc = DescNone
			} else {
				out.desc = DescPseudoE
			}
		}
		for i, n := range r.order {
			out.ranked = append(out.ranked, RankedLigand{Rank: i + 1, Atom: d.ligandAtom(n), End: e, LonePair: d.nodes[n].kind == nodeLonePair})
		}
		for _, dc := range r.decisions {
			dc.End = e
			out.decisions = append(out.decisions, dc)
		}
		if len(r.order) > 0 && d.ligandAtom(r.order[0]) != c.refs[e] {
			trans = !trans
		}
		l.release(d)
	}
	isPseudo := out.desc == DescPseudoE
	out.desc = DescNone
	switch {
	case out.capped:
		out.desc = DescUndetermined
	case out.tie:
	case trans:
		out.desc = DescE
	default:
		out.desc = DescZ
	}
	if isPseudo && out.desc.Labelled() {
		out.desc = pseudo(out.desc)
	}
	return out
}

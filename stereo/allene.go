// This file implements the labelling of allenes and even cumulenes (M/P).

package stereo

// Allenes and cumulenes with an even number of double bonds: extended
// tetrahedral centres labelled M/P (m/p). The two substituents of each
// terminal atom are ranked against each other; the pair of one end is
// then taken as ranks 1 and 2 and the other as 3 and 4, and the written
// hand gives R or S for that extended tetrahedron, which is M or P
// (aR is M, aS is P; P-93.5.7, common practice).

func (l *labeller) allene(c *alleneConfig) label {
	ds := [2]*digraph{l.digraph(c.ends[0]), l.digraph(c.ends[1])}
	defer l.release(ds[0], ds[1])
	lb, cands := l.alleneWith(ds, c, -1)
	if lb.tie && !lb.capped {
		lb = l.withReference(lb, cands, func(ref int) label {
			x, _ := l.alleneWith(ds, c, ref)
			return x
		})
	}
	return lb
}

// alleneWith labels an allene with a given Rule 6 reference atom.
func (l *labeller) alleneWith(ds [2]*digraph, c *alleneConfig, ref int) (label, []int) {
	var out label
	var cands []int
	rankOf := map[[2]int]int{} // (end, atom) -> rank 1..4
	hRank := [2]int{}
	isPseudo := false
	for e := 0; e < 2; e++ {
		var nl int
		d := ds[e]
		r := l.rootRanking(d, ref, func(d *digraph) []nodeID {
			var ligs []nodeID
			for _, k := range d.ligandsOf(unitRoot, noNode) {
				if d.nodes[k].atom != c.inner[e] {
					ligs = append(ligs, k)
				}
			}
			nl = len(ligs)
			return ligs
		})
		ligs := make([]nodeID, nl)
		if d.capped {
			out.capped = true
		}
		if r.tie || len(ligs) != 2 {
			out.tie = true
			if cands == nil {
				for _, n := range r.tied {
					if a := d.ligandAtom(n); a >= 0 {
						cands = append(cands, a)
					}
				}
			}
		}
		isPseudo = isPseudo != r.pseudo
		for i, n := range r.order {
			rank := 2*e + i + 1
			a := d.ligandAtom(n)
			if a == ImplicitNeighbour {
				hRank[e] = rank
			} else {
				rankOf[[2]int{e, a}] = rank
			}
			out.ranked = append(out.ranked, RankedLigand{Rank: rank, Atom: a, End: e})
		}
		for _, dc := range r.decisions {
			dc.End = e
			dc.Higher += 2 * e
			dc.Lower += 2 * e
			out.decisions = append(out.decisions, dc)
		}
	}
	switch {
	case out.capped:
		out.desc = DescUndetermined
		return out, cands
	case out.tie || len(c.ligands) != 4:
		out.tie = true
		return out, cands
	}
	ranks := make([]int, 4)
	for i, a := range c.ligands {
		if a == ImplicitNeighbour {
			ranks[i] = hRank[c.ligEnd[i]]
		} else {
			ranks[i] = rankOf[[2]int{c.ligEnd[i], a}]
		}
		if ranks[i] == 0 {
			out.tie = true
			return out, cands
		}
	}
	out.desc = DescM
	if tetrahedralDescriptor(ranks, c.hand) == DescS {
		out.desc = DescP
	}
	if isPseudo {
		out.desc = pseudo(out.desc)
	}
	return out, cands
}

// This file implements the labelling of double bonds and odd cumulenes
// (E/Z).

package stereo

import "stereoline/stereo/internal/ringgeom"

// Double bonds and cumulenes with an odd number of double bonds: E/Z
// (e/z when a pseudoasymmetric ranking decided), from the highest ranked
// ligand at each terminal atom.

func (l *labeller) doubleBond(c *bondConfig) label {
	var out label
	// the written hand relates the refs; each end whose highest ranked
	// ligand is not its ref reverses it
	hand := c.hand
	// lowercase counts the ends whose ranking needed an enantiomorphic
	// pair (Rule 5 or 6): one such end makes the label lowercase, two
	// cancel (reflection swaps both and the label stays uppercase)
	lowercase := false
	for e := 0; e < 2; e++ {
		var nl int
		d := l.digraph(c.ends[e])
		r := l.rootRanking(d, -1, func(d *digraph) []nodeID {
			var ligs []nodeID
			for _, k := range d.ligandsOf(unitRoot, noNode) {
				if d.nodes[k].atom != c.inner[e] {
					ligs = append(ligs, k)
				}
			}
			if len(ligs) == 1 && l.g.hyd[c.ends[e]] == 0 && len(l.g.adj[c.ends[e]]) == 2 {
				// =N- : the lone pair is the second ligand
				ligs = append(ligs, d.lonePair(unitRoot))
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
			lowercase = !lowercase
		}
		for i, n := range r.order {
			out.ranked = append(out.ranked, RankedLigand{Rank: i + 1, Atom: d.ligandAtom(n), End: e, LonePair: d.nodes[n].kind == nodeLonePair})
		}
		for _, dc := range r.decisions {
			dc.End = e
			out.decisions = append(out.decisions, dc)
		}
		if len(r.order) > 0 && d.ligandAtom(r.order[0]) != c.refs[e] {
			hand = hand.Reversed()
		}
		l.release(d)
	}
	switch {
	case out.capped:
		out.desc = DescUndetermined
	case out.tie:
		out.desc = DescNone
	case hand == ringgeom.Trans:
		out.desc = DescE
	default:
		out.desc = DescZ
	}
	if lowercase && out.desc.Labelled() {
		out.desc = pseudo(out.desc)
	}
	return out
}

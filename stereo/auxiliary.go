// This file implements the auxiliary descriptors that Rules 3 to 5
// compare.

package stereo

import "stereoline/stereo/internal/ringgeom"

// Auxiliary descriptors (P-92.1.3.4 with the 2018 guide): the
// stereodescriptors Rules 3 to 5 compare are assigned inside the digraph,
// to the nodes of stereogenic atoms and double bonds, by ranking each
// node's ligands in the tree re-rooted at that node. A node's ranking may
// use the auxiliary descriptors of nodes farther from the original root
// only, which keeps the recursion finite.

// auxFor returns the auxiliary descriptor of n as used in the view rooted
// at root, or DescNone when n lies no farther out than the view's root.
func (d *digraph) auxFor(root, n nodeID) Descriptor {
	if n == noNode || d.nodes[n].depth <= d.nodes[root].depth || d.nodes[n].kind != nodeAtom {
		return DescNone
	}
	// aux grows with the nodes on demand; its entries say whether the
	// descriptor is known, being computed, or not looked at yet
	for len(d.aux) <= int(n) {
		d.aux = append(d.aux, auxEntry{})
	}
	var x Descriptor
	switch e := d.aux[n]; e.state {
	case auxKnown:
		x = e.desc
	case auxComputing:
		return DescNone
	default:
		d.aux[n].state = auxComputing
		x = d.computeAux(n)
		d.aux[n] = auxEntry{state: auxKnown, desc: x}
	}
	if d.mirror && root == unitRoot {
		return mirrorAux(x)
	}
	return x
}

// auxEntry is the auxiliary descriptor of one node, once known.
type auxEntry struct {
	state auxState
	desc  Descriptor
}

type auxState uint8

const (
	auxUnknown   auxState = iota // not looked at yet
	auxComputing                 // being computed: a recursion back to it sees none
	auxKnown
)

// mirrorAux is the auxiliary descriptor of the same node in the mirror
// image (see Descriptor.Mirror).
func mirrorAux(x Descriptor) Descriptor { return x.Mirror() }

func (d *digraph) computeAux(n nodeID) Descriptor {
	a := d.nodes[n].atom
	if t, ok := d.cfg.tetra[a]; ok {
		return d.auxTetrahedral(n, t)
	}
	if c, ok := d.cfg.allene[a]; ok {
		return d.auxAllene(n, c)
	}
	// a configured double bond from this atom to a tree neighbour
	for _, y := range d.neighbours(n, noNode) {
		if d.nodes[y].kind != nodeAtom {
			continue
		}
		bi := d.g.mol.BondBetween(a, d.nodes[y].atom)
		if bi < 0 {
			continue
		}
		if c, ok := d.cfg.bonds[bi]; ok && c.inner[0] == c.ends[1] {
			return d.auxDoubleBond(n, y, c)
		}
	}
	return DescNone
}

// auxTetrahedral labels a tetrahedral node in the tree re-rooted at it.
func (d *digraph) auxTetrahedral(n nodeID, t *tetraConfig) Descriptor {
	ligs := d.ligandsOf(n, noNode)
	if len(ligs) == 3 && t.lonePair {
		if lp := d.lonePair(n); lp != noNode {
			ligs = append(ligs, lp)
		}
	}
	if len(ligs) != len(t.ligands) || len(ligs) != 4 {
		return DescNone
	}
	r := d.rankLigands(n, ligs)
	if d.capped {
		return DescNone
	}
	if r.tie {
		return d.auxWithReference(n, ligs, r, t)
	}
	x, ok := d.descriptorFromRanking(r, t)
	if !ok {
		return DescNone
	}
	if r.pseudo {
		x = pseudo(x)
	}
	return x
}

// auxWithReference applies Rule 6 to a tetrahedral node left tied, as
// withReference does for the root: each tied ligand in turn is the
// reference, and the node has a descriptor only if all choices agree.
func (d *digraph) auxWithReference(n nodeID, ligs []nodeID, r ranking, t *tetraConfig) Descriptor {
	if len(r.tied) < 2 {
		return DescNone
	}
	defer delete(d.auxRef, n)
	var first Descriptor
	for i, c := range r.tied {
		a := d.ligandAtom(c)
		if a < 0 {
			return DescNone
		}
		if d.auxRef == nil {
			d.auxRef = map[nodeID]int{}
		}
		d.auxRef[n] = a
		rr := d.rankLigands(n, ligs)
		if rr.tie || d.capped {
			return DescNone
		}
		x, ok := d.descriptorFromRanking(rr, t)
		if !ok {
			return DescNone
		}
		if rr.pseudo {
			x = pseudo(x)
		}
		if i == 0 {
			first = x
		} else if x != first {
			return DescNone
		}
	}
	return first
}

// descriptorFromRanking maps ranked ligand nodes onto the written ligand
// order of a tetrahedral configuration.
func (d *digraph) descriptorFromRanking(r ranking, t *tetraConfig) (Descriptor, bool) {
	ranks := make([]int, len(t.ligands))
	used := make([]bool, len(r.order))
	for i, atom := range t.ligands {
		for k, nd := range r.order {
			if !used[k] && d.ligandAtom(nd) == atom {
				ranks[i] = k + 1
				used[k] = true
				break
			}
		}
		if ranks[i] == 0 {
			return DescNone, false
		}
	}
	return tetrahedralDescriptor(ranks, t.hand), true
}

// auxDoubleBond labels the double bond between node x and its tree
// neighbour y.
func (d *digraph) auxDoubleBond(x, y nodeID, c *bondConfig) Descriptor {
	hx, px, okx := d.topLigand(x, y)
	hy, py, oky := d.topLigand(y, x)
	if !okx || !oky {
		return DescNone
	}
	ax := d.nodes[x].atom
	// the written hand relates the refs; each end whose top ligand is
	// not its ref reverses it
	refX, refY := c.refs[0], c.refs[1]
	if ax != c.ends[0] {
		refX, refY = refY, refX
	}
	hand := c.hand
	if hx != refX {
		hand = hand.Reversed()
	}
	if hy != refY {
		hand = hand.Reversed()
	}
	x2 := DescZ
	if hand == ringgeom.Trans {
		x2 = DescE
	}
	if px != py {
		x2 = pseudo(x2)
	}
	return x2
}

// topLigand ranks the ligands of end n of a double bond (the partner
// excluded) in the view rooted at n and returns the atom of the highest,
// whether Rule 5 was needed, and false on a tie.
func (d *digraph) topLigand(n, partner nodeID) (int, bool, bool) {
	ligs := d.ligandsOf(n, partner)
	switch len(ligs) {
	case 0:
		return 0, false, false
	case 1:
		return d.ligandAtom(ligs[0]), false, true
	}
	r := d.rankLigands(n, ligs)
	if r.tie || d.capped {
		return 0, false, false
	}
	return d.ligandAtom(r.order[0]), r.pseudo, true
}

// auxAllene labels an allene centre node: the terminal on the root side
// is its parent, the far terminal its child.
func (d *digraph) auxAllene(n nodeID, c *alleneConfig) Descriptor {
	p := d.nodes[n].parent
	if p == noNode || d.nodes[p].kind != nodeAtom {
		return DescNone
	}
	near := -1
	for e := 0; e < 2; e++ {
		if c.ends[e] == d.nodes[p].atom && c.inner[e] == c.centre {
			near = e
		}
	}
	if near < 0 {
		return DescNone
	}
	far := noNode
	for _, k := range d.kids(n) {
		if d.nodes[k].kind == nodeAtom && d.nodes[k].atom == c.ends[1-near] {
			far = k
		}
	}
	if far == noNode {
		return DescNone
	}
	rankOf := map[[2]int]int{}
	isPseudo := false
	for i, end := range [2]nodeID{p, far} {
		e := near
		if i == 1 {
			e = 1 - near
		}
		ligs := d.ligandsOf(end, n)
		if len(ligs) != 2 {
			return DescNone
		}
		r := d.rankLigands(end, ligs)
		if r.tie || d.capped {
			return DescNone
		}
		isPseudo = isPseudo != r.pseudo
		for k, nd := range r.order {
			rankOf[[2]int{e, d.ligandAtom(nd)}] = 2*e + k + 1
		}
	}
	ranks := make([]int, 4)
	for i, a := range c.ligands {
		ranks[i] = rankOf[[2]int{c.ligEnd[i], a}]
		if ranks[i] == 0 {
			return DescNone
		}
	}
	x := DescM
	if tetrahedralDescriptor(ranks, c.hand) == DescS {
		x = DescP
	}
	if isPseudo {
		x = pseudo(x)
	}
	return x
}

// pseudo returns the lowercase form of a descriptor.
func pseudo(x Descriptor) Descriptor {
	switch x {
	case DescR:
		return DescPseudoR
	case DescS:
		return DescPseudoS
	case DescE:
		return DescPseudoE
	case DescZ:
		return DescPseudoZ
	case DescM:
		return DescPseudoM
	case DescP:
		return DescPseudoP
	}
	return x
}

// This file implements the chain of sequence rules and the comparison of
// digraph branches under it.

package stereo

// A sequence rule compares two branches of a digraph. The chain below
// fixes the order of P-92.1.3 (2013) with the 2018 revisions; each rule
// is applied exhaustively, sphere by sphere over the whole digraph,
// before the next one is tried.

// Rule identifies one sequence rule.
type Rule uint8

// The sequence rules in the order they are applied.
const (
	Rule1a Rule = iota
	Rule1b
	Rule2
	Rule3
	Rule4a
	Rule4b
	Rule4c
	Rule5
	Rule6
	numRules
)

var ruleNames = [...]string{"1a", "1b", "2", "3", "4a", "4b", "4c", "5", "6"}

func (r Rule) String() string {
	if int(r) < len(ruleNames) {
		return ruleNames[r]
	}
	return "?"
}

// nodeRule is a rule that orders single nodes; the digraph comparison
// applies it sphere by sphere in hierarchical order. value returns a
// number where higher precedes.
type nodeRule func(d *digraph, root, n nodeID) float64

// nodeRules holds the node-wise rules; Rule 4b compares whole branches
// and is handled in rule4b.go.
var nodeRules [numRules]nodeRule

func init() {
	// assigned in init: the rules reach back into the comparison through
	// the auxiliary descriptors, which a composite literal cannot express
	nodeRules = [numRules]nodeRule{
		Rule1a: rule1aValue,
		Rule1b: rule1bValue,
		Rule2:  rule2Value,
		Rule3:  rule3Value,
		Rule4a: rule4aValue,
		Rule4c: rule4cValue,
		Rule5:  rule5Value,
		Rule6:  rule6Value,
	}
}

// compareRule compares branches a (entered from af) and b (entered from
// bf) under one rule, in the view rooted at root. It returns the sign
// (positive when a precedes) and the sphere, counted from the root, where
// the difference lies.
func (d *digraph) compareRule(root, a, af, b, bf nodeID, r Rule) (int, int) {
	if !d.canSplit(root, r) {
		return 0, 0
	}
	if r == Rule1a && a != noNode && b != noNode {
		// most pairs differ in their own atomic numbers: the first
		// sphere of compareSpheres, without its memo and queues
		if za, zb := d.nodes[a].z, d.nodes[b].z; za != zb {
			if za > zb {
				return 1, d.sphereOf(root, a)
			}
			return -1, d.sphereOf(root, a)
		}
	}
	if r != Rule4b && a != noNode && b != noNode && d.nodes[a].kind != nodeAtom && d.nodes[b].kind != nodeAtom {
		// duplicates, hydrogens and lone pairs have no branches of
		// their own: their own values decide, or nothing does
		va, vb := nodeRules[r](d, root, a), nodeRules[r](d, root, b)
		switch {
		case va > vb:
			return 1, d.sphereOf(root, a)
		case va < vb:
			return -1, d.sphereOf(root, a)
		}
		return 0, 0
	}
	ref, mirror := d.viewState(root, r)
	key := packCompare(root, a, af, b, bf, r, ref, mirror)
	bypass := d.bypassMemo(root, r)
	if v, ok := d.compared[key]; ok && !bypass {
		return int(v[0]), int(v[1])
	}
	var c, s int
	if r == Rule4b {
		c, s = d.compareLikeUnlike(root, a, af, b, bf)
	} else {
		c, s = d.compareSpheres(root, a, af, b, bf, r)
	}
	// a difference found at once is cheaper to find again than to keep
	if !d.capped && !bypass && (c == 0 || s > int(d.nodes[a].depth-d.nodes[root].depth)+1) {
		if d.compared == nil {
			d.compared = map[[2]uint64][2]int32{}
		}
		d.compared[key] = [2]int32{int32(c), int32(s)}
	}
	return c, s
}

// canSplit reports whether rule r can tell apart two branches of the
// view rooted at root that the rules before it left tied (every caller
// walks the rules in order and stops at the first that decides). A
// rule that cannot is skipped, sparing a walk to the end of both
// branches: Rule 2 adds nothing to Rule 1a when mass follows atomic
// number (the hierarchical orders of both rules then read the same
// atomic numbers sphere by sphere, hence the same masses); Rule 3 needs
// a configured double bond, Rules 4a to 5 a configured centre other
// than the root, Rule 6 a reference.
func (d *digraph) canSplit(root nodeID, r Rule) bool {
	switch {
	case r == Rule2:
		return !d.g.massFollowsZ()
	case r == Rule3:
		return len(d.cfg.bonds) > 0
	case r >= Rule4a && r <= Rule5:
		return d.otherCentres
	case r == Rule6:
		ref, ok := d.referenceOf(root)
		return ok && ref >= 0
	}
	return true
}

// referenceOf returns the Rule 6 reference atom of the view rooted at
// root: for the unit's own view refAtom (-1 while none is chosen), for
// an auxiliary view the reference of its ranking under way (auxRef), or
// ok false when it has none.
func (d *digraph) referenceOf(root nodeID) (ref int, ok bool) {
	if root == unitRoot {
		return d.refAtom, true
	}
	ref, ok = d.auxRef[root]
	return ref, ok
}

// bypassMemo reports a comparison that must not be memoised. The memos
// key a comparison by its view: the root, the rule and, for the unit's
// view, its reference and mirror flag (viewState). An auxiliary view's
// Rule 6 reference is not in the key, since it changes while
// auxWithReference tries each tied ligand, so a Rule 6 comparison in a
// view that has one is computed afresh each time.
func (d *digraph) bypassMemo(root nodeID, r Rule) bool {
	if root == unitRoot || r < Rule6 || len(d.auxRef) == 0 {
		return false
	}
	_, ok := d.auxRef[root]
	return ok
}

// The memo keys pack node numbers (at most the node cap, so 20 bits
// each, offset by one for noNode) into machine words, which hash far
// faster than structs: the same pair of branches is compared again and
// again while siblings are sorted at each level of the rule chain.

func packView(n, from, root nodeID, r Rule) uint64 {
	return uint64(n+1) | uint64(from+1)<<20 | uint64(root+1)<<40 | uint64(r)<<60
}

func packCompare(root, a, af, b, bf nodeID, r Rule, ref int, mirror bool) [2]uint64 {
	k0 := uint64(root+1) | uint64(a+1)<<20 | uint64(af+1)<<40 | uint64(r)<<60
	k1 := uint64(b+1) | uint64(bf+1)<<20 | uint64(ref+1)<<40
	if mirror {
		k1 |= 1 << 63
	}
	return [2]uint64{k0, k1}
}

// compareChain applies the rules up to and including last, in order. It
// returns the sign, the deciding rule and the sphere.
func (d *digraph) compareChain(root, a, af, b, bf nodeID, last Rule) (int, Rule, int) {
	for r := Rule1a; r <= last; r++ {
		if c, s := d.compareRule(root, a, af, b, bf, r); c != 0 {
			return c, r, s
		}
		if d.capped {
			return 0, r, 0
		}
	}
	return 0, last, 0
}

// compareForOrder orders two siblings for the hierarchical walk of rule
// r: by the rules up to r, with two exceptions.
//
// Rule 6 orders by the constitutional rules (1a, 1b, 2) and itself only.
// Its reference is fixed by constitution; ordering by the descriptor
// rules, which invert in a mirror image, would let a mirror plane
// through the reference tell the two mirror-image ligands apart (the
// bridgeheads of adamantane).
//
// Rules 4c and 5 order without Rule 4b. Like/unlike pairs are read
// against a reference chosen inside each branch, so they can order the
// sub-branches of two otherwise equal branches in opposite ways, and the
// walk would then meet the r and s centres below them in opposite orders
// (the suite's VS268, whose labels need those branches to tie under 4c).
func (d *digraph) compareForOrder(root, x, y, from nodeID, r Rule) int {
	if r >= Rule4c && r != Rule6 {
		for q := Rule1a; q <= r; q++ {
			if q == Rule4b {
				continue
			}
			if c, _ := d.compareRule(root, x, from, y, from, q); c != 0 {
				return c
			}
		}
		return 0
	}
	if r != Rule6 {
		c, _, _ := d.compareChain(root, x, from, y, from, r)
		return c
	}
	if c, _, _ := d.compareChain(root, x, from, y, from, Rule2); c != 0 {
		return c
	}
	c, _ := d.compareRule(root, x, from, y, from, Rule6)
	return c
}

type step struct{ n, from nodeID }

// compareSpheres walks both branches breadth first. At each sphere the
// nodes are taken in hierarchical order: the children of a higher ranked
// node before those of a lower ranked one, each node's children sorted by
// the same rule and those before it. Missing children are phantom atoms
// (atomic number zero), so the two walks stay aligned.
func (d *digraph) compareSpheres(root, a, af, b, bf nodeID, r Rule) (int, int) {
	value := nodeRules[r]
	bufs := d.takeBuffers()
	defer d.putBuffers(bufs)
	qa, qb, na, nb := bufs[0][:0], bufs[1][:0], bufs[2][:0], bufs[3][:0]
	qa = append(qa, step{a, af})
	qb = append(qb, step{b, bf})
	defer func() { bufs[0], bufs[1], bufs[2], bufs[3] = qa, qb, na, nb }()
	for sphere := d.sphereOf(root, a); len(qa) > 0; sphere++ {
		if d.budget.tick() {
			// a walk over nodes grown before adds none: the budget is
			// asked here too
			d.capped = true
			return 0, sphere
		}
		for i := range qa {
			var va, vb float64
			if r == Rule1a {
				// the rule read in place: most walks are Rule 1a walks
				va, vb = d.atomicNumber(qa[i].n), d.atomicNumber(qb[i].n)
			} else {
				va, vb = d.valueOf(value, root, qa[i].n), d.valueOf(value, root, qb[i].n)
			}
			if va != vb {
				if va > vb {
					return 1, sphere
				}
				return -1, sphere
			}
		}
		if r == Rule1a {
			// Under Rule 1a siblings sort by their own atomic number
			// first, so the next sphere can be compared from unsorted
			// children; the deep sort that fixes the order for the
			// sphere after is needed only when this one ties.
			if c := d.peekAtomicNumbers(qa, qb); c != 0 {
				return c, sphere + 1
			}
		}
		na, nb = na[:0], nb[:0]
		for i := range qa {
			ka := d.sortedNeighbours(root, qa[i].n, qa[i].from, r)
			kb := d.sortedNeighbours(root, qb[i].n, qb[i].from, r)
			m := max(len(ka), len(kb))
			for j := 0; j < m; j++ {
				na = append(na, stepAt(ka, j, qa[i].n))
				nb = append(nb, stepAt(kb, j, qb[i].n))
			}
		}
		if d.capped {
			return 0, sphere
		}
		qa, na = na, qa
		qb, nb = nb, qb
	}
	return 0, 0
}

// peekAtomicNumbers compares the children of aligned node pairs by
// their atomic numbers, highest first, group by group.
func (d *digraph) peekAtomicNumbers(qa, qb []step) int {
	var za, zb [8]float64
	for i := range qa {
		xa := d.childAtomicNumbers(qa[i], za[:0])
		xb := d.childAtomicNumbers(qb[i], zb[:0])
		for j := 0; j < len(xa) || j < len(xb); j++ {
			var va, vb float64
			if j < len(xa) {
				va = xa[j]
			}
			if j < len(xb) {
				vb = xb[j]
			}
			if va != vb {
				if va > vb {
					return 1
				}
				return -1
			}
		}
	}
	return 0
}

// childAtomicNumbers lists the atomic numbers of the branches leaving a
// step, in descending order.
func (d *digraph) childAtomicNumbers(s step, buf []float64) []float64 {
	if s.n == noNode {
		return buf
	}
	for _, k := range d.neighbours(s.n, s.from) {
		buf = append(buf, d.nodes[k].z)
	}
	for i := 1; i < len(buf); i++ {
		for j := i; j > 0 && buf[j] > buf[j-1]; j-- {
			buf[j], buf[j-1] = buf[j-1], buf[j]
		}
	}
	return buf
}

// takeBuffers hands out four reusable walk queues; comparisons nest
// (sorting a node's children compares their branches), so the buffers
// form a stack.
func (d *digraph) takeBuffers() *[4][]step {
	if n := len(d.free); n > 0 {
		b := d.free[n-1]
		d.free = d.free[:n-1]
		return b
	}
	return new([4][]step)
}

func (d *digraph) putBuffers(b *[4][]step) { d.free = append(d.free, b) }

func stepAt(ks []nodeID, j int, from nodeID) step {
	if j < len(ks) {
		return step{ks[j], from}
	}
	return step{noNode, from}
}

// atomicNumber is rule1aValue with phantom atoms (noNode) at zero.
func (d *digraph) atomicNumber(n nodeID) float64 {
	if n == noNode {
		return 0
	}
	return d.nodes[n].z
}

func (d *digraph) valueOf(value nodeRule, root, n nodeID) float64 {
	if n == noNode {
		return 0
	}
	return value(d, root, n)
}

// sphereOf is the sphere of a ligand of root: 1 for the root's own
// neighbours.
func (d *digraph) sphereOf(root, n nodeID) int {
	if n == noNode {
		return 1
	}
	if root == unitRoot {
		return int(d.nodes[n].depth) // the root's view: depth is the distance
	}
	return d.treeDistance(root, n)
}

// sortedNeighbours returns the branches leaving n (entered from `from`)
// in descending order under the rules up to r.
func (d *digraph) sortedNeighbours(root, n, from nodeID, r Rule) []nodeID {
	if n == noNode {
		return nil
	}
	ref, mirror := d.viewState(root, r)
	fast := root == unitRoot && from == d.nodes[n].parent && ref < 0 && !mirror
	if fast {
		if i := d.nodes[n].sorted; i > 0 && d.sortTables[i-1][r] > 0 {
			start := int(d.sortTables[i-1][r] - 1)
			end := start + int(d.nodes[n].kidCount)
			return d.sorts[start:end:end]
		}
	}
	key := sortKey{n: n, from: from, root: root, level: int(r), ref: ref, mirror: mirror}
	packed := packView(n, from, root, r)
	bypass := d.bypassMemo(root, r)
	if !fast && !bypass {
		if root != unitRoot {
			if s, ok := d.sortedAux[packed]; ok {
				return s
			}
		} else if s, ok := d.sortedRoot[key]; ok {
			return s
		}
	}
	nb := d.neighbours(n, from)
	s := d.store(nb)
	// insertion sort: few children, and a stable order for ties
	for i := 1; i < len(s); i++ {
		for j := i; j > 0; j-- {
			c := d.compareForOrder(root, s[j], s[j-1], n, r)
			if c <= 0 {
				break
			}
			s[j], s[j-1] = s[j-1], s[j]
		}
	}
	switch {
	case bypass:
	case fast:
		if d.nodes[n].sorted == 0 {
			d.sortTables = append(d.sortTables, [numRules]int32{})
			d.nodes[n].sorted = int32(len(d.sortTables))
		}
		// copied only now: the sort above may have sorted other nodes
		// and grown sorts meanwhile
		d.sortTables[d.nodes[n].sorted-1][r] = int32(len(d.sorts) + 1)
		d.sorts = append(d.sorts, s...)
	case root != unitRoot:
		if d.sortedAux == nil {
			d.sortedAux = map[uint64][]nodeID{}
		}
		d.sortedAux[packed] = s
	default:
		if d.sortedRoot == nil {
			d.sortedRoot = map[sortKey][]nodeID{}
		}
		d.sortedRoot[key] = s
	}
	return s
}

// viewState returns the parts of the root's view a comparison under rule
// r depends on: the Rule 6 reference matters to Rule 6 only, the mirror
// flag to the descriptor rules only, and neither to auxiliary views.
func (d *digraph) viewState(root nodeID, r Rule) (ref int, mirror bool) {
	if root != unitRoot {
		return -1, false
	}
	if r >= Rule3 {
		mirror = d.mirror
	}
	if r >= Rule6 {
		return d.refAtom, mirror
	}
	return -1, mirror
}

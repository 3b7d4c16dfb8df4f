// This file implements the ranking of a unit's ligands and the decisions
// kept with it.

package stereo

import (
	"slices"

	"stereoline/stereo/internal/ringgeom"
)

// Ranking the ligands of one stereogenic unit and keeping the reasons.

// Decision records how two neighbouring ligands in the final order were
// told apart: the rule and the sphere (1 for the ligand atoms themselves)
// where the first difference lies.
type Decision struct {
	Higher, Lower int // ranks (1-based) of the two ligands
	End           int // for double bonds and allenes: which terminal atom (0 or 1)
	Rule          Rule
	Sphere        int
}

// RankedLigand is one ligand of a labelled unit.
type RankedLigand struct {
	Rank     int  // 1 is the highest priority
	Atom     int  // 0-based atom the ligand begins at; -1 for an implicit hydrogen or lone pair
	LonePair bool // the implicit ligand is a lone pair
	End      int  // for double bonds and allenes: which terminal atom the ligand is on
}

// ranking is the outcome of ordering the ligands of a root.
type ranking struct {
	order     []nodeID // highest first
	decisions []Decision
	tie       bool
	tied      []nodeID // the first group of ligands left tied
	pseudo    bool     // an odd number of pairs was told apart only by Rule 5 or 6
}

// rankLigands sorts the ligands of root in the view rooted at root.
func (d *digraph) rankLigands(root nodeID, ligs []nodeID) ranking {
	s := d.store(ligs)                               // the order lives as long as the digraph
	pairs := &pairMemo{d: d, root: root, ligs: ligs} // stays on the stack
	for i := 1; i < len(s); i++ {
		for j := i; j > 0; j-- {
			c, _, _ := pairs.compare(s[j], s[j-1])
			if c <= 0 {
				break
			}
			s[j], s[j-1] = s[j-1], s[j]
		}
	}
	r := ranking{order: s, decisions: make([]Decision, 0, max(len(s)-1, 0))}
	for i := 0; i+1 < len(s); i++ {
		c, rule, sphere := pairs.compare(s[i], s[i+1])
		if c == 0 {
			if !r.tie {
				r.tied = append(r.tied, s[i])
				for j := i + 1; j < len(s); j++ {
					if c2, _, _ := pairs.compare(s[i], s[j]); c2 != 0 {
						break
					}
					r.tied = append(r.tied, s[j])
				}
			}
			r.tie = true
			continue
		}
		if rule == Rule5 || rule == Rule6 {
			// each enantiomorphic pair swaps under reflection; an odd
			// number of swaps keeps the label, which makes it lowercase
			r.pseudo = !r.pseudo
		}
		r.decisions = append(r.decisions, Decision{Higher: i + 1, Lower: i + 2, Rule: rule, Sphere: sphere})
	}
	return r
}

// ligandAtom is the atom a ligand node stands for, or ImplicitNeighbour.
func (d *digraph) ligandAtom(n nodeID) int {
	x := &d.nodes[n]
	if x.kind == nodeHydrogen || x.kind == nodeLonePair {
		return ImplicitNeighbour
	}
	return x.atom
}

// tetrahedralDescriptor turns ranks (1..4, in the written ligand order)
// and the written hand into R or S. '@' means the second to fourth
// ligands turn anticlockwise seen from the first; R means ranks 1, 2, 3
// turn clockwise seen from the side away from rank 4, that is
// anticlockwise seen from rank 4. The written order is compared with
// (4, 1, 2, 3), an odd permutation of (1, 2, 3, 4): the hand read in
// that order is the hand read in rank order reversed.
func tetrahedralDescriptor(ranks []int, hand ringgeom.Hand) Descriptor {
	parity, _ := ringgeom.PermutationParity(ranks)
	if hand.Permuted(parity).Reversed() == ringgeom.Anticlockwise {
		return DescR
	}
	return DescS
}

// rootRanking ranks the ligands pick selects at the root of d, with the
// given Rule 6 reference. A ranking decided by the descriptor rules is
// pseudoasymmetric when the mirror image ranks the same ligands in an
// order of the opposite parity: reflection then leaves the label as it
// is, which is what lowercase labels mean (P-92.1.3.4). The mirror view
// reuses the digraph and its auxiliary descriptors.
func (l *labeller) rootRanking(d *digraph, ref int, pick func(d *digraph) []nodeID) ranking {
	r, ligs := l.plainRanking(d, ref, pick)
	if r.tie || d.capped || !usesDescriptorRules(r) {
		return r
	}
	d.mirror = true
	mr := d.rankLigands(unitRoot, ligs)
	d.mirror = false
	if mr.tie || d.capped || len(mr.order) != len(r.order) {
		return r
	}
	perm := make([]int, len(mr.order))
	for i, n := range mr.order {
		// a handful of ligands: a search beats a map
		perm[i] = slices.Index(r.order, n)
	}
	parity, _ := ringgeom.PermutationParity(perm)
	r.pseudo = parity == ringgeom.Odd
	return r
}

// plainRanking is rootRanking without the mirror-image test, for the
// rankings whose order and decisions are wanted but not a label (an
// unmarked centre has none): pseudo is always false. It also returns
// the ligands pick chose.
func (l *labeller) plainRanking(d *digraph, ref int, pick func(d *digraph) []nodeID) (ranking, []nodeID) {
	d.refAtom, d.mirror = ref, false
	ligs := pick(d)
	r := d.rankLigands(unitRoot, ligs)
	r.pseudo = false
	return r, ligs
}

func usesDescriptorRules(r ranking) bool {
	for _, dc := range r.decisions {
		if dc.Rule >= Rule3 {
			return true
		}
	}
	return false
}

// pairMemo keeps the full-chain comparisons of the ligands of one
// ranking: sorting and then reading the decisions of neighbours compare
// the same pairs again, and the digraph's own memo leaves out the pairs
// decided at once. A comparison is antisymmetric (both branches are
// walked alike), so one entry serves both orders of a pair.
type pairMemo struct {
	d     *digraph
	root  nodeID
	ligs  []nodeID
	known [maxMemoLigands * maxMemoLigands]bool
	res   [maxMemoLigands * maxMemoLigands]pairResult
}

// maxMemoLigands covers every geometry the labeller ranks (four ligands
// at most); a longer list is compared without the memo.
const maxMemoLigands = 6

type pairResult struct {
	c, sphere int
	rule      Rule
}

func (p *pairMemo) index(n nodeID) int {
	for i, x := range p.ligs {
		if x == n {
			return i
		}
	}
	return -1
}

// compare is compareChain up to Rule 6 for two of the ligands.
func (p *pairMemo) compare(a, b nodeID) (int, Rule, int) {
	i, j := p.index(a), p.index(b)
	if i < 0 || j < 0 || len(p.ligs) > maxMemoLigands {
		return p.d.compareChain(p.root, a, p.root, b, p.root, Rule6)
	}
	if k := i*maxMemoLigands + j; p.known[k] {
		x := p.res[k]
		return x.c, x.rule, x.sphere
	}
	if k := j*maxMemoLigands + i; p.known[k] {
		x := p.res[k]
		return -x.c, x.rule, x.sphere
	}
	c, rule, sphere := p.d.compareChain(p.root, a, p.root, b, p.root, Rule6)
	k := i*maxMemoLigands + j
	p.known[k], p.res[k] = true, pairResult{c: c, sphere: sphere, rule: rule}
	return c, rule, sphere
}

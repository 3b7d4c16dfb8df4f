// This file implements the hierarchical digraph of P-92.1.4.

package stereo

// The hierarchical digraph of P-92.1.4: a tree of paths that starts at
// the stereogenic unit (the root) and grows outwards, one sphere at a
// time. An atom met again on a path (a ring closure) becomes a duplicate
// node without substituents, and each extra bond order adds duplicates
// at both ends of a multiple bond. The tree grows lazily, only as far as
// comparisons need, and stops at a node cap so that no molecule can make
// the labeller run without bound.

// nodeID indexes digraph.nodes; noNode is the absent node.
type nodeID int32

const noNode nodeID = -1

// unitRoot is the root of the digraph: the node of the unit being
// labelled (for a double bond or allene, of one terminal atom). A
// comparison or ranking rooted at another node works in an auxiliary
// view of the tree, re-rooted at that node (auxiliary.go).
const unitRoot nodeID = 0

// nodeKind says what a node stands for.
type nodeKind uint8

const (
	nodeAtom      nodeKind = iota // an atom of the molecule
	nodeDuplicate                 // a duplicate atom (ring closure or multiple bond)
	nodeHydrogen                  // a hydrogen that is not an atom of its own
	nodeLonePair                  // the lone pair of a three-coordinate centre
)

// node is one vertex of the digraph.
type node struct {
	atom int     // atom index; -1 for hydrogens and lone pairs
	z    float64 // atomic number (averaged for mancude duplicates)
	mass float64
	// the narrow fields come last, packed, to keep the node small: a
	// digraph holds many and copies them as it grows. A node holds no
	// pointer (its children are a window of the arena, by offset), so the
	// collector need not scan the node table.
	kidStart, kidCount int32
	parent             nodeID
	depth              int32
	corr               nodeID // for a duplicate: the node of the atom it duplicates
	bond               int32  // bond to the parent; -1 for the root and implicit atoms
	// sorted finds the children in rule order for the root's plain
	// view: 1 + an index into digraph.sortTables, 0 before any sort
	sorted   int32
	kind     nodeKind
	expanded bool
	ringDup  bool // a duplicate closing a ring (a real ligand), not an extra bond order
}

// digraph is one hierarchical digraph. It belongs to one labelling call
// and is discarded afterwards; nothing in it is shared.
type digraph struct {
	g      *graph
	nodes  []node
	limit  int
	capped bool
	budget *budget // the analysis's time budget; spent ends growth like the cap

	compared   map[[2]uint64][2]int32
	sortedAux  map[uint64][]nodeID // children in rule order, auxiliary views
	sortedRoot map[sortKey][]nodeID
	free       []*[4][]step     // walk queues for reuse
	groupIDs   []map[[2]int]int // Rule 4b group numberings for reuse (rule4b.go)
	arena      []nodeID         // storage for children lists
	// sortTables holds, per sorted node and rule, 1 + the offset in
	// sorts of its children in that rule's order (as many as it has
	// children), 0 when not sorted yet. Offsets stay valid as sorts
	// grows, and take a sixth of the room of a table of slices.
	sortTables [][numRules]int32
	sorts      []nodeID
	kidBuf     []nodeID
	// auxRef holds, by the root of an auxiliary view, the Rule 6
	// reference of that view's ranking while one is under way
	// (auxWithReference tries each tied ligand in turn); Rule 6
	// comparisons in such a view bypass the memos (bypassMemo)
	auxRef map[nodeID]int
	aux    []auxEntry // by node, grown on demand (auxiliary.go)
	cfg    *configs
	// refAtom is the Rule 6 reference, -1 when none is chosen.
	refAtom int
	// otherCentres is set when an atom other than the root carries a
	// tetrahedral or allene configuration: without one, Rules 4a to 5
	// meet no descriptor and cannot split anything.
	otherCentres bool
	// mirror makes the root's view see the auxiliary descriptors of the
	// mirror image (R and S swapped, r and s kept), to test whether a
	// ranking is pseudoasymmetric.
	mirror bool
}

type sortKey struct {
	n, from, root nodeID
	level         int
	// the Rule 6 reference and the mirror flag change the root's view
	// only; auxiliary views share their entries across them
	ref    int
	mirror bool
}

// defaultNodeCap bounds every digraph. Real molecules of a few hundred
// atoms stay far below it; ladders of fused rings reach it, and their
// units are reported undetermined.
const defaultNodeCap = 200000

// maxNodeCap keeps node numbers within the 20 bits the memo keys give
// them.
const maxNodeCap = 1<<20 - 2

// MaxNodeCap is the largest node cap Options.NodeCap takes; a larger one
// is lowered to it.
const MaxNodeCap = maxNodeCap

func newDigraph(g *graph, cfg *configs, rootAtom int, limit int, b *budget) *digraph {
	limit = min(limit, maxNodeCap)
	// the maps are made on first use: most digraphs decide at the first
	// spheres and never need them
	d := &digraph{g: g, limit: limit, cfg: cfg, refAtom: -1, budget: b}
	d.nodes = make([]node, 0, 16)
	d.addRoot(rootAtom)
	return d
}

// addRoot adds the root node to an empty digraph.
func (d *digraph) addRoot(rootAtom int) {
	centres := len(d.cfg.tetra) + len(d.cfg.allene)
	if _, ok := d.cfg.tetra[rootAtom]; ok {
		centres--
	}
	if _, ok := d.cfg.allene[rootAtom]; ok {
		centres--
	}
	d.otherCentres = centres > 0
	d.nodes = append(d.nodes, node{atom: rootAtom, kind: nodeAtom, parent: noNode, corr: noNode, bond: -1,
		z: float64(d.g.z[rootAtom]), mass: d.g.mass[rootAtom]})
}

func (d *digraph) add(n node) nodeID {
	if len(d.nodes) >= d.limit || d.budget.tick() {
		d.capped = true
		return noNode
	}
	d.nodes = append(d.nodes, n)
	return nodeID(len(d.nodes) - 1)
}

// kids returns the children of n in the tree as grown from the root,
// growing them on first use.
func (d *digraph) kids(n nodeID) []nodeID {
	if n == noNode {
		return nil
	}
	if !d.nodes[n].expanded {
		d.expand(n)
	}
	x := &d.nodes[n]
	end := x.kidStart + x.kidCount
	return d.arena[x.kidStart:end:end]
}

// onPath returns the node on the path from the root to n (n included)
// that stands for atom a, reached from n's atom by bond, or noNode. The
// part of the path from that node to n closes a cycle with the bond, so
// it lies in the bond's block: the walk up stops at the first bond
// outside it, which keeps the search short on long chains (a bridge
// closes no cycle and is not searched at all).
func (d *digraph) onPath(n nodeID, a int, bond int) nodeID {
	g := d.g
	if x := &d.nodes[n]; x.kind == nodeAtom && x.atom == a {
		return n // a bond from an atom to itself
	}
	if !g.ringBond[bond] {
		return noNode
	}
	blk := g.block[bond]
	for ; n != noNode; n = d.nodes[n].parent {
		x := &d.nodes[n]
		if x.kind == nodeAtom && x.atom == a {
			return n
		}
		if x.bond < 0 || g.block[x.bond] != blk {
			return noNode
		}
	}
	return noNode
}

func (d *digraph) expand(n nodeID) {
	d.nodes[n].expanded = true
	x := d.nodes[n]
	if x.kind != nodeAtom {
		return
	}
	g := d.g
	a := x.atom
	kids := d.kidBuf[:0]
	push := func(k nodeID) {
		if k != noNode {
			kids = append(kids, k)
		}
	}
	dupZ := func(carrier, of int, bond int) float64 {
		if g.inMancude(carrier, of) && g.ringBond[bond] {
			return g.mancudeZ[carrier]
		}
		return float64(g.z[of])
	}
	dupMass := func(carrier, of int, bond int) float64 {
		if g.inMancude(carrier, of) && g.ringBond[bond] {
			return g.mancudeM[carrier]
		}
		return g.mass[of]
	}
	for _, e := range g.adj[a] {
		if int32(e.bond) == x.bond {
			// the bond back to the parent: only its extra orders appear
			for i := 1; i < e.cip; i++ {
				push(d.add(node{atom: e.to, kind: nodeDuplicate, parent: n, depth: x.depth + 1,
					z: dupZ(a, e.to, e.bond), mass: dupMass(a, e.to, e.bond), corr: x.parent, bond: int32(e.bond), expanded: true}))
			}
			continue
		}
		if anc := d.onPath(n, e.to, e.bond); anc != noNode {
			// a ring closure back to an atom already on the path
			for i := 0; i < e.cip; i++ {
				z, mass := float64(g.z[e.to]), g.mass[e.to]
				if i > 0 {
					z, mass = dupZ(a, e.to, e.bond), dupMass(a, e.to, e.bond)
				}
				push(d.add(node{atom: e.to, kind: nodeDuplicate, parent: n, depth: x.depth + 1,
					z: z, mass: mass, corr: anc, bond: int32(e.bond), expanded: true, ringDup: i == 0}))
			}
			continue
		}
		k := d.add(node{atom: e.to, kind: nodeAtom, parent: n, depth: x.depth + 1, corr: noNode,
			z: float64(g.z[e.to]), mass: g.mass[e.to], bond: int32(e.bond)})
		if k == noNode {
			break
		}
		push(k)
		for i := 1; i < e.cip; i++ {
			push(d.add(node{atom: e.to, kind: nodeDuplicate, parent: n, depth: x.depth + 1,
				z: dupZ(a, e.to, e.bond), mass: dupMass(a, e.to, e.bond), corr: k, bond: int32(e.bond), expanded: true}))
		}
	}
	for i := 0; i < g.hyd[a]; i++ {
		push(d.add(node{atom: -1, kind: nodeHydrogen, parent: n, depth: x.depth + 1, corr: noNode,
			z: 1, mass: atomMass(1, 0), bond: -1, expanded: true}))
	}
	// children live in one arena per digraph: a few large allocations
	// instead of one per node
	d.nodes[n].kidStart, d.nodes[n].kidCount = int32(len(d.arena)), int32(len(kids))
	d.store(kids)
	d.kidBuf = kids[:0]
}

// lonePair adds a lone-pair node under n (used for the ligands of
// three-coordinate centres).
func (d *digraph) lonePair(n nodeID) nodeID {
	return d.add(node{atom: -1, kind: nodeLonePair, parent: n, depth: d.nodes[n].depth + 1, corr: noNode, bond: -1, expanded: true})
}

// neighbours returns the tree neighbours of n seen from a view whose
// walk arrived at n from `from`: the parent and the children, minus from.
func (d *digraph) neighbours(n, from nodeID) []nodeID {
	ks := d.kids(n)
	p := d.nodes[n].parent
	if from == p {
		return ks
	}
	out := d.kidBuf[:0]
	if p != noNode {
		out = append(out, p)
	}
	for _, k := range ks {
		if k != from {
			out = append(out, k)
		}
	}
	d.kidBuf = out[:0]
	return d.store(out)
}

// store copies a list of nodes to the end of the digraph's arena and
// returns the copy, capped so that appending to it cannot overwrite its
// neighbours. The arena only grows: a copy handed out earlier keeps its
// contents when the arena moves, and children are found by offset.
func (d *digraph) store(xs []nodeID) []nodeID {
	if len(xs) == 0 {
		return nil
	}
	start := len(d.arena)
	d.arena = append(d.arena, xs...)
	return d.arena[start:len(d.arena):len(d.arena)]
}

// treeDistance is the number of edges between two nodes of the tree.
func (d *digraph) treeDistance(a, b nodeID) int {
	da, db := int(d.nodes[a].depth), int(d.nodes[b].depth)
	n := 0
	for da > db {
		a = d.nodes[a].parent
		da--
		n++
	}
	for db > da {
		b = d.nodes[b].parent
		db--
		n++
	}
	for a != b {
		a, b = d.nodes[a].parent, d.nodes[b].parent
		n += 2
	}
	return n
}

// isLigand reports whether a tree neighbour counts as a ligand of its
// atom: everything except the duplicates that stand for extra bond
// orders.
func (d *digraph) isLigand(n nodeID) bool {
	x := &d.nodes[n]
	return x.kind != nodeDuplicate || x.ringDup
}

// ligandsOf returns the ligands of n seen from `from` (excluded), that
// is its tree neighbours without bond-order duplicates.
func (d *digraph) ligandsOf(n, from nodeID) []nodeID {
	nb := d.neighbours(n, from)
	// copied to the end of the arena (which nb may be a window of: a
	// move of the arena leaves nb's contents where they were)
	start := len(d.arena)
	for _, k := range nb {
		if d.isLigand(k) {
			d.arena = append(d.arena, k)
		}
	}
	return d.arena[start:len(d.arena):len(d.arena)]
}

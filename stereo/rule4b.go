// This file implements Sequence Rule 4b.

package stereo

import "slices"

// Rule 4b: when two branches differ in the relation of their
// stereodescriptors to a reference descriptor, like pairs (RR, SS, RM,
// SP) precede unlike ones (P-92.1.3.4). Each branch takes as its
// reference the first descriptor met in hierarchical order; the other
// descriptors, sphere by sphere and in hierarchical order, are then read
// as like or unlike to it and the two sequences compared.
func (d *digraph) compareLikeUnlike(root, a, af, b, bf nodeID) (int, int) {
	sa, sb := d.bestLikeSequence(root, a, af), d.bestLikeSequence(root, b, bf)
	if sa == nil || sb == nil {
		return 0, 0
	}
	base := d.sphereOf(root, a)
	for s := 0; s < len(sa) || s < len(sb); s++ {
		var xa, xb []int
		if s < len(sa) {
			xa = sa[s]
		}
		if s < len(sb) {
			xb = sb[s]
		}
		for i := 0; i < len(xa) || i < len(xb); i++ {
			va, vb := at(xa, i), at(xb, i)
			if va != vb {
				if va > vb {
					return 1, base + s
				}
				return -1, base + s
			}
		}
	}
	return 0, 0
}

func at(xs []int, i int) int {
	if i < len(xs) {
		return xs[i]
	}
	return 0
}

// bestLikeSequence reads a branch's descriptors as like (2) or unlike
// (1) to a reference, sphere by sphere in hierarchical order. The
// reference is the first descriptor in hierarchical order. Where nodes
// tied by the earlier rules carry descriptors, that order is not fixed:
// each tied candidate is tried as the reference, its branch is then
// explored first among its tied siblings, and the sequence that ranks
// higher is kept (P-92.1.3.4: the reference is chosen to give the
// higher precedence). It returns nil when the branch has no descriptor.
func (d *digraph) bestLikeSequence(root, a, af nodeID) [][]int {
	cands := d.referenceCandidates(root, a, af)
	var best [][]int
	for _, ref := range cands {
		seq := d.likeSequence(root, a, af, ref)
		if best == nil || compareSequences(seq, best) > 0 {
			best = seq
		}
	}
	return best
}

// referenceCandidates returns the nodes of the first sphere holding a
// chiral descriptor that are tied, under the rules up to 4a, with the
// first such node.
func (d *digraph) referenceCandidates(root, a, af nodeID) []nodeID {
	type item struct {
		step
		group int
	}
	q := []item{{step{a, af}, 0}}
	ids := d.takeGroupIDs()
	defer d.putGroupIDs(ids)
	for len(q) > 0 && !d.capped {
		var found []item
		var next []item
		for _, s := range q {
			if handedness(d.auxFor(root, s.n)) != 0 {
				found = append(found, s)
			}
			ks := d.sortedNeighbours(root, s.n, s.from, Rule4a)
			run := 0
			for i, k := range ks {
				if i > 0 && !d.tiedUpTo(root, ks[i-1], k, s.n, Rule4a) {
					run++
				}
				key := [2]int{s.group, run}
				id, ok := ids[key]
				if !ok {
					id = len(ids) + 1
					ids[key] = id
				}
				next = append(next, item{step{k, s.n}, id})
			}
		}
		if len(found) > 0 {
			var out []nodeID
			for _, f := range found {
				if f.group == found[0].group {
					out = append(out, f.n)
				}
			}
			return out
		}
		q = next
	}
	return nil
}

// likeSequence walks the branch in hierarchical order, with the path to
// ref explored first among tied siblings, and scores each chiral
// descriptor against ref's.
func (d *digraph) likeSequence(root, a, af, ref nodeID) [][]int {
	// the path from ref up to a: a few nodes, searched in place
	var path []nodeID
	for n := ref; n != noNode; n = d.nodes[n].parent {
		path = append(path, n)
		if n == a {
			break
		}
	}
	onPath := func(n nodeID) bool { return slices.Contains(path, n) }
	refDesc := d.auxFor(root, ref)
	type item struct {
		step
		group int
	}
	type scored struct{ group, v int }
	ids := d.takeGroupIDs()
	defer d.putGroupIDs(ids)
	newID := func(key [2]int) int {
		id, ok := ids[key]
		if !ok {
			id = len(ids) + 1
			ids[key] = id
		}
		return id
	}
	var out [][]int
	q := []item{{step{a, af}, 0}}
	for len(q) > 0 && !d.capped {
		var row []scored
		var next []item
		for _, s := range q {
			if x := d.auxFor(root, s.n); handedness(x) != 0 {
				v := 1
				if handedness(x) == handedness(refDesc) {
					v = 2
				}
				row = append(row, scored{s.group, v})
			}
			ks := d.sortedNeighbours(root, s.n, s.from, Rule4a)
			ks = d.pathFirst(root, s.n, ks, onPath)
			// children of tied siblings stay tied, except the path to
			// the reference, which has been put first
			run := 0
			for i, k := range ks {
				if i > 0 && !d.tiedUpTo(root, ks[i-1], k, s.n, Rule4a) {
					run++
				}
				g := newID([2]int{s.group, run})
				if onPath(k) {
					g = newID([2]int{-int(k) - 1, 0})
				}
				next = append(next, item{step{k, s.n}, g})
			}
		}
		// like before unlike inside a tied group
		slices.SortStableFunc(row, func(x, y scored) int {
			if x.group != y.group {
				return x.group - y.group
			}
			return y.v - x.v
		})
		vals := make([]int, len(row))
		for i, r := range row {
			vals[i] = r.v
		}
		out = append(out, vals)
		q = next
	}
	return out
}

// pathFirst moves the child on the path to the reference to the front of
// its run of tied siblings.
func (d *digraph) pathFirst(root, from nodeID, ks []nodeID, onPath func(nodeID) bool) []nodeID {
	for i, k := range ks {
		if !onPath(k) {
			continue
		}
		j := i
		for j > 0 && d.tiedUpTo(root, ks[j-1], k, from, Rule4a) {
			j--
		}
		if j == i {
			return ks
		}
		out := make([]nodeID, 0, len(ks))
		out = append(out, ks[:j]...)
		out = append(out, k)
		out = append(out, ks[j:i]...)
		out = append(out, ks[i+1:]...)
		return out
	}
	return ks
}

// takeGroupIDs hands out an empty map for numbering tied groups. The
// walks of this file nest (an auxiliary descriptor met on the way ranks
// its own ligands, which may come back here), so the maps form a stack
// kept by the digraph, as the walk queues do.
func (d *digraph) takeGroupIDs() map[[2]int]int {
	if n := len(d.groupIDs); n > 0 {
		m := d.groupIDs[n-1]
		d.groupIDs = d.groupIDs[:n-1]
		return m
	}
	return map[[2]int]int{}
}

func (d *digraph) putGroupIDs(m map[[2]int]int) {
	if len(m) > keepMemo {
		return // clearing a large map costs more than a new one
	}
	clear(m)
	d.groupIDs = append(d.groupIDs, m)
}

func compareSequences(a, b [][]int) int {
	for s := 0; s < len(a) || s < len(b); s++ {
		var xa, xb []int
		if s < len(a) {
			xa = a[s]
		}
		if s < len(b) {
			xb = b[s]
		}
		for i := 0; i < len(xa) || i < len(xb); i++ {
			if va, vb := at(xa, i), at(xb, i); va != vb {
				if va > vb {
					return 1
				}
				return -1
			}
		}
	}
	return 0
}

// Pseudoasymmetric descriptors (r, s) are left to Rule 4c: counting them
// here would tell apart the two ring branches of a 1,4-disubstituted
// cyclohexane that carries further rings (VS205-VS226 of the suite).

// handedness folds the descriptors that count as like: R and M one way,
// S and P the other.
func handedness(x Descriptor) int {
	switch x {
	case DescR, DescM:
		return 1
	case DescS, DescP:
		return -1
	}
	return 0
}

// tiedUpTo reports whether two siblings are equal under the rules up to r.
func (d *digraph) tiedUpTo(root, x, y, from nodeID, r Rule) bool {
	c, _, _ := d.compareChain(root, x, from, y, from, r)
	return c == 0
}

package stereo

import "sort"

// Rule 4b: when two branches differ in the relation of their
// stereodescriptors to a reference descriptor, like pairs (RR, SS, RM,
// SP) precede unlike ones (P-92.1.3.4). Each branch takes as its
// reference the first descriptor met in hierarchical order; the other
// descriptors, sphere by sphere and in hierarchical order, are then read
// as like or unlike to it and the two sequences compared.
func (d *digraph) compareLikeUnlike(root, a, af, b, bf nodeID) (int, int) {
	la := d.descriptorSpheres(root, a, af)
	lb := d.descriptorSpheres(root, b, bf)
	sa, sb := bestLikeSequence(la), bestLikeSequence(lb)
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

// tagged is a descriptor with the group of nodes it is tied with under
// the rules before 4b; the order inside a group is not fixed by those
// rules, so like pairs are taken first there.
type tagged struct {
	desc  Descriptor
	group int
}

// bestLikeSequence reads a branch's descriptors as like (2) or unlike
// (1) to a reference, sphere by sphere. The reference is the first
// descriptor in hierarchical order; when nodes tied for that place carry
// different descriptors each is tried and the sequence that ranks higher
// kept. It returns nil when the branch has no descriptor.
func bestLikeSequence(l [][]tagged) [][]int {
	first := -1
	for i, s := range l {
		if len(s) > 0 {
			first = i
			break
		}
	}
	if first < 0 {
		return nil
	}
	var best [][]int
	g0 := l[first][0].group
	for _, cand := range l[first] {
		if cand.group != g0 {
			break
		}
		seq := likeSequence(l, cand.desc)
		if best == nil || compareSequences(seq, best) > 0 {
			best = seq
		}
	}
	return best
}

func likeSequence(l [][]tagged, ref Descriptor) [][]int {
	out := make([][]int, len(l))
	for s, row := range l {
		var vals []int
		for i := 0; i < len(row); {
			j := i
			for j < len(row) && row[j].group == row[i].group {
				j++
			}
			var grp []int
			for _, t := range row[i:j] {
				v := 1
				if handedness(t.desc) == handedness(ref) {
					v = 2
				}
				grp = append(grp, v)
			}
			// like before unlike inside a tied group
			for x := 1; x < len(grp); x++ {
				for y := x; y > 0 && grp[y] > grp[y-1]; y-- {
					grp[y], grp[y-1] = grp[y-1], grp[y]
				}
			}
			vals = append(vals, grp...)
			i = j
		}
		out[s] = vals
	}
	return out
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

// descriptorSpheres lists, sphere by sphere in hierarchical order (ranked
// by the rules up to 4a), the chiral auxiliary descriptors of a branch,
// each tagged with the group of siblings it is tied with.
func (d *digraph) descriptorSpheres(root, a, af nodeID) [][]tagged {
	var out [][]tagged
	type item struct {
		step
		group int
	}
	q := []item{{step{a, af}, 0}}
	ids := map[[2]int]int{}
	for len(q) > 0 && !d.capped {
		var row []tagged
		var next []item
		for _, s := range q {
			if x := d.auxFor(root, s.n); handedness(x) != 0 {
				row = append(row, tagged{x, s.group})
			}
			// children of nodes tied with each other are tied too: the
			// group of a child is its parent's group and its run of
			// tied siblings
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
		sort.SliceStable(row, func(i, j int) bool { return row[i].group < row[j].group })
		out = append(out, row)
		q = next
	}
	return out
}

// tiedUpTo reports whether two siblings are equal under the rules up to r.
func (d *digraph) tiedUpTo(root, x, y, from nodeID, r Rule) bool {
	c, _, _ := d.compareChain(root, x, from, y, from, r)
	return c == 0
}

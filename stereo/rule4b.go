package stereo

// Rule 4b: when two branches differ in the relation of their
// stereodescriptors to a reference descriptor, like pairs (RR, SS, RM,
// SP, rr, ss) precede unlike ones (P-92.1.3.4). Each branch takes as its
// reference the first descriptor met in hierarchical order; the other
// descriptors, sphere by sphere and in hierarchical order, are then read
// as like or unlike to it and the two sequences compared.
func (d *digraph) compareLikeUnlike(root, a, af, b, bf nodeID) (int, int) {
	la := d.descriptorSpheres(root, a, af)
	lb := d.descriptorSpheres(root, b, bf)
	refA, refB := firstDescriptor(la), firstDescriptor(lb)
	if refA == DescNone || refB == DescNone {
		return 0, 0
	}
	base := d.sphereOf(root, a)
	for s := 0; s < len(la) || s < len(lb); s++ {
		var xa, xb []Descriptor
		if s < len(la) {
			xa = la[s]
		}
		if s < len(lb) {
			xb = lb[s]
		}
		for i := 0; i < len(xa) || i < len(xb); i++ {
			va, vb := likeValue(xa, i, refA), likeValue(xb, i, refB)
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

// likeValue scores the i-th descriptor of a sphere: 2 like the
// reference, 1 unlike, 0 absent.
func likeValue(xs []Descriptor, i int, ref Descriptor) int {
	if i >= len(xs) {
		return 0
	}
	if handedness(xs[i]) == handedness(ref) {
		return 2
	}
	return 1
}

// handedness folds the descriptors that count as like: R, r and M one
// way, S, s and P the other.
func handedness(x Descriptor) int {
	switch x {
	case DescR, DescPseudoR, DescM, DescPseudoM:
		return 1
	case DescS, DescPseudoS, DescP, DescPseudoP:
		return -1
	}
	return 0
}

func firstDescriptor(l [][]Descriptor) Descriptor {
	for _, s := range l {
		if len(s) > 0 {
			return s[0]
		}
	}
	return DescNone
}

// descriptorSpheres lists, sphere by sphere in hierarchical order (ranked
// by the rules up to 4a), the chiral and pseudoasymmetric auxiliary
// descriptors of a branch.
func (d *digraph) descriptorSpheres(root, a, af nodeID) [][]Descriptor {
	var out [][]Descriptor
	q := []step{{a, af}}
	for len(q) > 0 && !d.capped {
		var row []Descriptor
		var next []step
		for _, s := range q {
			if x := d.auxFor(root, s.n); handedness(x) != 0 {
				row = append(row, x)
			}
			for _, k := range d.sortedNeighbours(root, s.n, s.from, Rule4a) {
				next = append(next, step{k, s.n})
			}
		}
		out = append(out, row)
		q = next
	}
	return out
}

package notation

// MirrorPermutation returns the permutation number that describes the
// mirror image of the arrangement @TBn or @OHn describes: the same axis
// with the other sense of turning around it (a reflection through a
// plane that holds the axis). A square-planar arrangement is its own
// mirror image, so @SPn maps to itself. It is derived from the tables of
// OpenSMILES 3.9 that decodePolyhedron holds, not from a table of pairs.
func MirrorPermutation(g ChiralClass, num int) (int, bool) {
	n := 0
	switch g {
	case ChiralSP:
		if num < 1 || num > classLimit(g) {
			return 0, false
		}
		return num, true
	case ChiralTB:
		n = 5
	case ChiralOH:
		n = 6
	default:
		return 0, false
	}
	order := make([]int, n)
	for i := range order {
		order[i] = i
	}
	p, ok := decodePolyhedron(g, order, num)
	if !ok {
		return 0, false
	}
	ring := append([]int(nil), p.ring...)
	reverseInts(ring)
	want := polyhedron{from: p.from, to: p.to, ring: ring}.canonical(g).key
	for m := 1; m <= classLimit(g); m++ {
		if q, ok := decodePolyhedron(g, order, m); ok && q.key == want {
			return m, true
		}
	}
	return 0, false
}

// Arrangement describes where the n neighbours of a square-planar,
// trigonal-bipyramidal or octahedral centre marked with number num sit,
// as neighbour indices in the stereo order: the axis from one neighbour
// to another, and the neighbours around it in anticlockwise order seen
// from the start of the axis. A square has no axis (from and to are -1)
// and its ring is the order around the square.
func Arrangement(g ChiralClass, num, n int) (from, to int, ring []int, ok bool) {
	order := make([]int, n)
	for i := range order {
		order[i] = i
	}
	p, ok := decodePolyhedron(g, order, num)
	if !ok {
		return -1, -1, nil, false
	}
	if g == ChiralSP {
		return -1, -1, p.ring, true
	}
	return p.from, p.to, p.ring, true
}

package stereo

// disjointSets is a union-find over 0..n-1 (path halving, no ranks: the
// sets here are ring systems of one molecule, small and shallow).
type disjointSets []int

func newDisjointSets(n int) disjointSets {
	s := make(disjointSets, n)
	for i := range s {
		s[i] = i
	}
	return s
}

// find returns the representative of x's set.
func (s disjointSets) find(x int) int {
	for s[x] != x {
		s[x] = s[s[x]]
		x = s[x]
	}
	return x
}

// union joins the sets of x and y.
func (s disjointSets) union(x, y int) { s[s.find(x)] = s.find(y) }

// This file implements the union-find both engines group ring systems
// with.

package ringgeom

// DisjointSets is a union-find over 0..n-1 (path halving, no ranks: the
// sets here are ring systems of one molecule, small and shallow).
type DisjointSets []int

// NewDisjointSets returns n sets of one element each.
func NewDisjointSets(n int) DisjointSets {
	s := make(DisjointSets, n)
	for i := range s {
		s[i] = i
	}
	return s
}

// Find returns the representative of x's set.
func (s DisjointSets) Find(x int) int {
	for s[x] != x {
		s[x] = s[s[x]]
		x = s[x]
	}
	return x
}

// Union joins the sets of x and y.
func (s DisjointSets) Union(x, y int) { s[s.Find(x)] = s.Find(y) }

// This file implements the one 64-bit mixer of the hashed graph
// invariants.

package ringgeom

// golden is the increment of splitmix64, 2^64 divided by the golden
// ratio.
const golden = 0x9e3779b97f4a7c15

// Scramble is the finaliser of splitmix64 (common practice): a
// bijection that scatters the bits of x, so that sums of scrambled
// values, which do not depend on the order they are added in, rarely
// collide. Scramble(0) is 0, so a zero contributes nothing to a sum.
func Scramble(x uint64) uint64 {
	x = (x ^ x>>30) * 0xbf58476d1ce4e5b9
	x = (x ^ x>>27) * 0x94d049bb133111eb
	return x ^ x>>31
}

// Mix64 is one step of splitmix64: x advanced by the golden increment,
// then scrambled, so that zero too gives a scattered value.
func Mix64(x uint64) uint64 { return Scramble(x + golden) }

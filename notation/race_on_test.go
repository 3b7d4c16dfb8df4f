//go:build race

package notation

// slowdown is how much slower the race detector makes the reader: the
// bounds of the tests that guard against quadratic work grow by it.
const slowdown = 10

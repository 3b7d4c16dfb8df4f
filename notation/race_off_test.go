//go:build !race

package notation

// slowdown is how much slower the race detector makes the reader (none
// without it): see race_on_test.go.
const slowdown = 1

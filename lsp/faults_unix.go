//go:build unix

package lsp

import "syscall"

// minorFaults returns the minor page faults of the process so far, for
// the debug log: on some virtual machines touching fresh memory costs
// more than the work itself.
func minorFaults() int64 {
	var ru syscall.Rusage
	if syscall.Getrusage(syscall.RUSAGE_SELF, &ru) != nil {
		return 0
	}
	return int64(ru.Minflt)
}

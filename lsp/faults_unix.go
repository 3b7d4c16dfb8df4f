//go:build unix

package lsp

import (
	"syscall"

	"go.uber.org/zap"
)

// minorFaults returns the minor page faults of the process so far, for
// the debug log (0 when log does not log at the debug level): on some
// virtual machines touching fresh memory costs more than the work itself.
func minorFaults(log *zap.Logger) int64 {
	if !log.Core().Enabled(zap.DebugLevel) {
		return 0 // a system call an analysis need not make
	}
	var ru syscall.Rusage
	if syscall.Getrusage(syscall.RUSAGE_SELF, &ru) != nil {
		return 0
	}
	return int64(ru.Minflt)
}

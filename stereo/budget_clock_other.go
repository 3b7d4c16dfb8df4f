//go:build !linux

package stereo

import "time"

// threadCPU reports that the processor time of a thread is not known
// here: the budget counts wall time.
func threadCPU() (time.Duration, bool) { return 0, false }

package stereo

import (
	"syscall"
	"time"
	"unsafe"
)

// clockThreadCPU is Linux's CLOCK_THREAD_CPUTIME_ID: the processor time
// of the calling thread.
const clockThreadCPU = 3

// threadCPU returns the processor time the calling thread has used, and
// false where the system does not say.
func threadCPU() (time.Duration, bool) {
	var ts syscall.Timespec
	_, _, errno := syscall.RawSyscall(syscall.SYS_CLOCK_GETTIME, clockThreadCPU, uintptr(unsafe.Pointer(&ts)), 0)
	if errno != 0 {
		return 0, false
	}
	return time.Duration(ts.Nano()), true
}

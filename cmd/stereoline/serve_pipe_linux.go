package main

import (
	"io"
	"os"
	"syscall"
)

// widenPipe makes the pipe w writes to, when it is one, hold a megabyte
// (Linux's default unprivileged maximum, /proc/sys/fs/pipe-max-size)
// rather than 64 KB: the server writes its diagnostics of a large list,
// tens of megabytes, through it on every edit, and a small pipe makes the
// writer and the editor take turns 16 times a megabyte. It does nothing
// when w is not a pipe or the size is refused.
func widenPipe(w io.Writer) {
	f, ok := w.(*os.File)
	if !ok {
		return
	}
	if st, err := f.Stat(); err != nil || st.Mode()&os.ModeNamedPipe == 0 {
		return
	}
	const setPipeSize = 1031 // F_SETPIPE_SZ, fcntl(2)
	syscall.Syscall(syscall.SYS_FCNTL, f.Fd(), setPipeSize, 1<<20)
}

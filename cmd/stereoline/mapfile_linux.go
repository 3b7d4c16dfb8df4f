package main

import (
	"os"
	"syscall"
)

// canMap reports whether large files are mapped rather than read.
const canMap = true

// mapFile maps size bytes of an open regular file read-only. The pages
// are the kernel's page cache, not the heap: dropPages lets them go
// while the mapping stays valid, and a page touched again is read back.
func mapFile(fh *os.File, size int64) ([]byte, error) {
	return syscall.Mmap(int(fh.Fd()), 0, int(size), syscall.PROT_READ, syscall.MAP_PRIVATE)
}

// dropPages takes the pages of a mapping out of the process's memory;
// the data stays readable.
func dropPages(b []byte) { _ = syscall.Madvise(b, syscall.MADV_DONTNEED) }

// unmapFile ends a mapping; nothing may use b afterwards.
func unmapFile(b []byte) { _ = syscall.Munmap(b) }

package main

import (
	"os"
	"path/filepath"
	"runtime/debug"
	"strings"
	"testing"
)

// TestMappedFileCutShort checks that reading a mapped file that was cut
// short after it was mapped is an error of the file, not a crash: the
// fault is a panic (debug.SetPanicOnFault) that readFailure names.
func TestMappedFileCutShort(t *testing.T) {
	path := filepath.Join(t.TempDir(), "short.smi")
	if err := os.WriteFile(path, []byte(strings.Repeat("C[C@H](N)O\n", 4096)), 0o644); err != nil {
		t.Fatal(err)
	}
	fh, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer fh.Close()
	b, err := mapFile(fh, 4096*11)
	if err != nil {
		t.Fatal(err)
	}
	defer unmapFile(b)
	if err := os.Truncate(path, 0); err != nil {
		t.Fatal(err)
	}
	got := func() (failure error) {
		defer func() {
			if p := recover(); p != nil {
				failure = readFailure(p, true)
			}
		}()
		defer debug.SetPanicOnFault(debug.SetPanicOnFault(true))
		lastByte = b[len(b)-1] // past the end of the file now: SIGBUS
		return nil
	}()
	if got == nil || !strings.Contains(got.Error(), "cut short") {
		t.Errorf("got %v, want the file named as cut short", got)
	}
}

var lastByte byte // a read the compiler keeps

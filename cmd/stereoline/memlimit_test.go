package main

import (
	"os"
	"os/exec"
	"runtime"
	"runtime/debug"
	"testing"
	"time"
)

// TestFollowLiveHeap runs followLiveHeap in a child process (it changes
// the process's memory limit for good): with 200 MB held live the limit
// rises to at least that plus liveHeadroom after a collection, and once
// it is let go the limit returns to the base.
func TestFollowLiveHeap(t *testing.T) {
	if os.Getenv("STEREOLINE_FOLLOW_CHILD") == "1" {
		followChild(t)
		return
	}
	cmd := exec.Command(os.Args[0], "-test.run=^TestFollowLiveHeap$", "-test.v")
	cmd.Env = append(os.Environ(), "STEREOLINE_FOLLOW_CHILD=1", "GOMEMLIMIT=")
	out, err := cmd.CombinedOutput()
	if err != nil {
		t.Fatalf("child: %v\n%s", err, out)
	}
}

func followChild(t *testing.T) {
	const base = 256 << 20 // above liveHeadroom, as the server's is
	followLiveHeap(base)
	if got := debug.SetMemoryLimit(-1); got != base {
		t.Fatalf("limit %d at the start, want %d", got, base)
	}
	// waitFor collects until the limit satisfies ok, for at most 5 s
	// (the finalizer that sets it runs after the collection, on its own
	// goroutine).
	waitFor := func(what string, ok func(int64) bool) {
		t.Helper()
		deadline := time.Now().Add(5 * time.Second)
		for {
			runtime.GC()
			time.Sleep(10 * time.Millisecond)
			if got := debug.SetMemoryLimit(-1); ok(got) {
				return
			} else if time.Now().After(deadline) {
				t.Fatalf("%s: limit %d MB", what, got>>20)
			}
		}
	}
	held := make([]byte, 200<<20)
	for i := range held {
		held[i] = byte(i)
	}
	waitFor("200 MB live", func(l int64) bool { return l >= 200<<20+liveHeadroom })
	runtime.KeepAlive(held)
	held = nil
	waitFor("let go", func(l int64) bool { return l == base })
}

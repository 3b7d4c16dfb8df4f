package lsp

import (
	"runtime"
	"runtime/debug"
	"runtime/metrics"
	"testing"
	"time"
)

// numGC is the number of collections completed.
func numGC() uint64 {
	s := []metrics.Sample{{Name: "/gc/cycles/total:gc-cycles"}}
	metrics.Read(s)
	return s[0].Value.Uint64()
}

// TestIdleCollection checks that an idle worker collects once the heap
// holds more garbage than idleGarbage, and that heapGarbage sees
// garbage made and dropped.
func TestIdleCollection(t *testing.T) {
	// No collection but those asked for, so the garbage stays.
	defer debug.SetGCPercent(debug.SetGCPercent(-1))
	w := newWorker(nil)
	runtime.GC()
	junk := make([][]byte, 0, 64)
	for range 64 {
		junk = append(junk, make([]byte, (idleGarbage+(16<<20))/64))
	}
	junk = nil
	_ = junk
	if g := heapGarbage(); g < idleGarbage {
		t.Fatalf("heapGarbage %d MB after dropping %d MB", g>>20, (idleGarbage+(16<<20))>>20)
	}
	before := numGC()
	w.collectIfIdle()
	deadline := time.Now().Add(10 * time.Second)
	for numGC() == before {
		if time.Now().After(deadline) {
			t.Fatal("no collection after the idle worker found the garbage")
		}
		time.Sleep(5 * time.Millisecond)
	}
	// A worker with a document due does not collect.
	w.due["file:///due.smi"] = time.Now()
	for range 64 {
		junk = append(junk, make([]byte, (idleGarbage+(16<<20))/64))
	}
	junk = nil
	w.collectIfIdle()
	if w.collecting.Load() {
		t.Error("a busy worker started a collection")
	}
}

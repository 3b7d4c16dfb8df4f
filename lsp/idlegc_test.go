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
	for w.collecting.Load() { // the collection counted ends
		if time.Now().After(deadline) {
			t.Fatal("the idle collection did not end")
		}
		time.Sleep(time.Millisecond)
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

// TestCollectionInDebounce checks that an edit scheduled with its
// debounce starts an idle collection when the heap holds much garbage,
// that one scheduled at once does not, and that an analysis waits for a
// running collection to end (awaitCollection).
func TestCollectionInDebounce(t *testing.T) {
	defer debug.SetGCPercent(debug.SetGCPercent(-1))
	w := newWorker(nil)
	runtime.GC()
	drop := func() {
		junk := make([][]byte, 0, 64)
		for range 64 {
			junk = append(junk, make([]byte, (idleGarbage+(16<<20))/64))
		}
		_ = junk
	}
	drop()
	before := numGC()
	w.schedule("file:///now.smi", 0)
	if w.collecting.Load() || numGC() != before {
		t.Fatal("an edit due at once started a collection")
	}
	delete(w.due, "file:///now.smi")
	w.schedule("file:///typed.smi", DefaultDebounce)
	deadline := time.Now().Add(10 * time.Second)
	for w.collecting.Load() && time.Now().Before(deadline) {
		time.Sleep(time.Millisecond)
	}
	if numGC() == before {
		t.Fatal("no collection in the debounce of an edit")
	}

	// An analysis waits for a running collection, and no longer than
	// collectWait.
	done := make(chan struct{})
	w.collected.Store(&done)
	w.collecting.Store(true)
	waited := make(chan time.Duration)
	go func() {
		begun := time.Now()
		w.awaitCollection()
		waited <- time.Since(begun)
	}()
	time.Sleep(collectWait / 5)
	w.collecting.Store(false)
	close(done)
	if d := <-waited; d < collectWait/5 {
		t.Errorf("awaitCollection returned after %v, before the collection ended", d)
	}
	done2 := make(chan struct{}) // never closed: the wait is bounded
	w.collected.Store(&done2)
	w.collecting.Store(true)
	begun := time.Now()
	w.awaitCollection()
	if d := time.Since(begun); d < collectWait || d > 10*collectWait {
		t.Errorf("awaitCollection on a collection that does not end took %v, want about %v", d, collectWait)
	}
	w.collecting.Store(false)
}

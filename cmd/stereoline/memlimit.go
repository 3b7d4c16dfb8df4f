package main

import (
	"runtime"
	"runtime/debug"
	"runtime/metrics"
)

// A soft memory limit (debug.SetMemoryLimit) keeps the heap of the
// language server below 500 MB for the documents it is sized for. A
// document whose live heap comes near the limit would have the collector
// run back to back: a list of 190,000 records keeps some 420 MB live, and
// with the limit fixed at 450 MB every edit ran three collections of it
// (a mark changed: 280-320 ms and 740-850 ms of processor time, against
// 31 ms for 100,000 records). followLiveHeap lets the limit rise above the
// live heap by a fixed headroom after each collection, and fall back to
// the base once the document is closed.

// liveHeadroom is how far above the live heap the limit is kept: more
// than one edit of such a list allocates (its publication alone is 64 MB),
// so an edit runs one collection at most.
const liveHeadroom = 200 << 20

// followLiveHeap sets the soft memory limit to base now and, after every
// collection, to the live heap plus liveHeadroom when that is higher, for the life of the process. It
// is called once, by serve; a limit the user set (GOMEMLIMIT) is left
// alone by not calling it.
func followLiveHeap(base int64) {
	debug.SetMemoryLimit(base)
	sample := []metrics.Sample{{Name: "/gc/heap/live:bytes"}}
	current := base
	// A finalizer runs once after the collection that finds its object
	// unreachable; it arms the next one, so it runs after every cycle.
	type sentinel struct{ _ [64]byte } // not a tiny allocation
	var arm func()
	arm = func() {
		runtime.SetFinalizer(new(sentinel), func(*sentinel) {
			metrics.Read(sample)
			if sample[0].Value.Kind() == metrics.KindUint64 {
				live := int64(sample[0].Value.Uint64())
				if want := max(base, live+liveHeadroom); want != current {
					debug.SetMemoryLimit(want)
					current = want
				}
			}
			arm()
		})
	}
	arm()
}

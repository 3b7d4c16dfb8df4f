package stereo

import (
	"testing"
	"time"
)

// TestBudgetCountsProcessorTime checks the clocks the budget counts where
// the system gives a thread's processor time: after the first half of
// the budget, waiting (a sleep, or a core taken by other work) does not
// spend it, working does; and a budget that is never looked at past its
// first half never reads the processor clock or wires its thread.
func TestBudgetCountsProcessorTime(t *testing.T) {
	if _, ok := threadCPU(); !ok {
		t.Skip("this system gives no processor time per thread; the budget counts wall time")
	}
	b, _ := newBudget(Options{Budget: 40 * time.Millisecond})
	defer b.release()
	if b.check() || b.cpu || b.locked {
		t.Fatalf("a fresh budget: spent %v, processor time %v, wired %v", b.spent, b.cpu, b.locked)
	}
	time.Sleep(120 * time.Millisecond)
	if b.check() {
		t.Fatal("120 ms of sleep spent a budget of 40 ms: waiting counted as work")
	}
	if !b.cpu || !b.locked {
		t.Fatalf("past its first half the budget counts processor time on a wired thread: %v %v", b.cpu, b.locked)
	}
	time.Sleep(60 * time.Millisecond)
	if b.check() {
		t.Fatal("another 60 ms of sleep spent the budget")
	}
	wall := time.Now()
	x := 0
	for !b.check() {
		for i := 0; i < 1000; i++ {
			x += i
		}
		if time.Since(wall) > 10*time.Second {
			t.Fatalf("10 s of work did not spend a budget of 40 ms (%d)", x)
		}
	}
	if time.Since(wall) < 15*time.Millisecond {
		t.Errorf("the budget was spent after %v of work, less than the 20 ms left in processor time", time.Since(wall))
	}
	b.release()
	if b.locked {
		t.Error("release left the thread wired")
	}
}

// TestBudgetNoLimit checks that a budget with no limit is never spent.
func TestBudgetNoLimit(t *testing.T) {
	b, _ := newBudget(Options{})
	time.Sleep(2 * time.Millisecond)
	if b.check() || b.tick() {
		t.Fatal("a budget with no limit was spent")
	}
}

package stereo

import (
	"testing"
	"time"
)

// TestBudgetCountsProcessorTime checks the clock the budget counts where
// the system gives a thread's processor time: waiting (a sleep, or a
// core taken by other work) does not spend the budget, working does.
func TestBudgetCountsProcessorTime(t *testing.T) {
	if _, ok := threadCPU(); !ok {
		t.Skip("this system gives no processor time per thread; the budget counts wall time")
	}
	start, done := StartBudget()
	defer done()
	b := &budget{deadline: start.after(20 * time.Millisecond)}
	time.Sleep(60 * time.Millisecond)
	if b.check() {
		t.Fatal("60 ms of sleep spent a budget of 20 ms")
	}
	wall := time.Now()
	x := 0
	for !b.check() {
		for i := 0; i < 1000; i++ {
			x += i
		}
		if time.Since(wall) > 10*time.Second {
			t.Fatalf("10 s of work did not spend a budget of 20 ms (%d)", x)
		}
	}
}

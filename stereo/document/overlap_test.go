package document

import (
	"testing"

	"stereoline/notation/find"
)

// TestFindOverlapped checks the hand-over between the finder's goroutine
// and the reading one: every chunk comes in order, a panic of the finder
// reaches the caller, and a panic of the reader stops the finder.
func TestFindOverlapped(t *testing.T) {
	chunks := func(n int) func(func([]find.Occurrence)) {
		return func(each func([]find.Occurrence)) {
			for i := range n {
				each([]find.Occurrence{{Text: string(rune('a' + i%26))}})
			}
		}
	}
	var got string
	findOverlapped(chunks(30), func(occs []find.Occurrence) { got += occs[0].Text })
	if want := "abcdefghijklmnopqrstuvwxyzabcd"; got != want {
		t.Errorf("chunks %q, want %q", got, want)
	}

	func() {
		defer func() {
			if r := recover(); r != "finder broke" {
				t.Errorf("recovered %v, want the finder's panic", r)
			}
		}()
		findOverlapped(func(each func([]find.Occurrence)) {
			each(nil)
			panic("finder broke")
		}, func([]find.Occurrence) {})
		t.Error("no panic")
	}()

	stopped := make(chan int, 1)
	func() {
		defer func() {
			if r := recover(); r != "reader broke" {
				t.Errorf("recovered %v, want the reader's panic", r)
			}
		}()
		findOverlapped(func(each func([]find.Occurrence)) {
			n := 0
			defer func() { stopped <- n }()
			for range 1000 {
				each(nil)
				n++
			}
		}, func([]find.Occurrence) { panic("reader broke") })
	}()
	if n := <-stopped; n >= 1000 {
		t.Errorf("the finder handed out all %d chunks after the reader panicked", n)
	}
}

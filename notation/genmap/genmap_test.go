package genmap

import (
	"fmt"
	"testing"
)

// TestBounds checks that a Map never holds more than two generations
// within their bounds, whatever passes through, and forgets the oldest
// keys first.
func TestBounds(t *testing.T) {
	m := New[string, int](8, 100, func(k string) int { return len(k) })
	for i := range 1000 {
		k := fmt.Sprintf("key%d", i)
		m.Put(k, i)
		cur, old := m.Len()
		if cur > 8 || old > 8 || m.Weight() > 100 {
			t.Fatalf("after %d keys: %d and %d keys, weight %d", i+1, cur, old, m.Weight())
		}
		if v, ok := m.Get(k); !ok || v != i {
			t.Fatalf("%s: got %d, %v right after it was put", k, v, ok)
		}
	}
	if _, ok := m.Get("key0"); ok {
		t.Error("the first key is still held after 1,000 others")
	}
	// weight alone bounds a generation too
	w := New[string, bool](1000, 10, func(k string) int { return len(k) })
	for i := range 50 {
		w.Put(fmt.Sprint("abcd", i), true)
		if w.Weight() > 10 {
			t.Fatalf("weight %d past its bound 10", w.Weight())
		}
	}
}

// TestKeptInUse checks that a key asked for stays while others pass
// through: Get moves it out of the older generation, which the next
// rollover drops.
func TestKeptInUse(t *testing.T) {
	m := New[int, int](4, 0, nil)
	m.Put(-1, 42)
	for i := range 100 {
		m.Put(i, i)
		if v, ok := m.Get(-1); !ok || v != 42 {
			t.Fatalf("after %d others the key in use is gone (%d, %v)", i+1, v, ok)
		}
	}
	seen := 0
	m.All(func(k, v int) bool {
		if k != v && k != -1 {
			t.Errorf("entry %d holds %d", k, v)
		}
		seen++
		return true
	})
	if cur, old := m.Len(); seen != cur+old {
		t.Errorf("All gave %d entries, Len %d and %d", seen, cur, old)
	}
}

// TestWorkingSet checks that keys asked for over and over stay while
// they fit in the two generations, even when they fill more than one:
// asking never drops what it has not yet asked for.
func TestWorkingSet(t *testing.T) {
	m := New[int, int](8, 0, nil)
	for i := range 12 {
		m.Put(i, i)
	}
	for round := range 5 {
		for i := range 12 {
			if _, ok := m.Get(i); !ok {
				t.Fatalf("round %d: key %d of 12 is gone (generations of 8)", round, i)
			}
		}
	}
}

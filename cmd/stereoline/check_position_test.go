package main

import "testing"

// TestLineIndex checks positions against the rules of LSP 3.17, "Text
// Documents": lines end at \n, \r\n or \r; characters count UTF-16 code
// units, so a character outside the Basic Multilingual Plane (U+1F9EA,
// four bytes in UTF-8) counts two; an offset inside a character or
// inside \r\n maps to its start. Code points (the text format's
// columns) count every character once.
func TestLineIndex(t *testing.T) {
	text := "a\r\nαβ\rx\U0001F9EAy\nz"
	// Byte offsets: a=0 \r=1 \n=2 α=3-4 β=5-6 \r=7 x=8 🧪=9-12 y=13 \n=14 z=15.
	idx := newLineIndex([]byte(text))
	for _, c := range []struct {
		off  int
		want position
	}{
		{0, position{0, 0, 0}},
		{1, position{0, 1, 1}},  // the \r that ends line 0
		{2, position{0, 1, 1}},  // inside \r\n: start of the pair
		{3, position{1, 0, 0}},  // α
		{4, position{1, 0, 0}},  // inside α
		{5, position{1, 1, 1}},  // β
		{8, position{2, 0, 0}},  // x after a lone \r
		{9, position{2, 1, 1}},  // the emoji
		{13, position{2, 3, 2}}, // y: two UTF-16 units, one code point before it
		{15, position{3, 0, 0}}, // z
		{16, position{3, 1, 1}}, // end of text
		{99, position{3, 1, 1}}, // past the end: clamped
	} {
		if got := idx.position(c.off); got != c.want {
			t.Errorf("offset %d: got %+v, want %+v", c.off, got, c.want)
		}
	}
}

package main

import (
	"strings"
	"testing"
)

// TestCheckPositions checks where findings land on a line with text
// outside ASCII before the notation, by the rules of LSP 3.17, "Text
// Documents" (characters count UTF-16 code units, so U+1F9EA, outside the
// Basic Multilingual Plane, counts two) and of the text format (columns
// count code points, from 1), and across a "\r" line break, which LSP
// counts as one.
func TestCheckPositions(t *testing.T) {
	// A Python script whose first line has a Greek letter and an emoji
	// before the notation, and whose lines end in a lone \r and in \r\n.
	src := "label = \"\u03b1\U0001F9EA\"; smiles = \"C/C=CC\"\rnext = 1\r\nsmiles = \"C/C=CC\"\n"
	stdout, stderr, _ := runCheck(t, src, "--stdin-name", "made_up.py", "-")
	lines := strings.Split(strings.TrimSpace(stdout), "\n")
	// The mark '/' follows 25 code points (label = "α🧪"; smiles = "C), so
	// it is column 26 of the text format, and 26 UTF-16 units, the emoji
	// counting two.
	want := []string{
		"made_up.py:1:26: warning:",
		"made_up.py:3:12: warning:",
	}
	if len(lines) != len(want) {
		t.Fatalf("got %d findings, want %d:\n%s\n%s", len(lines), len(want), stdout, stderr)
	}
	for i := range want {
		if !strings.HasPrefix(lines[i], want[i]) {
			t.Errorf("finding %d: %q, want prefix %q", i, lines[i], want[i])
		}
	}
	stdout, _, _ = runCheck(t, src, "--stdin-name", "made_up.py", "--format", "json", "-")
	if !strings.Contains(stdout, `"start":{"line":0,"character":26}`) || !strings.Contains(stdout, `"start":{"line":2,"character":11}`) {
		t.Errorf("JSON positions should be 0-based UTF-16:\n%s", stdout)
	}
}

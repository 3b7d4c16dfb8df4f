package main

import (
	"sort"
	"unicode/utf8"
)

// lineIndex turns byte offsets of one file into lines and characters.
// It follows the same rules as the language server's mapper (LSP 3.17,
// "Text Documents": lines end at "\n", "\r\n" or "\r"; an offset inside a
// character or a "\r\n" pair maps to its start) so the checker and the
// editor put a finding at the same place. It lives here rather than in
// lsp/ so the checker does not have to build the server.
type lineIndex struct {
	content    []byte
	lineStarts []int
}

func newLineIndex(content []byte) *lineIndex {
	starts := make([]int, 1, 1+len(content)/32)
	for i := 0; i < len(content); i++ {
		switch content[i] {
		case '\n':
			starts = append(starts, i+1)
		case '\r':
			if i+1 < len(content) && content[i+1] == '\n' {
				i++
			}
			starts = append(starts, i+1)
		}
	}
	return &lineIndex{content: content, lineStarts: starts}
}

// lineEnd is the offset of the line break ending line i, or the end of the
// text on the last line.
func (x *lineIndex) lineEnd(i int) int {
	if i+1 >= len(x.lineStarts) {
		return len(x.content)
	}
	end := x.lineStarts[i+1] - 1
	if end > x.lineStarts[i] && x.content[end] == '\n' && x.content[end-1] == '\r' {
		end--
	}
	return end
}

// position returns the 0-based line of off and its character in UTF-16
// code units and in code points. Offsets outside the text are clamped.
func (x *lineIndex) position(off int) position {
	off = max(0, min(off, len(x.content)))
	line := sort.Search(len(x.lineStarts), func(i int) bool { return x.lineStarts[i] > off }) - 1
	start := x.lineStarts[line]
	if end := x.lineEnd(line); off > end {
		off = end
	}
	p := position{Line: line}
	b := x.content[start:off]
	for len(b) > 0 {
		r, size := utf8.DecodeRune(b)
		if r == utf8.RuneError && size == 1 && !utf8.FullRune(b) {
			break // a character cut by the offset counts from its start
		}
		p.CharCP++
		p.Char16++
		if r >= 0x10000 {
			p.Char16++ // a surrogate pair
		}
		b = b[size:]
	}
	return p
}

package find

import (
	"bytes"
	"sort"

	"stereoline/notation"
)

// lineTable holds the offsets where lines start, for pragmas that work
// line by line. Built on demand: files without pragmas never need it.
type lineTable []int

func newLineTable(src []byte) lineTable {
	t := lineTable{0}
	for i, c := range src {
		if c == '\n' {
			t = append(t, i+1)
		}
	}
	return t
}

// line returns the 0-based line holding offset off.
func (t lineTable) line(off int) int {
	return sort.Search(len(t), func(i int) bool { return t[i] > off }) - 1
}

// splitRecord splits one line of a record list into the record and its
// title: the record runs to the first blank (space, tab or carriage
// return), or, when a CXSMILES extension block ("|...|") follows after
// blanks, to the end of the block (notation.RecordEnd decides); the title
// is the rest, trimmed. Results are offsets into line.
func splitRecord(line []byte) (recEnd, titleStart, titleEnd int) {
	_, recEnd = notation.RecordEnd(line)
	titleEnd = len(line)
	for titleEnd > recEnd && isBlank(line[titleEnd-1]) {
		titleEnd--
	}
	titleStart = recEnd
	for titleStart < titleEnd && isBlank(line[titleStart]) {
		titleStart++
	}
	return recEnd, titleStart, titleEnd
}

func isBlank(c byte) bool { return c == ' ' || c == '\t' || c == '\r' }

// skipBOM returns where the text of a file starts: after a UTF-8 byte
// order mark, which spreadsheet and editor exports on Windows write
// (common practice) and which is no part of the first record or header.
func skipBOM(src []byte) int {
	if len(src) >= 3 && src[0] == 0xef && src[1] == 0xbb && src[2] == 0xbf {
		return 3
	}
	return 0
}

// nextLine returns the line of src that starts at start, without its
// newline, and the offset where the next line starts (len(src) after the
// last line).
func nextLine(src []byte, start int) (line []byte, next int) {
	end := bytes.IndexByte(src[start:], '\n')
	if end < 0 {
		return src[start:], len(src)
	}
	return src[start : start+end], start + end + 1
}

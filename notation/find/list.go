package find

import (
	"bytes"

	"stereoline/notation"
)

// findList reads a record list: one record a line, its title after the
// first blank; blank lines and lines starting with '#' are skipped, and
// '#' lines may carry pragmas. A first line whose record is the word
// SMILES (any case) is a header, as many tools write one (common
// practice). This is the hot path for files of 100,000 records: one pass,
// no per-line allocation beyond the two strings and identity offset maps.
func findList(src []byte) []Occurrence {
	prag := newPragmas(src)
	// One string for the whole file: records and titles are slices of
	// it, so the list costs one allocation however long it is.
	text := string(src)
	out := make([]Occurrence, 0, bytes.Count(src, []byte{'\n'})+1)
	first := true
	for start := skipBOM(src); start < len(src); {
		line, next := nextLine(src, start)
		lineStart := start
		start = next
		for len(line) > 0 && (line[0] == ' ' || line[0] == '\t') {
			line = line[1:]
			lineStart++
		}
		if len(line) == 0 || line[0] == '\r' {
			continue
		}
		if line[0] == '#' {
			prag.addComment(line, lineStart)
			continue
		}
		recEnd, ts, te := splitRecord(line)
		if first {
			first = false
			if bytes.EqualFold(line[:recEnd], []byte("smiles")) {
				continue
			}
		}
		if recEnd == 0 || !prag.allowed(lineStart) {
			continue
		}
		o := Occurrence{
			Text:      text[lineStart : lineStart+recEnd],
			Span:      notation.Span{Start: lineStart, End: lineStart + recEnd},
			Kind:      KindList,
			Construct: ConstructListRecord,
			Reason:    ReasonPlace,
			m:         identityMap(lineStart, recEnd),
		}
		if te > ts {
			o.Title = text[lineStart+ts : lineStart+te]
		}
		out = append(out, o)
	}
	return out
}

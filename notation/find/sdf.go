package find

import (
	"bytes"
	"strings"

	"stereoline/notation"
)

// findSDF reads the data items of an SD file (the structure-data format
// of the CTfile formats: each record a molfile, then data items, then a
// line "$$$$"). A data item is a header line starting with '>' that
// names the item between '<' and '>' ("> <SMILES>", ">  <smiles>  (12)"),
// its value on the lines after it, up to a blank line. The value of an
// item whose name names notation (SMILES, Canonical_SMILES, reaction
// SMILES; as a table's structure column is named) is a record, one a
// line; the molfile itself is not line notation and is not read. A
// record's title is its item named as a table's title column (ID, name),
// else the molfile's name line.
func findSDF(src []byte, cfg *Config) []Occurrence { return findSDFChunks(src, cfg, 0, nil) }

// findSDFChunks is findSDF handing its occurrences to each n at a time,
// a record's as soon as it ends, when each is not nil (FindChunks); it
// returns them when each is nil.
func findSDFChunks(src []byte, cfg *Config, n int, each func([]Occurrence)) []Occurrence {
	nm := newNamer(cfg)
	var out []Occurrence
	first := 0           // the first occurrence of the current record
	name := ""           // the name line of the current record's molfile
	title, rank := "", 0 // its best title item and its rank
	atStart := true      // the next line is a record's name line
	item, inItem, structure := "", false, false
	finish := func() {
		t := title
		if t == "" {
			t = name
		}
		for k := first; k < len(out); k++ {
			out[k].Title = t
		}
		first, name, title, rank = len(out), "", "", 0
		atStart, inItem = true, false
		if each != nil && len(out) >= n {
			k := 0
			for ; len(out)-k >= n; k += n {
				each(out[k : k+n : k+n])
			}
			out = append(make([]Occurrence, 0, n), out[k:]...)
			first = len(out)
		}
	}
	for start := skipBOM(src); start < len(src); {
		line, next := nextLine(src, start)
		ls := start
		start = next
		body := bytes.TrimRight(line, " \t\r")
		switch {
		case atStart:
			if n := strings.TrimSpace(string(body)); len(n) <= maxJSONTitle {
				name = n
			}
			atStart = false
		case bytes.Equal(body, []byte("$$$$")):
			finish()
		case len(body) > 0 && body[0] == '>' && (!inItem || bytes.HasPrefix(bytes.TrimLeft(body[1:], " \t"), []byte("<"))):
			// a header ends the item before it even without the blank
			// line the format asks for; a value that starts with '>'
			// (a reaction without reactants, ">>CCO") is no header
			open := bytes.IndexByte(body, '<')
			end := bytes.LastIndexByte(body, '>')
			if open < 0 || end <= open {
				continue
			}
			item = strings.TrimSpace(string(body[open+1 : end]))
			inItem = true
			structure = nm.column(item, cfg.Columns)
			if w, about := nm.classify(item); w.smarts > 0 && !about {
				structure = true // a query pattern item (SMARTS)
			}
		case inItem && len(body) == 0:
			inItem = false
		case inItem:
			value := strings.TrimSpace(string(body))
			if p := titlePriority(item); p > 0 && (rank == 0 || p < rank) && value != "" && len(value) <= maxJSONTitle {
				title, rank = value, p
			}
			if !structure || !plausible(value) || placeholders[strings.ToLower(value)] {
				continue
			}
			from := ls + bytes.Index(line, []byte(value))
			o := Occurrence{
				Text:      value,
				Span:      notation.Span{Start: from, End: from + len(value)},
				Kind:      KindSDF,
				Construct: ConstructTableCell,
				Reason:    ReasonPlace,
				Field:     FieldOfKey(item),
				m:         identityMap(from, len(value)),
			}
			if w, _ := nm.classify(item); w.smarts > w.smiles || queryContent(value) && !readsAsNotation(value) {
				o.Dialect = DialectSMARTS
			}
			out = append(out, o)
		}
	}
	finish()
	if each != nil {
		chunks(out, n, each)
		return nil
	}
	return out
}

package find

import (
	"bytes"
	"slices"
	"strings"

	"stereoline/notation"
	"stereoline/notation/smarts"
)

// findTable reads a CSV or TSV table (RFC 4180: fields separated by the
// separator, records by CRLF or LF, a field in double quotes may hold
// separators, line breaks and doubled quotes). The first record is the
// header. Cells of structure columns are notation: a column whose header
// mentions smiles, structure, rxn or reaction (name parts as for
// variables, so "reaction_id" and "structure name" are not), or one of
// cfg.Columns. A .csv whose first line has semicolons and no commas is
// read with ';', as spreadsheet exports in many locales write it (common
// practice). The title of a record is its cell in the first name, title
// or id column.
func findTable(src []byte, sep byte, cfg *Config) []Occurrence {
	return findTableFrom(src, skipBOM(src), sep, cfg)
}

// findTableFrom is findTable for a table whose header line starts at
// from (after comment lines of a list, say).
func findTableFrom(src []byte, from int, sep byte, cfg *Config) []Occurrence {
	if from >= len(src) {
		return nil
	}
	sep = tableSep(src, sep)
	h, next := readHeader(src, from, sep, cfg)
	if !h.named {
		if cfg.NoGuess {
			return nil
		}
		return tableByContent(src, from, sep, newNamer(cfg), cfg)
	}
	out := h.rows(src, next, sep, nil)
	queryList(out)
	return out
}

// tableSep is the separator of a table read as sep: a .csv whose first
// line has semicolons and no commas is read with ';'.
func tableSep(src []byte, sep byte) byte {
	if sep == ',' {
		first := src
		if k := bytes.IndexByte(src, '\n'); k >= 0 {
			first = src[:k]
		}
		if bytes.IndexByte(first, ',') < 0 && bytes.IndexByte(first, ';') >= 0 {
			return ';'
		}
	}
	return sep
}

// tableHeader is what the header record of a table says: which columns
// hold structures and which the title.
type tableHeader struct {
	columns  []bool // structure columns by index
	titleCol int    // -1 for none
	named    bool   // some column holds structures
}

// readHeader reads the header record starting at from and returns it
// and where the next record starts.
func readHeader(src []byte, from int, sep byte, cfg *Config) (tableHeader, int) {
	nm := newNamer(cfg)
	h := tableHeader{titleCol: -1}
	if from >= len(src) {
		return h, from
	}
	rec, next := readRecord(src, from, sep, nil)
	var byName []int // columns chosen by their names, not by the configuration
	for k, c := range rec {
		name := strings.TrimSpace(string(c.text))
		h.columns = append(h.columns, nm.column(name, cfg.Columns))
		if h.columns[k] && !configured(name, cfg.Columns) {
			byName = append(byName, k)
		}
		if p := titlePriority(name); p > 0 && !h.columns[k] && (h.titleCol < 0 || p < titlePriority(strings.TrimSpace(string(rec[h.titleCol].text)))) {
			h.titleCol = k
		}
	}
	h.vet(src, next, sep, byName)
	for _, c := range h.columns {
		h.named = h.named || c
	}
	return h, next
}

// configured reports whether the configuration names a column so.
func configured(name string, columns []string) bool {
	for _, c := range columns {
		if strings.EqualFold(strings.TrimSpace(c), name) {
			return true
		}
	}
	return false
}

// vetRecords is how many records after the header vet the columns
// chosen by their names.
const vetRecords = 200

// minVetCells is the fewest cells of a column that vet it; a column
// with fewer is kept.
const minVetCells = 4

// vet gives up the columns of cols, chosen by their names, whose cells
// in the first vetRecords records after the header (starting at i) are
// mostly not notation at all (plausible: a blank inside, no atom, a
// file name): a column "reaction_conditions" of "THF, 0 °C, 2 h", or
// "SubstructureMatches" of filter names and "no match". Empty and
// placeholder cells do not count. A column the configuration names is
// never given up; a broken record in a column of records is still
// reported.
func (h *tableHeader) vet(src []byte, i int, sep byte, cols []int) {
	if len(cols) == 0 {
		return
	}
	cells := make([]int, len(cols))
	good := make([]int, len(cols))
	var rec []tableCell
	for n := 0; n < vetRecords && i < len(src); n++ {
		rec, i = readRecord(src, i, sep, rec[:0])
		for j, k := range cols {
			if k >= len(rec) {
				continue
			}
			text := strings.TrimSpace(string(rec[k].text))
			if text == "" || placeholders[strings.ToLower(text)] {
				continue
			}
			cells[j]++
			if plausible(text) {
				good[j]++
			}
		}
	}
	for j, k := range cols {
		if cells[j] >= minVetCells && 2*good[j] < cells[j] {
			h.columns[k] = false
		}
	}
}

// rows appends the structures of the records of src from offset i on to
// out.
func (h *tableHeader) rows(src []byte, i int, sep byte, out []Occurrence) []Occurrence {
	h.eachRow(src, i, sep, func(o Occurrence) { out = append(out, o) })
	return out
}

// findTableChunks is findTable handing out the structures n at a time,
// so that those of a long table are not all held (FindChunks): a first
// pass counts the query patterns that queryList decides on, a second
// reads the records again and hands them out. It returns false, having
// handed out nothing, for a table read by its content.
func findTableChunks(src []byte, sep byte, cfg *Config, n int, each func([]Occurrence)) bool {
	from := skipBOM(src)
	if from >= len(src) {
		return false
	}
	sep = tableSep(src, sep)
	h, next := readHeader(src, from, sep, cfg)
	rows := func(f func(Occurrence)) { h.eachRow(src, next, sep, f) }
	if !h.named {
		if cfg.NoGuess {
			return false
		}
		nm := newNamer(cfg)
		l, ok := contentLayout(src, from, sep, nm, cfg)
		if !ok {
			return false
		}
		rows = func(f func(Occurrence)) {
			// the strings are pieces of windows of the text, not of one
			// copy of it all
			eachContentRow(src, from, sep, l, hostText{src: src, window: streamWindow}, f)
		}
	}
	total, patterns := 0, 0
	rows(func(o Occurrence) {
		total++
		if o.Dialect == DialectSMARTS {
			patterns++
		}
	})
	asPatterns := patterns > 0 && patterns*10 >= total // as queryList decides
	out := make([]Occurrence, 0, n)
	rows(func(o Occurrence) {
		if asPatterns && o.Dialect == DialectSMILES && smarts.Valid(o.Text) {
			o.Dialect = DialectSMARTS
		}
		out = append(out, o)
		if len(out) == n {
			each(out)
			out = make([]Occurrence, 0, n)
		}
	})
	if len(out) > 0 {
		each(out)
	}
	return true
}

// eachRow calls f with the structures of the records of src from offset
// i on, in order.
func (h *tableHeader) eachRow(src []byte, i int, sep byte, f func(Occurrence)) {
	var rec []tableCell
	for i < len(src) {
		rec, i = readRecord(src, i, sep, rec[:0])
		title := ""
		if h.titleCol >= 0 && h.titleCol < len(rec) {
			title = strings.TrimSpace(string(rec[h.titleCol].text))
		}
		for k, c := range rec {
			if k >= len(h.columns) || !h.columns[k] {
				continue
			}
			if o, ok := cellOccurrence(c, title); ok {
				o.Field = uint32(k + 1)
				if sep == '\t' {
					o.Kind = KindTSV
				}
				if queryContent(o.Text) {
					o.Dialect = DialectSMARTS
				}
				f(o)
			}
		}
	}
}

// FindTableLines is FindListLines for a CSV or TSV table (FindKind with
// KindCSV or KindTSV, whose separator sep is): the structures of the
// records on the lines from offset from to offset to of src, exactly as
// the whole table's reading finds them there, where old is the text
// before the edit (old[from:] became src[from:], the lines after to
// unchanged). ok is false when they cannot be read apart: the edit
// reaches the header line, the header names no structure column (the
// table is read by its content), a field in quotes runs over a line
// break in either text (a record is then no line), a structure of the
// lines is a query pattern (whether the others are read as patterns
// depends on them all), or the text has a pragma. The caller must know
// that the old text's reading found no query pattern (none of its
// records has DialectSMARTS): past a share of them, records that read as
// both are read as patterns throughout.
func FindTableLines(old, src []byte, sep byte, cfg Config, from, to int) (occs []Occurrence, ok bool) {
	if old == nil || from < 0 || to > len(src) || from > to || bytes.Contains(src, []byte(pragmaWord)) ||
		skipBOM(old) != skipBOM(src) {
		return nil, false
	}
	return tableLines(old, src, skipBOM(src), sep, &cfg, from, to)
}

// tableLines is FindTableLines for a table whose header line starts at
// start.
func tableLines(old, src []byte, start int, sep byte, cfg *Config, from, to int) (occs []Occurrence, ok bool) {
	k := bytes.IndexByte(src[start:], '\n')
	if k < 0 || start+k >= from {
		return nil, false
	}
	sep = tableSep(src, sep)
	if multiLineField(src, sep) || multiLineField(old, sep) {
		return nil, false
	}
	h, _ := readHeader(src, start, sep, cfg)
	if ho, _ := readHeader(old, start, sep, cfg); !h.named || !slices.Equal(h.columns, ho.columns) {
		// the first records, which vet the columns, chose others
		return nil, false
	}
	occs = h.rows(src[:to], from, sep, nil)
	for i := range occs {
		if occs[i].Dialect == DialectSMARTS {
			return nil, false
		}
	}
	return occs, true
}

// multiLineField reports whether a field of a table in double quotes
// holds a line break or has no closing quote, as readRecord reads them:
// a quote opens a field only where a field starts.
func multiLineField(src []byte, sep byte) bool {
	first := skipBOM(src)
	for i := 0; i < len(src); {
		k := bytes.IndexByte(src[i:], '"')
		if k < 0 {
			return false
		}
		q := i + k
		if q > first && src[q-1] != sep && src[q-1] != '\n' {
			i = q + 1 // a quote inside a field is a character
			continue
		}
		j := q + 1
		for {
			k := bytes.IndexByte(src[j:], '"')
			if k < 0 || bytes.IndexByte(src[j:j+k], '\n') >= 0 {
				return true
			}
			j += k
			if j+1 < len(src) && src[j+1] == '"' {
				j += 2
				continue
			}
			break
		}
		i = j + 1
	}
	return false
}

// tableByContent reads a table whose header names no structure column
// (or that has no header: a comment line first, or records from the
// first line) by its content, as record lists are read: the column that
// reads as notation while the others do not. A table is held to more
// than a list, as its columns are mostly other data: the column must
// read on most lines, the layout must be clear, and at least a third of
// the cells that read must show structure beyond letters (a ring digit,
// a bond, a branch, a bracket), so that a column of codes or words that
// happen to spell atoms stays silent. With detection by names only
// (Config.NoGuess) it is not done.
func tableByContent(src []byte, from int, sep byte, nm namer, cfg *Config) []Occurrence {
	l, ok := contentLayout(src, from, sep, nm, cfg)
	if !ok {
		return nil
	}
	var out []Occurrence
	eachContentRow(src, from, sep, l, wholeText(src), func(o Occurrence) { out = append(out, o) })
	queryList(out)
	return out
}

// contentLayout returns the layout a table is read by its content with
// (tableByContent); false when none is clear enough.
func contentLayout(src []byte, from int, sep byte, nm namer, cfg *Config) (Layout, bool) {
	v := detectLayout(src, from, layoutSpec{sep: sep, sepSet: true}, nm, cfg)
	if v.ambiguous != "" || v.score < 0.5 || !structured(src, from, v.layout) {
		return Layout{}, false
	}
	return v.layout, true
}

// eachContentRow calls f with the structures of the records of a table
// read by its content in the layout l, in order, before queryList; their
// strings are pieces of text.
func eachContentRow(src []byte, from int, sep byte, l Layout, text hostText, f func(Occurrence)) {
	kind := KindCSV
	if sep == '\t' {
		kind = KindTSV
	}
	var fields []fieldSpan
	first := true
	for start := from; start < len(src); {
		line, next := nextLine(src, start)
		ls := start
		start = next
		for len(line) > 0 && (line[0] == ' ' || line[0] == '\t' && sep != '\t') {
			line, ls = line[1:], ls+1
		}
		if len(bytes.TrimSpace(line)) == 0 || isComment(line) {
			continue
		}
		text.cover(ls, ls+len(line))
		if first {
			first = false
			if l.Header {
				continue
			}
		}
		var o Occurrence
		var ok bool
		fields, ok = layoutRecord(&o, &text, src, ls, ls+len(line), l, fields)
		if !ok || placeholders[strings.ToLower(o.Text)] {
			continue
		}
		o.Kind, o.Construct, o.Reason = kind, ConstructTableCell, ReasonPlace
		if queryContent(o.Text) {
			o.Dialect = DialectSMARTS
		}
		f(o)
	}
}

// structured reports whether at least a third of the sample cells of the
// layout's notation field that read as notation show structure beyond
// letters.
func structured(src []byte, from int, l Layout) bool {
	reads, shaped := 0, 0
	for _, ln := range dataLines(src, from, sampleLines) {
		f, ok := pick(splitFields(src, ln.start, ln.end, l.Sep, nil), l.Field)
		if !ok || !fieldReads(src[f.start:f.end]) {
			continue
		}
		reads++
		if bytes.ContainsAny(src[f.start:f.end], "0123456789()[]=#/\\@.") {
			shaped++
		}
	}
	return reads > 0 && shaped*3 >= reads
}

// tableCell is one field: its text as the table means it and the map
// back to the file.
type tableCell struct {
	text []byte
	m    offsetMap
}

// readRecord reads the record starting at i and returns its cells and
// the offset of the next record.
func readRecord(src []byte, i int, sep byte, rec []tableCell) ([]tableCell, int) {
	for {
		var c tableCell
		if i < len(src) && src[i] == '"' {
			var d decoded
			j := i + 1
			for j < len(src) {
				k := bytes.IndexByte(src[j:], '"')
				if k < 0 {
					d.copy(src, j, len(src))
					j = len(src)
					break
				}
				d.copy(src, j, j+k)
				j += k
				if j+1 < len(src) && src[j+1] == '"' {
					d.escape([]byte{'"'}, j, 2)
					j += 2
					continue
				}
				j++ // closing quote
				break
			}
			c = tableCell{text: d.text, m: d.b.done(i + 1)}
			// Anything between the closing quote and the separator is
			// malformed; skip it.
			for j < len(src) && src[j] != sep && src[j] != '\n' {
				j++
			}
			i = j
		} else {
			j := i
			for j < len(src) && src[j] != sep && src[j] != '\n' {
				j++
			}
			end := j
			if end > i && src[end-1] == '\r' {
				end--
			}
			c = tableCell{text: src[i:end], m: identityMap(i, end-i)}
			i = j
		}
		rec = append(rec, c)
		if i >= len(src) {
			return rec, i
		}
		if src[i] == '\n' {
			return rec, i + 1
		}
		i++ // separator
	}
}

// placeholders are cell values that mean "no structure" (common practice).
var placeholders = map[string]bool{"-": true, "na": true, "n/a": true, "nan": true, "none": true, "null": true, "?": true}

// cellOccurrence turns a structure cell into an occurrence, without the
// blanks around it; empty and placeholder cells are skipped.
func cellOccurrence(c tableCell, title string) (Occurrence, bool) {
	from, to := 0, len(c.text)
	for from < to && isBlank(c.text[from]) {
		from++
	}
	for to > from && isBlank(c.text[to-1]) {
		to--
	}
	text := string(c.text[from:to])
	if text == "" || placeholders[strings.ToLower(text)] {
		return Occurrence{}, false
	}
	m := c.m
	if from != 0 || to != len(c.text) {
		m = c.m.slice(from, to)
	}
	return Occurrence{
		Text:      text,
		Title:     title,
		Span:      notation.Span{Start: m.hostStart(), End: m.hostEnd()},
		Kind:      KindCSV,
		Construct: ConstructTableCell,
		Reason:    ReasonPlace,
		m:         m,
	}, true
}

// column reports whether a table header names a structure column.
func (n namer) column(h string, extra []string) bool {
	if configured(h, extra) {
		return true
	}
	found := false
	for _, p := range nameParts(h) {
		if aboutWords[p] {
			return false
		}
		if n.word(p) || strings.Contains(p, "structure") || strings.Contains(p, "reaction") || strings.Contains(p, "rxn") {
			found = true
		}
	}
	return found
}

// titlePriority ranks headers for the title column: 1 is best, 0 is not
// a title column. A name comes first (name, title, compound_name,
// iupac_name, pref_name), then the subject itself (compound, molecule),
// then an identifier of the compound (id, chembl_id, molecule_chembl_id,
// Compound ID, CID, cas), then any other identifier (assay_id), which
// names the row at least. Headers are split into parts as names are
// (nameParts), so case and separators do not matter.
func titlePriority(h string) int {
	switch strings.ToLower(h) {
	case "name", "title", "compound name", "compound_name":
		return 1
	case "compound", "molecule":
		return 2
	case "id":
		return 3
	}
	parts := nameParts(h)
	if len(parts) == 0 || len(parts) > 4 {
		return 0
	}
	last, rest := parts[len(parts)-1], parts[:len(parts)-1]
	ofSubject := true // the other parts say whose name or identifier it is
	for _, p := range rest {
		ofSubject = ofSubject && titleSubjects[p]
	}
	switch {
	case (last == "name" || last == "title") && ofSubject:
		return 1
	case len(parts) == 1 && titleIdentifiers[last]:
		return 3
	case (last == "id" || last == "identifier" || last == "number" && len(rest) > 0) && ofSubject:
		return 3
	case last == "id" || last == "identifier":
		return 4
	}
	return 0
}

// titleSubjects are the parts before name or id in a header that names
// the compound of a row (common practice in exported datasets:
// molecule_chembl_id, pref_name, iupac_name, Compound ID).
var titleSubjects = map[string]bool{
	"compound": true, "molecule": true, "mol": true, "drug": true, "ligand": true, "substance": true,
	"chemical": true, "product": true, "sample": true, "entry": true, "record": true, "pref": true,
	"preferred": true, "common": true, "iupac": true, "trivial": true, "catalog": true, "catalogue": true,
	"vendor": true, "supplier": true, "chembl": true, "pubchem": true, "zinc": true, "cas": true,
	"registry": true, "reg": true, "corporate": true, "corp": true, "internal": true,
}

// titleIdentifiers are one-word headers of compound identifiers (PubChem
// writes CID and SID; CAS registry numbers).
var titleIdentifiers = map[string]bool{"cid": true, "sid": true, "cas": true, "casrn": true, "identifier": true}

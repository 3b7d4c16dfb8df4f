package find

import (
	"bytes"
	"fmt"

	"stereoline/notation"
	"stereoline/notation/smarts"
)

// CodeListLayout is an information about a record list whose layout was
// not clear: two fields read as notation, or none clearly did, so the
// first field was read, or a layout pragma could not be read. It is
// reported once for the file, at its first record.
const CodeListLayout notation.Code = "host-list-layout"

// findList reads a record list: one record a line, laid out as the file
// shows (layout.go): the notation in the field that reads as notation
// while the others do not, fields separated by blanks, tabs, commas or
// semicolons, an optional header line, '#' and '//' comment lines
// (which may carry pragmas) and blank lines skipped. A pragma line
// "stereoline: layout ..." or the layouts setting (Config.Layout) fixes
// what it says. A delimited list whose header names structure columns
// is read as a table, every such column.
//
// This is the hot path for files of 100,000 records: the layout is read
// from the first lines only, the common layout (notation first, title
// after a blank) costs one pass with no per-line allocation, and the
// content of each record is looked at for query primitives only when
// the first lines hold query patterns (a list of structures is not
// searched for them record by record).
func findList(src []byte, cfg *Config) []Occurrence {
	prag := newPragmas(src)
	fixed, bad := listSpec(src, cfg)
	nm := newNamer(cfg)
	v := detectLayout(src, skipBOM(src), fixed, nm, cfg)
	lay := v.layout
	if v.none && fixed.empty() {
		return nil
	}
	if lay.Sep != ' ' && lay.Header {
		if occs, ok := listTable(src, lay, nm, cfg); ok {
			return occs
		}
	}
	out, queries := listRecords(src, skipBOM(src), v, prag, true, make([]Occurrence, 0, bytes.Count(src, []byte{'\n'})+1))
	if !lay.DialectSet && queries > 0 {
		queryList(out)
	}
	switch {
	case len(out) == 0:
	case bad != "":
		out[0].addDiag(layoutNote(out[0].Span, bad), nil)
	case v.ambiguous != "":
		out[0].addDiag(layoutNote(out[0].Span, "could not tell which field holds the notation: "+v.ambiguous+" (a \"stereoline: layout\" pragma or the layouts setting fixes the layout)"), nil)
	}
	return out
}

// listRecords reads the record lines of src from offset from on by the
// layout verdict v, appending to out; first says whether the first data
// line may be a header. It returns the records and how many of them are
// query patterns by their content.
func listRecords(src []byte, from int, v layoutVerdict, prag *pragmas, first bool, out []Occurrence) ([]Occurrence, int) {
	text := string(src)
	lay := v.layout
	queries := 0
	var fields []fieldSpan
	for start := from; start < len(src); {
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
		if isComment(line) {
			prag.addComment(line, lineStart)
			continue
		}
		if first {
			first = false
			if lay.Header || lay.Sep == ' ' && lay.Field == 0 && bytes.EqualFold(line[:notationEnd(line, 0, len(line), ' ')], []byte("smiles")) {
				continue
			}
		}
		if !prag.allowed(lineStart) {
			continue
		}
		if lay.Sep == ' ' && lay.Field == 0 && lay.Title == TitleRest && !v.lenient {
			// The common layout, written out so that the occurrence is
			// built once.
			recEnd, ts, te := splitRecord(line)
			if recEnd == 0 {
				continue
			}
			o := Occurrence{
				Text:      text[lineStart : lineStart+recEnd],
				Span:      notation.Span{Start: lineStart, End: lineStart + recEnd},
				Kind:      KindList,
				Construct: ConstructListRecord,
				Reason:    ReasonPlace,
				Dialect:   lay.Dialect,
				m:         identityMap(lineStart, recEnd),
			}
			if te > ts {
				o.Title = text[lineStart+ts : lineStart+te]
			}
			if !lay.DialectSet && recordIsPattern(o.Text, v) {
				o.Dialect = DialectSMARTS
				queries++
			}
			out = append(out, o)
			continue
		}
		o := Occurrence{Kind: KindList, Construct: ConstructListRecord, Reason: ReasonPlace, Dialect: lay.Dialect}
		var ok bool
		if fields, ok = layoutRecord(&o, text, src, lineStart, lineStart+len(line), lay, fields); !ok {
			continue
		}
		if v.lenient && !fieldReads(src[o.Span.Start:o.Span.End]) {
			continue
		}
		if !lay.DialectSet && recordIsPattern(o.Text, v) {
			o.Dialect = DialectSMARTS
			queries++
		}
		out = append(out, o)
	}
	return out, queries
}

func layoutNote(span notation.Span, msg string) *notation.Error {
	return &notation.Error{Span: span, Code: CodeListLayout, Severity: notation.SeverityInformation, Msg: msg}
}

// recordIsPattern says whether a list record is a query pattern by its
// content: query primitives, looked for only when the first lines hold
// patterns, or, in a list of fragments, a record that reads as a
// pattern and not as notation.
func recordIsPattern(s string, v layoutVerdict) bool {
	if v.queries && maybeQuery(s) && queryContent(s) {
		return true
	}
	return v.fragments && fragmentPattern(s) && !readsAsNotation(s)
}

// maybeQuery is the quick test before queryContent: a query pattern has
// a bracket or one of ~ ! @ , ; & > *, and most records of a list of
// structures have none but brackets.
func maybeQuery(s string) bool {
	for i := 0; i < len(s); i++ {
		if queryByte[s[i]] {
			return true
		}
	}
	return false
}

var queryByte = func() (t [256]bool) {
	for _, c := range "[~!@,;&>*" {
		t[c] = true
	}
	return t
}()

// layoutRecord reads the notation field and title of the line
// src[start:end] by a layout into o.
func layoutRecord(o *Occurrence, text string, src []byte, start, end int, lay Layout, buf []fieldSpan) ([]fieldSpan, bool) {
	for end > start && isBlank(src[end-1]) {
		end--
	}
	fields := splitFields(src, start, end, lay.Sep, buf[:0])
	f, ok := pick(fields, lay.Field)
	if ok && f.end <= f.start && lay.Field >= 0 {
		// An empty field where tabs align the columns ("-X\t\t*-[#9]"):
		// the next field that is not empty.
		for k := lay.Field + 1; k < len(fields); k++ {
			if fields[k].end > fields[k].start {
				f = fields[k]
				break
			}
		}
	}
	if !ok || f.end <= f.start {
		return fields, false
	}
	if f.quoted && bytes.IndexByte(src[f.start:f.end], '"') >= 0 {
		return fields, false // a doubled quote: no record holds one
	}
	o.Text = text[f.start:f.end]
	o.Span = notation.Span{Start: f.start, End: f.end}
	o.m = identityMap(f.start, f.end-f.start)
	o.Title = layoutTitle(text, src, fields, f, lay, end)
	return fields, true
}

// layoutTitle returns the title a layout puts beside the notation field
// f: the rest of the line, everything before the field, a given field,
// or the next field (the one before, for a notation field last).
func layoutTitle(text string, src []byte, fields []fieldSpan, f fieldSpan, lay Layout, end int) string {
	trim := func(a, b int) string {
		for a < b && (isBlank(src[a]) || lay.Sep != ' ' && src[a] == lay.Sep) {
			a++
		}
		for b > a && (isBlank(src[b-1]) || lay.Sep != ' ' && src[b-1] == lay.Sep) {
			b--
		}
		return text[a:b]
	}
	k := -1
	for i := range fields {
		if fields[i] == f {
			k = i
		}
	}
	switch lay.Title {
	case TitleNone:
		return ""
	case TitleRest:
		next := f.end
		if f.quoted && next < end {
			next++
		}
		_, ts, te := splitRecord(src[f.start:end])
		rest := trim(next, end)
		if lay.Sep == ' ' && !f.quoted {
			rest = text[f.start+ts : f.start+te]
		}
		if rest == "" && k > 0 {
			// Nothing after the record: the name before it
			// ("Primary_carbon: [CX4H3][#6]").
			return trim(fields[0].start, fields[k-1].end)
		}
		return rest
	case TitleBefore:
		if k <= 0 {
			return ""
		}
		return trim(fields[0].start, fields[k-1].end)
	case TitleNearest:
		for _, t := range nearest(k, len(fields)) {
			c := src[fields[t].start:fields[t].end]
			if len(c) > 0 && !number(c) && !fieldReads(c) {
				return text[fields[t].start:fields[t].end]
			}
		}
		return ""
	}
	if t := lay.Title; t >= 0 && t < len(fields) && t != k {
		return text[fields[t].start:fields[t].end]
	}
	return ""
}

// nearest lists the field indices after k, then those before it nearest
// first.
func nearest(k, n int) []int {
	out := make([]int, 0, n)
	for i := k + 1; i < n; i++ {
		out = append(out, i)
	}
	for i := k - 1; i >= 0; i-- {
		out = append(out, i)
	}
	return out
}

// number reports whether b is a number (digits with a sign, point or
// exponent), which is data rather than a title.
func number(b []byte) bool {
	digits := 0
	for _, c := range b {
		switch {
		case c >= '0' && c <= '9':
			digits++
		case c == '.' || c == '-' || c == '+' || c == 'e' || c == 'E':
		default:
			return false
		}
	}
	return digits > 0
}

// queryList makes a list of query patterns consistent: when at least
// one record in ten is a pattern by its content (SMARTS primitives), the
// records that read as patterns too are patterns ([N](=O)(O)O in a salt
// list); a rare pattern-like record in a list of structures changes
// nothing else.
func queryList(out []Occurrence) {
	n := 0
	for i := range out {
		if out[i].Dialect == DialectSMARTS {
			n++
		}
	}
	if n == 0 || n*10 < len(out) {
		return
	}
	for i := range out {
		if out[i].Dialect == DialectSMILES && smarts.Valid(out[i].Text) {
			out[i].Dialect = DialectSMARTS
		}
	}
}

// listSpec returns what a layout pragma of the file, or else the layouts
// setting, fixes; bad is a message when a pragma could not be read.
func listSpec(src []byte, cfg *Config) (spec layoutSpec, bad string) {
	if text, at, ok := layoutPragma(src); ok {
		s, err := parseLayoutSpec(text)
		if err == nil {
			return s, ""
		}
		_ = at
		return layoutSpec{}, fmt.Sprintf("layout pragma not read: %v", err)
	}
	if cfg.Layout != "" {
		if s, err := parseLayoutSpec(cfg.Layout); err == nil {
			return s, ""
		}
	}
	return layoutSpec{}, ""
}

// layoutPragma finds a comment line holding "stereoline: layout" and
// returns the specification after it.
func layoutPragma(src []byte) (spec string, at int, ok bool) {
	for from := 0; from < len(src); {
		k := bytes.Index(src[from:], []byte(pragmaWord))
		if k < 0 {
			return "", 0, false
		}
		k += from
		ls := bytes.LastIndexByte(src[:k], '\n') + 1
		line, _ := nextLine(src, ls)
		trimmed := bytes.TrimLeft(line, " \t")
		rest := bytes.TrimLeft(src[k+len(pragmaWord):ls+len(line)], " \t")
		if isComment(trimmed) && bytes.HasPrefix(rest, []byte("layout")) && !wordChar(string(rest), len("layout")) {
			return string(bytes.TrimSpace(rest[len("layout"):])), k, true
		}
		from = k + len(pragmaWord)
	}
	return "", 0, false
}

// listTable reads a delimited list with a header as a table when the
// header names structure columns; ok is false when it names none.
func listTable(src []byte, lay Layout, nm namer, cfg *Config) ([]Occurrence, bool) {
	lines := dataLines(src, skipBOM(src), 1)
	if len(lines) == 0 {
		return nil, false
	}
	named := false
	for _, f := range splitFields(src, lines[0].start, lines[0].end, lay.Sep, nil) {
		named = named || nm.column(string(bytes.TrimSpace(src[f.start:f.end])), cfg.Columns)
	}
	if !named {
		return nil, false
	}
	occs := findTableFrom(src, lines[0].start, lay.Sep, cfg)
	for i := range occs {
		occs[i].Kind, occs[i].Construct = KindList, ConstructListRecord
		if queryContent(occs[i].Text) {
			occs[i].Dialect = DialectSMARTS
		}
	}
	queryList(occs)
	return occs, true
}

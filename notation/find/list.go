package find

import (
	"bytes"
	"fmt"
	"runtime"
	"runtime/debug"
	"sync"

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
	sc, note, occs, done := startList(src, cfg, false)
	if done {
		return occs
	}
	out := sc.nextAll(make([]Occurrence, 0, bytes.Count(src, []byte{'\n'})+1))
	if !sc.v.layout.DialectSet && sc.queries > 0 {
		queryList(out)
	}
	if len(out) > 0 && note != "" {
		out[0].addDiag(layoutNote(out[0].Span, note), nil)
	}
	return out
}

// findListChunks is findList a chunk of at most n records at a time, the
// strings of each chunk copied apart from the rest (streamWindow), so
// that neither all the records nor a copy of the whole list are held at
// once. It reports false, having called nothing, for the lists that must
// be read whole: tables, and lists whose first lines hold query patterns
// (which records are patterns then depends on all of them, queryList).
func findListChunks(src []byte, cfg *Config, n int, each func([]Occurrence)) bool {
	sc, note, occs, done := startList(src, cfg, true)
	switch {
	case done:
		chunks(occs, n, each)
		return true
	case !sc.v.layout.DialectSet && (sc.v.queries || sc.v.fragments):
		return false
	}
	for first := true; ; first = false {
		out := sc.next(make([]Occurrence, 0, n), n)
		if len(out) == 0 {
			return true
		}
		if first && note != "" {
			out[0].addDiag(layoutNote(out[0].Span, note), nil)
		}
		each(out)
	}
}

// startList reads the layout of a list and returns the scanner for its
// records and the note for its first record; done is true when the list
// was read otherwise (as a table, occs) or holds nothing.
func startList(src []byte, cfg *Config, windows bool) (sc *listScanner, note string, occs []Occurrence, done bool) {
	prag := newPragmas(src)
	fixed, bad := listSpec(src, cfg)
	nm := newNamer(cfg)
	v := detectLayout(src, skipBOM(src), fixed, nm, cfg)
	lay := v.layout
	if v.none && fixed.empty() {
		return nil, "", nil, true
	}
	if lay.Sep != ' ' && lay.Header {
		if occs, ok := listTable(src, lay, nm, cfg); ok {
			return nil, "", occs, true
		}
	}
	switch {
	case bad != "":
		note = bad
	case v.ambiguous != "":
		note = "could not tell which field holds the notation: " + v.ambiguous + " (a \"stereoline: layout\" pragma or the layouts setting fixes the layout)"
	}
	sc = &listScanner{src: src, pos: skipBOM(src), v: v, prag: prag, first: true}
	if windows {
		sc.text = hostText{src: src, window: streamWindow}
	} else {
		sc.text = wholeText(src)
	}
	return sc, note, nil, false
}

// listRecords reads the record lines of src from offset from on by the
// layout verdict v, appending to out; first says whether the first data
// line may be a header. It returns the records and how many of them are
// query patterns by their content.
func listRecords(src []byte, from int, v layoutVerdict, prag *pragmas, first bool, out []Occurrence) ([]Occurrence, int) {
	sc := listScanner{src: src, pos: from, v: v, prag: prag, first: first, text: wholeText(src)}
	out = sc.next(out, -1)
	return out, sc.queries
}

// listScanner reads the record lines of a list in order, a number of
// records at a time (next), so that a long list can be streamed.
type listScanner struct {
	src     []byte
	pos     int // where the next line starts
	v       layoutVerdict
	prag    *pragmas
	first   bool // the first data line may be a header
	text    hostText
	fields  []fieldSpan
	queries int // records found query patterns by their content so far
}

// parallelListFrom is the size from which the records of a list are read
// in pieces on all cores: the lines of a list are read each on its own
// once its layout is known, and reading 100,000 of them (6 MB, about
// 120 ms) held up the analysis of a large list opened in the editor.
var parallelListFrom = 1 << 20

// nextAll appends all the remaining records to out, whose capacity must
// be at least the number of lines left. A large list is read in pieces
// on all cores, each into its own stretch of out, unless it holds a
// pragma, whose directives carry from line to line.
func (sc *listScanner) nextAll(out []Occurrence) []Occurrence {
	procs := runtime.GOMAXPROCS(0)
	if procs < 2 || len(sc.src)-sc.pos < parallelListFrom || bytes.Contains(sc.src, []byte(pragmaWord)) {
		return sc.next(out, -1)
	}
	// The first record alone: a header line is looked for before it.
	out = sc.next(out, 1)
	if sc.pos >= len(sc.src) {
		return out
	}
	// Pieces that end at line starts, and the most records each can hold:
	// its lines.
	bounds := []int{sc.pos}
	for k := 1; k < procs; k++ {
		at := sc.pos + (len(sc.src)-sc.pos)*k/procs
		if i := bytes.IndexByte(sc.src[at:], '\n'); i >= 0 && at+i+1 > bounds[len(bounds)-1] && at+i+1 < len(sc.src) {
			bounds = append(bounds, at+i+1)
		}
	}
	bounds = append(bounds, len(sc.src))
	pieces := len(bounds) - 1
	room := make([]int, pieces+1) // piece k writes from out[room[k]] on
	room[0] = len(out)
	for k := range pieces {
		room[k+1] = room[k] + bytes.Count(sc.src[bounds[k]:bounds[k+1]], []byte{'\n'})
	}
	room[pieces]++ // the last line may have no line break
	if room[pieces] > cap(out) {
		return sc.next(out, -1)
	}
	all := out[:room[pieces]]
	got := make([]int, pieces)
	queries := make([]int, pieces)
	failed := make([]any, pieces)
	var wg sync.WaitGroup
	for k := range pieces {
		wg.Add(1)
		go func() {
			defer wg.Done()
			// the content may be a mapped file: a fault on it, if the
			// file is cut short meanwhile, is raised on the caller
			defer func() { failed[k] = recover() }()
			debug.SetPanicOnFault(true)
			part := listScanner{src: sc.src[:bounds[k+1]], pos: bounds[k], v: sc.v, prag: sc.prag, text: sc.text}
			got[k] = len(part.next(all[room[k]:room[k]:room[k+1]], -1))
			queries[k] = part.queries
		}()
	}
	wg.Wait()
	for _, p := range failed {
		if p != nil {
			panic(p)
		}
	}
	n := room[0]
	for k := range pieces {
		n += copy(all[n:], all[room[k]:room[k]+got[k]])
		sc.queries += queries[k]
	}
	clear(all[n:])
	sc.pos = len(sc.src)
	return all[:n]
}

// headerLine reports whether the first data line of a list, without its
// leading blanks, is a header line rather than a record.
func headerLine(line []byte, lay Layout) bool {
	return lay.Header || lay.Sep == ' ' && lay.Field == 0 && bytes.EqualFold(line[:notationEnd(line, 0, len(line), ' ')], []byte("smiles"))
}

// next appends up to max records (all when max < 0) to out.
func (sc *listScanner) next(out []Occurrence, max int) []Occurrence {
	src, v, lay := sc.src, sc.v, sc.v.layout
	text := &sc.text
	for n := 0; sc.pos < len(src) && n != max; {
		line, next := nextLine(src, sc.pos)
		lineStart := sc.pos
		sc.pos = next
		for len(line) > 0 && (line[0] == ' ' || line[0] == '\t') {
			line = line[1:]
			lineStart++
		}
		if len(line) == 0 || line[0] == '\r' {
			continue
		}
		if isComment(line) {
			sc.prag.addComment(line, lineStart)
			continue
		}
		if sc.first {
			sc.first = false
			if headerLine(line, lay) {
				continue
			}
		}
		if !sc.prag.allowed(lineStart) {
			continue
		}
		text.cover(lineStart, lineStart+len(line))
		if lay.Sep == ' ' && lay.Field == 0 && lay.Title == TitleRest && !v.lenient {
			// The common layout, written out so that the occurrence is
			// built once.
			recEnd, ts, te := splitRecord(line)
			if recEnd == 0 {
				continue
			}
			o := Occurrence{
				Text:      text.sub(lineStart, lineStart+recEnd),
				Span:      notation.Span{Start: lineStart, End: lineStart + recEnd},
				Kind:      KindList,
				Construct: ConstructListRecord,
				Reason:    ReasonPlace,
				Dialect:   lay.Dialect,
				m:         identityMap(lineStart, recEnd),
			}
			if te > ts {
				o.Title = text.sub(lineStart+ts, lineStart+te)
			}
			if !lay.DialectSet && recordIsPattern(o.Text, v) {
				o.Dialect = DialectSMARTS
				sc.queries++
			}
			out = append(out, o)
			n++
			continue
		}
		o := Occurrence{Kind: KindList, Construct: ConstructListRecord, Reason: ReasonPlace, Dialect: lay.Dialect}
		var ok bool
		if sc.fields, ok = layoutRecord(&o, text, src, lineStart, lineStart+len(line), lay, sc.fields); !ok {
			continue
		}
		if v.lenient && !fieldReads(src[o.Span.Start:o.Span.End]) {
			continue
		}
		if !lay.DialectSet && recordIsPattern(o.Text, v) {
			o.Dialect = DialectSMARTS
			sc.queries++
		}
		out = append(out, o)
		n++
	}
	return out
}

// hostText hands out the strings of occurrences as pieces of the host
// bytes: of one copy of the whole content (wholeText), or, when a list is
// streamed, of copies of windows of it, each shared by the records of a
// stretch of lines and dropped with them.
type hostText struct {
	src    []byte
	s      string
	base   int
	window int // 0: s is the whole content
}

func wholeText(src []byte) hostText { return hostText{src: src, s: string(src)} }

// streamWindow is the size of the windows a streamed list is copied in.
const streamWindow = 64 << 10

// cover makes sure the bytes [a, b) are in the current window.
func (h *hostText) cover(a, b int) {
	if h.window == 0 || a >= h.base && b <= h.base+len(h.s) {
		return
	}
	h.base = a
	h.s = string(h.src[a:min(len(h.src), max(b, a+h.window))])
}

// sub returns the host bytes [a, b) as a string; they must be covered.
func (h *hostText) sub(a, b int) string { return h.s[a-h.base : b-h.base] }

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
func layoutRecord(o *Occurrence, text *hostText, src []byte, start, end int, lay Layout, buf []fieldSpan) ([]fieldSpan, bool) {
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
	o.Text = text.sub(f.start, f.end)
	o.Span = notation.Span{Start: f.start, End: f.end}
	o.m = identityMap(f.start, f.end-f.start)
	o.Title = layoutTitle(text, src, fields, f, lay, end)
	return fields, true
}

// layoutTitle returns the title a layout puts beside the notation field
// f: the rest of the line, everything before the field, a given field,
// or the next field (the one before, for a notation field last).
func layoutTitle(text *hostText, src []byte, fields []fieldSpan, f fieldSpan, lay Layout, end int) string {
	trim := func(a, b int) string {
		for a < b && (isBlank(src[a]) || lay.Sep != ' ' && src[a] == lay.Sep) {
			a++
		}
		for b > a && (isBlank(src[b-1]) || lay.Sep != ' ' && src[b-1] == lay.Sep) {
			b--
		}
		return text.sub(a, b)
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
			rest = text.sub(f.start+ts, f.start+te)
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
				return text.sub(fields[t].start, fields[t].end)
			}
		}
		return ""
	}
	if t := lay.Title; t >= 0 && t < len(fields) && t != k {
		return text.sub(fields[t].start, fields[t].end)
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

// namesColumn reports whether the header line of a list names a
// structure column, which makes the list a table (listTable).
func namesColumn(src []byte, header listLine, sep byte, nm namer, cfg *Config) bool {
	for _, f := range splitFields(src, header.start, header.end, sep, nil) {
		if nm.column(string(bytes.TrimSpace(src[f.start:f.end])), cfg.Columns) {
			return true
		}
	}
	return false
}

// listTable reads a delimited list with a header as a table when the
// header names structure columns; ok is false when it names none.
func listTable(src []byte, lay Layout, nm namer, cfg *Config) ([]Occurrence, bool) {
	lines := dataLines(src, skipBOM(src), 1)
	if len(lines) == 0 || !namesColumn(src, lines[0], lay.Sep, nm, cfg) {
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

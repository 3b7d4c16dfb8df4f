package find

import (
	"bytes"
	"fmt"
	"strconv"
	"strings"

	"stereoline/notation/smarts"
)

// This file reads the layout of a record list: which field of a line
// holds the notation, what separates the fields, whether a header line
// names them and where the title is. Lists in the wild put the notation
// first or last, after a count or an index, separate fields with blanks,
// tabs, commas or semicolons and open with a header (common practice);
// the layout of each file is read from its content, or fixed by a
// pragma line or a setting in the syntax ParseLayout reads.

// Layout is how the lines of a record list are laid out.
type Layout struct {
	// Sep separates fields: ' ' (runs of blanks), '\t', ',' or ';'.
	// Commas and semicolons inside brackets and double quotes do not
	// separate (they are SMARTS operators or quoted text).
	Sep byte
	// Field is the 0-based field holding the notation; FieldLast for
	// the last field of each line.
	Field int
	// Header is true when the first line that is not a comment names
	// the fields rather than holding a record.
	Header bool
	// Title is the 0-based field holding the title; TitleRest for the
	// rest of the line after the notation (blank-separated lists with
	// the notation first), TitleBefore for everything before it,
	// TitleNone for none, TitleNearest for the nearest field after the
	// notation, else before it, that is neither a number nor notation
	// (an identifier beside a count or a second structure).
	Title int
	// Dialect, when DialectSet, says what the notation field holds;
	// otherwise each record's content decides.
	Dialect    Dialect
	DialectSet bool
}

// Special field positions.
const (
	FieldLast    = -1
	TitleNone    = -1
	TitleRest    = -2
	TitleBefore  = -3
	TitleNearest = -4
)

// defaultLayout is the reading of OpenSMILES section 4.5: the notation
// ends at the first blank and the rest of the line is its title.
var defaultLayout = Layout{Sep: ' ', Field: 0, Title: TitleRest}

// layoutSpec is the part of a layout a pragma or setting fixes; the rest
// is still read from the content.
type layoutSpec struct {
	sep                        byte
	field, title               int
	fieldSet, titleSet, sepSet bool
	header, headerSet          bool
	dialect                    Dialect
	dialectSet                 bool
}

// ParseLayout reads a layout specification: words separated by blanks or
// commas, each optional, those left out read from the content:
//
//	field=N      the notation is field N (1-based), or field=last
//	sep=tab      fields are separated by tab, comma, semicolon or space
//	             (runs of blanks)
//	header       the first line names the fields; no-header: it does not
//	title=N      the title is field N (1-based), title=rest (the rest of
//	             the line after the notation), title=none
//	smarts       the notation field holds query patterns; smiles: it
//	             holds notation, even where a record looks like a pattern
//
// This is the syntax of the "stereoline: layout" pragma and of the
// values of the layouts setting. An empty specification fixes nothing.
func ParseLayout(spec string) (Layout, error) {
	s, err := parseLayoutSpec(spec)
	if err != nil {
		return Layout{}, err
	}
	return s.apply(defaultLayout), nil
}

func parseLayoutSpec(spec string) (layoutSpec, error) {
	var s layoutSpec
	for _, w := range strings.FieldsFunc(spec, func(r rune) bool { return r == ' ' || r == '\t' || r == ',' }) {
		key, val, hasVal := strings.Cut(strings.ToLower(w), "=")
		switch {
		case key == "header" && !hasVal:
			s.header, s.headerSet = true, true
		case key == "no-header" && !hasVal:
			s.header, s.headerSet = false, true
		case key == "smarts" && !hasVal:
			s.dialect, s.dialectSet = DialectSMARTS, true
		case key == "smiles" && !hasVal:
			s.dialect, s.dialectSet = DialectSMILES, true
		case key == "sep" && hasVal:
			c, ok := map[string]byte{"tab": '\t', "comma": ',', "semicolon": ';', "space": ' ', "blank": ' '}[val]
			if !ok {
				return s, fmt.Errorf("layout %q: sep: expected tab, comma, semicolon or space, found %q", spec, val)
			}
			s.sep, s.sepSet = c, true
		case key == "field" && hasVal:
			n, err := layoutIndex(val, "last", FieldLast)
			if err != nil {
				return s, fmt.Errorf("layout %q: field: %v", spec, err)
			}
			s.field, s.fieldSet = n, true
		case key == "title" && hasVal:
			n, err := layoutIndex(val, "rest", TitleRest)
			if val == "none" {
				n, err = TitleNone, nil
			}
			if err != nil {
				return s, fmt.Errorf("layout %q: title: %v", spec, err)
			}
			s.title, s.titleSet = n, true
		default:
			return s, fmt.Errorf("layout %q: unknown word %q (expected field=, sep=, header, no-header, title=, smarts or smiles)", spec, w)
		}
	}
	return s, nil
}

// layoutIndex reads a 1-based field number, or the word standing for a
// special position.
func layoutIndex(val, word string, special int) (int, error) {
	if val == word {
		return special, nil
	}
	n, err := strconv.Atoi(val)
	if err != nil || n < 1 || n > 1000 {
		return 0, fmt.Errorf("expected a field number from 1 or %q, found %q", word, val)
	}
	return n - 1, nil
}

func (s layoutSpec) empty() bool {
	return !s.sepSet && !s.fieldSet && !s.titleSet && !s.headerSet && !s.dialectSet
}

// apply overrides l with what the specification fixes.
func (s layoutSpec) apply(l Layout) Layout {
	if s.sepSet {
		l.Sep = s.sep
	}
	if s.fieldSet {
		l.Field = s.field
		if !s.titleSet {
			l.Title = defaultTitle(l.Sep, l.Field)
		}
	}
	if s.titleSet {
		l.Title = s.title
	}
	if s.headerSet {
		l.Header = s.header
	}
	if s.dialectSet {
		l.Dialect, l.DialectSet = s.dialect, true
	}
	return l
}

// defaultTitle is where the title is when nothing says: the rest of the
// line after a notation first in a blank-separated list, everything
// before a notation last there, otherwise the nearest field that is
// neither a number nor notation.
func defaultTitle(sep byte, field int) int {
	switch {
	case sep == ' ' && field == 0:
		return TitleRest
	case sep == ' ' && field == FieldLast:
		return TitleBefore
	case sep == ' ':
		return TitleRest
	}
	return TitleNearest
}

// ---- lines and fields ----

// listLine is one line of a list: [start, end) without its line break
// and trailing carriage return, with leading blanks skipped.
type listLine struct{ start, end int }

// isComment reports whether a line (leading blanks skipped) is a comment
// of a list: '#', ';' (which no record starts with) or '//'.
func isComment(line []byte) bool {
	return len(line) > 0 && (line[0] == '#' || line[0] == ';') || len(line) > 1 && line[0] == '/' && line[1] == '/'
}

// dataLines returns up to max lines of text that are neither blank nor
// comments, from offset from.
func dataLines(text []byte, from, max int) []listLine {
	var out []listLine
	for start := from; start < len(text) && len(out) < max; {
		line, next := nextLine(text, start)
		s := start
		start = next
		for len(line) > 0 && (line[0] == ' ' || line[0] == '\t') {
			line, s = line[1:], s+1
		}
		for len(line) > 0 && isBlank(line[len(line)-1]) {
			line = line[:len(line)-1]
		}
		if len(line) == 0 || isComment(line) {
			continue
		}
		out = append(out, listLine{s, s + len(line)})
	}
	return out
}

// fieldSpan is one field of a line: [start, end) in the text, quotes
// excluded; quoted says it was in double quotes.
type fieldSpan struct {
	start, end int
	quoted     bool
}

// splitFields splits text[start:end] into fields by sep, appending to
// out. Blank separation takes runs of blanks; other separators are one
// byte each, outside double quotes and, for commas and semicolons,
// outside brackets.
func splitFields(text []byte, start, end int, sep byte, out []fieldSpan) []fieldSpan {
	if sep == ' ' {
		for i := start; i < end; {
			for i < end && isBlank(text[i]) {
				i++
			}
			if i >= end {
				break
			}
			j := notationEnd(text, i, end, ' ')
			out = append(out, fieldSpan{start: i, end: j})
			i = j
		}
		return out
	}
	for i := start; ; {
		f := fieldSpan{start: i}
		if i < end && text[i] == '"' {
			j := i + 1
			for j < end {
				if text[j] == '"' {
					if j+1 < end && text[j+1] == '"' {
						j += 2
						continue
					}
					break
				}
				j++
			}
			f = fieldSpan{start: i + 1, end: min(j, end), quoted: true}
			for j < end && text[j] != sep {
				j++
			}
			i = j
		} else {
			f.end = notationEnd(text, i, end, sep)
			i = f.end
		}
		// Blanks around a delimited field belong to neither.
		for f.start < f.end && isBlank(text[f.start]) {
			f.start++
		}
		for f.end > f.start && isBlank(text[f.end-1]) {
			f.end--
		}
		out = append(out, f)
		if i >= end {
			return out
		}
		i++ // the separator
	}
}

// notationEnd is the one place that says where a field that starts at
// i ends in text[:end]: at the first blank in a blank-separated list (a
// record is terminated by a blank, OpenSMILES section 4.5), at the
// separator otherwise, skipping separators inside brackets (SMARTS
// operators). What follows a record before its title (a CXSMILES
// extension block) starts at the returned offset.
func notationEnd(text []byte, i, end int, sep byte) int {
	depth := 0
	for j := i; j < end; j++ {
		c := text[j]
		switch {
		case sep == ' ' && (c == ' ' || c == '\t'):
			return j
		case c == '[':
			depth++
		case c == ']':
			if depth > 0 {
				depth--
			}
		case c == sep && (depth == 0 || sep == '\t'):
			return j
		}
	}
	return end
}

// pick returns the field a layout position names, or false.
func pick(fields []fieldSpan, pos int) (fieldSpan, bool) {
	switch {
	case pos == FieldLast && len(fields) > 0:
		return fields[len(fields)-1], true
	case pos >= 0 && pos < len(fields):
		return fields[pos], true
	}
	return fieldSpan{}, false
}

// ---- reading the layout from the content ----

// sampleLines is how many lines the layout is read from: enough to see a
// pattern, few enough that a 100,000-line list pays nothing noticeable.
const sampleLines = 24

// candidate is one (separator, field) reading of the sample lines.
type candidate struct {
	sep   byte
	pos   int
	score float64 // share of the sample lines whose field reads as notation
	spans []fieldSpan
	reads []bool // per sample line: the field reads as notation
}

// layoutVerdict is what detection found: the layout, and when it fell
// back to the first field because two fields read as notation or none
// clearly did, why.
type layoutVerdict struct {
	layout    Layout
	ambiguous string
	score     float64 // share of the sample lines whose chosen field reads
	// none: hardly a line of a long enough sample has a field that reads
	// as notation; the text is no record list (prose, another format).
	none bool
	// queries: a sample line's notation field is a query pattern by its
	// content, so every record's content is looked at.
	queries bool
	// lenient: the layout is a guess on little evidence; only the lines
	// whose field reads as notation are records.
	lenient bool
	// fragments: a good share of the sample records read only as
	// patterns (fragmentPattern); such records are patterns.
	fragments bool
}

// detectLayout reads the layout of text from its first data lines.
// fixed holds what a pragma or setting says; the rest is detected.
func detectLayout(text []byte, from int, fixed layoutSpec, nm namer, cfg *Config) layoutVerdict {
	lines := dataLines(text, from, sampleLines+1)
	if len(lines) == 0 {
		return layoutVerdict{layout: fixed.apply(defaultLayout)}
	}
	// The first line may be a header, which costs it one line of the
	// score.
	scored := lines
	if !fixed.fieldSet && !fixed.sepSet && singleFields(text, scored) {
		// One field a line: nothing to choose between.
		v := layoutVerdict{layout: fixed.apply(defaultLayout), score: 1}
		for _, l := range scored {
			v.queries = v.queries || queryContent(string(text[l.start:l.end]))
		}
		return v
	}
	var cands []candidate
	var buf []fieldSpan
	// Candidates of different separators often pick the same bytes; each
	// field is read once.
	memo := map[fieldSpan]bool{}
	reads := func(f fieldSpan) bool {
		v, ok := memo[f]
		if !ok {
			v = fieldReads(text[f.start:f.end])
			memo[f] = v
		}
		return v
	}
	for _, sep := range separators(text, scored, fixed) {
		maxFields := 0
		per := make([][]fieldSpan, len(scored))
		for k, l := range scored {
			buf = splitFields(text, l.start, l.end, sep, buf[:0])
			per[k] = append([]fieldSpan(nil), buf...)
			maxFields = max(maxFields, len(buf))
		}
		positions := []int{0, 1, 2, FieldLast}
		if sep != ' ' {
			positions = positions[:0]
			for p := 0; p < min(maxFields, 8); p++ {
				positions = append(positions, p)
			}
		}
		if fixed.fieldSet {
			positions = []int{fixed.field}
		}
		for _, pos := range positions {
			c := candidate{sep: sep, pos: pos, spans: make([]fieldSpan, len(scored)), reads: make([]bool, len(scored))}
			hits := 0
			for k := range scored {
				f, ok := pick(per[k], pos)
				if !ok {
					c.spans[k] = fieldSpan{start: -1}
					continue
				}
				c.spans[k] = f
				if reads(f) {
					hits++
					c.reads[k] = true
				}
			}
			c.score = float64(hits) / float64(len(scored))
			cands = append(cands, c)
		}
	}
	v := choose(cands, fixed)
	v.layout.Header = header(text, lines, v.layout, v.score, fixed, nm, cfg)
	patterns := 0
	for _, l := range scored {
		f, ok := pick(splitFields(text, l.start, l.end, v.layout.Sep, buf[:0]), v.layout.Field)
		if !ok {
			continue
		}
		if f.end-f.start > maxLayoutField {
			continue
		}
		s := string(text[f.start:f.end])
		if queryContent(s) {
			v.queries = true
		}
		if !v.queries && fragmentPattern(s) && !(organicShape(s) && readsAsNotation(s)) {
			patterns++
		}
	}
	// A list where one record in ten reads only as a pattern is a list of
	// patterns: its records are looked at one by one.
	v.fragments = patterns*10 >= len(scored) && patterns > 0
	return v
}

// singleFields reports whether no sample line has a blank, tab, comma or
// semicolon after its first character.
func singleFields(text []byte, lines []listLine) bool {
	for _, l := range lines {
		if bytes.IndexAny(text[l.start:l.end], " \t,;") >= 0 {
			return false
		}
	}
	return true
}

// separators returns the separators worth trying: the fixed one, or
// each of tab, comma and semicolon that most sample lines hold outside
// brackets and quotes, and blanks.
func separators(text []byte, lines []listLine, fixed layoutSpec) []byte {
	if fixed.sepSet {
		return []byte{fixed.sep}
	}
	var out []byte
	for _, sep := range []byte{'\t', ',', ';'} {
		n := 0
		for _, l := range lines {
			if notationEnd(text, l.start, l.end, sep) < l.end {
				n++
			}
		}
		if n*5 >= len(lines)*4 {
			out = append(out, sep)
		}
	}
	return append(out, ' ')
}

// maxLayoutField is the longest field the layout is judged by: a record
// of 400 KB (a hostile chain) would cost the sampling more than its own
// analysis, and says nothing about the columns that fieldReads could not
// learn from the other lines.
const maxLayoutField = 4096

// fieldReads reports whether one field reads as a record: notation
// without an error, or a query pattern (by its content) without one.
// Numbers, words that spell no structure and prose fail here.
func fieldReads(b []byte) bool {
	if len(b) == 0 || len(b) > maxLayoutField {
		return false
	}
	// The quick tests of plausible on the bytes, before a string is made.
	if c := b[0] | 0x20; !(c >= 'a' && c <= 'z' || b[0] == '[' || b[0] == '*' || b[0] == '>') {
		return false
	}
	for _, c := range b {
		if !notationByte[c] {
			return false
		}
	}
	s := string(b)
	if !plausible(s) {
		return false
	}
	if queryContent(s) {
		return hasElementAtom(s) && smarts.Valid(s)
	}
	if organicShape(s) && readsAsNotation(s) {
		return true
	}
	return fragmentPattern(s)
}

// fragmentPattern reports a record that reads as a pattern but not as
// notation: a fragment with aromatic atoms outside a ring or odd
// hydrogen counts (BrCc(c)c, C(C=O)[nH2]), as torsion and fragment
// libraries write them. Letters alone (SP3-SP3) do not count.
func fragmentPattern(s string) bool {
	return strings.ContainsAny(s, "[cnops") && hasElementAtom(s) && smarts.Valid(s)
}

// choose picks the reading. The notation field is the one that reads as
// notation on most lines while the fields beside it do not; when two
// fields both read (two structure columns, or names that spell
// structures) or none clearly does, the first field is read, as the
// specification's default, and the verdict says why.
func choose(cands []candidate, fixed layoutSpec) layoutVerdict {
	def := fixed.apply(defaultLayout)
	if len(cands) == 0 {
		return layoutVerdict{layout: def}
	}
	first := -1
	best := 0
	for i, c := range cands {
		if c.sep == ' ' && c.pos == 0 {
			first = i
		}
		b := cands[best]
		// Ties go to a delimiter over blanks (its title is cleaner) and
		// to the earlier field.
		if c.score > b.score+1e-9 || c.score > b.score-1e-9 && c.sep != ' ' && b.sep == ' ' {
			best = i
		}
	}
	b := cands[best]
	if b.score == 0 {
		return layoutVerdict{layout: def, none: len(b.reads) >= 3}
	}
	// The others: how often another field reads on a line where it is
	// not the chosen field.
	second := 0.0
	for i, c := range cands {
		if i != best {
			second = max(second, elsewhere(b, c))
		}
	}
	d := 0.0
	if first >= 0 {
		d = elsewhere(b, cands[first])
	}
	chosen := Layout{Sep: b.sep, Field: b.pos, Title: defaultTitle(b.sep, b.pos)}
	chosen = fixed.apply(chosen)
	switch {
	case fixed.fieldSet:
		return layoutVerdict{layout: chosen, score: b.score}
	case b.score >= 0.5 && second <= b.score/3:
		return layoutVerdict{layout: chosen, score: b.score}
	case first >= 0 && !sameColumn(b, cands[first]) && b.score >= 0.3 && d <= 0.05 && second <= b.score/3:
		// A field that reads on a good share of the lines where the
		// first field never does (a column of partly broken records).
		return layoutVerdict{layout: chosen, score: b.score}
	}
	if second > b.score/3 && b.score >= 0.5 {
		// Two fields read (a pattern column and a structure column, or
		// names that spell structures): the earlier one is read.
		k := earliest(cands, best)
		e := cands[k]
		l := fixed.apply(Layout{Sep: e.sep, Field: e.pos, Title: defaultTitle(e.sep, e.pos)})
		why := fmt.Sprintf("fields %s and %s both read as notation; field %s is read", b.name(), secondName(cands, best), e.name())
		if k != best {
			why = fmt.Sprintf("fields %s and %s both read as notation; field %s is read", e.name(), b.name(), e.name())
		}
		return layoutVerdict{layout: l, ambiguous: why, score: e.score}
	}
	if len(b.reads) >= 5 && b.score < 0.2 || len(b.reads) >= 3 && b.score == 0 {
		// Hardly any line has a field that reads: not a record list.
		return layoutVerdict{layout: def, none: true}
	}
	// Few lines read, in whichever field: a file that is mostly
	// something else. The best field is read on the lines where it
	// reads, and nowhere else, so that the rest is not reported as
	// broken notation.
	l := fixed.apply(Layout{Sep: b.sep, Field: b.pos, Title: defaultTitle(b.sep, b.pos)})
	why := fmt.Sprintf("field %s reads as notation on only %d%% of the lines, so only those lines are read", b.name(), int(b.score*100+0.5))
	return layoutVerdict{layout: l, ambiguous: why, score: b.score, lenient: true}
}

// sameColumn reports whether two candidates pick the same bytes on most
// sample lines (a field first split by tabs or by blanks).
func sameColumn(a, b candidate) bool {
	same := 0
	for k := range a.spans {
		if a.spans[k] == b.spans[k] {
			same++
		}
	}
	return same*2 > len(a.spans)
}

// earliest returns the candidate reading well (at least half as often as
// the best) whose field comes first on the line.
func earliest(cands []candidate, best int) int {
	k := best
	rank := func(c candidate) int {
		if c.pos == FieldLast {
			return 1 << 20
		}
		return c.pos
	}
	for i, c := range cands {
		if c.score >= cands[best].score/2 && c.sep == cands[best].sep && rank(c) < rank(cands[k]) {
			k = i
		}
	}
	return k
}

// secondName names the candidate that most often reads where it is not
// the chosen field.
func secondName(cands []candidate, best int) string {
	k := -1
	for i, c := range cands {
		if i != best && (k < 0 || elsewhere(cands[best], c) > elsewhere(cands[best], cands[k])) {
			k = i
		}
	}
	if k < 0 {
		return "?"
	}
	return cands[k].name()
}

// elsewhere is the share of sample lines on which c's field reads as
// notation and is not b's field.
func elsewhere(b, c candidate) float64 {
	n := 0
	for k := range c.reads {
		if c.reads[k] && c.spans[k] != b.spans[k] {
			n++
		}
	}
	return float64(n) / float64(max(1, len(c.reads)))
}

// name says which field a candidate is, for messages: "1", "last".
func (c candidate) name() string {
	if c.pos == FieldLast {
		return "last"
	}
	return strconv.Itoa(c.pos + 1)
}

// header decides whether the first data line is a header: fixed by a
// specification, or its notation field does not read as notation, reads
// like a column name (letters, digits, blanks, _ - . and the like) and
// the lines after it do read (otherwise it is one more bad record).
func header(text []byte, lines []listLine, l Layout, score float64, fixed layoutSpec, nm namer, cfg *Config) bool {
	if fixed.headerSet {
		return fixed.header
	}
	if len(lines) == 0 {
		return false
	}
	fields := splitFields(text, lines[0].start, lines[0].end, l.Sep, nil)
	f, ok := pick(fields, l.Field)
	if !ok {
		return false
	}
	cell := text[f.start:f.end]
	if fieldReads(cell) {
		return false
	}
	if nm.column(strings.TrimSpace(string(cell)), cfg.Columns) || strings.EqualFold(string(cell), "smiles") {
		return true
	}
	if len(lines) < 2 || score < 0.5 {
		return false
	}
	for _, c := range cell {
		if !(c >= 'a' && c <= 'z' || c >= 'A' && c <= 'Z' || c >= '0' && c <= '9' || bytes.IndexByte([]byte(" _-.()/#%"), c) >= 0) {
			return false
		}
	}
	return true
}

package review

import (
	"bytes"
	"encoding/json"
	"sort"
	"strconv"
	"strings"

	"stereoline/notation/find"
)

// This file implements the identity the host gives a record: the title
// of a list line, the ID column of a table row (with the column of the
// cell, so a reactant and a product column of one row stay apart), the
// path of object keys to a JSON value, the name a string literal is
// bound to in code. A key that is not unique within its version is no
// identity and is dropped; its records are paired by content and
// position instead.

// hostKeys returns the identity key of each occurrence, "" where the
// host gives none. keyField is the --key setting: a table column by its
// header or 1-based number, or a 1-based field of a list line.
func hostKeys(kind find.Kind, content []byte, occs []find.Occurrence, keyField string) []string {
	keys := make([]string, len(occs))
	var tab *tableIndex
	var js *jsonIndex
	for i := range occs {
		o := &occs[i]
		switch {
		case kind == find.KindNotebook:
			// Cells are JSON strings holding code; positions in them
			// are not worth the guess.
		case o.Construct == find.ConstructTableCell:
			if tab == nil {
				tab = newTableIndex(content, o.Kind)
			}
			keys[i] = tab.key(o.Span.Start, o.Title, keyField)
		case o.Construct == find.ConstructListRecord || o.Construct == find.ConstructFencedRecord:
			if keyField != "" {
				keys[i] = listField(content, o, keyField)
			} else {
				keys[i] = o.Title
			}
		case o.Construct == find.ConstructJSONValue:
			if js == nil {
				js = newJSONIndex(content, keyField)
			}
			keys[i] = js.path(o.Span.Start)
		case o.Construct == find.ConstructStringLiteral:
			keys[i] = boundName(content, o.Span.Start)
		default:
			keys[i] = o.Title
		}
	}
	return uniqueOnly(keys)
}

// uniqueOnly blanks every key that occurs more than once.
func uniqueOnly(keys []string) []string {
	count := make(map[string]int, len(keys))
	for _, k := range keys {
		if k != "" {
			count[k]++
		}
	}
	for i, k := range keys {
		if count[k] > 1 {
			keys[i] = ""
		}
	}
	return keys
}

// lineAround returns the bounds of the line holding off.
func lineAround(content []byte, off int) (int, int) {
	off = max(0, min(off, len(content)))
	start := bytes.LastIndexByte(content[:off], '\n') + 1
	end := bytes.IndexByte(content[off:], '\n')
	if end < 0 {
		end = len(content)
	} else {
		end += off
	}
	if end > start && content[end-1] == '\r' {
		end--
	}
	return start, end
}

// listField returns field n (1-based) of a list record's line. The
// separator is the first of tab, semicolon, comma that occurs on the
// line outside the notation, else blanks.
func listField(content []byte, o *find.Occurrence, keyField string) string {
	n, err := strconv.Atoi(strings.TrimSpace(keyField))
	if err != nil || n < 1 {
		return ""
	}
	start, end := lineAround(content, o.Span.Start)
	line := string(content[start:end])
	outside := string(content[start:max(start, min(o.Span.Start, end))]) + string(content[min(max(o.Span.End, start), end):end])
	var fields []string
	switch {
	case strings.Contains(outside, "\t"):
		fields = strings.Split(line, "\t")
	case strings.Contains(outside, ";"):
		fields = strings.Split(line, ";")
	case strings.Contains(outside, ","):
		fields = strings.Split(line, ",")
	default:
		fields = strings.Fields(line)
	}
	if n > len(fields) {
		return ""
	}
	return strings.TrimSpace(strings.Trim(strings.TrimSpace(fields[n-1]), `"`))
}

// tableIndex knows the header and the cells of a CSV or TSV table, read
// as RFC 4180 says (fields in double quotes may hold separators, line
// breaks and doubled quotes).
type tableIndex struct {
	header []string
	rows   [][]tableCell // every row after the header
	starts []int         // start offset of each row, ascending
}

type tableCell struct {
	start, end int
	text       string
}

// newTableIndex reads the table. The separator is a tab for TSV, else a
// comma, or a semicolon when the header line has semicolons and no
// comma (as the finder decides); comment and blank lines before the
// header are skipped.
func newTableIndex(content []byte, kind find.Kind) *tableIndex {
	t := &tableIndex{}
	i := 0
	if bytes.HasPrefix(content, []byte("\xef\xbb\xbf")) {
		i = 3
	}
	for i < len(content) {
		s, e := lineAround(content, i)
		line := bytes.TrimSpace(content[s:e])
		if len(line) > 0 && line[0] != '#' {
			break
		}
		i = nextLineStart(content, i)
	}
	sep := byte(',')
	if kind == find.KindTSV {
		sep = '\t'
	} else {
		s, e := lineAround(content, i)
		if bytes.IndexByte(content[s:e], ',') < 0 && bytes.IndexByte(content[s:e], ';') >= 0 {
			sep = ';'
		}
	}
	first := true
	for i < len(content) {
		start := i
		var row []tableCell
		row, i = readTableRow(content, i, sep)
		if first {
			first = false
			for _, c := range row {
				t.header = append(t.header, strings.TrimSpace(c.text))
			}
			continue
		}
		t.rows = append(t.rows, row)
		t.starts = append(t.starts, start)
	}
	return t
}

func nextLineStart(content []byte, i int) int {
	k := bytes.IndexByte(content[i:], '\n')
	if k < 0 {
		return len(content)
	}
	return i + k + 1
}

// readTableRow reads one row from i and returns its cells and the start
// of the next row.
func readTableRow(src []byte, i int, sep byte) ([]tableCell, int) {
	var row []tableCell
	for {
		c := tableCell{start: i}
		if i < len(src) && src[i] == '"' {
			var b strings.Builder
			j := i + 1
			for j < len(src) {
				if src[j] == '"' {
					if j+1 < len(src) && src[j+1] == '"' {
						b.WriteByte('"')
						j += 2
						continue
					}
					j++
					break
				}
				b.WriteByte(src[j])
				j++
			}
			for j < len(src) && src[j] != sep && src[j] != '\n' {
				j++
			}
			c.end, c.text, i = j, b.String(), j
		} else {
			j := i
			for j < len(src) && src[j] != sep && src[j] != '\n' {
				j++
			}
			end := j
			if end > i && src[end-1] == '\r' {
				end--
			}
			c.end, c.text, i = end, string(src[i:end]), j
		}
		row = append(row, c)
		if i >= len(src) {
			return row, i
		}
		if src[i] == '\n' {
			return row, i + 1
		}
		i++
	}
}

// key returns the identity of the cell at off: the value of the key
// column (the --key column, else the title the finder took from the
// first name, title or ID column) and the header of the cell's column.
func (t *tableIndex) key(off int, title, keyField string) string {
	r := sort.SearchInts(t.starts, off+1) - 1
	if r < 0 || r >= len(t.rows) {
		return title
	}
	row := t.rows[r]
	col := -1
	for k, c := range row {
		if off >= c.start && off <= c.end {
			col = k
			break
		}
	}
	id := title
	if keyField != "" {
		id = ""
		if k := t.column(keyField); k >= 0 && k < len(row) {
			id = strings.TrimSpace(row[k].text)
		}
	}
	if id == "" {
		return ""
	}
	if col >= 0 && col < len(t.header) {
		return id + "\x00" + t.header[col]
	}
	return id
}

// column finds the --key column by header (case-insensitive) or 1-based
// number.
func (t *tableIndex) column(keyField string) int {
	for k, h := range t.header {
		if strings.EqualFold(h, strings.TrimSpace(keyField)) {
			return k
		}
	}
	if n, err := strconv.Atoi(strings.TrimSpace(keyField)); err == nil && n >= 1 {
		return n - 1
	}
	return -1
}

// idMembers are the object members that name an element of a JSON array
// (common practice in data files).
var idMembers = []string{"id", "ID", "Id", "key", "name", "title", "code", "compound", "compound_id", "compoundId"}

// jsonIndex maps each JSON string value to the path of object keys that
// leads to it. An array element is named by its identifying member
// (idMembers, or the --key member) when it is an object that has one;
// a value under an element with no such member has no path.
type jsonIndex struct {
	spans []jsonString // string values in order
}

type jsonString struct {
	start, end int // the value's bytes between its quotes
	path       string
}

func newJSONIndex(content []byte, keyField string) *jsonIndex {
	p := &jsonParser{src: content}
	root := p.value(0)
	x := &jsonIndex{}
	members := idMembers
	if keyField != "" {
		members = []string{keyField}
	}
	var walk func(n *jsonNode, path string, named bool)
	walk = func(n *jsonNode, path string, named bool) {
		if n == nil {
			return
		}
		switch n.kind {
		case '"':
			if !named {
				path = ""
			}
			x.spans = append(x.spans, jsonString{start: n.start + 1, end: n.end - 1, path: path})
		case '{':
			for k, c := range n.children {
				walk(c, path+"\x00"+n.keys[k], named)
			}
		case '[':
			for k, c := range n.children {
				id, ok := c.member(members)
				if ok {
					walk(c, path+"\x00["+id+"]", named)
				} else {
					walk(c, path+"\x00#"+strconv.Itoa(k), false)
				}
			}
		}
	}
	walk(root, "", true)
	return x
}

// path returns the path of the string value holding off, "" for none.
func (x *jsonIndex) path(off int) string {
	i := sort.Search(len(x.spans), func(i int) bool { return x.spans[i].end >= off })
	if i < len(x.spans) && x.spans[i].start <= off {
		return x.spans[i].path
	}
	return ""
}

// jsonNode is a value of the light tree jsonParser builds: only what the
// paths need.
type jsonNode struct {
	kind       byte // '{', '[', '"', or 0 for other scalars
	start, end int
	keys       []string // object member names
	children   []*jsonNode
	text       string // a string's value, a scalar's text
}

// member returns the text of the first of names that the object has as
// a string or number member.
func (n *jsonNode) member(names []string) (string, bool) {
	if n.kind != '{' {
		return "", false
	}
	for _, name := range names {
		for k, key := range n.keys {
			if key == name && (n.children[k].kind == '"' || n.children[k].kind == 0) && n.children[k].text != "" {
				return n.children[k].text, true
			}
		}
	}
	return "", false
}

// jsonParser builds a jsonNode tree; on malformed input it stops and
// returns what it has, and nesting is bounded so no input recurses
// without limit.
type jsonParser struct {
	src []byte
	i   int
	bad bool
}

const maxJSONDepth = 500

func (p *jsonParser) space() {
	for p.i < len(p.src) && (p.src[p.i] == ' ' || p.src[p.i] == '\t' || p.src[p.i] == '\n' || p.src[p.i] == '\r') {
		p.i++
	}
}

func (p *jsonParser) value(depth int) *jsonNode {
	p.space()
	if p.i >= len(p.src) || p.bad || depth > maxJSONDepth {
		p.bad = true
		return nil
	}
	switch p.src[p.i] {
	case '{':
		n := &jsonNode{kind: '{', start: p.i}
		p.i++
		for !p.bad {
			p.space()
			if p.i < len(p.src) && p.src[p.i] == '}' {
				p.i++
				break
			}
			key := p.value(depth + 1)
			if key == nil || key.kind != '"' {
				p.bad = true
				break
			}
			p.space()
			if p.i >= len(p.src) || p.src[p.i] != ':' {
				p.bad = true
				break
			}
			p.i++
			v := p.value(depth + 1)
			if v == nil {
				break
			}
			n.keys = append(n.keys, key.text)
			n.children = append(n.children, v)
			p.space()
			if p.i < len(p.src) && p.src[p.i] == ',' {
				p.i++
			}
		}
		n.end = p.i
		return n
	case '[':
		n := &jsonNode{kind: '[', start: p.i}
		p.i++
		for !p.bad {
			p.space()
			if p.i < len(p.src) && p.src[p.i] == ']' {
				p.i++
				break
			}
			v := p.value(depth + 1)
			if v == nil {
				break
			}
			n.children = append(n.children, v)
			p.space()
			if p.i < len(p.src) && p.src[p.i] == ',' {
				p.i++
			}
		}
		n.end = p.i
		return n
	case '"':
		start := p.i
		j := p.i + 1
		escaped := false
		for j < len(p.src) && p.src[j] != '"' {
			if p.src[j] == '\\' {
				escaped = true
				j++
			}
			j++
		}
		if j >= len(p.src) {
			p.bad = true
			return nil
		}
		p.i = j + 1
		n := &jsonNode{kind: '"', start: start, end: p.i}
		if escaped {
			var s string
			if json.Unmarshal(p.src[start:p.i], &s) == nil {
				n.text = s
			}
		} else {
			n.text = string(p.src[start+1 : j])
		}
		return n
	}
	start := p.i
	for p.i < len(p.src) && !bytes.ContainsRune([]byte(",]} \t\r\n"), rune(p.src[p.i])) {
		p.i++
	}
	if p.i == start {
		p.bad = true
		return nil
	}
	return &jsonNode{start: start, end: p.i, text: string(p.src[start:p.i])}
}

// boundName returns the name a string literal whose content starts at
// off is bound to: the variable of an assignment (smiles_a = "...", x :=
// "...", const x = "..."), or the key of a dictionary or object entry
// ("LRK-BB-001": "...", key: "..."). The literal must be the whole value
// (only blanks between it and the '=' or ':'); "" otherwise.
func boundName(content []byte, off int) string {
	i := literalStart(content, off)
	i = skipBlanksBack(content, i)
	if i == 0 {
		return ""
	}
	switch c := content[i-1]; {
	case c == '=':
		if i >= 2 && strings.IndexByte("=!<>+-*/%&|^", content[i-2]) >= 0 {
			return "" // a comparison or compound assignment
		}
		i--
		if i > 0 && content[i-1] == ':' {
			i-- // Go's :=
		}
		i = skipBlanksBack(content, i)
		name := nameBack(content, i)
		if name == "" {
			return ""
		}
		// an annotated Python name ("x: str = ..."): the name before
		// the annotation
		if j := skipBlanksBack(content, i-len(name)); j > 0 && content[j-1] == ':' {
			if n := nameBack(content, skipBlanksBack(content, j-1)); n != "" {
				return n
			}
		}
		return name
	case c == ':':
		if i >= 2 && content[i-2] == ':' {
			return ""
		}
		i = skipBlanksBack(content, i-1)
		if i > 0 && (content[i-1] == '"' || content[i-1] == '\'') {
			q := content[i-1]
			k := bytes.LastIndexByte(content[:i-1], q)
			if k < 0 || bytes.IndexByte(content[k:i], '\n') >= 0 {
				return ""
			}
			return string(content[k+1 : i-1])
		}
		return nameBack(content, i)
	}
	return ""
}

// literalStart steps back from the first byte of a literal's content
// over its opening quotes (up to three, and the '#' of raw strings) and a
// string prefix of up to two letters (r, b, u, f, t in Python).
func literalStart(content []byte, off int) int {
	i := min(off, len(content))
	for k := 0; k < 4 && i > 0 && strings.IndexByte("\"'`#", content[i-1]) >= 0; k++ {
		i--
	}
	j := i
	for j > 0 && i-j < 2 && strings.IndexByte("rbuftRBUFT", content[j-1]) >= 0 {
		j--
	}
	if j < i && (j == 0 || !isNameByte(content[j-1])) {
		i = j
	}
	return i
}

func skipBlanksBack(content []byte, i int) int {
	for i > 0 && (content[i-1] == ' ' || content[i-1] == '\t') {
		i--
	}
	return i
}

// nameBack returns the name (letters, digits, '_', '.', '$', and
// subscripts in brackets) that ends at i.
func nameBack(content []byte, i int) string {
	j := i
	for j > 0 {
		c := content[j-1]
		if isNameByte(c) || c == '.' {
			j--
			continue
		}
		if c == ']' {
			k := bytes.LastIndexByte(content[:j-1], '[')
			if k < 0 || bytes.IndexByte(content[k:j], '\n') >= 0 {
				break
			}
			j = k
			continue
		}
		break
	}
	name := string(content[j:i])
	if name == "" || name[0] >= '0' && name[0] <= '9' || name[0] == '[' {
		return ""
	}
	return name
}

func isLetter(c byte) bool { return c >= 'a' && c <= 'z' || c >= 'A' && c <= 'Z' }

func isNameByte(c byte) bool {
	return isLetter(c) || c >= '0' && c <= '9' || c == '_' || c == '$' || c >= 0x80
}

package find

import (
	"bytes"
	"sort"
	"strings"
	"unicode/utf8"

	"stereoline/notation"
)

// jsonValue is one value of a JSON document (RFC 8259) with its spans.
// The parser is forgiving: it stops quietly at the first syntax error,
// keeping what it has read, or, reading a document for notation
// (recover), goes on at the next line that may begin a member of the
// object or array the error is in (resync).
type jsonValue struct {
	kind byte          // 'o' object, 'a' array, 's' string, 'v' other
	span notation.Span // the whole value (a string's quotes included)
	keys []jsonValue   // object keys (strings)
	vals []jsonValue   // object values or array elements
}

// maxJSONDepth bounds nesting so that hostile input cannot exhaust the
// stack.
const maxJSONDepth = 500

type jsonParser struct {
	src []byte
	i   int
	bad bool
	// shallow keeps the members and elements of the values at depth top
	// only (without theirs): a reading of a document's structure that
	// allocates nothing per record (jsonRecordArray)
	shallow bool
	top     int
	// recover goes on reading an object or array after a member that
	// does not read, at the next line that may begin one (resync)
	recover bool
	// levels are the objects and arrays being read, the innermost last,
	// when recovering (resync)
	levels []jsonLevel
	// keys and vals hold the members of the containers being read, the
	// innermost last; a container's are moved to slab, in slices of
	// their exact length, when it ends: one allocation for thousands of
	// members instead of a few for each object
	keys, vals []jsonValue
	slab       []jsonValue
}

// jsonSlab is the most values allocated at once for the members of
// containers; a parser starts with a few and doubles, so that one made
// for each line of JSON Lines allocates no more than the line needs.
const jsonSlab = 4096

// take moves the values of stack from base on into the slab and returns
// them, and shortens the stack to base.
func (p *jsonParser) take(stack *[]jsonValue, base int) []jsonValue {
	vs := (*stack)[base:]
	n := len(vs)
	if n == 0 {
		return nil
	}
	if cap(p.slab)-len(p.slab) < n {
		p.slab = make([]jsonValue, 0, max(min(jsonSlab, 2*cap(p.slab)), n, 8))
	}
	at := len(p.slab)
	p.slab = append(p.slab, vs...)
	clear(vs)
	*stack = (*stack)[:base]
	return p.slab[at : at+n : at+n]
}

func parseJSON(src []byte) jsonValue {
	p := &jsonParser{src: src}
	return p.value(0)
}

// parseJSONValues reads a document of one JSON value or of several one
// after the other. When the first value is whole on its line (JSON
// Lines, .jsonl and .ndjson: one value a line), every later line is read
// on its own, so a line that does not read spoils no other: it is kept
// as far as it reads, as JSON Lines readers skip a bad line. Otherwise
// the values are read one after another (pretty-printed values written
// in a row, or a JSON text sequence, RFC 7464, each value after a record
// separator 0x1E); a later value that does not read is kept as far as it
// reads and the reading goes on at the next line. Inside the first value
// the reading goes on after an error at the next line that may begin a
// member of the object or array the error is in (resync); an error it
// cannot go on from ends the reading there.
func parseJSONValues(src []byte) []jsonValue {
	if jsonLineMode(src) {
		return jsonLineValues(src, 0, len(src), nil)
	}
	p := &jsonParser{src: src, recover: true}
	p.blankOrSeparator()
	vs := []jsonValue{p.value(0)}
	if p.bad {
		return vs
	}
	for {
		p.blankOrSeparator()
		if p.i >= len(src) {
			return vs
		}
		start := p.i
		vs = append(vs, p.value(0))
		if !p.bad {
			continue
		}
		p.bad = false
		from := max(p.i, start+1) - 1
		next := bytes.IndexByte(src[from:], '\n')
		if next < 0 {
			return vs
		}
		p.i = from + next + 1
	}
}

// jsonLineValues appends to vs the values on the lines of src from
// offset from (a line start) to offset to (a line start or len(src)),
// each line read on its own: a value cannot run past its line, and a
// line that does not read is kept as far as it reads.
func jsonLineValues(src []byte, from, to int, vs []jsonValue) []jsonValue {
	p := &jsonParser{} // one for all lines: its stacks and slab are shared
	for from < to {
		end, next := to, to
		if k := bytes.IndexByte(src[from:to], '\n'); k >= 0 {
			end, next = from+k, from+k+1
		}
		p.src, p.i, p.bad = src[:end], from, false
		for {
			p.blankOrSeparator()
			if p.i >= end {
				break
			}
			vs = append(vs, p.value(0))
			if p.bad {
				break
			}
		}
		from = next
	}
	return vs
}

// jsonLineMode reports whether src is read line by line
// (parseJSONValues): its first line that is not blank holds one whole
// value, or, when that line does not read (a line being typed), the
// next one does. A pretty-printed document's first lines ("{", "[" or
// a member ending in a comma) hold no whole value. It reads at most
// those two lines.
func jsonLineMode(src []byte) bool {
	for tries, from := 0, 0; tries < 2 && from < len(src); tries++ {
		whole, next, blank := jsonWholeLine(src, from)
		for blank && next < len(src) {
			whole, next, blank = jsonWholeLine(src, next)
		}
		if blank || whole {
			return whole
		}
		from = next
	}
	return false
}

// jsonWholeLine reads the line of src starting at from on its own and
// reports whether it holds one whole value and blanks, or only blanks;
// next is the start of the line after it.
func jsonWholeLine(src []byte, from int) (whole bool, next int, blank bool) {
	end, next := len(src), len(src)
	if k := bytes.IndexByte(src[from:], '\n'); k >= 0 {
		end, next = from+k, from+k+1
	}
	p := &jsonParser{src: src[:end], i: from}
	p.blankOrSeparator()
	if p.i >= end {
		return false, next, true
	}
	p.value(0)
	if p.bad {
		return false, next, false
	}
	p.blank()
	return p.i >= end, next, false
}

// FindJSONLines returns the notation on the lines of the JSON document
// src from offset from (a line start) to offset to (a line start or
// len(src)), exactly as FindKind(KindJSON, src, cfg) finds it there. ok
// is false when those lines cannot be read apart from the rest and the
// caller must read the whole document: unless both old (the text before
// an edit that changed only those lines) and src are read line by line
// (JSON Lines, parseJSONValues), a value may run over many lines.
func FindJSONLines(old, src []byte, cfg Config, from, to int) (occs []Occurrence, ok bool) {
	if from < 0 || to > len(src) || from > to || !jsonLineMode(old) || !jsonLineMode(src) {
		return nil, false
	}
	jf := &jsonFinder{src: src, cfg: &cfg, nm: newNamer(&cfg)}
	for _, v := range jsonLineValues(src, from, to, nil) {
		jf.walk(v, wants{}, false)
	}
	return jf.out, true
}

// JSONArray is what FindJSONEdit keeps of a document that is an array
// of records for the edit after: where its elements lie, and what the
// document says around them.
type JSONArray struct {
	elems []notation.Span
	close int // where the array's closing bracket is
	ctx   jsonContext
}

// jsonContext is what the elements of an array of records are read
// with (jsonFinder.walk): the whole document, or a member of a document
// that is one object, {"compounds": [...]}.
type jsonContext struct {
	member bool   // the array is a member of an object
	w      wants  // what the member's key names
	other  bool   // the key names something about notation
	title  string // the object's title
	key    string
}

// depth is the depth of the elements in the document, as the parser
// counts it (maxJSONDepth).
func (c jsonContext) depth() int {
	if c.member {
		return 2
	}
	return 1
}

// FindJSONEdit returns the notation on the lines of the JSON document
// src from offset from (a line start) to offset newTo (a line start or
// len(src)), exactly as FindKind(KindJSON, src, cfg) finds it there,
// after an edit that changed only the lines of old from from to oldTo
// into them. The lines read may be more than those (from2, oldTo2 and
// newTo2 give them, in both texts): a record of a pretty-printed array
// spans several lines, and all of them are read again when one changes,
// since a member on one line may give the title of a record on another.
// ok is false when the lines cannot be read apart and the caller must
// read the whole document.
//
// Two layouts are read apart: JSON Lines (FindJSONLines), and an array
// of records (values) across many lines, either the whole document or
// the longest array member of a document that is one object. src must
// read without error from end to end, and the edit must change only the
// array's elements and leave them in place outside the lines read. arr
// is what the call for old returned (nil: old is read), and next is kept
// for the edit after this one.
func FindJSONEdit(old, src []byte, cfg Config, from, oldTo, newTo int, arr *JSONArray) (occs []Occurrence, from2, oldTo2, newTo2 int, next *JSONArray, ok bool) {
	if from < 0 || newTo > len(src) || from > newTo || oldTo > len(old) || from > oldTo || newTo-oldTo != len(src)-len(old) {
		return nil, 0, 0, 0, nil, false
	}
	if jsonLineMode(old) || jsonLineMode(src) {
		occs, ok = FindJSONLines(old, src, cfg, from, newTo)
		return occs, from, oldTo, newTo, nil, ok
	}
	if arr == nil {
		if arr, ok = jsonRecordArray(old, &cfg); !ok {
			return nil, 0, 0, 0, nil, false
		}
	}
	next, ok = editedElements(arr, src, from, newTo, len(src)-len(old))
	if !ok {
		// the edit is not inside the elements: the array is found again,
		// and must be read as it was
		if arr.ctx.member {
			return nil, 0, 0, 0, nil, false
		}
		if next, ok = jsonRecordArray(src, &cfg); !ok || next.ctx != arr.ctx {
			return nil, 0, 0, 0, nil, false
		}
	}
	es, oes := next.elems, arr.elems
	// Widen the lines to whole elements, and to whole lines again, until
	// no element lies across either end.
	lineStart := func(off int) int { return bytes.LastIndexByte(src[:off], '\n') + 1 }
	lineAfter := func(off int) int {
		if k := bytes.IndexByte(src[off:], '\n'); k >= 0 {
			return off + k + 1
		}
		return len(src)
	}
	from2, newTo2 = from, newTo
	var k0, k1 int
	for {
		// elements k0..k1-1 overlap [from2, newTo2)
		k0 = sort.Search(len(es), func(k int) bool { return es[k].End > from2 })
		k1 = sort.Search(len(es), func(k int) bool { return es[k].Start >= newTo2 })
		f, t := from2, newTo2
		if k0 < k1 {
			f = min(f, lineStart(es[k0].Start))
			if es[k1-1].End > t {
				t = lineAfter(es[k1-1].End - 1)
			}
		}
		if f == from2 && t == newTo2 {
			break
		}
		from2, newTo2 = f, t
	}
	// Between the elements on those lines there is nothing to find: only
	// blanks, commas and the array's brackets.
	for at, k := from2, k0; at < newTo2; {
		end := newTo2
		if k < k1 {
			end = es[k].Start
		}
		for _, c := range src[at:end] {
			if !strings.ContainsRune(" \t\r\n,[]", rune(c)) {
				return nil, 0, 0, 0, nil, false
			}
		}
		if k == k1 {
			break
		}
		at = es[k].End
		k++
	}
	oldTo2 = newTo2 - (len(src) - len(old))
	// In old, the same elements lie before from2 and after oldTo2 (the
	// texts there are the same), none across either end.
	across := func(es []notation.Span, off int) bool {
		k := sort.Search(len(es), func(k int) bool { return es[k].End > off })
		return k < len(es) && es[k].Start < off
	}
	after := func(es []notation.Span, off int) int {
		return len(es) - sort.Search(len(es), func(k int) bool { return es[k].Start >= off })
	}
	before := func(es []notation.Span, off int) int {
		return sort.Search(len(es), func(k int) bool { return es[k].End > off })
	}
	if across(oes, from2) || across(oes, oldTo2) || after(oes, oldTo2) != after(es, newTo2) || before(oes, from2) != before(es, from2) {
		return nil, 0, 0, 0, nil, false
	}
	ctx := next.ctx
	jf := &jsonFinder{src: src, cfg: &cfg, nm: newNamer(&cfg), title: ctx.title, key: ctx.key}
	for k := k0; k < k1; k++ {
		p := &jsonParser{src: src[:es[k].End], i: es[k].Start}
		jf.walk(p.value(ctx.depth()), ctx.w, ctx.other)
	}
	return jf.out, from2, oldTo2, newTo2, next, true
}

// editedElements returns the array of records of src, an edit of a
// document whose array was arr, reading only from an element before the
// edit (its text and place are old's) to the first element boundary
// after the edit that is one in old too, from where the texts are the
// same again. False when the edit is not inside the elements, or when
// they do not read without error.
func editedElements(arr *JSONArray, src []byte, from, newTo, delta int) (*JSONArray, bool) {
	oes := arr.elems
	// the first element that ends after the edit begins, or the one
	// before it when the edit begins before it; the state before it is
	// old's: an element is expected
	k := sort.Search(len(oes), func(k int) bool { return oes[k].End > from })
	if k == len(oes) || oes[k].Start > from {
		k--
	}
	if k < 0 {
		return nil, false
	}
	p := &jsonParser{src: src, i: oes[k].Start, shallow: true, top: -1}
	es := append(make([]notation.Span, 0, len(oes)+8), oes[:k]...)
	for {
		v := p.value(arr.ctx.depth())
		if p.bad {
			return nil, false
		}
		es = append(es, v.span)
		p.blank()
		if p.i < len(src) && src[p.i] == ',' {
			p.i++
			p.blank()
			// an element begins here; past the edit, where one began in
			// old, the rest is old's moved
			if p.i >= newTo {
				j := sort.Search(len(oes), func(j int) bool { return oes[j].Start >= p.i-delta })
				if j < len(oes) && oes[j].Start == p.i-delta {
					for _, e := range oes[j:] {
						es = append(es, notation.Span{Start: e.Start + delta, End: e.End + delta})
					}
					return &JSONArray{elems: es, close: arr.close + delta, ctx: arr.ctx}, true
				}
			}
			continue
		}
		// the array ends where it ended, past the edit
		if p.i < len(src) && src[p.i] == ']' && p.i >= newTo && p.i-delta == arr.close {
			return &JSONArray{elems: es, close: p.i, ctx: arr.ctx}, true
		}
		return nil, false
	}
}

// jsonRecordArray finds the array of records of a document that reads
// without error from end to end (blanks around it): the document when
// it is one array, or the member of a document that is one object whose
// value is the longest array; false for any other document.
func jsonRecordArray(src []byte, cfg *Config) (*JSONArray, bool) {
	p := &jsonParser{src: src, shallow: true}
	p.blank()
	if p.i >= len(src) || src[p.i] != '[' && src[p.i] != '{' {
		return nil, false
	}
	v := p.value(0)
	p.blank()
	if p.bad || p.i != len(src) {
		return nil, false
	}
	arr := &JSONArray{}
	if v.kind == 'o' {
		best := recordMember(v)
		if best < 0 {
			return nil, false
		}
		jf := &jsonFinder{src: src, cfg: cfg, nm: newNamer(cfg)}
		key := jf.keyText(v.keys[best])
		kw, about := jf.nm.classify(key)
		if !kw.named() && !aboutKey(key) {
			kw = wants{}
		}
		arr.ctx = jsonContext{member: true, w: kw, other: about, title: jf.objectTitle(v), key: key}
		span := v.vals[best].span
		p = &jsonParser{src: src[:span.End], i: span.Start, shallow: true, top: 1}
		v = p.value(1)
		if p.bad {
			return nil, false
		}
	}
	arr.close = v.span.End - 1
	arr.elems = make([]notation.Span, len(v.vals))
	for k := range v.vals {
		arr.elems[k] = v.vals[k].span
	}
	return arr, true
}

// recordMember returns the index of the member of the object v whose
// value is the longest array, the first of those as long; -1 when no
// member is an array.
func recordMember(v jsonValue) int {
	best := -1
	for k := range v.vals {
		if e := v.vals[k]; e.kind == 'a' && (best < 0 || e.span.Len() > v.vals[best].span.Len()) {
			best = k
		}
	}
	return best
}

// walkMemberArray walks a document that is one object as walk does,
// each member read on its own, and the elements of its array of records
// (arr, jsonRecordArray) one at a time: the object's values are not all
// read first.
func (jf *jsonFinder) walkMemberArray(arr *JSONArray) {
	p := &jsonParser{src: jf.src, shallow: true}
	p.blank()
	v := p.value(0) // the members' spans only: the document reads (jsonRecordArray)
	best := recordMember(v)
	jf.walkObject(v, wants{}, false, func(k int, w wants, other bool) {
		if k != best {
			mp := &jsonParser{src: jf.src[:v.vals[k].span.End], i: v.vals[k].span.Start}
			jf.walk(mp.value(1), w, other)
			return
		}
		// as walk visits an array
		jf.own = ""
		for _, e := range arr.elems {
			ep := &jsonParser{src: jf.src[:e.End], i: e.Start}
			jf.walk(ep.value(arr.ctx.depth()), w, other)
		}
	})
}

// walkObject visits the members of the object v as walk does, member
// walking the value of the k-th with what its key says (w, other), the
// object's title and the key set.
func (jf *jsonFinder) walkObject(v jsonValue, w wants, other bool, member func(k int, w wants, other bool)) {
	if t := jf.objectTitle(v); t != "" {
		outer := jf.title
		jf.title = t
		defer func() { jf.title = outer }()
	}
	// beside a member named as notation, a name, title or id member
	// is the record's title (objectTitle), not a record of its own,
	// as a table's title column is not read beside its notation
	// column: {"name": "c1ccccc1O", "smiles": "Oc1ccccc1"}
	named := false
	for k := range v.keys {
		if jf.keyInfo(v.keys[k]).w.named() {
			named = true
			break
		}
	}
	for k := range v.vals {
		ki := jf.keyInfo(v.keys[k])
		if named && ki.title > 0 && !ki.w.named() && v.vals[k].kind == 's' {
			continue
		}
		child := ki.w
		if !ki.w.named() && !ki.aboutKey {
			child = w
		}
		outer, outerOwn := jf.key, jf.own
		jf.key, jf.own = ki.text, ki.text
		member(k, child, other || ki.about)
		jf.key, jf.own = outer, outerOwn
	}
}

// blankOrSeparator skips blanks and the record separators (0x1E) of a
// JSON text sequence.
func (p *jsonParser) blankOrSeparator() {
	for p.blank(); p.i < len(p.src) && p.src[p.i] == 0x1e; p.blank() {
		p.i++
	}
}

func (p *jsonParser) blank() {
	for p.i < len(p.src) {
		switch p.src[p.i] {
		case ' ', '\t', '\n', '\r':
			p.i++
		default:
			return
		}
	}
}

func (p *jsonParser) value(depth int) jsonValue {
	p.blank()
	start := p.i
	if p.i >= len(p.src) || depth > maxJSONDepth {
		p.bad = true
		return jsonValue{kind: 'v', span: notation.Span{Start: start, End: start}}
	}
	switch p.src[p.i] {
	case '"':
		_, end, ok := quoted(p.src, p.i+1, `"`, true, false)
		if !ok {
			p.bad = true
		}
		p.i = max(end, p.i+1)
		return jsonValue{kind: 's', span: notation.Span{Start: start, End: p.i}}
	case '{', '[':
		v := jsonValue{kind: 'o'}
		closer := byte('}')
		if p.src[p.i] == '[' {
			v.kind, closer = 'a', ']'
		}
		p.i++
		kb, vb := len(p.keys), len(p.vals)
		me := len(p.levels)
		if p.recover {
			p.levels = append(p.levels, jsonLevel{ind: -1, kind: v.kind, closer: closer})
		}
		for {
			p.blank()
			if p.i < len(p.src) && p.src[p.i] == closer {
				p.i++
				break
			}
			elem := p.i
			if p.recover && p.levels[me].ind == -1 {
				p.levels[me].ind, p.levels[me].openIn = memberIndentation(p.src, start, elem, v.kind)
			}
			p.member(v.kind, depth)
			if p.bad && !(p.recover && p.levels[me].ind >= 0 && p.resync(elem, me)) {
				break
			}
		}
		if p.recover {
			p.levels = p.levels[:me]
		}
		v.keys, v.vals = p.take(&p.keys, kb), p.take(&p.vals, vb)
		v.span = notation.Span{Start: start, End: p.i}
		return v
	}
	for p.i < len(p.src) && strings.IndexByte(",]}: \t\r\n", p.src[p.i]) < 0 {
		p.i++
	}
	if p.i == start {
		p.bad = true
	}
	return jsonValue{kind: 'v', span: notation.Span{Start: start, End: p.i}}
}

// member reads one member of an object (kind 'o': key, colon, value)
// or one element of an array onto the parser's stacks, and the comma
// after it; p.bad is set when it does not read, the stacks keeping what
// did.
func (p *jsonParser) member(kind byte, depth int) {
	if kind == 'o' {
		if p.i >= len(p.src) || p.src[p.i] != '"' {
			// no key: what is here is left for the reading to go on at
			// (the next record, after a brace missing before it)
			p.bad = true
			return
		}
		k := p.value(depth + 1)
		p.blank()
		if p.i >= len(p.src) || p.src[p.i] != ':' {
			p.bad = true
			return
		}
		p.i++
		if !p.shallow || depth == p.top {
			p.keys = append(p.keys, k)
		}
	}
	if e := p.value(depth + 1); !p.shallow || depth == p.top {
		p.vals = append(p.vals, e)
	}
	if p.bad {
		return
	}
	p.blank()
	closer := byte(']')
	if kind == 'o' {
		closer = '}'
	}
	if p.i < len(p.src) && p.src[p.i] == ',' {
		p.i++
	} else if p.i >= len(p.src) || p.src[p.i] != closer {
		p.bad = true
	}
}

// jsonLevel is an object or array being read, for resync: the
// indentation its members begin their lines at (-1 while no member has
// begun a line, -2 when they are not indented as a pretty-printed
// container's are), that of the line it opens on, its kind and closer.
type jsonLevel struct {
	ind, openIn  int
	kind, closer byte
}

// begins reports whether a line indented by in whose first character is
// c may begin a member of l or close it.
func (l jsonLevel) begins(in int, c byte) bool {
	if l.ind < 0 {
		return false
	}
	return in == l.ind && (c == '"' || l.kind == 'a' && strings.IndexByte("{[-0123456789tfn", c) >= 0) ||
		c == l.closer && in >= l.openIn && in <= l.ind
}

// resync finds where the reading of the object or array p.levels[me]
// goes on after its member or element that begins at elem did not read,
// and reports whether it does. A document being typed, or with a stray
// line (a comment, a merge conflict marker), keeps the records after the
// error: the reading resumes at the next line, from where the reading
// stopped, that begins at the indentation of the container's members
// with what may begin a member (a key; for an array, any value), or that
// closes the container. A line that may begin a member of a container
// around this one, or close it, ends the search: this one stays broken
// and p.i is set to that line for that container to go on at. Other
// lines (text that is no JSON, members of a value inside) are passed
// over. Lines are only searched forward of p.i, so a document is
// searched about once however deep the error lies.
func (p *jsonParser) resync(elem, me int) bool {
	src, l := p.src, p.levels[me]
	from := max(p.i, elem+1)
	at := bytes.LastIndexByte(src[:min(from, len(src))], '\n') + 1
	for at < len(src) {
		first := at
		for first < len(src) && (src[first] == ' ' || src[first] == '\t') {
			first++
		}
		next := len(src)
		if k := bytes.IndexByte(src[first:], '\n'); k >= 0 {
			next = first + k + 1
		}
		if first < from || first == len(src) || src[first] == '\n' || src[first] == '\r' {
			at = next // before where the reading stopped, or blank
			continue
		}
		c, in := src[first], first-at
		if l.begins(in, c) {
			p.i, p.bad = first, false
			return true
		}
		for k := me - 1; k >= 0; k-- {
			if p.levels[k].begins(in, c) {
				p.i = at
				return false
			}
		}
		at = next
	}
	p.i = len(src)
	return false
}

// memberIndentation returns the indentation of the members of the object
// or array (kind 'o' or 'a') that opens at offset open, from its member
// at offset elem, and that of the line it opens on: -1 when elem does
// not begin its line (a later member may), -2 when the members are not
// indented as a pretty-printed container's are and the reading is not
// to go on after an error in it.
// An object's members are indented more than the line it opens on;
// otherwise the "member" is the next record, after the object's closing
// brace went missing. An array's elements may stand at the indentation
// of the line it opens on ("[" alone on its first line, a record a line).
func memberIndentation(src []byte, open, elem int, kind byte) (ind, openIn int) {
	in := indentation(src, elem)
	if in < 0 {
		return -1, 0
	}
	ls := bytes.LastIndexByte(src[:open], '\n') + 1
	for ls+openIn < open && (src[ls+openIn] == ' ' || src[ls+openIn] == '\t') {
		openIn++
	}
	if in < openIn || kind == 'o' && in == openIn {
		return -2, openIn
	}
	return in, openIn
}

// indentation returns the indentation of the line of src holding offset
// at when only blanks come before it there, else -1.
func indentation(src []byte, at int) int {
	ls := at
	for ls > 0 && src[ls-1] != '\n' {
		if src[ls-1] != ' ' && src[ls-1] != '\t' {
			return -1
		}
		ls--
	}
	return at - ls
}

// content returns the span between a string value's quotes.
func (v *jsonValue) content(src []byte) notation.Span {
	s := notation.Span{Start: v.span.Start + 1, End: v.span.End - 1}
	if s.End < s.Start || v.span.End > len(src) || src[v.span.End-1] != '"' || v.span.Len() < 2 {
		s.End = max(s.Start, v.span.End)
	}
	return s
}

// decodeJSON decodes a JSON string's content. With exact set it decodes
// every escape as JSON defines it (a notebook cell's source is exactly
// the decoded text). Otherwise the string is a notation value: escapes
// standing for control characters, and unknown escapes, are kept as
// written and reported, since they are backslash bonds the writer forgot
// to double. `\/` is '/' in both modes: encoders write it for any slash.
func decodeJSON(src []byte, s notation.Span, exact bool, d *decoded) {
	i, end := s.Start, s.End
	for i < end {
		c := src[i]
		if c != '\\' || i+1 >= end {
			j := i + 1
			for j < end && src[j] != '\\' {
				j++
			}
			d.copy(src, i, j)
			i = j
			continue
		}
		e := src[i+1]
		switch {
		case e == '\\' || e == '"' || e == '/':
			d.escape([]byte{e}, i, 2)
			i += 2
		case strings.IndexByte("bfnrt", e) >= 0:
			if exact {
				d.escape([]byte{byte(simpleEscape(e))}, i, 2)
			} else {
				d.keep(src, i, i+2, notation.SeverityError, "json reads '"+string(src[i:i+2])+"' as "+describeRune(simpleEscape(e))+"; double the backslash")
			}
			i += 2
		case e == 'u':
			r, n := jsonCodePoint(src[i:end])
			if n == 0 {
				d.keep(src, i, i+2, notation.SeverityError, "json rejects the malformed escape '\\u', so the file is not valid json; double the backslash")
				i += 2
				continue
			}
			if !exact && r < 0x20 {
				d.keep(src, i, i+n, notation.SeverityError, "json reads '"+string(src[i:i+n])+"' as "+describeRune(r)+"; double the backslash")
			} else {
				d.escape(utf8.AppendRune(nil, r), i, n)
			}
			i += n
		default:
			_, size := utf8.DecodeRune(src[i+1 : end])
			d.keep(src, i, i+1+size, notation.SeverityError, "json rejects the unknown escape '"+string(src[i:i+1+size])+"', so the file is not valid json; double the backslash")
			i += 1 + size
		}
	}
}

// jsonCodePoint reads \uXXXX, joining a surrogate pair, and returns the
// character and the bytes read (0 when malformed).
func jsonCodePoint(b []byte) (rune, int) {
	hex := func(b []byte) (rune, bool) {
		if len(b) < 6 || b[0] != '\\' || b[1] != 'u' {
			return 0, false
		}
		var r rune
		for _, c := range b[2:6] {
			if !isHex(c) {
				return 0, false
			}
			r = r<<4 | rune(hexVal(c))
		}
		return r, true
	}
	r, ok := hex(b)
	if !ok {
		return 0, 0
	}
	if r >= 0xd800 && r < 0xdc00 {
		if r2, ok := hex(b[6:]); ok && r2 >= 0xdc00 && r2 < 0xe000 {
			return (r-0xd800)<<10 | (r2 - 0xdc00) + 0x10000, 12
		}
		return utf8.RuneError, 6
	}
	return r, 6
}

func hexVal(c byte) byte {
	switch {
	case c >= 'a':
		return c - 'a' + 10
	case c >= 'A':
		return c - 'A' + 10
	}
	return c - '0'
}

// jsonEscape writes s as the content of a JSON string.
func jsonEscape(s string) string {
	var sb strings.Builder
	for _, r := range s {
		switch {
		case r == '\\' || r == '"':
			sb.WriteByte('\\')
			sb.WriteRune(r)
		case r == '\n':
			sb.WriteString(`\n`)
		case r == '\t':
			sb.WriteString(`\t`)
		case r < 0x20:
			sb.WriteString(`\u00`)
			sb.WriteByte("0123456789abcdef"[r>>4])
			sb.WriteByte("0123456789abcdef"[r&15])
		default:
			sb.WriteRune(r)
		}
	}
	return sb.String()
}

// findJSON takes string values under notation-named keys (and inside
// arrays and objects under them, except under keys that are about the
// notation, like "name"), and string values anywhere that are
// unmistakably notation. Keys themselves are never notation.
func findJSON(src []byte, cfg *Config) []Occurrence {
	return findJSONChunks(src, cfg, 0, nil)
}

// findJSONChunks is findJSON handing the occurrences to each n at a
// time as the walk finds them, when each is not nil; it returns the
// occurrences when each is nil.
func findJSONChunks(src []byte, cfg *Config, n int, each func([]Occurrence)) []Occurrence {
	jf := &jsonFinder{src: src, cfg: cfg, nm: newNamer(cfg), each: each, chunk: n}
	if each != nil {
		jf.out = make([]Occurrence, 0, n)
		walk := func(vs []jsonValue) {
			for i := range vs {
				jf.walk(vs[i], wants{}, false)
				vs[i] = jsonValue{} // read: its slabs may go while the rest is read
			}
		}
		lines := jsonLineMode(src)
		var arr *JSONArray
		array := false
		if len(src) >= streamFrom && !lines {
			arr, array = jsonRecordArray(src, cfg)
		}
		switch {
		case lines:
			// each line is read on its own: a window of lines at a
			// time, not all read first (the values of a million lines
			// are hundreds of MB)
			var vs []jsonValue
			for from := 0; from < len(src); {
				to := min(len(src), from+jsonLineWindow)
				if k := bytes.IndexByte(src[to:], '\n'); k >= 0 {
					to += k + 1
				} else {
					to = len(src)
				}
				vs = jsonLineValues(src, from, to, vs[:0])
				walk(vs)
				from = to
			}
		case array && arr.ctx.member:
			// a long document that is one object around its records:
			// its members are read one at a time, the records' array
			// element by element
			jf.walkMemberArray(arr)
		case array:
			// a long document that is one array: its elements are read
			// and walked one at a time, as an edit reads them apart
			// (FindJSONEdit)
			for _, e := range arr.elems {
				p := &jsonParser{src: src[:e.End], i: e.Start}
				jf.walk(p.value(arr.ctx.depth()), arr.ctx.w, arr.ctx.other)
			}
		default:
			walk(parseJSONValues(src))
		}
		if len(jf.out) > 0 {
			each(jf.out)
		}
		return nil
	}
	vs := parseJSONValues(src)
	// about a record a value of JSON Lines, or an element of an array of
	// records (the document, or its longest array member): room made once
	n = len(vs)
	if len(vs) == 1 {
		n = 0
		if v := vs[0]; v.kind == 'a' {
			n = len(v.vals)
		} else if v.kind == 'o' {
			for _, m := range v.vals {
				if m.kind == 'a' {
					n = max(n, len(m.vals))
				}
			}
		}
	}
	if n > 1000 {
		jf.out = make([]Occurrence, 0, n)
	}
	for _, v := range vs {
		jf.walk(v, wants{}, false)
	}
	return jf.out
}

// jsonLineWindow is how many bytes of JSON Lines are read before their
// values are walked (a variable for the tests).
var jsonLineWindow = 1 << 20

type jsonFinder struct {
	src  []byte
	cfg  *Config
	nm   namer
	out  []Occurrence
	keys map[string]jsonKey // keyInfo
	// each, when not nil, is handed out every chunk occurrences
	// (findJSONChunks)
	each  func([]Occurrence)
	chunk int
	// title is the name of the innermost object around the value
	// visited: its name, title or id member, as a table's title column
	title string
	// key is the innermost key above the value visited ("" for none)
	key string
	// own is the key whose value the string visited is, "" for an
	// element of an array: a label for a record nothing else names
	own string
}

// maxJSONTitle bounds a title taken from a member: a title names a
// record in messages.
const maxJSONTitle = 200

// objectTitle returns the title an object gives the records inside it:
// the value of its best name, title or id member (titlePriority), a
// string or a number; "" when it has none.
func (jf *jsonFinder) objectTitle(v jsonValue) string {
	best, title := 0, ""
	for k := range v.vals {
		val := v.vals[k]
		if val.kind != 's' && val.kind != 'v' || val.span.Len() > maxJSONTitle+2 {
			continue
		}
		p := jf.keyInfo(v.keys[k]).title
		if p == 0 || best != 0 && p >= best {
			continue
		}
		var t string
		if val.kind == 's' {
			var d decoded
			decodeJSON(jf.src, val.content(jf.src), true, &d)
			t = strings.TrimSpace(string(d.text))
		} else {
			t = string(jf.src[val.span.Start:val.span.End])
			if t == "null" || t == "true" || t == "false" {
				continue
			}
		}
		if t != "" && !strings.ContainsAny(t, "\r\n") {
			best, title = p, t
		}
	}
	return title
}

// walk visits a value; w says what a key above names (notation, a
// query pattern), other that one names something about it
// ("smiles_file"), whose values are not guessed.
func (jf *jsonFinder) walk(v jsonValue, w wants, other bool) {
	switch v.kind {
	case 'o':
		jf.walkObject(v, w, other, func(k int, w wants, other bool) { jf.walk(v.vals[k], w, other) })
	case 'a':
		outerOwn := jf.own
		jf.own = ""
		defer func() { jf.own = outerOwn }()
		for k := range v.vals {
			jf.walk(v.vals[k], w, other)
			if jf.each != nil {
				// handed out as it is read: an element read is let go,
				// so the parsed records before it need not stay while
				// the chunks handed out are analysed
				v.vals[k] = jsonValue{}
			}
		}
	case 's':
		if w.named() || !other {
			jf.str(v, w)
		}
	}
}

// jsonKey is what a key says, worked out once for each key text of a
// document (jsonFinder.keys): records of a dataset repeat their keys.
type jsonKey struct {
	text     string
	w        wants // what the key names (namer.classify)
	about    bool  // the key names something about notation
	aboutKey bool  // aboutKey(text)
	title    int   // titlePriority(text)
}

// maxJSONKeys bounds the keys kept: a document keyed by record names
// ({"CHEMBL25": "...", ...}) has as many keys as records.
const maxJSONKeys = 4096

// keyInfo returns what the key k says, from the keys seen before when
// it is written without escapes.
func (jf *jsonFinder) keyInfo(k jsonValue) jsonKey {
	cs := k.content(jf.src)
	raw := jf.src[cs.Start:cs.End]
	plain := bytes.IndexByte(raw, '\\') < 0
	if plain {
		if ki, ok := jf.keys[string(raw)]; ok {
			return ki
		}
	}
	ki := jsonKey{text: jf.keyText(k)}
	ki.w, ki.about = jf.nm.classify(ki.text)
	ki.aboutKey, ki.title = aboutKey(ki.text), titlePriority(ki.text)
	if plain && len(jf.keys) < maxJSONKeys {
		if jf.keys == nil {
			jf.keys = map[string]jsonKey{}
		}
		jf.keys[ki.text] = ki
	}
	return ki
}

func (jf *jsonFinder) keyText(k jsonValue) string {
	var d decoded
	decodeJSON(jf.src, k.content(jf.src), true, &d)
	return string(d.text)
}

// aboutKey reports whether a key inside a notation-named object is about
// the notation rather than notation: {"reactions": [{"name": "Suzuki"}]}.
func aboutKey(key string) bool {
	for _, p := range nameParts(key) {
		if aboutWords[p] {
			return true
		}
	}
	return false
}

func (jf *jsonFinder) str(v jsonValue, w wants) {
	named := w.named()
	if !named && jf.cfg.NoGuess {
		return
	}
	w.guess = !named
	var d decoded
	cs := v.content(jf.src)
	var text string
	if raw := jf.src[cs.Start:cs.End]; bytes.IndexByte(raw, '\\') < 0 {
		// no escape: the text is the bytes, its map made only for a
		// record (the one decodeJSON would make)
		text = string(raw)
		if rs := decide(text, w); len(rs) > 0 {
			d.b.copy(cs.Start, len(raw))
			jf.record(v, &d, cs, text, rs, named)
		}
		return
	}
	decodeJSON(jf.src, cs, false, &d)
	text = string(d.text)
	if rs := decide(text, w); len(rs) > 0 {
		jf.record(v, &d, cs, text, rs, named)
	}
}

// record adds the records rs of the JSON string v, whose content cs
// decodes to text (d).
func (jf *jsonFinder) record(v jsonValue, d *decoded, cs notation.Span, text string, rs []found, named bool) {
	m := d.b.done(cs.Start)
	for _, r := range rs {
		sub := m
		if r.from != 0 || r.to != len(text) {
			sub = m.slice(r.from, r.to)
		}
		o := Occurrence{
			Text:      text[r.from:r.to],
			Title:     jf.title,
			Span:      notation.Span{Start: sub.hostStart(), End: sub.hostEnd()},
			Kind:      KindJSON,
			Construct: ConstructJSONValue,
			Reason:    ReasonName,
			Dialect:   r.dialect,
			m:         sub,
			encode:    jsonEscape,
		}
		if !named {
			o.Reason = ReasonGuess
			// the key of a record taken by its content labels it
			// ({"lead": "C[C@@H](O)c1ccccc1"}); a key that names the
			// notation does not
			if o.Title == "" && labelKey(jf.own) {
				o.Title = jf.own
			}
		}
		if jf.key != "" {
			o.Field = FieldOfKey(jf.key)
		}
		for _, is := range d.issues {
			if is.span.Start < o.Span.Start || is.span.Start >= o.Span.End {
				continue
			}
			e := &notation.Error{Span: is.span, Code: CodeHostEscape, Severity: is.sev, Msg: is.msg}
			o.addDiag(e, []Fix{{Title: "double the backslashes", Span: v.span, NewText: `"` + jsonEscape(text) + `"`}})
		}
		jf.out = append(jf.out, o)
		if jf.each != nil && len(jf.out) >= jf.chunk {
			jf.each(jf.out)
			jf.out = make([]Occurrence, 0, jf.chunk)
		}
	}
}

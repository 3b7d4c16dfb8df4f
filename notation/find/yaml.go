package find

import (
	"bytes"
	"strings"

	"stereoline/notation"
)

// yamlRules are the escapes of YAML double-quoted scalars (YAML 1.2.2,
// 5.7 "Escaped Characters"). `\/` and `\ ` give the byte itself.
var yamlRules = &escapeRules{
	lang: "yaml", harmless: `"/ ` + "\t", simple: "0abtnvfreN_LP", hex: true, unicode: "uU",
	unknown: unknownReject,
}

// findYAML reads the block subset of YAML that configuration and data
// files use, line by line: "key: value" mappings nested by indentation,
// "- item" sequences, one-line flow sequences [a, "b"], plain, single-
// and double-quoted scalars, and literal or folded block scalars (| >),
// whose lines are records when their key names the notation. Values
// under a notation-named key, and in sequences and mappings under it
// (except under keys about the notation, like name), are notation; other
// scalars only when unmistakably so. '#' comments may carry pragmas.
func findYAML(src []byte, cfg *Config) []Occurrence {
	yf := &yamlFinder{src: src, cfg: cfg, nm: newNamer(cfg), prag: newPragmas(src)}
	yf.walk()
	yf.flush(true)
	return yf.done
}

// findYAMLChunks is findYAML handing its occurrences to each n at a
// time, as soon as their titles are known: a long document's are not
// all held (FindChunks).
func findYAMLChunks(src []byte, cfg *Config, n int, each func([]Occurrence)) {
	yf := &yamlFinder{src: src, cfg: cfg, nm: newNamer(cfg), prag: newPragmas(src), each: each, chunk: max(n, 1)}
	yf.walk()
	yf.flush(true)
	if len(yf.done) > 0 {
		each(yf.done)
	}
}

type yamlFinder struct {
	src  []byte
	cfg  *Config
	nm   namer
	prag *pragmas
	out  []Occurrence
	// key is the innermost key above the scalar being read, mapping the
	// mapping it is in (an index into titles), for each occurrence its
	// mapping (outMaps); titles are each mapping's name, title or id
	// member and its rank (titlePriority), given to the records found
	// in it once the document is read
	key     string
	mapping int
	outMaps []int
	titles  []yamlTitle
	// own is the key whose value on its own line is the scalar being
	// read ("" for an item of a sequence or a block), and outOwn that of
	// each occurrence: a label for a record nothing else names
	own    string
	outOwn []string
	// done are the occurrences whose titles are known (flush), in
	// order; each, when not nil, is handed them chunk at a time
	done  []Occurrence
	each  func([]Occurrence)
	chunk int
	head  int // out[:head] were moved to done (flush)
}

type yamlTitle struct {
	text   string
	rank   int
	parent int  // the mapping it is nested in, -1 for none
	closed bool // no more lines of it come: its title is final
}

type yamlLevel struct {
	indent  int
	w       wants
	key     string
	mapping int // the mapping the level's lines are members of, -1 for none
}

// flush titles the occurrences found so far whose titles are known, in
// order, and moves them to done (handing done out when it holds a
// chunk): an occurrence is titled by the innermost mapping around it
// that has a title, and that is known once each mapping from its own up
// to the first with a title is closed. At the end (all), every mapping
// is closed. The occurrences before yf.head were moved; the rest is
// moved down once it is at most half of out, so each is copied a bounded
// number of times.
func (yf *yamlFinder) flush(all bool) {
	k := yf.head
	for ; k < len(yf.out); k++ {
		o := &yf.out[k]
		if o.Title != "" {
			// a block scalar's record titled on its line
			yf.ready(o)
			continue
		}
		m := yf.outMaps[k]
		for ; m >= 0 && (all || yf.titles[m].closed) && yf.titles[m].rank == 0; m = yf.titles[m].parent {
		}
		if m >= 0 && !all && !yf.titles[m].closed {
			break // a mapping around it is still being read
		}
		if m >= 0 {
			o.Title = yf.titles[m].text
		} else if o.Reason == ReasonGuess && labelKey(yf.outOwn[k]) {
			// else the key of a record taken by its content labels it
			// ("lead: C[C@@H](O)c1ccccc1"); a key that names the notation
			// does not (the record was taken by that name)
			o.Title = yf.outOwn[k]
		}
		yf.ready(o)
	}
	yf.head = k
	if k < 1024 && k < len(yf.out) || 2*k < len(yf.out) {
		return
	}
	n := copy(yf.out, yf.out[k:])
	clear(yf.out[n:])
	yf.out = yf.out[:n]
	yf.outMaps = yf.outMaps[:copy(yf.outMaps, yf.outMaps[k:])]
	yf.outOwn = yf.outOwn[:copy(yf.outOwn, yf.outOwn[k:])]
	yf.head = 0
}

// waiting reports whether occurrences wait for their titles.
func (yf *yamlFinder) waiting() bool { return yf.head < len(yf.out) }

// ready moves a titled occurrence to done, handing done out when it
// holds a chunk.
func (yf *yamlFinder) ready(o *Occurrence) {
	yf.done = append(yf.done, *o)
	if yf.each != nil && len(yf.done) == yf.chunk {
		yf.each(yf.done)
		yf.done = make([]Occurrence, 0, yf.chunk)
	}
}

// close marks the mappings of levels closed.
func (yf *yamlFinder) close(levels []yamlLevel) {
	for _, l := range levels {
		yf.titles[l.mapping].closed = true
	}
}

// forget renumbers the mappings when no occurrence waits for a title
// and many are closed: only the open ones, maps, are kept (a mapping's
// parent is open while it is).
func (yf *yamlFinder) forget(maps []yamlLevel) {
	if yf.waiting() || len(yf.titles) < 4096+2*len(maps) {
		return
	}
	kept := make([]yamlTitle, 0, max(64, 2*len(maps)))
	renumber := make(map[int]int, len(maps))
	for i := range maps {
		t := yf.titles[maps[i].mapping]
		if p, ok := renumber[t.parent]; ok {
			t.parent = p
		} else {
			t.parent = -1
		}
		renumber[maps[i].mapping] = len(kept)
		maps[i].mapping = len(kept)
		kept = append(kept, t)
	}
	yf.titles = kept
}

// labelKey reports whether a key can label the record that is its value:
// not empty, not too long, and not a generic word of data formats.
func labelKey(key string) bool {
	if key == "" || len(key) > maxJSONTitle {
		return false
	}
	switch strings.ToLower(key) {
	case "value", "values", "data", "text", "input", "output", "default", "example", "item", "result", "string":
		return false
	}
	return true
}

// newMapping starts a mapping inside the mapping parent (-1 for none)
// and returns its index.
func (yf *yamlFinder) newMapping(parent int) int {
	yf.titles = append(yf.titles, yamlTitle{parent: parent})
	return len(yf.titles) - 1
}

// walk reads the document's lines.
func (yf *yamlFinder) walk() {
	src := yf.src
	var stack []yamlLevel
	// maps are the mappings open at each indent, innermost last
	var maps []yamlLevel
	block := -1 // indent of the key owning a block scalar being skipped
	var blockW wants
	for start := 0; start < len(src); {
		line, next := nextLine(src, start)
		ls := start
		start = next
		indent := 0
		for indent < len(line) && line[indent] == ' ' {
			indent++
		}
		rest := bytes.TrimRight(line, " \t\r")
		if block >= 0 {
			if indent > block || len(bytes.TrimSpace(line)) == 0 {
				if blockW.named() && indent < len(rest) && rest[indent] != '#' {
					yf.record(rest[indent:], ls+indent, blockW)
				}
				continue
			}
			block = -1
		}
		body := rest[min(indent, len(rest)):]
		if c := yamlComment(body); c >= 0 {
			yf.prag.addComment(body[c:], ls+indent+c)
			body = bytes.TrimRight(body[:c], " \t")
		}
		if bytes.HasPrefix(body, []byte("---")) || bytes.HasPrefix(body, []byte("...")) {
			yf.close(maps)
			stack, maps = stack[:0], maps[:0] // a new document
			continue
		}
		if len(body) == 0 {
			continue
		}
		for len(stack) > 0 && stack[len(stack)-1].indent >= indent {
			stack = stack[:len(stack)-1]
		}
		for len(maps) > 0 && maps[len(maps)-1].indent > indent {
			yf.close(maps[len(maps)-1:])
			maps = maps[:len(maps)-1]
		}
		if yf.waiting() {
			yf.flush(false)
		}
		yf.forget(maps)
		var w wants
		parentKey := ""
		if len(stack) > 0 {
			w, parentKey = stack[len(stack)-1].w, stack[len(stack)-1].key
		}
		at := ls + indent
		// Sequence items: "- value" or "- key: value". An item starts
		// a mapping of its own.
		for len(body) > 0 && body[0] == '-' && (len(body) == 1 || body[1] == ' ') {
			k := 1
			for k < len(body) && body[k] == ' ' {
				k++
			}
			stack = append(stack, yamlLevel{indent: indent, w: w, key: parentKey})
			for len(maps) > 0 && maps[len(maps)-1].indent >= indent {
				yf.close(maps[len(maps)-1:])
				maps = maps[:len(maps)-1]
			}
			if yf.waiting() {
				yf.flush(false)
			}
			indent += k
			body, at = body[k:], at+k
			maps = append(maps, yamlLevel{indent: indent, mapping: yf.newMapping(innermost(maps))})
		}
		if len(body) == 0 {
			continue
		}
		yf.mapping = -1
		if len(maps) > 0 && maps[len(maps)-1].indent <= indent {
			yf.mapping = maps[len(maps)-1].mapping
		}
		key, valueAt, ok := yamlKey(body)
		if !ok {
			yf.key, yf.own = parentKey, ""
			yf.scalar(body, at, w)
			continue
		}
		if len(maps) == 0 || maps[len(maps)-1].indent < indent {
			// the first key of a mapping nested under a key
			maps = append(maps, yamlLevel{indent: indent, mapping: yf.newMapping(innermost(maps))})
		}
		yf.mapping = maps[len(maps)-1].mapping
		yf.title(key, body[valueAt:])
		keyW, about := yf.nm.classify(key)
		if !keyW.named() && !aboutKey(key) {
			keyW = w
		}
		if !keyW.named() && about {
			// smiles_file: in.smi, smarts_col: ...: not even guessed.
			continue
		}
		value := body[valueAt:]
		switch {
		case len(value) == 0:
			stack = append(stack, yamlLevel{indent: indent, w: keyW, key: key})
		case value[0] == '|' || value[0] == '>':
			block, blockW = indent, keyW
			yf.key, yf.own = key, ""
		default:
			yf.key, yf.own = key, key
			yf.scalar(value, at+valueAt, keyW)
		}
	}
}

// innermost returns the innermost open mapping, -1 for none.
func innermost(maps []yamlLevel) int {
	if len(maps) == 0 {
		return -1
	}
	return maps[len(maps)-1].mapping
}

// title notes a name, title or id member of the mapping being read.
func (yf *yamlFinder) title(key string, value []byte) {
	rank := titlePriority(key)
	t := &yf.titles[yf.mapping]
	if rank == 0 || t.rank != 0 && rank >= t.rank || len(value) == 0 || len(value) > maxJSONTitle {
		return
	}
	v := string(value)
	if q := v[0]; (q == '"' || q == '\'') && len(v) >= 2 && v[len(v)-1] == q {
		v = v[1 : len(v)-1]
	}
	v = strings.TrimSpace(v)
	switch v {
	case "", "~", "null", "|", ">":
		return
	}
	t.text, t.rank = v, rank
}

// add appends an occurrence with the field and mapping it was found in.
func (yf *yamlFinder) add(o Occurrence) {
	if yf.key != "" {
		o.Field = FieldOfKey(yf.key)
	}
	yf.out = append(yf.out, o)
	yf.outMaps = append(yf.outMaps, yf.mapping)
	yf.outOwn = append(yf.outOwn, yf.own)
}

// yamlComment returns where a comment starts in a line ('#' at the start
// or after a blank, outside quotes), or -1.
func yamlComment(b []byte) int {
	var q byte
	for i := 0; i < len(b); i++ {
		c := b[i]
		if q != 0 {
			if q == '"' && c == '\\' {
				i++
			} else if c == q {
				q = 0
			}
			continue
		}
		switch {
		case (c == '"' || c == '\'') && (i == 0 || strings.IndexByte(" [,:-", b[i-1]) >= 0):
			q = c
		case c == '#' && (i == 0 || b[i-1] == ' ' || b[i-1] == '\t'):
			return i
		}
	}
	return -1
}

// yamlKey splits "key: value" and returns the key and where the value
// starts; quoted keys are unquoted.
func yamlKey(b []byte) (string, int, bool) {
	if len(b) > 0 && (b[0] == '"' || b[0] == '\'') {
		k := bytes.IndexByte(b[1:], b[0])
		if k < 0 || k+2 >= len(b)+1 {
			return "", 0, false
		}
		after := k + 2
		if after < len(b) && b[after] == ':' && (after+1 == len(b) || b[after+1] == ' ') {
			return string(b[1 : k+1]), skipSpaces(b, after+1), true
		}
		return "", 0, false
	}
	if len(b) > 0 && (b[0] == '[' || b[0] == '{') {
		return "", 0, false
	}
	for i := 0; i < len(b); i++ {
		if b[i] == ':' && (i+1 == len(b) || b[i+1] == ' ' || b[i+1] == '\t') {
			return strings.TrimSpace(string(b[:i])), skipSpaces(b, i+1), true
		}
	}
	return "", 0, false
}

func skipSpaces(b []byte, i int) int {
	for i < len(b) && (b[i] == ' ' || b[i] == '\t') {
		i++
	}
	return i
}

// scalar handles a value: a flow sequence, or one scalar.
func (yf *yamlFinder) scalar(v []byte, at int, w wants) {
	if len(v) > 1 && v[0] == '[' && v[len(v)-1] == ']' {
		inner := v[1 : len(v)-1]
		for i := 0; i < len(inner); {
			j, q := i, byte(0)
			for j < len(inner) && (q != 0 || inner[j] != ',') {
				if q == 0 && (inner[j] == '"' || inner[j] == '\'') {
					q = inner[j]
				} else if q != 0 && inner[j] == q {
					q = 0
				} else if q == '"' && inner[j] == '\\' {
					j++
				}
				j++
			}
			j = min(j, len(inner))
			item := inner[i:j]
			lead := len(item) - len(bytes.TrimLeft(item, " "))
			yf.one(bytes.TrimSpace(item), at+1+i+lead, w)
			i = j + 1
		}
		return
	}
	yf.one(v, at, w)
}

// one handles a single scalar at host offset at.
func (yf *yamlFinder) one(v []byte, at int, w wants) {
	named := w.named()
	if len(v) == 0 || !yf.prag.allowed(at) || !named && yf.cfg.NoGuess {
		return
	}
	var d decoded
	var quote byte
	var tok notation.Span
	switch v[0] {
	case '"':
		quote = '"'
		end := len(v)
		if end > 1 && v[end-1] == '"' {
			end--
		}
		tok = notation.Span{Start: at, End: at + len(v)}
		pc := piece{content: notation.Span{Start: at + 1, End: at + end}}
		d.piece(yf.src, &pc, yamlRules)
	case '\'':
		quote = '\''
		end := len(v)
		if end > 1 && v[end-1] == '\'' {
			end--
		}
		tok = notation.Span{Start: at, End: at + len(v)}
		for i := 1; i < end; i++ {
			if v[i] == '\'' && i+1 < end && v[i+1] == '\'' {
				d.escape([]byte{'\''}, at+i, 2)
				i++
				continue
			}
			d.copy(yf.src, at+i, at+i+1)
		}
	default:
		if v[0] == '{' || v[0] == '&' || v[0] == '*' || v[0] == '!' || v[0] == '|' || v[0] == '>' {
			return
		}
		d.copy(yf.src, at, at+len(v))
	}
	text := string(d.text)
	reason := ReasonName
	dialect := DialectSMILES
	switch {
	case yf.prag.forced(at):
		reason, dialect = ReasonPragma, dialectOf(text)
	default:
		w.guess = !named
		rs := decide(text, w)
		if len(rs) != 1 || rs[0].to-rs[0].from != len(text) {
			return
		}
		dialect = rs[0].dialect
		if !named {
			reason = ReasonGuess
		}
	}
	start := at
	if quote != 0 {
		start = at + 1
	}
	m := d.b.done(start)
	o := Occurrence{
		Text:      text,
		Span:      notation.Span{Start: m.hostStart(), End: m.hostEnd()},
		Kind:      KindYAML,
		Construct: ConstructYAMLValue,
		Reason:    reason,
		Dialect:   dialect,
		m:         m,
	}
	if quote == '"' {
		o.encode = doubleBackslashes
	}
	for _, is := range d.issues {
		e := &notation.Error{Span: is.span, Code: CodeHostEscape, Severity: is.sev, Msg: is.msg}
		o.addDiag(e, []Fix{
			{Title: "make it a single-quoted string", Span: tok, NewText: "'" + strings.ReplaceAll(text, "'", "''") + "'"},
		})
	}
	yf.add(o)
}

// record takes one line of a block scalar under a notation-named key.
func (yf *yamlFinder) record(line []byte, at int, w wants) {
	if !yf.prag.allowed(at) {
		return
	}
	recEnd, ts, te := splitRecord(line)
	if recEnd == 0 {
		return
	}
	if text := string(line[:recEnd]); w.loose && !readsAsNotation(text) && !readsAsQuery(text) {
		// under a word that often names other things (help text under a
		// key about a governance rule), only what reads
		return
	}
	yf.add(Occurrence{
		Text:      string(line[:recEnd]),
		Title:     string(line[ts:te]),
		Span:      notation.Span{Start: at, End: at + recEnd},
		Kind:      KindYAML,
		Construct: ConstructYAMLValue,
		Reason:    ReasonName,
		m:         identityMap(at, recEnd),
	})
}

package find

import (
	"bytes"
	"sort"
	"strings"

	"stereoline/notation"
)

// codeLang is what the rules need to know about a programming language.
type codeLang struct {
	kind  Kind
	lex   func(src []byte, prag *pragmas) []token
	rules *escapeRules
	// rawForm writes text as a raw literal of the language, reporting
	// false when the text cannot be written that way.
	rawForm func(pc *piece, text string) (string, bool)
	// dollar returns how a '$' of the notation is written in a piece
	// where '$' may start a template ("" where it cannot).
	dollar func(pc *piece) string
	// braceBlocks: '{' opens statement blocks, so a newline inside braces
	// ends a statement (Go, JavaScript, Rust, ...; not Python).
	braceBlocks bool
}

// keywords are names that are never called functions, so a '(' after
// them opens a plain group.
var keywords = map[string]bool{
	"if": true, "elif": true, "while": true, "for": true, "return": true, "in": true,
	"not": true, "and": true, "or": true, "switch": true, "case": true, "catch": true,
	"typeof": true, "yield": true, "await": true, "else": true, "assert": true, "when": true,
	"match": true, "with": true, "lambda": true, "print": false,
}

// passThrough are constructors and collection methods whose arguments are
// what a notation-named receiver or target holds: smiles = list("CCO"),
// smiles_list.append("CCO"), c("CCO", "CCN") in R.
var passThrough = map[string]bool{
	"list": true, "tuple": true, "set": true, "frozenset": true, "str": true, "String": true,
	"listOf": true, "setOf": true, "arrayOf": true, "mutableListOf": true, "mutableSetOf": true,
	"c": true, "vec": true, "Array": true, "of": true, "append": true, "push": true,
	"extend": true, "add": true, "insert": true, "array": true, "Set": true, "asList": true,
	"List": true, "Vector": true, "unshift": true, "appendleft": true,
}

// frame is the state of one bracket level while the rules walk tokens.
type frame struct {
	open byte // '(', '[', '{' or 0 at the top level
	// base: strings directly at this level are notation unless an
	// operator says otherwise (the arguments of MolFromSmiles(...), the
	// elements of a list assigned to smiles).
	base bool
	// subscript: a '[' indexing a value; a notation-named key inside
	// (row["smiles"]) names the target.
	subscript bool
	// seg: the current segment (since the last operator, comma or
	// statement end) mentioned a notation name.
	seg bool
	// val: 1 inside the value after an operator whose left side named
	// notation, 2 after an operator whose left side did not (a keyword
	// argument sanitize=...), 3 after one whose left side named something
	// about the notation (smiles_file =, reaction_smarts =), whose value
	// is not even guessed; 0 otherwise.
	val int
	// other: the current segment named something about the notation.
	other bool
	// noGuess: strings directly at this level are never guessed (the
	// arguments of MolFromSmarts(...)).
	noGuess bool
	// about: the key just read is about the notation ("name"), so the
	// value after ':' is not notation even inside a notation collection.
	about bool
}

func (f *frame) taken() bool { return f.val == 1 || f.val == 0 && f.base }

// codeFinder applies the rules to one source text.
type codeFinder struct {
	src  []byte
	lang *codeLang
	cfg  *Config
	nm   namer
	prag *pragmas
	out  []Occurrence
}

// findCode finds notation in source code.
//
// A string literal is taken when
//   - it is assigned or compared to a name mentioning the notation
//     (smiles = "...", self.rxn := "...", row["smiles"] = "...",
//     smiles: str = "..."), also inside list, tuple, set and dict
//     literals so assigned (dict values, not keys);
//   - it is an argument of a function whose name mentions it
//     (MolFromSmiles("...")) or the value of such a keyword argument
//     (f(smiles="...")) or such a key ({"smiles": "..."}, {smiles: "..."});
//   - nothing names it but it is unmistakably notation (see unmistakable);
//   - a "stereoline: notation" pragma is on its line.
//
// Named literals must still look like records (see plausible): a literal
// with several lines is a list, one record a line.
func findCode(src []byte, lang *codeLang, cfg *Config) []Occurrence {
	cf := &codeFinder{src: src, lang: lang, cfg: cfg, nm: newNamer(cfg), prag: newPragmas(src)}
	toks := lang.lex(src, cf.prag)
	cf.walk(toks)
	return cf.out
}

func (cf *codeFinder) walk(toks []token) {
	frames := make([]frame, 1, 16)
	for i := 0; i < len(toks); i++ {
		t := toks[i]
		f := &frames[len(frames)-1]
		switch t.kind {
		case tIdent:
			name := cf.textS(t)
			if cf.nm.value(name) {
				f.seg = true
			} else if cf.nm.other(name) {
				f.other = true
			}
		case tNumber:
		case tNewline:
			if f.open == 0 || f.open == '{' && cf.lang.braceBlocks {
				f.seg, f.val, f.about, f.other = false, 0, false, false
			}
		case tString:
			next := nextToken(toks, i)
			// A string before ':' inside braces is a key ({"smiles": ...});
			// elsewhere the colon ends a statement head (if s == "CCO":).
			key := f.open == '{' && next >= 0 && cf.is(toks[next], ":") ||
				f.subscript && next >= 0 && cf.is(toks[next], "]")
			if key {
				if !t.lit.skip && !t.lit.hasHoles() {
					k := cf.keyText(t)
					f.seg = cf.nm.value(k)
					f.about = !f.seg && aboutKey(k)
					f.other = cf.nm.other(k)
				}
				continue
			}
			cf.literal(t, f.taken(), f.val == 3 || f.val == 0 && f.noGuess)
		case tPunct:
			p := cf.text(t)
			switch string(p) {
			case "=", ":=", "==", "<-", "+=":
				switch {
				case f.seg || f.val == 1:
					f.val = 1
				case f.other:
					f.val = 3
				default:
					f.val = 2
				}
				f.seg, f.other = false, false
			case ":":
				switch {
				case f.seg:
					f.val = 1
				case f.other:
					f.val = 3
				case f.about:
					f.val = 2
				case f.val != 1:
					f.val = 0
				}
				f.seg, f.about, f.other = false, false, false
			case ",", ";":
				f.seg, f.val, f.about, f.other = false, 0, false, false
			case "(", "[", "{":
				frames = append(frames, cf.open(toks, i, f))
			case ")", "]", "}":
				if len(frames) > 1 {
					closed := frames[len(frames)-1]
					frames = frames[:len(frames)-1]
					if closed.subscript && closed.seg {
						frames[len(frames)-1].seg = true
					}
				}
			}
		}
	}
}

// open returns the frame a bracket opens.
func (cf *codeFinder) open(toks []token, i int, parent *frame) frame {
	c := cf.text(toks[i])[0]
	nf := frame{open: c, base: parent.taken()}
	prev := i - 1
	if prev < 0 {
		return nf
	}
	pt := toks[prev]
	switch c {
	case '(':
		if pt.kind == tIdent && !keywords[cf.textS(pt)] {
			name := cf.textS(pt)
			nf.base = cf.nm.call(name) || passThrough[name] && (parent.taken() || parent.seg)
			nf.noGuess = !nf.base && cf.nm.other(name)
		}
	case '[':
		if pt.kind == tIdent && !keywords[cf.textS(pt)] || pt.kind == tString || cf.is(pt, ")") || cf.is(pt, "]") {
			nf.subscript, nf.base = true, false
		}
	}
	return nf
}

// nextToken returns the index of the token after i, skipping newlines,
// or -1.
func nextToken(toks []token, i int) int {
	for j := i + 1; j < len(toks); j++ {
		if toks[j].kind != tNewline {
			return j
		}
	}
	return -1
}

func (cf *codeFinder) text(t token) []byte  { return cf.src[t.span.Start:t.span.End] }
func (cf *codeFinder) textS(t token) string { return string(cf.text(t)) }
func (cf *codeFinder) is(t token, s string) bool {
	return t.kind == tPunct && string(cf.text(t)) == s
}

// keyText returns the content of a string used as a key.
func (cf *codeFinder) keyText(t token) string {
	pc := t.lit.pieces[0]
	return string(cf.src[pc.content.Start:pc.content.End])
}

// literal decides about one string literal and records what it yields.
func (cf *codeFinder) literal(t token, named, noGuess bool) {
	lit := t.lit
	if lit.skip || !cf.prag.allowed(t.span.Start) {
		return
	}
	reason := ReasonName
	if cf.prag.forced(t.span.Start) {
		named, reason = true, ReasonPragma
	}
	if lit.template() {
		cf.templateLiteral(lit, named, reason, noGuess)
		return
	}
	if !named && (noGuess || cf.cfg.NoGuess || !mayGuess(cf.src, lit)) {
		return
	}
	d := &decoded{}
	m := cf.decode(lit, d)
	text := string(d.text)
	if named {
		if strings.IndexByte(text, '\n') >= 0 {
			cf.records(lit, d, &m, text, reason)
			return
		}
		// One line is one record without a title: prose such as
		// "see table 2" in a smiles variable is not a record.
		if reason == ReasonPragma && text != "" || plausible(text) {
			cf.emit(lit, d, &m, 0, len(text), "", reason)
		}
		return
	}
	if unmistakable(text) {
		cf.emit(lit, d, &m, 0, len(text), "", ReasonGuess)
	}
}

// decode decodes a literal into d and returns its offset map.
func (cf *codeFinder) decode(lit *literal, d *decoded) offsetMap {
	for k := range lit.pieces {
		d.piece(cf.src, &lit.pieces[k], cf.lang.rules)
	}
	return d.b.done(lit.pieces[0].content.Start)
}

// mayGuess is a quick test on the host bytes of an unnamed literal
// before it is decoded: a literal with a blank, a quote or any byte that
// is in no record cannot be unmistakably notation, and most literals are
// such. Only single-piece literals are guessed.
func mayGuess(src []byte, lit *literal) bool {
	if len(lit.pieces) != 1 {
		return len(lit.pieces) > 1
	}
	c := lit.pieces[0].content
	if c.Len() < 3 {
		return false
	}
	for _, b := range src[c.Start:c.End] {
		if !notationByte[b] {
			return false
		}
	}
	return true
}

// records takes a named multi-line literal as a record list.
func (cf *codeFinder) records(lit *literal, d *decoded, m *offsetMap, text string, reason Reason) {
	for start := 0; start < len(text); {
		end := strings.IndexByte(text[start:], '\n')
		if end < 0 {
			end = len(text)
		} else {
			end += start
		}
		line := d.text[start:end]
		trimmed := bytes.TrimLeft(line, " \t")
		if lit.margin != "" && bytes.HasPrefix(trimmed, []byte(lit.margin)) {
			trimmed = trimmed[len(lit.margin):]
		}
		lead := len(line) - len(trimmed)
		if len(trimmed) > 0 && trimmed[0] != '#' {
			recEnd, ts, te := splitRecord(trimmed)
			rs := start + lead
			if plausible(text[rs:rs+recEnd]) && cf.prag.allowed(m.host(rs)) {
				title := trimmed[ts:te]
				if bytes.IndexByte(title, holeByte) >= 0 {
					// A title with a replacement field is not known
					// before the program runs.
					title = nil
				}
				cf.emit(lit, d, m, rs, rs+recEnd, string(title), reason)
			}
		}
		start = end + 1
	}
}

// emit records the notation bytes [from, to) of a decoded literal.
func (cf *codeFinder) emit(lit *literal, d *decoded, m *offsetMap, from, to int, title string, reason Reason) {
	sub := *m
	if from != 0 || to != m.length() {
		sub = m.slice(from, to)
	}
	o := Occurrence{
		Text:      string(d.text[from:to]),
		Title:     title,
		Kind:      cf.lang.kind,
		Construct: ConstructStringLiteral,
		Reason:    reason,
		m:         sub,
	}
	o.Span = notation.Span{Start: sub.hostStart(), End: sub.hostEnd()}
	// Pieces and issues are in host order: a literal joined from many
	// pieces with many records is searched, not walked, per record.
	if k := pieceAt(lit, o.Span.Start); k >= 0 {
		if pc := &lit.pieces[k]; o.Span.Start <= pc.content.End {
			o.encode = cf.encoder(pc)
		}
	}
	first := sort.Search(len(d.issues), func(k int) bool { return d.issues[k].span.Start >= o.Span.Start })
	for _, is := range d.issues[first:] {
		if is.span.Start >= o.Span.End {
			break
		}
		e := &notation.Error{Span: is.span, Code: CodeHostEscape, Severity: is.sev, Msg: is.msg}
		var fixes []Fix
		if k := pieceAt(lit, is.span.Start); k >= 0 && is.span.Start < lit.pieces[k].content.End {
			pc := &lit.pieces[k]
			if pc.block || pc.template {
				// Rewriting the whole piece would have to rebuild its
				// layout or fields; the record alone is enough.
				fixes = []Fix{{Title: "double the backslashes", Span: o.Span, NewText: doubleBackslashes(o.Text)}}
			} else {
				pr := d.pieces[k]
				fixes = cf.fixes(pc, string(d.text[pr.start:pr.end]))
			}
		}
		o.addDiag(e, fixes)
	}
	cf.out = append(cf.out, o)
}

// encoder returns how text inserted into a piece must be written: with
// backslashes doubled unless the piece is raw, and with each '$' (the
// quadruple bond) written so that it starts no template where '$' does.
func (cf *codeFinder) encoder(pc *piece) func(string) string {
	dollar := ""
	if cf.lang.dollar != nil {
		dollar = cf.lang.dollar(pc)
	}
	switch {
	case dollar != "" && pc.raw:
		return func(s string) string { return strings.ReplaceAll(s, "$", dollar) }
	case dollar != "":
		return func(s string) string { return strings.ReplaceAll(doubleBackslashes(s), "$", dollar) }
	case pc.raw:
		return nil
	}
	return doubleBackslashes
}

// pieceAt returns the index of the last piece of a literal whose content
// starts at or before host offset h, or -1.
func pieceAt(lit *literal, h int) int {
	return sort.Search(len(lit.pieces), func(k int) bool { return lit.pieces[k].content.Start > h }) - 1
}

// fixes suggests rewrites of a piece whose notation is text.
func (cf *codeFinder) fixes(pc *piece, text string) []Fix {
	var fs []Fix
	if cf.lang.rawForm != nil {
		if s, ok := cf.lang.rawForm(pc, text); ok {
			fs = append(fs, Fix{Title: "make it a raw string", Span: pc.tok, NewText: s})
		}
	}
	multiline := len(pc.quote) == 3 || pc.quote == "`"
	if cf.lang.kind == KindRust || cf.lang.kind == KindR || cf.lang.kind == KindJulia {
		multiline = true
	}
	fs = append(fs, Fix{Title: "double the backslashes", Span: pc.tok, NewText: doubled(pc, text, multiline)})
	return fs
}

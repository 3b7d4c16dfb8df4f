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
	"match": true, "with": true, "lambda": true, "print": false, "of": true,
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
	// id numbers the frame; parent is its parent's id. callee is the
	// function whose arguments the frame holds ("" for a collection),
	// arg the index of the current argument or element. They key the
	// groups of literals that must agree (see group).
	id, parent int
	callee     string
	arg        int
	collection bool // a list, tuple, set or dict literal
	nested     bool // a collection directly inside another collection
	// base: what strings directly at this level are unless an operator
	// says otherwise (the arguments of MolFromSmiles(...), the elements
	// of a list assigned to smiles).
	base wants
	// subscript: a '[' indexing a value; a notation-named key inside
	// (row["smiles"]) names the target.
	subscript bool
	// seg: what the names of the current segment (since the last
	// operator, comma or statement end) say; segAbout: a name in it was
	// about the notation (smiles_file, reaction_name).
	seg      wants
	segAbout bool
	// val: valNamed inside the value after an operator whose left side
	// named notation (valWants says what), valOther after one whose
	// left side did not (a keyword argument sanitize=...), valAbout
	// after one whose left side named something about the notation
	// (smiles_file =), whose value is not even guessed; valNone
	// otherwise.
	val      int
	valWants wants
	// noGuess: strings directly at this level are never guessed (the
	// arguments of read_smiles_file(...)).
	noGuess bool
	// about: the key just read is about the notation ("name"), so the
	// value after ':' is not notation even inside a notation collection.
	about bool
	// forHead: between "for" and "in" (or "of", or ':' in Java): the
	// names of the loop variable say what the iterated values are.
	forHead bool
	// key: the string key of the current entry of a dict or object
	// literal ({"naproxen": "..."}), a label for a record nobody names
	key string
}

const (
	valNone = iota
	valNamed
	valOther
	valAbout
)

// wants says what strings directly at this level are.
func (f *frame) wants() wants {
	switch f.val {
	case valNamed:
		return f.valWants
	case valNone:
		return f.base
	}
	return wants{}
}

// noGuessHere reports whether strings directly at this level may not be
// guessed.
func (f *frame) noGuessHere() bool { return f.val == valAbout || f.val == valNone && f.noGuess }

// assign applies an assignment or comparison operator: the value after
// it is what the names before it say.
func (f *frame) assign() {
	switch {
	case f.seg.named():
		f.val, f.valWants = valNamed, f.seg
	case f.val == valNamed:
	case f.segAbout:
		f.val = valAbout
	default:
		f.val = valOther
	}
	f.seg, f.segAbout = wants{}, false
}

// merge returns the stronger of two contexts, field by field.
func merge(a, b wants) wants {
	// loose while neither names the text any more firmly
	loose := (a.loose || !a.named()) && (b.loose || !b.named()) && (a.named() || b.named())
	return wants{smiles: max(a.smiles, b.smiles), smarts: max(a.smarts, b.smarts), guess: a.guess || b.guess, loose: loose}
}

// codeFinder applies the rules to one source text.
type codeFinder struct {
	src    []byte
	lang   *codeLang
	cfg    *Config
	nm     namer
	prag   *pragmas
	out    []Occurrence
	frames int // frames opened, for their ids
	// inner: the finder reads the code of doctest lines inside a
	// docstring, and does not look for docstrings again.
	inner    bool
	doctests int     // doctests read, to keep their groups apart
	rs       []found // reused by decideInto
	// keys interns the group keys, so that an occurrence carries a
	// small number rather than the key; curKey is the key of the literal
	// being decided (groupMark.key currentGroup until interned).
	keys   map[groupKey]int32
	curKey groupKey
	// pending are literals of a group that were not taken but read as
	// query patterns: taken after all if their group turns out to hold
	// query patterns (agree).
	pending []pendingLiteral
	// literals counts the string literals of each group under a loose
	// name, taken or not (see strays)
	literals map[groupKey]int
	// carriers are the plain names passed whole to a constructor of the
	// notation somewhere in the code (see carrierNames)
	carriers map[string]wants
}

// carrierNames returns the names that are passed on their own as an
// argument of a constructor of the notation (Chem.MolFromSmiles(s),
// ReactionFromSmarts(t, ...)), with what they then carry: a loose
// notation name. The strings such a name is given or iterates over
// (s = "CC(C)O"; for s in ["CCO", "C1CCCCC1"]: ... MolFromSmiles(s)) are
// then taken when they read without error; a name used for other text
// elsewhere leaves that text alone unless it reads as a record.
func (cf *codeFinder) carrierNames(toks []token) map[string]wants {
	var out map[string]wants
	for i := 0; i+3 < len(toks); i++ {
		if toks[i].kind != tIdent || !cf.is(toks[i+1], "(") {
			continue
		}
		receiver := ""
		if i >= 2 && cf.is(toks[i-1], ".") && toks[i-2].kind == tIdent {
			receiver = cf.textS(toks[i-2])
		}
		callee := cf.textS(toks[i])
		w, _ := cf.nm.call(callee, receiver)
		// a converter's argument (smiles_to_smarts(s)) is not what its
		// name calls it
		if w.smiles != firmly && (w.smarts != firmly || strings.Contains(strings.ToLower(callee), "smi")) {
			continue
		}
		// each argument that is one name: f(a, b), not f(a.b) or f(a[0])
		for j := i + 2; j+1 < len(toks) && toks[j].kind == tIdent; j += 2 {
			name := cf.textS(toks[j])
			end := toks[j+1]
			if !cf.is(end, ",") && !cf.is(end, ")") {
				break
			}
			if named, about := cf.nm.classify(name); !named.named() && !about && !keywords[name] {
				if out == nil {
					out = map[string]wants{}
				}
				c := wants{smiles: weakly, loose: true}
				if w.smarts == firmly {
					c = wants{smarts: weakly, loose: true}
				}
				out[name] = merge(out[name], c)
			}
			if cf.is(end, ")") {
				break
			}
		}
	}
	return out
}

// pendingLiteral is a literal kept for agree.
type pendingLiteral struct {
	lit      *literal
	d        *decoded
	m        offsetMap
	from, to int
	mark     groupMark
	// word: a word under a loose name that reads as notation in this
	// dialect ("CN" in patterns = ["C=O", "CN"]), taken when another
	// literal of its group is
	word    bool
	dialect Dialect
	// sibling: a literal nobody names that reads as notation but is not
	// unmistakably so ("CC(=O)O"), taken when its list holds a literal
	// that is (["F/C=C/F", "CC(=O)O"])
	sibling bool
}

// groupMark ties an occurrence to the literals it must agree with.
type groupMark struct {
	key       int32 // an interned groupKey (codeFinder.intern); 0 for none
	byContent bool  // SMARTS by its content
	firm      bool  // its place fixes the dialect (MolFromSmiles(...))
	// loose: taken because a loose name (pattern, rule, query, template,
	// filter) is on it (see strays)
	loose bool
}

// findCode finds notation in source code.
//
// A string literal is taken when
//   - it is assigned or compared to a name mentioning the notation
//     (smiles = "...", self.rxn := "...", row["smiles"] = "...",
//     smiles: str = "...", for smi in ["..."], smi in ("...")), also
//     inside list, tuple, set and dict literals so assigned (dict
//     values, not keys);
//   - it is an argument of a function whose name mentions it
//     (MolFromSmiles("...")) or the value of such a keyword argument
//     (f(smiles="...")) or such a key ({"smiles": "..."}, {smiles: "..."});
//   - nothing names it but it is unmistakably notation (see unmistakable)
//     or a query pattern (see guessableQuery);
//   - a "stereoline: notation" pragma is on its line.
//
// Query patterns (SMARTS) are taken the same way, named by smarts,
// pattern, query, template, rule or filter, passed to a SMARTS
// constructor (MolFromSmarts, ReactionFromSmarts, SmartsPattern.create,
// ...) or recognised by their content, and carry DialectSMARTS. A text
// holding several records separated by commas, semicolons or blanks is
// split when each part is a record; a word or label under a mere name is
// not taken (see decide). Literals of one list, or at one argument of
// one function, that are partly query patterns by their content are all
// query patterns where they read as such (see agree).
//
// Named literals must still look like records (see plausible): a literal
// with several lines is a record list, laid out as list files are.
// Doctest lines of Python docstrings (">>> ...", "... ...") are read as
// the code they are.
func findCode(src []byte, lang *codeLang, cfg *Config) []Occurrence {
	cf := &codeFinder{src: src, lang: lang, cfg: cfg, nm: newNamer(cfg), prag: newPragmas(src)}
	toks := lang.lex(src, cf.prag)
	cf.carriers = cf.carrierNames(toks)
	cf.walk(toks)
	cf.agree()
	cf.strays()
	return cf.out
}

// strays drops the literals taken only because a loose name is on their
// list (rules = [...], templates = (...)) when most literals of the list
// are no records: a list of arithmetic rules, configuration templates or
// messages in which one item happens to read as a pattern ("A=B" among
// "(A+B)=C" and "A GT 0") holds no patterns. A list of four or more
// literals keeps its loosely named records only when at least half of
// its literals are records; a literal that is a record without the name
// (unmistakable notation, a query pattern by its content) stays anyway.
func (cf *codeFinder) strays() {
	loose := false
	for i := range cf.out {
		loose = loose || cf.out[i].group.loose
	}
	if !loose {
		return
	}
	taken := map[int32]int{}
	for i := range cf.out {
		if k := cf.out[i].group.key; k != 0 {
			taken[k]++
		}
	}
	drop := map[int32]bool{}
	for key, n := range cf.keys {
		if lits := cf.literals[key]; lits >= 4 && 2*taken[n] < lits {
			drop[n] = true
		}
	}
	if len(drop) == 0 {
		return
	}
	out := cf.out[:0]
	for _, o := range cf.out {
		// a literal that would be taken without the name stays
		if !o.group.loose || !drop[o.group.key] || unmistakable(o.Text) || guessableQuery(o.Text) {
			out = append(out, o)
		}
	}
	cf.out = out
}

func (cf *codeFinder) walk(toks []token) {
	frames := make([]frame, 1, 16)
	for i := 0; i < len(toks); i++ {
		t := toks[i]
		f := &frames[len(frames)-1]
		switch t.kind {
		case tIdent:
			name := cf.textS(t)
			switch {
			case name == "for":
				f.forHead = true
				continue
			case name == "in" || name == "of" && f.forHead:
				// for smi in [...], for (const smi of [...]), and the
				// membership test smi in ("CCO", "CCN").
				f.assign()
				f.forHead = false
				continue
			}
			w, about := cf.nm.classify(name)
			if c, ok := cf.carriers[name]; ok && !w.named() && !about {
				w = c
			}
			if w.named() {
				f.seg = merge(f.seg, w)
			} else if about {
				f.segAbout = true
			}
		case tNumber:
		case tNewline:
			if f.open == 0 || f.open == '{' && cf.lang.braceBlocks {
				f.seg, f.val, f.about, f.segAbout, f.forHead = wants{}, valNone, false, false, false
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
					w, about := cf.nm.classify(k)
					if f.open == '{' {
						f.key = k
					}
					f.seg = w
					f.about = !w.named() && aboutKey(k)
					f.segAbout = about
				}
				continue
			}
			if cf.concatenated(toks, i, next) && bytes.IndexByte(cf.text(t), '\n') < 0 {
				// "..." + x: a piece of a string built when the program
				// runs, like a template's fixed text around a field.
				// Joined blocks of whole lines stay record lists.
				continue
			}
			cf.literal(t, f)
		case tPunct:
			p := cf.text(t)
			switch string(p) {
			case "=", ":=", "==", "<-", "+=":
				f.assign()
			case ":":
				switch {
				case f.seg.named():
					f.val, f.valWants = valNamed, f.seg
				case f.segAbout:
					f.val = valAbout
				case f.about:
					f.val = valOther
				case f.val != valNamed:
					f.val = valNone
				}
				if f.forHead {
					// for (String smi : List.of(...)) in Java.
					f.forHead = false
				}
				f.seg, f.about, f.segAbout = wants{}, false, false
			case ",", ";":
				f.seg, f.val, f.about, f.segAbout = wants{}, valNone, false, false
				f.arg++
				f.key = ""
			case "(", "[", "{":
				frames = append(frames, cf.open(toks, i, f))
			case ")", "]", "}":
				if len(frames) > 1 {
					closed := frames[len(frames)-1]
					frames = frames[:len(frames)-1]
					if closed.subscript && closed.seg.named() {
						parent := &frames[len(frames)-1]
						parent.seg = merge(parent.seg, closed.seg)
					}
				}
			}
		}
	}
}

// concatenated reports whether the string token at i is joined to
// something else by a '+' (before it, or after it with next the token
// after it).
func (cf *codeFinder) concatenated(toks []token, i, next int) bool {
	if next >= 0 && cf.is(toks[next], "+") {
		return true
	}
	for j := i - 1; j >= 0; j-- {
		if toks[j].kind != tNewline {
			return cf.is(toks[j], "+")
		}
	}
	return false
}

// open returns the frame a bracket opens.
func (cf *codeFinder) open(toks []token, i int, parent *frame) frame {
	c := cf.text(toks[i])[0]
	cf.frames++
	nf := frame{open: c, id: cf.frames, parent: parent.id, base: parent.wants(), noGuess: parent.noGuessHere(), collection: true}
	nf.nested = parent.collection
	prev := i - 1
	if prev < 0 {
		return nf
	}
	pt := toks[prev]
	switch c {
	case '(':
		if pt.kind != tIdent {
			break
		}
		name := cf.textS(pt)
		if name == "for" {
			nf.forHead, nf.base, nf.collection = true, wants{}, false
			break
		}
		if keywords[name] && !(prev >= 1 && cf.is(toks[prev-1], ".")) {
			break // a keyword, not a method of that name (re.match)
		}
		receiver := ""
		if prev >= 2 && cf.is(toks[prev-1], ".") && toks[prev-2].kind == tIdent {
			receiver = cf.textS(toks[prev-2])
		}
		w, about := cf.nm.call(name, receiver)
		nf.callee, nf.collection, nf.nested = name, false, false
		switch {
		case w.named():
			nf.base = w
		case passThrough[name]:
			// smiles = list("CCO"), smiles_list.append("CCO"): what the
			// receiver or the target holds.
			nf.base = merge(parent.wants(), parent.seg)
			nf.callee = ""
			nf.collection = true
		default:
			nf.base = wants{}
		}
		// a call inside the arguments of one that takes no notation
		// (re.match(u(r'[19K]')), open(join(d, 'C1.smi'))) takes none
		// by guess either
		nf.noGuess = about || parent.noGuessHere()
	case '[':
		if pt.kind == tIdent && !keywords[cf.textS(pt)] || pt.kind == tString || cf.is(pt, ")") || cf.is(pt, "]") {
			nf.subscript, nf.base, nf.collection, nf.nested = true, wants{}, false, false
		}
	}
	return nf
}

// groupKey names the literals a literal must agree with: the same
// argument of every call of one function (AcidBasePair(name, acid,
// base) throughout a file), the same position in the tuples of one
// collection ({34: ('[CH2]=*', 0), ...}), or the elements of one list.
// The zero key is no group (the top level).
type groupKey struct {
	kind   byte // 'c' call argument, 't' tuple position, 'l' list
	callee string
	id     int
	arg    int
}

// currentGroup stands in a groupMark for the group of the literal being
// decided, before it is interned.
const currentGroup = -1

// resolve interns the group of a mark that stands for the current
// literal's.
func (cf *codeFinder) resolve(m groupMark) groupMark {
	if m.key == currentGroup {
		m.key = cf.intern(cf.curKey)
	}
	return m
}

// intern returns the number of a group key, 0 for no group.
func (cf *codeFinder) intern(k groupKey) int32 {
	if k == (groupKey{}) {
		return 0
	}
	if cf.keys == nil {
		cf.keys = map[groupKey]int32{}
	}
	n, ok := cf.keys[k]
	if !ok {
		n = int32(len(cf.keys) + 1)
		cf.keys[k] = n
	}
	return n
}

// group returns the group key of a literal in frame f.
func group(f *frame) groupKey {
	switch {
	case f.callee != "":
		return groupKey{kind: 'c', callee: f.callee, arg: f.arg}
	case f.nested:
		return groupKey{kind: 't', id: f.parent, arg: f.arg}
	case f.collection:
		return groupKey{kind: 'l', id: f.id}
	}
	return groupKey{}
}

// agree makes the literals of each group agree: when one of them is a
// query pattern by its content, the others that read as query patterns
// are query patterns too (and taken, if nothing else took them), except
// where their place fixes the dialect. Occurrences stay in host order.
func (cf *codeFinder) agree() {
	query, taken, guessed := map[int32]bool{}, map[int32]bool{}, map[int32]bool{}
	for i := range cf.out {
		o := &cf.out[i]
		g := &o.group
		if g.key != 0 && g.byContent && o.Dialect == DialectSMARTS {
			query[g.key] = true
		}
		if g.key != 0 {
			taken[g.key] = true
		}
		if g.key != 0 && o.Reason == ReasonGuess && o.Dialect == DialectSMILES {
			guessed[g.key] = true
		}
	}
	if len(query) == 0 && !cf.words(taken) && !cf.siblings(guessed) {
		return
	}
	for i := range cf.out {
		o := &cf.out[i]
		g := &o.group
		if query[g.key] && !g.firm && o.Dialect == DialectSMILES && readsAsQuery(o.Text) {
			o.Dialect = DialectSMARTS
		}
	}
	added := false
	for _, p := range cf.pending {
		if p.sibling {
			if guessed[p.mark.key] && !query[p.mark.key] {
				m := p.m
				cf.emit(p.lit, p.d, &m, p.from, p.to, "", ReasonGuess, DialectSMILES, p.mark)
				added = true
			}
			continue
		}
		if p.word {
			if taken[p.mark.key] {
				m := p.m
				cf.emit(p.lit, p.d, &m, p.from, p.to, "", ReasonName, p.dialect, p.mark)
				added = true
			}
			continue
		}
		if query[p.mark.key] {
			m := p.m
			cf.emit(p.lit, p.d, &m, p.from, p.to, "", ReasonGuess, DialectSMARTS, p.mark)
			added = true
		}
	}
	if added {
		sort.SliceStable(cf.out, func(a, b int) bool { return cf.out[a].Span.Start < cf.out[b].Span.Start })
	}
}

// siblings reports whether a sibling kept for agree has a group in
// guessed.
func (cf *codeFinder) siblings(guessed map[int32]bool) bool {
	for _, p := range cf.pending {
		if p.sibling && guessed[p.mark.key] {
			return true
		}
	}
	return false
}

// words reports whether a word kept for agree has a group in taken.
func (cf *codeFinder) words(taken map[int32]bool) bool {
	for _, p := range cf.pending {
		if p.word && taken[p.mark.key] {
			return true
		}
	}
	return false
}

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

// literal decides about one string literal in frame f and records what
// it yields.
func (cf *codeFinder) literal(t token, f *frame) {
	lit := t.lit
	if lit.skip || !cf.prag.allowed(t.span.Start) {
		return
	}
	w := f.wants()
	noGuess := f.noGuessHere() || cf.cfg.NoGuess
	reason := ReasonName
	if cf.prag.forced(t.span.Start) {
		w, reason = wants{smiles: firmly}, ReasonPragma
	}
	// The group is interned only when the literal yields something.
	cf.curKey = group(f)
	if cf.curKey != (groupKey{}) && w.loose && w.named() {
		if cf.literals == nil {
			cf.literals = map[groupKey]int{}
		}
		cf.literals[cf.curKey]++
	}
	mark := groupMark{firm: w.smiles == firmly || w.smarts == firmly, loose: w.loose && w.named() && reason == ReasonName}
	if cf.curKey != (groupKey{}) {
		mark.key = currentGroup
	}
	if !w.named() && !noGuess {
		w.guess = true
	}
	if lit.template() {
		cf.templateLiteral(lit, w, reason, mark)
		return
	}
	if !w.named() && !noGuess && cf.lang.kind == KindPython && !cf.inner && docString(cf.src, lit) {
		cf.doctest(lit)
		return
	}
	pend := mark.key != 0 && !noGuess && mayKeep(cf.src, lit)
	if !w.named() && (!w.guess || !mayGuess(cf.src, lit)) && !pend {
		return
	}
	d := &decoded{}
	m := cf.decode(lit, d)
	text := string(d.text)
	if pend && !w.named() && (!w.guess || !mayGuess(cf.src, lit)) {
		cf.keep(lit, d, m, text, mark, false)
		return
	}
	if w.named() && strings.IndexByte(text, '\n') >= 0 {
		cf.records(lit, d, &m, text, w, reason, mark)
		return
	}
	if reason == ReasonPragma {
		if text != "" {
			dia := DialectSMILES
			if queryContent(text) {
				dia = DialectSMARTS
			}
			cf.emit(lit, d, &m, 0, len(text), "", reason, dia, mark)
		}
		return
	}
	if !w.named() {
		reason = ReasonGuess
		if hostChanges(d) && !strings.Contains(text, "=") {
			// Nobody names the text, and it reads as notation only with
			// a backslash the language turns into something else
			// ("A!\n" is a line of text): a direction mark, the one mark
			// written with a backslash, needs a double bond to mean
			// anything, so without one the text is no record.
			w.guess = false
		}
	}
	rs := decideInto(cf.rs[:0], text, w)
	cf.rs = rs
	title := ""
	if reason == ReasonGuess && len(rs) == 1 && f.key != "" && labelKey(f.key) {
		// the key of a dict entry labels a record nobody names
		// ({"naproxen": "COc1ccc2cc([C@H](C)C(=O)O)ccc2c1"})
		title = f.key
	}
	for _, r := range rs {
		mk := mark
		mk.byContent = r.byContent
		cf.emit(lit, d, &m, r.from, r.to, title, reason, r.dialect, mk)
	}
	if len(rs) == 0 && mark.key != 0 && len(lit.pieces) == 1 && len(d.issues) == 0 {
		if dia, ok := looseWord(text, w); ok {
			kept := new(decoded)
			*kept = *d
			cf.pending = append(cf.pending, pendingLiteral{lit: lit, d: kept, m: m, from: 0, to: len(text), mark: cf.resolve(mark), word: true, dialect: dia})
			return
		}
	}
	if len(rs) == 0 && pend {
		cf.keep(lit, d, m, text, mark, !w.named() && w.guess)
	}
}

// hostChanges reports whether the language reads an escape of a decoded
// literal as something else than its bytes (an error-severity issue: a
// control character, a code point, a dropped backslash), as opposed to
// keeping it with a warning.
func hostChanges(d *decoded) bool {
	for _, is := range d.issues {
		if is.sev == notation.SeverityError {
			return true
		}
	}
	return false
}

// mayKeep is the quick test on the host bytes of a literal of a group,
// before it is decoded, for keep: one piece of notation bytes with
// something a word does not have (a bracket, bond, digit or wildcard).
// Most literals of lists and calls (names, messages, keys) fail here.
func mayKeep(src []byte, lit *literal) bool {
	if len(lit.pieces) != 1 {
		return false
	}
	c := lit.pieces[0].content
	if c.Len() < 2 || c.Len() > 4096 {
		return false
	}
	shaped := false
	for _, b := range src[c.Start:c.End] {
		if !notationByte[b] {
			return false
		}
		if !(b >= 'a' && b <= 'z' || b >= 'A' && b <= 'Z') {
			shaped = true
		}
	}
	return shaped
}

// keep holds a literal nothing took for agree, when it could be a query
// pattern of its group, or, guessing, a record beside one that is
// unmistakably notation.
func (cf *codeFinder) keep(lit *literal, d *decoded, m offsetMap, text string, mark groupMark, guessing bool) {
	if len(lit.pieces) != 1 || len(d.issues) > 0 {
		return
	}
	// Not taken as notation, a query pattern of a group has a bracket
	// atom, an aromatic atom, a wildcard or a bond query ('c[SH]',
	// '[CH2]=*'), and no range of characters ('[b-d]'); anything else is
	// not worth reading.
	if !strings.ContainsAny(text, "[*~@cnos") || characterRange(text) {
		if guessing && siblingRecord(text) {
			kept := new(decoded)
			*kept = *d
			cf.pending = append(cf.pending, pendingLiteral{lit: lit, d: kept, m: m, from: 0, to: len(text), mark: cf.resolve(mark), sibling: true})
		}
		return
	}
	parts := [][2]int{{0, len(text)}}
	if strings.ContainsAny(text, ",; ") {
		// "[o:1],[s:1]": patterns one by one.
		parts = splitParts(text)
	}
	for _, p := range parts {
		if s := text[p[0]:p[1]]; !plausible(s) || !readsAsQuery(s) {
			return
		}
	}
	kept := new(decoded)
	*kept = *d
	for _, p := range parts {
		cf.pending = append(cf.pending, pendingLiteral{lit: lit, d: kept, m: m, from: p[0], to: p[1], mark: cf.resolve(mark)})
	}
}

// siblingRecordText reports whether a literal nobody names could be a record
// of a list that holds unmistakable notation: one record that reads
// without error, with something besides letters ("CC(=O)O", "CCN(CC)CC";
// not "CCO", "NO" or "a=b", which are words as often).
func siblingRecordText(s string) bool {
	return len(s) >= 3 && plausible(s) && !strings.ContainsAny(s, " \t,;") && !accidentalWord(s) &&
		!keyValueWords(s) && readsAsNotation(s)
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
	b := src[c.Start:c.End]
	// A CXSMILES extension block after blanks belongs to the record
	// ("C[C@H](O)CC |&1:1|"): the notation before it is looked at, and
	// the whole is read later.
	if n, end := notation.RecordEnd(b); end == len(b) && end > n {
		b = b[:n]
	}
	// Blanks may separate records ("CC(=O)O C[C@@H](O)CC".split()):
	// decide splits the text and takes it only when every part is one.
	for _, c := range b {
		if !notationByte[c] && c != ' ' && c != '\t' {
			return false
		}
	}
	return true
}

// records takes a named multi-line literal as a record list, laid out
// as a list file would be (layout.go), each record a word-checked record
// of a weak place: a molfile or reaction file held in the string
// (V2000, V3000, M  END, $RXN) is no list at all.
func (cf *codeFinder) records(lit *literal, d *decoded, m *offsetMap, text string, w wants, reason Reason, mark groupMark) {
	if molfileLike(d.text) {
		return
	}
	lines := d.text
	if lit.margin != "" {
		lines = stripMargin(d.text, lit.margin)
	}
	// The common layout first (notation, then a title); the layout is
	// read from the content only when it leaves most lines without a
	// record, which keeps the cost of the usual block at one reading of
	// each record.
	recs, lines0 := cf.layoutRecords(lines, text, defaultLayout, w, reason)
	if len(recs)*2 < lines0 {
		v := detectLayout(lines, 0, layoutSpec{}, cf.nm, cf.cfg)
		if v.none {
			return
		}
		if v.layout != defaultLayout {
			recs, _ = cf.layoutRecords(lines, text, v.layout, w, reason)
		}
	}
	for _, r := range recs {
		if !cf.prag.allowed(m.host(r.from)) {
			continue
		}
		mk := mark
		mk.byContent = r.byContent
		cf.emit(lit, d, m, r.from, r.to, r.title, reason, r.dialect, mk)
	}
}

// litRecord is a record found in a multi-line literal.
type litRecord struct {
	found
	title string
}

// layoutRecords reads the lines of a literal by a layout, each record
// decided as a weakly named text; lines counts the lines that are not
// blank or comments.
func (cf *codeFinder) layoutRecords(lines []byte, text string, lay Layout, w wants, reason Reason) (out []litRecord, n int) {
	first := true
	linesText := wholeText(lines)
	var fields []fieldSpan
	for start := 0; start < len(lines); {
		line, next := nextLine(lines, start)
		ls := start
		start = next
		for len(line) > 0 && (line[0] == ' ' || line[0] == '\t') {
			line, ls = line[1:], ls+1
		}
		if len(line) == 0 || line[0] == '\r' || isComment(line) {
			continue
		}
		n++
		if first {
			first = false
			if lay.Header {
				continue
			}
		}
		var o Occurrence
		var ok bool
		fields, ok = layoutRecord(&o, &linesText, lines, ls, ls+len(line), lay, fields)
		if !ok {
			continue
		}
		from, to := o.Span.Start, o.Span.End
		title := o.Title
		if strings.IndexByte(title, holeByte) >= 0 {
			// A title with a replacement field is not known before the
			// program runs.
			title = ""
		}
		rs := decide(text[from:to], wants{smiles: max(w.smiles, weakly), smarts: w.smarts, loose: w.loose})
		if reason == ReasonPragma && len(rs) == 0 && plausible(text[from:to]) {
			rs = []found{{from: 0, to: to - from}}
		}
		if len(rs) != 1 {
			continue
		}
		rs[0].from, rs[0].to = from, to
		out = append(out, litRecord{found: rs[0], title: title})
	}
	return out, n
}

// stripMargin blanks out the trimMargin() prefix of each line (Kotlin),
// keeping offsets.
func stripMargin(text []byte, margin string) []byte {
	out := append([]byte(nil), text...)
	for start := 0; start < len(out); {
		line, next := nextLine(out, start)
		k := 0
		for k < len(line) && (line[k] == ' ' || line[k] == '\t') {
			k++
		}
		if bytes.HasPrefix(line[k:], []byte(margin)) {
			for j := 0; j < len(margin); j++ {
				out[start+k+j] = ' '
			}
		}
		start = next
	}
	return out
}

// molfileLike reports whether a text is a molfile, SD record or reaction
// file rather than a list of records.
func molfileLike(b []byte) bool {
	return bytes.Contains(b, []byte("V2000")) || bytes.Contains(b, []byte("V3000")) ||
		bytes.Contains(b, []byte("M  END")) || bytes.HasPrefix(bytes.TrimLeft(b, " \t\r\n"), []byte("$RXN"))
}

// emit records the notation bytes [from, to) of a decoded literal.
func (cf *codeFinder) emit(lit *literal, d *decoded, m *offsetMap, from, to int, title string, reason Reason, dialect Dialect, mark groupMark) {
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
		Dialect:   dialect,
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
	o.group = cf.resolve(mark)
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

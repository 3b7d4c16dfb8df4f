package notation

import (
	"fmt"
	"strings"
	"sync"
	"unicode/utf8"
)

// maxErrors bounds the error list of one record so that a megabyte of
// garbage costs a bounded amount of memory. The last entry says that the
// rest was dropped.
const maxErrors = 200

// Read parses one notation string (a molecule or a reaction, without its
// title) and returns the best molecule it could build. Reading never
// fails: every problem is in the returned molecule's Errors, sorted by
// position.
//
// The reader is a single loop over the bytes with an explicit branch
// stack, so nesting depth costs heap, not Go stack, and the work is linear
// in the length of the text.
//
// A CXSMILES extension block after the notation and whitespace
// ("C[C@H](O)CC |&1:1|") is read into m.Extension (extension_read.go);
// its atom indices count the atoms of the whole record in the order they
// are written. Text without a block is read as before, blanks included
// (they are errors).
func Read(text string) *Molecule {
	notationEnd, end := RecordEnd(text)
	src := text
	if end > notationEnd {
		src = text[:notationEnd]
	}
	return readWhole(newReader(src, text), text, notationEnd, end)
}

// readWhole reads the record text with r, a reader of its notation
// (text[:notationEnd]), and returns the molecule.
func readWhole(r *reader, text string, notationEnd, end int) *Molecule {
	r.read()
	finish(r.mol)
	if end > notationEnd {
		open := notationEnd
		for text[open] != '|' {
			open++
		}
		readExtension(r.mol, r.dropped, notationEnd, open)
	}
	r.mol.Errors.Sort()
	if len(r.mol.Errors) > maxErrors+1 {
		r.mol.Errors = r.mol.Errors[:maxErrors+1]
	}
	return r.mol
}

// newReader starts reading src, the notation of record text.
func newReader(src, text string) *reader {
	r := &reader{text: src, mol: &Molecule{Text: text}, prev: -1, rings: map[int]openRing{}}
	atoms, rings := countTokens(src)
	r.mol.Atoms = make([]Atom, 0, atoms)
	r.mol.Bonds = make([]Bond, 0, atoms+rings)
	return r
}

// Reads reports whether text reads without an error (warnings allowed)
// and with at least one atom, as Read's result would say, at less cost
// for text that does not read: once the text itself gave an error, what
// Read does after it (Kekulé structure, hydrogens, valences) is skipped.
// That work only adds errors, at most three for each atom, so the error
// stays in the list as long as the list cannot reach maxErrors; a record
// with an extension block is read whole.
func Reads(text string) bool { return ReadIfReads(text) != nil }

// ReadIfReads returns what Read returns for text that Reads accepts, and
// nil for other text, at Reads' lower cost for text that does not read:
// for a caller that wants the molecule of text that may well be no
// notation at all (a guess at a string nobody names).
func ReadIfReads(text string) *Molecule {
	if notationEnd, end := RecordEnd(text); end == notationEnd {
		r := quietReader(text)
		r.read()
		failed := r.mol.Errors.HasErrors() && len(r.mol.Errors)+3*len(r.mol.Atoms) <= maxErrors
		if cap(r.mol.Atoms) <= quietKeep {
			quietReaders.Put(r)
		}
		if failed {
			return nil
		}
	}
	m := Read(text)
	if m.Errors.HasErrors() || len(m.Atoms) == 0 {
		return nil
	}
	return m
}

// quietReaders keeps the readers of Reads, whose molecules never leave
// it, for the next call: the finder asks it of every title of a list.
// A reader whose molecule grew past quietKeep atoms is not kept.
var quietReaders = sync.Pool{New: func() any { return &reader{mol: &Molecule{}, rings: map[int]openRing{}} }}

const quietKeep = 4096

// quietReader returns a reader of Reads for text, from the pool, its
// state as newReader leaves it.
func quietReader(text string) *reader {
	r := quietReaders.Get().(*reader)
	reuseReader(r, text, text, true)
	return r
}

// A Rereader reads records one after another into the same storage: the
// molecule its Read returns, and everything in it, is valid until the
// next call, which overwrites it. It is for callers done with a record
// before they read the next (describe prints a record and forgets it),
// and spares them the allocation of every record's atoms, bonds and bond
// lists. The zero Rereader is ready to use; it is not safe for
// concurrent use.
type Rereader struct{ r *reader }

// ReadWith is the package's ReadWith into the Rereader's storage.
func (rr *Rereader) ReadWith(text string, reading Reading) *Molecule {
	notationEnd, end := RecordEnd(text)
	src := text
	if end > notationEnd {
		src = text[:notationEnd]
	}
	r := rr.r
	if r == nil || cap(r.mol.Atoms) > quietKeep {
		// the first record, or storage grown past quietKeep atoms by a
		// large one, which is not kept
		r = newReader(src, text)
		rr.r = r
	} else {
		reuseReader(r, src, text, false)
	}
	m := readWhole(r, text, notationEnd, end)
	m.Reading = reading
	return m
}

// reuseReader resets r, with its molecule's storage, to read src, the
// notation of record text, as newReader leaves a reader (quiet for
// Reads).
func reuseReader(r *reader, src, text string, quiet bool) {
	m := r.mol
	atoms, rings := countTokens(src)
	as, bs := m.Atoms[:0], m.Bonds[:0]
	if cap(as) < atoms {
		as = make([]Atom, 0, atoms)
	}
	if cap(bs) < atoms+rings {
		bs = make([]Bond, 0, atoms+rings)
	}
	*m = Molecule{Text: text, Atoms: as, Bonds: bs, Errors: m.Errors[:0], ringBonds: m.ringBonds[:0]}
	rs := r.rings
	clear(rs)
	*r = reader{text: src, mol: m, prev: -1, rings: rs, stack: r.stack[:0], quiet: quiet,
		slots: r.slotsAll, slotsAll: r.slotsAll, quietErrs: r.quietErrs[:0]}
}

// countTokens bounds the number of atoms (capital letters, aromatic
// letters and '*') and ring closures (digits) in text, so the slices are
// allocated once at about the right size.
func countTokens(text string) (atoms, rings int) {
	for i := 0; i < len(text); i++ {
		switch c := text[i]; {
		case c >= 'A' && c <= 'Z', c == '*', c == 'c', c == 'n', c == 'o', c == 's', c == 'p', c == 'b':
			atoms++
		case c >= '0' && c <= '9':
			rings++
		}
	}
	return atoms + 1, rings/2 + 1
}

// CountAtoms counts the atoms of a record's notation without reading
// it: the bracket atoms, the organic-subset atoms and '*' outside
// brackets, up to the extension block. It is exact for a record that
// reads without error and cheap on any text, so a caller can refuse to
// read a record too large to analyse in its time (stereo/document's
// recordAtoms limit).
func CountAtoms(text string) int {
	notationEnd, end := RecordEnd(text)
	if end > notationEnd {
		text = text[:notationEnd]
	}
	n := 0
	for i := 0; i < len(text); i++ {
		c := text[i]
		switch {
		case c == '[':
			n++
			for i+1 < len(text) && text[i+1] != ']' {
				i++
			}
		case isOrganicStart(c):
			n++
		}
	}
	return n
}

// reader is the state of one Read.
type reader struct {
	text string
	pos  int
	mol  *Molecule

	prev    int      // atom the next atom bonds to, or -1
	bond    byte     // pending bond symbol, 0 when none
	bondPos int      // where the pending bond symbol is
	stack   []branch // open branches
	rings   map[int]openRing
	role    Role
	arrows  int
	dropped bool // errors were dropped past maxErrors

	afterBranch bool // a branch was just closed: ring digits may not follow

	// quiet leaves the messages of errors unwritten (Reads, which only
	// asks whether there is one). slotsAll is the whole of the last slots
	// array, which the next record of a reused reader (Reads, Rereader)
	// starts again from.
	quiet    bool
	slotsAll []int
	// quietErrs holds the errors of a quiet reader, whose molecule never
	// leaves it: the next record overwrites them instead of allocating
	// its own. An append that moves the array leaves the errors listed
	// so far where they were, each still one error.
	quietErrs []Error

	// openDot is the offset plus one of a '.' that no atom has followed yet,
	// 0 when there is none: a component left empty at the end of the
	// record, of a reaction role or of a branch.
	openDot int

	// pairs holds the bonded atom pairs once a ring closure joins two
	// atoms with many bonds each; nil until then (see bonded).
	pairs map[uint64]struct{}

	// slots is the storage the atoms' bond lists start in, bondSlots
	// entries each, carved from one array sized by countTokens: a
	// million-atom record then makes one allocation for its bond lists
	// instead of two per atom. A list that outgrows its window moves
	// out on its own (the windows are capped).
	slots []int
}

// bondSlots is the room each atom's bond list starts with: four bonds,
// which most atoms do not outgrow.
const bondSlots = 4

// bondList returns an empty bond list with room for bondSlots bonds.
func (r *reader) bondList() []int {
	if len(r.slots) < bondSlots {
		r.slots = make([]int, bondSlots*max(16, cap(r.mol.Atoms)-len(r.mol.Atoms)))
		r.slotsAll = r.slots // where a reused reader starts again
	}
	s := r.slots[:0:bondSlots]
	r.slots = r.slots[bondSlots:]
	return s
}

// branch is an open '(' with the atom it hangs from.
type branch struct {
	atom  int
	pos   int
	atoms int // the atoms read before it opened
}

// openRing is a ring-closure digit waiting for its partner.
type openRing struct {
	atom    int
	slot    int  // index in the atom's Bonds reserved for the closure
	symbol  byte // bond symbol before the digit, or 0
	span    Span // symbol and digits
	symSpan Span
}

func (r *reader) errorf(span Span, code Code, format string, args ...any) *Error {
	if len(r.mol.Errors) >= maxErrors {
		if !r.dropped {
			r.dropped = true
			r.mol.Errors.Add(span, CodeSyntax, "too many errors; the rest of the record is not reported")
		}
		return &Error{}
	}
	if r.quiet {
		r.quietErrs = append(r.quietErrs, Error{Span: span, Code: code, Severity: SeverityError})
		e := &r.quietErrs[len(r.quietErrs)-1]
		r.mol.Errors = append(r.mol.Errors, e)
		return e
	}
	return r.mol.Errors.Add(span, code, format, args...)
}

// found describes the byte at pos for messages: "'x'" or "end of text".
func (r *reader) found(pos int) string { return describeAt(r.text, pos) }

// describeAt describes the character at pos of text for messages.
func describeAt(text string, pos int) string {
	if pos >= len(text) {
		return "end of text"
	}
	c, _ := utf8.DecodeRuneInString(text[pos:])
	return quoteRune(c)
}

func quoteRune(c rune) string {
	switch {
	case c == utf8.RuneError:
		return "an invalid byte"
	case c < 0x20 || c == 0x7f:
		return fmt.Sprintf("control character U+%04X", c)
	case c == ' ':
		return "a space"
	case c == '\'':
		return `"'"`
	}
	return "'" + string(c) + "'"
}

func (r *reader) read() {
	if r.hasArrow() {
		r.mol.Reaction = true
		r.role = RoleReactant
	}
	if len(r.text) == 0 {
		r.errorf(Span{0, 0}, CodeEmpty, "expected an atom, found end of text")
		return
	}
	for r.pos < len(r.text) {
		c := r.text[r.pos]
		switch {
		case c == '[':
			r.atom(r.bracketAtom())
		case isOrganicStart(c):
			r.atom(r.organicAtom())
		case c == '(':
			r.openBranch()
		case c == ')':
			r.closeBranch()
		case isBondSymbol(c):
			r.bondSymbol()
		case c >= '0' && c <= '9' || c == '%':
			r.ringBond()
		case c == '.':
			r.dot()
		case c == '>':
			r.arrow()
		default:
			r.unexpected()
		}
	}
	r.endPart(len(r.text))
}

// hasArrow reports whether the text has a '>' outside brackets.
func (r *reader) hasArrow() bool {
	inBracket := false
	for i := 0; i < len(r.text); i++ {
		switch r.text[i] {
		case '[':
			inBracket = true
		case ']':
			inBracket = false
		case '>':
			if !inBracket {
				return true
			}
		}
	}
	return false
}

func (r *reader) unexpected() {
	c, size := utf8.DecodeRuneInString(r.text[r.pos:])
	span := Span{r.pos, r.pos + size}
	switch {
	case c == utf8.RuneError && size <= 1:
		r.errorf(span, CodeEncoding, "expected text in UTF-8, found an invalid byte")
	case c < 0x20 || c == 0x7f:
		r.errorf(span, CodeEncoding, "expected an atom or bond, found %s", quoteRune(c))
	case c == ']':
		r.errorf(span, CodeSyntax, "expected an atom or bond, found ']' without '['")
	case c >= 'A' && c <= 'Z' || c >= 'a' && c <= 'z':
		r.letters(span)
		return
	default:
		r.errorf(span, CodeSyntax, "expected an atom or bond, found %s", quoteRune(c))
	}
	r.pos += size
}

// letters reports a symbol that is not in the organic subset, saying
// whether it names an element that needs brackets.
func (r *reader) letters(span Span) {
	end := span.End
	if end < len(r.text) && r.text[end] >= 'a' && r.text[end] <= 'z' {
		end++
	}
	sym := r.text[span.Start:end]
	if _, ok := ElementNumber(sym); ok {
		r.errorf(Span{span.Start, end}, CodeSyntax, "expected an organic-subset atom, found '%s' (write it in brackets: [%s])", sym, sym)
		r.pos = end
		return
	}
	if _, ok := ElementNumber(sym[:1]); ok && len(sym) == 1 {
		r.errorf(span, CodeSyntax, "expected an organic-subset atom, found '%s' (write it in brackets: [%s])", sym, sym)
	} else {
		r.errorf(span, CodeUnknownElement, "expected an element symbol, found '%s'", r.text[span.Start:span.End])
	}
	r.pos = span.End
}

// atom links a freshly read atom into the graph. A negative index means
// the token was unreadable and nothing was added.
func (r *reader) atom(idx int) {
	if idx < 0 {
		return
	}
	m := r.mol
	a := &m.Atoms[idx]
	a.Role = r.role
	a.Component = m.Components
	if r.prev >= 0 {
		r.addBond(r.prev, idx, r.bond, r.bondSpan(a.Span.Start))
		a.HasPrev = true
	} else if r.bond != 0 {
		r.errorf(Span{r.bondPos, r.bondPos + 1}, CodeSyntax, "expected an atom before bond '%c'", r.bond)
	}
	if r.prev < 0 {
		m.Components++
	}
	a.Component = m.Components - 1
	r.bond = 0
	r.prev = idx
	r.afterBranch = false
	r.openDot = 0
}

func (r *reader) bondSpan(next int) Span {
	if r.bond == 0 {
		return Span{next, next}
	}
	return Span{r.bondPos, r.bondPos + 1}
}

// addBond appends a chain or branch bond from atom a (written first) to
// atom b.
func (r *reader) addBond(a, b int, sym byte, span Span) int {
	m := r.mol
	bd := Bond{Begin: a, End: b, Written: sym, Span: span}
	bd.Order, bd.Dir = orderOf(sym, m.Atoms[a].Aromatic && m.Atoms[b].Aromatic)
	m.Bonds = append(m.Bonds, bd)
	bi := len(m.Bonds) - 1
	if r.pairs != nil {
		r.pairs[pairKey(a, b)] = struct{}{}
	}
	m.Atoms[a].Bonds = append(m.Atoms[a].Bonds, bi)
	m.Atoms[b].Bonds = append(m.Atoms[b].Bonds, bi)
	return bi
}

// orderOf maps a bond symbol to its order and direction; sym 0 is an
// implied bond, aromatic between two aromatic atoms (OpenSMILES 3.3).
func orderOf(sym byte, bothAromatic bool) (BondOrder, Direction) {
	switch sym {
	case '-':
		return OrderSingle, DirNone
	case '=':
		return OrderDouble, DirNone
	case '#':
		return OrderTriple, DirNone
	case '$':
		return OrderQuadruple, DirNone
	case ':':
		return OrderAromatic, DirNone
	case '/':
		return OrderSingle, DirUp
	case '\\':
		return OrderSingle, DirDown
	}
	if bothAromatic {
		return OrderAromatic, DirNone
	}
	return OrderSingle, DirNone
}

func isBondSymbol(c byte) bool {
	switch c {
	case '-', '=', '#', '$', ':', '/', '\\':
		return true
	}
	return false
}

func (r *reader) bondSymbol() {
	if r.bond != 0 {
		r.errorf(Span{r.pos, r.pos + 1}, CodeSyntax, "expected an atom after bond '%c', found '%c'", r.bond, r.text[r.pos])
	}
	if r.prev < 0 {
		r.errorf(Span{r.pos, r.pos + 1}, CodeSyntax, "expected an atom before bond '%c'", r.text[r.pos])
		r.openDot = 0 // this error says what is missing after a '.'
		r.pos++
		return
	}
	r.bond = r.text[r.pos]
	r.bondPos = r.pos
	r.pos++
}

// pendingBondError reports a bond symbol left without an atom after it.
func (r *reader) pendingBondError() {
	if r.bond != 0 {
		r.errorf(Span{r.bondPos, r.bondPos + 1}, CodeSyntax, "expected an atom after bond '%c', found %s", r.bond, r.found(r.pos))
		r.bond = 0
	}
}

func (r *reader) openBranch() {
	start := r.pos
	r.pos++
	if r.prev < 0 {
		r.errorf(Span{start, start + 1}, CodeSyntax, "expected an atom before '('")
	}
	if r.bond != 0 {
		r.errorf(Span{r.bondPos, r.bondPos + 1}, CodeSyntax, "expected an atom after bond '%c', found '('", r.bond)
		r.bond = 0
	}
	r.stack = append(r.stack, branch{atom: r.prev, pos: start, atoms: len(r.mol.Atoms)})
	if r.pos < len(r.text) && r.text[r.pos] == ')' {
		r.errorf(Span{start, r.pos + 1}, CodeSyntax, "expected an atom or bond after '(', found ')'")
	}
}

func (r *reader) closeBranch() {
	span := Span{r.pos, r.pos + 1}
	r.emptyAfterDot(r.pos)
	r.pos++
	r.pendingBondError()
	if len(r.stack) == 0 {
		r.errorf(span, CodeSyntax, "expected an atom or bond, found ')' without '('")
		return
	}
	top := r.stack[len(r.stack)-1]
	r.stack = r.stack[:len(r.stack)-1]
	if inner := r.text[top.pos+1 : span.Start]; len(r.mol.Atoms) == top.atoms && ringClosuresOnly(inner) {
		// "C(1)CC1": OpenSMILES wants a chain in a branch; readers part
		// here (RDKit 2022.09.3 rejects it, Open Babel 3.1.1 bonds the
		// digits to the atom before the branch, as this reader does).
		// An empty "()" was reported where it opened.
		e := r.errorf(Span{top.pos, span.End}, CodeBranchWithoutAtom, "expected an atom in the branch, found only the ring closure %s (outside the OpenSMILES grammar; some readers reject it, others read it as a ring bond of the atom before the branch, as here)", inner)
		e.Severity = SeverityWarning
	}
	r.prev = top.atom
	r.afterBranch = true
}

// ringClosuresOnly reports whether s is ring-closure digits alone, each
// with its bond symbol if any ("1", "=1%12"): a branch of nothing else
// read without error but no atom.
func ringClosuresOnly(s string) bool {
	digit := false
	for i := 0; i < len(s); i++ {
		switch c := s[i]; {
		case c >= '0' && c <= '9':
			digit = true
		case strings.IndexByte("%-=#$:/\\", c) < 0:
			return false
		}
	}
	return digit
}

func (r *reader) dot() {
	span := Span{r.pos, r.pos + 1}
	r.pos++
	r.pendingBondError()
	if r.prev < 0 && len(r.stack) == 0 {
		// a dot at the start of a part or after another dot: the
		// component before it is empty, reported once here
		r.openDot = 0
		r.errorf(span, CodeEmpty, "expected an atom before '.'")
	} else {
		r.openDot = span.Start + 1
	}
	r.prev = -1
}

// emptyAfterDot reports a '.' that nothing but the end of a part, a ')'
// or another '.' followed (OpenSMILES 3.7: a dot separates two
// components, each with atoms). The caller is at offset at.
func (r *reader) emptyAfterDot(at int) {
	if r.openDot == 0 {
		return
	}
	d := r.openDot - 1
	r.openDot = 0
	r.errorf(Span{d, d + 1}, CodeEmpty, "expected an atom after '.', found %s", r.found(at))
}

func (r *reader) arrow() {
	span := Span{r.pos, r.pos + 1}
	r.pos++
	r.endPart(span.Start)
	r.arrows++
	r.mol.Arrows = append(r.mol.Arrows, span)
	switch r.arrows {
	case 1:
		r.role = RoleAgent
	case 2:
		r.role = RoleProduct
	default:
		r.errorf(span, CodeReaction, "expected two '>' in a reaction, found a third")
	}
	r.prev = -1
}

// endPart closes everything still open at the end of the text or of a
// reaction part.
func (r *reader) endPart(at int) {
	r.pendingBondError()
	r.emptyAfterDot(at)
	for i := len(r.stack) - 1; i >= 0; i-- {
		b := r.stack[i]
		r.errorf(Span{b.pos, b.pos + 1}, CodeSyntax, "expected ')' to close this branch, found %s", r.found(at))
	}
	r.stack = r.stack[:0]
	r.closeOpenRings()
	if at == len(r.text) && r.mol.Reaction && r.arrows < 2 {
		span := Span{at, at}
		if len(r.mol.Arrows) > 0 {
			span = r.mol.Arrows[0]
		}
		r.errorf(span, CodeReaction, "expected two '>' in a reaction, found one")
	}
}

func isOrganicStart(c byte) bool {
	switch c {
	case 'B', 'C', 'N', 'O', 'P', 'S', 'F', 'I', '*', 'b', 'c', 'n', 'o', 'p', 's':
		return true
	}
	return false
}

// organicAtom reads an atom of the organic subset (OpenSMILES 3.1.5).
func (r *reader) organicAtom() int {
	start := r.pos
	c := r.text[r.pos]
	sym := r.text[r.pos : r.pos+1] // a window of the text: no allocation per atom
	if c == 'C' && r.pos+1 < len(r.text) && r.text[r.pos+1] == 'l' {
		sym = "Cl"
	} else if c == 'B' && r.pos+1 < len(r.text) && r.text[r.pos+1] == 'r' {
		sym = "Br"
	}
	if len(sym) == 1 && r.pos+1 < len(r.text) {
		// "Co", "Sc", "Na"... are elements outside the organic subset.
		n := r.text[r.pos+1]
		if n >= 'a' && n <= 'z' && c >= 'A' && c <= 'Z' {
			two := string([]byte{c, n})
			if _, ok := ElementNumber(two); ok && !organicFollow(n) {
				r.errorf(Span{start, start + 2}, CodeSyntax, "expected an organic-subset atom, found '%s' (write it in brackets: [%s])", two, two)
				sym = two
			}
		}
	}
	r.pos += len(sym)
	a := Atom{Symbol: sym, Span: Span{start, r.pos}}
	if len(sym) == 2 && sym != "Cl" && sym != "Br" {
		a.Bracket = true // recovered: no implicit hydrogens for it
		a.Number, _ = ElementNumber(sym)
	} else if z, ok := aromaticNumber(sym); ok {
		a.Number = z
		a.Aromatic = true
	} else {
		a.Number, _ = ElementNumber(sym)
	}
	a.Bonds = r.bondList()
	r.mol.Atoms = append(r.mol.Atoms, a)
	return len(r.mol.Atoms) - 1
}

// organicFollow reports whether the lowercase letter n after an uppercase
// organic-subset atom starts an atom of its own. OpenSMILES reads the
// organic subset by its own symbols, so "Cc" and "Co" are two atoms
// (aliphatic carbon, then an aromatic atom), while "Ca" can only be a
// calcium written without its brackets.
func organicFollow(n byte) bool {
	switch n {
	case 'b', 'c', 'n', 'o', 'p', 's':
		return true
	}
	return false
}

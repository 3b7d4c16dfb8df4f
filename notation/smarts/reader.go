package smarts

import (
	"fmt"
	"unicode/utf8"

	"stereoline/notation"
)

// maxErrors bounds the error list of one pattern; the last entry says
// that the rest was dropped.
const maxErrors = 100

// maxDepth bounds the nesting of recursive $(...) patterns, so that a
// pattern written to nest without end costs no more than this much
// stack. Real patterns nest two or three deep.
const maxDepth = 64

// Read parses a SMARTS or reaction SMARTS and returns the pattern it
// could build. Reading never fails: every problem is in the pattern's
// Errors, sorted by position. The work is linear in the length of the
// text.
func Read(text string) *Pattern {
	r := &reader{text: text, p: &Pattern{Text: text}}
	r.read()
	r.p.Errors.Sort()
	return r.p
}

// Valid reports whether text reads as a pattern without any error, as
// len(Read(text).Errors) == 0 does, but stops at the first error and
// builds no messages: the finder asks it of many strings that are not
// patterns.
func Valid(text string) bool {
	r := &reader{text: text, p: &Pattern{Text: text}, quick: true}
	r.read()
	return !r.failed
}

// reader is the state of one Read.
type reader struct {
	text    string
	pos     int
	end     int // end of the part being read
	p       *Pattern
	depth   int // nesting of recursive patterns
	role    notation.Role
	dropped bool
	// quick: stop at the first error without recording it (Valid);
	// failed says there was one.
	quick, failed bool
	// bracket is the state of the bracket atom being read: inside one,
	// its first error is reported and the others, which follow from it
	// ("[#NOEL]": N, E and L are each no primitive), are not.
	bracket struct{ in, erred bool }
}

func (r *reader) errorf(span notation.Span, code notation.Code, format string, args ...any) {
	if r.quick {
		r.failed = true
		return
	}
	if r.bracket.in {
		if r.bracket.erred {
			return
		}
		r.bracket.erred = true
	}
	if len(r.p.Errors) >= maxErrors {
		if !r.dropped {
			r.dropped = true
			r.p.Errors.Add(span, CodeSyntax, "too many errors; the rest of the pattern is not reported")
		}
		return
	}
	r.p.Errors.Add(span, code, format, args...)
}

// found describes the byte at pos for messages.
func (r *reader) found(pos int) string {
	if pos >= r.end {
		return "end of pattern"
	}
	c, _ := utf8.DecodeRuneInString(r.text[pos:])
	switch {
	case c == utf8.RuneError:
		return "an invalid byte"
	case c < 0x20 || c == 0x7f:
		return fmt.Sprintf("control character U+%04X", c)
	case c == ' ':
		return "a space"
	}
	return "'" + string(c) + "'"
}

// skipRune advances over one character, however many bytes it takes.
func (r *reader) skipRune() {
	_, n := utf8.DecodeRuneInString(r.text[r.pos:])
	r.pos += max(n, 1)
}

func (r *reader) read() {
	arrows := r.arrows()
	if len(arrows) == 0 {
		r.end = len(r.text)
		r.chain(r.p, false)
		return
	}
	r.p.Reaction = true
	start := 0
	for i, a := range arrows {
		r.readPart(start, a, i)
		r.p.Arrows = append(r.p.Arrows, notation.Span{Start: a, End: a + 1})
		start = a + 1
	}
	r.readPart(start, len(r.text), len(arrows))
	switch {
	case len(arrows) == 1:
		r.errorf(r.p.Arrows[0], CodeReaction, "expected two '>' in a reaction pattern, found one")
	case len(arrows) > 2:
		r.errorf(r.p.Arrows[2], CodeReaction, "expected two '>' in a reaction pattern, found %d", len(arrows))
	}
}

// readPart reads part i of a reaction: reactants, agents or products
// (the parts after a third '>' count as products).
func (r *reader) readPart(start, end, i int) {
	r.role = [...]notation.Role{notation.RoleReactant, notation.RoleAgent, notation.RoleProduct}[min(i, 2)]
	r.pos, r.end = start, end
	r.chain(r.p, true)
}

// arrows returns the offsets of the '>' outside brackets.
func (r *reader) arrows() []int {
	var out []int
	depth := 0
	for i := 0; i < len(r.text); i++ {
		switch r.text[i] {
		case '[':
			depth++
		case ']':
			if depth > 0 {
				depth--
			}
		case '>':
			if depth == 0 {
				out = append(out, i)
			}
		}
	}
	return out
}

// chainState is the state of one chain: the top level of a pattern or
// reaction part, or the inside of a recursive $(...).
type chainState struct {
	dst   *Pattern
	prev  int           // atom the next atom bonds to, -1 at the start of a component
	bond  notation.Span // pending bond expression; Start < 0 when none
	stack []branch
	rings map[int]*openRing
	atoms int // atoms read in this chain
	// part: the chain is a reaction part, where empty components and
	// component-level groups "(...)" are allowed (RDKit 2022.09 reads
	// them there, and only there).
	part bool
	// component: an atom has been read since the last dot or the start.
	component bool
	// opened: a '(' was the last thing read; RDKit 2022.09 wants an atom
	// or bond next, not another '(' or a dot.
	opened bool
}

type branch struct {
	atom  int // the atom the branch hangs from; -1 for a component group
	pos   int
	atoms int // atoms read when it opened
}

type openRing struct {
	atom int
	slot int
	span notation.Span
}

func (st *chainState) noBond() { st.bond = notation.Span{Start: -1, End: -1} }

// chain reads atoms, bonds, branches, ring closures and dots up to the
// end of the part, or, inside a recursive pattern (part false and depth
// above 0), up to the ')' that closes it.
func (r *reader) chain(dst *Pattern, part bool) {
	st := &chainState{dst: dst, prev: -1, part: part}
	st.noBond()
	start := r.pos
	for r.pos < r.end && !r.failed {
		c := r.text[r.pos]
		switch {
		case c == '[':
			r.atom(st, r.bracketAtom(st))
		case isAtomStart(c):
			r.atom(st, r.bareAtom(st))
		case c == '(':
			r.openBranch(st)
		case c == ')':
			if len(st.stack) == 0 && r.depth > 0 {
				r.closeChain(st, start)
				return
			}
			r.closeBranch(st)
		case isBondStart(c):
			r.bondExpr(st)
		case c >= '0' && c <= '9' || c == '%':
			r.ringBond(st)
		case c == '.':
			r.dot(st)
		default:
			r.unexpected()
		}
	}
	r.closeChain(st, start)
}

// closeChain reports what is left open at the end of a chain.
func (r *reader) closeChain(st *chainState, start int) {
	r.pendingBond(st)
	for i := len(st.stack) - 1; i >= 0; i-- {
		b := st.stack[i]
		r.errorf(notation.Span{Start: b.pos, End: b.pos + 1}, CodeSyntax, "expected ')' to close this branch, found %s", r.found(r.pos))
	}
	if !st.part && st.atoms > 0 && !st.component {
		// "C." has a dot with nothing after it.
		r.errorf(notation.Span{Start: r.pos - 1, End: r.pos}, CodeSyntax, "expected an atom after '.', found %s", r.found(r.pos))
	}
	if st.atoms == 0 && !st.part {
		r.errorf(notation.Span{Start: start, End: r.pos}, CodeSyntax, "expected an atom, found %s", r.found(r.pos))
	}
	for _, o := range sortedRings(st.rings) {
		r.errorf(o.span, CodeUnclosedRing, "expected ring closure %s to be closed, found no partner", r.text[o.span.Start:o.span.End])
		st.dst.Atoms[o.atom].Bonds[o.slot] = -1
	}
	for i := range st.dst.Atoms {
		a := &st.dst.Atoms[i]
		k := a.Bonds[:0]
		for _, b := range a.Bonds {
			if b >= 0 {
				k = append(k, b)
			}
		}
		a.Bonds = k
	}
}

func (r *reader) unexpected() {
	start := r.pos
	r.skipRune()
	r.errorf(notation.Span{Start: start, End: r.pos}, CodeSyntax, "expected an atom or bond, found %s", r.found(start))
}

// atom links an atom just read (index idx in st.dst, or -1 when nothing
// readable was there) into the chain.
func (r *reader) atom(st *chainState, idx int) {
	if idx < 0 {
		return
	}
	a := &st.dst.Atoms[idx]
	a.Role = r.role
	if st.prev >= 0 {
		span := st.bond
		if span.Start < 0 {
			span = notation.Span{Start: a.Span.Start, End: a.Span.Start}
		}
		r.addBond(st, st.prev, idx, span, false)
		st.dst.Atoms[idx].HasPrev = true
	} else if st.bond.Start >= 0 {
		r.errorf(st.bond, CodeSyntax, "expected an atom before the bond")
	}
	st.noBond()
	st.prev = idx
	st.atoms++
	st.component = true
	st.opened = false
}

func (r *reader) addBond(st *chainState, a, b int, span notation.Span, ring bool) int {
	d := st.dst
	d.Bonds = append(d.Bonds, Bond{Begin: a, End: b, Span: span, Ring: ring})
	bi := len(d.Bonds) - 1
	d.Atoms[a].Bonds = append(d.Atoms[a].Bonds, bi)
	d.Atoms[b].Bonds = append(d.Atoms[b].Bonds, bi)
	return bi
}

// isAtomStart reports the bytes that start an unbracketed atom: the
// organic subset, its aromatic forms, the wildcard and the aromatic and
// aliphatic any-atoms a and A.
func isAtomStart(c byte) bool {
	switch c {
	case 'B', 'C', 'N', 'O', 'P', 'S', 'F', 'I', 'b', 'c', 'n', 'o', 'p', 's', '*', 'a', 'A':
		return true
	}
	return c >= 'A' && c <= 'Z' || c >= 'a' && c <= 'z'
}

// bareAtom reads an unbracketed atom. Letters outside the organic
// subset are reported; the atom is still made so the chain goes on.
func (r *reader) bareAtom(st *chainState) int {
	start := r.pos
	c := r.text[r.pos]
	n := 1
	if r.pos+1 < r.end && (c == 'C' && r.text[r.pos+1] == 'l' || c == 'B' && r.text[r.pos+1] == 'r') {
		n = 2
	}
	switch c {
	case 'B', 'C', 'N', 'O', 'P', 'S', 'F', 'I', 'b', 'c', 'n', 'o', 'p', 's', '*', 'a', 'A':
	default:
		sym := string(c)
		if r.pos+1 < r.end && r.text[r.pos+1] >= 'a' && r.text[r.pos+1] <= 'z' {
			if _, ok := notation.ElementNumber(r.text[r.pos : r.pos+2]); ok {
				sym = r.text[r.pos : r.pos+2]
				n = 2
			}
		}
		r.errorf(notation.Span{Start: start, End: start + n}, CodeSyntax, "expected an atom of the organic subset, a, A or *, found '%s' (write it in brackets: [%s])", sym, sym)
	}
	r.pos += n
	st.dst.Atoms = append(st.dst.Atoms, Atom{Span: notation.Span{Start: start, End: r.pos}})
	return len(st.dst.Atoms) - 1
}

func (r *reader) openBranch(st *chainState) {
	start := r.pos
	r.pos++
	if st.opened {
		r.errorf(notation.Span{Start: start, End: start + 1}, CodeSyntax, "expected an atom or bond after '(', found '('")
	}
	defer func() { st.opened = true }()
	if st.prev < 0 {
		if !st.component && st.bond.Start < 0 && r.depth == 0 {
			// A component-level group "(C.C)" (Daylight SMARTS theory
			// manual, "Component-level grouping"), in a reaction part
			// or a pattern of its own.
			st.stack = append(st.stack, branch{atom: -1, pos: start, atoms: st.atoms})
			return
		}
		r.errorf(notation.Span{Start: start, End: start + 1}, CodeSyntax, "expected an atom before '('")
	}
	if st.bond.Start >= 0 {
		r.errorf(st.bond, CodeSyntax, "expected an atom after the bond, found '('")
		st.noBond()
	}
	st.stack = append(st.stack, branch{atom: st.prev, pos: start, atoms: st.atoms})
}

func (r *reader) closeBranch(st *chainState) {
	span := notation.Span{Start: r.pos, End: r.pos + 1}
	r.pos++
	r.pendingBond(st)
	if len(st.stack) == 0 {
		r.errorf(span, CodeSyntax, "expected an atom or bond, found ')' without '('")
		return
	}
	top := st.stack[len(st.stack)-1]
	st.stack = st.stack[:len(st.stack)-1]
	if st.atoms == top.atoms {
		r.errorf(notation.Span{Start: top.pos, End: span.End}, CodeSyntax, "expected an atom inside the branch, found ')'")
	}
	st.opened = false
	if top.atom < 0 {
		// The end of a component group: the next thing is a dot, the
		// end of the part, or another group.
		st.prev = -1
		st.component = true
		return
	}
	st.prev = top.atom
}

// pendingBond reports a bond expression left without an atom after it.
func (r *reader) pendingBond(st *chainState) {
	if st.bond.Start >= 0 {
		r.errorf(st.bond, CodeSyntax, "expected an atom after the bond, found %s", r.found(r.pos))
		st.noBond()
	}
}

func (r *reader) dot(st *chainState) {
	span := notation.Span{Start: r.pos, End: r.pos + 1}
	r.pos++
	if st.opened {
		r.errorf(span, CodeSyntax, "expected an atom or bond after '(', found '.'")
	}
	r.pendingBond(st)
	if !st.component && !st.part {
		r.errorf(span, CodeSyntax, "expected an atom before '.'")
	}
	st.prev = -1
	st.component = false
}

// sortedRings returns the open rings in order of their numbers' spans.
func sortedRings(m map[int]*openRing) []*openRing {
	out := make([]*openRing, 0, len(m))
	for _, o := range m {
		out = append(out, o)
	}
	for i := 1; i < len(out); i++ {
		for j := i; j > 0 && out[j].span.Start < out[j-1].span.Start; j-- {
			out[j], out[j-1] = out[j-1], out[j]
		}
	}
	return out
}

// ringBond reads a ring-closure number with the bond expression pending
// before it and opens or closes that ring.
func (r *reader) ringBond(st *chainState) {
	start := r.pos
	num, ok := r.ringNumber()
	span := notation.Span{Start: start, End: r.pos}
	if !ok {
		return
	}
	if st.prev < 0 {
		r.errorf(span, CodeSyntax, "expected an atom before ring-closure number %s", r.text[span.Start:span.End])
		st.noBond()
		return
	}
	if st.opened {
		// "c(1c...": RDKit 2022.09 wants an atom first in a branch.
		r.errorf(span, CodeSyntax, "expected an atom after '(', found ring-closure number %s", r.text[span.Start:span.End])
	}
	if st.bond.Start >= 0 {
		span.Start = st.bond.Start
		st.noBond()
	}
	if st.rings == nil {
		st.rings = map[int]*openRing{}
	}
	open, isOpen := st.rings[num]
	d := st.dst
	if !isOpen {
		a := &d.Atoms[st.prev]
		st.rings[num] = &openRing{atom: st.prev, slot: len(a.Bonds), span: span}
		a.Bonds = append(a.Bonds, -1)
		return
	}
	delete(st.rings, num)
	cur := st.prev
	if open.atom == cur || bonded(d, open.atom, cur) {
		r.errorf(span, CodeRingBond, "expected a ring closure between two atoms not yet bonded, found one back to %s", map[bool]string{true: "the same atom", false: "a neighbour"}[open.atom == cur])
		d.Atoms[open.atom].Bonds[open.slot] = -1
		return
	}
	d.Bonds = append(d.Bonds, Bond{Begin: open.atom, End: cur, Span: open.span, Ring: true})
	bi := len(d.Bonds) - 1
	d.Atoms[open.atom].Bonds[open.slot] = bi
	d.Atoms[cur].Bonds = append(d.Atoms[cur].Bonds, bi)
}

// bonded reports whether atoms a and b share a bond. Atoms with many
// bonds are rare in patterns; the shorter list is scanned.
func bonded(d *Pattern, a, b int) bool {
	if len(d.Atoms[b].Bonds) < len(d.Atoms[a].Bonds) {
		a, b = b, a
	}
	for _, bi := range d.Atoms[a].Bonds {
		if bi >= 0 && d.Bonds[bi].Other(a) == b {
			return true
		}
	}
	return false
}

// ringNumber reads a digit, '%' and two digits, or '%(' digits ')'.
func (r *reader) ringNumber() (int, bool) {
	t := r.text
	if t[r.pos] != '%' {
		n := int(t[r.pos] - '0')
		r.pos++
		return n, true
	}
	start := r.pos
	r.pos++
	if r.pos < r.end && t[r.pos] == '(' {
		r.pos++
		n, digits := 0, 0
		for r.pos < r.end && isDigit(t[r.pos]) {
			if digits < 9 {
				n = n*10 + int(t[r.pos]-'0')
			}
			digits++
			r.pos++
		}
		if digits == 0 || digits > 9 || r.pos >= r.end || t[r.pos] != ')' {
			r.errorf(notation.Span{Start: start, End: r.pos}, CodeSyntax, "expected digits and ')' after '%%(', found %s", r.found(r.pos))
			return 0, false
		}
		r.pos++
		return n, true
	}
	if r.pos+1 < r.end && isDigit(t[r.pos]) && isDigit(t[r.pos+1]) {
		n := int(t[r.pos]-'0')*10 + int(t[r.pos+1]-'0')
		r.pos += 2
		return n, true
	}
	end := r.pos
	if end < r.end && isDigit(t[end]) {
		end++
	}
	r.errorf(notation.Span{Start: start, End: end}, CodeSyntax, "expected two digits after '%%', found %s", r.found(end))
	r.pos = end
	return 0, false
}

func isDigit(c byte) bool { return c >= '0' && c <= '9' }

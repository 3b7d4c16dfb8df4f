package smarts

import (
	"strings"

	"stereoline/notation"
)

// Atom and bond expressions (Daylight SMARTS theory manual, "Logical
// operators"): primitives joined by '!' (not), '&' (high-precedence
// and), ',' (or) and ';' (low-precedence and); two primitives side by
// side are joined by an implied '&'. The reader checks the shape of the
// expression, not what it means: a primitive after every operator, no
// operator at the end.

// exprKind tells the expression reader which primitives to expect.
type exprKind uint8

const (
	atomExpr exprKind = iota
	bondExpr
)

// expr reads an expression starting at r.pos and stops before the first
// byte that can be neither a primitive nor an operator (']' or ':' in an
// atom, an atom or digit after a bond). It returns false when nothing
// was read.
func (r *reader) expr(kind exprKind, a *Atom, st *chainState) bool {
	start := r.pos
	needTerm := true
	lastOp := -1
	for r.pos < r.end && !r.failed {
		c := r.text[r.pos]
		switch {
		case c == '!':
			r.pos++
			needTerm = true
			lastOp = r.pos - 1
			continue
		case c == '&' || c == ',' || c == ';':
			if needTerm {
				r.errorf(notation.Span{Start: r.pos, End: r.pos + 1}, CodeSyntax, "expected a primitive before '%c'", c)
			}
			lastOp = r.pos
			r.pos++
			needTerm = true
			continue
		}
		var ok bool
		if kind == atomExpr {
			ok = r.atomPrimitive(a, st)
		} else {
			ok = r.bondPrimitive()
		}
		if !ok {
			break
		}
		needTerm = false
	}
	if needTerm && lastOp >= 0 {
		r.errorf(notation.Span{Start: lastOp, End: lastOp + 1}, CodeSyntax, "expected a primitive after '%c', found %s", r.text[lastOp], r.found(r.pos))
	}
	return r.pos > start
}

// isBondStart reports the bytes that start a bond expression at the
// chain level.
func isBondStart(c byte) bool {
	switch c {
	case '-', '=', '#', ':', '~', '@', '/', '\\', '$', '!', '<':
		return true
	}
	return false
}

// bondPrimitive reads one bond primitive: - = # : ~ @ / \ $ (quadruple)
// or the dative bond <- of RDKit. It reports false, reading nothing,
// when none is there.
func (r *reader) bondPrimitive() bool {
	switch c := r.text[r.pos]; c {
	case '-', '=', '#', ':', '~', '@', '/', '\\', '$':
		r.pos++
		return true
	case '<':
		if r.pos+1 < r.end && r.text[r.pos+1] == '-' {
			r.pos += 2
			return true
		}
		r.errorf(notation.Span{Start: r.pos, End: r.pos + 1}, CodeSyntax, "expected '<-' (a dative bond), found '<' alone")
		r.pos++
		return true
	}
	return false
}

// bondExpr reads a bond expression between two atoms, or before a ring
// digit, and leaves it pending on the chain.
func (r *reader) bondExpr(st *chainState) {
	start := r.pos
	r.expr(bondExpr, nil, st)
	if r.pos == start {
		// '!' or an operator alone; expr reported it. Step over.
		r.pos++
	}
	span := notation.Span{Start: start, End: r.pos}
	if st.prev < 0 {
		r.errorf(span, CodeSyntax, "expected an atom before the bond")
		return
	}
	if st.bond.Start >= 0 {
		r.errorf(span, CodeSyntax, "expected an atom after the bond, found another bond")
		return
	}
	st.bond = span
}

// bracketAtom reads "[expression]" or "[expression:map]" and adds the
// atom; -1 when the bracket holds nothing readable.
func (r *reader) bracketAtom(st *chainState) int {
	start := r.pos
	r.pos++
	outer := r.bracket
	r.bracket.in, r.bracket.erred = true, false
	defer func() { r.bracket = outer }()
	a := Atom{Bracket: true}
	if r.pos < r.end && r.text[r.pos] == ']' {
		r.errorf(notation.Span{Start: start, End: r.pos + 1}, CodeSyntax, "expected an atom expression inside '[]', found ']'")
	} else {
		r.expr(atomExpr, &a, st)
	}
	if r.pos < r.end && r.text[r.pos] == ':' {
		r.atomMap(&a)
	}
	switch {
	case r.pos < r.end && r.text[r.pos] == ']':
		r.pos++
	default:
		r.errorf(notation.Span{Start: r.pos, End: min(r.pos+1, r.end)}, CodeSyntax, "expected ']' to close the atom, found %s", r.found(r.pos))
		// Resynchronise at the closing bracket, if there is one.
		if k := strings.IndexByte(r.text[r.pos:r.end], ']'); k >= 0 && !strings.ContainsAny(r.text[r.pos:r.pos+k], "[") {
			r.pos += k + 1
		}
	}
	a.Span = notation.Span{Start: start, End: r.pos}
	st.dst.Atoms = append(st.dst.Atoms, a)
	return len(st.dst.Atoms) - 1
}

// atomMap reads ":n", which must be the last thing in the bracket.
func (r *reader) atomMap(a *Atom) {
	start := r.pos
	r.pos++
	d0 := r.pos
	n := 0
	for r.pos < r.end && isDigit(r.text[r.pos]) {
		if r.pos-d0 < 9 {
			n = n*10 + int(r.text[r.pos]-'0')
		}
		r.pos++
	}
	switch {
	case r.pos == d0:
		r.errorf(notation.Span{Start: start, End: r.pos}, CodeSyntax, "expected an atom map number after ':', found %s", r.found(r.pos))
	case r.text[d0] == '0' && r.pos-d0 > 1:
		// RDKit 2022.09 rejects [C:01]; a map number is written without
		// leading zeros.
		r.errorf(notation.Span{Start: start, End: r.pos}, CodeSyntax, "expected an atom map number without leading zeros, found %s", r.text[d0:r.pos])
	default:
		a.Map = n
	}
}

// atomPrimitive reads one atomic primitive, reporting false (and
// reading nothing) at a byte that starts none.
func (r *reader) atomPrimitive(a *Atom, st *chainState) bool {
	t := r.text
	c := t[r.pos]
	start := r.pos
	switch {
	case isDigit(c): // isotope
		r.digits()
		return true
	case c == '*':
		r.pos++
		return true
	case c == '#':
		r.pos++
		if r.digits() == 0 {
			r.errorf(notation.Span{Start: start, End: r.pos}, CodeSyntax, "expected an atomic number after '#', found %s", r.found(r.pos))
		}
		return true
	case c == '+' || c == '-':
		r.pos++
		if r.digits() == 0 {
			for r.pos < r.end && t[r.pos] == c {
				r.pos++
			}
		}
		if r.pos < r.end && t[r.pos] == '{' {
			r.rangeArg()
		}
		return true
	case c == '@':
		r.chirality(a)
		return true
	case c == '^':
		r.pos++
		if r.pos < r.end && t[r.pos] >= '0' && t[r.pos] <= '5' {
			r.pos++
		} else {
			r.errorf(notation.Span{Start: start, End: min(r.pos+1, r.end)}, CodeSyntax, "expected a hybridization 0 to 5 after '^', found %s", r.found(r.pos))
		}
		return true
	case c == '$':
		r.recursive(start)
		return true
	case c >= 'A' && c <= 'Z':
		r.upperPrimitive(a)
		return true
	case c >= 'a' && c <= 'z':
		r.lowerPrimitive()
		return true
	}
	return false
}

// digits reads a run of digits and returns how many there were.
func (r *reader) digits() int {
	n := 0
	for r.pos < r.end && isDigit(r.text[r.pos]) {
		r.pos++
		n++
	}
	return n
}

// countArg reads the optional argument of a counting primitive: digits,
// or a range {n-m}, {n-} or {-m} (RDKit's extension).
func (r *reader) countArg() {
	if r.pos < r.end && r.text[r.pos] == '{' {
		r.rangeArg()
		return
	}
	r.digits()
}

// rangeArg reads {n-m}, {n-} or {-m}.
func (r *reader) rangeArg() {
	start := r.pos
	r.pos++
	lo := r.digits()
	dash := r.pos < r.end && r.text[r.pos] == '-'
	if dash {
		r.pos++
	}
	hi := r.digits()
	if r.pos < r.end && r.text[r.pos] == '}' && dash && lo+hi > 0 {
		r.pos++
		return
	}
	r.errorf(notation.Span{Start: start, End: min(r.pos+1, r.end)}, CodeSyntax, "expected a range {n-m}, {n-} or {-m}, found %s", r.found(r.pos))
	if k := strings.IndexByte(r.text[r.pos:r.end], '}'); k >= 0 && k < 8 {
		r.pos += k + 1
	}
}

// chirality reads @ or @@ and an optional class (TH, AL, SP, TB, OH)
// with its number.
func (r *reader) chirality(a *Atom) {
	start := r.pos
	r.pos++
	mark := 1
	if r.pos < r.end && r.text[r.pos] == '@' {
		r.pos++
		mark = 2
	}
	if r.pos+1 < r.end {
		switch r.text[r.pos : r.pos+2] {
		case "TH", "AL", "SP", "TB", "OH":
			r.pos += 2
			r.digits()
			mark = 0 // a class other than the default: not read as @/@@
		}
	}
	if r.pos < r.end && r.text[r.pos] == '?' {
		// Daylight writes "@?" for "this or unspecified"; RDKit 2022.09
		// does not read it, and a pattern that fails there fails the
		// user.
		r.errorf(notation.Span{Start: start, End: r.pos + 1}, CodeSyntax, "expected no '?' after a chirality mark (widely used readers reject \"@?\")")
		r.pos++
	}
	if a != nil && a.Chirality == 0 && mark != 0 {
		a.Chirality = mark
		a.ChiralitySpan = notation.Span{Start: start, End: r.pos}
	}
}

// recursive reads $( pattern ) into a scratch pattern.
func (r *reader) recursive(start int) {
	r.pos++
	if r.pos >= r.end || r.text[r.pos] != '(' {
		r.errorf(notation.Span{Start: start, End: min(r.pos+1, r.end)}, CodeSyntax, "expected '(' after '$' in an atom, found %s", r.found(r.pos))
		return
	}
	r.pos++
	if r.depth >= maxDepth {
		r.errorf(notation.Span{Start: start, End: r.pos}, CodeSyntax, "expected recursive patterns nested at most %d deep", maxDepth)
		r.skipRecursive()
		return
	}
	r.depth++
	role, bracket := r.role, r.bracket
	r.role, r.bracket.in = notation.RoleNone, false // a pattern of its own
	r.chain(&Pattern{Text: r.text}, false)
	r.role, r.bracket = role, bracket
	r.depth--
	if r.pos < r.end && r.text[r.pos] == ')' {
		r.pos++
		return
	}
	r.errorf(notation.Span{Start: start, End: start + 2}, CodeSyntax, "expected ')' to close the recursive pattern, found %s", r.found(r.pos))
}

// skipRecursive skips to the ')' that closes a recursive pattern too
// deep to read, counting parentheses.
func (r *reader) skipRecursive() {
	depth := 1
	for r.pos < r.end && depth > 0 {
		switch r.text[r.pos] {
		case '(':
			depth++
		case ')':
			depth--
		}
		r.pos++
	}
}

// upperPrimitive reads an element symbol or one of the primitives A, D,
// H, R, X, Z with its count. A two-letter symbol wins over a
// one-letter one followed by a lowercase primitive ([Hg] is mercury,
// [Hh] is H and h), as the general-purpose readers read it.
func (r *reader) upperPrimitive(a *Atom) {
	t := r.text
	start := r.pos
	if r.pos+1 < r.end && t[r.pos+1] >= 'a' && t[r.pos+1] <= 'z' && bracketElement(t[r.pos:r.pos+2]) {
		r.pos += 2
		return
	}
	c := t[r.pos]
	r.pos++
	switch c {
	case 'D', 'R', 'X', 'Z':
		r.countArg()
	case 'H':
		d := r.pos
		r.countArg()
		if a != nil && (r.pos == d || t[d:r.pos] == "1") && start > 0 && t[start-1] != '[' && t[start-1] != '!' {
			a.Hydrogen = true
		}
	case 'A', 'B', 'C', 'N', 'O', 'F', 'P', 'S', 'K', 'V', 'Y', 'I', 'W', 'U':
	default:
		r.errorf(notation.Span{Start: start, End: r.pos}, CodeUnknownElement, "expected an element symbol or primitive, found '%c'", c)
	}
}

// bracketElement reports the two-letter element symbols an atom
// expression may hold: every element up to 118 except the three RDKit
// 2022.09 does not know in SMARTS (Mc, Ts, Og).
func bracketElement(s string) bool {
	if _, ok := notation.ElementNumber(s); !ok {
		return false
	}
	return s != "Mc" && s != "Ts" && s != "Og"
}

// lowerPrimitive reads an aromatic element (c n o s p b, and se, te,
// as, si) or one of the primitives a, d, h, r, v, x, z with its count.
func (r *reader) lowerPrimitive() {
	t := r.text
	start := r.pos
	if r.pos+1 < r.end {
		switch t[r.pos : r.pos+2] {
		case "se", "te", "as", "si":
			r.pos += 2
			return
		}
	}
	c := t[r.pos]
	r.pos++
	switch c {
	case 'c', 'n', 'o', 's', 'p', 'b', 'a':
	case 'd', 'h', 'r', 'v', 'x', 'z':
		r.countArg()
	default:
		r.errorf(notation.Span{Start: start, End: r.pos}, CodeUnknownElement, "expected an aromatic element or primitive, found '%c'", c)
	}
}

package notation

import "sort"

// ringBond reads a ring-closure number (a digit, '%' and two digits, or
// '%(' digits ')') together with the bond symbol pending before it, and
// opens or closes the ring it names (OpenSMILES 3.4).
func (r *reader) ringBond() {
	start := r.pos
	num, ok := r.ringNumber()
	span := Span{start, r.pos}
	if !ok {
		return
	}
	if r.prev < 0 {
		r.errorf(span, CodeSyntax, "expected an atom before ring-closure number %s", r.text[span.Start:span.End])
		r.bond = 0
		r.openDot = 0 // this error says what is missing after a '.'
		return
	}
	if r.afterBranch {
		// OpenSMILES puts ring bonds before branches (branched_atom ::=
		// atom ringbond* branch*), but widely used readers accept them
		// after one and bond them to the atom the branch hangs from, in
		// the order written; so does this reader (RDKit 2022.09.3 reads
		// F[C@H](Cl)1.Br1 as F[C@H](Cl)Br). The structure is what those
		// readers make of it, so this is a warning, not an error.
		e := r.errorf(span, CodeRingAfterBranch, "expected ring-closure numbers right after the atom, found %s after a branch (outside the OpenSMILES grammar; read as widely used readers do, as a ring bond of the atom before the branch)", r.text[span.Start:span.End])
		e.Severity = SeverityWarning
	}
	sym := r.bond
	symSpan := Span{start, start}
	if sym != 0 {
		symSpan = Span{r.bondPos, r.bondPos + 1}
		span.Start = r.bondPos
		r.bond = 0
	}
	open, isOpen := r.rings[num]
	if !isOpen {
		a := &r.mol.Atoms[r.prev]
		r.rings[num] = openRing{atom: r.prev, slot: len(a.Bonds), symbol: sym, span: span, symSpan: symSpan}
		a.Bonds = append(a.Bonds, -1)
		return
	}
	delete(r.rings, num)
	r.closeRing(&open, sym, span, symSpan)
}

// ringNumber reads the digits of a ring-closure number.
func (r *reader) ringNumber() (int, bool) {
	t := r.text
	if t[r.pos] != '%' {
		n := int(t[r.pos] - '0')
		r.pos++
		return n, true
	}
	start := r.pos
	r.pos++
	if r.pos < len(t) && t[r.pos] == '(' {
		r.pos++
		n, digits := 0, 0
		for r.pos < len(t) && t[r.pos] >= '0' && t[r.pos] <= '9' {
			if digits < 9 {
				n = n*10 + int(t[r.pos]-'0')
			}
			digits++
			r.pos++
		}
		if digits == 0 || r.pos >= len(t) || t[r.pos] != ')' {
			r.errorf(Span{start, r.pos}, CodeSyntax, "expected digits and ')' after '%%(', found %s", r.found(r.pos))
			return 0, false
		}
		r.pos++
		if digits > 9 {
			r.errorf(Span{start, r.pos}, CodeSyntax, "expected a ring-closure number of at most 9 digits, found %d digits", digits)
			return 0, false
		}
		return n, true
	}
	if r.pos+1 < len(t) && isDigit(t[r.pos]) && isDigit(t[r.pos+1]) {
		n := int(t[r.pos]-'0')*10 + int(t[r.pos+1]-'0')
		r.pos += 2
		return n, true
	}
	end := r.pos
	if end < len(t) && isDigit(t[end]) {
		end++
	}
	r.errorf(Span{start, end}, CodeSyntax, "expected two digits after '%%', found %s", r.found(end))
	r.pos = end
	return 0, false
}

func isDigit(c byte) bool { return c >= '0' && c <= '9' }

// closeRing joins the atom that opened a ring closure to the current atom.
func (r *reader) closeRing(open *openRing, sym byte, span, symSpan Span) {
	m := r.mol
	cur := r.prev
	drop := func() { m.Atoms[open.atom].Bonds[open.slot] = -1 }
	if open.atom == cur {
		e := r.errorf(span, CodeRingSelf, "expected a ring closure to another atom, found one back to the same atom")
		e.Related = append(e.Related, Related{open.span, "ring opened here"})
		drop()
		return
	}
	if r.bonded(open.atom, cur) {
		e := r.errorf(span, CodeRingDuplicate, "expected a ring closure between atoms not yet bonded, found a second bond between atoms %d and %d", open.atom+1, cur+1)
		e.Related = append(e.Related, Related{open.span, "ring opened here"})
		drop()
		return
	}
	written := open.symbol
	if written == 0 {
		written = sym
	}
	if open.symbol != 0 && sym != 0 && orderOf1(open.symbol) != orderOf1(sym) {
		e := r.errorf(span, CodeRingBondMismatch, "expected the same bond at both ends of ring closure, found '%c' and '%c'", open.symbol, sym)
		e.Related = append(e.Related, Related{open.span, "ring opened here"})
	}
	bd := Bond{Begin: open.atom, End: cur, Written: written, Span: open.span, Ring: true, CloseSpan: span, CloseWritten: sym}
	bd.Order, _ = orderOf(written, m.Atoms[open.atom].Aromatic && m.Atoms[cur].Aromatic)
	if bd.Order == OrderSingle {
		_, bd.Dir = orderOf(open.symbol, false)
		_, bd.CloseDir = orderOf(sym, false)
	}
	m.Bonds = append(m.Bonds, bd)
	bi := len(m.Bonds) - 1
	if r.pairs != nil {
		r.pairs[pairKey(open.atom, cur)] = struct{}{}
	}
	m.Atoms[open.atom].Bonds[open.slot] = bi
	m.Atoms[cur].Bonds = append(m.Atoms[cur].Bonds, bi)
}

// bonded reports whether atoms a and b are already bonded. Scanning the
// shorter neighbour list is enough for ordinary molecules; when both atoms
// carry many bonds (a record written to have thousands of ring closures
// on two atoms) a set of bonded pairs keeps the check constant-time, so
// reading stays linear.
func (r *reader) bonded(a, b int) bool {
	m := r.mol
	da, db := len(m.Atoms[a].Bonds), len(m.Atoms[b].Bonds)
	if da <= 16 || db <= 16 {
		if db < da {
			a, b = b, a
		}
		return m.BondBetween(a, b) >= 0
	}
	if r.pairs == nil {
		r.pairs = make(map[uint64]struct{}, len(m.Bonds))
		for i := range m.Bonds {
			r.pairs[pairKey(m.Bonds[i].Begin, m.Bonds[i].End)] = struct{}{}
		}
	}
	_, ok := r.pairs[pairKey(a, b)]
	return ok
}

func pairKey(a, b int) uint64 {
	if a > b {
		a, b = b, a
	}
	return uint64(a)<<32 | uint64(uint32(b))
}

func orderOf1(sym byte) BondOrder {
	o, _ := orderOf(sym, false)
	return o
}

// closeOpenRings reports the ring closures never closed and frees their
// reserved slots.
func (r *reader) closeOpenRings() {
	if len(r.rings) == 0 {
		return
	}
	if r.quiet {
		// Reads only counts the errors of a molecule it then drops: their
		// order and messages do not matter
		for _, o := range r.rings {
			r.errorf(o.span, CodeUnclosedRing, "")
			r.mol.Atoms[o.atom].Bonds[o.slot] = -1
		}
		clear(r.rings)
		return
	}
	nums := make([]int, 0, len(r.rings))
	for n := range r.rings {
		nums = append(nums, n)
	}
	sort.Ints(nums)
	for _, n := range nums {
		o := r.rings[n]
		r.errorf(o.span, CodeUnclosedRing, "expected ring closure %s to be closed, found no partner", ringLabel(n))
		r.mol.Atoms[o.atom].Bonds[o.slot] = -1
		delete(r.rings, n)
	}
}

func ringLabel(n int) string {
	switch {
	case n < 10:
		return string(rune('0' + n))
	case n < 100:
		return "%" + string(rune('0'+n/10)) + string(rune('0'+n%10))
	}
	return "%(" + itoa(n) + ")"
}

func itoa(n int) string {
	if n == 0 {
		return "0"
	}
	var b [20]byte
	i := len(b)
	neg := n < 0
	if neg {
		n = -n
	}
	for n > 0 {
		i--
		b[i] = byte('0' + n%10)
		n /= 10
	}
	if neg {
		i--
		b[i] = '-'
	}
	return string(b[i:])
}

package notation

// bracketAtom reads '[' isotope? symbol chiral? hcount? charge? class? ']'
// (OpenSMILES 3.1). On a malformed atom it reports the first problem,
// skips to the closing bracket and still returns an atom, so that the
// bonds around it stay in place.
func (r *reader) bracketAtom() int {
	t := r.text
	start := r.pos
	r.pos++ // '['
	a := Atom{Bracket: true}

	if n, ok := r.number(4); ok {
		a.Isotope = n
	}
	if !r.bracketSymbol(&a) {
		r.skipBracket(start, &a)
		return r.appendAtom(a)
	}
	r.chirality(&a)
	if r.pos < len(t) && t[r.pos] == 'H' {
		r.pos++
		a.BracketH = 1
		if r.pos < len(t) && isDigit(t[r.pos]) {
			a.BracketH = int(t[r.pos] - '0')
			r.pos++
		}
	}
	r.charge(&a)
	if r.pos < len(t) && t[r.pos] == ':' {
		r.pos++
		if n, ok := r.number(9); ok {
			a.Map = n
		} else {
			r.errorf(Span{r.pos - 1, r.pos}, CodeSyntax, "expected an atom-class number after ':', found %s", r.found(r.pos))
		}
	}
	if r.pos < len(t) && t[r.pos] == ']' {
		r.pos++
		a.Span = Span{start, r.pos}
		return r.appendAtom(a)
	}
	r.errorf(Span{r.pos, r.pos + min(1, len(t)-r.pos)}, CodeSyntax, "expected ']' to close the atom, found %s", r.found(r.pos))
	r.skipBracket(start, &a)
	return r.appendAtom(a)
}

func (r *reader) appendAtom(a Atom) int {
	if a.Bonds == nil {
		a.Bonds = r.bondList()
	}
	r.mol.Atoms = append(r.mol.Atoms, a)
	return len(r.mol.Atoms) - 1
}

// skipBracket moves past the closing ']' of a malformed atom. It stops
// before a '[' (the next atom) or a character that cannot be inside
// brackets, so one missing ']' does not swallow the record.
func (r *reader) skipBracket(start int, a *Atom) {
	t := r.text
	for r.pos < len(t) {
		c := t[r.pos]
		if c == ']' {
			r.pos++
			break
		}
		if c == '[' || c == '(' || c == ')' || c == '.' || c == '>' || c == ' ' {
			break
		}
		r.pos++
	}
	a.Span = Span{start, r.pos}
	if a.Symbol == "" {
		a.Symbol = "*"
	}
}

// number reads up to maxDigits decimal digits. Longer runs are consumed
// and reported, so a huge number cannot overflow.
func (r *reader) number(maxDigits int) (int, bool) {
	t := r.text
	start := r.pos
	n := 0
	for r.pos < len(t) && isDigit(t[r.pos]) {
		if r.pos-start < maxDigits {
			n = n*10 + int(t[r.pos]-'0')
		}
		r.pos++
	}
	if r.pos == start {
		return 0, false
	}
	if r.pos-start > maxDigits {
		r.errorf(Span{start, r.pos}, CodeSyntax, "expected at most %d digits, found %d", maxDigits, r.pos-start)
	}
	return n, true
}

// bracketSymbol reads an element symbol, an aromatic symbol or '*'.
func (r *reader) bracketSymbol(a *Atom) bool {
	t := r.text
	if r.pos >= len(t) {
		r.errorf(Span{r.pos, r.pos}, CodeSyntax, "expected an element symbol, found end of text")
		return false
	}
	c := t[r.pos]
	start := r.pos
	switch {
	case c == '*':
		a.Symbol, a.Number = "*", 0
		r.pos++
		return true
	case c >= 'A' && c <= 'Z':
		if r.pos+1 < len(t) && t[r.pos+1] >= 'a' && t[r.pos+1] <= 'z' {
			if z, ok := ElementNumber(t[r.pos : r.pos+2]); ok {
				a.Symbol, a.Number = t[r.pos:r.pos+2], z
				r.pos += 2
				return true
			}
		}
		if z, ok := ElementNumber(t[r.pos : r.pos+1]); ok {
			a.Symbol, a.Number = t[r.pos:r.pos+1], z
			r.pos++
			return true
		}
		end := r.pos + 1
		if end < len(t) && t[end] >= 'a' && t[end] <= 'z' {
			end++
		}
		r.errorf(Span{start, end}, CodeUnknownElement, "expected an element symbol, found '%s'", t[start:end])
		a.Symbol = "*"
		r.pos = end
		return false
	case c >= 'a' && c <= 'z':
		if r.pos+1 < len(t) {
			two := t[r.pos : r.pos+2]
			if z, ok := aromaticSymbols[two]; ok {
				a.Symbol, a.Number, a.Aromatic = two, z, true
				r.pos += 2
				return true
			}
			if two[1] >= 'a' && two[1] <= 'z' {
				if _, ok := ElementNumber(string(two[0]-'a'+'A') + two[1:]); ok {
					r.errorf(Span{start, start + 2}, CodeBadAromatic, "expected an aromatic symbol (b c n o p s se as te), found '%s'", two)
					a.Symbol = "*"
					r.pos += 2
					return false
				}
			}
		}
		if z, ok := aromaticNumber(t[r.pos : r.pos+1]); ok {
			a.Symbol, a.Number, a.Aromatic = t[r.pos:r.pos+1], z, true
			r.pos++
			return true
		}
		end := r.pos + 1
		if end < len(t) && t[end] >= 'a' && t[end] <= 'z' {
			end++
		}
		sym := t[start:end]
		upper := string(sym[0]-'a'+'A') + sym[1:]
		if _, ok := ElementNumber(upper); ok {
			r.errorf(Span{start, end}, CodeBadAromatic, "expected an aromatic symbol (b c n o p s se as te), found '%s'", sym)
		} else {
			r.errorf(Span{start, end}, CodeUnknownElement, "expected an element symbol, found '%s'", sym)
		}
		a.Symbol = "*"
		r.pos = end
		return false
	}
	r.errorf(Span{start, start + 1}, CodeSyntax, "expected an element symbol, found %s", r.found(start))
	return false
}

// chiralRange gives the highest permutation number of each class
// (OpenSMILES 3.9).
var chiralRange = map[string]struct {
	class ChiralClass
	max   int
}{
	"TH": {ChiralTH, 2}, "AL": {ChiralAL, 2}, "SP": {ChiralSP, 3},
	"TB": {ChiralTB, 20}, "OH": {ChiralOH, 30},
}

// chirality reads '@', '@@' or '@' class number.
func (r *reader) chirality(a *Atom) {
	t := r.text
	if r.pos >= len(t) || t[r.pos] != '@' {
		return
	}
	start := r.pos
	r.pos++
	if r.pos < len(t) && t[r.pos] == '@' {
		r.pos++
		a.Chirality = Chirality{Class: ChiralTH, Num: 2, Short: true, Span: Span{start, r.pos}}
		return
	}
	if r.pos+1 < len(t) {
		if cls, ok := chiralRange[t[r.pos:r.pos+2]]; ok {
			r.pos += 2
			n, ok := r.number(2)
			span := Span{start, r.pos}
			if !ok || n < 1 || n > cls.max {
				r.errorf(span, CodeBadChirality, "expected @%s1 to @%s%d, found '%s'", t[start+1:start+3], t[start+1:start+3], cls.max, t[start:r.pos])
				a.Chirality = Chirality{Class: cls.class, Num: 0, Span: span}
				return
			}
			a.Chirality = Chirality{Class: cls.class, Num: n, Span: span}
			return
		}
	}
	a.Chirality = Chirality{Class: ChiralTH, Num: 1, Short: true, Span: Span{start, r.pos}}
}

// charge reads '+', '++', '+n', '-', '--', '-n' with n from 1 to 15.
func (r *reader) charge(a *Atom) {
	t := r.text
	if r.pos >= len(t) || (t[r.pos] != '+' && t[r.pos] != '-') {
		return
	}
	start := r.pos
	sign := 1
	if t[r.pos] == '-' {
		sign = -1
	}
	c := t[r.pos]
	r.pos++
	if r.pos < len(t) && t[r.pos] == c {
		r.pos++
		a.Charge = 2 * sign
		return
	}
	if n, ok := r.number(2); ok {
		if n > 15 {
			r.errorf(Span{start, r.pos}, CodeSyntax, "expected a charge from -15 to +15, found '%s'", t[start:r.pos])
			n = 15
		}
		a.Charge = n * sign
		return
	}
	a.Charge = sign
}

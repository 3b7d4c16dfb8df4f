package find

import (
	"slices"
	"strconv"
	"strings"

	"stereoline/notation"
	"stereoline/notation/smarts"
)

// Dialect is the line notation an occurrence is written in.
type Dialect uint8

// Dialects. The zero value is notation (SMILES and reaction SMILES), so
// code that predates query patterns keeps its meaning.
const (
	// DialectSMILES: SMILES or reaction SMILES, read by notation.Read.
	DialectSMILES Dialect = iota
	// DialectSMARTS: SMARTS or reaction SMARTS, a query pattern, read by
	// smarts.Read and never checked as SMILES.
	DialectSMARTS
)

// String returns "smiles" or "smarts".
func (d Dialect) String() string {
	if d == DialectSMARTS {
		return "smarts"
	}
	return "smiles"
}

// strength is how firmly a place says what a text is.
type strength uint8

const (
	// weakly: a variable, key or argument name (smiles = ..., patterns
	// = [...]); a text that reads as a word is not taken.
	weakly strength = iota + 1
	// firmly: a constructor of the notation (MolFromSmiles(...),
	// MolFromSmarts(...)), a pragma, a notation-only list field.
	firmly
)

// wants is what the place of a text says about it.
type wants struct {
	smiles, smarts strength
	// guess: nothing names the text; take it when it is unmistakably
	// notation or a query pattern.
	guess bool
	// loose: only a word that often names other things names the text
	// (pattern, template, rule, filter: patternWords); take it only when
	// it reads without error.
	loose bool
}

func (w wants) named() bool { return w.smiles > 0 || w.smarts > 0 }

// found is one record found in a one-line text: its bytes and dialect.
type found struct {
	from, to int
	dialect  Dialect
	// byContent: SMARTS because of what it holds (query primitives), not
	// because of where it is; such records make their group SMARTS.
	byContent bool
}

// decide splits a one-line text into records and says what each is, or
// returns nil when the text is not notation. A text holding several
// records separated by commas, semicolons or blanks (outside brackets,
// where commas and semicolons are SMARTS operators) is split only when
// every part is a record on its own; a firmly placed text that does not
// split is taken whole, as its constructor will read it.
func decide(text string, w wants) []found { return decideInto(nil, text, w) }

// decideInto is decide appending to buf, so that a caller deciding about
// many texts reuses one slice.
func decideInto(buf []found, text string, w wants) []found {
	if !w.named() && !w.guess {
		return buf
	}
	if n := len(text); n > 0 && (isBlank(text[0]) || isBlank(text[n-1])) {
		// Blanks around a record ("[C;H2] ") are no part of it.
		from, to := 0, n
		for from < to && isBlank(text[from]) {
			from++
		}
		for to > from && isBlank(text[to-1]) {
			to--
		}
		n0 := len(buf)
		out := decideInto(buf, text[from:to], w)
		for i := n0; i < len(out); i++ {
			out[i].from += from
			out[i].to += from
		}
		return out
	}
	if n, end := notation.RecordEnd(text); end == len(text) && end > n {
		// A CXSMILES extension block after the notation belongs to the
		// record; its '&', ',' and ';' are no query primitives and no
		// separators, so only the notation before it is decided on.
		n0 := len(buf)
		out := decideInto(buf, text[:n], w)
		if len(out) != n0+1 || out[n0].dialect != DialectSMILES {
			return buf
		}
		// A text nobody names is a record only when it reads without
		// error, its block too.
		if !w.named() && !notation.Reads(text) {
			return buf
		}
		out[n0].to = len(text)
		return out
	}
	if strings.IndexAny(text, ",; \t") >= 0 {
		if parts := splitParts(text); len(parts) > 1 {
			if out, ok := decideParts(text, parts, w); ok {
				return append(buf, out...)
			}
			if w.smiles < firmly && w.smarts < firmly {
				return buf
			}
		}
	}
	d, by, ok := decideOne(text, w, false)
	if !ok {
		return buf
	}
	return append(buf, found{from: 0, to: len(text), dialect: d, byContent: by})
}

// decideParts decides about a text holding separators: ok when it
// splits into parts that are each a record.
func decideParts(text string, parts [][2]int, w wants) ([]found, bool) {
	out := make([]found, 0, len(parts))
	// guessing, a part that only reads ("CC(=O)O") is a record beside
	// one that is unmistakably notation, as in a list (siblingRecord)
	sure, siblings := false, false
	for _, p := range parts {
		part := text[p[0]:p[1]]
		d, by, ok := decideOne(part, w, true)
		switch {
		case ok:
			sure = true
		case !w.named() && w.guess && siblingRecord(part):
			d, by, ok, siblings = DialectSMILES, false, true, true
		}
		if !ok {
			return nil, false
		}
		out = append(out, found{from: p[0], to: p[1], dialect: d, byContent: by})
	}
	if siblings && !sure {
		return nil, false
	}
	return out, true
}

// splitParts returns the byte ranges of the parts of text between
// commas, semicolons and blanks outside brackets; one range when there
// is no such separator.
func splitParts(text string) [][2]int {
	var out [][2]int
	depth, start := 0, 0
	for i := 0; i < len(text); i++ {
		switch c := text[i]; c {
		case '[':
			depth++
		case ']':
			if depth > 0 {
				depth--
			}
		case ',', ';', ' ', '\t':
			if (c == ',' || c == ';') && (depth > 0 || !separates(text, i)) {
				continue
			}
			if i > start {
				out = append(out, [2]int{start, i})
			}
			start = i + 1
		}
	}
	if start < len(text) {
		out = append(out, [2]int{start, len(text)})
	}
	if len(out) == 0 {
		return [][2]int{{0, len(text)}}
	}
	return out
}

// separates reports whether the comma or semicolon at i stands between
// two records rather than inside a SMARTS bond expression (C-,=C,
// C!@;-C): a record ends with an atom, a closing bracket or parenthesis
// or a ring digit, and the next starts with an atom.
func separates(text string, i int) bool {
	if i == 0 || i+1 >= len(text) {
		return true
	}
	p, n := text[i-1], text[i+1]
	before := p == ']' || p == ')' || p == '*' || p >= '0' && p <= '9' || p >= 'a' && p <= 'z' || p >= 'A' && p <= 'Z'
	after := n == '[' || n == '*' || n == ' ' || n >= 'a' && n <= 'z' || n >= 'A' && n <= 'Z'
	return before && after
}

// decideOne says what one record is. part says the record is one of
// several in its text, which must each be notation on their own.
func decideOne(s string, w wants, part bool) (d Dialect, byContent, ok bool) {
	d, byContent, ok = decideNamed(s, w, part)
	if ok && w.loose && w.named() {
		// a pattern named so is as often a word (an enum's "CO", a mode
		// "O"), a URL query ("a=b"), a regular expression's class
		// ([a-z0-9]*) or a glob's or expression's "match anything"
		// ("[ab].*", "**/x")
		ok = !accidentalWord(s) && !keyValueWords(s) && !characterRange(s) && !contradictoryBracket(s) &&
			!strings.Contains(s, ".*") && !strings.Contains(s, "**") &&
			(readsIn(d, s) || d == DialectSMILES && w.smiles > 0 && strings.Contains(s, ">"))
		// under a reaction name (w.smiles), a text with a reaction arrow
		// is a reaction even when it does not read: its errors are
		// reported ("CC(=O>>CC"), where an emoji is not taken
	}
	return d, byContent, ok
}

// readsIn reports whether s reads without error in dialect d.
func readsIn(d Dialect, s string) bool {
	if d == DialectSMARTS {
		return readsAsQuery(s)
	}
	return readsAsNotation(s)
}

// looseWord reports whether s is a word under a loose name that reads
// as notation, and in which dialect: one that decideOne does not take
// alone, but that a list of patterns may hold beside others. A pair of
// lowercase words joined by '=' counts as a word: under a name such as
// query it is a URL query's "a=b" far more often than a pattern.
func looseWord(s string, w wants) (Dialect, bool) {
	if !w.loose || !w.named() || !accidentalWord(s) && !keyValueWords(s) {
		return 0, false
	}
	d, _, ok := decideNamed(s, w, false)
	return d, ok && readsIn(d, s)
}

// keyValueWords reports whether s is two words of lowercase letters
// joined by '='.
func keyValueWords(s string) bool {
	k := strings.IndexByte(s, '=')
	if k <= 0 || k == len(s)-1 {
		return false
	}
	for i := 0; i < len(s); i++ {
		if i != k && (s[i] < 'a' || s[i] > 'z') {
			return false
		}
	}
	return true
}

// characterRange reports whether a bracket of s holds a range of
// characters as regular expressions and globs write them: two lowercase
// letters, two capitals or two digits joined by '-' ([a-z], [!b-d],
// [A-Z0-9]). Inside a SMARTS bracket '-' is a charge, which a primitive
// of another kind follows, or a bond of a recursive pattern, which is
// not looked at.
func characterRange(s string) bool {
	depth, parens := 0, 0
	for i := 0; i < len(s); i++ {
		switch c := s[i]; {
		case c == '[':
			depth++
		case c == ']':
			depth = max(depth-1, 0)
		case depth > 0 && c == '(':
			// a recursive pattern, $(N-C=O): '-' is a bond there
			parens++
		case depth > 0 && c == ')':
			parens = max(parens-1, 0)
		case depth > 0 && parens == 0 && c == '-' && i > 0 && i+1 < len(s):
			a, b := s[i-1], s[i+1]
			if 'a' <= a && a <= 'z' && 'a' <= b && b <= 'z' || 'A' <= a && a <= 'Z' && 'A' <= b && b <= 'Z' || isDigitByte(a) && isDigitByte(b) {
				return true
			}
		}
	}
	return false
}

func isDigitByte(c byte) bool { return '0' <= c && c <= '9' }

// decideNamed is decideOne before a loosely named text is held to
// reading without error.
func decideNamed(s string, w wants, part bool) (d Dialect, byContent, ok bool) {
	if !w.named() && !maybeQuery(s) {
		// The common case of a literal nobody names.
		return DialectSMILES, false, w.guess && unmistakable(s)
	}
	if !plausible(s) {
		return 0, false, false
	}
	query := queryContent(s)
	switch {
	case w.smiles == firmly:
		return DialectSMILES, false, true
	case w.smarts == firmly:
		return DialectSMARTS, query, true
	case query && w.named():
		// A word that happens to hold a or A (Arginine, WATER) is no
		// pattern unless it reads as one.
		if accidentalWord(s) && !readsAsQuery(s) {
			return 0, false, false
		}
		return DialectSMARTS, true, true
	case query:
		return DialectSMARTS, true, guessableQuery(s)
	case w.smarts == weakly && readsAsQuery(s) && (!accidentalWord(s) || readsAsNotation(s)):
		// A word under a pattern name is a pattern only when it spells
		// structure (I, CCO), not when it is a word (PAINS, none).
		return DialectSMARTS, false, true
	case w.smiles == weakly:
		if accidentalWord(s) && !readsAsNotation(s) {
			return 0, false, false
		}
		if part && !readsAsNotation(s) {
			return 0, false, false
		}
		return DialectSMILES, false, true
	case w.guess:
		return DialectSMILES, false, unmistakable(s)
	}
	return 0, false, false
}

// accidentalWord reports whether a text is shaped like a word or a label
// rather than notation: letters only (WATER, Arginine, smiles, CO), or
// letters with one run of digits (R1, R1a, A12). Such a text is notation
// only when a constructor or a notation-only field says so; under a
// mere name it is taken only when it reads without error.
func accidentalWord(s string) bool {
	runs, prevDigit := 0, false
	for i := 0; i < len(s); i++ {
		c := s[i]
		switch {
		case c >= '0' && c <= '9':
			if !prevDigit {
				runs++
			}
			prevDigit = true
		case c >= 'a' && c <= 'z' || c >= 'A' && c <= 'Z':
			prevDigit = false
		default:
			return false
		}
	}
	return runs <= 1
}

// readsAsNotation reports whether s reads as SMILES without an error
// (warnings allowed).
func readsAsNotation(s string) bool {
	return notation.Reads(s)
}

// readsAsQuery reports whether s reads as SMARTS without an error and
// names at least one element (a wildcard alone, "*", is a glob rather
// than a pattern).
func readsAsQuery(s string) bool {
	return hasElementAtom(s) && smarts.Valid(s)
}

// hasElementAtom reports whether s holds an element: an organic-subset
// letter outside brackets or an element or atomic number inside.
func hasElementAtom(s string) bool {
	depth := 0
	for i := 0; i < len(s); i++ {
		switch c := s[i]; {
		case c == '[':
			depth++
		case c == ']':
			depth--
		case c == 'B', c == 'C', c == 'N', c == 'O', c == 'P', c == 'S', c == 'F', c == 'I',
			c == 'b', c == 'c', c == 'n', c == 'o', c == 'p', c == 's', c == '#':
			return true
		case depth > 0 && c >= 'A' && c <= 'Z':
			// an element in brackets: [H], [Li], [Se]; not a primitive
			// of another kind ([AZ], [D3])
			if i+1 < len(s) && s[i+1] >= 'a' && s[i+1] <= 'z' {
				if _, ok := notation.ElementNumber(s[i : i+2]); ok {
					return true
				}
			}
			if _, ok := notation.ElementNumber(s[i : i+1]); ok {
				return true
			}
		}
	}
	return false
}

// guessableQuery is the test for a query pattern nobody names: it reads
// as SMARTS without an error, names an element, and holds a primitive
// that only a query pattern has (an atomic number, a logical operator
// in brackets, a recursive pattern, a bond query), not merely a
// bracketed range such as [a-z], which regular expressions write too.
func guessableQuery(s string) bool {
	if len(s) < 3 || !hasElementAtom(s) && !strings.Contains(s, "$(") || !strongQuery(s) || characterRange(s) {
		return false
	}
	if s[0] == '[' && strings.IndexByte(s, ']') == len(s)-1 && !strings.ContainsAny(s, "#$,;&") {
		// one bracket atom of letters, '!' and charges ("[!b-]",
		// "[!AZ]") is a glob's or a regular expression's class as often;
		// an atomic number, a list or a conjunction ([Cl,Br,I]) is not
		return false
	}
	if !strings.ContainsAny(s, "[0123456789") {
		// no bracket atom and no ring: letters joined by operators
		// ("a@b@c", "a/b*c") are addresses, paths and arithmetic far
		// more often than patterns nobody names
		return false
	}
	if contradictoryBracket(s) || letterList(s) {
		return false
	}
	return smarts.Valid(s)
}

// letterList reports a text that is one bracket holding a comma list of
// single capital letters ("[A,B]", "[B,C]"): a commutator, an index pair
// or a list of variables in prose and formulas far more often than a
// pattern nobody names; a list with a two-letter symbol, a number or a
// condition ("[Cl,Br,I]", "[N,O;H1]") is not one.
func letterList(s string) bool {
	if len(s) < 5 || s[0] != '[' || s[len(s)-1] != ']' {
		return false
	}
	items := strings.Split(s[1:len(s)-1], ",")
	if len(items) < 2 {
		return false
	}
	for _, it := range items {
		if len(it) != 1 || it[0] < 'A' || it[0] > 'Z' {
			return false
		}
	}
	return true
}

// contradictoryBracket reports a bracket atom that requires two elements
// at once ("a[b;c]", a compound expression of another language: aromatic
// boron and aromatic carbon), which no atom matches and no pattern
// writes: among its parts joined by the AND operators ; and &, two that
// are each one element (a symbol or #n) and name different elements, or
// one element both aromatic and aliphatic. A string with a recursive
// pattern is not looked at.
func contradictoryBracket(s string) bool {
	for i := 0; i < len(s); i++ {
		if s[i] == '$' && i+1 < len(s) && s[i+1] == '(' {
			return false // the brackets are nested: not worth reading
		}
		if s[i] != '[' {
			continue
		}
		end := strings.IndexByte(s[i+1:], ']')
		if end < 0 {
			return false
		}
		inner := s[i+1 : i+1+end]
		i += end + 1
		var num int
		var sym string
		for _, part := range strings.FieldsFunc(inner, func(r rune) bool { return r == ';' || r == '&' }) {
			if implicitElements(part) {
				return true
			}
			n, ps, ok := oneElement(part)
			if !ok {
				continue
			}
			switch {
			case num == 0:
				num, sym = n, ps
			case n != num || ps != "" && sym != "" && ps != sym:
				return true
			case sym == "":
				sym = ps
			}
		}
	}
	return false
}

// aromaticSymbols are the aromatic element symbols of SMARTS bracket
// atoms (OpenSMILES 3.5 and Daylight SMARTS 4.1: b c n o p s, se as).
var aromaticSymbols = map[string]bool{"b": true, "c": true, "n": true, "o": true, "p": true, "s": true, "se": true, "as": true}

// implicitElements reports a part of lowercase letters only that reads
// as aromatic symbols joined by the implicit AND of SMARTS (Daylight
// SMARTS theory manual, 4.1: adjacent primitives are ANDed) and names two
// different elements: "san" is s, a and n, an atom both sulfur and
// nitrogen, which an INI section header ("[san]") is far more often.
func implicitElements(part string) bool {
	if len(part) < 2 {
		return false
	}
	first := ""
	for i := 0; i < len(part); {
		var sym string
		switch {
		case i+1 < len(part) && aromaticSymbols[part[i:i+2]]:
			sym = part[i : i+2]
		case aromaticSymbols[part[i:i+1]]:
			sym = part[i : i+1]
		case part[i] == 'a':
			i++ // any aromatic atom: no element
			continue
		default:
			return false // not aromatic symbols alone
		}
		i += len(sym)
		switch {
		case first == "":
			first = sym
		case sym != first:
			return true
		}
	}
	return false
}

// oneElement reads a part of a bracket atom's expression that is one
// element alone: a symbol (sym is it, aromatic in lower case) or an
// atomic number #n (sym is "").
func oneElement(part string) (num int, sym string, ok bool) {
	if strings.HasPrefix(part, "#") {
		n, err := strconv.Atoi(part[1:])
		return n, "", err == nil && n > 0 && n < 119
	}
	if aromaticSymbols[part] {
		n, ok := notation.ElementNumber(strings.ToUpper(part[:1]) + part[1:])
		return n, part, ok
	}
	if part == "" || part[0] < 'A' || part[0] > 'Z' || part == "H" {
		// a lone H after an element counts hydrogens ([N;H])
		return 0, "", false
	}
	n, ok := notation.ElementNumber(part)
	return n, part, ok
}

// strongQuery reports primitives that regular expressions and globs do
// not write: #n, ; & ! inside brackets, $( , and ~ or @ or ! between
// atoms.
func strongQuery(s string) bool {
	depth := 0
	for i := 0; i < len(s); i++ {
		c := s[i]
		switch {
		case c == '[' && elementList(s[i+1:]):
			return true
		case c == '[':
			depth++
		case c == ']':
			depth--
		case c == '$' && i+1 < len(s) && s[i+1] == '(':
			return true
		case depth > 0 && (c == ';' || c == '&' || c == '!'):
			return true
		case depth > 0 && c == '#' && i+1 < len(s) && s[i+1] >= '0' && s[i+1] <= '9':
			return true
		case depth == 0 && (c == '~' || c == '!' || c == '@'):
			return true
		}
	}
	return false
}

// elementList reports whether the bracket that s starts inside holds a
// comma-separated list of at least two different atoms ([Cl,Br,I],
// [N,O;H1]), which no regular expression's class looks like.
func elementList(s string) bool {
	end := strings.IndexByte(s, ']')
	if end < 0 {
		return false
	}
	inner := s[:end]
	if k := strings.IndexByte(inner, ';'); k >= 0 {
		inner = inner[:k]
	}
	items := strings.Split(inner, ",")
	if len(items) < 2 {
		return false
	}
	for k, it := range items {
		if it == "" || !smilesBracket(it) || slices.Contains(items[:k], it) {
			// an item twice ("[O,O]", a C format string) is no list a
			// pattern writes
			return false
		}
	}
	return true
}

// queryContent reports whether s holds something SMARTS has and SMILES
// lacks, so that it can only be a query pattern: a bracket atom that is
// no SMILES bracket atom ([#6], [c;x2], [C,N], [CH2;R], [$(C=O)]), a
// bond query or a wildcard bond (!@, -@, ~, a comma or semicolon between
// atoms), or a reaction whose atoms carry
// maps and that has unbracketed wildcards (a reaction template such as
// [C:1]=[C:2]>>[C:1]*.*[C:2]).
func queryContent(s string) bool {
	if strings.IndexByte(s, '|') > 0 {
		// A CXSMILES extension block is no part of the pattern: its '&'
		// and ',' say nothing about the notation before it.
		if n, end := notation.RecordEnd(s); end == len(s) && end > n {
			s = s[:n]
		}
	}
	maps, star, arrow := false, false, false
	for i := 0; i < len(s); i++ {
		c := s[i]
		switch c {
		case '[':
			end := strings.IndexByte(s[i+1:], ']')
			if end < 0 {
				return false
			}
			inner := s[i+1 : i+1+end]
			if !smilesBracket(inner) && queryBracket(inner) {
				return true
			}
			if strings.IndexByte(inner, ':') >= 0 {
				maps = true
			}
			i += end + 1
		case '~', '!', '@', ',', ';', '&':
			return true
		case '*':
			star = true
		case '>':
			arrow = true
		}
	}
	return arrow && maps && star
}

// queryBracket reports whether the inside of a bracket atom that is no
// SMILES bracket atom is a query atom: it holds an operator or atomic
// number (; & , ! $ #), or reads as a SMARTS atom ([CR2], [D3]). A
// bracket that is neither ([Xy], [cl]) is broken notation, not a
// pattern.
func queryBracket(inner string) bool {
	if strings.ContainsAny(inner, ";&,!$#") {
		return true
	}
	return smarts.Valid("[" + inner + "]")
}

// smilesBracket reports whether the inside of a bracket atom follows the
// OpenSMILES grammar: isotope? symbol chiral? hcount? charge? class?
// (section 2, bracket_atom).
func smilesBracket(b string) bool {
	i := 0
	for i < len(b) && b[i] >= '0' && b[i] <= '9' {
		i++
	}
	// symbol: an element, an aromatic symbol or '*'
	switch {
	case i < len(b) && b[i] == '*':
		i++
	case i+1 < len(b) && isAromaticPair(b[i:i+2]):
		i += 2
	case i < len(b) && strings.IndexByte("bcnops", b[i]) >= 0:
		i++
	case i < len(b) && b[i] >= 'A' && b[i] <= 'Z':
		if i+1 < len(b) && b[i+1] >= 'a' && b[i+1] <= 'z' {
			if _, ok := notation.ElementNumber(b[i : i+2]); ok {
				i += 2
				break
			}
		}
		if _, ok := notation.ElementNumber(b[i : i+1]); !ok {
			return false
		}
		i++
	default:
		return false
	}
	if i < len(b) && b[i] == '@' {
		i++
		if i < len(b) && b[i] == '@' {
			i++
		} else if i+1 < len(b) && strings.Contains("TH AL SP TB OH", b[i:i+2]) && b[i] >= 'A' && b[i] <= 'Z' {
			i += 2
			for i < len(b) && b[i] >= '0' && b[i] <= '9' {
				i++
			}
		}
	}
	if i < len(b) && b[i] == 'H' {
		i++
		for i < len(b) && b[i] >= '0' && b[i] <= '9' {
			i++
		}
	}
	if i < len(b) && (b[i] == '+' || b[i] == '-') {
		sign := b[i]
		i++
		if i < len(b) && b[i] == sign {
			i++
		} else {
			for i < len(b) && b[i] >= '0' && b[i] <= '9' {
				i++
			}
		}
	}
	if i < len(b) && b[i] == ':' {
		i++
		d := i
		for i < len(b) && b[i] >= '0' && b[i] <= '9' {
			i++
		}
		if i == d {
			return false
		}
	}
	return i == len(b)
}

func isAromaticPair(s string) bool { return s == "se" || s == "as" || s == "te" }

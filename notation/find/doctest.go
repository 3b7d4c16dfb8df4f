package find

import (
	"bytes"
	"sort"

	"stereoline/notation"
)

// Doctests (the Python standard library's doctest module): lines of a
// docstring that start, after blanks, with the prompt ">>> " hold code,
// and lines starting with "... " right after them continue it. That code
// is Python like any other: Chem.MolFromSmiles('CCO') there names its
// argument as it would in the module.

// docString reports whether an unnamed literal is worth reading as a
// docstring: one triple-quoted piece with doctest lines or a run of
// notation bytes with a mark, digit or bracket in it (evidenceRun), the
// only kind of token its prose could hold unmistakable notation in.
func docString(src []byte, lit *literal) bool {
	if len(lit.pieces) != 1 || len(lit.pieces[0].quote) != 3 || lit.pieces[0].template {
		return false
	}
	c := src[lit.pieces[0].content.Start:lit.pieces[0].content.End]
	return bytes.Contains(c, []byte(">>>")) || evidenceRun(c)
}

// doctest reads the code of the doctest lines of a literal: the literal
// is decoded as Python decodes it, everything but the code after the
// prompts is blanked out (offsets kept, so positions carry over), the
// result is searched as Python code, and what is found is lifted through
// the literal's map to the file.
func (cf *codeFinder) doctest(lit *literal) {
	n0 := len(cf.out)
	defer func() {
		// Prose and code were searched apart: host order again.
		added := cf.out[n0:]
		sort.SliceStable(added, func(i, j int) bool { return added[i].Span.Start < added[j].Span.Start })
	}()
	d := &decoded{}
	m := cf.decode(lit, d)
	code := doctestCode(d.text)
	cf.prose(lit, d, &m, code)
	if code == nil {
		return
	}
	inner := &codeFinder{src: code, lang: cf.lang, cfg: cf.cfg, nm: cf.nm, prag: newPragmas(code), inner: true}
	inner.walk(cf.lang.lex(code, inner.prag))
	inner.agree()
	if len(inner.out) == 0 {
		return
	}
	var encode func(string) string
	if !lit.pieces[0].raw {
		encode = doubleBackslashes
	}
	lift(inner.out, m, encode)
	// The groups of the doctest code are its own: their numbers are
	// moved past those of the file.
	cf.doctests++
	base := int32(cf.doctests) << 20
	for _, o := range inner.out {
		if !cf.prag.allowed(o.Span.Start) {
			continue
		}
		if o.group.key != 0 {
			o.group.key += base
		}
		cf.out = append(cf.out, o)
	}
}

// prose takes the unmistakable notation of the lines of a docstring that
// are no doctest code (its prose, and the expected output of doctests,
// where results are often notation), token by token as templates are
// read: a token is a run of text between blanks, with a trailing '.',
// ',', ';' or ':' of the sentence dropped.
func (cf *codeFinder) prose(lit *literal, d *decoded, m *offsetMap, code []byte) {
	text := d.text
	for start := 0; start < len(text); {
		var end int
		start, end = nextWord(text, start)
		tok := end
		for tok > start && (text[tok-1] == '.' || text[tok-1] == ',' || text[tok-1] == ';' || text[tok-1] == ':') {
			tok--
		}
		if e, dia, ok := withBlock(text, start, end); ok && (code == nil || code[start] == ' ') && cf.prag.allowed(m.host(start)) {
			cf.emit(lit, d, m, start, e, "", ReasonGuess, dia, groupMark{})
			start = e
			continue
		}
		if tok > start && (code == nil || code[start] == ' ') && cf.prag.allowed(m.host(start)) {
			s := string(text[start:tok])
			switch {
			case unmistakable(s):
				cf.emit(lit, d, m, start, tok, "", ReasonGuess, DialectSMILES, groupMark{})
			case queryContent(s) && guessableQuery(s):
				cf.emit(lit, d, m, start, tok, "", ReasonGuess, DialectSMARTS, groupMark{})
			}
		}
		start = end
	}
}

// withBlock reads the word text[start:end] with the CXSMILES extension
// block after it on its line, when one follows: it returns where the
// block ends and the dialect when the whole is a record a guess takes.
func withBlock[T ~string | ~[]byte](text T, start, end int) (blockEnd int, dialect Dialect, ok bool) {
	e := blockAfter(text, start, end)
	if e == end {
		return end, 0, false
	}
	rs := decide(string(text[start:e]), wants{guess: true})
	if len(rs) != 1 || rs[0].from != 0 || rs[0].to != e-start {
		return end, 0, false
	}
	return e, rs[0].dialect, true
}

// blockAfter returns where the CXSMILES extension block after the token
// text[start:end] ends, when one follows it on its line after blanks
// ("C[C@H](F)Cl |&1:1|"); end when none does.
func blockAfter[T ~string | ~[]byte](text T, start, end int) int {
	p := end
	for p < len(text) && (text[p] == ' ' || text[p] == '\t') {
		p++
	}
	if p == end || p >= len(text) || text[p] != '|' {
		return end
	}
	// to the closing bar on the line: a block is short, so the cost is
	// the block's, not the line's
	q := p + 1
	for q < len(text) && text[q] != '|' && text[q] != '\n' {
		q++
	}
	if q >= len(text) || text[q] != '|' {
		return end
	}
	n, e := notation.RecordEnd(text[start : q+1])
	if n != end-start || e != q+1-start {
		return end
	}
	return q + 1
}

// doctestCode returns text with everything but the code of its doctest
// lines blanked out (line breaks kept), or nil when it has none.
func doctestCode(text []byte) []byte {
	code := bytes.Repeat([]byte{' '}, len(text))
	found, inCode := false, false
	for start := 0; start < len(text); {
		line, next := nextLine(text, start)
		if next <= len(text) && next > 0 && text[next-1] == '\n' {
			code[next-1] = '\n'
		}
		k := 0
		for k < len(line) && (line[k] == ' ' || line[k] == '\t') {
			k++
		}
		rest := line[k:]
		switch {
		case bytes.HasPrefix(rest, []byte(">>> ")) || bytes.Equal(bytes.TrimRight(rest, "\r"), []byte(">>>")):
			found, inCode = true, true
			copy(code[start+k+3:start+len(line)], line[k+3:])
		case inCode && (bytes.HasPrefix(rest, []byte("... ")) || bytes.Equal(bytes.TrimRight(rest, "\r"), []byte("..."))):
			copy(code[start+k+3:start+len(line)], line[k+3:])
		default:
			inCode = false
		}
		start = next
	}
	if !found {
		return nil
	}
	return code
}

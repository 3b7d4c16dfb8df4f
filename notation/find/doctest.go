package find

import "bytes"

// Doctests (the Python standard library's doctest module): lines of a
// docstring that start, after blanks, with the prompt ">>> " hold code,
// and lines starting with "... " right after them continue it. That code
// is Python like any other: Chem.MolFromSmiles('CCO') there names its
// argument as it would in the module.

// docTests reports whether a literal may hold doctest lines.
func docTests(src []byte, lit *literal) bool {
	for k := range lit.pieces {
		c := lit.pieces[k].content
		if bytes.Contains(src[c.Start:c.End], []byte(">>>")) {
			return true
		}
	}
	return false
}

// doctest reads the code of the doctest lines of a literal: the literal
// is decoded as Python decodes it, everything but the code after the
// prompts is blanked out (offsets kept, so positions carry over), the
// result is searched as Python code, and what is found is lifted through
// the literal's map to the file.
func (cf *codeFinder) doctest(lit *literal) {
	d := &decoded{}
	m := cf.decode(lit, d)
	code := doctestCode(d.text)
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

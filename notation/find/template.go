package find

import "strings"

// Templates are literals formatted at run time: Python f- and t-strings,
// JavaScript template literals with substitutions, Kotlin (and Julia)
// strings with $name or ${...} templates, and format strings
// (format.go). Only their fixed text is known, and it is a layout of
// values rather than a value: in
// f"{cid}\tC[C@H](N)C(=O)O" the record is the token after the tab. So a
// template is searched token by token, a token being a run of fixed text
// between blanks (spaces, tabs, line ends, and the \t, \n and \r escapes
// that stand for them) and the ends of the literal. A token touching a
// replacement field is part of a value built at run time
// (f"C{n}CO", f"{prefix}/F") and is never taken; nor is anything that
// spans a field.
//
// A template is taken
//   - when a name or pragma says so and it has no field at all (a
//     template without fields is a plain literal);
//   - with several lines under a name or pragma: as a record list, one
//     record a line, when the record is whole fixed text;
//   - otherwise token by token, each token that is unmistakably notation
//     (or, under a "stereoline: notation" pragma, each token).

// templateLiteral decides about a template literal (see above).
func (cf *codeFinder) templateLiteral(lit *literal, w wants, reason Reason, mark groupMark) {
	named := w.named()
	forced := reason == ReasonPragma
	if !named && (!w.guess || !mayGuessTemplate(cf.src, lit)) {
		return
	}
	d := &decoded{}
	m := cf.decode(lit, d)
	if lit.format != formatNone {
		d.text, m = collapseFields(d.text, m, lit.format)
	}
	text := string(d.text)
	if named {
		switch {
		case strings.IndexByte(text, '\n') >= 0:
			cf.records(lit, d, &m, text, w, reason, mark)
			return
		case strings.IndexByte(text, holeByte) < 0:
			if forced && text != "" {
				cf.emit(lit, d, &m, 0, len(text), "", reason, dialectOf(text), mark)
				return
			}
			for _, r := range decide(text, w) {
				mk := mark
				mk.byContent = r.byContent
				cf.emit(lit, d, &m, r.from, r.to, "", reason, r.dialect, mk)
			}
			return
		}
		// One line with fields: its tokens, as if unnamed.
	}
	guess := w.guess || named
	for start := 0; start < len(text); {
		var end int
		start, end = nextWord(text, start)
		tok := text[start:end]
		if tok == "" || strings.IndexByte(tok, holeByte) >= 0 || !cf.prag.allowed(m.host(start)) {
			start = end
			continue
		}
		if e, dia, ok := withBlock(text, start, end); ok && guess && !forced && strings.IndexByte(text[start:e], holeByte) < 0 {
			cf.emit(lit, d, &m, start, e, "", ReasonGuess, dia, mark)
			start = e
			continue
		}
		switch {
		case forced:
			cf.emit(lit, d, &m, start, end, "", ReasonPragma, dialectOf(tok), mark)
		case guess && unmistakable(tok):
			cf.emit(lit, d, &m, start, end, "", ReasonGuess, DialectSMILES, mark)
		case guess && queryContent(tok) && guessableQuery(tok):
			mk := mark
			mk.byContent = true
			cf.emit(lit, d, &m, start, end, "", ReasonGuess, DialectSMARTS, mk)
		}
		start = end
	}
}

// dialectOf is the dialect a text forced by a pragma is read in: a query
// pattern when its content says so.
func dialectOf(text string) Dialect {
	if queryContent(text) {
		return DialectSMARTS
	}
	return DialectSMILES
}

func isTokenBlank(c byte) bool { return c == ' ' || c == '\t' || c == '\r' || c == '\n' }

// nextWord returns the bounds of the first run of text from start on
// between blanks (the tokens prose and templates are read by); start ==
// end == len(text) when none is left.
func nextWord[T ~string | ~[]byte](text T, start int) (from, to int) {
	for start < len(text) && isTokenBlank(text[start]) {
		start++
	}
	end := start
	for end < len(text) && !isTokenBlank(text[end]) {
		end++
	}
	return start, end
}

// mayGuessTemplate is the quick test of mayGuess for templates: an
// unmistakable token is at least three notation bytes of fixed text with
// a mark, ring digit, bracket or class among them, and without such a
// run in the host bytes no token can be. Most templates (messages, paths,
// keys) fail here before they are decoded.
func mayGuessTemplate(src []byte, lit *literal) bool {
	for k := range lit.pieces {
		pc := &lit.pieces[k]
		from := pc.content.Start
		for _, h := range pc.holes {
			if evidenceRun(src[from:h.Start]) {
				return true
			}
			from = h.End
		}
		if evidenceRun(src[from:pc.content.End]) {
			return true
		}
	}
	return false
}

// evidenceRun reports whether b has three or more consecutive notation
// bytes, one of which is a mark, digit, bracket or '%'.
func evidenceRun(b []byte) bool {
	n, evidence := 0, false
	for _, c := range b {
		if !notationByte[c] {
			n, evidence = 0, false
			continue
		}
		n++
		switch {
		case c == '@' || c == '/' || c == '\\' || c == '[' || c == '%' || c >= '0' && c <= '9':
			evidence = true
		}
		if evidence && n >= 3 {
			return true
		}
	}
	return false
}

package find

import (
	"bytes"
	"sort"
	"strings"

	"stereoline/notation"
)

// findRST reads a reStructuredText document (the markup of Sphinx
// documentation; Docutils, "reStructuredText Markup Specification"):
//   - the code of doctest lines (">>> ", "... ", Python's doctest module)
//     anywhere in the document is read as Python: doctest blocks, literal
//     blocks and the doctest directive alike;
//   - the body of a code-block, code or sourcecode directive tagged with a
//     language we lex is read as that language, and the bodies of
//     testcode, ipython and jupyter-execute directives as Python;
//   - a line of a literal block (after a paragraph ending in "::") or of a
//     code block tagged text, or of none, is a record when it starts with
//     unmistakable notation, as in an untagged Markdown fence;
//   - the rest (prose, inline literals “...“, expected output) is read
//     token by token, as the prose of a docstring: unmistakable notation,
//     a query pattern by its content, or an inline literal the words just
//     before name ("SMILES “CCO“").
func findRST(src []byte, cfg *Config) []Occurrence {
	prag := newPragmas(src)
	nm := newNamer(cfg)
	var out []Occurrence
	blocks := rstBlocks(src)
	code := doctestCode(src)
	if code != nil {
		// the doctest lines, blanked elsewhere (offsets are the file's),
		// but those of a block read as another language
		for _, b := range blocks {
			if b.kind != KindUnknown && b.kind != KindPython {
				for i := b.start; i < b.end; i++ {
					if code[i] != '\n' {
						code[i] = ' '
					}
				}
			}
		}
		for _, o := range FindKind(KindPython, code, *cfg) {
			if prag.allowed(o.Span.Start) {
				out = append(out, o)
			}
		}
	}
	for _, b := range blocks {
		body := src[b.start:b.end]
		switch {
		case b.kind != KindUnknown:
			if b.kind == KindPython && bytes.Contains(body, []byte(">>>")) {
				continue // its doctest lines are read above
			}
			inner := FindKind(b.kind, body, *cfg)
			lift(inner, identityMap(b.start, len(body)), nil)
			for _, o := range inner {
				if prag.allowed(o.Span.Start) {
					out = append(out, o)
				}
			}
		case b.guess:
			first := len(out)
			if !cfg.NoGuess {
				for start := b.start; start < b.end; {
					line, next := nextLine(src[:b.end], start)
					if t := bytes.TrimLeft(line, " \t"); !bytes.HasPrefix(t, []byte(">>>")) && !bytes.HasPrefix(t, []byte("...")) {
						n := len(out)
						out = guessedFenceRecord(out, line, start, prag)
						for k := n; k < len(out); k++ {
							out[k].Kind = KindRST
						}
					}
					start = next
				}
			}
			if bytes.Contains(body, []byte(">>>")) {
				continue // its doctest lines are read above
			}
			// Sphinx highlights literal blocks as Python unless told
			// otherwise (its highlight_language): their code is read as
			// Python too, but for the lines taken as records
			guessed := out[first:]
			inner := FindKind(KindPython, body, *cfg)
			lift(inner, identityMap(b.start, len(body)), nil)
			for _, o := range inner {
				if prag.allowed(o.Span.Start) && !overlapsAny(o.Span, guessed) {
					out = append(out, o)
				}
			}
		}
	}
	out = rstProse(out, src, code, blocks, prag, nm, cfg)
	sort.SliceStable(out, func(i, j int) bool { return out[i].Span.Start < out[j].Span.Start })
	return out
}

// overlapsAny reports whether s overlaps the span of one of occs.
func overlapsAny(s notation.Span, occs []Occurrence) bool {
	for _, o := range occs {
		if s.Start < o.Span.End && o.Span.Start < s.End {
			return true
		}
	}
	return false
}

// rstBlock is the body of a directive or a literal block: the lines after
// it indented more than it, from start to end (offsets of the file).
type rstBlock struct {
	start, end int
	kind       Kind // the language its body is read as; KindUnknown for none
	guess      bool // its lines are guessed (literal blocks, text)
}

// rstBlocks finds the code directives and literal blocks of a document.
func rstBlocks(src []byte) []rstBlock {
	var blocks []rstBlock
	paraEndsLiteral, paraIndent := false, 0
	for start := 0; start < len(src); {
		line, next := nextLine(src, start)
		indent := leadingBlanks(line)
		body := bytes.TrimRight(line[indent:], " \t\r")
		if len(body) == 0 {
			if paraEndsLiteral {
				end := rstBody(src, next, paraIndent)
				if end > next {
					blocks = append(blocks, rstBlock{start: next, end: end, guess: true})
					start = end
					paraEndsLiteral = false
					continue
				}
			}
			paraEndsLiteral = false
			start = next
			continue
		}
		if kind, guess, ok := rstDirective(body); ok {
			bodyStart := skipOptions(src, next, indent)
			end := rstBody(src, bodyStart, indent)
			if end > bodyStart {
				blocks = append(blocks, rstBlock{start: bodyStart, end: end, kind: kind, guess: guess})
			}
			paraEndsLiteral = false
			start = max(end, next)
			continue
		}
		// A paragraph ending in "::" introduces a literal block (an
		// expanded form "Paragraph::" or a lone "::").
		paraEndsLiteral = bytes.HasSuffix(body, []byte("::")) && !bytes.HasPrefix(body, []byte(".. "))
		paraIndent = indent
		start = next
	}
	return blocks
}

// rstDirective reads a directive line (".. code-block:: python"): the
// language its body is read as, or whether its lines are guessed.
func rstDirective(body []byte) (kind Kind, guess, ok bool) {
	if !bytes.HasPrefix(body, []byte(".. ")) {
		return 0, false, false
	}
	name, arg, found := strings.Cut(string(body[3:]), "::")
	if !found {
		return 0, false, false
	}
	lang := strings.ToLower(strings.TrimSpace(arg))
	if f := strings.Fields(lang); len(f) > 0 {
		lang = f[0]
	}
	switch strings.TrimSpace(name) {
	case "code-block", "code", "sourcecode":
		switch lang {
		case "", "text", "none", "txt", "smiles", "smi":
			return KindUnknown, true, true
		}
		k := KindFor(lang)
		if k == KindUnknown {
			k = fenceAliases[lang]
		}
		if k == KindUnknown {
			// pycon, console, bash, ...: not read, but its doctest lines are
			return KindUnknown, false, true
		}
		return k, false, true
	case "testcode", "ipython", "jupyter-execute":
		return KindPython, false, true
	case "doctest", "testoutput":
		return KindUnknown, false, true
	}
	return 0, false, false
}

// skipOptions returns where the body of a directive starts: after its
// option lines (":linenos:", ":caption: x"), indented more than it.
func skipOptions(src []byte, from, indent int) int {
	for start := from; start < len(src); {
		line, next := nextLine(src, start)
		k := leadingBlanks(line)
		t := bytes.TrimRight(line[k:], " \t\r")
		if k <= indent || len(t) == 0 || t[0] != ':' || bytes.Count(t, []byte(":")) < 2 {
			return start
		}
		start = next
	}
	return len(src)
}

// rstBody returns where the block starting at from ends: at the first
// line that is not blank and indented no more than indent.
func rstBody(src []byte, from, indent int) int {
	end := from
	for start := from; start < len(src); {
		line, next := nextLine(src, start)
		k := leadingBlanks(line)
		if len(bytes.TrimSpace(line)) > 0 {
			if k <= indent {
				break
			}
			end = next
		}
		start = next
	}
	return end
}

func leadingBlanks(line []byte) int {
	k := 0
	for k < len(line) && (line[k] == ' ' || line[k] == '\t') {
		k++
	}
	return k
}

// rstProse takes the notation of the text outside code blocks (blocks,
// in order and apart, as rstBlocks finds them) and doctest code, token by
// token.
func rstProse(out []Occurrence, src, code []byte, blocks []rstBlock, prag *pragmas, nm namer, cfg *Config) []Occurrence {
	// inBlock reports whether off, which only grows from call to call,
	// lies in a block
	bi := 0
	inBlock := func(off int) bool {
		for bi < len(blocks) && blocks[bi].end <= off {
			bi++
		}
		return bi < len(blocks) && blocks[bi].start <= off
	}
	add := func(from, to int, reason Reason, dialect Dialect) {
		out = append(out, Occurrence{
			Text:      string(src[from:to]),
			Span:      notation.Span{Start: from, End: to},
			Kind:      KindRST,
			Construct: ConstructInlineCode,
			Reason:    reason,
			Dialect:   dialect,
			m:         identityMap(from, to-from),
		})
	}
	for start := 0; start < len(src); {
		var end int
		start, end = nextWord(src, start)
		from, to := start, end
		if from >= len(src) || inBlock(from) || code != nil && code[from] != ' ' || !prag.allowed(from) {
			start = end
			continue
		}
		if bytes.HasPrefix(src[from:], []byte("``")) {
			// an inline literal, which may hold blanks ("``C[C@H](F)Cl
			// |&1:1|``"): to its closing backquotes on the same line
			if k := closingBackquotes(src[from+2:]); k > 0 {
				from, to = from+2, from+2+k
				s := string(src[from:to])
				w := wants{guess: !cfg.NoGuess}
				reason := ReasonGuess
				if namedBefore(nil, wordsBefore(src, start), nm) {
					w, reason = wants{smiles: firmly}, ReasonName
				}
				if plausible(s) {
					for _, r := range decide(s, w) {
						if r.dialect == DialectSMILES && queryContent(s[r.from:r.to]) && reason == ReasonName {
							r.dialect = DialectSMARTS
						}
						add(from+r.from, from+r.to, reason, r.dialect)
					}
				}
				start = to + 2
				continue
			}
		}
		if e, dia, ok := withBlock(src, from, end); ok && !cfg.NoGuess {
			add(from, e, ReasonGuess, dia)
			start = e
			continue
		}
		for to > from && strings.IndexByte(".,;:", src[to-1]) >= 0 {
			to--
		}
		if to > from && !cfg.NoGuess {
			switch s := string(src[from:to]); {
			case unmistakable(s):
				add(from, to, ReasonGuess, DialectSMILES)
			case queryContent(s) && guessableQuery(s):
				add(from, to, ReasonGuess, DialectSMARTS)
			}
		}
		start = end
	}
	return out
}

// closingBackquotes returns where the first pair of backquotes of b lies
// on its first line, or -1: the cost is the distance to it or to the
// line's end.
func closingBackquotes(b []byte) int {
	for k := 0; k < len(b); {
		j := bytes.IndexAny(b[k:], "`\n")
		if j < 0 || b[k+j] == '\n' {
			return -1
		}
		k += j
		if k+1 < len(b) && b[k+1] == '`' {
			return k
		}
		k++
	}
	return -1
}

// wordsBefore returns the text before off on its line, at most the 64
// bytes namedBefore looks at.
func wordsBefore(src []byte, off int) []byte {
	b := src[max(0, off-64):off]
	if k := bytes.LastIndexByte(b, '\n'); k >= 0 {
		b = b[k+1:]
	}
	return b
}

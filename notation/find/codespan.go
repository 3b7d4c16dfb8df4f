package find

import (
	"bytes"
	"strings"

	"stereoline/notation"
)

// Code spans (CommonMark 0.31, 6.1 "Code spans"): a backtick string opens
// a span that the next backtick string of the same length closes, within
// the paragraph; a backtick string no such string follows is literal
// text. Line endings inside a span become spaces, and one space is
// stripped from both ends when both ends have one and the span is not all
// spaces.
//
// Spans are read over the whole paragraph, so a span that closes on the
// next line closes there and its closing backticks open nothing. A
// paragraph here ends at a blank line, a fence, a heading or a list item;
// table rows are read cell by cell (findMarkdown). A span
// whose content still holds a line ending after the stripping holds a
// space, which no record has: it is never notation. One whose only line
// endings are the ones stripped at its ends (`⏎F/C=C/F⏎`) is read as its
// content, which then lies on one line.

// inlineCode adds the notation in the code spans of one paragraph (or
// table cell), the host bytes text starting at host offset at; pre is the
// text before it on its line that may name the notation (the cells before
// a cell), or nil.
func inlineCode(out []Occurrence, text []byte, at int, pre []byte, prag *pragmas, nm namer, cfg *Config) []Occurrence {
	if bytes.IndexByte(text, '`') < 0 {
		return out
	}
	runs := backtickRuns(text)
	// next[n] is the position in byLen[n] of the first run of length n
	// not yet passed: each list is walked once, so matching is linear.
	byLen := map[int][]int{}
	for k, r := range runs {
		byLen[r.Len()] = append(byLen[r.Len()], k)
	}
	next := map[int]int{}
	for k := 0; k < len(runs); k++ {
		open := runs[k]
		n := open.Len()
		list, p := byLen[n], next[n]
		for p < len(list) && list[p] <= k {
			p++
		}
		next[n] = p
		if p == len(list) {
			continue // literal backticks
		}
		closer := list[p]
		k = closer
		cs, ce := codeSpanContent(text, open.End, runs[closer].Start)
		if bytes.IndexAny(text[cs:ce], "\r\n") >= 0 {
			continue
		}
		o, ok := codeSpan(text, cs, ce, open.Start, at, pre, prag, nm, cfg)
		if ok {
			out = append(out, o)
		}
	}
	return out
}

// backtickRuns returns the maximal runs of backticks in text.
func backtickRuns(text []byte) []notation.Span {
	var runs []notation.Span
	for i := 0; i < len(text); {
		k := bytes.IndexByte(text[i:], '`')
		if k < 0 {
			break
		}
		s := i + k
		e := s + fenceRun(text[s:], '`')
		runs = append(runs, notation.Span{Start: s, End: e})
		i = e
	}
	return runs
}

// codeSpanContent strips one space or line ending from both ends of the
// content text[cs:ce] when both ends have one and it is not all blank.
func codeSpanContent(text []byte, cs, ce int) (int, int) {
	if len(bytes.Trim(text[cs:ce], " \r\n")) == 0 {
		return cs, ce
	}
	lead := 0
	switch {
	case text[cs] == ' ' || text[cs] == '\n':
		lead = 1
	case text[cs] == '\r':
		lead = 1
		if cs+1 < ce && text[cs+1] == '\n' {
			lead = 2
		}
	}
	trail := 0
	switch {
	case text[ce-1] == ' ' || text[ce-1] == '\r':
		trail = 1
	case text[ce-1] == '\n':
		trail = 1
		if ce-2 >= cs && text[ce-2] == '\r' {
			trail = 2
		}
	}
	if lead > 0 && trail > 0 {
		return cs + lead, ce - trail
	}
	return cs, ce
}

// codeSpan decides about the content text[cs:ce] of a code span opened at
// text offset open.
func codeSpan(text []byte, cs, ce, open, at int, pre []byte, prag *pragmas, nm namer, cfg *Config) (Occurrence, bool) {
	s := string(text[cs:ce])
	if !prag.allowed(at + open) {
		return Occurrence{}, false
	}
	reason := Reason(0)
	switch {
	case prag.forced(at + open):
		reason = ReasonPragma
	case namedBefore(pre, text[:open], nm) && plausible(s):
		reason = ReasonName
	case !cfg.NoGuess && unmistakable(s):
		reason = ReasonGuess
	}
	if reason == 0 {
		return Occurrence{}, false
	}
	return Occurrence{
		Text:      s,
		Span:      notation.Span{Start: at + cs, End: at + ce},
		Kind:      KindMarkdown,
		Construct: ConstructInlineCode,
		Reason:    reason,
		m:         identityMap(at+cs, ce-cs),
	}, true
}

// namedBefore reports whether the last words before a code span, in pre
// and then before, name the notation ("the SMILES `CCO`", "Reaction
// SMILES: `...`", "| SMILES | `CCO` |").
func namedBefore(pre, before []byte, nm namer) bool {
	if len(before) > 40 {
		before = before[len(before)-40:]
	} else if len(pre) > 0 {
		pre = pre[max(0, len(pre)-(40-len(before))):]
		before = append(append([]byte(nil), pre...), before...)
	}
	words := strings.Fields(string(before))
	if len(words) > 3 {
		words = words[len(words)-3:]
	}
	for _, w := range words {
		if strings.ContainsAny(w, "`/") {
			// code or a path ("`MolToCXSmiles` writes `a:`",
			// "`stereo/reaction`; `stereo/internal`"): a name in prose
			// is a plain word
			continue
		}
		if nm.value(strings.Trim(w, ":*_,()")) {
			return true
		}
	}
	return false
}

package find

import (
	"bytes"
	"sort"
	"strings"
)

// The pragma is a comment of the host language containing
// "stereoline:" followed by one directive:
//
//	stereoline: off        stop taking notation from this line on
//	stereoline: on         start again from this line on
//	stereoline: skip       take nothing on this line
//	stereoline: skip-next  take nothing on the next line
//	stereoline: notation   every string literal on this line is notation
//
// "off" on the first line without a later "on" switches a whole file off.
// Comments are those of the host: '#' lines in lists and smiles fences,
// '#' or '//' comments in code, <!-- --> in Markdown, '#' in YAML. JSON
// and tables have no comments and no pragmas. In a notebook each cell is
// its own scope.
const pragmaWord = "stereoline:"

type directive uint8

const (
	dirOff directive = iota + 1
	dirOn
	dirSkip
	dirSkipNext
	dirNotation
)

var directiveWords = []struct {
	word string
	d    directive
}{
	// Longest first, so "skip-next" is not read as "skip".
	{"skip-next", dirSkipNext},
	{"notation", dirNotation},
	{"skip", dirSkip},
	{"off", dirOff},
	{"on", dirOn},
}

// pragmas records the directives found in one text and answers, for an
// offset into that text, whether notation may be taken there.
type pragmas struct {
	src   []byte
	lines lineTable
	// switches are the off/on directives by line, in order.
	switches []lineDirective
	skip     map[int]bool // lines where nothing is taken
	force    map[int]bool // lines where every literal is notation
}

type lineDirective struct {
	line int
	on   bool
}

func newPragmas(src []byte) *pragmas { return &pragmas{src: src} }

// addComment reads the directives in a comment whose text starts at
// offset at of the scanned text.
func (p *pragmas) addComment(comment []byte, at int) {
	if !bytes.Contains(comment, []byte(pragmaWord)) {
		return
	}
	rest := comment
	for {
		k := bytes.Index(rest, []byte(pragmaWord))
		if k < 0 {
			return
		}
		at += k
		rest = rest[k+len(pragmaWord):]
		word := strings.TrimLeft(string(rest[:min(len(rest), 24)]), " \t")
		for _, dw := range directiveWords {
			if strings.HasPrefix(word, dw.word) && !wordChar(word, len(dw.word)) {
				p.add(dw.d, at)
				break
			}
		}
		at += len(pragmaWord)
	}
}

// wordChar reports whether s continues with a name character at i, so
// that "online" is not read as "on".
func wordChar(s string, i int) bool {
	if i >= len(s) {
		return false
	}
	c := s[i]
	return c == '-' || c == '_' || c >= 'a' && c <= 'z' || c >= 'A' && c <= 'Z' || c >= '0' && c <= '9'
}

func (p *pragmas) add(d directive, at int) {
	if p.lines == nil {
		p.lines = newLineTable(p.src)
	}
	l := p.lines.line(at)
	switch d {
	case dirOff, dirOn:
		p.switches = append(p.switches, lineDirective{line: l, on: d == dirOn})
	case dirSkip, dirSkipNext:
		if p.skip == nil {
			p.skip = map[int]bool{}
		}
		if d == dirSkipNext {
			l++
		}
		p.skip[l] = true
	case dirNotation:
		if p.force == nil {
			p.force = map[int]bool{}
		}
		p.force[l] = true
	}
}

// allowed reports whether notation starting at offset off may be taken.
func (p *pragmas) allowed(off int) bool {
	if p == nil || p.lines == nil {
		return true
	}
	l := p.lines.line(off)
	if p.skip[l] {
		return false
	}
	// The last switch at or before the line decides; switches are in
	// line order, so a binary search keeps many pragmas cheap.
	k := sort.Search(len(p.switches), func(i int) bool { return p.switches[i].line > l })
	return k == 0 || p.switches[k-1].on
}

// forced reports whether a "notation" directive covers offset off.
func (p *pragmas) forced(off int) bool {
	if p == nil || p.force == nil {
		return false
	}
	return p.force[p.lines.line(off)]
}

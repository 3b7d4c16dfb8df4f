package main

import (
	"encoding/binary"
	"iter"
	"slices"

	"stereoline/notation"
)

// findingList holds the findings of one file packed into bytes, about 15
// bytes and the message's length each instead of the 90 of a finding and
// its message's own allocation: a list of a million records has about as
// many findings, all kept until the file is written (in order with the
// files before it; SARIF, at the end). Positions are varints, the code
// and the commonest messages indices into tables; the other messages
// (those naming an earlier record are each different) are copied in.
type findingList struct {
	buf   []byte
	n     int
	codes []notation.Code
	msgs  []string
	// byCode and byMsg index codes and msgs while the list is built.
	byCode map[notation.Code]int
	byMsg  map[string]int
}

// maxInterned bounds the messages a list keeps in its table; the first
// ones met fill it, and a rare message met late is copied in each time.
const maxInterned = 1024

// Len returns the number of findings.
func (l *findingList) Len() int { return l.n }

// add appends a finding.
func (l *findingList) add(f finding) {
	if l.byCode == nil {
		l.byCode, l.byMsg = map[notation.Code]int{}, map[string]int{}
	}
	c, ok := l.byCode[f.Code]
	if !ok {
		c = len(l.codes)
		l.codes = append(l.codes, f.Code)
		l.byCode[f.Code] = c
	}
	b := l.buf
	for _, v := range [...]int{f.Start.Line, f.Start.Char16, f.Start.CharCP, f.End.Line - f.Start.Line, f.End.Char16, f.End.CharCP, int(f.Severity), c} {
		b = binary.AppendUvarint(b, uint64(v))
	}
	// The message: 2k+1 for table entry k, 2n for n bytes that follow.
	m, ok := l.byMsg[f.Message]
	if !ok && len(l.msgs) < maxInterned {
		m, ok = len(l.msgs), true
		l.msgs = append(l.msgs, f.Message)
		l.byMsg[f.Message] = m
	}
	if ok {
		b = binary.AppendUvarint(b, uint64(2*m+1))
	} else {
		b = binary.AppendUvarint(b, uint64(2*len(f.Message)))
		b = append(b, f.Message...)
	}
	l.buf = b
	l.n++
}

// done drops what only building needed.
func (l *findingList) done() {
	l.byCode, l.byMsg = nil, nil
	l.buf = slices.Clip(l.buf)
}

// All yields the findings in the order they were added.
func (l *findingList) All() iter.Seq[finding] {
	return func(yield func(finding) bool) {
		b := l.buf
		next := func() int {
			v, k := binary.Uvarint(b)
			b = b[k:]
			return int(v)
		}
		for range l.n {
			var f finding
			f.Start.Line, f.Start.Char16, f.Start.CharCP = next(), next(), next()
			f.End.Line = f.Start.Line + next()
			f.End.Char16, f.End.CharCP = next(), next()
			f.Severity = notation.Severity(next())
			f.Code = l.codes[next()]
			if m := next(); m%2 == 1 {
				f.Message = l.msgs[m/2]
			} else {
				f.Message = string(b[:m/2])
				b = b[m/2:]
			}
			if !yield(f) {
				return
			}
		}
	}
}

package main

import (
	"bufio"
	"bytes"
	"cmp"
	"encoding/binary"
	"fmt"
	"io"
	"iter"
	"os"
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
//
// The bytes fill blocks of findingBlock bytes; past spillAfter bytes the
// full blocks go to a temporary file (removed at once where the system
// allows, else by close), so that the findings of a file of any length
// take a few megabytes of memory. Without a temporary folder they stay
// in memory.
type findingList struct {
	cur    []byte   // the block being filled
	blocks [][]byte // full blocks in memory, after those in the file
	held   int      // bytes in blocks
	n      int
	codes  []notation.Code
	msgs   []string
	// byCode and byMsg index codes and msgs while the list is built.
	byCode map[notation.Code]int
	byMsg  map[string]int
	// spill is the temporary file of the first spilled bytes, nil until
	// then; spillName is its name when it could not be removed while
	// open; noSpill is set once a temporary file failed.
	spill     *os.File
	spilled   int64
	spillName string
	noSpill   bool
	err       error // a failure to read the file back
	hold      int   // bytes of full blocks kept in memory; 0: spillAfter
}

// The block size, and how many bytes of full blocks a list holds in
// memory before it writes them to its file (variables for the tests).
var (
	findingBlock = 64 << 10
	spillAfter   = 8 << 20
)

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
	var scratch [8 * binary.MaxVarintLen64]byte
	b := scratch[:0]
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
	var msg string
	if ok {
		b = binary.AppendUvarint(b, uint64(2*m+1))
	} else {
		b = binary.AppendUvarint(b, uint64(2*len(f.Message)))
		msg = f.Message
	}
	if need := len(b) + len(msg); len(l.cur)+need > cap(l.cur) {
		if len(l.cur) > 0 {
			l.blocks = append(l.blocks, l.cur)
			l.held += len(l.cur)
			if l.held > cmp.Or(l.hold, spillAfter) {
				l.spillBlocks()
			}
		}
		l.cur = make([]byte, 0, max(findingBlock, need))
	}
	l.cur = append(append(l.cur, b...), msg...)
	l.n++
}

// spillBlocks writes the full blocks to the temporary file.
func (l *findingList) spillBlocks() {
	if l.noSpill {
		return
	}
	if l.spill == nil {
		f, err := os.CreateTemp("", "stereoline-findings-*")
		if err != nil {
			l.noSpill = true
			return
		}
		if os.Remove(f.Name()) != nil {
			l.spillName = f.Name() // removed by close
		}
		l.spill = f
	}
	for _, b := range l.blocks {
		if _, err := l.spill.WriteAt(b, l.spilled); err != nil {
			l.noSpill = true
			return
		}
		l.spilled += int64(len(b))
	}
	l.blocks, l.held = nil, 0
}

// done drops what only building needed.
func (l *findingList) done() {
	l.byCode, l.byMsg = nil, nil
}

// close removes the temporary file, if any; the list is empty after.
func (l *findingList) close() {
	if l.spill != nil {
		l.spill.Close()
		if l.spillName != "" {
			os.Remove(l.spillName)
		}
	}
	*l = findingList{}
}

// Err returns the failure to read back the findings written to the
// temporary file, if All met one.
func (l *findingList) Err() error { return l.err }

// All yields the findings in the order they were added.
func (l *findingList) All() iter.Seq[finding] {
	return func(yield func(finding) bool) {
		parts := make([]io.Reader, 0, len(l.blocks)+2)
		if l.spill != nil {
			parts = append(parts, io.NewSectionReader(l.spill, 0, l.spilled))
		}
		for _, b := range l.blocks {
			parts = append(parts, bytes.NewReader(b))
		}
		parts = append(parts, bytes.NewReader(l.cur))
		r := bufio.NewReaderSize(io.MultiReader(parts...), 64<<10)
		var err error
		next := func() int {
			if err != nil {
				return 0
			}
			var v uint64
			v, err = binary.ReadUvarint(r)
			return int(v)
		}
		var msg []byte
		for range l.n {
			var f finding
			f.Start.Line, f.Start.Char16, f.Start.CharCP = next(), next(), next()
			f.End.Line = f.Start.Line + next()
			f.End.Char16, f.End.CharCP = next(), next()
			f.Severity = notation.Severity(next())
			code := next()
			m := next()
			if err != nil || code >= len(l.codes) || m%2 == 1 && m/2 >= len(l.msgs) {
				l.err = fmt.Errorf("reading back the findings: %v", cmp.Or(err, io.ErrUnexpectedEOF))
				return
			}
			f.Code = l.codes[code]
			if m%2 == 1 {
				f.Message = l.msgs[m/2]
			} else {
				msg = slices.Grow(msg[:0], m/2)[:m/2]
				if _, err = io.ReadFull(r, msg); err != nil {
					l.err = fmt.Errorf("reading back the findings: %v", err)
					return
				}
				f.Message = string(msg)
			}
			if !yield(f) {
				return
			}
		}
	}
}

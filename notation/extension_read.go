package notation

import (
	"slices"
	"strconv"
	"strings"
)

// This file implements reading of the CXSMILES extension block: finding
// where it ends (RecordEnd, used by the finder to split a line into
// record and title), splitting it into fields with their spans, and the
// information on fields kept; extension_fields.go reads each field.
//
// The block is "|" field "," field ... "|". Some fields hold commas of
// their own (o1:1,3 lists atoms; Sg:n:1,2:n:ht lists atoms of a repeat
// unit), so a comma ends a field only when a new field starts after it: a
// tag followed by ':' ("o2:", "Sg:", "atomProp:"), '$' (atom labels), '('
// (coordinates), the flag "r", or another comma. Atom labels are skipped
// whole when the end of the block is searched, since RDKit 2022.09.3
// reads a label holding '|' (CC |$a|b;$| is read with the label "a|b").
//
// Leniency follows RDKit 2022.09.3 where it reads a block without
// complaint and the meaning is clear: empty fields (it writes
// "o1:1,3,,SgD:..." itself), a group tag without a number ("o:1"), fewer
// labels or coordinates than atoms. Fields no library documents are
// kept, never an error.

// RecordEnd finds the end of the record at the start of line. The
// notation runs to the first blank (space, tab, carriage return or line
// feed; OpenSMILES 4.5: the string is terminated by whitespace). A
// CXSMILES extension block written after blanks belongs to the record:
// end is then just past its closing '|', or the end of the line (without
// trailing blanks) when the block is never closed, so that the reader
// reports extension-unclosed instead of taking the block for a title. With
// no block, end equals notationEnd. The title, if any, follows end after
// blanks: "C[C@H](O)CC |&1:1| racemate" gives the record
// "C[C@H](O)CC |&1:1|" and the title "racemate", as RDKit 2022.09.3 reads
// it (a title may follow the block without a blank, too).
func RecordEnd[T ~string | ~[]byte](line T) (notationEnd, end int) {
	n := 0
	for n < len(line) && !isRecordBlank(line[n]) {
		n++
	}
	if n == 0 {
		return 0, 0
	}
	open := n
	for open < len(line) && (line[open] == ' ' || line[open] == '\t') {
		open++
	}
	if open >= len(line) || line[open] != '|' {
		return n, n
	}
	if close := blockEnd(line, open); close > 0 {
		return n, close
	}
	e := open + 1
	for e < len(line) && line[e] != '\n' && line[e] != '\r' {
		e++
	}
	for e > open+1 && (line[e-1] == ' ' || line[e-1] == '\t') {
		e--
	}
	return n, e
}

func isRecordBlank(c byte) bool { return c == ' ' || c == '\t' || c == '\r' || c == '\n' }

// blockEnd returns the offset just past the '|' that closes the block
// opened at text[open], or -1 when the line ends first. A '$' that starts
// a field opens an atom label list, skipped to its closing '$'; when there
// is no closing '$' on the line, the '$' is an ordinary byte (the field is
// then malformed, and the first '|' closes the block). Each byte is looked
// at a bounded number of times: a failed search for '$' means there is no
// '$' further on, so none is searched for again.
func blockEnd[T ~string | ~[]byte](text T, open int) int {
	fieldStart := true
	noDollar := false
	for i := open + 1; i < len(text); i++ {
		switch c := text[i]; {
		case c == '\n' || c == '\r':
			return -1
		case c == '|':
			return i + 1
		case c == '$' && fieldStart && !noDollar:
			j := i + 1
			for j < len(text) && text[j] != '$' && text[j] != '\n' && text[j] != '\r' {
				j++
			}
			if j < len(text) && text[j] == '$' {
				i = j
			} else {
				noDollar = true
			}
			fieldStart = false
		case c == ',':
			fieldStart = true
		default:
			fieldStart = false
		}
	}
	return -1
}

// blockReader reads the fields of one extension block.
type blockReader struct {
	m    *Molecule
	text string
	end  int // end of the fields: the closing '|', or the end of the text
	// quiet is set for a block that is never closed: its fields are read
	// as well as they can be, but only the missing '|' is reported.
	quiet bool
	// dropped is set once the error list is full (see maxErrors).
	dropped bool

	atoms, bonds, components int
	ext                      *Extension

	// owner and ownerSpan hold, per atom, the group that listed it first
	// and where; allocated at the first group.
	owner     []int32
	ownerSpan []Span
}

// readExtension reads the block of m.Text that starts with the
// whitespace at sep and the '|' at open, after the notation has been
// read into m; dropped says whether the reader has filled the error list.
// (A function of the molecule, not of the reader, so that the reader
// stays on the stack.)
func readExtension(m *Molecule, dropped bool, sep, open int) {
	text := m.Text
	ext := &Extension{Separator: Span{sep, open}}
	m.Extension = ext
	b := &blockReader{m: m, text: text, dropped: dropped,
		atoms: len(m.Atoms), bonds: len(m.Bonds), components: m.Components, ext: ext}
	close := blockEnd(text, open)
	b.end = close - 1
	if close < 0 {
		close, b.end = len(text), len(text)
		b.errorf(Span{open, len(text)}, CodeExtensionUnclosed, "expected '|' to close the extension block, found end of text")
		b.quiet = true
	} else {
		ext.Closed = true
	}
	ext.Span = Span{open, close}
	b.fields(open + 1)
	b.reportKept()
	if close < len(text) {
		b.quiet = false
		b.errorf(Span{close, len(text)}, CodeSyntax, "expected the end of the record after the extension block, found %s", describeAt(text, close))
	}
}

// errorf reports a problem in the block and returns its entry, or nil
// when it is not reported: in a block that is never closed only the
// missing '|' is, and past the bound on errors (maxErrors) none is; the
// first one past it says so, as the reader does.
func (b *blockReader) errorf(span Span, code Code, format string, args ...any) *Error {
	if b.quiet || b.dropped {
		return nil
	}
	if len(b.m.Errors) >= maxErrors {
		b.dropped = true
		b.m.Errors.Add(span, CodeSyntax, "too many errors; the rest of the record is not reported")
		return nil
	}
	return b.m.Errors.Add(span, code, format, args...)
}

// fields reads the fields from p to the end of the block.
func (b *blockReader) fields(p int) {
	for p < b.end {
		if b.text[p] == ',' {
			p++ // an empty field
			continue
		}
		p = b.field(p)
		if p < b.end && b.text[p] == ',' {
			p++
		}
	}
}

// field reads one field starting at p and returns where it ends (at the
// comma before the next field, or the end of the block).
func (b *blockReader) field(p int) int {
	f := Field{Group: -1, Tag: Span{p, p}}
	var end int
	switch c := b.text[p]; {
	case c == '(':
		f.Kind, f.Tag = FieldCoordinates, Span{p, p + 1}
		end = b.coordinates(&f, p+1)
	case c == '$':
		end = b.labels(&f, p)
	default:
		tagEnd := b.tagEnd(p)
		tag := b.text[p:tagEnd]
		f.Tag = Span{p, tagEnd}
		if tag == "r" && (tagEnd >= b.end || b.text[tagEnd] == ',') {
			f.Kind = FieldRelative
			end = tagEnd
			break
		}
		if tagEnd == p || tagEnd >= b.end || b.text[tagEnd] != ':' {
			f.Kind = FieldUnknown
			end = b.fieldEnd(p)
			break
		}
		end = b.tagged(&f, tag, tagEnd+1)
	}
	f.Span = Span{p, end}
	b.ext.Fields = append(b.ext.Fields, f)
	if f.Group >= 0 {
		b.ext.Groups[f.Group].Field = len(b.ext.Fields) - 1
	}
	return end
}

// tagEnd returns the end of the tag at p: a letter, '_', '^', '&' or '@',
// then letters, digits, '_' and '@'.
func (b *blockReader) tagEnd(p int) int {
	if p >= b.end {
		return p
	}
	c := b.text[p]
	if !(isLetter(c) || c == '_' || c == '^' || c == '&' || c == '@') {
		return p
	}
	q := p + 1
	for q < b.end && (isLetter(b.text[q]) || isDigit(b.text[q]) || b.text[q] == '_' || b.text[q] == '@') {
		q++
	}
	return q
}

func isLetter(c byte) bool { return c >= 'a' && c <= 'z' || c >= 'A' && c <= 'Z' }

// startsField reports whether a field starts at p (just after a comma).
func (b *blockReader) startsField(p int) bool {
	if p >= b.end {
		return true
	}
	switch b.text[p] {
	case ',', '$', '(':
		return true
	case 'r':
		if p+1 >= b.end || b.text[p+1] == ',' {
			return true
		}
	}
	q := b.tagEnd(p)
	return q > p && q < b.end && b.text[q] == ':'
}

// fieldEnd returns the end of a field that runs from p: the first comma
// after which a field starts, or the end of the block.
func (b *blockReader) fieldEnd(p int) int {
	for q := p; q < b.end; q++ {
		if b.text[q] == ',' && b.startsField(q+1) {
			return q
		}
	}
	return b.end
}

// malformed reports a field that does not follow its syntax from
// position at to the field's end, and returns that end.
func (b *blockReader) malformed(at int, format string, args ...any) int {
	end := b.fieldEnd(at)
	span := Span{at, end}
	if span.Len() == 0 {
		span = Span{at, min(at+1, len(b.text))}
		if at >= b.end {
			span = Span{at, at}
		}
	}
	b.errorf(span, CodeExtensionField, format, args...)
	return end
}

// foundAt describes the byte at p inside the block for messages.
func (b *blockReader) foundAt(p int) string {
	if p >= b.end {
		if b.ext.Closed {
			return "'|'"
		}
		return "end of text"
	}
	return describeAt(b.text, p)
}

// reportKept adds the information that some fields are kept as written
// without being interpreted, naming their kinds once each.
func (b *blockReader) reportKept() {
	if b.quiet {
		return
	}
	var names []string
	var known [64]bool
	unknown := map[string]bool{}
	for i := range b.ext.Fields {
		f := &b.ext.Fields[i]
		if f.Kind.Interpreted() {
			continue
		}
		name := f.Kind.String()
		if t := b.text[f.Tag.Start:f.Tag.End]; f.Kind == FieldUnknown && t != "" {
			if unknown[t] {
				continue
			}
			unknown[t] = true
			// a tag is letters, digits and '_', '^', '&', '@': safe to
			// quote, and shortened
			if len(t) > 16 {
				t = t[:16] + "..."
			}
			name = "unknown field '" + t + "'"
		} else {
			if known[f.Kind] || slices.Contains(names, name) {
				continue
			}
			known[f.Kind] = true
		}
		names = append(names, name)
	}
	if len(names) == 0 {
		return
	}
	const most = 8
	list := strings.Join(names[:min(len(names), most)], ", ")
	if len(names) > most {
		list += " and " + strconv.Itoa(len(names)-most) + " more"
	}
	if e := b.errorf(b.ext.Span, CodeExtensionKept, "extension block kept as written, not interpreted: %s", list); e != nil {
		e.Severity = SeverityInformation
	}
}

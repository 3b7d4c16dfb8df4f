package lsp

import (
	"math/rand"
	"slices"
	"strings"
	"testing"
	"unicode/utf16"
	"unicode/utf8"

	"go.lsp.dev/protocol"

	"stereoline/notation"
)

// The expected characters follow LSP 3.17, "Position" and "Position
// Encoding Kind": UTF-16 counts code units (an emoji outside the Basic
// Multilingual Plane is two), UTF-8 counts bytes, UTF-32 code points; lines
// end at \n, \r\n or \r.
func TestMapperOffsetToPosition(t *testing.T) {
	text := "# é😀\r\nx = \"C[C@H](O)N\"\rlast"
	tests := []struct {
		enc        PositionEncoding
		find       string // the offset is the first byte of this text
		line, char uint32
	}{
		{EncodingUTF16, "é", 0, 2},
		{EncodingUTF16, "😀", 0, 3},
		{EncodingUTF16, "\r\n", 0, 5}, // é is one unit, the emoji two
		{EncodingUTF8, "\r\n", 0, 8},  // é is two bytes, the emoji four
		{EncodingUTF32, "\r\n", 0, 4},
		{EncodingUTF16, "x =", 1, 0},
		{EncodingUTF16, "@H", 1, 8},
		{EncodingUTF16, "last", 2, 0},
	}
	for _, tt := range tests {
		m := NewMapper([]byte(text), tt.enc)
		if tt.enc != EncodingUTF16 {
			// The same table, counted in another encoding.
			m = NewMapper([]byte(text), EncodingUTF16).WithEncoding(tt.enc)
		}
		off := strings.Index(text, tt.find)
		got, err := m.OffsetToPosition(off)
		if err != nil {
			t.Fatalf("%s %q: %v", tt.enc, tt.find, err)
		}
		if got.Line != tt.line || got.Character != tt.char {
			t.Errorf("%s %q: got %d:%d, want %d:%d", tt.enc, tt.find, got.Line, got.Character, tt.line, tt.char)
		}
		back, err := m.PositionToOffset(got)
		if err != nil || back != off {
			t.Errorf("%s %q: back to %d (%v), want %d", tt.enc, tt.find, back, err, off)
		}
	}
}

// The UTF-16 column of every rune must equal the length of the preceding
// text as the client holds it: a Go conversion to UTF-16 is the outside
// reference here (unicode/utf16 implements RFC 2781).
func TestMapperAgreesWithUTF16(t *testing.T) {
	line := "αβγ 😀 [C@@H] 日本 \U0001F9EA F/C=C/F"
	m := NewMapper([]byte(line), EncodingUTF16)
	for off := range line {
		want := len(utf16.Encode([]rune(line[:off])))
		got, err := m.OffsetToPosition(off)
		if err != nil || got.Line != 0 || int(got.Character) != want {
			t.Fatalf("offset %d: got %v (%v), want 0:%d", off, got, err, want)
		}
		back, err := m.PositionToOffset(got)
		if err != nil || back != off {
			t.Fatalf("position %v: back to %d (%v), want %d", got, back, err, off)
		}
	}
}

// TestMapperMixedLines checks a text whose lines are ASCII and not, in
// every encoding, against the same Go conversions: the mapper takes a
// short cut on ASCII lines, which must give the same answers.
func TestMapperMixedLines(t *testing.T) {
	text := "C[C@H](O)CC\r\nαβ 😀 F/C=C/F\n" + strings.Repeat("C%10CC%10", 50) + "\rO日本\n\n"
	for _, enc := range []PositionEncoding{EncodingUTF8, EncodingUTF16, EncodingUTF32} {
		m := NewMapper([]byte(text), enc)
		line, start := 0, 0
		for off := 0; off <= len(text); off++ {
			if off > 0 && (text[off-1] == '\n' || text[off-1] == '\r' && (off == len(text) || text[off] != '\n')) {
				line, start = line+1, off
			}
			if !utf8.RuneStart(byteAt(text, off)) || off > 0 && text[off-1] == '\r' && off < len(text) && text[off] == '\n' {
				continue // inside a character or a CRLF pair: mapped to its start
			}
			prefix := text[start:off]
			want := len(prefix)
			switch enc {
			case EncodingUTF16:
				want = len(utf16.Encode([]rune(prefix)))
			case EncodingUTF32:
				want = utf8.RuneCountInString(prefix)
			}
			got, err := m.OffsetToPosition(off)
			if err != nil || int(got.Line) != line || int(got.Character) != want {
				t.Fatalf("%s offset %d: got %v (%v), want %d:%d", enc, off, got, err, line, want)
			}
		}
	}
}

// byteAt is text[off], or an ASCII byte at the end of the text.
func byteAt(text string, off int) byte {
	if off >= len(text) {
		return 'x'
	}
	return text[off]
}

func TestMapperClamps(t *testing.T) {
	text := "ab😀\r\ncd\n"
	m := NewMapper([]byte(text), EncodingUTF16)
	tests := []struct {
		name string
		pos  protocol.Position
		want int
	}{
		// LSP 3.17: "If the character value is greater than the line
		// length it defaults back to the line length."
		{"past the line end", protocol.Position{Line: 0, Character: 99}, strings.Index(text, "\r")},
		{"inside a surrogate pair", protocol.Position{Line: 0, Character: 3}, 2},
		{"after the pair", protocol.Position{Line: 0, Character: 4}, 2 + utf8.RuneLen('😀')},
		{"empty last line", protocol.Position{Line: 2, Character: 0}, len(text)},
		{"one past the last line", protocol.Position{Line: 3, Character: 0}, len(text)},
	}
	for _, tt := range tests {
		got, err := m.PositionToOffset(tt.pos)
		if err != nil || got != tt.want {
			t.Errorf("%s: got %d (%v), want %d", tt.name, got, err, tt.want)
		}
	}
	if _, err := m.PositionToOffset(protocol.Position{Line: 4}); err == nil {
		t.Errorf("line 4 of a 3-line text: no error")
	}
	if _, err := m.OffsetToPosition(len(text) + 1); err == nil {
		t.Errorf("offset past the end: no error")
	}
	// An offset between \r and \n is the end of the line.
	p, _ := m.OffsetToPosition(strings.Index(text, "\n"))
	if p.Line != 0 || p.Character != 4 {
		t.Errorf("offset of \\n in \\r\\n: got %v, want 0:4", p)
	}
}

func TestMapperSpanToRange(t *testing.T) {
	text := "s = \"é\" + 'C/C=C/C'"
	m := NewMapper([]byte(text), EncodingUTF16)
	start := strings.Index(text, "/C=")
	r, err := m.SpanToRange(notation.Span{Start: start, End: start + 1})
	if err != nil {
		t.Fatal(err)
	}
	// é is two bytes but one UTF-16 unit, so the column is one less than
	// the byte offset.
	if r.Start.Character != uint32(start-1) || r.End.Character != uint32(start) {
		t.Errorf("got %v, want characters %d-%d", r, start-1, start)
	}
	s, err := m.RangeToSpan(r)
	if err != nil || s != (notation.Span{Start: start, End: start + 1}) {
		t.Errorf("back: got %v (%v)", s, err)
	}
	if _, err := m.RangeToSpan(protocol.Range{Start: r.End, End: r.Start}); err == nil {
		t.Errorf("reversed range: no error")
	}
}

// A mapper moved through an edit (Replace) must equal the one built from
// the new text: random edits of texts made of line breaks of the three
// kinds LSP 3.17 names ("\n", "\r\n", "\r"), ASCII and wider characters,
// at random places, including inside a "\r\n" pair and at the ends.
func TestMapperReplaceAgreesWithNewMapper(t *testing.T) {
	pieces := []string{"\n", "\r\n", "\r", "C", "[C@@H]", "é", "😀", " t", "\r\r", "\n\n"}
	rng := rand.New(rand.NewSource(7))
	random := func(n int) string {
		var b strings.Builder
		for range n {
			b.WriteString(pieces[rng.Intn(len(pieces))])
		}
		return b.String()
	}
	for _, enc := range []PositionEncoding{EncodingUTF16, EncodingUTF8} {
		text := []byte(random(40))
		m := NewMapper(text, enc)
		for step := range 3000 {
			start := rng.Intn(len(text) + 1)
			end := min(start+rng.Intn(6), len(text))
			if rng.Intn(4) == 0 {
				end = start
			}
			ins := random(rng.Intn(3))
			if len(text) > 400 {
				end = min(start+rng.Intn(40), len(text))
				ins = ""
			}
			next := append(append(append([]byte(nil), text[:start]...), ins...), text[end:]...)
			got := m.Replace(start, end, len(ins), next)
			want := NewMapper(next, enc)
			if !slices.Equal(got.lineStarts, want.lineStarts) || !slices.Equal(got.wide, want.wide) || got.encoding != want.encoding {
				t.Fatalf("%s step %d: %q [%d,%d) -> %q:\nstarts %v\nwant   %v\nwide %v\nwant %v",
					enc, step, text, start, end, ins, got.lineStarts, want.lineStarts, got.wide, want.wide)
			}
			text, m = next, got
		}
	}
}

// applyChanges moves the line table through each change of a
// notification (LSP 3.17, "DidChangeTextDocument Notification": each
// change applies to the text the previous one left, one without a range
// replaces the whole text); the mapper it returns must equal the one
// built from the final text.
func TestApplyChangesMapper(t *testing.T) {
	rng := func(l1, c1, l2, c2 uint32) *protocol.Range {
		return &protocol.Range{Start: protocol.Position{Line: l1, Character: c1}, End: protocol.Position{Line: l2, Character: c2}}
	}
	m := NewMapper([]byte("CCO a\r\nC[C@H](F)Cl é\nF/C=C/F\n"), EncodingUTF16)
	changes := []contentChange{
		{Range: rng(1, 2, 1, 4), Text: "@@"},
		{Range: rng(0, 5, 1, 0), Text: "\n\r\n"},
		{Text: "N\rO\n"},
		{Range: rng(1, 0, 1, 1), Text: "😀\r"},
		{Range: rng(2, 0, 2, 0), Text: "last"},
	}
	for _, tt := range []struct {
		n    int
		want string
	}{
		{2, "CCO a\n\r\nC[@@H](F)Cl é\nF/C=C/F\n"},
		{5, "N\r😀\r\nlast"},
	} {
		got, err := applyChanges(m, EncodingUTF16, changes[:tt.n])
		if err != nil {
			t.Fatal(err)
		}
		want := NewMapper([]byte(tt.want), EncodingUTF16)
		if string(got.Content()) != string(want.Content()) || !slices.Equal(got.lineStarts, want.lineStarts) || !slices.Equal(got.wide, want.wide) {
			t.Errorf("%d changes: got %q %v %v, want %q %v %v", tt.n, got.Content(), got.lineStarts, got.wide, want.Content(), want.lineStarts, want.wide)
		}
	}
}

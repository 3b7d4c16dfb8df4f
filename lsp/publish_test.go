package lsp

import (
	"encoding/json"
	"math/rand"
	"reflect"
	"strconv"
	"strings"
	"testing"

	"stereoline/stereo/document"
)

// TestDiagnosticsJSON checks that the hand-written publication decodes
// to the same value as the protocol structures marshalled by
// encoding/json, on a list with findings of every kind: reader errors,
// ineffective marks (tagged), relations (with related places), titles
// with quotes, tabs, non-ASCII and bytes that are not UTF-8 (records
// invented for the test).
func TestDiagnosticsJSON(t *testing.T) {
	text := "C[C@H](C)C \"quoted\\\" title\n" +
		"N[C@@H](C)C(=O)O\tα-alanine\n" +
		"N[C@H](C)C(=O)O\tits mirror image \x01\n" +
		"N[C@@H](C)C(=O)O\tagain \xff\xfe\n" +
		"C1CC(\tbroken\n" +
		"F/C=C/F\t𝛼 wide\n"
	for _, enc := range []PositionEncoding{EncodingUTF16, EncodingUTF8} {
		f := &fileVersion{URI: "file:///t/a \"b\".smi", Name: "/t/a.smi", Version: 3, mapper: NewMapper([]byte(text), enc)}
		res := document.NewAnalyzer(document.DefaultConfig()).Analyze(f.Name, "", []byte(text))
		if len(res.Diagnostics) < 4 {
			t.Fatalf("%d findings, want at least 4", len(res.Diagnostics))
		}
		if raw, want, same := publicationAgainstMarshal(t, f, res); !same {
			t.Errorf("encoding %v:\n got %s\nwant %s", enc, raw, want)
		}
	}
}

// TestDiagnosticsJSONInParts checks a publication written in several
// parts on all cores (more findings than publishChunk) against the
// protocol structures marshalled by encoding/json: line breaks of every
// kind, titles outside ASCII, relations that point back many lines
// (records invented for the test).
func TestDiagnosticsJSONInParts(t *testing.T) {
	var b strings.Builder
	breaks := []string{"\n", "\r\n", "\r"}
	for i := 0; i < 2*publishChunk+100; i++ {
		switch i % 4 {
		case 0:
			b.WriteString("C1CC(\tbroken ")
		case 1:
			b.WriteString("N[C@@H](C)C(=O)O\tα ")
		case 2:
			b.WriteString("F/C=C/F\t𝛼 ")
		default:
			b.WriteString("C[C@H](F)Cl\tx ")
		}
		b.WriteString(strconv.Itoa(i))
		b.WriteString(breaks[i%3])
	}
	text := b.String()
	f := &fileVersion{URI: "file:///t/parts.smi", Name: "/t/parts.smi", Version: 1, mapper: NewMapper([]byte(text), EncodingUTF16)}
	res := document.NewAnalyzer(document.DefaultConfig()).Analyze(f.Name, "", []byte(text))
	if len(res.Diagnostics) <= publishChunk+100 {
		t.Fatalf("%d findings, want more than %d", len(res.Diagnostics), publishChunk+100)
	}
	if _, _, same := publicationAgainstMarshal(t, f, res); !same {
		t.Errorf("the publication in parts differs from the marshalled one")
	}
}

// publicationAgainstMarshal writes the publication of res by hand and
// through the protocol structures with encoding/json, and reports
// whether the two decode to the same value.
func publicationAgainstMarshal(t *testing.T, f *fileVersion, res *document.Result) (raw, want []byte, same bool) {
	t.Helper()
	version := f.Version
	raw, err := diagnosticsJSON(f, res, &version)
	if err != nil {
		t.Fatal(err)
	}
	diags, err := (&Server{}).toDiagnostics(f, res)
	if err != nil {
		t.Fatal(err)
	}
	want, _ = json.Marshal(publishDiagnosticsParams{URI: f.URI, Version: &version, Diagnostics: diags})
	var g, w any
	if err := json.Unmarshal(raw, &g); err != nil {
		t.Fatalf("%s: %v", raw, err)
	}
	json.Unmarshal(want, &w)
	return raw, want, reflect.DeepEqual(g, w)
}

// TestCursorPositions checks the cursor against OffsetToPosition at every
// offset of a text with every kind of line break and wide characters, in
// order, backwards and at random.
func TestCursorPositions(t *testing.T) {
	text := []byte("ab\r\ncd\n\nα𝛼x\rend\r\n\n\xffz")
	for _, enc := range []PositionEncoding{EncodingUTF16, EncodingUTF8, EncodingUTF32} {
		m := NewMapper(text, enc)
		c := cursor{m: m}
		var offs []int
		for off := 0; off <= len(text); off++ {
			offs = append(offs, off)
		}
		for off := len(text); off >= 0; off-- {
			offs = append(offs, off)
		}
		rng := rand.New(rand.NewSource(1))
		for k := 0; k < 200; k++ {
			offs = append(offs, rng.Intn(len(text)+1))
		}
		for _, off := range offs {
			got, err1 := c.position(off)
			want, err2 := m.OffsetToPosition(off)
			if got != want || (err1 == nil) != (err2 == nil) {
				t.Fatalf("%v: offset %d: %v, want %v", enc, off, got, want)
			}
		}
	}
}

// TestAppendString checks the hand-written JSON strings against
// encoding/json: both decode to the same string, for quotes, controls,
// text outside ASCII and bytes that are not UTF-8.
func TestAppendString(t *testing.T) {
	for _, s := range []string{"", "plain", `q"b\`, "tab\tnl\n\x01", "α-alanine", "𝛼 wide", "bad \xff\xfe here", "α then bad \xc3", "\xe2\x82"} {
		var g, w string
		if err := json.Unmarshal(appendString(nil, s), &g); err != nil {
			t.Fatalf("%q: %v", s, err)
		}
		q, _ := json.Marshal(s)
		json.Unmarshal(q, &w)
		if g != w {
			t.Errorf("%q: %q, want %q", s, g, w)
		}
	}
}

// TestAppendStringWords checks appendString on longer texts, which it
// reads eight bytes at a time: every byte that needs an escape or a look
// (RFC 8259, section 7: quote, backslash, controls; and bytes outside
// ASCII) at every place of a word, among plain text, against
// encoding/json as in TestAppendString.
func TestAppendStringWords(t *testing.T) {
	special := []string{"\"", "\\", "\x00", "\x1f", "\n", "\x7f", "é", "\xff", " ", "!", "#", "[", "]", "~"}
	for _, sp := range special {
		for at := 0; at < 20; at++ {
			s := strings.Repeat("C", at) + sp + strings.Repeat("a", 20-at)
			var g, w string
			if err := json.Unmarshal(appendString(nil, s), &g); err != nil {
				t.Fatalf("%q: %v", s, err)
			}
			q, _ := json.Marshal(s)
			json.Unmarshal(q, &w)
			if g != w {
				t.Errorf("%q: %q, want %q", s, g, w)
			}
		}
	}
	for c := 0; c < 256; c++ {
		word := strings.Repeat(string([]byte{byte(c)}), 8)
		want := c >= 0x20 && c < 0x80 && c != '"' && c != '\\'
		if got := plain8(word); got != want {
			t.Errorf("plain8(%q) = %v, want %v", word, got, want)
		}
		mixed := "abc" + string([]byte{byte(c)}) + "defg"
		if got := plain8(mixed); got != want {
			t.Errorf("plain8(%q) = %v, want %v", mixed, got, want)
		}
	}
}

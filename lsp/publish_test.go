package lsp

import (
	"bytes"
	"encoding/json"
	"math/rand"
	"reflect"
	"runtime"
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
		if len(res.Diagnostics()) < 4 {
			t.Fatalf("%d findings, want at least 4", len(res.Diagnostics()))
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
	if len(res.Diagnostics()) <= publishChunk+100 {
		t.Fatalf("%d findings, want more than %d", len(res.Diagnostics()), publishChunk+100)
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

// TestPublicationFromLast checks that a publication made from the last
// one is byte for byte the publication written afresh, through a chain of
// random edits of a list: marks toggled, titles changed (also to text
// outside ASCII), lines inserted and deleted, line breaks of every kind
// added, removed and turned into others (a "\r" that pairs with a "\n"
// after it), duplicates made and broken so that relations of lines before
// and after the edit change, and edits at the first and last byte. It
// also checks that most findings' JSON is taken from the last
// publication where an edit moved no line, so it fails if nothing is
// (records invented for the test).
func TestPublicationFromLast(t *testing.T) {
	t.Run("spare", func(t *testing.T) { testPublicationFromLast(t) })
	// Without spare bytes, a publication copies what it takes from the
	// last one together whenever it would keep more than it uses.
	t.Run("compact", func(t *testing.T) {
		defer func(n int) { maxSpareBytes = n }(maxSpareBytes)
		maxSpareBytes = 0
		testPublicationFromLast(t)
	})
}

func testPublicationFromLast(t *testing.T) {
	records := []string{"N[C@@H](C)C(=O)O", "N[C@H](C)C(=O)O", "C[C@H](F)Cl", "C[C@@H](F)Cl", "F/C=C/F", "F/C=C\\F", "C1CC(", "OC[C@H]1OC(O)[C@@H](O)[C@H]1O"}
	breaks := []string{"\n", "\r\n", "\r"}
	rng := rand.New(rand.NewSource(7))
	var b strings.Builder
	for i := 0; i < 600; i++ {
		b.WriteString(records[rng.Intn(len(records))])
		b.WriteString("\tr" + strconv.Itoa(i))
		if i%50 == 7 {
			b.WriteString(" α")
		}
		b.WriteString(breaks[(i/100)%3])
	}
	text := []byte(b.String())
	a := document.NewAnalyzer(document.DefaultConfig())
	for _, enc := range []PositionEncoding{EncodingUTF16, EncodingUTF8} {
		m := NewMapper(text, enc)
		res := a.Analyze("/t/chain.smi", "", text)
		f := &fileVersion{URI: "file:///t/chain.smi", Name: "/t/chain.smi", mapper: m}
		v := int32(1)
		last, err := publish(nil, f, res, &v)
		if err != nil {
			t.Fatal(err)
		}
		content := text
		sameLines := 0
		for step := 0; step < 120; step++ {
			from := rng.Intn(len(content) + 1)
			to := min(len(content), from+rng.Intn(3))
			var ins string
			switch step % 8 {
			case 0: // a mark toggled
				if k := bytes.IndexByte(content[from:], '@'); k >= 0 {
					from, to, ins = from+k, from+k+1, "@@"
				}
			case 1: // a title changed
				to, ins = from, "é"
			case 2: // a line inserted
				at := bytes.IndexByte(content[from:], '\n')
				if at < 0 {
					at = len(content) - from - 1
				}
				from, to, ins = from+at+1, from+at+1, records[rng.Intn(len(records))]+"\tnew\n"
			case 3: // a line break changed or removed
				k := bytes.IndexAny(content[from:], "\r\n")
				if k < 0 {
					break
				}
				from, to, ins = from+k, from+k+1, breaks[rng.Intn(3)]
				if rng.Intn(4) == 0 {
					ins = ""
				}
			case 4: // at the ends
				if rng.Intn(2) == 0 {
					from, to = 0, 0
				} else {
					from, to = len(content), len(content)
				}
				ins = "C\n"
			case 5: // a record made the copy of another
				to, ins = from, "C"
			default:
				ins = string("CN@\r\n()/"[rng.Intn(8)])
			}
			next := append(append(append([]byte(nil), content[:from]...), ins...), content[to:]...)
			m = m.Replace(from, to, len(ins), next)
			prev := res
			res = a.Reanalyze(prev, "/t/chain.smi", "", next)
			content = next
			f = &fileVersion{URI: f.URI, Name: f.Name, mapper: m}
			v++
			p, err := publish(last, f, res, &v)
			if err != nil {
				t.Fatal(err)
			}
			fresh, err := diagnosticsJSON(f, res, &v)
			if err != nil {
				t.Fatal(err)
			}
			if got := bytes.Join(p.parts, nil); !bytes.Equal(got, fresh) {
				t.Fatalf("%v step %d (%q at %d-%d): the publication made from the last differs from the one written afresh:\n got %s\nwant %s",
					enc, step, ins, from, to, got, fresh)
			}
			if m.LineCount() == last.lines && len(res.Diagnostics()) > 100 && len(p.parts) < 40 {
				sameLines++
			}
			if maxSpareBytes == 0 && len(p.bufs) > 0 {
				kept, used := 0, 0
				for _, b := range p.bufs[:1] {
					kept += cap(b)
				}
				for _, a := range p.at {
					if a.buf == 0 {
						used += int(a.n) + 1
					}
				}
				if kept > 2*used+64<<10 {
					t.Fatalf("%v step %d: the first buffer holds %d bytes for %d used", enc, step, kept, used)
				}
			}
			last.release(p)
			last = p
		}
		if sameLines < 20 {
			t.Errorf("%v: %d edits that moved no line took most findings from the last publication, want at least 20", enc, sameLines)
		}
	}
}

// TestPublicationBounds checks that a chain of publications, each made
// from the last, stays within maxPublicationParts parts and keeps
// buffers of no more than twice the bytes it uses (and maxSpareBytes),
// over many edits of a list long enough for buffers of several chunks.
func TestPublicationBounds(t *testing.T) {
	var b strings.Builder
	for i := 0; i < 3*publishChunk; i++ {
		b.WriteString("C1CC(\tbroken ")
		b.WriteString(strconv.Itoa(i))
		b.WriteByte('\n')
	}
	text := []byte(b.String())
	a := document.NewAnalyzer(document.DefaultConfig())
	m := NewMapper(text, EncodingUTF16)
	res := a.Analyze("/t/bounds.smi", "", text)
	f := &fileVersion{URI: "file:///t/bounds.smi", Name: "/t/bounds.smi", mapper: m}
	last, err := publish(nil, f, res, nil)
	if err != nil {
		t.Fatal(err)
	}
	rng := rand.New(rand.NewSource(3))
	content := text
	for step := 0; step < 3000; step++ {
		// a title changed on a random line: one finding written afresh
		at := rng.Intn(len(content) - 1)
		at += bytes.IndexByte(content[at:], '\n')
		next := append(append(append([]byte(nil), content[:at]...), 'x'), content[at:]...)
		m = m.Replace(at, at, 1, next)
		res = a.Reanalyze(res, "/t/bounds.smi", "", next)
		content = next
		f = &fileVersion{URI: f.URI, Name: f.Name, mapper: m}
		p, err := publish(last, f, res, nil)
		if err != nil {
			t.Fatal(err)
		}
		used, kept := 0, 0
		for _, part := range p.parts {
			used += len(part)
		}
		for _, buf := range p.bufs {
			kept += cap(buf)
		}
		if len(p.parts) > maxPublicationParts || kept > 3*used+maxSpareBytes {
			t.Fatalf("step %d: %d parts and %d bytes of buffers for %d bytes", step, len(p.parts), kept, used)
		}
		last.release(p)
		last = p
	}
}

// TestOffsetMapPositions checks the map between the offsets of two texts
// that publications are made from: every offset of the new text it maps
// has the position of the offset it maps to in the old text, in every
// encoding, over random edits of short texts of line breaks of every
// kind and characters outside ASCII (LSP 3.17, "Text Documents": "\n",
// "\r\n" and "\r" end lines); and it maps most offsets of a long text
// after an edit that moved no line.
func TestOffsetMapPositions(t *testing.T) {
	alphabet := []string{"a", "b", "\n", "\r", "\r\n", "é", "𝛼"}
	rng := rand.New(rand.NewSource(11))
	word := func(n int) string {
		var b strings.Builder
		for range n {
			b.WriteString(alphabet[rng.Intn(len(alphabet))])
		}
		return b.String()
	}
	for _, enc := range []PositionEncoding{EncodingUTF16, EncodingUTF8, EncodingUTF32} {
		mapped := 0
		for trial := 0; trial < 3000; trial++ {
			old := []byte(word(rng.Intn(12)))
			from := rng.Intn(len(old) + 1)
			to := from + rng.Intn(len(old)-from+1)
			text := append(append(append([]byte(nil), old[:from]...), word(rng.Intn(3))...), old[to:]...)
			last := &publication{content: old, lines: NewMapper(old, enc).LineCount()}
			p := &publication{content: text, lines: NewMapper(text, enc).LineCount()}
			m := newOffsetMap(last, p)
			om, nm := NewMapper(old, enc), NewMapper(text, enc)
			for off := 0; off <= len(text); off++ {
				o, ok := m.old(off)
				if !ok {
					continue
				}
				mapped++
				got, err1 := nm.OffsetToPosition(off)
				want, err2 := om.OffsetToPosition(o)
				if err1 != nil || err2 != nil || got != want {
					t.Fatalf("%v: %q to %q: offset %d maps to %d: position %v, there %v (%v, %v)", enc, old, text, off, o, got, want, err1, err2)
				}
			}
		}
		if mapped < 10000 {
			t.Errorf("%v: %d offsets mapped, want at least 10000", enc, mapped)
		}
	}
	long := []byte(strings.Repeat("C[C@H](F)Cl\tα title\r\n", 1000))
	text := append(append(append([]byte(nil), long[:500]...), '@'), long[500:]...)
	m := newOffsetMap(&publication{content: long, lines: 2001}, &publication{content: text, lines: 2001})
	n := 0
	for off := range text {
		if _, ok := m.old(off); ok {
			n++
		}
	}
	if n < len(text)-100 {
		t.Errorf("%d of %d offsets mapped after a one-byte edit, want all but those of the edited line", n, len(text))
	}
}

// TestPartBufferPool checks that the buffers of publications are kept
// across collections (a sync.Pool is emptied by them), handed out to the
// size asked for, and bounded by maxPooledBytes.
func TestPartBufferPool(t *testing.T) {
	partBuffers.Lock()
	saved := partBuffers.free
	partBuffers.free, partBuffers.bytes = nil, 0
	partBuffers.Unlock()
	defer func() {
		partBuffers.Lock()
		partBuffers.free, partBuffers.bytes = saved, 0
		for _, b := range saved {
			partBuffers.bytes += cap(b)
		}
		partBuffers.Unlock()
	}()
	small, large := make([]byte, 0, 1<<20), make([]byte, 0, 3<<20)
	putPartBuffer(small)
	putPartBuffer(large)
	runtime.GC()
	if b := partBuffer(2 << 20); cap(b) != 3<<20 {
		t.Errorf("a buffer for 2 MB has %d bytes, want the kept one of 3 MB", cap(b))
	}
	if b := partBuffer(1 << 20); cap(b) != 1<<20 || len(b) != 0 {
		t.Errorf("a buffer for 1 MB has %d bytes (length %d), want the kept one of 1 MB, empty", cap(b), len(b))
	}
	if b := partBuffer(1 << 20); cap(b) != 1<<20 {
		t.Errorf("an empty pool gave a buffer of %d bytes for 1 MB", cap(b))
	}
	for range 2 * maxPooledBytes / (4 << 20) {
		putPartBuffer(make([]byte, 0, 4<<20))
	}
	if partBuffers.bytes > maxPooledBytes {
		t.Errorf("the pool keeps %d bytes, more than %d", partBuffers.bytes, maxPooledBytes)
	}
}

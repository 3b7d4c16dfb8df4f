package find

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"stereoline/notation"
)

// Marker files live in testdata/markers. Each is a host file of one kind
// whose expected occurrences are written beside the text they are about,
// in a comment of the host language:
//
//	smiles = "F/C=C/F"   # want «F/C=C/F»
//	b = "C1CC\1"         # want «C1CC\1» error «\1»
//
// A marker is the word want followed by the exact host bytes the
// occurrence covers, between « and »; the test finds those bytes on the
// same line, before the marker, so no offset is ever typed by hand.
// After it may come:
//
//	text «...»     the notation text when it differs from the host bytes
//	title «...»    the expected title
//	error «...»    a host-escape error at these host bytes (inside the occurrence)
//	warning «...»  the same with severity warning
//	fix «...»      the replacement text of one of that diagnostic's fixes
//	dialect «smarts» the occurrence is a query pattern (smiles: notation,
//	               the default)
//	note «...»     the occurrence carries the list-layout information
//	               (CodeListLayout) and its message contains this text
//
// want-next puts the expectation on the next line (for list records and
// fenced lines, where a trailing comment would be read as a title);
// want-after searches the rest of the file (for the lines of a
// multi-line literal, which can hold no comment).
// Several markers on one line are matched left to right. Hosts without
// comments (JSON, tables, notebooks) keep their markers in a sidecar file
// NAME.want, one marker a line, matched in order through the whole file;
// there ␍ and ⏎ stand for a carriage return and a line feed.
//
// Every line without a marker must yield no occurrence: the test compares
// the full list.

type wantOcc struct {
	span    notation.Span
	text    string
	title   *string
	diags   []wantDiag
	line    int
	dialect Dialect
	note    string
}

type wantDiag struct {
	span  notation.Span
	sev   notation.Severity
	fixes []string
}

// markerArgs parses the «»-quoted directives of one marker group. It
// returns the directives in order as (word, value) pairs.
func markerArgs(s string) [][2]string {
	var out [][2]string
	for {
		k := strings.Index(s, "«")
		if k < 0 {
			return out
		}
		word := strings.TrimSpace(s[:k])
		if f := strings.Fields(word); len(f) > 0 {
			word = f[len(f)-1]
		}
		rest := s[k+len("«"):]
		e := strings.Index(rest, "»")
		if e < 0 {
			return out
		}
		out = append(out, [2]string{word, rest[:e]})
		s = rest[e+len("»"):]
	}
}

// expectations reads the markers of a file (inline) or of its sidecar.
func expectations(t *testing.T, path string, src []byte) []wantOcc {
	t.Helper()
	if side, err := os.ReadFile(path + ".want"); err == nil {
		var out []wantOcc
		from := 0
		for n, line := range strings.Split(string(side), "\n") {
			if strings.TrimSpace(line) == "" || strings.HasPrefix(strings.TrimSpace(line), "//") {
				continue
			}
			line = strings.NewReplacer("␍", "\r", "⏎", "\n").Replace(line)
			w, end := parseMarker(t, path, src, from, len(src), markerArgs(line), n+1)
			out = append(out, w...)
			from = end
		}
		return out
	}
	var out []wantOcc
	lines := bytes.SplitAfter(src, []byte("\n"))
	off := 0
	for n, line := range lines {
		start := off
		off += len(line)
		k := bytes.Index(line, []byte("want"))
		for k >= 0 && !bytes.HasPrefix(bytes.TrimLeft(line[k+4:], "-nextafr "), []byte("«")) {
			j := bytes.Index(line[k+4:], []byte("want"))
			if j < 0 {
				k = -1
				break
			}
			k += 4 + j
		}
		if k < 0 {
			continue
		}
		from, to := start, start+k
		if bytes.HasPrefix(line[k:], []byte("want-after")) {
			from, to = off, len(src)
		} else if bytes.HasPrefix(line[k:], []byte("want-next")) {
			if n+1 >= len(lines) {
				t.Fatalf("%s:%d: want-next on the last line", path, n+1)
			}
			from, to = off, off+len(lines[n+1])
		}
		w, _ := parseMarker(t, path, src, from, to, markerArgs(string(line[k:])), n+1)
		out = append(out, w...)
	}
	return out
}

// parseMarker turns directives into expectations, locating host bytes in
// src[from:to] left to right. It returns the offset after the last match.
func parseMarker(t *testing.T, path string, src []byte, from, to int, args [][2]string, line int) ([]wantOcc, int) {
	t.Helper()
	var out []wantOcc
	for _, a := range args {
		word, val := a[0], a[1]
		if word == "want" || word == "want-next" || word == "want-after" {
			k := bytes.Index(src[from:to], []byte(val))
			if k < 0 {
				t.Fatalf("%s:%d: marker text «%s» not found before the marker", path, line, val)
			}
			s := from + k
			out = append(out, wantOcc{span: notation.Span{Start: s, End: s + len(val)}, text: val, line: line})
			from = s + len(val)
			continue
		}
		if len(out) == 0 {
			t.Fatalf("%s:%d: %s before any want", path, line, word)
		}
		w := &out[len(out)-1]
		switch word {
		case "text":
			w.text = val
		case "title":
			v := val
			w.title = &v
		case "error", "warning":
			// Diagnostics are searched inside the occurrence, after
			// the previous diagnostic of the same occurrence.
			at := w.span.Start
			if n := len(w.diags); n > 0 {
				at = w.diags[n-1].span.End
			}
			k := bytes.Index(src[at:w.span.End], []byte(val))
			if k < 0 {
				t.Fatalf("%s:%d: %s «%s» not found inside the occurrence", path, line, word, val)
			}
			sev := notation.SeverityError
			if word == "warning" {
				sev = notation.SeverityWarning
			}
			w.diags = append(w.diags, wantDiag{span: notation.Span{Start: at + k, End: at + k + len(val)}, sev: sev})
		case "dialect":
			switch val {
			case "smarts":
				w.dialect = DialectSMARTS
			case "smiles":
				w.dialect = DialectSMILES
			default:
				t.Fatalf("%s:%d: dialect «%s»: expected smarts or smiles", path, line, val)
			}
		case "note":
			w.note = val
		case "fix":
			if len(w.diags) == 0 {
				t.Fatalf("%s:%d: fix before any error or warning", path, line)
			}
			d := &w.diags[len(w.diags)-1]
			d.fixes = append(d.fixes, val)
		default:
			t.Fatalf("%s:%d: unknown marker word %q", path, line, word)
		}
	}
	return out, from
}

func TestMarkers(t *testing.T) {
	files, err := filepath.Glob(filepath.Join("testdata", "markers", "*"))
	if err != nil || len(files) == 0 {
		t.Fatal("no marker files")
	}
	for _, path := range files {
		if strings.HasSuffix(path, ".want") {
			continue
		}
		t.Run(filepath.Base(path), func(t *testing.T) {
			src, err := os.ReadFile(path)
			if err != nil {
				t.Fatal(err)
			}
			want := expectations(t, path, src)
			// NAME.EXT.src is a NAME.EXT that must not be seen by the
			// tools of its own language (a Go file with compile errors
			// on purpose, which gofmt would reject).
			got := Find(strings.TrimSuffix(path, ".src"), src, Config{})
			checkOccurrences(t, path, src, got, want)
		})
	}
}

func checkOccurrences(t *testing.T, path string, src []byte, got []Occurrence, want []wantOcc) {
	t.Helper()
	for i := 0; i < len(got) || i < len(want); i++ {
		if i >= len(want) {
			o := got[i]
			t.Errorf("%s: unexpected occurrence %q at %s", path, o.Text, lineCol(src, o.Span.Start))
			continue
		}
		w := want[i]
		if i >= len(got) {
			t.Errorf("%s:%d: missing occurrence «%s»", path, w.line, src[w.span.Start:w.span.End])
			continue
		}
		o := got[i]
		if o.Span != w.span || o.Text != w.text {
			t.Errorf("%s:%d: got %q at %s (host %q), want %q at %s", path, w.line, o.Text, lineCol(src, o.Span.Start),
				src[o.Span.Start:o.Span.End], w.text, lineCol(src, w.span.Start))
			continue
		}
		if w.title != nil && o.Title != *w.title {
			t.Errorf("%s:%d: title %q, want %q", path, w.line, o.Title, *w.title)
		}
		if o.Dialect != w.dialect {
			t.Errorf("%s:%d: %q read as %s, want %s", path, w.line, o.Text, o.Dialect, w.dialect)
		}
		diags, fixes := o.Diagnostics, o.Fixes
		if len(diags) > 0 && diags[0].Code == CodeListLayout {
			if w.note == "" || !strings.Contains(diags[0].Msg, w.note) || diags[0].Severity != notation.SeverityInformation {
				t.Errorf("%s:%d: layout note %q, want one containing %q", path, w.line, diags[0].Msg, w.note)
			}
			diags, fixes = diags[1:], fixes[1:]
		} else if w.note != "" {
			t.Errorf("%s:%d: no layout note, want one containing %q", path, w.line, w.note)
		}
		if len(diags) != len(w.diags) {
			t.Errorf("%s:%d: %d host diagnostics %v, want %d", path, w.line, len(diags), diags, len(w.diags))
			continue
		}
		for k, d := range w.diags {
			e := diags[k]
			if e.Span != d.span || e.Severity != d.sev || e.Code != CodeHostEscape {
				t.Errorf("%s:%d: diagnostic %v %s %s, want %v %s", path, w.line, e.Span, e.Severity, e.Code, d.span, d.sev)
			}
			if e.Msg == "" || strings.ToLower(e.Msg[:1]) != e.Msg[:1] {
				t.Errorf("%s:%d: message %q should be a lowercase fragment", path, w.line, e.Msg)
			}
			for _, f := range d.fixes {
				found := false
				for _, g := range fixes[k] {
					found = found || g.NewText == f
				}
				if !found {
					t.Errorf("%s:%d: no fix %q among %v", path, w.line, f, fixes[k])
				}
			}
		}
	}
	for i := range got {
		checkMap(t, path, src, &got[i])
	}
}

// checkMap checks the offset map of an occurrence against the host bytes:
// monotone, inside the occurrence, every notation byte mapped to the same
// byte in the host or to the backslash or quote opening its escape, and
// the inverse consistent.
func checkMap(t *testing.T, path string, src []byte, o *Occurrence) {
	t.Helper()
	prev := o.Span.Start
	for i := 0; i <= len(o.Text); i++ {
		h := o.HostOffset(i)
		if h < prev || h < o.Span.Start || h > o.Span.End || h > len(src) {
			t.Fatalf("%s: %q: HostOffset(%d) = %d outside [%d, %d] or before %d", path, o.Text, i, h, o.Span.Start, o.Span.End, prev)
		}
		prev = h
		if i == len(o.Text) {
			if h != o.Span.End {
				t.Errorf("%s: %q: HostOffset(len) = %d, want %d", path, o.Text, h, o.Span.End)
			}
			break
		}
		if c := src[h]; c != o.Text[i] && c != '\\' && c != '"' && c != '\'' {
			t.Errorf("%s: %q: notation byte %d %q maps to host byte %q", path, o.Text, i, o.Text[i], c)
		}
		n, ok := o.NotationOffset(h)
		if !ok || n > i {
			t.Errorf("%s: %q: NotationOffset(HostOffset(%d)) = %d, %v", path, o.Text, i, n, ok)
		}
	}
	if s := o.HostSpan(notation.Span{Start: 0, End: len(o.Text)}); s != o.Span {
		t.Errorf("%s: %q: HostSpan(all) = %v, want %v", path, o.Text, s, o.Span)
	}
}

// lineCol formats a host offset as 1-based line:column for messages.
func lineCol(src []byte, off int) string {
	line := 1 + bytes.Count(src[:off], []byte("\n"))
	col := off - bytes.LastIndexByte(src[:off], '\n')
	return strings.Join([]string{itoa(line), itoa(col)}, ":")
}

func itoa(n int) string {
	if n == 0 {
		return "0"
	}
	var b []byte
	for ; n > 0; n /= 10 {
		b = append([]byte{byte('0' + n%10)}, b...)
	}
	return string(b)
}

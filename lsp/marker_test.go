package lsp

import (
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"

	"go.lsp.dev/protocol"
)

// Marker tests: each file under testdata/markers is a host file whose
// comments carry annotations about the line they sit on:
//
//	@diag("TEXT", "CODE")   a diagnostic with CODE covers exactly TEXT
//	@hover("TEXT", "WORDS") hovering inside TEXT shows WORDS, over TEXT
//	@inlay("TEXT", "LABEL") an inlay hint LABEL sits right after TEXT
//
// TEXT is found in the line before the comment that holds the marker; in
// TEXT and WORDS, \\ stands for a backslash and \" for a quote, and any
// other backslash is itself.
// Every diagnostic and every inlay hint the server sends must be
// annotated, so a finding nobody expected fails the test too. Each file
// runs in UTF-16 and in UTF-8.

var (
	markerRE    = regexp.MustCompile(`@(diag|hover|inlay)\("((?:[^"\\]|\\.)*)", "((?:[^"\\]|\\.)*)"\)`)
	markerStart = regexp.MustCompile(`@(diag|hover|inlay)\(`)
	unescape    = strings.NewReplacer(`\\`, `\`, `\"`, `"`)
)

// marker is one annotation, located in the text.
type marker struct {
	kind, at, want string
	line           int
	offset         int // byte offset of the first byte of at
}

func readMarkers(t *testing.T, text string) []marker {
	t.Helper()
	var out []marker
	lineStart := 0
	for i, line := range strings.SplitAfter(text, "\n") {
		ms := markerRE.FindAllStringSubmatchIndex(line, -1)
		if n := len(markerStart.FindAllStringIndex(line, -1)); n != len(ms) {
			t.Fatalf("line %d: %d annotations of which %d read: %q", i+1, n, len(ms), line)
		}
		if len(ms) > 0 {
			code := line[:ms[0][0]]
			for _, opener := range []string{"<!--", "#"} {
				if j := strings.LastIndex(code, opener); j >= 0 {
					code = code[:j]
					break
				}
			}
			for _, m := range ms {
				mk := marker{kind: line[m[2]:m[3]], at: unescape.Replace(line[m[4]:m[5]]), want: unescape.Replace(line[m[6]:m[7]]), line: i}
				j := strings.Index(code, mk.at)
				if j < 0 {
					t.Fatalf("line %d: %q not found before the comment", i+1, mk.at)
				}
				mk.offset = lineStart + j
				out = append(out, mk)
			}
		}
		lineStart += len(line)
	}
	return out
}

func TestMarkers(t *testing.T) {
	files, err := filepath.Glob(filepath.Join("testdata", "markers", "*"))
	if err != nil || len(files) == 0 {
		t.Fatalf("no marker files: %v", err)
	}
	for _, file := range files {
		b, err := os.ReadFile(file)
		if err != nil {
			t.Fatal(err)
		}
		text := string(b)
		markers := readMarkers(t, text)
		for _, enc := range []PositionEncoding{EncodingUTF16, EncodingUTF8} {
			t.Run(filepath.Base(file)+"/"+string(enc), func(t *testing.T) {
				runMarkers(t, file, text, markers, enc)
			})
		}
	}
}

func runMarkers(t *testing.T, file, text string, markers []marker, enc PositionEncoding) {
	c := start(t, clientSetup{caps: map[string]any{"general": map[string]any{"positionEncodings": []string{string(enc)}}}})
	abs, _ := filepath.Abs(file)
	u := "file://" + filepath.ToSlash(abs)
	c.open(u, "", 1, text)
	diags := c.diagnostics(u, 1)
	var hints []hint
	c.mustCall(methodInlayHint, map[string]any{"textDocument": textDoc(u), "range": map[string]any{
		"start": protocol.Position{}, "end": offsetPosition(text, len(text), enc),
	}}, &hints)

	usedDiag := make([]bool, len(diags))
	usedHint := make([]bool, len(hints))
	for _, m := range markers {
		switch m.kind {
		case "diag":
			found := false
			for i, d := range diags {
				if usedDiag[i] || d.Code != m.want {
					continue
				}
				if positionOffset(t, text, d.Range.Start, enc) == m.offset && rangeText(t, text, d.Range, enc) == m.at {
					usedDiag[i], found = true, true
					break
				}
			}
			if !found {
				t.Errorf("line %d: no %s over %q", m.line+1, m.want, m.at)
			}
		case "hover":
			pos := offsetPosition(text, m.offset+len(m.at)/2, enc)
			h := hoverAt(t, c, u, pos)
			switch {
			case h == nil:
				t.Errorf("line %d: no hover inside %q", m.line+1, m.at)
			case !strings.Contains(h.Contents.Value, m.want):
				t.Errorf("line %d: hover inside %q lacks %q:\n%s", m.line+1, m.at, m.want, h.Contents.Value)
			case h.Range == nil || rangeText(t, text, *h.Range, enc) != m.at:
				t.Errorf("line %d: hover range %v, want it over %q", m.line+1, h.Range, m.at)
			}
		case "inlay":
			want := offsetPosition(text, m.offset+len(m.at), enc)
			found := false
			for i, h := range hints {
				if !usedHint[i] && h.Label == m.want && h.Position == want {
					usedHint[i], found = true, true
					break
				}
			}
			if !found {
				t.Errorf("line %d: no inlay hint %s after %q (at %v); hints %+v", m.line+1, m.want, m.at, want, hints)
			}
		}
	}
	for i, d := range diags {
		if !usedDiag[i] {
			t.Errorf("unannotated diagnostic %s on line %d over %q: %s", d.Code, d.Range.Start.Line+1, rangeText(t, text, d.Range, enc), d.Message)
		}
	}
	for i, h := range hints {
		if !usedHint[i] {
			t.Errorf("unannotated inlay hint %s at %v", h.Label, h.Position)
		}
	}
}

package find

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// FuzzFind checks, for any content and any host kind, that the finder
// does not panic and that every occurrence is consistent: spans inside
// the content, offset maps monotone and inside the occurrence, each byte
// at the host byte it was written as, the
// inverse map landing at or before the byte it came from, diagnostics
// and fixes inside the content.
func FuzzFind(f *testing.F) {
	for _, dir := range []string{"markers", "negatives", "corpus"} {
		files, _ := filepath.Glob(filepath.Join("testdata", dir, "*"))
		for _, path := range files {
			if strings.HasSuffix(path, ".want") {
				continue
			}
			src, err := os.ReadFile(path)
			if err == nil {
				f.Add(src, uint8(KindForName(strings.TrimSuffix(path, ".src"))))
			}
		}
	}
	f.Add([]byte(`x = "\`), uint8(KindPython))
	f.Add([]byte(`{"cells":[{"cell_type":"code","source":"s = \"\\`), uint8(KindNotebook))
	f.Add([]byte("s = f\"{x:{y}} C1CC\\1 {{\" f'{a[\"k\"]!r}'"), uint8(KindPython))
	f.Add([]byte("String smiles = \"\"\"\r\n  F/C=\\\n  C\\F\\s\n \"\"\";"), uint8(KindJava))
	f.Add([]byte("val smiles = \"${m[\"k\"]} $x F/C=C/F\" + \"\"\"$y C1CC1\"\"\"\""), uint8(KindKotlin))
	f.Add([]byte("const s = `${a} F/C=C\\F ${`${b}`}`"), uint8(KindJavaScript))
	f.Add([]byte("x = \"$(f(\")\")) C1CC1 $y\""), uint8(KindJulia))
	f.Add([]byte("a `\nF/C=C/F\n` b ``x\n`` `c"), uint8(KindMarkdown))
	f.Fuzz(func(t *testing.T, src []byte, kind uint8) {
		k := Kind(kind % uint8(KindNotebook+1))
		for _, o := range FindKind(k, src, Config{}) {
			if o.Span.Start < 0 || o.Span.End > len(src) || o.Span.Start > o.Span.End {
				t.Fatalf("%s: span %v outside content of %d bytes", k, o.Span, len(src))
			}
			prev := o.Span.Start
			for i := 0; i <= len(o.Text); i++ {
				h := o.HostOffset(i)
				if h < prev || h > o.Span.End {
					t.Fatalf("%s: %q: HostOffset(%d) = %d not in [%d, %d]", k, o.Text, i, h, prev, o.Span.End)
				}
				prev = h
				// Each byte sits at itself in the host, or at the
				// backslash or quote opening its escape.
				if i < len(o.Text) && h < len(src) {
					if c := src[h]; c != o.Text[i] && c != '\\' && c != '"' && c != '\'' {
						t.Fatalf("%s: %q: notation byte %d %q at host byte %q", k, o.Text, i, o.Text[i], c)
					}
				}
				if n, ok := o.NotationOffset(h); !ok || n > i {
					t.Fatalf("%s: %q: NotationOffset(HostOffset(%d)=%d) = %d, %v", k, o.Text, i, h, n, ok)
				}
			}
			for j, e := range o.Diagnostics {
				if e.Span.Start < 0 || e.Span.End > len(src) || e.Span.Start > e.Span.End {
					t.Fatalf("%s: diagnostic span %v outside content", k, e.Span)
				}
				for _, fx := range o.Fixes[j] {
					if fx.Span.Start < 0 || fx.Span.End > len(src) || fx.Span.Start > fx.Span.End {
						t.Fatalf("%s: fix span %v outside content", k, fx.Span)
					}
				}
			}
		}
	})
}

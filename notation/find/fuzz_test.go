package find

import (
	"encoding/json"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"stereoline/notation"
)

// The fuzz targets of the finder: FuzzFind over every host kind, and one
// target per host family (Python, tables and lists, JSON and notebooks,
// Markdown) whose seeds are files of that family, so that the mutator
// works from inputs the host's scanner takes seriously. All check the
// same promises (checkFound). The corpora live in
// testdata/fuzz/<target>.

// FuzzFind checks, for any content and any host kind, that the finder
// does not panic and that every occurrence is consistent
// (checkFound).
func FuzzFind(f *testing.F) {
	for _, path := range seedFiles(f) {
		src, err := os.ReadFile(path)
		if err == nil {
			f.Add(src, uint8(KindForName(strings.TrimSuffix(path, ".src"))))
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
	f.Add([]byte(".. code-block:: python\n   :x:\n\n   s = 'F/C=C/F'\nText::\n\n  C1CC1 t\n>>> m('C\\1')\n``CC``"), uint8(KindRST))
	f.Fuzz(func(t *testing.T, src []byte, kind uint8) {
		k := Kind(kind % uint8(KindSDF+1))
		checkFound(t, k, src, FindKind(k, src, Config{}))
	})
}

// FuzzFindPython: Python sources, with string prefixes, escapes,
// implicit concatenation, f-strings, doctests and pragmas.
func FuzzFindPython(f *testing.F) {
	addSeedFiles(f, KindPython)
	for _, s := range []string{
		`smiles = "F/C=C\\F"`, `smi = r'F/C=C\F'`, `s = b"C1CC\1"`, `x = ("F/C=C" "/F")`,
		"smiles = '''\nC[C@H](N)O\n'''", `s = f"{x!r:>{w}} C[C@@H](F)Cl {{"`, `mol = Chem.MolFromSmiles("c1ccccc1\x41")`,
		`smiles = "\N{LATIN SMALL LETTER E WITH ACUTE}C\u00e9\U0001F600"`, "def f():\n    \"\"\"\n    >>> smi('F/C=C/F')\n    \"\"\"\n",
		"# stereoline: notation\nx = 'C[C@H]1CC1'", `pattern = Chem.MolFromSmarts("[#6;R]~[C@@H]")`, "s = 'C\\\nC'", `smiles = "C%(12)C%(12"`,
	} {
		f.Add([]byte(s))
	}
	f.Fuzz(func(t *testing.T, src []byte) {
		checkFound(t, KindPython, src, FindKind(KindPython, src, Config{}))
	})
}

// FuzzFindTable: CSV and TSV tables and record lists (which kind comes
// from the second argument), with quoted cells, doubled quotes, titles,
// layout pragmas and extension blocks.
func FuzzFindTable(f *testing.F) {
	for _, k := range []Kind{KindCSV, KindTSV, KindList} {
		addSeedFiles(f, k)
	}
	for _, s := range []struct {
		text string
		kind Kind
	}{
		{"id,smiles\n1,\"F/C=C/F\"\n2,\"C[C@H](\"\"x\"\")O\"\n", KindCSV},
		{"SMILES,name\r\nC[C@H](N)O,alanine\r\n\"unterminated", KindCSV},
		{"smiles\tname\nF/C=C/F\ttrans\n\tempty\n", KindTSV},
		{"C[C@H](O)[C@@H](C)Cl |o1:1,3| first\nF/C=C/F trans\n# comment\n", KindList},
		{"# stereoline: layout title,notation\nname F/C=C/F\n", KindList},
		{"CC(=O)O.OCC>[H+]>CC(=O)OCC.O rxn\n", KindList},
	} {
		f.Add([]byte(s.text), uint8(s.kind))
	}
	f.Fuzz(func(t *testing.T, src []byte, which uint8) {
		k := pickKind(which, KindCSV, KindTSV, KindList)
		checkFound(t, k, src, FindKind(k, src, Config{}))
	})
}

// FuzzFindJSON: JSON documents and Jupyter notebooks (which from the
// second argument), with escapes, surrogate pairs and code cells whose
// string literals are escaped twice.
func FuzzFindJSON(f *testing.F) {
	for _, k := range []Kind{KindJSON, KindNotebook} {
		addSeedFiles(f, k)
	}
	for _, s := range []struct {
		text string
		kind Kind
	}{
		{`{"smiles": "F/C=C\\F", "name": "x", "list": ["C[C@H](N)O", {"smi": "\u0043\ud83d\ude00"}]}`, KindJSON},
		{`{"smiles": "F/C=C\/F", "bad": "\ud800", "cut": "C[C@`, KindJSON},
		{`[{"reaction_smiles": "CC(=O)O>>CC(=O)OC"}, 1, true, null]`, KindJSON},
		{`{"cells":[{"cell_type":"code","source":["smiles = \"F/C=C\\\\F\"\n","x = 'C1CC\\1'"]}],"metadata":{"language_info":{"name":"python"}}}`, KindNotebook},
		{`{"cells":[{"cell_type":"markdown","source":"` + "`F/C=C/F`" + `"},{"cell_type":"code","source":"%%bash\necho \"F/C=C/F\""}]}`, KindNotebook},
		{`{"cells":[{"cell_type":"code","source":"s = \"\\`, KindNotebook},
	} {
		f.Add([]byte(s.text), uint8(s.kind))
	}
	f.Fuzz(func(t *testing.T, src []byte, which uint8) {
		k := pickKind(which, KindJSON, KindNotebook)
		checkFound(t, k, src, FindKind(k, src, Config{}))
	})
}

// FuzzFindMarkdown: Markdown with code spans over lines, fences tagged
// smiles, indented blocks and pragmas.
func FuzzFindMarkdown(f *testing.F) {
	addSeedFiles(f, KindMarkdown)
	for _, s := range []string{
		"a `\nF/C=C/F\n` b ``x\n`` `c", "```smiles\nC[C@H](N)O alanine\nF/C=C/F |c:1|\n```\n",
		"~~~smi\nC1CC1\n~~~~\n`C[C@@H](F)Cl`", "    F/C=C/F\n\n* `[C@@H]` and `` `C` ``\n",
		"<!-- stereoline: notation -->\n`CCO`\n", "```\nunclosed `F/C=C/F`",
	} {
		f.Add([]byte(s))
	}
	f.Fuzz(func(t *testing.T, src []byte) {
		checkFound(t, KindMarkdown, src, FindKind(KindMarkdown, src, Config{}))
	})
}

// FuzzFindRST: reStructuredText, with directives and their options,
// literal blocks, doctest lines, inline literals and pragmas.
func FuzzFindRST(f *testing.F) {
	addSeedFiles(f, KindRST)
	for _, s := range []string{
		".. code-block:: python\n   :linenos:\n\n   s = 'F/C=C/F'\n   t = \"C1CC\\1\"\nafter",
		"Text::\n\n  C[C@H](F)Cl t\n  >>> m('C1CC1')\n\nmore ``CC`` the SMILES ``CCO``.",
		">>> x = ('F/C=C'\n...      '/F')\n'F/C=C/F'\n", ".. doctest::\n\n   >>> f('[C@@H]')\n",
		"::\n\n\tC1CC1\n", ".. code:: js\n\n  s = `${a} F/C=C\\F`\n", "``\n`` ``C[C@@H](F)Cl",
	} {
		f.Add([]byte(s))
	}
	f.Fuzz(func(t *testing.T, src []byte) {
		checkFound(t, KindRST, src, FindKind(KindRST, src, Config{}))
	})
}

// pickKind reads a target's kind argument: one of kinds as is (the
// seeds pass their kind), any other value by its remainder.
func pickKind(which uint8, kinds ...Kind) Kind {
	for _, k := range kinds {
		if Kind(which) == k {
			return k
		}
	}
	return kinds[int(which)%len(kinds)]
}

// seedFiles lists the finder's test files: markers, negatives and the
// corpus, without their expectations.
func seedFiles(f *testing.F) []string {
	var out []string
	for _, dir := range []string{"markers", "negatives", "corpus"} {
		files, _ := filepath.Glob(filepath.Join("testdata", dir, "*"))
		for _, path := range files {
			if !strings.HasSuffix(path, ".want") {
				out = append(out, path)
			}
		}
	}
	return out
}

// addSeedFiles adds the test files of one kind; targets with a kind
// argument get it as uint8.
func addSeedFiles(f *testing.F, k Kind) {
	for _, path := range seedFiles(f) {
		if KindForName(strings.TrimSuffix(path, ".src")) != k {
			continue
		}
		src, err := os.ReadFile(path)
		if err != nil {
			continue
		}
		switch k {
		case KindCSV, KindTSV, KindList, KindJSON, KindNotebook:
			f.Add(src, uint8(k))
		default:
			f.Add(src)
		}
	}
}

// checkFound verifies what the finder promises of its occurrences:
// spans inside the content and in order without overlap; an offset map
// whose runs cover the notation in order, each plain run holding the
// very bytes of the notation and each escape decoding to the bytes it
// stands for; HostOffset monotone and NotationOffset its inverse; the
// spans of the molecule read from the text mapping inside the
// occurrence; diagnostics and fixes inside the content.
func checkFound(t *testing.T, k Kind, src []byte, occs []Occurrence) {
	t.Helper()
	end := 0
	for oi := range occs {
		o := &occs[oi]
		if o.Span.Start < 0 || o.Span.End > len(src) || o.Span.Start > o.Span.End {
			t.Fatalf("%s: span %v outside content of %d bytes", k, o.Span, len(src))
		}
		if o.Span.Start < end {
			t.Fatalf("%s: occurrence %d at %v starts before the previous one ends (%d)", k, oi, o.Span, end)
		}
		end = o.Span.End
		checkRuns(t, k, src, o)
		prev := o.Span.Start
		for i := 0; i <= len(o.Text); i++ {
			h := o.HostOffset(i)
			if h < prev || h > o.Span.End {
				t.Fatalf("%s: %q: HostOffset(%d) = %d not in [%d, %d]", k, o.Text, i, h, prev, o.Span.End)
			}
			prev = h
			if n, ok := o.NotationOffset(h); !ok || n > i {
				t.Fatalf("%s: %q: NotationOffset(HostOffset(%d)=%d) = %d, %v", k, o.Text, i, h, n, ok)
			}
		}
		if len(o.Text) < 2000 {
			m := notation.Read(o.Text)
			for ai := range m.Atoms {
				if hs := o.HostSpan(m.Atoms[ai].Span); hs.Start < o.Span.Start || hs.End > o.Span.End || hs.Start > hs.End {
					t.Fatalf("%s: %q: atom %d at %v maps to %v outside %v", k, o.Text, ai+1, m.Atoms[ai].Span, hs, o.Span)
				}
			}
		}
		if len(o.Fixes) != len(o.Diagnostics) {
			t.Fatalf("%s: %d diagnostics and %d fix lists", k, len(o.Diagnostics), len(o.Fixes))
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
}

// checkRuns checks the offset map against the host bytes: the runs cover
// the notation from 0 without gaps, their host ranges are in order inside
// the occurrence, a plain run is the notation's own bytes, and an escape
// decodes to the notation bytes it stands for.
func checkRuns(t *testing.T, k Kind, src []byte, o *Occurrence) {
	t.Helper()
	m := o.m
	if m.runs == nil {
		if m.size != len(o.Text) || m.base != o.Span.Start || m.base+m.size != o.Span.End {
			t.Fatalf("%s: identity map at %d over %d bytes for %q at %v", k, m.base, m.size, o.Text, o.Span)
		}
		if string(src[m.base:m.base+m.size]) != o.Text {
			t.Fatalf("%s: %q written verbatim as %q", k, o.Text, src[m.base:m.base+m.size])
		}
		return
	}
	n, h := 0, o.Span.Start
	for ri, r := range m.runs {
		if r.n != n || r.nlen <= 0 || r.h < h || r.hlen <= 0 || r.h+r.hlen > o.Span.End {
			t.Fatalf("%s: %q at %v: run %d %+v after notation %d, host %d", k, o.Text, o.Span, ri, r, n, h)
		}
		want, host := o.Text[r.n:r.n+r.nlen], string(src[r.h:r.h+r.hlen])
		if !r.atomic && host != want || r.atomic && !decodesTo(host, want) {
			t.Fatalf("%s: %q: notation %q written as %q (run %+v)", k, o.Text, want, host, r)
		}
		n, h = r.n+r.nlen, r.h+r.hlen
	}
	if n != len(o.Text) {
		t.Fatalf("%s: runs cover %d of the %d bytes of %q", k, n, len(o.Text), o.Text)
	}
	if m.runs[0].h != o.Span.Start || h != o.Span.End {
		t.Fatalf("%s: runs over host [%d, %d), occurrence at %v", k, m.runs[0].h, h, o.Span)
	}
}

// lenientUnescape resolves the one-character backslash escapes and
// keeps any other backslash as written, as the finders do with an escape
// the host does not know (JSON's \B).
func lenientUnescape(s string) (string, bool) {
	var b strings.Builder
	for i := 0; i < len(s); i++ {
		if s[i] != '\\' || i+1 == len(s) {
			b.WriteByte(s[i])
			continue
		}
		switch c := s[i+1]; c {
		case '\\', '"', '\'', '/', '$': // \$: a dollar in Kotlin and Julia strings
			b.WriteByte(c)
		case 'n':
			b.WriteByte('\n')
		case 't':
			b.WriteByte('\t')
		case 'r':
			b.WriteByte('\r')
		case 'b':
			b.WriteByte('\b')
		case 'f':
			b.WriteByte('\f')
		default:
			b.WriteByte('\\')
			b.WriteByte(c)
		}
		i++
	}
	return b.String(), true
}

// decodesTo reports whether an escape, as some host writes it, stands
// for want: a backslash escape of the C family (Go's strconv.Unquote reads
// the same as Python, JavaScript and the other code hosts for the
// escapes a finder resolves), a JSON escape, an unknown escape kept as written, a doubled
// character, or one of
// these inside another (a Python string in a notebook's JSON).
func decodesTo(host, want string) bool {
	decoders := []func(string) (string, bool){
		func(s string) (string, bool) { return s, true },
		func(s string) (string, bool) {
			v, err := strconv.Unquote(`"` + s + `"`)
			if err != nil {
				v, err = strconv.Unquote(`'` + s + `'`)
			}
			return v, err == nil
		},
		func(s string) (string, bool) {
			var v string
			err := json.Unmarshal([]byte(`"`+s+`"`), &v)
			return v, err == nil
		},
		lenientUnescape,
		func(s string) (string, bool) {
			// a backslash before a character that means itself: R's
			// "\ " and "\`" (?Quotes)
			if len(s) == 2 && s[0] == '\\' {
				return s[1:], true
			}
			return "", false
		},
		func(s string) (string, bool) {
			// a doubled character: a quote in a CSV cell or a YAML
			// scalar, %% in a format string, {{ in an f-string
			if len(s) == 2 && s[0] == s[1] {
				return s[:1], true
			}
			return "", false
		},
	}
	for _, outer := range decoders {
		mid, ok := outer(host)
		if !ok {
			continue
		}
		for _, inner := range decoders {
			if v, ok := inner(mid); ok && v == want {
				return true
			}
		}
	}
	return false
}

package find

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"stereoline/notation"
)

func TestKindForName(t *testing.T) {
	// Extensions: common practice for each format; .ipynb from the
	// Jupyter notebook format documentation.
	tests := []struct {
		name string
		want Kind
	}{
		{"library.smi", KindList},
		{"dir/sub/REACTIONS.RSMI", KindList},
		{"x.cxsmiles", KindList},
		{"table.csv", KindCSV},
		{"table.tsv", KindTSV},
		{"analysis.ipynb", KindNotebook},
		{"script.py", KindPython},
		{"app.tsx", KindJavaScript},
		{"main.go", KindGo},
		{`C:\work\plot.R`, KindR},
		{"model.jl", KindJulia},
		{"lib.rs", KindRust},
		{"Mol.java", KindJava},
		{"build.gradle.kts", KindKotlin},
		{"README.md", KindMarkdown},
		{"report.Rmd", KindMarkdown},
		{"paper.qmd", KindMarkdown},
		{"data.json", KindJSON},
		{"reactions.jsonl", KindJSON},
		{"records.ndjson", KindJSON},
		{"conf.yml", KindYAML},
		{"notes.txt", KindUnknown},
		{"Makefile", KindUnknown},
		{"", KindUnknown},
	}
	for _, tt := range tests {
		if got := KindForName(tt.name); got != tt.want {
			t.Errorf("KindForName(%q) = %s, want %s", tt.name, got, tt.want)
		}
	}
}

func TestKindFor(t *testing.T) {
	// Language identifiers from the LSP 3.17 specification, section
	// "TextDocumentItem" (table of known language identifiers).
	tests := []struct {
		id   string
		want Kind
	}{
		{"python", KindPython},
		{"typescriptreact", KindJavaScript},
		{"javascript", KindJavaScript},
		{"go", KindGo},
		{"r", KindR},
		{"rust", KindRust},
		{"java", KindJava},
		{"markdown", KindMarkdown},
		{"json", KindJSON},
		{"yaml", KindYAML},
		{"csv", KindCSV},
		{"Python", KindPython},
		{"smiles", KindList},
		{"cpp", KindUnknown},
		{"plaintext", KindUnknown},
	}
	for _, tt := range tests {
		if got := KindFor(tt.id); got != tt.want {
			t.Errorf("KindFor(%q) = %s, want %s", tt.id, got, tt.want)
		}
	}
	// Every kind's own name maps back to it.
	for k := KindList; k <= KindNotebook; k++ {
		if got := KindFor(k.String()); got != k {
			t.Errorf("KindFor(%q) = %s", k.String(), got)
		}
	}
}

// TestNames checks what names say: value is the reading of a variable,
// key or argument name, call that of a function name (with the name of
// what it is called on), each as "smiles", "smarts", "both", "about" or
// "" with "!" for a firm place. The constructor names are those of the
// general-purpose libraries' documentation: RDKit (MolFromSmiles,
// MolFromSmarts, ReactionFromSmarts), the CDK (SmartsPattern.create,
// SMARTSQueryTool), Open Babel's pybel (Smarts), Indigo (loadSmarts,
// loadQueryMolecule) and RDKit's JavaScript build (get_qmol, from
// memory).
func TestNames(t *testing.T) {
	nm := newNamer(&Config{})
	say := func(w wants, about bool) string {
		s := ""
		switch {
		case about:
			return "about"
		case w.smiles > 0 && w.smarts > 0:
			s = "both"
		case w.smiles > 0:
			s = "smiles"
		case w.smarts > 0:
			s = "smarts"
		}
		if w.smiles == firmly || w.smarts == firmly {
			s += "!"
		}
		return s
	}
	tests := []struct {
		name, receiver string
		value, call    string
	}{
		{"smiles", "", "smiles", "smiles!"},
		{"SMILES_LIST", "", "smiles", "smiles!"},
		{"MolFromSmiles", "Chem", "smiles", "smiles!"},
		{"reactantSmiles", "", "smiles", "smiles!"},
		{"rxn", "", "smiles", "smiles"},
		{"reaction", "", "smiles", "smiles"},
		{"HeteroAtomReaction", "", "smiles", "smiles"},
		{"canonicalsmiles", "", "smiles", "smiles!"},
		{"smi", "", "smiles", "smiles!"},
		{"smiles_col", "", "about", "about"},
		{"smiles_file", "", "about", "about"},
		{"reaction_name", "", "about", "smiles"},
		{"is_valid_smiles", "", "smiles", "smiles!"},
		{"read_smiles_file", "", "about", "about"},
		{"MolFromSmarts", "Chem", "smarts", "smarts!"},
		{"ReactionFromSmarts", "AllChem", "smarts", "smarts!"},
		{"reaction_smarts", "", "smarts", "smarts!"},
		{"AcceptorSmarts", "", "smarts", "smarts!"},
		{"create", "SmartsPattern", "", "smarts!"},
		{"SMARTSQueryTool", "", "smarts", "smarts!"},
		{"Smarts", "pybel", "smarts", "smarts!"},
		{"loadSmarts", "indigo", "smarts", "smarts!"},
		{"loadQueryMolecule", "indigo", "smarts", "both"},
		{"get_qmol", "RDKit", "smarts", "smarts!"},
		{"patterns", "", "smarts", ""},
		{"reaction_rules", "", "both", "smiles"},
		{"smarts_col", "", "about", "about"},
		{"append", "smarts_list", "", ""},
		{"semicolon", "", "", ""},
		{"transmission", "", "", ""},
		{"smith", "", "", ""},
		{"name", "", "", ""},
	}
	for _, tt := range tests {
		if got := say(nm.classify(tt.name)); got != tt.value {
			t.Errorf("classify(%q) = %q, want %q (parts %v)", tt.name, got, tt.value, nameParts(tt.name))
		}
		if got := say(nm.call(tt.name, tt.receiver)); got != tt.call {
			t.Errorf("call(%q, %q) = %q, want %q", tt.name, tt.receiver, got, tt.call)
		}
	}
	extra := newNamer(&Config{Names: []string{"Structure"}})
	if !extra.value("mol_structure") || nm.value("mol_structure") {
		t.Error("Config.Names should add name parts")
	}
}

func TestUnmistakable(t *testing.T) {
	tests := []struct {
		s    string
		want bool
	}{
		// Notation from the OpenSMILES specification's examples.
		{"F/C=C/F", true},
		{"F/C=C\\F", true},
		{"N[C@@H](C)C(=O)O", true},
		{"C1CCCCC1", true},
		{"c1ccccc1", true},
		{"[NH4+]", true},
		{"[2H]C", true},
		// Ordinary words and element-like strings (common practice).
		{"Cl", false},
		{"CO", false},
		{"NO", false},
		{"Co", false},
		{"C", false},
		{"OK", false},
		{"SCSS", false},
		{"OCCO", false},
		{"I/O", false},
		{"N/A", false},
		{"B/C", false},
		{"C/C", false},
		{"CO/NO", false},
		{"/usr/bin", false},
		{"src/main", false},
		{"https://example.org/a", false},
		{"2024/01/31", false},
		{"1.2.3", false},
		{"[0-9]+", false},
		{"\\d+", false},
		{"[C]", false},
		{"[OK]", false},
		{"C3PO", false},
		{"CO2", false},
		{"H2O", false},
		{"C1C1", false},
		{"O-O", false},
		{"Nf3", false},
		{"in.smi", false},
	}
	for _, tt := range tests {
		if got := unmistakable(tt.s); got != tt.want {
			m := notation.Read(tt.s)
			t.Errorf("unmistakable(%q) = %v, want %v (reader errors: %v)", tt.s, got, tt.want, m.Errors)
		}
	}
}

func TestOffsetMap(t *testing.T) {
	// Python source `x = "a\\b" "c"`: notation a\bc. Offsets by hand
	// from the text below: the quote at 4, a at 5, \\ at 6-7, b at 8,
	// the second literal's c at 12.
	src := []byte(`x = "a\\b" "c"`)
	occs := FindKind(KindPython, src, Config{Kind: KindPython, Names: []string{"x"}})
	_ = occs // x is too short a name; build the map directly instead
	var d decoded
	p1 := piece{content: notation.Span{Start: 5, End: 9}}
	p2 := piece{content: notation.Span{Start: 12, End: 13}}
	d.piece(src, &p1, python.rules)
	d.piece(src, &p2, python.rules)
	m := d.b.done(5)
	o := Occurrence{Text: string(d.text), m: m}
	if o.Text != `a\bc` {
		t.Fatalf("text %q", o.Text)
	}
	hosts := []int{5, 6, 8, 12, 13}
	for i, want := range hosts {
		if got := o.HostOffset(i); got != want {
			t.Errorf("HostOffset(%d) = %d, want %d", i, got, want)
		}
	}
	if got := o.HostSpan(notation.Span{Start: 1, End: 2}); got != (notation.Span{Start: 6, End: 8}) {
		t.Errorf("HostSpan of the backslash = %v, want the whole escape 6-8", got)
	}
	if got := o.HostSpan(notation.Span{Start: 2, End: 3}); got != (notation.Span{Start: 8, End: 9}) {
		t.Errorf("HostSpan of b = %v, want 8-9", got)
	}
	for _, tt := range []struct {
		host, want int
		ok         bool
	}{{5, 0, true}, {6, 1, true}, {7, 1, true}, {8, 2, true}, {9, 0, false}, {11, 0, false}, {12, 3, true}, {13, 4, true}, {14, 0, false}, {2, 0, false}} {
		n, ok := o.NotationOffset(tt.host)
		if ok != tt.ok || ok && n != tt.want {
			t.Errorf("NotationOffset(%d) = %d, %v; want %d, %v", tt.host, n, ok, tt.want, tt.ok)
		}
	}
	// slice keeps host offsets.
	s := m.slice(1, 3)
	if s.host(0) != 6 || s.host(1) != 8 || s.host(2) != 9 {
		t.Errorf("slice: %d %d %d", s.host(0), s.host(1), s.host(2))
	}
	// compose with a shift is a shift.
	c := compose(m, identityMap(100, 20))
	if c.host(3) != 112 || c.span(notation.Span{Start: 1, End: 2}) != (notation.Span{Start: 106, End: 108}) {
		t.Errorf("compose with a shift: %d %v", c.host(3), c.span(notation.Span{Start: 1, End: 2}))
	}
}

func TestNotebookHostBytes(t *testing.T) {
	// The cell source line smiles = "F/C=C\\F" is stored in JSON with
	// each backslash doubled again (RFC 8259, section 7), so the one
	// backslash of the notation is four bytes of the file.
	src, err := os.ReadFile(filepath.Join("testdata", "markers", "notebook.ipynb"))
	if err != nil {
		t.Fatal(err)
	}
	var o *Occurrence
	occs := Find("notebook.ipynb", src, Config{})
	for i := range occs {
		if occs[i].Text == `F/C=C\F` && occs[i].Cell == 2 {
			o = &occs[i]
			break
		}
	}
	if o == nil {
		t.Fatal("no F/C=C\\F in cell 2")
	}
	for i := 0; i < len(o.Text); i++ {
		s := o.HostSpan(notation.Span{Start: i, End: i + 1})
		host := string(src[s.Start:s.End])
		want := o.Text[i : i+1]
		if o.Text[i] == '\\' {
			want = `\\\\`
		}
		if host != want {
			t.Errorf("notation byte %d %q is host %q, want %q", i, o.Text[i], host, want)
		}
	}
	// The cell, analysed on its own as an editor sends it, gives the
	// same text, with offsets into the cell.
	cell := "smiles = \"F/C=C\\\\F\"\n"
	cellOccs := FindKind(KindFor("python"), []byte(cell), Config{})
	if len(cellOccs) != 1 || cellOccs[0].Text != o.Text || cellOccs[0].Span != (notation.Span{Start: 10, End: 18}) {
		t.Errorf("cell occurrences %+v", cellOccs)
	}
}

func TestConfig(t *testing.T) {
	// A column of letters alone is not taken by its content (see
	// tableByContent); named in the configuration, it is.
	src := []byte("id,mol,note\n1,FC,x\n2,CCO,y\n")
	if n := len(FindKind(KindCSV, src, Config{})); n != 0 {
		t.Errorf("column mol taken without configuration: %d", n)
	}
	if n := len(FindKind(KindCSV, []byte("id,mol,note\n1,F/C=C/F,x\n2,C1CCCCC1,y\n"), Config{})); n != 2 {
		t.Errorf("column mol read by its content: %d occurrences, want 2", n)
	}
	if n := len(FindKind(KindCSV, src, Config{Columns: []string{"MOL"}})); n != 2 {
		t.Errorf("configured column: %d occurrences, want 1", n)
	}
	code := []byte(`x = "C1CCCCC1"` + "\n" + `structure = "CCO"` + "\n")
	if n := len(FindKind(KindPython, code, Config{NoGuess: true})); n != 0 {
		t.Errorf("NoGuess: %d occurrences, want 0", n)
	}
	if n := len(FindKind(KindPython, code, Config{NoGuess: true, Names: []string{"structure"}})); n != 1 {
		t.Errorf("Names: %d occurrences, want 1", n)
	}
	if n := len(Find("x.txt", code, Config{Kind: KindPython})); n != 1 {
		t.Errorf("Kind override: %d occurrences, want 1", n)
	}
}

func TestPragmaFile(t *testing.T) {
	// "off" on the first line switches the whole file off.
	for _, tt := range []struct {
		kind Kind
		src  string
	}{
		{KindPython, "# stereoline: off\nsmiles = 'F/C=C/F'\nx = 'C1CCCCC1'\n"},
		{KindGo, "// stereoline: off\nvar smiles = \"F/C=C/F\"\n"},
		{KindList, "# stereoline: off\nF/C=C/F\nCCO\n"},
		{KindMarkdown, "<!-- stereoline: off -->\n`F/C=C/F`\n"},
		{KindYAML, "# stereoline: off\nsmiles: F/C=C/F\n"},
	} {
		if occs := FindKind(tt.kind, []byte(tt.src), Config{}); len(occs) != 0 {
			t.Errorf("%s: %d occurrences in a file switched off", tt.kind, len(occs))
		}
		on := strings.Replace(tt.src, "stereoline: off", "stereoline: online", 1)
		if occs := FindKind(tt.kind, []byte(on), Config{}); len(occs) == 0 {
			t.Errorf("%s: 'online' must not read as a pragma", tt.kind)
		}
	}
}

// TestFixesFix applies every suggested fix in the marker files and checks
// that the host then holds the same notation with no host problem: a fix
// that does not fix is a bug.
func TestFixesFix(t *testing.T) {
	files, _ := filepath.Glob(filepath.Join("testdata", "markers", "*"))
	fixes := 0
	for _, path := range files {
		if strings.HasSuffix(path, ".want") {
			continue
		}
		src, _ := os.ReadFile(path)
		name := strings.TrimSuffix(path, ".src")
		for _, o := range Find(name, src, Config{}) {
			for k := range o.Diagnostics {
				for _, f := range o.Fixes[k] {
					fixes++
					fixed := string(src[:f.Span.Start]) + f.NewText + string(src[f.Span.End:])
					ok := false
					for _, p := range Find(name, []byte(fixed), Config{}) {
						if p.Span.Start >= f.Span.Start && p.Span.End <= f.Span.Start+len(f.NewText) &&
							p.Text == o.Text && len(p.Diagnostics) == 0 {
							ok = true
						}
					}
					if !ok {
						t.Errorf("%s: fix %q (%s) of %q leaves a problem or loses the notation", path, f.NewText, f.Title, o.Text)
					}
				}
			}
		}
	}
	if fixes < 20 {
		t.Errorf("only %d fixes in the marker files", fixes)
	}
}

// TestGuessExtensionBlock checks that a string literal nobody names is
// taken whole when it is unmistakable notation followed by a CXSMILES
// extension block after a blank (the layout CXSMILES writers use, as
// RDKit 2022.09.3's MolToCXSmiles writes "C[C@H](F)Cl |&1:1|"), in every
// language whose literals are guessed; and that text with a block that
// is never closed, or that is no notation before the block, is not taken.
func TestGuessExtensionBlock(t *testing.T) {
	sources := []struct {
		kind Kind
		src  string
	}{
		{KindPython, "y = \"%s\"\nprint('%s')\n"},
		{KindJavaScript, "const y = \"%s\";\nf('%s');\n"},
		{KindGo, "var y = \"%s\"\nvar z = `%s`\n"},
		{KindR, "y <- \"%s\"\nf('%s')\n"},
	}
	texts := []struct {
		text string
		want bool
	}{
		{"C[C@H](F)Cl |&1:1|", true},
		{"N[C@@H](C)C(=O)O |o1:1|", true},
		{"CC(C)Cc1ccc(cc1)[C@@H](C)C(=O)O |a:10|", true},
		{"F/C=C/[C@H](O)C |&1:3,r|", true},
		// an unknown field is kept as written (the reader notes it)
		{"C[C@H](F)Cl |zz9|", true},
		// a block that is never closed is no block: the text is no record
		{"C[C@H](F)Cl |&1:1", false},
		// and the text before it must be notation (common practice)
		{"usage |&1:1|", false},
		{"a b |&1:1|", false},
	}
	for _, s := range sources {
		for _, tt := range texts {
			src := strings.ReplaceAll(s.src, "%s", tt.text)
			occs := FindKind(s.kind, []byte(src), Config{})
			got := 0
			for _, o := range occs {
				if o.Text == tt.text {
					got++
				} else {
					t.Errorf("%v %q: found %q, want the whole text or nothing", s.kind, tt.text, o.Text)
				}
			}
			if want := map[bool]int{true: 2, false: 0}[tt.want]; got != want {
				t.Errorf("%v %q: found %d times, want %d", s.kind, tt.text, got, want)
			}
		}
	}
}

// TestDictKeyTitles checks that the string key of a dict or object entry
// labels the record nobody names that is its value (a layout of common
// practice: {"naproxen": "..."}), while a key that names the notation,
// a generic key and the elements of a list under a key label nothing.
func TestDictKeyTitles(t *testing.T) {
	tests := []struct {
		kind Kind
		src  string
		want []string // text=title
	}{
		{KindPython, `drugs = {"naproxen": "COc1ccc2cc([C@H](C)C(=O)O)ccc2c1", "value": "F/C=C/F", "smiles": "C[C@H](F)Cl", "pair": ["C1CC[C@H](O)CC1"]}`,
			[]string{"COc1ccc2cc([C@H](C)C(=O)O)ccc2c1=naproxen", "F/C=C/F=", "C[C@H](F)Cl=", "C1CC[C@H](O)CC1="}},
		{KindJavaScript, `const m = {"lead": "C[C@@H](O)c1ccccc1", other: "F/C=C/F"};`,
			[]string{"C[C@@H](O)c1ccccc1=lead", "F/C=C/F="}},
	}
	for _, tt := range tests {
		var got []string
		for _, o := range FindKind(tt.kind, []byte(tt.src), Config{}) {
			got = append(got, o.Text+"="+o.Title)
		}
		if strings.Join(got, " ") != strings.Join(tt.want, " ") {
			t.Errorf("%v %q: got %q, want %q", tt.kind, tt.src, got, tt.want)
		}
	}
}

package main

import (
	"go/ast"
	"go/parser"
	"go/token"
	"io/fs"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"stereoline/notation"
	"stereoline/stereo/document"
)

// repoRoot is the module root seen from this package's folder.
var repoRoot = filepath.Join("..", "..")

// declaredCodes finds every diagnostic code the project declares: each
// constant whose type is notation.Code (or Code inside package notation)
// with a string value, in any non-test Go file of the module. Reading the
// source rather than a registry means a new code is caught the moment it
// is written, in whatever package.
func declaredCodes(t *testing.T) map[notation.Code]string {
	t.Helper()
	codes := map[notation.Code]string{}
	fset := token.NewFileSet()
	err := filepath.WalkDir(repoRoot, func(path string, d fs.DirEntry, err error) error {
		if err != nil {
			return err
		}
		if d.IsDir() {
			if path != repoRoot && (strings.HasPrefix(d.Name(), ".") || d.Name() == "testdata" || d.Name() == "node_modules") {
				return filepath.SkipDir
			}
			return nil
		}
		if !strings.HasSuffix(path, ".go") || strings.HasSuffix(path, "_test.go") {
			return nil
		}
		f, err := parser.ParseFile(fset, path, nil, parser.SkipObjectResolution)
		if err != nil {
			return nil // a file being edited by someone else; the build reports it
		}
		inNotation := f.Name.Name == "notation"
		for _, decl := range f.Decls {
			gd, ok := decl.(*ast.GenDecl)
			if !ok || gd.Tok != token.CONST {
				continue
			}
			for _, spec := range gd.Specs {
				vs := spec.(*ast.ValueSpec)
				if !isCodeType(vs.Type, inNotation) {
					continue
				}
				for i, v := range vs.Values {
					lit, ok := v.(*ast.BasicLit)
					if !ok || lit.Kind != token.STRING {
						continue
					}
					s, err := strconv.Unquote(lit.Value)
					if err != nil {
						continue
					}
					codes[notation.Code(s)] = filepath.ToSlash(path) + ": " + vs.Names[i].Name
				}
			}
		}
		return nil
	})
	if err != nil {
		t.Fatal(err)
	}
	return codes
}

func isCodeType(e ast.Expr, inNotation bool) bool {
	switch x := e.(type) {
	case *ast.Ident:
		return inNotation && x.Name == "Code"
	case *ast.SelectorExpr:
		pkg, ok := x.X.(*ast.Ident)
		return ok && pkg.Name == "notation" && x.Sel.Name == "Code"
	}
	return false
}

func TestCatalogueCoversEveryCode(t *testing.T) {
	declared := declaredCodes(t)
	// The reader's codes alone are more than ten; finding fewer means the
	// scan itself is broken.
	if len(declared) < 10 {
		t.Fatalf("found only %d code declarations; the source scan is broken", len(declared))
	}
	documented := map[notation.Code]bool{}
	for _, d := range codeCatalogue {
		if documented[d.Code] {
			t.Errorf("%s documented twice", d.Code)
		}
		documented[d.Code] = true
		if d.Short == "" || d.Full == "" || d.Help == "" || d.Example.Text == "" {
			t.Errorf("%s: short and full description, help and example are all required", d.Code)
		}
		if _, ok := declared[d.Code]; !ok {
			t.Errorf("%s is documented but no longer declared anywhere", d.Code)
		}
	}
	for code, where := range declared {
		if !documented[code] {
			t.Errorf("%s (%s) is missing from codeCatalogue in check_codes.go", code, where)
		}
	}
}

// TestCatalogueExamples runs the engine on each example: the README
// promises that the example shows the code.
func TestCatalogueExamples(t *testing.T) {
	a := document.NewAnalyzer(document.DefaultConfig())
	for _, d := range codeCatalogue {
		if d.Example.NotShown != "" {
			continue
		}
		res := a.Analyze(d.Example.File, "", []byte(d.Example.Text))
		found := false
		var got []string
		for _, diag := range res.Diagnostics() {
			found = found || diag.Code == d.Code
			got = append(got, string(diag.Code))
		}
		if !found {
			t.Errorf("%s: example %q in %s gives %v", d.Code, d.Example.Text, d.Example.File, got)
		}
	}
}

// The README's catalogue section is generated from codeCatalogue; -update
// rewrites it between the markers.
const (
	catalogueBegin = "<!-- codes:begin (generated from cmd/stereoline/check_codes.go; go test ./cmd/stereoline -run README -update) -->"
	catalogueEnd   = "<!-- codes:end -->"
)

func TestREADMECatalogue(t *testing.T) {
	path := filepath.Join(repoRoot, "README.md")
	data, err := os.ReadFile(path)
	if err != nil {
		t.Skipf("no README: %v", err)
	}
	text := string(data)
	i, j := strings.Index(text, catalogueBegin), strings.Index(text, catalogueEnd)
	if i < 0 || j < i {
		t.Fatalf("README.md lacks the markers %q and %q", catalogueBegin, catalogueEnd)
	}
	want := catalogueBegin + "\n" + catalogueMarkdown() + catalogueEnd
	got := text[i : j+len(catalogueEnd)]
	if got == want {
		return
	}
	if *update {
		if err := os.WriteFile(path, []byte(text[:i]+want+text[j+len(catalogueEnd):]), 0o644); err != nil {
			t.Fatal(err)
		}
		return
	}
	t.Errorf("README.md's catalogue of codes is out of date: run go test ./cmd/stereoline -run README -update")
}

// catalogueMarkdown renders the catalogue as README sections.
func catalogueMarkdown() string {
	var b strings.Builder
	origins := []struct{ origin, title string }{
		{originReader, "Reading the notation"},
		{originStereo, "Stereo marks"},
		{originList, "Records of one list"},
		{originMap, "Atom-mapped reactions"},
		{originFinder, "Notation inside host files"},
		{originQuery, "Query patterns (SMARTS)"},
		{originRewrite, "Rewrites (returned by rewriting commands, never by `check`)"},
	}
	for _, o := range origins {
		b.WriteString("\n#### " + o.title + "\n\n")
		b.WriteString("| Code | Meaning | Example | What to do |\n|---|---|---|---|\n")
		for _, d := range codeCatalogue {
			if d.Origin != o.origin {
				continue
			}
			ex := strings.TrimSpace(d.Example.display())
			ex = "`" + strings.ReplaceAll(ex, "|", "\\|") + "`"
			if d.Example.File != "example.smi" {
				ex += " in `" + d.Example.File + "`"
			}
			if d.Example.NotShown != "" {
				ex += " (" + d.Example.NotShown + ")"
			}
			b.WriteString("| `" + string(d.Code) + "` | " + cell(d.Full) + " | " + ex + " | " + cell(d.Help) + " |\n")
		}
	}
	b.WriteString("\n")
	return b.String()
}

// cell escapes text for a Markdown table cell.
func cell(s string) string {
	return strings.ReplaceAll(s, "|", "\\|")
}

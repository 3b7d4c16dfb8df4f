package main

import (
	"go/build"
	"io/fs"
	"os"
	"path/filepath"
	"sort"
	"strings"
	"testing"
)

// The dependency direction of DEVELOPERS.md ("Layers"): every package of
// the module has a layer, and imports packages of the module only from
// lower layers. Two packages of one layer do not import each other.
// Tests may reach across (a fuzz target of the transforms also runs the
// reaction check), so only the imports of non-test files are checked.
var layers = []struct {
	layer    int
	packages []string
}{
	{0, []string{"notation", "notation/genmap"}},
	{1, []string{"notation/smarts"}},
	{2, []string{"notation/find"}},
	{3, []string{"stereo/internal/ringgeom", "stereo/internal/skeleton"}},
	{4, []string{"stereo"}},
	{5, []string{"stereo/identity"}},
	{6, []string{"stereo/transform", "stereo/reaction", "stereo/depict", "stereo/readings"}},
	{7, []string{"stereo/document"}},
	{8, []string{"stereo/review"}},
	{9, []string{"lsp"}},
	{10, []string{"cmd/stereoline"}},
}

// protocolPrefixes are the import paths of the LSP and JSON-RPC
// libraries: only the language server (and the command that starts it)
// may know them.
var protocolPrefixes = []string{"go.lsp.dev/"}

const module = "stereoline"

func TestLayers(t *testing.T) {
	layerOf := map[string]int{}
	for _, l := range layers {
		for _, p := range l.packages {
			layerOf[module+"/"+p] = l.layer
		}
	}
	pkgs := modulePackages(t)
	if len(pkgs) < len(layerOf) {
		t.Fatalf("found %d packages, fewer than the %d the layers name", len(pkgs), len(layerOf))
	}
	lspLayer := layerOf[module+"/lsp"]
	for _, p := range pkgs {
		mine, ok := layerOf[p.ImportPath]
		if !ok {
			t.Errorf("%s has no layer: give it one in layers_test.go and in DEVELOPERS.md", p.ImportPath)
			continue
		}
		for _, imp := range p.Imports {
			for _, prefix := range protocolPrefixes {
				if strings.HasPrefix(imp, prefix) && mine < lspLayer {
					t.Errorf("%s (layer %d) imports %s: only lsp/ and cmd/ know the protocol", p.ImportPath, mine, imp)
				}
			}
			if imp != module && !strings.HasPrefix(imp, module+"/") {
				continue
			}
			theirs, ok := layerOf[imp]
			switch {
			case !ok:
				t.Errorf("%s imports %s, which has no layer", p.ImportPath, imp)
			case theirs >= mine:
				t.Errorf("%s (layer %d) imports %s (layer %d): imports go to lower layers only", p.ImportPath, mine, imp, theirs)
			}
		}
	}
}

// modulePackages returns the packages of the module with the imports of
// their non-test files, found by walking the module from its root (two
// folders above this test's) as the go command does: testdata and hidden
// folders are skipped, and so are folders of other modules.
func modulePackages(t *testing.T) []*build.Package {
	var out []*build.Package
	root := filepath.Join("..", "..")
	err := filepath.WalkDir(root, func(full string, d fs.DirEntry, err error) error {
		if err != nil {
			return err
		}
		if !d.IsDir() {
			return nil
		}
		path, err := filepath.Rel(root, full)
		if err != nil {
			return err
		}
		name := d.Name()
		if path != "." && (strings.HasPrefix(name, ".") || strings.HasPrefix(name, "_") || name == "testdata" || name == "node_modules") {
			return filepath.SkipDir
		}
		if _, err := os.Stat(filepath.Join(full, "go.mod")); err == nil && path != "." {
			return filepath.SkipDir
		}
		p, err := build.Default.ImportDir(full, 0)
		if err != nil {
			if _, none := err.(*build.NoGoError); none {
				return nil
			}
			return err
		}
		p.ImportPath = module
		if path != "." {
			p.ImportPath = module + "/" + filepath.ToSlash(path)
		}
		if p.ImportPath == module {
			return nil // the module root holds no package
		}
		out = append(out, p)
		return nil
	})
	if err != nil {
		t.Fatal(err)
	}
	sort.Slice(out, func(i, j int) bool { return out[i].ImportPath < out[j].ImportPath })
	return out
}

package document

import (
	"slices"
	"strings"
	"testing"
)

// TestDrawingLenses checks which records get the drawing lens: by
// default those of lists, smiles fences and tables, not strings in code
// or inline code spans; "everywhere" and "off" say what they say; any
// other value is refused.
func TestDrawingLenses(t *testing.T) {
	files := []struct {
		name, text string
		lists      int // records that are lines of a list or cells of a table
	}{
		{"pool.smi", "N[C@@H](C)C(=O)O LRK-BB-001\nC/C=C/C LRK-BB-002\n", 2},
		{"pool.csv", "id,smiles\nLRK-BB-001,N[C@@H](C)C(=O)O\nLRK-BB-002,C/C=C/C\n", 2},
		{"notes.md", "The amine `N[C@@H](C)C(=O)O` is LRK-BB-001.\n\n```smiles\nC/C=C/C LRK-BB-002\n```\n", 1},
		{"build.py", "alanine_smiles = \"N[C@@H](C)C(=O)O\"\nbutene_smiles = \"C/C=C/C\"\n", 0},
	}
	for _, f := range files {
		for _, c := range []struct {
			setting string
			want    func(records int) int
		}{
			{"", func(int) int { return f.lists }},
			{`{"drawingLens": "lists"}`, func(int) int { return f.lists }},
			{`{"drawingLens": "everywhere"}`, func(n int) int { return n }},
			{`{"drawingLens": "off"}`, func(int) int { return 0 }},
		} {
			cfg := DefaultConfig()
			if c.setting != "" {
				if err := cfg.Merge([]byte(c.setting)); err != nil {
					t.Fatal(err)
				}
			}
			res := NewAnalyzer(cfg).Analyze(f.name, "", []byte(f.text))
			if len(res.Records) != 2 {
				t.Fatalf("%s: %d records read, want 2", f.name, len(res.Records))
			}
			got := res.DrawingLenses()
			if want := c.want(len(res.Records)); len(got) != want {
				t.Errorf("%s %s: lenses on %v of %d records, want %d", f.name, c.setting, got, len(res.Records), want)
			}
			if !slices.IsSorted(got) {
				t.Errorf("%s %s: lenses %v not in record order", f.name, c.setting, got)
			}
		}
	}
	cfg := DefaultConfig()
	if err := cfg.Merge([]byte(`{"drawingLens": "always"}`)); err == nil || !strings.Contains(err.Error(), "drawingLens") {
		t.Errorf("a bad value was taken: %v", err)
	}
}

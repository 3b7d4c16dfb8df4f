package find

import "testing"

// TestBoundedByName checks the kinds FindChunks reads in bounded memory
// whatever their size, as named: lists, tables, SD files and JSON Lines,
// not JSON documents, YAML, source or Markdown.
func TestBoundedByName(t *testing.T) {
	for name, want := range map[string]bool{
		"a.smi": true, "B.CSV": true, "c.tsv": true, "d.sdf": true,
		"e.jsonl": true, `dir\f.ndjson`: true,
		"g.json": false, "h.yaml": false, "i.py": false, "j.md": false, "k.ipynb": false, "l": false,
	} {
		if got := BoundedByName(name); got != want {
			t.Errorf("BoundedByName(%q) = %v, want %v", name, got, want)
		}
	}
}

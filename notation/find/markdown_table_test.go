package find

import "testing"

// TestMarkdownTableTitles checks that a record in a Markdown table takes
// its title from the row's name column, as a CSV record does, and that
// a header row's own code spans get none.
func TestMarkdownTableTitles(t *testing.T) {
	src := "| `SMILES` | Compound | note |\n|---|---|---|\n| C[C@H](N)C(=O)O | **L-alanine** | `F/C=C/F` |\n| OC[C@@H](O)C=O | glyceraldehyde | |\n"
	want := []struct{ text, title string }{
		{"C[C@H](N)C(=O)O", "L-alanine"},
		{"F/C=C/F", "L-alanine"},
		{"OC[C@@H](O)C=O", "glyceraldehyde"},
	}
	occs := FindKind(KindMarkdown, []byte(src), Config{})
	if len(occs) != len(want) {
		t.Fatalf("found %d records, want %d: %+v", len(occs), len(want), occs)
	}
	for i, w := range want {
		if occs[i].Text != w.text || occs[i].Title != w.title {
			t.Errorf("record %d: %q titled %q, want %q titled %q", i, occs[i].Text, occs[i].Title, w.text, w.title)
		}
		if got := src[occs[i].Span.Start:occs[i].Span.End]; got != w.text {
			t.Errorf("record %d: span holds %q", i, got)
		}
	}
}

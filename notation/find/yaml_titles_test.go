package find

import "testing"

// TestYAMLTitlesAndFields checks that a YAML record takes the name,
// title or id member of the innermost mapping around it that has one (a
// sequence item's mapping, then the mapping holding the sequence), that
// a new document (---) starts afresh, that a block scalar's record keeps
// the title on its line, and that records under different keys are of
// different fields. The layout is common practice for compound lists in
// YAML; the names are our own.
func TestYAMLTitlesAndFields(t *testing.T) {
	src := `name: panel A
compounds:
  - C[C@H](N)C(=O)O
  - id: k-2
    smiles: C[C@@H](N)C(=O)O
products:
  - F/C=C/F
---
smiles: F/C=C\F
block_smiles: |
  OC[C@@H](O)C=O glyceraldehyde
`
	want := []struct{ text, title, key string }{
		{"C[C@H](N)C(=O)O", "panel A", "compounds"},
		{"C[C@@H](N)C(=O)O", "k-2", "smiles"},
		{"F/C=C/F", "panel A", "products"},
		{`F/C=C\F`, "", "smiles"},
		{"OC[C@@H](O)C=O", "glyceraldehyde", "block_smiles"},
	}
	occs := FindKind(KindYAML, []byte(src), Config{})
	if len(occs) != len(want) {
		t.Fatalf("found %d records, want %d: %+v", len(occs), len(want), occs)
	}
	for i, w := range want {
		o := occs[i]
		if o.Text != w.text || o.Title != w.title || o.Field != FieldOfKey(w.key) {
			t.Errorf("record %d: %q titled %q in field %d, want %q titled %q under %q (%d)", i, o.Text, o.Title, o.Field, w.text, w.title, w.key, FieldOfKey(w.key))
		}
	}
}

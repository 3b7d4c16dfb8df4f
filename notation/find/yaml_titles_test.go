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

// TestOwnKeyLabels checks that in YAML and JSON a record taken by its
// content, with no name, title or id member around it, is labelled by
// the key it is the value of ("lead: C[C@@H](O)c1ccccc1", a layout of
// common practice in configuration files), while a key that names the
// notation, a generic key and an array's key label nothing.
func TestOwnKeyLabels(t *testing.T) {
	docs := []struct {
		kind Kind
		src  string
	}{
		{KindYAML, "compounds:\n  lead: C[C@@H](O)c1ccccc1\n  value: C[C@H](O)c1ccccc1\n  smiles: F/C=C/F\nlist:\n  - C[C@H](F)Cl\n"},
		{KindJSON, `{"compounds": {"lead": "C[C@@H](O)c1ccccc1", "value": "C[C@H](O)c1ccccc1", "smiles": "F/C=C/F"}, "list": ["C[C@H](F)Cl"]}`},
	}
	want := []struct{ text, title string }{
		{"C[C@@H](O)c1ccccc1", "lead"},
		{"C[C@H](O)c1ccccc1", ""},
		{"F/C=C/F", ""},
		{"C[C@H](F)Cl", ""},
	}
	for _, d := range docs {
		occs := FindKind(d.kind, []byte(d.src), Config{})
		if len(occs) != len(want) {
			t.Fatalf("%v: found %d records, want %d: %+v", d.kind, len(occs), len(want), occs)
		}
		for i, w := range want {
			if occs[i].Text != w.text || occs[i].Title != w.title {
				t.Errorf("%v record %d: %q titled %q, want %q titled %q", d.kind, i, occs[i].Text, occs[i].Title, w.text, w.title)
			}
		}
	}
}

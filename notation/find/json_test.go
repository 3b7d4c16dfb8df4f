package find

import (
	"fmt"
	"math/rand"
	"slices"
	"strings"
	"testing"
)

// TestFindJSONValues checks documents of several JSON values: JSON Lines
// (jsonlines.org: one valid JSON value a line, UTF-8, "\n" or "\r\n"
// ends a line), a JSON text sequence (RFC 7464: a record separator,
// 0x1E, before each value), values written one after another, and a line
// that does not read among good ones (JSON Lines readers skip it; common
// practice). Inside a value, the reading goes on after an error at the
// next line that begins at the indentation of the member that did not
// read; an error it cannot go on from ends the reading there.
func TestFindJSONValues(t *testing.T) {
	tests := []struct {
		name, src string
		want      []string
	}{
		{"lines", "{\"smiles\": \"C[C@H](N)C(=O)O\"}\n{\"smiles\": \"C[C@@H](N)C(=O)O\"}\r\n{\"smiles\": \"F/C=C/F\"}\n",
			[]string{"C[C@H](N)C(=O)O", "C[C@@H](N)C(=O)O", "F/C=C/F"}},
		{"no last line break", "{\"smiles\": \"CC\"}\n{\"smiles\": \"CO\"}",
			[]string{"CC", "CO"}},
		{"blank lines", "\n{\"smiles\": \"CC\"}\n\n\n{\"smiles\": \"CO\"}\n\n",
			[]string{"CC", "CO"}},
		{"a bad line is skipped", "{\"smiles\": \"CC\"}\n{\"smiles\": \"CN\", oops}\n]]\n{\"smiles\": \"CO\"}\n",
			[]string{"CC", "CN", "CO"}},
		{"a broken first line spoils no other", "{\"smiles\": \"CN\",\n{\"smiles\": \"CC\"}\n{\"smiles\": \"CO\"}\n",
			[]string{"CN", "CC", "CO"}},
		{"a broken line spoils no other", "{\"smiles\": \"CC\"}\n{\"smiles\": \"CN\",\n{\"smiles\": \"CO\"}\n",
			[]string{"CC", "CN", "CO"}},
		{"text sequence", "\x1e{\"smiles\": \"CC\"}\n\x1e{\"smiles\": \"CO\"}\n",
			[]string{"CC", "CO"}},
		{"one after another", "{\"smiles\": \"CC\"}{\"smiles\": \"CO\"} [\"C[C@H](F)Cl\"]",
			[]string{"CC", "CO", "C[C@H](F)Cl"}},
		{"pretty-printed one after another", "{\n  \"smiles\": \"CC\"\n}\n{\n  \"smiles\": \"CO\"\n}\n",
			[]string{"CC", "CO"}},
		// a line that does not read is passed over: the next line at
		// the indentation of the members is one
		{"a stray line among members", "{\n  \"smiles\": \"CC\",\n  oops\n  \"smiles\": \"CO\"\n}\n",
			[]string{"CC", "CO"}},
		// on one line there is no line to go on at: the reading of a
		// first value that breaks off ends there
		{"error in the first value", "{\"smiles\": \"CC\", oops \"smiles\": \"CO\"}\n",
			[]string{"CC"}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			var got []string
			for _, o := range FindKind(KindJSON, []byte(tt.src), Config{}) {
				got = append(got, o.Text)
				if string([]byte(tt.src)[o.Span.Start:o.Span.End]) != o.Text {
					t.Errorf("%q: span %v holds %q", o.Text, o.Span, tt.src[o.Span.Start:o.Span.End])
				}
			}
			if !slices.Equal(got, tt.want) {
				t.Errorf("found %q, want %q", got, tt.want)
			}
		})
	}
}

// TestFindJSONTitles checks that a record found in an object takes the
// object's name, title or id member as its title, as a table's record
// takes its title column (the best by the same ranking), and that an
// inner object's name wins over an outer one's.
func TestFindJSONTitles(t *testing.T) {
	src := `{"name": "batch 7", "records": [
  {"id": 17, "smiles": "C[C@H](N)C(=O)O", "title": "alanine"},
  {"id": "r-2", "smiles": "F/C=C/F"},
  {"smiles": "OC[C@@H](O)C=O", "name": null}
], "reference": "C[C@@H](O)C(=O)O"}`
	want := map[string]string{
		"C[C@H](N)C(=O)O":  "alanine",
		"F/C=C/F":          "r-2",
		"OC[C@@H](O)C=O":   "batch 7",
		"C[C@@H](O)C(=O)O": "batch 7",
	}
	occs := FindKind(KindJSON, []byte(src), Config{})
	if len(occs) != len(want) {
		t.Fatalf("found %d records, want %d", len(occs), len(want))
	}
	for _, o := range occs {
		if o.Title != want[o.Text] {
			t.Errorf("%s: title %q, want %q", o.Text, o.Title, want[o.Text])
		}
	}
}

// TestFindJSONResync checks that a JSON document with a syntax error
// keeps the records after it: the reading goes on at the next line that
// begins at the indentation of the members of the object or array the
// error is in (a document being typed, a stray line such as a comment or
// a merge conflict marker, as git writes them; common practice), and that
// those records keep their titles.
func TestFindJSONResync(t *testing.T) {
	tests := []struct {
		name, src string
		want      []string // text and title of each record
	}{
		{"a closing brace missing", "[\n{\"id\": 1, \"smiles\": \"C[C@H](N)C(=O)O\"},\n{\"id\": 2, \"smiles\": \"C[C@@H](N)C(=O)O\"\n{\"id\": 3, \"smiles\": \"F/C=C/F\"},\n{\"id\": 4, \"smiles\": \"N[C@@H](C)C(=O)O\"}\n]\n",
			[]string{"C[C@H](N)C(=O)O 1", "C[C@@H](N)C(=O)O 2", "F/C=C/F 3", "N[C@@H](C)C(=O)O 4"}},
		// the comma after the missing brace makes the next record look
		// like the object's next member: it is not taken as one
		{"a closing brace missing before its comma", "[\n{\"id\": 1, \"smiles\": \"CC\"},\n{\"id\": 2, \"smiles\": \"CN\",\n{\"id\": 3, \"smiles\": \"CO\"},\n{\"id\": 4, \"smiles\": \"C[C@H](F)Cl\"}\n]\n",
			[]string{"CC 1", "CN 2", "CO 3", "C[C@H](F)Cl 4"}},
		{"a comma missing between records", "[\n  {\n    \"id\": \"a\",\n    \"smiles\": \"CC\"\n  }\n  {\n    \"id\": \"b\",\n    \"smiles\": \"C[C@H](F)Cl\"\n  }\n]\n",
			[]string{"CC a", "C[C@H](F)Cl b"}},
		{"a string left open", "[\n  {\n    \"id\": \"a\",\n    \"note\": \"half-typed,\n    \"smiles\": \"CC\"\n  },\n  {\n    \"id\": \"b\",\n    \"smiles\": \"C[C@H](F)Cl\"\n  }\n]\n",
			[]string{"CC a", "C[C@H](F)Cl b"}},
		{"merge conflict markers", "[\n  {\"id\": \"a\", \"smiles\": \"CC\"},\n<<<<<<< HEAD\n  {\"id\": \"b\", \"smiles\": \"C[C@H](F)Cl\"},\n=======\n  {\"id\": \"b\", \"smiles\": \"C[C@@H](F)Cl\"},\n>>>>>>> other\n  {\"id\": \"c\", \"smiles\": \"CO\"}\n]\n",
			[]string{"CC a", "C[C@H](F)Cl b", "C[C@@H](F)Cl b", "CO c"}},
		{"comments", "{\n  // the reference\n  \"smiles\": \"C[C@@H](O)C(=O)O\",\n  /* and its mirror image */\n  \"mirror_smiles\": \"C[C@H](O)C(=O)O\"\n}\n",
			[]string{"C[C@@H](O)C(=O)O ", "C[C@H](O)C(=O)O "}},
		{"an array member", "{\"name\": \"batch 7\", \"compounds\": [\n  {\"id\": 1, \"smiles\": \"CC\"},\n  {\"id\": 2, \"smiles\": \"CN\"\n  {\"smiles\": \"C[C@H](F)Cl\"}\n]}\n",
			[]string{"CC 1", "CN 2", "C[C@H](F)Cl batch 7"}},
		{"an error in an inner array", "[\n  {\n    \"id\": \"r1\",\n    \"tags\": [\n      \"x\"\n      \"y\"\n    ],\n    \"smiles\": \"C[C@H](F)Cl\"\n  },\n  {\n    \"id\": \"r2\",\n    \"smiles\": \"F/C=C/F\"\n  }\n]\n",
			[]string{"C[C@H](F)Cl r1", "F/C=C/F r2"}},
		{"no line to go on at", "[{\"smiles\": \"CC\"}, {\"smiles\": \"CO\" {\"smiles\": \"CN\"}]\n",
			[]string{"CC ", "CO "}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			var got []string
			for _, o := range FindKind(KindJSON, []byte(tt.src), Config{}) {
				got = append(got, o.Text+" "+o.Title)
				if tt.src[o.Span.Start:o.Span.End] != o.Text {
					t.Errorf("%q: span %v holds %q", o.Text, o.Span, tt.src[o.Span.Start:o.Span.End])
				}
			}
			if !slices.Equal(got, tt.want) {
				t.Errorf("found %q, want %q", got, tt.want)
			}
		})
	}
}

// TestFindJSONTitleBesideNotation checks that the name, title or id
// member of an object that has a member named as notation is its title
// and no record of its own, as a table's title column is no notation
// column (common practice), while the same text in an object without
// such a member is still looked at.
func TestFindJSONTitleBesideNotation(t *testing.T) {
	tests := []struct {
		src  string
		want []string // text and title of each record
	}{
		{`[{"name": "c1ccccc1O", "smiles": "Oc1ccccc1"}, {"id": "C[C@H](N)C(=O)O", "smiles": "C[C@@H](N)C(=O)O"}]`,
			[]string{"Oc1ccccc1 c1ccccc1O", "C[C@@H](N)C(=O)O C[C@H](N)C(=O)O"}},
		// no member named as notation: the name is looked at as before
		{`{"name": "C[C@H](N)C(=O)O", "note": "x"}`, []string{"C[C@H](N)C(=O)O C[C@H](N)C(=O)O"}},
	}
	for _, tt := range tests {
		var got []string
		for _, o := range FindKind(KindJSON, []byte(tt.src), Config{}) {
			got = append(got, o.Text+" "+o.Title)
		}
		if !slices.Equal(got, tt.want) {
			t.Errorf("%s: found %q, want %q", tt.src, got, tt.want)
		}
	}
}

// TestFindJSONResyncLoss breaks arrays of records one character or one
// line at a time (a character deleted, a bracket, brace, comma, colon,
// quote, letter or line break put in, a line deleted) and checks that
// each break costs at most the two records around it, in an array of an
// object a line and in a pretty-printed one whose records hold an inner
// array. Breaks on the first lines, which hold the document's own
// bracket, are left out: a document that does not begin as JSON is not
// read on.
func TestFindJSONResyncLoss(t *testing.T) {
	recs := []string{"N[C@@H](C)C(=O)O", "F/C=C/F", "C1CC[C@H](O)CC1", "c1ccccc1O"} // OpenSMILES examples (common practice)
	const n = 40
	layouts := map[string]func(b *strings.Builder, i int){
		"an object a line": func(b *strings.Builder, i int) {
			fmt.Fprintf(b, `{"id": %d, "smiles": "%s", "name": "n%d"}`, i, recs[i%4], i)
		},
		"pretty-printed": func(b *strings.Builder, i int) {
			fmt.Fprintf(b, "  {\n    \"id\": %d,\n    \"smiles\": \"%s\",\n    \"tags\": [\n      \"a\",\n      \"b\"\n    ]\n  }", i, recs[i%4])
		},
	}
	count := func(s string) int {
		k := 0
		for _, o := range FindKind(KindJSON, []byte(s), Config{}) {
			if o.Field == FieldOfKey("smiles") {
				k++
			}
		}
		return k
	}
	for name, record := range layouts {
		var b strings.Builder
		b.WriteString("[\n")
		for i := range n {
			if i > 0 {
				b.WriteString(",\n")
			}
			record(&b, i)
		}
		b.WriteString("\n]\n")
		src := b.String()
		if c := count(src); c != n {
			t.Fatalf("%s: %d records in the whole document, want %d", name, c, n)
		}
		skip := strings.Index(src, "\"id\": 1,") // past the first record
		rng := rand.New(rand.NewSource(1))
		for range 2000 {
			i := skip + rng.Intn(len(src)-skip)
			var m string
			switch rng.Intn(3) {
			case 0:
				m = src[:i] + src[i+1:]
			case 1:
				m = src[:i] + string("{}[],:\"x\n"[rng.Intn(9)]) + src[i:]
			default:
				ls := strings.LastIndexByte(src[:i], '\n') + 1
				j := strings.IndexByte(src[i:], '\n')
				if j < 0 {
					continue
				}
				m = src[:ls] + src[i+j+1:]
			}
			if c := count(m); c < n-2 {
				t.Errorf("%s: %d of %d records after a break at %d: %q", name, c, n, i, m[max(0, i-60):min(len(m), i+60)])
			}
		}
	}
}

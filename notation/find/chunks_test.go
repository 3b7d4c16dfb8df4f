package find

import (
	"fmt"
	"reflect"
	"strings"
	"testing"
)

// chunkCases are hosts FindChunks streams (plain lists, over several
// copy windows) or must hand out whole (tables, query lists, code).
func chunkCases() map[string]string {
	var long strings.Builder
	long.WriteString("# a generated list\n")
	for i := range 6000 {
		// Records from OpenSMILES examples (common practice), titles
		// with the index so that no two lines are alike.
		rec := []string{"N[C@@H](C)C(=O)O", "F/C=C/F", "C1CC[C@H](O)CC1", "c1ccccc1O"}[i%4]
		fmt.Fprintf(&long, "%s item-%d extra words\n", rec, i)
		if i%997 == 0 {
			long.WriteString("// stereoline: skip-next\nC[C@H](O)CC skipped\n\n")
		}
	}
	var tabbed strings.Builder
	for i := range 3000 {
		fmt.Fprintf(&tabbed, "id%d\tC[C@@H](N)C%s\t%d\n", i, strings.Repeat("C", i%7), i)
	}
	var array, lines strings.Builder
	array.WriteString("{\"name\": \"batch\", \"records\": [\n")
	for i := range 3000 {
		rec := []string{"N[C@@H](C)C(=O)O", "F/C=C\\\\F", "C1CC[C@H](O)CC1", "c1ccccc1O"}[i%4]
		if i > 0 {
			array.WriteString(",\n")
		}
		fmt.Fprintf(&array, "  {\"id\": %d, \"smiles\": \"%s\", \"tags\": [\"x\", \"C[C@H](F)Cl\"]}", i, rec)
		if i%1000 == 500 {
			array.WriteString("\n  oops a stray line")
		}
		fmt.Fprintf(&lines, "{\"smiles\": \"%s\", \"n\": %d}\n", rec, i)
	}
	array.WriteString("\n]}\n")
	// a document that reads, its records under a member between others:
	// a title, a member named as notation, and a shorter array
	var member strings.Builder
	member.WriteString("{\"name\": \"batch 7\", \"smiles\": \"C[C@H](O)CC\", \"extra\": [\"F/C=C/F\", {\"smiles\": \"CCO\"}],\n \"records\": [\n")
	for i := range 2000 {
		rec := []string{"N[C@@H](C)C(=O)O", "F/C=C\\\\F", "C1CC[C@H](O)CC1", "c1ccccc1O"}[i%4]
		if i > 0 {
			member.WriteString(",\n")
		}
		fmt.Fprintf(&member, "  {\"id\": %d, \"smiles\": \"%s\", \"more\": [\"C[C@H](F)Cl\"], \"title\": \"t%d\"}", i, rec, i)
	}
	member.WriteString("\n],\n \"reagent\": \"O[C@@H](C)CC\", \"notes\": {\"rxn\": \"CC>>C[C@H](O)CC\"}}\n")
	var tsv strings.Builder
	tsv.WriteString("id\tsmiles\tname\n")
	for i := range 3000 {
		fmt.Fprintf(&tsv, "%d\tC[C@@H](N)C%s\tn-%d\n", i, strings.Repeat("C", i%7), i)
	}
	// tables whose header names no structure column, or that have none:
	// read by their content
	var nohead strings.Builder
	nohead.WriteString("# exported list\n")
	for i := range 1500 {
		fmt.Fprintf(&nohead, "item-%d,C[C@@H](N)C%s(=O)O,%d\n", i, strings.Repeat("C", i%5), i%3)
		if i%400 == 7 {
			nohead.WriteString("\n# a comment\nitem-x,-,0\n")
		}
	}
	// YAML: records titled by a name before or after them, in nested
	// mappings, a title of the whole document at its end, block
	// scalars, pragmas and a second document
	var yml strings.Builder
	yml.WriteString("batch:\n  compounds:\n")
	for i := range 1200 {
		rec := []string{"N[C@@H](C)C(=O)O", "F/C=C/F", "C1CC[C@H](O)CC1", "c1ccccc1O"}[i%4]
		switch i % 5 {
		case 0:
			fmt.Fprintf(&yml, "    - name: y%d\n      smiles: %q\n", i, rec)
		case 1:
			fmt.Fprintf(&yml, "    - smiles: '%s'\n      id: y%d\n      more:\n        smiles: C[C@H](F)Cl\n", rec, i)
		case 2:
			fmt.Fprintf(&yml, "    - smiles: %s\n      props:\n        name: inner%d\n", rec, i)
		case 3:
			fmt.Fprintf(&yml, "    - lead: C[C@@H](O)c1ccccc1\n      smiles: |\n        %s first\n        CCO second\n", rec)
		default:
			fmt.Fprintf(&yml, "    # stereoline: skip-next\n    - smiles: %s\n    - smiles: [CCO, \"F/C=C\\\\F\"]\n", rec)
		}
	}
	yml.WriteString("  title: the batch\n---\nsmiles: F/C=C/F\nname: second\n")
	// an SD file: titles from an id item or the name line, records
	// with no structure item, a pattern item
	var sdf strings.Builder
	mol := "\n     demo          2D\n\n  0  0  0  0  0  0  0  0  0  0999 V2000\nM  END\n"
	for i := range 900 {
		rec := []string{"N[C@@H](C)C(=O)O", "F/C=C/F", "C1CC[C@H](O)CC1", "c1ccccc1O"}[i%4]
		fmt.Fprintf(&sdf, "AX-%d%s", i, mol)
		switch i % 3 {
		case 0:
			fmt.Fprintf(&sdf, ">  <SMILES>\n%s\n\n>  <Compound ID>\nLOT-%d\n\n", rec, i)
		case 1:
			fmt.Fprintf(&sdf, "> <Canonical_SMILES>\n%s\n\n> <smarts_query>\n[#6;R]\n\n> <SMILES>\nCCO\n\n", rec)
		}
		sdf.WriteString("$$$$\n")
	}
	return map[string]string{
		"set.sdf":      sdf.String(),
		"set.yaml":     yml.String(),
		"nohead.csv":   nohead.String(),
		"nohead.tsv":   strings.ReplaceAll(nohead.String(), ",", "\t"),
		"contentq.csv": "a,b\n[#6][OX2H],x\n[N](=O)(O)O,y\nCCO,z\n[CX3](=O)[OX2H1],w\nc1ccccc1O,v\n",
		"big.tsv":      tsv.String(),
		// one record in two a pattern by its content: the nitrate that
		// reads as both becomes a pattern too (queryList)
		"patterns.csv": "smiles,name\n[#6][OX2H],alcohol\n[N](=O)(O)O,nitrate\nCCO,ethanol\n[CX3](=O)[OX2H1],acid\n",
		"quoted.csv":   "\"id\",\"smiles\"\n\"1\",\"C[C@H](O)CC\"\n\"2, b\",\"F/C=C/F\"\n\"3\nc\",\"CC\"\n",
		"semi.csv":     "id;smiles\n1;C[C@H](O)CC\n2;F/C=C\\F\n",
		"strings.json": "[\"C[C@H](O)CC\", \"CCO\", \"hello\", \"F/C=C/F\"]\n",
		"nested.json":  "[{\"id\": \"a\", \"smiles\": \"C[C@H](O)CC\", \"more\": [{\"smiles\": \"F/C=C\\\\F\"}]},\n {\"name\": \"b\", \"rxn\": \"CC>>C[C@H](O)CC\"}]\n",
		"content.csv":  "a,b\nC[C@H](O)CC,x\nF/C=C/F,y\nN[C@@H](C)C(=O)O,z\n",
		"array.json":   array.String(),
		"member.json":  member.String(),
		"lines.jsonl":  lines.String(),
		"long.smi":     long.String(),
		"tabbed.smi":   tabbed.String(),
		"header.smi":   "smiles name\nC[C@H](O)CC butanol\n\nF/C=C\\F difluoroethene\n",
		"queries.smi":  "[#6][OX2H] alcohol\n[CX3](=O)[OX2H1] acid\nC[C@H](N)C(=O)O alanine\n",
		"table.csv":    "id,smiles,amount\n1,C[C@H](O)CC,3\n2,F/C=C/F,4\n",
		"unclear.smi":  "CCO CCN\nCCC CCCl\n",
		"empty.smi":    "",
		"code.py":      "A = 'C[C@H](O)CC'\nB = 'F/C=C/F'\n",
	}
}

// TestFindChunksIsFindKind checks that the chunks, joined, are what
// FindKind finds, occurrence for occurrence, for several chunk sizes.
func TestFindChunksIsFindKind(t *testing.T) {
	defer func(w, a int) { jsonLineWindow, streamFrom = w, a }(jsonLineWindow, streamFrom)
	for _, window := range []int{1 << 20, 1, 150} {
		jsonLineWindow = window // JSON Lines read a line or two at a time too
		testFindChunksIsFindKind(t)
	}
	streamFrom = 0 // arrays element by element, tables in two passes
	testFindChunksIsFindKind(t)
}

func testFindChunksIsFindKind(t *testing.T) {
	for name, src := range chunkCases() {
		kind := KindForName(name)
		want := FindKind(kind, []byte(src), Config{})
		for _, n := range []int{1, 7, 2048, 100000} {
			var got []Occurrence
			calls := 0
			FindChunks(kind, []byte(src), Config{}, n, func(occs []Occurrence) {
				calls++
				if len(occs) == 0 || len(occs) > n {
					t.Errorf("%s n=%d: a chunk of %d occurrences", name, n, len(occs))
				}
				got = append(got, occs...)
			})
			if len(got) != len(want) {
				t.Fatalf("%s n=%d: %d occurrences, FindKind %d", name, n, len(got), len(want))
			}
			for i := range want {
				if !reflect.DeepEqual(strip(got[i]), strip(want[i])) {
					t.Fatalf("%s n=%d: occurrence %d is %+v, FindKind's %+v", name, n, i, got[i], want[i])
				}
			}
			if wantCalls := (len(want) + n - 1) / n; calls != wantCalls {
				t.Errorf("%s n=%d: %d calls, want %d", name, n, calls, wantCalls)
			}
		}
	}
}

// strip drops the encoder, a function DeepEqual cannot compare.
func strip(o Occurrence) Occurrence {
	if o.encode != nil {
		o.Title += fmt.Sprintf(" (encoded by %x)", reflect.ValueOf(o.encode).Pointer())
		o.encode = nil
	}
	return o
}

// TestRefRebuilds checks that a Ref rebuilds the occurrence of a list
// record, title included, and is refused where escapes make the text
// differ from the host bytes.
func TestRefRebuilds(t *testing.T) {
	for name, src := range chunkCases() {
		content := []byte(src)
		for _, o := range FindKind(KindForName(name), content, Config{}) {
			r, ok := RefOf(content, &o)
			if !ok {
				if KindForName(name) == KindList && len(o.Diagnostics) == 0 {
					t.Errorf("%s: the list record %q at %v has no Ref", name, o.Text, o.Span)
				}
				continue
			}
			var again Ref
			b, _ := r.AppendBinary(nil)
			if err := again.UnmarshalBinary(b); err != nil || again != r || len(b) != RefSize {
				t.Errorf("%s: the Ref of %q written as %d bytes read back as %+v (%v), was %+v", name, o.Text, len(b), again, err, r)
			}
			back := r.Occurrence(content)
			if !reflect.DeepEqual(strip(back), strip(o)) {
				t.Errorf("%s: rebuilt %+v, was %+v", name, back, o)
			}
		}
	}
	// A Python literal with an escaped backslash: its text is not its
	// host bytes.
	content := []byte(`smiles = "F/C=C\\F"` + "\n")
	for _, o := range FindKind(KindPython, content, Config{}) {
		if _, ok := RefOf(content, &o); ok {
			t.Errorf("RefOf took %q at %v, written with an escape", o.Text, o.Span)
		}
	}
}

// FuzzFindChunks checks, for any content of the streamed host kinds
// (JSON Lines in windows of a few lines, JSON arrays element by
// element), that the chunks of FindChunks joined are FindKind's occurrences, none
// empty or over the chunk size, and that every Ref taken rebuilds its
// occurrence.
func FuzzFindChunks(f *testing.F) {
	for name, src := range chunkCases() {
		f.Add([]byte(src), uint8(KindForName(name)), uint16(3))
	}
	f.Add([]byte("C1CC1 a\r\n\r\n\tF/C=C/F  b c\nC1CC\n"), uint8(KindList), uint16(1))
	f.Fuzz(func(t *testing.T, src []byte, kind uint8, size uint16) {
		// JSON Lines read a few lines at a time, arrays element by element
		defer func(w, a int) { jsonLineWindow, streamFrom = w, a }(jsonLineWindow, streamFrom)
		jsonLineWindow, streamFrom = 1+int(size)%200, 0
		kinds := []Kind{KindList, KindCSV, KindTSV, KindPython, KindJSON, KindYAML, KindSDF}
		k := kinds[int(kind)%len(kinds)]
		n := 1 + int(size)%64
		want := FindKind(k, src, Config{})
		var got []Occurrence
		FindChunks(k, src, Config{}, n, func(occs []Occurrence) {
			if len(occs) == 0 || len(occs) > n {
				t.Fatalf("a chunk of %d occurrences, size %d", len(occs), n)
			}
			got = append(got, occs...)
		})
		if len(got) != len(want) {
			t.Fatalf("%d occurrences, FindKind %d", len(got), len(want))
		}
		for i := range want {
			if !reflect.DeepEqual(strip(got[i]), strip(want[i])) {
				t.Fatalf("occurrence %d is %+v, FindKind's %+v", i, got[i], want[i])
			}
			if r, ok := RefOf(src, &want[i]); ok {
				if back := r.Occurrence(src); !reflect.DeepEqual(strip(back), strip(want[i])) {
					t.Fatalf("Ref of occurrence %d rebuilt %+v, was %+v", i, back, want[i])
				}
			}
		}
	})
}

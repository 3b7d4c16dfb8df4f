package find

import (
	"reflect"
	"testing"
)

// FuzzFindEditLines checks the promise the language server's edits rest
// on: when FindListLines, FindTableLines or FindJSONEdit reads the lines
// of an edit apart (FindJSONEdit may read more lines than the edit
// changed), the records it returns are those a whole reading of the new
// text finds there, and every other record of that reading is the old
// text's, moved by the bytes the edit added; no record reaches over the
// edited lines. The edit replaces cut bytes at offset at of old by ins;
// its lines are found as the document engine finds them (EditedLines).
// As the engine does, it reads a text whose records include query
// patterns whole.
func FuzzFindEditLines(f *testing.F) {
	list := "N[C@@H](C)C(=O)O ala\nC[C@H](O)CC but\nF/C=C/F dfe\n"
	for _, s := range []struct {
		old, ins string
		at       uint32
		cut      uint8
		which    uint8
	}{
		{list + list + list, "F/C=C\\F x\n", 0, 0, uint8(KindList)},
		{list + list, "", 21, 16, uint8(KindList)},
		{"# made by hand\n" + list + list, "#", 15, 0, uint8(KindList)},
		{"smiles,name\nC[C@H](N)O,a\nF/C=C/F,\"b, c\"\n", "\"", 12, 0, uint8(KindCSV)},
		{"smiles,name\nC[C@H](N)O,a\nF/C=C/F,b\"\n", ",\"x", 25, 1, uint8(KindCSV)},
		{"name\tsmiles\na\tC[C@@H](N)O\nb\tF/C=C/F\n", "c\tOC[C@H](F)Cl\n", 26, 0, uint8(KindTSV)},
		{"smiles,name\nC[C@H](N)O,a\n", "[C@@H]", 12, 7, uint8(KindList)},
		{"\ufeff" + list + list, "C\n", 3, 0, uint8(KindList)},
		// the cell edited decides whether the column is one of structures
		{"smiles,structure\nCC,CCO\nCO,CCN\nCN,no match\nCF,no match\n", "n a", 27, 3, uint8(KindCSV)},
		{"{\"smiles\": \"C[C@H](N)O\"}\n{\"smiles\": \"F/C=C/F\"}\n", "{\"smiles\": \"OC[C@@H](F)Cl\"}\n", 26, 0, uint8(KindJSON)},
		{"[\"C[C@H](N)O\", \"F/C=C/F\"]\n{\"smiles\": \"F/C=C/F\"}\n", "", 20, 9, uint8(KindJSON)},
		// one array of records over many lines
		{"[\n {\"smiles\": \"C[C@H](N)O\",\n  \"name\": \"a\"},\n {\"name\": \"b\", \"smiles\": \"F/C=C/F\"}\n]\n", "x", 36, 0, uint8(KindJSON)},
		{"[\n {\"smiles\": \"C[C@H](N)O\"},\n {\"smiles\": \"F/C=C/F\"},\n {\"smiles\": \"OC[C@@H](F)Cl\"}\n]\n", "\"", 20, 0, uint8(KindJSON)},
		{"[{\"smiles\": \"C[C@H](N)O\"},\n{\"smiles\": \"F/C=C/F\"}]\n", "},\n{", 13, 0, uint8(KindJSON)},
		{"{\"name\": \"s\", \"smiles\": [\n \"C[C@H](N)O\",\n \"F/C=C/F\"\n ],\n \"ref\": {\"smiles\": \"CCO\"}}\n", "@", 38, 0, uint8(KindJSON)},
	} {
		f.Add([]byte(s.old), s.at, s.cut, []byte(s.ins), s.which)
	}
	f.Fuzz(func(t *testing.T, old []byte, at uint32, cut uint8, ins []byte, which uint8) {
		if len(old) > 1<<14 || len(ins) > 1<<10 {
			return
		}
		kind := pickKind(which, KindList, KindCSV, KindTSV, KindJSON)
		a := int(at) % (len(old) + 1)
		z := min(len(old), a+int(cut))
		src := append(append(append([]byte(nil), old[:a]...), ins...), old[z:]...)
		from, oldTo, newTo := EditedLines(old, src)
		var got []Occurrence
		var ok bool
		switch kind {
		case KindCSV:
			got, ok = FindTableLines(old, src, ',', Config{}, from, newTo)
		case KindTSV:
			got, ok = FindTableLines(old, src, '\t', Config{}, from, newTo)
		case KindJSON:
			var next *JSONArray
			got, from, oldTo, newTo, next, ok = FindJSONEdit(old, src, Config{}, from, oldTo, newTo, nil)
			if ok && next != nil {
				// what is kept for the next edit is where the elements lie
				// (unless the edit made another member the longest array)
				whole, ok := jsonRecordArray(src, &Config{})
				if !ok || whole.ctx.key == next.ctx.key && (!reflect.DeepEqual(whole.elems, next.elems) || whole.close != next.close) {
					t.Fatalf("array kept %+v, want %+v (%t)", next, whole, ok)
				}
			}
		default:
			got, ok = FindListLines(old, src, Config{}, from, newTo)
		}
		if !ok {
			return
		}
		whole, before := FindKind(kind, src, Config{}), FindKind(kind, old, Config{})
		for _, o := range before {
			if o.Dialect == DialectSMARTS {
				return // the callers read a text with query patterns whole
			}
		}
		delta := len(src) - len(old)
		var in, beforeEdit, afterEdit []Occurrence
		for _, o := range whole {
			switch {
			case o.Span.End <= from:
				beforeEdit = append(beforeEdit, o)
			case o.Span.Start >= from && o.Span.End <= newTo:
				in = append(in, o)
			case o.Span.Start >= newTo:
				afterEdit = append(afterEdit, o)
			default:
				t.Fatalf("a record at %v reaches over the edited lines %d to %d", o.Span, from, newTo)
			}
		}
		if !sameOccurrences(got, in) {
			t.Fatalf("lines %d to %d read apart:\n got %+v\nwant %+v", from, newTo, got, in)
		}
		var oldBefore, oldAfter []Occurrence
		for _, o := range before {
			switch {
			case o.Span.End <= from:
				oldBefore = append(oldBefore, o)
			case o.Span.Start >= oldTo:
				o.Shift(delta)
				oldAfter = append(oldAfter, o)
			case o.Span.Start < from || o.Span.End > oldTo:
				t.Fatalf("a record of the old text at %v reaches over the edited lines %d to %d", o.Span, from, oldTo)
			}
		}
		if !sameOccurrences(beforeEdit, oldBefore) || !sameOccurrences(afterEdit, oldAfter) {
			t.Fatalf("the records outside lines %d to %d are not the old text's:\n got %+v %+v\nwant %+v %+v",
				from, newTo, beforeEdit, afterEdit, oldBefore, oldAfter)
		}
	})
}

// sameOccurrences is reflect.DeepEqual for occurrences, except that an
// encoder is equal to the same function (DeepEqual holds no two non-nil
// functions equal).
func sameOccurrences(a, b []Occurrence) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		x, y := a[i], b[i]
		if (x.encode == nil) != (y.encode == nil) ||
			x.encode != nil && reflect.ValueOf(x.encode).Pointer() != reflect.ValueOf(y.encode).Pointer() {
			return false
		}
		x.encode, y.encode = nil, nil
		if !reflect.DeepEqual(x, y) {
			return false
		}
	}
	return true
}

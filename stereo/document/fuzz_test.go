package document

import (
	"reflect"
	"sort"
	"testing"
)

// FuzzStreamInParts checks that a list streamed and related in parts on
// disk, with chunks of a few records, gives Analyze's findings: the
// relations of records split into parts by key, read again and merged
// back in order, are those of the whole list.
func FuzzStreamInParts(f *testing.F) {
	for _, seed := range []string{
		// alanine and its mirror image, E and Z 2-butene, lactic acid
		// and its racemate (common practice)
		"N[C@@H](C)C(=O)O a\nN[C@H](C)C(=O)O b\nN[C@@H](C)C(=O)O c\n",
		"C/C=C/C\nC/C=C\\C\nCC=CC\nC/C=C/C e\n",
		"C[C@H](O)C(=O)O\nC[C@@H](O)C(=O)O |&1:1|\nCC(O)C(=O)O\nC[C@H](O)C(=O)O |o1:1|\n",
		"smiles,name\nF[C@H](Cl)Br,x\nF[C@@H](Cl)Br,y\nF[C@H](Cl)Br,z\n",
	} {
		f.Add(seed, uint8(3), uint8(40))
	}
	f.Fuzz(func(t *testing.T, text string, chunk, partBytes uint8) {
		if len(text) > 4000 {
			return
		}
		defer func(n int) { streamChunk = n }(streamChunk)
		defer func(above, each int) { partitionAbove, partitionBytes = above, each }(partitionAbove, partitionBytes)
		streamChunk = 1 + int(chunk%8)
		partitionAbove, partitionBytes = 0, 1+int(partBytes)
		for _, name := range []string{"list.smi", "table.csv"} {
			want := NewAnalyzer(DefaultConfig()).Analyze(name, "", []byte(text)).Diagnostics()
			var got []Diagnostic
			NewAnalyzer(DefaultConfig()).Stream(name, "", []byte(text), func(ds []Diagnostic) { got = append(got, ds...) })
			sort.SliceStable(got, func(i, j int) bool {
				x, y := got[i], got[j]
				if x.Span != y.Span {
					return x.Span.Start < y.Span.Start || x.Span.Start == y.Span.Start && x.Span.End < y.Span.End
				}
				return !IsRelation(x.Code) && IsRelation(y.Code)
			})
			if len(got) != len(want) {
				t.Fatalf("%s: %d findings streamed in parts, Analyze has %d", name, len(got), len(want))
			}
			for i := range got {
				if !reflect.DeepEqual(got[i], want[i]) {
					t.Fatalf("%s: finding %d\n got %+v\nwant %+v", name, i, got[i], want[i])
				}
			}
		}
	})
}

// FuzzReanalyze checks that an edit of a document whose records are
// related, analysed from the last version's result (read apart by lines,
// or found whole and compared, rereadWhole), gives the records and
// findings a fresh analysis of the edited text gives: any text of any
// such kind, any one edit, then the edit taken back.
func FuzzReanalyze(f *testing.F) {
	for _, seed := range []struct {
		kind uint8
		text string
	}{
		// alanine and its mirror image, E and Z 2-butene, lactic acid
		// and its racemate (common practice)
		{0, "N[C@@H](C)C(=O)O a\nN[C@H](C)C(=O)O b\nN[C@@H](C)C(=O)O c\n"},
		{1, "smiles,name\nF[C@H](Cl)Br,x\nF[C@@H](Cl)Br,y\nF[C@H](Cl)Br,z\n"},
		{2, "[\n  {\"smiles\": \"C/C=C/C\", \"name\": \"e\"},\n  {\"smiles\": \"C/C=C\\\\C\", \"name\": \"z\"}\n]\n"},
		{3, "compounds:\n  - name: a\n    smiles: \"C[C@H](O)C(=O)O\"\n  - name: b\n    smiles: \"C[C@@H](O)C(=O)O\"\n"},
		{4, "a\n  demo\n\n  0  0  0  0  0  0  0  0  0  0999 V2000\nM  END\n> <SMILES>\nN[C@@H](C)C(=O)O\n\n$$$$\n"},
		{5, "{\"smiles\": \"F/C=C/F\"}\n{\"smiles\": \"F/C=C\\\\F\"}\n"},
	} {
		f.Add(seed.kind, seed.text, uint16(10), uint8(3), "@")
	}
	names := []string{"list.smi", "table.csv", "data.json", "data.yaml", "set.sdf", "lines.jsonl", "table.tsv"}
	f.Fuzz(func(t *testing.T, kind uint8, text string, at uint16, cut uint8, insert string) {
		if len(text) > 4000 || len(insert) > 200 {
			return
		}
		name := names[int(kind)%len(names)]
		from := int(at) % (len(text) + 1)
		to := min(len(text), from+int(cut%32))
		edited := text[:from] + insert + text[to:]
		a := NewAnalyzer(DefaultConfig())
		prev := a.Analyze(name, "", []byte(text))
		for _, step := range []struct{ what, text string }{{"the edit", edited}, {"the edit taken back", text}} {
			next := a.reanalyzeList(prev, name, "", []byte(step.text))
			if next == nil {
				next = a.Analyze(name, "", []byte(step.text))
			}
			compareResults(t, name+", "+step.what, next, NewAnalyzer(DefaultConfig()).Analyze(name, "", []byte(step.text)))
			if t.Failed() {
				return
			}
			prev = next
		}
	})
}

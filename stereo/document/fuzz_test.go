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

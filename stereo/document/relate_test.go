package document

import (
	"fmt"
	"math/rand"
	"reflect"
	"slices"
	"strings"
	"testing"

	"stereoline/notation"
)

// TestRelateInTwoSteps: AnalyzeRecords then Relate gives what Analyze
// gives, and leaves the first result as it was, so an editor can show it
// while the relations are computed. The list is that of TestListRelations
// (L- and D-alanine are mirror images, tartaric acid's (R,R) and meso
// forms are diastereomers; common practice), with a record of its own
// findings (an ineffective mark on isobutane's central carbon).
func TestRelateInTwoSteps(t *testing.T) {
	text := strings.Join([]string{
		"N[C@@H](C)C(=O)O L-Ala",
		"N[C@H](C)C(=O)O D-Ala",
		"C[C@H](C)C marked isobutane",
		"OC(=O)[C@H](C)N L-Ala again",
		"O[C@H](C(=O)O)[C@@H](O)C(=O)O tartaric acid",
		"O[C@H](C(=O)O)[C@H](O)C(=O)O tartaric acid, other form",
	}, "\n") + "\n"
	a := NewAnalyzer(DefaultConfig())
	first := a.AnalyzeRecords("pool.smi", "", []byte(text))
	firstDiags := append([]Diagnostic(nil), first.Diagnostics()...)
	for _, d := range first.Diagnostics() {
		if strings.HasPrefix(string(d.Code), "list-") {
			t.Errorf("relation before Relate: %+v", d)
		}
	}
	if len(first.Diagnostics()) == 0 {
		t.Fatalf("no findings of the records themselves")
	}
	related := first.Relate()
	whole := NewAnalyzer(DefaultConfig()).Analyze("pool.smi", "", []byte(text))
	if !reflect.DeepEqual(codesAndSpans(related), codesAndSpans(whole)) {
		t.Errorf("in two steps:\n%v\nin one:\n%v", codesAndSpans(related), codesAndSpans(whole))
	}
	if n := len(related.Diagnostics()) - len(first.Diagnostics()); n != 3 {
		t.Errorf("Relate added %d findings, want 3: an enantiomer, a duplicate, a stereoisomer", n)
	}
	if !reflect.DeepEqual(first.Diagnostics(), firstDiags) {
		t.Errorf("Relate changed the first result's findings")
	}
	for i := range first.Records {
		if first.Records[i].Identity != nil {
			t.Errorf("Relate set an identity on record %d of the first result", i)
		}
	}
	if again := related.Relate(); again != related {
		t.Errorf("a related result was related again")
	}
}

func codesAndSpans(r *Result) []string {
	var out []string
	for _, d := range r.Diagnostics() {
		out = append(out, string(d.Code)+" "+string(r.Content[d.Span.Start:d.Span.End])+" "+d.Message)
	}
	return out
}

// TestMergeRelations checks the merge of Relate against what it stands
// for, a stable sort by position of the findings followed by the
// relations in record order, on random findings at few places (so many
// share one), with the relations in host order and out of it.
func TestMergeRelations(t *testing.T) {
	rng := rand.New(rand.NewSource(11))
	span := func() notation.Span {
		s := rng.Intn(8)
		return notation.Span{Start: s, End: s + rng.Intn(3)}
	}
	for round := 0; round < 500; round++ {
		ds := make([]Diagnostic, rng.Intn(12))
		for k := range ds {
			ds[k] = Diagnostic{Span: span(), Message: fmt.Sprint("own ", k)}
		}
		sortByPosition(ds)
		rel := make([]*relation, rng.Intn(10))
		var spans []notation.Span
		for range rel {
			spans = append(spans, span())
		}
		if round%2 == 0 {
			for a := 1; a < len(spans); a++ {
				for b := a; b > 0 && before(spans[b], spans[b-1]); b-- {
					spans[b], spans[b-1] = spans[b-1], spans[b]
				}
			}
		}
		want := append([]Diagnostic(nil), ds...)
		for k := range rel {
			if rng.Intn(3) == 0 {
				continue // a record without a relation
			}
			rel[k] = &relation{d: Diagnostic{Span: spans[k], Message: fmt.Sprint("relation ", k)}}
			want = append(want, rel[k].d)
		}
		sortByPosition(want)
		if got := mergeRelations(ds, rel); len(got)+len(want) > 0 && !reflect.DeepEqual(got, want) {
			t.Fatalf("round %d:\n got %v\nwant %v", round, got, want)
		}
	}
}

// TestRelateListInParts checks that the findings of a related list, kept
// in parts of records, are those a merge of the relations into the
// records' findings sorted by position gives, as for other related
// kinds, and that the parts are aligned on records as Reanalyze needs.
func TestRelateListInParts(t *testing.T) {
	rng := rand.New(rand.NewSource(7))
	text := strings.Join(editList(rng, 3*partRecords+17), "\n") + "\n"
	records := NewAnalyzer(DefaultConfig()).AnalyzeRecords("parts.smi", "", []byte(text))
	related := records.Relate()
	if related.parts == nil {
		t.Fatalf("a related list keeps no parts")
	}
	want := mergeRelations(records.Diagnostics(), related.rel)
	if !reflect.DeepEqual(related.Diagnostics(), want) {
		t.Fatalf("parts joined differ from the merge: %d findings against %d", related.DiagnosticCount(), len(want))
	}
	relations := 0
	for c, part := range related.DiagnosticParts() {
		for _, d := range part {
			if d.Record < c*partRecords || d.Record >= (c+1)*partRecords {
				t.Fatalf("part %d holds a finding of record %d", c, d.Record)
			}
			if IsRelation(d.Code) {
				relations++
			}
		}
	}
	if relations == 0 || relations == related.DiagnosticCount() {
		t.Errorf("%d relations among %d findings: the list does not test the merge", relations, related.DiagnosticCount())
	}
}

// TestActionsOnListParts checks that the quick fixes of a related list,
// whose findings are kept in parts, name by index (Diagnostic) the
// finding they fix, as Diagnostics lists them.
func TestActionsOnListParts(t *testing.T) {
	var b strings.Builder
	for i := range 3*partRecords + 5 {
		if i%7 == 0 {
			b.WriteString("C[C@H](C)C\tineffective " + fmt.Sprint(i) + "\n") // a mark on a non-stereocentre: a fix
		} else {
			b.WriteString("N[C@@H](C)C(=O)O\tdup " + fmt.Sprint(i) + "\n") // duplicates: relations
		}
	}
	res := NewAnalyzer(DefaultConfig()).Analyze("fixes.smi", "", []byte(b.String()))
	if res.parts == nil {
		t.Fatalf("the list keeps no parts")
	}
	all := res.Diagnostics()
	checked := 0
	for _, d := range all {
		if len(d.Fixes) == 0 {
			continue
		}
		found := false
		for _, act := range res.Actions(d.Span) {
			if act.Diagnostic < 0 {
				continue
			}
			got := res.Diagnostic(act.Diagnostic)
			if got == nil || got != &all[act.Diagnostic] && (got.Span != all[act.Diagnostic].Span || got.Code != all[act.Diagnostic].Code) {
				t.Fatalf("action %q names finding %d, which Diagnostic gives as %+v", act.Title, act.Diagnostic, got)
			}
			if got.Span == d.Span && got.Code == d.Code {
				found = true
			}
		}
		if !found {
			t.Errorf("no action names the finding %s at %v", d.Code, d.Span)
		}
		checked++
	}
	if checked < 3*partRecords/7 {
		t.Errorf("%d findings with fixes checked, want at least %d", checked, 3*partRecords/7)
	}
	if res.DiagnosticCount() != len(all) || res.Diagnostic(len(all)) != nil || res.Diagnostic(-1) != nil {
		t.Errorf("count %d, joined %d, or a finding past the ends", res.DiagnosticCount(), len(all))
	}
}

// TestRelateWithinFields checks that records are related only to records
// of their own field: a table's column, a JSON key. A PubChem export
// writes each compound twice, without and with its marks (the layout of
// its CanonicalSMILES and IsomericSMILES columns, common practice), and
// a reaction table writes products that other rows use as reactants;
// neither is a duplicate or a stereoisomer of the other field's record.
// Analyze and Stream (check) must agree. The molecules (alanine and its
// mirror image, from memory) are facts; the rows are our own.
func TestRelateWithinFields(t *testing.T) {
	tests := []struct {
		name, file, text string
		want             []string // "code line", in order
	}{
		{"two columns", "t.csv",
			"id,CanonicalSMILES,IsomericSMILES\n1,CC(N)C(=O)O,C[C@@H](N)C(=O)O\n2,CC(N)C(=O)O,C[C@H](N)C(=O)O\n3,CCO,CCO\n",
			[]string{"list-duplicate 3", "list-enantiomer 3"}},
		{"reactions", "t.csv",
			"reactant_smiles,product_smiles\nC[C@@H](N)C(=O)O,C[C@@H](N)C(=O)OC\nC[C@@H](N)C(=O)OC,C[C@@H](NC=O)C(=O)OC\n",
			nil},
		{"json keys", "t.jsonl",
			"{\"a_smiles\": \"C[C@@H](N)C(=O)O\", \"b_smiles\": \"C[C@H](N)C(=O)O\"}\n{\"a_smiles\": \"C[C@H](N)C(=O)O\"}\n",
			[]string{"list-enantiomer 2"}},
	}
	cfg := DefaultConfig()
	for _, tt := range tests {
		a := NewAnalyzer(cfg)
		describe := func(ds []Diagnostic, content string) []string {
			var out []string
			for _, d := range ds {
				if strings.HasPrefix(string(d.Code), "list-") {
					out = append(out, fmt.Sprintf("%s %d", d.Code, strings.Count(content[:d.Span.Start], "\n")+1))
				}
			}
			return out
		}
		got := describe(a.Analyze(tt.file, "", []byte(tt.text)).Diagnostics(), tt.text)
		if !slices.Equal(got, tt.want) {
			t.Errorf("%s: Analyze related %q, want %q", tt.name, got, tt.want)
		}
		var streamed []Diagnostic
		a.Stream(tt.file, "", []byte(tt.text), func(ds []Diagnostic) { streamed = append(streamed, ds...) })
		if got := describe(streamed, tt.text); !slices.Equal(got, tt.want) {
			t.Errorf("%s: Stream related %q, want %q", tt.name, got, tt.want)
		}
	}
}

package document

import (
	"reflect"
	"strings"
	"testing"
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
	firstDiags := append([]Diagnostic(nil), first.Diagnostics...)
	for _, d := range first.Diagnostics {
		if strings.HasPrefix(string(d.Code), "list-") {
			t.Errorf("relation before Relate: %+v", d)
		}
	}
	if len(first.Diagnostics) == 0 {
		t.Fatalf("no findings of the records themselves")
	}
	related := first.Relate()
	whole := NewAnalyzer(DefaultConfig()).Analyze("pool.smi", "", []byte(text))
	if !reflect.DeepEqual(codesAndSpans(related), codesAndSpans(whole)) {
		t.Errorf("in two steps:\n%v\nin one:\n%v", codesAndSpans(related), codesAndSpans(whole))
	}
	if n := len(related.Diagnostics) - len(first.Diagnostics); n != 3 {
		t.Errorf("Relate added %d findings, want 3: an enantiomer, a duplicate, a stereoisomer", n)
	}
	if !reflect.DeepEqual(first.Diagnostics, firstDiags) {
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
	for _, d := range r.Diagnostics {
		out = append(out, string(d.Code)+" "+string(r.Content[d.Span.Start:d.Span.End])+" "+d.Message)
	}
	return out
}

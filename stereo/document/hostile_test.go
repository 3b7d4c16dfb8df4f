package document

import (
	"strings"
	"testing"

	"stereoline/notation"
)

// BenchmarkHostileDocument analyses a .smi list holding one hostile
// record of issue 13 as the language server does (Analyze) and as the
// checker does (Stream): finder, reading, analysis, relations, with a
// fresh cache each time.
func BenchmarkHostileDocument(b *testing.B) {
	for _, c := range []struct{ name, text string }{
		{"chain-1000000", strings.Repeat("C", 1000000)},
		{"chain-marks-50000", strings.Repeat("[C@H](F)", 50000)},
		{"small-rings-8000", strings.Repeat("C%10CC%10", 8000)},
	} {
		content := []byte(c.text + " hostile\n") // a list line: notation and title
		b.Run(c.name, func(b *testing.B) {
			for b.Loop() {
				NewAnalyzer(DefaultConfig()).Analyze("hostile.smi", "", content)
			}
		})
		// the checker's path: found a chunk at a time, the list's layout
		// sampled from its first lines
		b.Run(c.name+"/stream", func(b *testing.B) {
			for b.Loop() {
				NewAnalyzer(DefaultConfig()).Stream("hostile.smi", "", content, func([]Diagnostic) {})
			}
		})
	}
}

// TestLimitsKeyTheCache analyses one record under two limits with
// analyzers that share a cache: each gets the analysis of its own limits
// (a budget spent at once, or the default), in host offsets.
func TestLimitsKeyTheCache(t *testing.T) {
	content := []byte("# a list\nN[C@@H](C)C(=O)O alanine\n")
	base := NewAnalyzer(DefaultConfig())
	tight := DefaultConfig()
	tight.Limits.RecordTime = "1ns"
	if err := tight.Validate(); err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		a    *Analyzer
		want int
	}{{base, 0}, {base.WithConfig(tight), 1}, {base, 0}} {
		res := c.a.Analyze("list.smi", "", content)
		var got []Diagnostic
		for _, d := range res.Diagnostics() {
			if d.Code == "stereo-over-budget" {
				got = append(got, d)
			}
		}
		if len(got) != c.want {
			t.Fatalf("recordTime %q: budget findings %v, want %d", c.a.Config().Limits.RecordTime, got, c.want)
		}
		// the finding stands on the mark, in host offsets
		if c.want == 1 && string(content[got[0].Span.Start:got[0].Span.End]) != "@@" {
			t.Errorf("finding at %q", content[got[0].Span.Start:got[0].Span.End])
		}
	}
}

// TestRecordAtomsLimit analyses a list whose second record has more
// atoms than the recordAtoms limit: that record is not read and gets one
// warning on its first atom; the other records are analysed as usual,
// and every request on the refused record (hover, inlay hints, code
// actions, lenses, symbols, relations) answers without failing.
func TestRecordAtomsLimit(t *testing.T) {
	big := strings.Repeat("[C@H](F)", 10)
	content := []byte("N[C@@H](C)C(=O)O alanine\n" + big + " chain\nC[C@H](N)C(=O)O d-alanine\n")
	cfg := DefaultConfig()
	cfg.Limits.RecordAtoms = 19
	if err := cfg.Validate(); err != nil {
		t.Fatal(err)
	}
	res := NewAnalyzer(cfg).Analyze("list.smi", "", content)
	start := strings.Index(string(content), big)
	var over, inBig int
	for _, d := range res.Diagnostics() {
		if d.Span.Start >= start && d.Span.Start < start+len(big) {
			inBig++
		}
		if d.Code == "stereo-over-budget" {
			over++
			if d.Span.Start != start || !strings.Contains(d.Message, "has 20 atoms, more than the 19") {
				t.Errorf("finding %+v", d)
			}
		}
	}
	if over != 1 || inBig != 1 {
		t.Errorf("%d budget findings, %d findings on the refused record, want 1 and 1: %+v", over, inBig, res.Diagnostics())
	}
	// the other two records are still related (enantiomers)
	if len(res.Records) != 3 || res.Records[0].Identify() == nil || res.Records[2].Identify() == nil {
		t.Fatalf("records %+v", res.Records)
	}
	if res.Records[1].Identify() != nil {
		t.Errorf("the refused record has identity keys")
	}
	if h, _, ok := res.Hover(start + 3); !ok || !strings.HasPrefix(h, "Not analysed: the record has 20 atoms") || !strings.Contains(h, Caution) {
		t.Errorf("hover on the refused record: %q", h)
	}
	for off := start; off <= start+len(big); off++ {
		res.Hover(off)
		res.Actions(notation.Span{Start: off, End: off})
	}
	res.InlayLabels()
	res.DrawingLenses()
	res.Symbols()
	// the default limit reads the record
	res = NewAnalyzer(DefaultConfig()).Analyze("list.smi", "", content)
	for _, d := range res.Diagnostics() {
		if d.Code == "stereo-over-budget" {
			t.Errorf("default limits: %+v", d)
		}
	}
}

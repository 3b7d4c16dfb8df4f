package document

import (
	"strings"
	"testing"
)

// BenchmarkHostileDocument analyses a .smi list holding one hostile
// record of issue 13, as the checker does (finder, reading, analysis,
// relations), with a fresh cache each time.
func BenchmarkHostileDocument(b *testing.B) {
	for _, c := range []struct{ name, text string }{
		{"chain-1000000", strings.Repeat("C", 1000000)},
		{"chain-marks-50000", strings.Repeat("[C@H](F)", 50000)},
		{"small-rings-8000", strings.Repeat("C%10CC%10", 8000)},
	} {
		content := []byte(c.text + "\n")
		b.Run(c.name, func(b *testing.B) {
			for b.Loop() {
				NewAnalyzer(DefaultConfig()).Analyze("hostile.smi", "", content)
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
		for _, d := range res.Diagnostics {
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

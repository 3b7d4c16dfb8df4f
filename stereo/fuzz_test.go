package stereo

import (
	"strings"
	"testing"

	"stereoline/notation"
)

// FuzzAnalyze checks that no text makes the stereo engine fail inside:
// every diagnostic span lies in the text, unit atoms exist, and no
// internal error is recovered.
func FuzzAnalyze(f *testing.F) {
	for _, s := range []string{
		"N[C@@H](C)C(=O)O", `F/C(\Cl)=C/Br`, "ClC=[C@]=CCl", "C[C@SP1H]C", "C1CCC/C=C/1",
		"[C@@H]12[C@H]3[C@H]4[C@@H]1[C@@H]5[C@H]4[C@H]3[C@H]25", "C/C=C/1\\CC[C@H](C)CC1",
		"O[C@H]1CC[C@H](CC1)O", "C[S@@](=O)c1ccccc1", "[C@]=1=C2CCCCCCC1CCCCCC2", "C/1=C/CCCCCC\\1",
		"C[C@H](O)[C@H](O)[C@@H](O)C |o1:1,3,5|", "C/C=C/[C@H](O)C |&1:1,3,o1:2|", "C[C@H](O)CC>>C[C@H](N)CC |o1:1,6|",
	} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, text string) {
		if len(text) > 300 {
			return
		}
		m := notation.Read(text)
		a := AnalyzeWith(m, Options{NodeCap: 5000})
		for _, e := range a.Diagnostics {
			if e.Span.Start < 0 || e.Span.End > len(text) || e.Span.Start > e.Span.End {
				t.Fatalf("%q: span %v outside the text (%v)", text, e.Span, e)
			}
			if strings.HasPrefix(e.Msg, "internal error") {
				t.Fatalf("%q: %v", text, e)
			}
		}
		for _, u := range a.Units {
			for _, at := range u.Atoms {
				if at < 0 || at >= len(m.Atoms) {
					t.Fatalf("%q: unit atom %d out of range", text, at)
				}
			}
		}
	})
}

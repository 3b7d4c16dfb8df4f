package review

import (
	"testing"

	"stereoline/stereo/document"
)

// FuzzReview: any two versions of a file of any host kind review without
// a panic, and every pair has a side, a known class and places inside
// its version.
func FuzzReview(f *testing.F) {
	seeds := []struct{ name, old, new string }{
		{"x.smi", "C[C@H](O)[C@@H](Cl)C A\nCCO B\n", "C[C@H](O)[C@H](Cl)C A\nCCN C\n"},
		{"x.csv", "id,smiles\nA,N[C@@H](C)C(=O)O\nB,CCO\n", "id,smiles\n\"B\",CCO\nA,N[C@H](C)C(=O)O\n"},
		{"x.json", `{"a": {"smiles": "C/C=C/C"}, "b": [{"id": 1, "smiles": "CCO"}]}`, `{"a": {"smiles": "C/C=C\\C"}, "b": [{"id": 1, "smiles": "CCN"}`},
		{"x.py", "alanine = \"N[C@@H](C)C(=O)O\"\nd = {\"k\": 'C/C=C/C'}\n", "alanine = r\"N[C@H](C)C(=O)O\"\n"},
		{"x.rsmi", "[CH3:1][C@H:2]([OH:3])CC>>[CH3:1][C@@H:2]([OH:3])CC R\n", "[CH3:1][C@H:2]([OH:3])CC>O>[CH3:1][C@H:2]([OH:3])CC R\n"},
		{"x.cxsmi", "C[C@H](O)CC |&1:1| A\n", "C[C@@H](O)CC |o1:1| A\n"},
		{"x.smi", "", "((((\n"},
	}
	for _, s := range seeds {
		f.Add(s.name, []byte(s.old), []byte(s.new))
	}
	a := document.NewAnalyzer(document.DefaultConfig())
	f.Fuzz(func(t *testing.T, name string, old, new []byte) {
		if len(old) > 4000 || len(new) > 4000 {
			return
		}
		rep := Review(a, Version{Name: name, Content: old}, Version{Name: name, Content: new}, Options{})
		for i := range rep.Pairs {
			p := &rep.Pairs[i]
			if p.Old == nil && p.New == nil || p.Class.String() == "unknown" || p.Explanation == "" {
				t.Fatalf("pair %d: %+v", i, p)
			}
			if p.New != nil {
				if off := p.HostMark(true); off < 0 || off > len(new) {
					t.Fatalf("new mark %d outside %d bytes", off, len(new))
				}
			}
			if p.Old != nil {
				if off := p.HostMark(false); off < 0 || off > len(old) {
					t.Fatalf("old mark %d outside %d bytes", off, len(old))
				}
			}
		}
	})
}

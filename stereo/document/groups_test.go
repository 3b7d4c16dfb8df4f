package document

import (
	"strings"
	"testing"

	"stereoline/notation"
)

// TestGroupRelationsInAList: the relations stereo groups make, in words,
// in a list of the Fenwick Row pool team (butan-2-ol: C[C@@H](O)CC is
// (R), from memory; a racemate beside one of its enantiomers is common
// practice in such lists), and the duplicate that two writings of one
// racemate are.
func TestGroupRelationsInAList(t *testing.T) {
	text := strings.Join([]string{
		"C[C@H](O)CC |&1:1| LRK-BB-101 racemate",
		"C[C@@H](O)CC LRK-BB-102",
		"C[C@@H](O)CC |&1:1| LRK-BB-103",
		"C[C@H](O)[C@@H](C)Cl |o1:1,3| LRK-BB-104",
		"C[C@@H](O)[C@H](C)Cl LRK-BB-105",
		"C[C@H](O)CC |o1:1| LRK-BB-106",
		"C[C@H](O)CC LRK-BB-107",
	}, "\n") + "\n"
	r := NewAnalyzer(DefaultConfig()).Analyze("pool.cxsmi", "", []byte(text))
	want := map[string]string{
		"C[C@@H](O)CC":                  "list-absolute-of-mixture the (2R) enantiomer of the racemate in line 1 (LRK-BB-101 racemate)",
		"C[C@@H](O)CC |&1:1|":           "list-duplicate the same racemate as line 1 (LRK-BB-101 racemate)",
		"C[C@@H](O)[C@H](C)Cl":          "list-absolute-of-relative the same relative configuration as line 4 (LRK-BB-104) (rel-(2R,4S)), with the absolute configuration (2R,4S)",
		"C[C@H](O)CC |o1:1|":            "list-relative-and-mixture one enantiomer, unknown which, of the racemate in line 1 (LRK-BB-101 racemate): the same relative configuration (rel-(2R))",
		"C[C@H](O)CC":                   "list-enantiomer the mirror image of line 2 (LRK-BB-102)",
		"C[C@H](O)[C@@H](C)Cl |o1:1,3|": "",
		"C[C@H](O)CC |&1:1|":            "",
	}
	got := map[string]string{}
	for _, d := range r.Diagnostics() {
		if !strings.HasPrefix(string(d.Code), "list-") {
			continue
		}
		rec := r.Records[d.Record].Occ.Text
		got[rec] = string(d.Code) + " " + d.Message
	}
	for rec, w := range want {
		if got[rec] != w {
			t.Errorf("%s: %q, want %q", rec, got[rec], w)
		}
	}
}

// TestGroupFixes: the quick fixes of the findings about stereo groups are
// minimal edits of the block.
func TestGroupFixes(t *testing.T) {
	tests := []struct {
		have, code, want string
	}{
		{"CC(O)CC |o1:1,$;lbl;;;$|\n", "stereo-group-ineffective-member", "CC(O)CC |$;lbl;;;$|\n"},
		{"C[C@H](O)[C@@H](C)C(O)C |o1:1,3,6|\n", "stereo-group-ineffective-member", "C[C@H](O)[C@@H](C)C(O)C |o1:1,3|\n"},
		{"C[C@H](O)CC.C[C@H](N)CC |o1:1,6|\n", "stereo-group-across-components", "C[C@H](O)CC.C[C@H](N)CC |o1:1,o2:6|\n"},
		{"C[C@H](O)[C@@H](C)Cl |o1:1,o1:3|\n", "stereo-group-repeated-tag", "C[C@H](O)[C@@H](C)Cl |o1:1,o2:3|\n"},
		{"O[C@H]1CCCC[C@H]1O |o1:1,6|\n", "stereo-group-adds-nothing", "O[C@H]1CCCC[C@H]1O\n"},
	}
	for _, tt := range tests {
		r := NewAnalyzer(DefaultConfig()).Analyze("x.cxsmi", "", []byte(tt.have))
		found := false
		for _, d := range r.Diagnostics() {
			if string(d.Code) != tt.code {
				continue
			}
			found = true
			if len(d.Fixes) != 1 {
				t.Errorf("%s: %s has %d fixes", tt.have, tt.code, len(d.Fixes))
				continue
			}
			var edits []notation.Edit
			for _, e := range d.Fixes[0].Edits {
				edits = append(edits, notation.Edit{Span: e.Span, New: e.NewText})
			}
			out, err := notation.ApplyEdits(tt.have, edits)
			if err != nil || out != tt.want {
				t.Errorf("%s: fix %q gives %q (%v), want %q", tt.have, d.Fixes[0].Title, out, err, tt.want)
			}
		}
		if !found {
			t.Errorf("%s: no %s", tt.have, tt.code)
		}
	}
}

// TestGroupHoverAndActions: hover on a centre of an or group and on the
// group's field says what the group means; the inline label is R* or S*;
// the actions make the group absolute either way or racemic.
func TestGroupHoverAndActions(t *testing.T) {
	const text = "C[C@H](O)[C@@H](C)Cl |o1:1,3| LRK-BB-104\n"
	cfg := DefaultConfig()
	cfg.InlayHints = true
	r := NewAnalyzer(cfg).Analyze("x.cxsmi", "", []byte(text))
	h, _, ok := r.Hover(strings.Index(text, "@H"))
	if !ok || !strings.Contains(h, "In stereo group o1: **R***, relative configuration rel-(2R,4S)") || !strings.Contains(h, "configuration relative (o1: rel-(2R,4S))") {
		t.Errorf("hover on C2:\n%s", h)
	}
	h, _, ok = r.Hover(strings.Index(text, "o1:") + 1)
	if !ok || !strings.Contains(h, "**stereo group o1**: relative configuration") || !strings.Contains(h, "(2R*,4S*)") {
		t.Errorf("hover on the group:\n%s", h)
	}
	var labels []string
	for _, l := range r.InlayLabels() {
		labels = append(labels, l.Text)
	}
	if strings.Join(labels, " ") != "R* S*" {
		t.Errorf("inline labels %q, want R* S*", labels)
	}
	var titles []string
	for _, a := range r.Actions(notation.Span{Start: 3, End: 3}) {
		titles = append(titles, a.Kind+" "+a.Title)
	}
	want := []string{
		"refactor.rewrite.stereo.invert Invert C2 within stereo group o1 (R* to S*)",
		"refactor.rewrite.stereo.set Set C2 to S* in stereo group o1",
		"refactor.rewrite.stereo.absolute Make stereo group o1 absolute as written: (2S,4R)",
		"refactor.rewrite.stereo.absolute Make stereo group o1 absolute as its mirror image: (2R,4S)",
		"refactor.rewrite.stereo.racemic Mark stereo group o1 as racemic",
	}
	if strings.Join(titles, "\n") != strings.Join(want, "\n") {
		t.Errorf("actions:\n%s\nwant:\n%s", strings.Join(titles, "\n"), strings.Join(want, "\n"))
	}
}

package document

import (
	"strings"
	"testing"

	"stereoline/notation"
	"stereoline/stereo"
)

// The facts checked here are common practice: L-alanine is (S), a mark
// on a methylene carbon is ineffective, an unmarked double bond end of
// F/C=CF is one-sided.

func analyze(t *testing.T, name, text string) *Result {
	t.Helper()
	return NewAnalyzer(DefaultConfig()).Analyze(name, "", []byte(text))
}

func TestListDiagnosticsInHostOffsets(t *testing.T) {
	text := "N[C@@H](C)C(=O)O L-alanine\nC[C@H](C)O propan-2-ol, marked\n"
	res := analyze(t, "blocks.smi", text)
	if len(res.Records) != 2 {
		t.Fatalf("records = %d, want 2", len(res.Records))
	}
	var found bool
	for _, d := range res.Diagnostics() {
		if d.Code == stereo.CodeIneffectiveCenter {
			found = true
			if got := text[d.Span.Start:d.Span.End]; !strings.Contains(got, "@") {
				t.Errorf("ineffective mark span covers %q, want the mark", got)
			}
			if !d.Unnecessary {
				t.Errorf("ineffective mark not tagged unnecessary")
			}
		}
	}
	if !found {
		t.Errorf("no %s on C[C@H](C)O: %+v", stereo.CodeIneffectiveCenter, res.Diagnostics())
	}
}

func TestHoverAndLabels(t *testing.T) {
	text := "# é — a comment with non-ASCII text\nalanine_smiles = \"N[C@@H](C)C(=O)O\"\n"
	res := analyze(t, "amino.py", text)
	if len(res.Records) != 1 {
		t.Fatalf("records = %d, want 1", len(res.Records))
	}
	at := strings.Index(text, "[C@@H]") + 2
	md, span, ok := res.Hover(at)
	if !ok {
		t.Fatalf("no hover at the centre")
	}
	if got := text[span.Start:span.End]; got != "[C@@H]" {
		t.Errorf("hover span covers %q, want [C@@H]", got)
	}
	for _, want := range []string{"(S)", "clockwise", "Fischer family: **L**", "notation as written"} {
		if !strings.Contains(md, want) {
			t.Errorf("hover lacks %q:\n%s", want, md)
		}
	}
	labels := res.InlayLabels()
	if len(labels) != 1 || labels[0].Text != "S" || labels[0].Offset != strings.Index(text, "[C@@H]")+len("[C@@H]") {
		t.Errorf("labels = %+v", labels)
	}
	cfg := DefaultConfig()
	cfg.InlayHints = false
	if l := NewAnalyzer(cfg).Analyze("amino.py", "", []byte(text)).InlayLabels(); len(l) != 0 {
		t.Errorf("labels with hints off = %+v", l)
	}
}

func TestSeverityOverride(t *testing.T) {
	cfg := DefaultConfig()
	if err := cfg.Merge([]byte(`{"severity": {"stereo-ineffective-center": "off"}}`)); err != nil {
		t.Fatal(err)
	}
	res := NewAnalyzer(cfg).Analyze("x.smi", "", []byte("C[C@H](C)O\n"))
	for _, d := range res.Diagnostics() {
		if d.Code == stereo.CodeIneffectiveCenter {
			t.Errorf("code switched off but reported: %+v", d)
		}
	}
	if err := cfg.Merge([]byte(`{"severity": {"stereo-undefined": "loud"}}`)); err == nil {
		t.Errorf("bad severity accepted")
	}
}

func TestSymbols(t *testing.T) {
	res := analyze(t, "x.smi", "CCO ethanol\nC[C@@H](O)CC\n")
	syms := res.Symbols()
	if len(syms) != 2 || syms[0].Name != "ethanol" || syms[1].Name != "C[C@@H](O)CC" {
		t.Errorf("symbols = %+v", syms)
	}
}

// TestListRelations: L- and D-alanine are mirror images; the same
// structure written from the other end is a duplicate; (2R,3R)- and
// (2R,3S)-2,3-dibromobutane... here tartaric acid: the (R,R) form and the
// meso form are diastereomers (common practice).
func TestListRelations(t *testing.T) {
	text := strings.Join([]string{
		"N[C@@H](C)C(=O)O L-Ala",
		"N[C@H](C)C(=O)O D-Ala",
		"OC(=O)[C@H](C)N L-Ala again",
		"O[C@H](C(=O)O)[C@@H](O)C(=O)O tartaric acid",
		"O[C@H](C(=O)O)[C@H](O)C(=O)O tartaric acid, other form",
		"CCO ethanol",
	}, "\n") + "\n"
	res := analyze(t, "pool.smi", text)
	want := map[notation.Code]int{CodeListEnantiomer: 2, CodeListDuplicate: 3, CodeListStereoisomer: 5}
	got := map[notation.Code]int{}
	for _, d := range res.Diagnostics() {
		if _, ok := want[d.Code]; ok {
			got[d.Code] = res.lineOf(d.Span.Start) + 1
			if len(d.Related) != 1 || d.Related[0].Span.Start != res.Records[0].Occ.Span.Start && d.Code != CodeListStereoisomer {
				t.Errorf("%s: related %+v, want the first record", d.Code, d.Related)
			}
		}
	}
	for code, line := range want {
		if got[code] != line {
			t.Errorf("%s on line %d, want line %d (all: %+v)", code, got[code], line, res.Diagnostics())
		}
	}
	// Source code is not a list: the same string twice is not reported.
	res = analyze(t, "t.py", "smiles_in = \"N[C@@H](C)C(=O)O\"\nsmiles_out = \"N[C@@H](C)C(=O)O\"\n")
	for _, d := range res.Diagnostics() {
		if d.Code == CodeListDuplicate {
			t.Errorf("duplicate reported in source code: %+v", d)
		}
	}
}

// TestActions: the rewrites touch only the marks, in host bytes, and a
// backslash inserted into a Python string is written doubled (Python
// language reference, string literals).
func TestActions(t *testing.T) {
	text := "smiles = \"N[C@@H](C)C(=O)O\"\nother_smiles = \"F\\\\C=CF\"\n"
	res := analyze(t, "x.py", text)
	at := strings.Index(text, "@@")
	var mirror, set *Action
	for _, a := range res.Actions(notation.Span{Start: at, End: at}) {
		a := a
		switch a.Kind {
		case KindMirror:
			mirror = &a
		case KindSet:
			set = &a
		}
	}
	if mirror == nil || len(mirror.Edits) != 1 || text[mirror.Edits[0].Span.Start:mirror.Edits[0].Span.End] != "@@" || mirror.Edits[0].NewText != "@" {
		t.Fatalf("mirror = %+v", mirror)
	}
	if set == nil || !strings.Contains(set.Title, "to R") {
		t.Errorf("set = %+v", set)
	}
	// The one-sided bond's quick fix adds a partner mark, doubled.
	var fix *Action
	for _, d := range res.Diagnostics() {
		if d.Code == stereo.CodeOneSidedBond {
			for _, a := range res.Actions(d.Span) {
				if a.Kind == KindQuickFix {
					a := a
					fix = &a
				}
			}
		}
	}
	if fix == nil || len(fix.Edits) != 1 || !strings.Contains(fix.Edits[0].NewText, `\\`) {
		t.Fatalf("one-sided fix = %+v", fix)
	}
	fixed := text[:fix.Edits[0].Span.Start] + fix.Edits[0].NewText + text[fix.Edits[0].Span.End:]
	after := analyze(t, "x.py", fixed)
	for _, d := range after.Diagnostics() {
		if d.Code == stereo.CodeOneSidedBond {
			t.Errorf("after the fix %q still one-sided: %+v", fixed, d)
		}
	}
}

// TestParallelAnalysis checks that a list large enough to be analysed on
// all cores gives the same findings as one analysed record by record
// (run it with -race).
func TestParallelAnalysis(t *testing.T) {
	records := []string{"N[C@@H](C)C(=O)O", "C[C@H](C)O", "F/C=CF", "C1CC", "O[C@H](C(=O)O)[C@@H](O)C(=O)O", "c1ccccc1", "N[C@H](C)C(=O)O"}
	var b strings.Builder
	for i := 0; i < 3*parallelMin; i++ {
		b.WriteString(records[i%len(records)] + " r" + strings.Repeat("x", i%5) + "\n")
	}
	text := b.String()
	big := analyze(t, "many.smi", text)
	var want int
	lines := strings.SplitAfter(text, "\n")
	for _, l := range lines[:len(records)] {
		one := analyze(t, "one.smi", l)
		for _, d := range one.Diagnostics() {
			if !strings.HasPrefix(string(d.Code), "list-") {
				want++
			}
		}
	}
	got := 0
	for _, d := range big.Diagnostics() {
		if big.RecordAt(d.Span.Start) < len(records) && !strings.HasPrefix(string(d.Code), "list-") {
			got++
		}
	}
	if got != want {
		t.Errorf("first %d records: %d findings in the big list, %d one by one", len(records), got, want)
	}
	if len(big.Records) != 3*parallelMin {
		t.Errorf("records = %d", len(big.Records))
	}
}

// TestHoverReaction: an SN2 displacement inverts the centre (common
// practice, Walden inversion).
func TestHoverReaction(t *testing.T) {
	text := "[CH3:1][C@@H:2]([Br:3])[CH2:4][CH3:5].[OH-:6]>>[CH3:1][C@H:2]([OH:6])[CH2:4][CH3:5].[Br-:3] RX-1\n"
	res := analyze(t, "r.rsmi", text)
	at := strings.LastIndex(text, "[C@H:2]") + 1
	md, _, ok := res.Hover(at)
	if !ok || !strings.Contains(md, "Across the reaction (map 2): **inversion**") {
		t.Errorf("hover:\n%s", md)
	}
}

// TestHoverHalfMarked: in 1,4-dimethylcyclohexane with one ring carbon
// marked (cis and trans exist; common practice), the hover on the
// marked carbon says its mark waits for its partner.
func TestHoverHalfMarked(t *testing.T) {
	text := "C[C@H]1CCC(C)CC1\n"
	res := analyze(t, "x.smi", text)
	md, _, ok := res.Hover(strings.Index(text, "@"))
	if !ok {
		t.Fatalf("no hover on the mark")
	}
	if !strings.Contains(md, "only together with the configuration of another unit") {
		t.Errorf("hover does not say the mark waits for a partner:\n%s", md)
	}
}

package document

import (
	"fmt"
	"math/rand"
	"reflect"
	"strings"
	"testing"

	"stereoline/notation"
	"stereoline/stereo"
)

// withKept returns an analyzer for the default configuration whose cache
// keeps the full analyses of at most limit records.
func withKept(limit int) *Analyzer {
	a := NewAnalyzer(DefaultConfig())
	a.cache.fulls = newFullList(limit)
	return a
}

// TestDroppedAnalysesAnswerAlike edits a list at random with an analyzer
// that keeps the full analysis of only three records, so nearly every
// record's molecule and stereo analysis is dropped and read again, and
// checks after each edit that its findings (relations included), hovers,
// inline labels and code actions are those of an analyzer that keeps
// every full analysis. The list is editList's (invented: what is checked
// is that dropping changes nothing, not the chemistry).
func TestDroppedAnalysesAnswerAlike(t *testing.T) {
	n, steps := 600, 25
	if testing.Short() {
		n, steps = 200, 10
	}
	rng := rand.New(rand.NewSource(20261203))
	lean := withKept(3)
	lines := editList(rng, n)
	text := strings.Join(lines, "\n") + "\n"
	prev := lean.Analyze("lean.smi", "", []byte(text))
	for step := 0; step <= steps; step++ {
		what := "the first version"
		if step > 0 {
			what = randomEdit(rng, &lines)
			text = strings.Join(lines, "\n") + "\n"
			prev = lean.Reanalyze(prev, "lean.smi", "", []byte(text))
		}
		want := withKept(1<<30).Analyze("lean.smi", "", []byte(text))
		what = fmt.Sprintf("step %d (%s)", step, what)
		compareResults(t, what, prev, want)
		compareAnswers(t, what, prev, want, rng)
		if got := lean.cache.fulls.kept(); got > 3 {
			t.Fatalf("%s: %d full analyses kept, more than the limit 3", what, got)
		}
		if t.Failed() {
			return
		}
	}
}

// compareAnswers fails t when two results of one text answer requests
// differently: hovers at some offsets of each record, inline labels, and
// the code actions of each finding.
func compareAnswers(t *testing.T, what string, got, want *Result, rng *rand.Rand) {
	t.Helper()
	for i := range want.Records {
		g, w := &got.Records[i], &want.Records[i]
		if !reflect.DeepEqual(g.Mol(), w.Mol()) || !reflect.DeepEqual(g.Stereo(), w.Stereo()) || !reflect.DeepEqual(g.Reaction(), w.Reaction()) {
			t.Errorf("%s: record %d (%q): the analysis read again differs", what, i, w.Occ.Text)
			return
		}
		if !reflect.DeepEqual(g.Identify(), w.Identify()) {
			t.Errorf("%s: record %d (%q): identity %+v, want %+v", what, i, w.Occ.Text, g.Identify(), w.Identify())
			return
		}
		s := w.Occ.Span
		for _, off := range []int{s.Start, s.Start + rng.Intn(s.Len()+1), s.End} {
			gh, gs, gok := got.Hover(off)
			wh, ws, wok := want.Hover(off)
			if gh != wh || gs != ws || gok != wok {
				t.Errorf("%s: hover at %d:\n got %q %v %t\nwant %q %v %t", what, off, gh, gs, gok, wh, ws, wok)
				return
			}
		}
	}
	if g, w := got.InlayLabels(), want.InlayLabels(); !reflect.DeepEqual(g, w) {
		t.Errorf("%s: inline labels differ: %d, want %d", what, len(g), len(w))
	}
	for _, d := range want.Diagnostics() {
		if g, w := got.Actions(d.Span), want.Actions(d.Span); !reflect.DeepEqual(g, w) {
			t.Errorf("%s: actions at %v differ:\n got %+v\nwant %+v", what, d.Span, g, w)
			return
		}
	}
}

// TestFullListBound reads more records than the list keeps, through the
// cache and through requests, and checks that no more than the limit
// keep their full analyses (the first reading of a list keeps none), that
// the others have dropped theirs, and that a dropped analysis read again
// is kept again.
func TestFullListBound(t *testing.T) {
	const limit = 8
	a := withKept(limit)
	rng := rand.New(rand.NewSource(7))
	lines := editList(rng, 300)
	res := a.Analyze("bound.smi", "", []byte(strings.Join(lines, "\n")+"\n"))
	kept := func() int {
		n := 0
		a.cache.mu.Lock()
		defer a.cache.mu.Unlock()
		seen := map[*analysis]bool{}
		a.cache.analyses.All(func(_ cacheKey, an *analysis) bool {
			if !seen[an] && an.full.Load() != nil && !an.pinned {
				n++
			}
			seen[an] = true
			return true
		})
		return n
	}
	if n := kept(); n > limit {
		t.Fatalf("%d analyses keep their full analysis after reading %d records, want at most %d", n, len(res.Records), limit)
	}
	for k := 0; k < 200; k++ {
		rec := &res.Records[rng.Intn(len(res.Records))]
		if rec.Mol() == nil || rec.Stereo() == nil {
			t.Fatalf("record %q: no analysis", rec.Occ.Text)
		}
		if rec.an.full.Load() == nil {
			t.Fatalf("record %q: the analysis just asked for is not kept", rec.Occ.Text)
		}
		if n := kept(); n > limit {
			t.Fatalf("after %d requests %d analyses keep their full analysis, more than %d", k+1, n, limit)
		}
	}
}

// TestMoleculeReadAgainAlike checks that the molecule read again for the
// identity keys of a dropped analysis is the one the analysis read.
func TestMoleculeReadAgainAlike(t *testing.T) {
	for _, text := range editTemplates {
		text = strings.ReplaceAll(text, "*", "@")
		a := analyse(text, notation.Reading{}, DefaultConfig().Limits.limits())
		kept := a.full.Load().mol
		a.full.Store(nil)
		if again := a.molecule(); !reflect.DeepEqual(again, kept) {
			t.Errorf("%q: the molecule read again differs", text)
		}
	}
}

// TestOccurrencesKeepTheirAnalyses checks that the records of
// AnalyzeOccurrences (a review reads them all) hold on to their full
// analyses however few the cache keeps: each is read once.
func TestOccurrencesKeepTheirAnalyses(t *testing.T) {
	a := withKept(1)
	lines := editList(rand.New(rand.NewSource(3)), 50)
	text := []byte(strings.Join(lines, "\n") + "\n")
	kind, occs := a.Occurrences("keep.smi", "", text)
	res := a.AnalyzeOccurrences("keep.smi", kind, text, occs)
	first := make([]*notation.Molecule, len(res.Records))
	for i := range res.Records {
		first[i] = res.Records[i].Mol()
	}
	for i := range res.Records {
		if m := res.Records[i].Mol(); m != first[i] || m == nil {
			t.Fatalf("record %d (%q) was read again", i, res.Records[i].Occ.Text)
		}
	}
}

// TestPinnedKeepTheirMolecules reads a list under a budget spent at once,
// so analyses are pinned (kept whole) while the first reading reads the
// records into storage it reuses: each pinned analysis must keep a
// molecule of its own, the one its text reads as, not storage a later
// record was read into.
func TestPinnedKeepTheirMolecules(t *testing.T) {
	cfg := DefaultConfig()
	cfg.Limits.RecordTime = "1ns"
	if err := cfg.Validate(); err != nil {
		t.Fatal(err)
	}
	a := NewAnalyzer(cfg)
	lines := editList(rand.New(rand.NewSource(5)), 120) // fewer than parallelMin: one goroutine
	res := a.AnalyzeRecords("pinned.smi", "", []byte(strings.Join(lines, "\n")+"\n"))
	pinned := 0
	for i := range res.Records {
		an := res.Records[i].an
		if an == nil || !an.pinned {
			continue
		}
		pinned++
		kept := an.full.Load()
		if kept == nil {
			t.Fatalf("record %d: pinned without its full analysis", i)
		}
		want := notation.ReadWith(an.key.text, an.key.reading)
		if kept.mol.Text != an.key.text || !reflect.DeepEqual(kept.mol.Atoms, want.Atoms) || !reflect.DeepEqual(kept.mol.Bonds, want.Bonds) {
			t.Fatalf("record %d (%q): the kept molecule is %q", i, an.key.text, kept.mol.Text)
		}
	}
	if pinned < 2 {
		t.Fatalf("%d pinned analyses, want several", pinned)
	}
}

// TestUnmarkedCentreExplainedAfterFirstReading checks that the first
// reading of a list, which ranks no unmarked unit's ligands
// (stereo.Options.FindingsOnly), leaves nothing less for the requests:
// the hover of the unmarked centre of butan-2-ol (common practice: C2
// is a stereocentre, O > C3 > C1 > H) names the CIP priority of its
// ligands, as an analysis of the record alone does.
func TestUnmarkedCentreExplainedAfterFirstReading(t *testing.T) {
	text := "C[C@H](O)CC marked\nCC(O)CC unmarked\nC[C@@H](O)CC mirror\n"
	res := NewAnalyzer(DefaultConfig()).Analyze("explain.smi", "", []byte(text))
	line := strings.Index(text, "CC(O)CC")
	got, _, ok := res.Hover(line + 1)
	if !ok || !strings.Contains(got, "CIP priority: O") {
		t.Fatalf("hover of the unmarked centre: %t %q, want its CIP priority", ok, got)
	}
	alone := NewAnalyzer(DefaultConfig()).Analyze("alone.smi", "", []byte("CC(O)CC\n"))
	want, _, _ := alone.Hover(1)
	// the part on the unit; what follows names the record and its list
	got, _, _ = strings.Cut(got, "\n---")
	want, _, _ = strings.Cut(want, "\n---")
	if got != want {
		t.Errorf("hover in the list:\n%s\nalone:\n%s", got, want)
	}
	var unit *stereo.Unit
	for k := range res.Records[1].Stereo().Units {
		if u := &res.Records[1].Stereo().Units[k]; u.Centre == 1 {
			unit = u
		}
	}
	if unit == nil || len(unit.Ranked) != 4 {
		t.Errorf("the unmarked centre's unit: %+v, want four ranked ligands", unit)
	}
}

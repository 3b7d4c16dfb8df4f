package stereo

import (
	"fmt"
	"strings"
	"testing"
	"time"

	"stereoline/notation"
)

// ladder writes a ladder of n fused four-membered rings: a top row
// t0..tn, a bottom row b0..bn, and rungs t_i-b_i, as one path
// t0..tn bn..b0 with the rungs as ring closures. tail is written on tn.
func ladder(n int, tail string) string {
	var b strings.Builder
	for i := 0; i <= n; i++ {
		b.WriteString("C")
		if i < n {
			fmt.Fprintf(&b, "%%%d", 10+i)
		}
		if i == n && tail != "" {
			b.WriteString("(" + tail + ")")
		}
	}
	for i := n; i >= 0; i-- {
		b.WriteString("C")
		if i < n {
			fmt.Fprintf(&b, "%%%d", 10+i)
		}
	}
	return b.String()
}

// dendrimer writes a tree where every carbon carries three branches, to
// the given depth; leaf is written at the last leaf.
func dendrimer(depth int, leaf string) string {
	if depth == 0 {
		return "C" + leaf
	}
	sub := dendrimer(depth-1, "")
	return "C(" + sub + ")(" + sub + ")" + dendrimer(depth-1, leaf)
}

var hostileCases = []struct{ name, smiles string }{
	// a stereocentre between two ladders of 40 fused rings that differ
	// only at their far ends
	{"ladders", "O[C@H](" + ladder(40, "F") + ")" + ladder(40, "Cl")},
	// cubane (VS009 of the validation suite) and adamantane with every
	// atom marked; the CH2 marks of adamantane cannot apply
	{"cubane", "[C@@H]12[C@H]3[C@H]4[C@@H]1[C@@H]5[C@H]4[C@H]3[C@H]25"},
	{"adamantane", "[C@H2]1[C@H]2[C@H2][C@H]3[C@H2][C@@H]1[C@H2][C@@H]([C@H2]2)[C@H2]3"},
	// a dendrimer of depth 6 (729 leaves) around one centre whose two
	// big branches differ at a single leaf
	{"dendrimer", "O[C@H](" + dendrimer(6, "") + ")" + dendrimer(6, "F")},
}

// TestHostile checks that pathological inputs come back with a result,
// and that a unit left undetermined by the node cap says so.
func TestHostile(t *testing.T) {
	for _, c := range hostileCases {
		t.Run(c.name, func(t *testing.T) {
			m := notation.Read(c.smiles)
			if len(m.Atoms) == 0 {
				t.Fatalf("reader returned no atoms")
			}
			a := Analyze(m)
			if a == nil {
				t.Fatal("no analysis")
			}
			undetermined := 0
			for _, u := range a.Units {
				if u.Descriptor == DescUndetermined {
					undetermined++
				}
			}
			diag := 0
			for _, e := range a.Diagnostics {
				if e.Code == CodeUndetermined {
					diag++
				}
			}
			if undetermined > 0 && diag == 0 {
				t.Errorf("%d units undetermined without a diagnostic", undetermined)
			}
			t.Logf("%d atoms, %d units (%d undetermined), %d diagnostics", len(m.Atoms), len(a.Units), undetermined, len(a.Diagnostics))
		})
	}
}

func BenchmarkHostile(b *testing.B) {
	for _, c := range hostileCases {
		m := notation.Read(c.smiles)
		b.Run(c.name, func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				Analyze(m)
			}
		})
	}
}

// TestNodeCap forces the cap on a small digraph budget: the centre
// between the two ladders must come back undetermined, with a diagnostic
// on its mark, instead of a label or a hang.
func TestNodeCap(t *testing.T) {
	smi := "O[C@H](" + ladder(40, "F") + ")" + ladder(40, "Cl")
	a := AnalyzeWith(notation.Read(smi), Options{NodeCap: 200})
	var centre *Unit
	for i := range a.Units {
		if a.Units[i].Centre == 1 {
			centre = &a.Units[i]
		}
	}
	if centre == nil || centre.Descriptor != DescUndetermined {
		t.Fatalf("centre: got %+v, want an undetermined unit", centre)
	}
	found := false
	for _, e := range a.Diagnostics {
		if e.Code == CodeUndetermined && e.Span.Overlaps(centre.Marks[0]) {
			found = true
		}
	}
	if !found {
		t.Errorf("no %s diagnostic on the mark; got %v", CodeUndetermined, a.Diagnostics)
	}
	// with shorter ladders the default cap reaches the far ends, and
	// the difference there decides (Cl > F, Rule 1a)
	short := "O[C@H](" + ladder(6, "F") + ")" + ladder(6, "Cl")
	for _, u := range Analyze(notation.Read(short)).Units {
		if u.Centre == 1 && !u.Descriptor.Labelled() {
			t.Errorf("six-ring ladders: centre left %v", u.Descriptor)
		}
	}
}

// The hostile records of issue 13, built at any size. The same records
// are written to files by testdata/hostile/gen.py for the whole-pipeline
// measurements of testdata/hostile/run.sh.

// chainMarks writes a chain of n marked centres, [C@H](F) repeated.
func chainMarks(n int) string { return strings.Repeat("[C@H](F)", n) }

// smallRings writes a chain of n three-membered rings.
func smallRings(n int) string { return strings.Repeat("C%10CC%10", n) }

// fusedLadder writes n fused six-membered rings: a top row t0..tn and a
// bottom row b0..bn joined by rungs t_i-b_i, one CH2 between
// neighbouring fusion atoms of each row, written as one path (the top
// row, then the bottom row back) with the rungs as ring closures. When
// marked, every fusion atom but the four at the ends (CH2 groups) is
// marked, the hands alternating.
func fusedLadder(n int, marked bool) string {
	if n >= 90 {
		panic("fusedLadder: one ring number per rung, at most 89")
	}
	fusion := func(i int, hand bool) string {
		switch {
		case !marked || i == 0 || i == n:
			return "C"
		case hand:
			return "[C@H]"
		}
		return "[C@@H]"
	}
	var b strings.Builder
	for i := 0; i <= n; i++ {
		b.WriteString(fusion(i, i%2 == 0))
		if i < n {
			fmt.Fprintf(&b, "%%%dC", 10+i)
		}
	}
	for i := n; i >= 0; i-- {
		b.WriteString(fusion(i, i%2 == 1))
		if i < n {
			fmt.Fprintf(&b, "%%%d", 10+i)
		}
		if i > 0 {
			b.WriteString("C")
		}
	}
	return b.String()
}

// sheet writes a saturated honeycomb of rows×cols carbons with every
// atom marked: a brick wall, atom (r, c) bonded to its row neighbours
// and to (r+1, c) when r+c is even. Rows are chains joined by '.', the
// bonds between rows ring closures (at most cols open at a time).
func sheet(rows, cols int) string {
	var free []int
	for n := 99; n >= 10; n-- {
		free = append(free, n)
	}
	down := map[[2]int]int{}
	var b strings.Builder
	for r := 0; r < rows; r++ {
		if r > 0 {
			b.WriteByte('.')
		}
		for c := 0; c < cols; c++ {
			if (r*cols+c)%3 != 0 {
				b.WriteString("[C@H]")
			} else {
				b.WriteString("[C@@H]")
			}
			if n, ok := down[[2]int{r - 1, c}]; ok {
				delete(down, [2]int{r - 1, c})
				fmt.Fprintf(&b, "%%%d", n)
				free = append(free, n)
			}
			if r+1 < rows && (r+c)%2 == 0 {
				n := free[len(free)-1]
				free = free[:len(free)-1]
				down[[2]int{r, c}] = n
				fmt.Fprintf(&b, "%%%d", n)
			}
		}
	}
	return b.String()
}

// hostileRecords are the records of issue 13 at the sizes it names.
var hostileRecords = []struct {
	name   string
	smiles func() string
}{
	{"chain-marks-2000", func() string { return chainMarks(2000) }},
	{"chain-marks-4000", func() string { return chainMarks(4000) }},
	{"chain-marks-8000", func() string { return chainMarks(8000) }},
	{"chain-marks-50000", func() string { return chainMarks(50000) }},
	{"small-rings-8000", func() string { return smallRings(8000) }},
	{"small-rings-20000", func() string { return smallRings(20000) }},
	{"fused-ladder-20", func() string { return fusedLadder(20, true) }},
	{"fused-ladder-40", func() string { return fusedLadder(40, true) }},
	{"fused-ladder-80", func() string { return fusedLadder(80, true) }},
	{"sheet-30x30", func() string { return sheet(30, 30) }},
	{"chain-1000000", func() string { return strings.Repeat("C", 1000000) }},
	{"nested-100000", func() string {
		return strings.Repeat("C(", 100000) + "C" + strings.Repeat(")", 100000)
	}},
}

// BenchmarkHostileRecords reads and analyses each hostile record of
// issue 13 under the engine's default budget (GOMAXPROCS=1 for the
// figures in the report).
func BenchmarkHostileRecords(b *testing.B) {
	for _, c := range hostileRecords {
		text := c.smiles()
		b.Run(c.name, func(b *testing.B) {
			for b.Loop() {
				AnalyzeWith(notation.Read(text), Options{Budget: DefaultBudget})
			}
		})
	}
}

// TestHostileRecords analyses each hostile record of issue 13 under the
// engine's default limits and checks the answer: every marked unit comes back
// (labelled, or undetermined with a finding that says why), and the
// findings stay few.
func TestHostileRecords(t *testing.T) {
	for _, c := range hostileRecords {
		if testing.Short() && strings.HasSuffix(c.name, "000") {
			continue
		}
		t.Run(c.name, func(t *testing.T) {
			text := c.smiles()
			m := notation.Read(text)
			a := AnalyzeWith(m, Options{Budget: DefaultBudget})
			marks := 0
			for i := range m.Atoms {
				if m.Atoms[i].Chirality.Class != notation.ChiralNone {
					marks++
				}
			}
			labelled, undetermined := 0, 0
			for _, u := range a.Units {
				switch {
				case u.Descriptor == DescUndetermined:
					undetermined++
				case u.Specified && u.Descriptor.Labelled():
					labelled++
				}
			}
			codes := map[notation.Code]int{}
			for _, e := range a.Diagnostics {
				codes[e.Code]++
				if strings.HasPrefix(e.Msg, "internal error") {
					t.Fatalf("%v", e)
				}
			}
			if undetermined > 0 && codes[CodeBudget] == 0 && codes[CodeUndetermined] == 0 {
				t.Errorf("%d units undetermined without a finding", undetermined)
			}
			if codes[CodeBudget] > 1 {
				t.Errorf("%d budget findings, want at most one", codes[CodeBudget])
			}
			// a marked centre is labelled, left undetermined, or reported
			// as no centre (impossible or ineffective marks)
			if got := labelled + undetermined + codes[CodeImpossibleCenter] + codes[CodeIneffectiveCenter]; got < marks {
				t.Errorf("%d marks but %d labelled, %d undetermined, %v", marks, labelled, undetermined, codes)
			}
			t.Logf("%d atoms, %d marks: %d labelled, %d undetermined; findings %v", len(m.Atoms), marks, labelled, undetermined, codes)
		})
	}
}

// TestBudgetKeepsDecidedLabels labels a chain of marked centres without
// a budget and again with a budget too short for all of them: every
// centre labelled within the budget has the label the unlimited run
// gives, the rest are undetermined, and one finding on the first of
// them says so, listing the others as related places.
func TestBudgetKeepsDecidedLabels(t *testing.T) {
	m := notation.Read(chainMarks(400))
	full := AnalyzeWith(m, Options{Budget: -1})
	want := map[int]Descriptor{}
	for _, u := range full.Units {
		if !u.Descriptor.Labelled() {
			t.Fatalf("unlimited: centre %d left %v", u.Centre, u.Descriptor)
		}
		want[u.Centre] = u.Descriptor
	}
	for _, e := range full.Diagnostics {
		if e.Code == CodeBudget {
			t.Fatalf("unlimited: %v", e)
		}
	}
	for _, budget := range []time.Duration{time.Nanosecond, 2 * time.Millisecond} {
		a := AnalyzeWith(m, Options{Budget: budget})
		var first notation.Span
		skipped := 0
		for _, u := range a.Units {
			switch u.Descriptor {
			case DescUndetermined:
				if skipped == 0 {
					first = u.Marks[0]
				}
				skipped++
			case want[u.Centre]:
			default:
				t.Errorf("budget %v: centre %d labelled %v, unlimited %v", budget, u.Centre, u.Descriptor, want[u.Centre])
			}
		}
		if len(a.Units) != len(full.Units) {
			t.Errorf("budget %v: %d units, unlimited %d", budget, len(a.Units), len(full.Units))
		}
		var found []*notation.Error
		for _, e := range a.Diagnostics {
			if e.Code == CodeBudget {
				found = append(found, e)
			}
		}
		switch {
		case skipped == 0:
			t.Logf("budget %v: the machine labelled all centres in time", budget)
		case len(found) != 1:
			t.Errorf("budget %v: %d centres skipped, budget findings %v", budget, skipped, found)
		case found[0].Span != first:
			t.Errorf("budget %v: finding at %v, first skipped mark at %v", budget, found[0].Span, first)
		case len(found[0].Related) != min(skipped-1, maxBudgetRelated):
			t.Errorf("budget %v: %d related places for %d skipped centres", budget, len(found[0].Related), skipped)
		}
		if budget == time.Nanosecond && skipped != len(want) {
			t.Errorf("a spent budget labelled %d centres", len(want)-skipped)
		}
	}
}

// TestBudgetUnmarked spends the budget before perception: a record
// without marks gets one finding on its first atom.
func TestBudgetUnmarked(t *testing.T) {
	m := notation.Read(smallRings(50))
	a := AnalyzeWith(m, Options{Budget: time.Nanosecond})
	var found []*notation.Error
	for _, e := range a.Diagnostics {
		if e.Code == CodeBudget {
			found = append(found, e)
		}
		if e.Code == CodeUndefined {
			t.Errorf("perception ran after the budget: %v", e)
		}
	}
	if len(found) != 1 || found[0].Span != m.Atoms[0].Span {
		t.Errorf("budget findings %v, want one on the first atom %v", found, m.Atoms[0].Span)
	}
	// without a budget the ring centres are found: two on each
	// ring but the end rings, whose two CH2 groups are equal
	undefined := 0
	for _, e := range Analyze(m).Diagnostics {
		if e.Code == CodeUndefined {
			undefined++
		}
	}
	if undefined != 2*(50-2) {
		t.Errorf("%d unmarked centres reported, want %d", undefined, 2*(50-2))
	}
}

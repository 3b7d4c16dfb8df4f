package stereo

import (
	"bufio"
	"os"
	"path/filepath"
	"sort"
	"strconv"
	"strings"
	"testing"
	"time"

	"stereoline/notation"
)

// The CIP validation suite of Hanson et al., J. Chem. Inf. Model. 2018,
// 58, 1755 (CIPValidationSuite/ValidationSuite, compounds.smi), kept in
// the shared reference directory beside the repository.
var suitePath = filepath.Join("..", "..", "shared", "reference", "cip-validation-suite", "compounds.smi")

// suiteReading is the reading the suite's strings were written for: the
// lone pair in the hydrogen's slot. Three strings depend on it, each a
// nitrogen bridgehead with one ring-closure digit and single bonds
// (VS128, VS129, VS132); read with the lone pair last (the default, as
// RDKit reads it) their bridgeheads cannot exist and VS132 (Tröger's
// base) loses its published labels 6S 14S. TestValidationSuiteReading
// checks that this is so.
var suiteReading = notation.Reading{LonePair: notation.LonePairHydrogenSlot}

type suiteCase struct {
	smiles, id string
	want       []string
	kinds      string
	rules      string
}

func readSuite(t testing.TB) []suiteCase {
	f, err := os.Open(suitePath)
	if err != nil {
		t.Skipf("CIP validation suite not found at %s: %v", suitePath, err)
	}
	defer f.Close()
	var out []suiteCase
	sc := bufio.NewScanner(f)
	sc.Buffer(make([]byte, 1<<20), 1<<20)
	for sc.Scan() {
		cols := strings.Split(sc.Text(), "\t")
		if len(cols) < 2 {
			continue
		}
		c := suiteCase{smiles: cols[0], id: cols[1]}
		if len(cols) > 2 {
			c.want = strings.Fields(cols[2])
		}
		if len(cols) > 4 {
			c.kinds = cols[4]
		}
		if len(cols) > 5 {
			c.rules = cols[5]
		}
		// M/P labels of atropisomers and helicenes come from 3D
		// coordinates the notation does not carry (suite README)
		if strings.Contains(c.kinds, "AT") || strings.Contains(c.kinds, "HE") {
			var keep []string
			for _, w := range c.want {
				if l := w[len(w)-1]; l != 'M' && l != 'P' && l != 'm' && l != 'p' {
					keep = append(keep, w)
				}
			}
			c.want = keep
		}
		sort.Strings(c.want)
		out = append(out, c)
	}
	return out
}

// labelSet renders an analysis the way the suite writes labels: 1-based
// atom numbers, both atoms of a double bond or of an allene's ends.
func labelSet(a *Analysis) []string {
	var out []string
	for _, u := range a.Units {
		if !u.Descriptor.Labelled() {
			continue
		}
		for _, at := range u.Atoms {
			out = append(out, strconv.Itoa(at+1)+u.Descriptor.String())
		}
	}
	sort.Strings(out)
	return out
}

func TestValidationSuite(t *testing.T) {
	cases := readSuite(t)
	pass := 0
	var fails []string
	for _, c := range cases {
		m := notation.ReadWith(c.smiles, suiteReading)
		start := time.Now()
		a := Analyze(m)
		if el := time.Since(start); el > 200*time.Millisecond {
			t.Logf("%s took %v", c.id, el)
		}
		got := labelSet(a)
		if strings.Join(got, " ") == strings.Join(c.want, " ") {
			pass++
			continue
		}
		fails = append(fails, c.id+" ["+c.rules+"] want "+strings.Join(c.want, " ")+" got "+strings.Join(got, " ")+"  "+c.smiles)
	}
	t.Logf("CIP validation suite: %d/%d compounds exact", pass, len(cases))
	failed := map[string]bool{}
	for _, f := range fails {
		id := f[:strings.IndexByte(f, ' ')]
		failed[id] = true
		if why, ok := knownSuiteFailures[id]; ok {
			t.Logf("known: %s (%s)", f, why)
			continue
		}
		t.Errorf("%s", f)
	}
	for id := range knownSuiteFailures {
		if !failed[id] {
			t.Errorf("%s now passes: take it off the known failures", id)
		}
	}
}

// TestValidationSuiteReading finds which lone-pair reading the suite's
// strings were written for, from their published labels and from their
// bridgeheads being possible: every compound is read under both rules of
// notation.Reading. Under the hydrogen slot every compound gets its
// published labels with no error; under the default (lone pair last, as
// RDKit 2022.09.3 and @rdkit/rdkit read it) exactly the three compounds
// whose marks depend on the rule differ, each with a
// stereo-reader-dependent finding that says so. No compound is right
// under the default only.
func TestValidationSuiteReading(t *testing.T) {
	cases := readSuite(t)
	// how the compound reads: its labels and whether a mark is impossible
	outcome := func(c suiteCase, r notation.Reading) (exact, clean, flagged bool) {
		a := Analyze(notation.ReadWith(c.smiles, r))
		exact = strings.Join(labelSet(a), " ") == strings.Join(c.want, " ")
		clean = true
		for _, e := range a.Diagnostics {
			clean = clean && e.Severity != notation.SeverityError
			flagged = flagged || e.Code == CodeReaderDependent
		}
		return exact, clean, flagged
	}
	var differ []string
	slotRight := 0
	for _, c := range cases {
		se, sc, _ := outcome(c, suiteReading)
		de, dc, flagged := outcome(c, notation.DefaultReading)
		if se && sc {
			slotRight++
		}
		if se == de && sc == dc {
			continue
		}
		differ = append(differ, c.id)
		if !flagged {
			t.Errorf("%s reads differently under the two lone-pair rules but carries no %s finding: %s", c.id, CodeReaderDependent, c.smiles)
		}
		if de && dc && !(se && sc) {
			t.Errorf("%s is right under the default reading only: %s", c.id, c.smiles)
		}
		t.Logf("%s: with the lone pair in the hydrogen's slot exact=%v no error=%v; with the lone pair last exact=%v no error=%v  %s", c.id, se, sc, de, dc, c.smiles)
	}
	if slotRight != len(cases) {
		t.Errorf("hydrogen slot: %d/%d compounds exact and free of errors", slotRight, len(cases))
	}
	if want := []string{"VS128", "VS129", "VS132"}; strings.Join(differ, " ") != strings.Join(want, " ") {
		t.Errorf("compounds that depend on the lone-pair reading: %v, want %v", differ, want)
	}
}

// knownSuiteFailures are the compounds this engine still labels
// differently from the suite, with what is understood of why. The issue
// stays open while this list is not empty.
var knownSuiteFailures = map[string]string{}

// TestValidationSuiteMarks checks the other half of the suite's README:
// a mark on a unit with no expected label must be reported as
// ineffective, and a labelled unit must not be.
func TestValidationSuiteMarks(t *testing.T) {
	cases := readSuite(t)
	bad := 0
	for _, c := range cases {
		m := notation.ReadWith(c.smiles, suiteReading)
		a := Analyze(m)
		labelled := map[int]bool{}
		for _, w := range c.want {
			n, _ := strconv.Atoi(strings.TrimRight(w, "RSrsEZezMPmp"))
			labelled[n-1] = true
		}
		ineffective := func(sp notation.Span, code notation.Code) bool {
			for _, e := range a.Diagnostics {
				if e.Code == code && e.Span.Overlaps(sp) {
					return true
				}
			}
			return false
		}
		for i := range m.Atoms {
			ch := m.Atoms[i].Chirality
			if ch.Class == notation.ChiralNone {
				continue
			}
			if _, ok := l0(m, i); ok && !labelled[i] {
				// extended tetrahedral marks are labelled on the terminals
				continue
			}
			has := ineffective(ch.Span, CodeIneffectiveCenter)
			if labelled[i] == has {
				bad++
				t.Errorf("%s: atom %d labelled=%v but ineffective-center=%v  %s", c.id, i+1, labelled[i], has, c.smiles)
			}
		}
		// the suite's structures are real: no mark in them is impossible
		// or contradictory
		for _, e := range a.Diagnostics {
			if e.Severity == notation.SeverityError {
				bad++
				t.Errorf("%s: %v  %s", c.id, e, c.smiles)
			}
		}
		for bi := range m.Bonds {
			b := &m.Bonds[bi]
			if b.Dir == notation.DirNone && b.CloseDir == notation.DirNone {
				continue
			}
			// the double bond this mark belongs to is labelled when the
			// marked atom's neighbour across it is
			anyLabelled := labelled[b.Begin] || labelled[b.End]
			if anyLabelled {
				if ineffective(m.MarkSpan(bi), CodeIneffectiveBond) {
					bad++
					t.Errorf("%s: mark on bond %d-%d of a labelled unit reported ineffective  %s", c.id, b.Begin+1, b.End+1, c.smiles)
				}
			}
		}
	}
	if bad > 0 {
		t.Logf("%d marks misreported", bad)
	}
}

// l0 reports whether atom a is the centre of an allene-type unit.
func l0(m *notation.Molecule, a int) (int, bool) {
	g := newGraph(m)
	_, _, ok := g.alleneEnds(a)
	return a, ok
}

// TestSuitePerceivedUnmarked checks perception against the validation
// suite: with every mark removed, each unit the suite compound has when
// marked is still found (and reported as undefined), and no other unit
// appears; units that exist only through configurations written
// elsewhere (their ranking needed Rules 3 to 5) are the exception.
// Compounds whose marks are impossible are left out.
func TestSuitePerceivedUnmarked(t *testing.T) {
	cases := readSuite(t)
	bad := 0
	for _, c := range cases {
		lost, gained, _ := marksAndPerception(c.smiles)
		bad += len(lost) + len(gained)
		for _, k := range gained {
			t.Errorf("%s %s: unit %s not found without the marks", c.id, c.smiles, k)
		}
		for _, k := range lost {
			t.Errorf("%s %s: unit %s found without the marks only", c.id, c.smiles, k)
		}
	}
	t.Logf("%d compounds: %d units perceived differently with and without marks", len(cases), bad)
}

package readings_test

import (
	"bufio"
	"fmt"
	"os"
	"path/filepath"
	"slices"
	"sort"
	"strconv"
	"strings"
	"testing"

	"stereoline/notation"
	"stereoline/stereo"
)

// The survey: testdata/survey/survey.tsv, made by
// testdata/survey/gen_survey.py with RDKit 2022.09.3 (Debian's
// python3-rdkit), the npm package @rdkit/rdkit and Open Babel 3.1.1
// (Debian's python3-openbabel); the versions are in the file's header. Each
// row is one writing of a structure with each library's configuration of
// every stereo element, in one form (see configuration below).
var surveyPath = filepath.Join("..", "..", "testdata", "survey", "survey.tsv")

// The libraries of the survey, by their names in the fixture.
const (
	rdkit     = "rdkit-2022.09.3"
	rdkitJS   = "rdkit-js"
	openBabel = "openbabel"
)

var libraries = []string{rdkit, rdkitJS, openBabel}

// reading says, for one construct of testdata/survey/constructs.tsv and one
// library, whether Stereoline reads the construct as that library does
// under one reader setting.
type reading struct {
	construct string
	library   string
	setting   string
	same      bool
	// refused: Stereoline reports a notation error where the library
	// reads the construct
	refused bool
}

// The reader settings (notation.Reading), named by the libraries whose
// readings they are: the default reads the open constructs as both RDKit
// releases do, the other as Open Babel does.
const (
	settingRDKit     = "lonePair=last ringMarks=closing"
	settingOpenBabel = "lonePair=hydrogen-slot ringMarks=dropped"
)

// settings lists the reader settings the survey is checked under, by
// the name of their notation.Reading; the first is the default.
var settings = []string{settingRDKit, settingOpenBabel}

// readingOf returns the notation.Reading a setting names.
func readingOf(t testing.TB, setting string) notation.Reading {
	for _, r := range notation.Readings() {
		if r.String() == setting {
			return r
		}
	}
	t.Fatalf("reader setting %q is not a notation.Reading", setting)
	return notation.Reading{}
}

// readingTable lists, for the constructs on which the surveyed readers
// part, whether Stereoline reads each as each library does, under each
// setting. Constructs every reader surveyed reads alike (first-atom
// hydrogen, a lone-pair centre after its preceding atom without ring
// digits, ring digits on a centre with a hydrogen, [H] atoms, a mark on
// one ring-closure digit, shared marks, marks between aromatic atoms,
// ...) are not listed: any difference there fails the test, as does a
// row saying "differs" that no writing bears out.
var readingTable = []reading{
	// OpenSMILES 3.8.2 says where a bracket hydrogen stands, not a lone
	// pair. By default Stereoline puts it last and, on a centre with
	// single bonds only, inverts the result once more for each ring
	// digit, as RDKit does; with lonePair=hydrogen-slot it puts it where
	// the hydrogen would be (right after the preceding atom, first when
	// the centre starts its part), as Open Babel does.
	{"first-atom-lone-pair", rdkit, settingRDKit, true, false},
	{"first-atom-lone-pair", rdkitJS, settingRDKit, true, false},
	{"first-atom-lone-pair", openBabel, settingRDKit, false, false},
	{"first-atom-lone-pair-ring-digit", rdkit, settingRDKit, true, false},
	{"first-atom-lone-pair-ring-digit", rdkitJS, settingRDKit, true, false},
	{"first-atom-lone-pair-ring-digit", openBabel, settingRDKit, false, false},
	{"lone-pair-ring-digit", rdkit, settingRDKit, true, false},
	{"lone-pair-ring-digit", rdkitJS, settingRDKit, true, false},
	{"lone-pair-ring-digit", openBabel, settingRDKit, false, false},
	{"first-atom-lone-pair", rdkit, settingOpenBabel, false, false},
	{"first-atom-lone-pair", rdkitJS, settingOpenBabel, false, false},
	{"first-atom-lone-pair", openBabel, settingOpenBabel, true, false},
	{"first-atom-lone-pair-ring-digit", rdkit, settingOpenBabel, false, false},
	{"first-atom-lone-pair-ring-digit", rdkitJS, settingOpenBabel, false, false},
	{"first-atom-lone-pair-ring-digit", openBabel, settingOpenBabel, true, false},
	{"lone-pair-ring-digit", rdkit, settingOpenBabel, false, false},
	{"lone-pair-ring-digit", rdkitJS, settingOpenBabel, false, false},
	{"lone-pair-ring-digit", openBabel, settingOpenBabel, true, false},
	// The same direction mark on both digits of a ring closure
	// (OpenSMILES 3.4 against 3.8.3): RDKit lets the closing digit
	// decide (ringMarks=closing, the default), Open Babel drops the pair
	// and lets the other marks decide (ringMarks=dropped).
	{"ring-mark-both-same", rdkit, settingRDKit, true, false},
	{"ring-mark-both-same", rdkitJS, settingRDKit, true, false},
	{"ring-mark-both-same", openBabel, settingRDKit, false, false},
	{"ring-mark-both-same", rdkit, settingOpenBabel, false, false},
	{"ring-mark-both-same", rdkitJS, settingOpenBabel, false, false},
	{"ring-mark-both-same", openBabel, settingOpenBabel, true, false},
	// '@' on an allene (OpenSMILES 3.8.4): read by Stereoline under
	// every setting, dropped by every library surveyed (no setting
	// drops it: the standard is clear, and the CIP validation suite
	// publishes M/P labels for such marks).
	{"allene", rdkit, settingRDKit, false, false},
	{"allene", rdkitJS, settingRDKit, false, false},
	{"allene", openBabel, settingRDKit, false, false},
	{"allene", rdkit, settingOpenBabel, false, false},
	{"allene", rdkitJS, settingOpenBabel, false, false},
	{"allene", openBabel, settingOpenBabel, false, false},
	// A ring digit after a branch is outside the grammar (OpenSMILES
	// 2.2); Stereoline warns (ring-after-branch) and, like every library
	// surveyed, reads the digit where it stands, under every setting.
	{"ring-digit-after-branch", rdkit, settingRDKit, true, false},
	{"ring-digit-after-branch", rdkitJS, settingRDKit, true, false},
	{"ring-digit-after-branch", openBabel, settingRDKit, true, false},
	{"ring-digit-after-branch", rdkit, settingOpenBabel, true, false},
	{"ring-digit-after-branch", rdkitJS, settingOpenBabel, true, false},
	{"ring-digit-after-branch", openBabel, settingOpenBabel, true, false},
}

// settingLibraries names, for each setting, the libraries whose reading
// it is: under it, every construct but '@' on an allene must read as
// they read it (TestSurveySettingsNameTheirLibraries).
var settingLibraries = map[string][]string{
	settingRDKit:     {rdkit, rdkitJS},
	settingOpenBabel: {openBabel},
}

// row is one line of the survey.
type row struct {
	structure, writing, writer, smiles string
	constructs                         map[string][]string          // element -> constructs
	config                             map[string]map[string]string // library -> element -> key
	rejected                           map[string]bool
	labels                             map[string][]string
	classes                            map[string][]string
}

func readSurvey(t testing.TB) []row {
	f, err := os.Open(surveyPath)
	if err != nil {
		t.Skipf("survey fixture not found at %s (made by testdata/survey/gen_survey.py): %v", surveyPath, err)
	}
	defer f.Close()
	var rows []row
	sc := bufio.NewScanner(f)
	sc.Buffer(make([]byte, 1<<20), 1<<20)
	for sc.Scan() {
		line := sc.Text()
		if line == "" || strings.HasPrefix(line, "#") {
			continue
		}
		c := strings.Split(line, "\t")
		if len(c) != 16 {
			t.Fatalf("survey row with %d columns: %q", len(c), line)
		}
		r := row{structure: c[0], writing: c[1], writer: c[2], smiles: c[3],
			constructs: parseElements(c[4]), config: map[string]map[string]string{},
			rejected: map[string]bool{}, labels: map[string][]string{}, classes: parseElements(c[15])}
		for i, lib := range libraries {
			cfg, lab := c[6+i], c[12+i]
			if cfg == "=" {
				cfg = c[6]
			}
			if lab == "=" {
				lab = c[12]
			}
			r.rejected[lib] = cfg == "!"
			r.config[lib] = parseConfig(cfg)
			r.labels[lib] = strings.Fields(lab)
		}
		rows = append(rows, r)
	}
	if err := sc.Err(); err != nil {
		t.Fatal(err)
	}
	return rows
}

// parseElements reads "a3:x,y b4-5:z" into a map.
func parseElements(s string) map[string][]string {
	out := map[string][]string{}
	for _, f := range strings.Fields(s) {
		el, names, ok := strings.Cut(f, ":")
		if !ok {
			continue
		}
		out[el] = strings.Split(names, ",")
	}
	return out
}

// parseConfig reads "a3@ a7@@ b4-5t" into element -> key.
func parseConfig(s string) map[string]string {
	out := map[string]string{}
	if s == "!" {
		return out
	}
	for _, f := range strings.Fields(s) {
		i := strings.IndexByte(f, '@')
		if f[0] == 'b' {
			i = len(f) - 1
		}
		if i <= 0 {
			continue
		}
		out[f[:i]] = f[i:]
	}
	return out
}

// configuration is Stereoline's reading of a writing in the survey's
// form: for a labelled tetrahedral centre a<atom> the key '@' or '@@'
// says how its neighbours, in increasing atom number with a hydrogen or
// lone pair first, run (OpenSMILES 3.8.2); for a labelled double bond
// b<atom>-<atom> the key 'c' or 't' relates the lowest-numbered heavy
// neighbour of each end; an allene centre has the key "allene". The keys
// come from the CIP labels and ranked ligands of stereo.Analyze, so they
// are the configuration read, whatever the ranking. unlabelled lists
// marked units that got no label (no key can be derived from them);
// rejected is true when the reader reports a notation error.
type configuration struct {
	keys       map[string]string
	unlabelled map[string]string // element -> diagnostic code or "unlabelled"
	// unspecified lists units we find but whose marks, as we read them,
	// fix no configuration (contradicting marks, one-sided marks): a
	// reading, to be compared, not a matter of perception
	unspecified map[string]bool
	conflicting bool // we report contradicting direction marks
	rejected    bool
	labels      []string
}

func readOurs(t testing.TB, smiles, setting string) configuration {
	m := notation.ReadWith(smiles, readingOf(t, setting))
	a := stereo.Analyze(m)
	c := configuration{keys: map[string]string{}, unlabelled: map[string]string{}, unspecified: map[string]bool{},
		rejected: m.Errors.HasErrors()}
	token := func(atom int) int {
		if atom < 0 {
			return -1
		}
		at := m.Atoms[atom]
		if at.Number == 1 && at.Isotope == 0 {
			return -1
		}
		return atom
	}
	for _, u := range a.Units {
		if u.Descriptor.Labelled() {
			for _, at := range u.Atoms {
				c.labels = append(c.labels, strconv.Itoa(at+1)+u.Descriptor.String())
			}
		}
		if !u.Specified {
			if el := unitElement(m, u); el != "" {
				c.unspecified[el] = true
			}
			continue
		}
		switch u.Kind {
		case stereo.KindTetrahedral:
			el := fmt.Sprintf("a%d", u.Centre)
			if !u.Descriptor.Labelled() || len(u.Ranked) != 4 {
				c.unlabelled[el] = "unlabelled"
				continue
			}
			byRank := make([]int, 4)
			for _, l := range u.Ranked {
				byRank[l.Rank-1] = token(l.Atom)
			}
			// R (and r): clockwise with the lowest ligand away from the
			// viewer, so anticlockwise seen from the lowest ligand
			list := []int{byRank[3], byRank[0], byRank[1], byRank[2]}
			anti := u.Descriptor == stereo.DescR || u.Descriptor == stereo.DescPseudoR
			if k := centreKey(list, anti); k != "" {
				c.keys[el] = k
			}
		case stereo.KindDoubleBond:
			x, y := u.Atoms[0], u.Atoms[1]
			if m.BondBetween(x, y) < 0 {
				continue // a cumulene: its ends are not bonded
			}
			lo, hi := x, y
			if lo > hi {
				lo, hi = hi, lo
			}
			el := fmt.Sprintf("b%d-%d", lo, hi)
			if !u.Descriptor.Labelled() {
				c.unlabelled[el] = "unlabelled"
				continue
			}
			first := [2]int{-2, -2}
			for _, l := range u.Ranked {
				if l.Rank == 1 && l.End >= 0 && l.End < 2 {
					first[l.End] = token(l.Atom)
				}
			}
			cis := u.Descriptor == stereo.DescZ || u.Descriptor == stereo.DescPseudoZ
			for e, end := range []int{x, y} {
				if first[e] != lowestHeavy(m, end, u.Atoms[1-e], token) {
					cis = !cis
				}
			}
			if cis {
				c.keys[el] = "c"
			} else {
				c.keys[el] = "t"
			}
		case stereo.KindAllene:
			c.keys[fmt.Sprintf("a%d", u.Centre)] = "allene"
		}
	}
	for _, d := range a.Diagnostics {
		c.conflicting = c.conflicting || d.Code == stereo.CodeConflictingMarks
	}
	// marks that make no unit: say why, by the diagnostic at the atom
	for _, d := range a.Diagnostics {
		for i, at := range m.Atoms {
			// the diagnostic covers the atom or lies inside it (the mark)
			if at.Chirality.Class == notation.ChiralNone || d.Span.End <= at.Span.Start || d.Span.Start >= at.Span.End {
				continue
			}
			el := fmt.Sprintf("a%d", i)
			if _, ok := c.keys[el]; !ok {
				if _, ok := c.unlabelled[el]; !ok {
					c.unlabelled[el] = string(d.Code)
				}
			}
		}
	}
	sort.Slice(c.labels, func(i, j int) bool { return labelLess(c.labels[i], c.labels[j]) })
	return c
}

// unitElement names a tetrahedral centre or a double bond the survey's
// way; "" for other units.
func unitElement(m *notation.Molecule, u stereo.Unit) string {
	switch u.Kind {
	case stereo.KindTetrahedral:
		return fmt.Sprintf("a%d", u.Centre)
	case stereo.KindDoubleBond:
		x, y := u.Atoms[0], u.Atoms[1]
		if m.BondBetween(x, y) < 0 {
			return ""
		}
		if x > y {
			x, y = y, x
		}
		return fmt.Sprintf("b%d-%d", x, y)
	}
	return ""
}

func lowestHeavy(m *notation.Molecule, end, other int, token func(int) int) int {
	best := -1
	for _, b := range m.Atoms[end].Bonds {
		n := m.Bonds[b].Other(end)
		if n == other || token(n) < 0 {
			continue
		}
		if best < 0 || n < best {
			best = n
		}
	}
	return best
}

// centreKey: '@' when list (neighbours as seen from the first, the other
// three anticlockwise if anti) is an even permutation of the neighbours in
// increasing order (hydrogen, -1, first), '@@' otherwise; "" unless there
// are four distinct neighbours.
func centreKey(list []int, anti bool) string {
	seen := map[int]bool{}
	for _, v := range list {
		seen[v] = true
	}
	if len(list) != 4 || len(seen) != 4 {
		return ""
	}
	even := true
	for i := range list {
		for j := i + 1; j < len(list); j++ {
			if list[i] > list[j] {
				even = !even
			}
		}
	}
	if even == anti {
		return "@"
	}
	return "@@"
}

func labelLess(a, b string) bool {
	na, _ := strconv.Atoi(strings.TrimRight(a, "RSrsEZezMPmp"))
	nb, _ := strconv.Atoi(strings.TrimRight(b, "RSrsEZezMPmp"))
	if na != nb {
		return na < nb
	}
	return a < b
}

// comparison is what one writing tells about Stereoline and one library.
type comparison struct {
	agree, differ      []string // elements
	ourRejects         bool
	libraryPerception  []string // elements the library keeps no configuration for (fixture class perception:*)
	ourPerception      []string // elements we keep no configuration for: element=reason
	libraryRejects     bool
	unexplainedReading []string
}

// compare reads r and compares Stereoline's configuration with lib's,
// element by element.
func compare(r row, ours configuration, lib string) comparison {
	var c comparison
	if r.rejected[lib] {
		c.libraryRejects = true
		return c
	}
	theirs := r.config[lib]
	if ours.rejected {
		c.ourRejects = true
		return c
	}
	elements := map[string]bool{}
	for el := range theirs {
		elements[el] = true
	}
	for el := range ours.keys {
		elements[el] = true
	}
	for el := range elements {
		o, ok1 := ours.keys[el]
		l, ok2 := theirs[el]
		switch {
		case ok1 && ok2 && o == l:
			c.agree = append(c.agree, el)
		case ok1 && ok2:
			c.differ = append(c.differ, el)
		case ok1 && o == "allene":
			c.differ = append(c.differ, el) // read by us, dropped by the library
		case ok1:
			if hasPerception(r.classes[el]) {
				c.libraryPerception = append(c.libraryPerception, el)
			} else {
				c.differ = append(c.differ, el)
			}
		case ours.unspecified[el] && ours.conflicting:
			// we find the unit and read its contradicting marks as fixing
			// nothing: a reading
			c.differ = append(c.differ, el)
		case ours.unspecified[el]:
			c.ourPerception = append(c.ourPerception, el+"=unspecified")
		default:
			reason, ok := ours.unlabelled[el]
			if !ok {
				reason = "no-unit"
			}
			c.ourPerception = append(c.ourPerception, el+"="+reason)
		}
	}
	sort.Strings(c.agree)
	sort.Strings(c.differ)
	return c
}

func hasPerception(classes []string) bool {
	for _, k := range classes {
		if strings.HasPrefix(k, "perception:") {
			return true
		}
	}
	return false
}

// tableFor returns the rows of readingTable for one setting, by
// (construct, library).
func tableFor(setting string) map[[2]string]reading {
	out := map[[2]string]reading{}
	for _, r := range readingTable {
		if r.setting == setting {
			out[[2]string{r.construct, r.library}] = r
		}
	}
	return out
}

// explainers returns the constructs at an element that the table says we
// read unlike lib.
func explainers(table map[[2]string]reading, names []string, lib string) []string {
	var out []string
	for _, n := range names {
		if r, ok := table[[2]string{n, lib}]; ok && !r.same && !r.refused {
			out = append(out, n)
		}
	}
	return out
}

// refusals returns the constructs of a writing that the table says make
// Stereoline refuse what lib reads.
func refusals(table map[[2]string]reading, names []string, lib string) []string {
	var out []string
	for _, n := range names {
		if r, ok := table[[2]string{n, lib}]; ok && r.refused {
			out = append(out, n)
		}
	}
	return out
}

// TestSurveyReadings checks, for every writing of the survey and every
// library, that Stereoline reads each stereo element as the library does
// except where readingTable says their readings of a construct at that
// element differ, and that every row saying they differ is borne out by
// at least one writing. Units a library keeps no configuration for
// (perception, not reading: amine nitrogens, phosphines, isotopic
// ligands, equivalent ligands) and units Stereoline gives no label are
// counted, not compared.
func TestSurveyReadings(t *testing.T) {
	rows := readSurvey(t)
	for _, setting := range settings {
		table := tableFor(setting)
		// per (construct, library): elements where our reading equals the
		// library's, differs because of this construct, or differs because
		// of another construct at the same element
		type tally struct{ agree, differ, other int }
		stats := map[[2]string]*tally{}
		witnessed := map[[2]string]int{}
		perception := map[string]map[string]int{}
		ourPerception := map[string]int{}
		rejects := map[string]int{}
		var unexplained []string
		labelAgree := map[string]int{}
		for _, r := range rows {
			ours := readOurs(t, r.smiles, setting)
			for _, lib := range libraries {
				if !r.rejected[lib] && strings.Join(ours.labels, " ") == strings.Join(r.labels[lib], " ") {
					labelAgree[lib]++
				}
			}
			var all []string
			for _, names := range r.constructs {
				all = append(all, names...)
			}
			for _, lib := range libraries {
				c := compare(r, ours, lib)
				if c.libraryRejects {
					rejects[lib+" refuses"]++
					continue
				}
				if c.ourRejects {
					why := refusals(table, all, lib)
					if len(why) == 0 {
						unexplained = append(unexplained, fmt.Sprintf("%s %s: we report a notation error, %s reads it", r.structure, r.smiles, lib))
					}
					for _, n := range why {
						witnessed[[2]string{n, lib}]++
					}
					rejects["stereoline refuses"]++
					continue
				}
				count := func(n string) *tally {
					s := stats[[2]string{n, lib}]
					if s == nil {
						s = &tally{}
						stats[[2]string{n, lib}] = s
					}
					return s
				}
				for _, el := range c.agree {
					for _, n := range r.constructs[el] {
						count(n).agree++
					}
				}
				for _, el := range c.differ {
					why := explainers(table, r.constructs[el], lib)
					if len(why) == 0 {
						unexplained = append(unexplained, fmt.Sprintf("%s %s %s: ours %q, %s %q (constructs %v)",
							r.structure, r.smiles, el, ours.keys[el], lib, r.config[lib][el], r.constructs[el]))
					}
					for _, n := range why {
						witnessed[[2]string{n, lib}]++
					}
					for _, n := range r.constructs[el] {
						if slices.Contains(why, n) {
							count(n).differ++
						} else {
							count(n).other++
						}
					}
				}
				for _, el := range c.libraryPerception {
					if perception[lib] == nil {
						perception[lib] = map[string]int{}
					}
					for _, k := range r.classes[el] {
						if strings.HasPrefix(k, "perception:") {
							perception[lib][k]++
						}
					}
				}
				impossible := false
				for _, reason := range ours.unlabelled {
					impossible = impossible || reason == string(stereo.CodeImpossibleCenter)
				}
				for _, e := range c.ourPerception {
					_, reason, _ := strings.Cut(e, "=")
					if reason == "no-unit" && impossible {
						// the partner of a bridgehead we call impossible
						reason = "impossible-bicycle"
					}
					ourPerception[reason]++
				}
			}
		}
		for _, u := range unexplained {
			t.Errorf("setting %q: unexplained difference: %s", setting, u)
		}
		t.Logf("CIP labels (ours from stereo.Analyze, the libraries' from the fixture) equal on %v of %d writings; labellers differ too (RDKit 2022.09.3 matches 254/300 compounds of the CIP validation suite), so the configurations above are what is compared", labelAgree, len(rows))
		for _, r := range readingTable {
			if r.setting != setting || r.same {
				continue
			}
			if witnessed[[2]string{r.construct, r.library}] == 0 {
				t.Errorf("setting %q: readingTable says our reading of %s differs from %s, but no writing of the survey shows it", setting, r.construct, r.library)
			}
		}
		var keys [][2]string
		for k := range stats {
			keys = append(keys, k)
		}
		sort.Slice(keys, func(i, j int) bool {
			if keys[i][0] != keys[j][0] {
				return keys[i][0] < keys[j][0]
			}
			return keys[i][1] < keys[j][1]
		})
		t.Logf("setting %q: %d writings; per construct and library, elements where our reading equals the library's, differs by this construct, differs by another construct there:", setting, len(rows))
		for _, k := range keys {
			s := stats[k]
			t.Logf("  %-34s %-16s %6d equal %5d differ %5d other", k[0], k[1], s.agree, s.differ, s.other)
		}
		t.Logf("writings refused: %v", rejects)
		for _, lib := range libraries {
			t.Logf("units %s keeps no configuration for (perception): %v", lib, perception[lib])
		}
		t.Logf("elements a library configures and Stereoline does not, by our diagnostic: %v", ourPerception)
	}
}

// TestSurveyLabelsAcrossRDKitWritings measures how often Stereoline's labels
// of one structure change with the writing, over the writings RDKit
// 2022.09.3 made (canonical, its seeded random writer, a writing starting
// at a stereocentre, one with all hydrogens as atoms). RDKit writes under
// its own readings, so a label that changes must come from a construct
// Stereoline reads unlike RDKit (readingTable) in one of the writings
// compared; any other change fails. Every changed structure is listed
// with its constructs. Under the default reader setting, which reads the
// open constructs as RDKit does, labels never change across these
// writings: a change fails the test.
func TestSurveyLabelsAcrossRDKitWritings(t *testing.T) {
	rows := readSurvey(t)
	table := tableFor(settingRDKit)
	type writing struct {
		r      row
		labels string
		why    []string
	}
	byStructure := map[string][]writing{}
	var order, changedByWriter []string
	for _, r := range rows {
		if r.writer != "rdkit" {
			continue
		}
		if slices.Contains(r.classes["*"], "writer-changed") {
			// every reader reads another structure here: RDKit's writer
			// changed it (the fixture's header says how this is found)
			changedByWriter = append(changedByWriter, r.structure+" "+r.smiles)
			continue
		}
		ours := readOurs(t, r.smiles, settingRDKit)
		var letters []string
		for _, l := range ours.labels {
			letters = append(letters, l[len(l)-1:])
		}
		sort.Strings(letters)
		var why []string
		for _, names := range r.constructs {
			why = append(why, explainers(table, names, rdkit)...)
		}
		sort.Strings(why)
		if _, ok := byStructure[r.structure]; !ok {
			order = append(order, r.structure)
		}
		byStructure[r.structure] = append(byStructure[r.structure], writing{r, strings.Join(letters, ""), why})
	}
	for _, onlyRandom := range []bool{true, false} {
		changed, total := map[string]int{}, map[string]int{}
		for _, s := range order {
			ws := byStructure[s]
			if onlyRandom {
				var keep []writing
				for _, w := range ws {
					if w.r.writing == "canonical" || strings.HasPrefix(w.r.writing, "rdkit-random-") {
						keep = append(keep, w)
					}
				}
				ws = keep
			}
			if len(ws) < 2 {
				continue
			}
			source, _, _ := strings.Cut(s, "-")
			total[source]++
			ref := ws[0]
			var lines []string
			for _, w := range ws[1:] {
				if w.labels == ref.labels {
					continue
				}
				why := append(append([]string{}, ref.why...), w.why...)
				t.Errorf("%s: our labels %s for %s but %s for %s under the default setting (constructs read unlike RDKit there: %v)",
					s, ref.labels, ref.r.smiles, w.labels, w.r.smiles, why)
				lines = append(lines, fmt.Sprintf("%s (%s) vs %s (%s): %v", ref.r.smiles, ref.labels, w.r.smiles, w.labels, why))
			}
			if len(lines) > 0 {
				changed[source]++
				if onlyRandom {
					t.Logf("labels change across RDKit's canonical and random writings: %s: %s", s, lines[0])
				} else {
					t.Logf("labels change with the writing: %s", s)
					for _, l := range lines {
						t.Logf("    %s", l)
					}
				}
			}
		}
		if !onlyRandom {
			t.Logf("%d RDKit writings left out: every reader reads another structure in them (RDKit's writer changed it): %v", len(changedByWriter), changedByWriter)
		}
		what := "all RDKit writings"
		if onlyRandom {
			what = "RDKit's canonical and seeded random (doRandom) writings"
		}
		for _, src := range []string{"nci", "suite", "marked", "case"} {
			t.Logf("%s: labels change in %d of %d %s structures", what, changed[src], total[src], src)
		}
	}
}

// TestSurveySettingsNameTheirLibraries checks that under each reader
// setting Stereoline reads every writing of the survey as the libraries
// the setting is named for (settingLibraries), element by element: every
// element both configure is configured alike, but for '@' on an allene,
// which no setting drops. Units one side keeps no configuration for are
// perception, not reading, and are counted apart by TestSurveyReadings.
func TestSurveySettingsNameTheirLibraries(t *testing.T) {
	rows := readSurvey(t)
	for _, setting := range settings {
		for _, lib := range settingLibraries[setting] {
			equal := map[string]int{}
			for _, r := range rows {
				ours := readOurs(t, r.smiles, setting)
				c := compare(r, ours, lib)
				for _, el := range c.agree {
					for _, n := range r.constructs[el] {
						equal[n]++
					}
				}
				for _, el := range c.differ {
					if slices.Equal(r.constructs[el], []string{"allene"}) {
						continue
					}
					t.Errorf("setting %q: %s %s %s read %q by us, %q by %s (constructs %v)",
						setting, r.structure, r.smiles, el, ours.keys[el], r.config[lib][el], lib, r.constructs[el])
				}
			}
			for _, n := range []string{"first-atom-lone-pair", "first-atom-lone-pair-ring-digit", "lone-pair-ring-digit", "ring-mark-both-same"} {
				if equal[n] == 0 {
					t.Errorf("setting %q: no element of construct %s is configured by %s and us alike", setting, n, lib)
				}
			}
			t.Logf("setting %q reads as %s: elements configured alike per open construct: first-atom-lone-pair %d, first-atom-lone-pair-ring-digit %d, lone-pair-ring-digit %d, ring-mark-both-same %d",
				setting, lib, equal["first-atom-lone-pair"], equal["first-atom-lone-pair-ring-digit"], equal["lone-pair-ring-digit"], equal["ring-mark-both-same"])
		}
	}
}

package main

import (
	"fmt"
	"os"
	"path/filepath"
	"regexp"
	"slices"
	"strings"
	"testing"
)

// The chemistry behind these tests is textbook (common practice): the
// two centres of 3-chlorobutan-2-ol, L- and D-alanine as mirror images,
// (E)- and (Z)-but-2-ene, ethanol and propan-1-ol as different
// compounds. The pairs against the reference library are in
// diff_rdkit_test.go.

// writeFile writes (or overwrites) a file of a test folder.
func writeFile(t *testing.T, dir, name, text string) {
	t.Helper()
	p := filepath.Join(dir, filepath.FromSlash(name))
	if err := os.MkdirAll(filepath.Dir(p), 0o755); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(p, []byte(text), 0o644); err != nil {
		t.Fatal(err)
	}
}

// relLines returns the output lines with the folder prefix removed.
func relLines(out, dir string) []string {
	var lines []string
	for _, l := range strings.Split(strings.TrimSpace(out), "\n") {
		if l != "" {
			lines = append(lines, strings.TrimPrefix(filepath.ToSlash(l), filepath.ToSlash(dir)+"/"))
		}
	}
	return lines
}

// TestDiffText: one compiler-style line per changed record, pointing at
// the mark that changed (the first '@' of the centre, the first '/' of
// the double bond), with the findings the change brings or removes, and
// a summary on standard error.
func TestDiffText(t *testing.T) {
	dir := gitRepo(t, map[string]string{"blocks.smi": "" +
		"C[C@H](O)[C@@H](Cl)C LRK-BB-001\n" +
		"N[C@@H](C)C(=O)O LRK-BB-002\n" +
		"C/C=C/C LRK-BB-003\n" +
		"CCO LRK-BB-004\n" +
		"CC(O)CC LRK-BB-005\n" +
		"C[C@@H](O)CC LRK-BB-006\n" +
		"OCC LRK-BB-007\n"})
	writeFile(t, dir, "blocks.smi", ""+
		"C[C@H](O)[C@H](Cl)C LRK-BB-001\n"+
		"N[C@H](C)C(=O)O LRK-BB-002\n"+
		"C/C=C\\C LRK-BB-003\n"+
		"CCCO LRK-BB-004\n"+
		"C[C@H](O)CC LRK-BB-005\n"+
		"CC(O)CC LRK-BB-006\n"+
		"C(O)C LRK-BB-007\n")
	stdout, stderr, status := runDiff(t, dir)
	want := []string{
		"blocks.smi:1:12: epimer: LRK-BB-001: C4 is now R (was S); the other centre is unchanged",
		"blocks.smi:2:4: enantiomer: LRK-BB-002: the mirror image (1 centre inverted): C2 is now R (was S)",
		"blocks.smi:3:2: bond-flipped: LRK-BB-003: C2=C3 is now Z (was E)",
		"blocks.smi:4:1: constitution-changed: LRK-BB-004: a different compound: C3H8O (was C2H6O)",
		"blocks.smi:5:4: stereo-added: LRK-BB-005: C2 is now marked S (was unmarked); hint gone: stereocentre without a configuration [stereo-undefined]",
		"blocks.smi:6:1: stereo-removed: LRK-BB-006: C2 is now unmarked (was R); new hint: stereocentre without a configuration [stereo-undefined]",
		"blocks.smi:7:1: rewritten: LRK-BB-007: the same compound with the same configuration, written differently",
	}
	if got := relLines(stdout, dir); !slices.Equal(got, want) {
		t.Errorf("got:\n%s\nwant:\n%s", strings.Join(got, "\n"), strings.Join(want, "\n"))
	}
	if status != 0 {
		t.Errorf("status %d without --fail-on", status)
	}
	wantSum := "stereoline diff against HEAD: 1 file changed, 7 records in them, 7 listed: 1 rewritten, 1 stereo-added, 1 stereo-removed, 1 bond-flipped, 1 epimer, 1 enantiomer, 1 constitution-changed; 0 unchanged"
	if strings.TrimSpace(stderr) != wantSum {
		t.Errorf("summary %q, want %q", stderr, wantSum)
	}
	if _, _, status := runDiff(t, "--fail-on", "epimer,added", dir); status != 1 {
		t.Errorf("--fail-on epimer: status %d, want 1", status)
	}
	if _, _, status := runDiff(t, "--fail-on", "added,removed", dir); status != 0 {
		t.Errorf("--fail-on added,removed: status %d, want 0", status)
	}
	if _, stderr, status := runDiff(t, "--fail-on", "epimers", dir); status != 2 || !strings.Contains(stderr, `unknown class "epimers"`) {
		t.Errorf("--fail-on epimers: status %d, stderr %q", status, stderr)
	}
	if _, stderr, status := runDiff(t, "--format", "xml", dir); status != 2 || !strings.Contains(stderr, "--format") {
		t.Errorf("--format xml: status %d, stderr %q", status, stderr)
	}
}

// TestDiffPairing: records moved to other lines, reordered table rows,
// JSON objects and Python names are paired by the identity their host
// gives them; only the records whose meaning or text changed are
// listed, each against its own earlier version.
func TestDiffPairing(t *testing.T) {
	dir := gitRepo(t, map[string]string{
		"blocks.smi": "N[C@@H](C)C(=O)O LRK-BB-001\nC[C@H](O)[C@@H](Cl)C LRK-BB-002\nC/C=C/C LRK-BB-003\nCCO LRK-BB-004\n",
		"plates.csv": "id,smiles,amount\nLRK-PL-1,N[C@@H](C)C(=O)O,1\nLRK-PL-2,C[C@H](O)CC,2\nLRK-PL-3,C/C=C/C,3\n",
		"lots.json":  `{"LRK-LOT-1": {"smiles": "N[C@@H](C)C(=O)O"}, "LRK-LOT-2": {"smiles": "C[C@H](O)CC"}}` + "\n",
		"series.json": `{"compounds": [{"id": "LRK-S-1", "smiles": "N[C@@H](C)C(=O)O"},` +
			` {"id": "LRK-S-2", "smiles": "C[C@H](O)CC"}]}` + "\n",
		"enumerate.py": "alanine = \"N[C@@H](C)C(=O)O\"\nbutanol = \"C[C@H](O)CC\"\n",
	})
	// moved lines, one record's centre inverted (LRK-BB-002 now last)
	writeFile(t, dir, "blocks.smi", "CCO LRK-BB-004\nC/C=C/C LRK-BB-003\nN[C@@H](C)C(=O)O LRK-BB-001\nC[C@H](O)[C@H](Cl)C LRK-BB-002\n")
	// reordered rows; LRK-PL-2 mirrored
	writeFile(t, dir, "plates.csv", "id,smiles,amount\nLRK-PL-3,C/C=C/C,3\nLRK-PL-2,C[C@@H](O)CC,2\nLRK-PL-1,N[C@@H](C)C(=O)O,1\n")
	// keys swapped in order; LRK-LOT-1 re-written, LRK-LOT-2 unchanged
	writeFile(t, dir, "lots.json", `{"LRK-LOT-2": {"smiles": "C[C@H](O)CC"}, "LRK-LOT-1": {"smiles": "OC(=O)[C@@H](N)C"}}`+"\n")
	// array elements swapped, named by their id; LRK-S-1 mirrored
	writeFile(t, dir, "series.json", `{"compounds": [{"id": "LRK-S-2", "smiles": "C[C@H](O)CC"},`+
		` {"id": "LRK-S-1", "smiles": "N[C@H](C)C(=O)O"}]}`+"\n")
	// assignments swapped; butanol mirrored
	writeFile(t, dir, "enumerate.py", "butanol = \"C[C@@H](O)CC\"\nalanine = \"N[C@@H](C)C(=O)O\"\n")
	stdout, stderr, status := runDiff(t, "--format", "json", dir)
	if status != 0 {
		t.Fatalf("status %d: %s", status, stderr)
	}
	type got struct{ path, class, key string }
	var lines []got
	for _, l := range parseDiffJSON(t, stdout) {
		lines = append(lines, got{strings.TrimPrefix(l.Path, filepath.ToSlash(dir)+"/"), l.Class, l.New.Text})
		if l.Old == nil || l.New == nil {
			t.Errorf("%s: unpaired %s", l.Path, l.Class)
		}
	}
	want := []got{
		{"blocks.smi", "epimer", "C[C@H](O)[C@H](Cl)C"},
		{"enumerate.py", "enantiomer", "C[C@@H](O)CC"},
		{"lots.json", "rewritten", "OC(=O)[C@@H](N)C"},
		{"plates.csv", "enantiomer", "C[C@@H](O)CC"},
		{"series.json", "enantiomer", "N[C@H](C)C(=O)O"},
	}
	if !slices.Equal(lines, want) {
		t.Errorf("got %v\nwant %v", lines, want)
	}
	// the old line of the moved record is its line before the move
	for _, l := range parseDiffJSON(t, stdout) {
		if strings.HasSuffix(l.Path, "blocks.smi") && (l.Old.Line != 2 || l.New.Line != 4) {
			t.Errorf("blocks.smi: old line %d, new line %d; want 2 and 4", l.Old.Line, l.New.Line)
		}
	}
}

// TestDiffByPosition: records without titles are paired by position and
// content: a record inserted at the top is added, the edited one is
// paired with its old self, a deleted one is removed.
func TestDiffByPosition(t *testing.T) {
	dir := gitRepo(t, map[string]string{"plain.smi": "N[C@@H](C)C(=O)O\nC[C@H](O)[C@@H](Cl)C\nC/C=C/C\nCCO\n"})
	writeFile(t, dir, "plain.smi", "CC(=O)O\nN[C@@H](C)C(=O)O\nC[C@@H](O)[C@@H](Cl)C\nC/C=C/C\n")
	stdout, stderr, status := runDiff(t, dir)
	if status != 0 {
		t.Fatalf("status %d: %s", status, stderr)
	}
	want := []string{
		"plain.smi:1:1: added: a new record",
		"plain.smi:3:4: epimer: C2 is now R (was S); the other centre is unchanged",
		"plain.smi:4:1: removed: the record is gone (line 4 at HEAD)",
	}
	if got := relLines(stdout, dir); !slices.Equal(got, want) {
		t.Errorf("got:\n%s\nwant:\n%s", strings.Join(got, "\n"), strings.Join(want, "\n"))
	}
}

// TestDiffReaction: a reaction whose product centre was mirrored: the
// products are the enantiomer, the reactants unchanged, and mapped
// centre 2 now inverts where it kept its configuration.
func TestDiffReaction(t *testing.T) {
	dir := gitRepo(t, map[string]string{"steps.rsmi": "[CH3:1][C@H:2]([OH:3])[CH2:4][CH3:5]>>[CH3:1][C@H:2]([OH:3])[CH2:4][CH3:5] LRK-RX-01\n"})
	writeFile(t, dir, "steps.rsmi", "[CH3:1][C@H:2]([OH:3])[CH2:4][CH3:5]>>[CH3:1][C@@H:2]([OH:3])[CH2:4][CH3:5] LRK-RX-01\n")
	stdout, _, _ := runDiff(t, "--format", "json", dir)
	ls := parseDiffJSON(t, stdout)
	if len(ls) != 1 {
		t.Fatalf("%d lines: %s", len(ls), stdout)
	}
	l := ls[0]
	if l.Class != "enantiomer" || len(l.Roles) != 2 || l.Roles[0].Class != "rewritten" || l.Roles[1].Role != "product" || l.Roles[1].Class != "enantiomer" {
		t.Errorf("class %s, roles %+v", l.Class, l.Roles)
	}
	if len(l.Units) != 1 || l.Units[0].Role != "product" || !slices.Equal(l.Units[0].Atoms, []int{7}) {
		t.Errorf("units %+v, want the product centre, atom 7", l.Units)
	}
	if len(l.Centres) != 1 || l.Centres[0].Map != 2 || *l.Centres[0].Before != "retention" || *l.Centres[0].After != "inversion" {
		t.Errorf("centres %+v", l.Centres)
	}
	if !strings.Contains(l.Explanation, "products: enantiomer") || !strings.Contains(l.Explanation, "mapped centre 2: inversion now (was retention)") {
		t.Errorf("explanation %q", l.Explanation)
	}
}

// TestDiffFindingsAndGroups: a change that introduces a finding and
// removes another lists both; a record with an and-group (racemic)
// says so.
func TestDiffFindingsAndGroups(t *testing.T) {
	dir := gitRepo(t, map[string]string{"blocks.cxsmi": "C1CCC/C=C/1 LRK-BB-001\nC/C=C/C LRK-BB-002\nC[C@H](O)CC |&1:1| LRK-BB-003\n"})
	writeFile(t, dir, "blocks.cxsmi", "C1CCC/C=C\\1 LRK-BB-001\nC/C=CC LRK-BB-002\nC[C@@H](O)CC |&1:1| LRK-BB-003\n")
	stdout, _, _ := runDiff(t, "--format", "json", dir)
	ls := parseDiffJSON(t, stdout)
	if len(ls) != 3 {
		t.Fatalf("%d lines:\n%s", len(ls), stdout)
	}
	codes := func(l diffLine) []string {
		var out []string
		for _, f := range l.Findings {
			out = append(out, f.Change+" "+f.Code)
		}
		return out
	}
	// a cis double bond in a six-membered ring is the only one there
	// is: its marks now change nothing
	if got := codes(ls[0]); !slices.Equal(got, []string{"introduced stereo-ineffective-bond", "removed stereo-strained-ring"}) {
		t.Errorf("LRK-BB-001 findings %v", got)
	}
	if got := codes(ls[1]); !slices.Equal(got, []string{"introduced stereo-one-sided-bond"}) || ls[1].Class != "stereo-removed" {
		t.Errorf("LRK-BB-002 %s, findings %v", ls[1].Class, got)
	}
	if !strings.Contains(ls[2].Explanation, "both versions carry stereo groups: &1 at C2 (a mixture of both configurations)") {
		t.Errorf("LRK-BB-003 explanation %q", ls[2].Explanation)
	}
}

// TestDiffBadInput: a file new since the revision is all added, a
// deleted one all removed; binary and oversized files are skipped with a
// message; a record that does not read is unreadable with the reason;
// an unknown revision is an error with status 2.
func TestDiffBadInput(t *testing.T) {
	dir := gitRepo(t, map[string]string{
		"gone.smi":    "CCO LRK-BB-001\nCCN LRK-BB-002\n",
		"blocks.smi":  "C[C@H](O)CC LRK-BB-003\n",
		"binary.smi":  "CCO\x00\x01\x02\n",
		"keep.smi":    "CCO LRK-BB-009\n",
		"huge/.keep":  "",
		"notes/x.txt": "not a host\n",
	})
	if err := os.Remove(filepath.Join(dir, "gone.smi")); err != nil {
		t.Fatal(err)
	}
	writeFile(t, dir, "new.smi", "C[C@@H](N)C(=O)O LRK-BB-004\nC/C=C/C LRK-BB-005\n")
	writeFile(t, dir, "blocks.smi", "C[C@H](O)C(C LRK-BB-003\n")
	writeFile(t, dir, "binary.smi", "CCO\x00\x03\n")
	big := strings.Repeat("CCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCC LRK-BB-BIG\n", 220_000)
	writeFile(t, dir, "big.smi", big)
	stdout, stderr, status := runDiff(t, dir)
	want := []string{
		"blocks.smi:1:1: unreadable: LRK-BB-003: the new record does not read: unclosed branch: expected ')' [syntax]",
		"gone.smi:1:1: removed: the record LRK-BB-001 is gone (line 1 at HEAD)",
		"gone.smi:2:1: removed: the record LRK-BB-002 is gone (line 2 at HEAD)",
		"new.smi:1:1: added: a new record LRK-BB-004",
		"new.smi:2:1: added: a new record LRK-BB-005",
	}
	got := relLines(stdout, dir)
	if len(got) != len(want) {
		t.Fatalf("got:\n%s\nwant:\n%s", strings.Join(got, "\n"), strings.Join(want, "\n"))
	}
	for i := range want {
		// the reader's wording of the syntax error is its own
		if i == 0 && strings.HasPrefix(got[0], "blocks.smi:1:1: unreadable: LRK-BB-003: the new record does not read: ") {
			continue
		}
		if got[i] != want[i] {
			t.Errorf("line %d: %q, want %q", i+1, got[i], want[i])
		}
	}
	for _, msg := range []string{"binary.smi: skipped: binary file", "big.smi: skipped: larger than 10000000 bytes"} {
		if !strings.Contains(stderr, msg) {
			t.Errorf("stderr lacks %q:\n%s", msg, stderr)
		}
	}
	if status != 0 {
		t.Errorf("status %d; skipped files are no error", status)
	}
	_, stderr, status = runDiff(t, "--base", "no-such-rev", dir)
	if status != 2 || !strings.Contains(stderr, `unknown revision "no-such-rev"`) {
		t.Errorf("unknown revision: status %d, stderr %q", status, stderr)
	}
	_, stderr, status = runDiff(t, filepath.Join(dir, "nothing-here"))
	if status != 2 || !strings.Contains(stderr, "nothing-here") {
		t.Errorf("missing path: status %d, stderr %q", status, stderr)
	}
	outside := t.TempDir()
	writeFile(t, outside, "a.smi", "CCO\n")
	_, stderr, status = runDiff(t, "--base", "HEAD", filepath.Join(outside, "a.smi"))
	if status != 2 || !strings.Contains(stderr, "not in a git repository") {
		t.Errorf("outside git: status %d, stderr %q", status, stderr)
	}
}

// TestDiffDirect: two files outside git are compared with each other.
func TestDiffDirect(t *testing.T) {
	dir := t.TempDir()
	writeFile(t, dir, "old.smi", "N[C@@H](C)C(=O)O LRK-BB-001\nCCO LRK-BB-002\n")
	writeFile(t, dir, "new.smi", "N[C@H](C)C(=O)O LRK-BB-001\nCCO LRK-BB-002\n")
	stdout, stderr, status := runDiff(t, filepath.Join(dir, "old.smi"), filepath.Join(dir, "new.smi"))
	want := "new.smi:1:4: enantiomer: LRK-BB-001: the mirror image (1 centre inverted): C2 is now R (was S)"
	if got := relLines(stdout, dir); len(got) != 1 || got[0] != want || status != 0 {
		t.Errorf("got %q (status %d, stderr %s), want %q", got, status, stderr, want)
	}
	if !strings.Contains(stderr, "against "+filepath.Join(dir, "old.smi")) {
		t.Errorf("summary %q names no base", stderr)
	}
}

// TestDiffMaxSize: --max-size sets the largest file reviewed; a smaller
// limit than the file skips it with a note.
func TestDiffMaxSize(t *testing.T) {
	dir := t.TempDir()
	writeFile(t, dir, "old.smi", "N[C@@H](C)C(=O)O LRK-BB-001\n")
	writeFile(t, dir, "new.smi", "N[C@H](C)C(=O)O LRK-BB-001\n")
	stdout, stderr, status := runDiff(t, "--max-size", "20", filepath.Join(dir, "old.smi"), filepath.Join(dir, "new.smi"))
	if got := relLines(stdout, dir); len(got) != 0 || status != 0 || !strings.Contains(stderr, "larger than 20 bytes") {
		t.Errorf("got %q (status %d, stderr %s), want the file skipped", got, status, stderr)
	}
	_, stderr, status = runDiff(t, "--max-size", "lots", filepath.Join(dir, "old.smi"), filepath.Join(dir, "new.smi"))
	if status != 2 || !strings.Contains(stderr, "--max-size") {
		t.Errorf("a bad size: status %d, stderr %q", status, stderr)
	}
}

// TestDiffHTML: the page holds every record, the first page as markup
// (each changed record with its two drawings inline), the rest as text
// the page's script turns into markup; the record count is in the
// title; the caution is there; nothing is fetched.
func TestDiffHTML(t *testing.T) {
	var old, new strings.Builder
	const n = 130
	for i := 0; i < n; i++ {
		fmt.Fprintf(&old, "C[C@H](O)[C@@H](Cl)C%s LRK-BB-%03d\n", strings.Repeat("C", i%7), i)
		fmt.Fprintf(&new, "C[C@H](O)[C@H](Cl)C%s LRK-BB-%03d\n", strings.Repeat("C", i%7), i)
	}
	fmt.Fprintf(&new, "C/C=C/C LRK-BB-NEW\n")
	dir := gitRepo(t, map[string]string{"blocks.smi": old.String()})
	writeFile(t, dir, "blocks.smi", new.String())
	page, stderr, status := runDiff(t, "--format", "html", dir)
	if status != 0 {
		t.Fatalf("status %d: %s", status, stderr)
	}
	count := func(re string) int { return len(regexp.MustCompile(re).FindAllStringIndex(page, -1)) }
	if !strings.Contains(page, "<title>Stereo review against HEAD: 131 records</title>") {
		t.Errorf("title: %s", regexp.MustCompile(`<title>.*</title>`).FindString(page))
	}
	if got := count(`<details class="rv-rec"`); got != n+1 {
		t.Errorf("%d record sections, want %d", got, n+1)
	}
	if got := count(`<script type="text/x-stereoline-record"`); got != n+1-pageSize {
		t.Errorf("%d records as text, want %d", got, n+1-pageSize)
	}
	if got := count(`<svg `); got != 2*n+1 {
		t.Errorf("%d drawings, want %d (two per changed record, one for the added one)", got, 2*n+1)
	}
	if got := count(`<mark>@</mark>`); got != n {
		t.Errorf("%d changed marks highlighted in the new notation, want %d", got, n)
	}
	if !strings.Contains(page, "analytical confirmation and qualified review") {
		t.Error("no caution on the page")
	}
	for _, bad := range []string{"src=", "<link", "@import", "url(", "fetch(", "XMLHttpRequest", "http://", "https://"} {
		if bad == "http://" {
			// only the SVG namespace may name a URL
			if c := strings.Count(page, "http://") - strings.Count(page, `xmlns="http://www.w3.org/2000/svg"`); c != 0 {
				t.Errorf("%d URLs besides the SVG namespace", c)
			}
			continue
		}
		if strings.Contains(page, bad) {
			t.Errorf("the page holds %q", bad)
		}
	}
	if strings.Count(page, "</script>") != count(`<script`) {
		t.Error("a record's text closes its script early")
	}
}

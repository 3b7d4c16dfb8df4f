package main

import (
	"bufio"
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"stereoline/lsp"
	"stereoline/stereo/document"
)

// writeFiles creates files under a new temporary folder; names use
// forward slashes.
func writeFiles(t *testing.T, files map[string]string) string {
	t.Helper()
	dir := t.TempDir()
	for name, content := range files {
		p := filepath.Join(dir, filepath.FromSlash(name))
		if err := os.MkdirAll(filepath.Dir(p), 0o755); err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(p, []byte(content), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	return dir
}

// The findings behind these tests are facts of the notation, stated in
// the OpenSMILES specification (ring closures, bond symbols) and in
// organic chemistry textbooks (a trans double bond needs a ring of eight
// or more atoms; an isolated double bond with one end marked has an open
// configuration): they are what the engine must report, and the exit
// status follows from their severities.
func TestCheckExitStatus(t *testing.T) {
	dir := writeFiles(t, map[string]string{
		"clean.smi":   "N[C@@H](C)C(=O)O L-alanine\nC/C=C/C E-but-2-ene\n",
		"warning.smi": "C/C=CC one end marked\n",
		"info.smi":    "C/C=C/C(O)CC one centre unmarked\n",
		"error.smi":   "C1CCC/C=C/1 trans in a six-membered ring\n",
	})
	p := func(name string) string { return filepath.Join(dir, name) }
	for _, c := range []struct {
		name   string
		args   []string
		status int
		stderr string // a fragment stderr must hold
	}{
		{"clean file", []string{p("clean.smi")}, 0, "1 file,"},
		{"warning below the default level", []string{p("warning.smi")}, 0, "1 warning"},
		{"warning at --fail-on warning", []string{"--fail-on", "warning", p("warning.smi")}, 1, ""},
		{"information below warning", []string{"--fail-on", "warning", p("info.smi")}, 0, ""},
		{"information at --fail-on information", []string{"--fail-on", "information", p("info.smi")}, 1, ""},
		{"error at the default level", []string{p("error.smi")}, 1, "1 error,"},
		{"options after the path", []string{p("warning.smi"), "--fail-on", "warning"}, 1, ""},
		{"missing path names it", []string{p("no-such.smi")}, 2, "no-such.smi"},
		{"missing path among good ones", []string{p("clean.smi"), p("gone")}, 2, "gone"},
		{"missing path still checks the rest", []string{p("gone"), p("error.smi")}, 2, "1 error,"},
		{"unknown option", []string{"--colour", p("clean.smi")}, 2, "colour"},
		{"bad format", []string{"--format", "xml", p("clean.smi")}, 2, "--format"},
		{"bad fail-on", []string{"--fail-on", "hint", p("clean.smi")}, 2, "--fail-on"},
		{"bad max-size", []string{"--max-size", "lots", p("clean.smi")}, 2, "--max-size"},
		{"stdin name without stdin", []string{"--stdin-name", "x.py", p("clean.smi")}, 2, "--stdin-name"},
		{"help", []string{"-h"}, 0, "usage: stereoline check"},
	} {
		t.Run(c.name, func(t *testing.T) {
			_, stderr, status := runCheck(t, "", c.args...)
			if status != c.status {
				t.Errorf("exit status %d, want %d; stderr:\n%s", status, c.status, stderr)
			}
			if !strings.Contains(stderr, c.stderr) {
				t.Errorf("stderr does not mention %q:\n%s", c.stderr, stderr)
			}
		})
	}
}

func TestCheckUnreadableFile(t *testing.T) {
	// A symbolic link to itself cannot be opened by anyone, root
	// included (ELOOP).
	loopDir := t.TempDir()
	loop := filepath.Join(loopDir, "loop.smi")
	if err := os.Symlink(loop, loop); err == nil {
		_, stderr, status := runCheck(t, "", loop)
		if status != 2 || !strings.Contains(stderr, "loop.smi") {
			t.Errorf("status %d, stderr %q; want 2 naming loop.smi", status, stderr)
		}
	}
	if os.Geteuid() == 0 {
		t.Skip("running as root: file permissions do not stop reading")
	}
	dir := writeFiles(t, map[string]string{"locked.smi": "CCO\n"})
	p := filepath.Join(dir, "locked.smi")
	if err := os.Chmod(p, 0); err != nil {
		t.Fatal(err)
	}
	_, stderr, status := runCheck(t, "", p)
	if status != 2 || !strings.Contains(stderr, "locked.smi") {
		t.Errorf("status %d, stderr %q; want 2 naming locked.smi", status, stderr)
	}
}

func TestCheckStdin(t *testing.T) {
	// A Python literal "C1CC\1": Python reads \1 as an octal escape, the
	// control character U+0001 (Python language reference, "String and
	// Bytes literals").
	src := "smiles = \"C1CCC\\1\"\n"
	stdout, stderr, status := runCheck(t, src, "--stdin-name", "made_up.py", "-")
	if status != 1 {
		t.Errorf("status %d, want 1; stderr %s", status, stderr)
	}
	if !strings.Contains(stdout, "made_up.py:1:") || !strings.Contains(stdout, "[host-escape]") {
		t.Errorf("want a host-escape finding on made_up.py, got:\n%s", stdout)
	}
	// Without a name standard input has no host kind: nothing is found.
	stdout, _, status = runCheck(t, src, "-")
	if status != 0 || stdout != "" {
		t.Errorf("unnamed stdin: status %d, output %q; want 0 and nothing", status, stdout)
	}
}

func TestCheckSkips(t *testing.T) {
	dir := writeFiles(t, map[string]string{
		"shown.smi":         "C/C=CC\n",
		".git/hidden.smi":   "C/C=CC\n",
		".cache/x/deep.smi": "C/C=CC\n",
		"binary.smi":        "C/C=CC\x00\n",
		"big.smi":           strings.Repeat("C/C=CC\n", 200),
		"readme.txt":        "C/C=CC\n",
	})
	stdout, stderr, _ := runCheck(t, "", "--max-size", "1kB", dir)
	if got := strings.Count(stdout, "\n"); got != 1 || !strings.Contains(stdout, "shown.smi") {
		t.Errorf("want one finding, in shown.smi; got:\n%s", stdout)
	}
	if !strings.Contains(stderr, "1 file (2 skipped)") {
		t.Errorf("summary should count 1 file and 2 skipped: %s", stderr)
	}
	// A file named on the command line is checked even if hidden, and a
	// skipped one is reported by name.
	_, stderr, _ = runCheck(t, "", "--max-size", "1kB", filepath.Join(dir, "big.smi"))
	if !strings.Contains(stderr, "big.smi: skipped: larger than the largest file scanned") {
		t.Errorf("stderr should say why big.smi was skipped: %s", stderr)
	}
	stdout, _, _ = runCheck(t, "", filepath.Join(dir, ".git", "hidden.smi"))
	if !strings.Contains(stdout, "hidden.smi:1:2") {
		t.Errorf("a hidden file named explicitly should be checked: %q", stdout)
	}
}

// TestCheckSARIFNotes checks that the SARIF log names the files it did
// not check (SARIF 2.1.0 §3.20.21 toolExecutionNotifications) and says
// whether the run succeeded (§3.20.14 executionSuccessful): a file too
// large is a warning and leaves the run successful, a missing path is an
// error and does not.
func TestCheckSARIFNotes(t *testing.T) {
	dir := writeFiles(t, map[string]string{
		"shown.smi": "C/C=CC\n",
		"big.smi":   strings.Repeat("C/C=CC\n", 200),
	})
	type note struct {
		Level     string
		Message   struct{ Text string }
		Locations []struct {
			PhysicalLocation struct {
				ArtifactLocation struct{ URI string }
			}
		}
	}
	invocations := func(args ...string) (bool, []note) {
		t.Helper()
		stdout, _, _ := runCheck(t, "", append([]string{"--format", "sarif", "--max-size", "1kB"}, args...)...)
		var log struct {
			Runs []struct {
				Invocations []struct {
					ExecutionSuccessful        bool
					ToolExecutionNotifications []note
				}
			}
		}
		if err := json.Unmarshal([]byte(stdout), &log); err != nil || len(log.Runs) != 1 || len(log.Runs[0].Invocations) != 1 {
			t.Fatalf("want one run with one invocation (%v):\n%s", err, stdout)
		}
		inv := log.Runs[0].Invocations[0]
		return inv.ExecutionSuccessful, inv.ToolExecutionNotifications
	}
	ok, notes := invocations(filepath.Join(dir, "shown.smi"), filepath.Join(dir, "big.smi"))
	if !ok || len(notes) != 1 || notes[0].Level != "warning" || !strings.Contains(notes[0].Message.Text, "larger than") ||
		len(notes[0].Locations) != 1 || !strings.HasSuffix(notes[0].Locations[0].PhysicalLocation.ArtifactLocation.URI, "/big.smi") {
		t.Errorf("a skipped file: successful %v, notes %+v; want true and one warning on big.smi", ok, notes)
	}
	ok, notes = invocations(filepath.Join(dir, "shown.smi"), filepath.Join(dir, "gone.smi"))
	if ok || len(notes) != 1 || notes[0].Level != "error" || !strings.HasSuffix(notes[0].Locations[0].PhysicalLocation.ArtifactLocation.URI, "/gone.smi") {
		t.Errorf("a missing file: successful %v, notes %+v; want false and one error on gone.smi", ok, notes)
	}
	if ok, notes = invocations(filepath.Join(dir, "shown.smi")); !ok || len(notes) != 0 {
		t.Errorf("a clean run: successful %v, notes %+v; want true and none", ok, notes)
	}
}

func TestCheckConfigFile(t *testing.T) {
	dir := writeFiles(t, map[string]string{
		"a/one.smi":                    "C/C=CC\n",
		"a/quiet/two.smi":              "C/C=CC\n",
		"a/quiet/" + configFileName:    `{"severity": {"stereo-one-sided-bond": "off"}}`,
		"b/strict/three.smi":           "C/C=CC\n",
		"b/" + configFileName:          `{"severity": {"stereo-one-sided-bond": "error"}}`,
		"c/bad/four.smi":               "C/C=CC\n",
		"c/bad/" + configFileName:      `{"severty": {}}`,
		"d/tables/five.tab.txt":        "id\tstructure\nX\tC/C=CC\n",
		"d/tables/" + configFileName:   `{"files": {"*.tab.txt": "tsv"}, "columns": ["structure"]}`,
		"e/override/six.smi":           "C/C=CC\n",
		"e/override/" + configFileName: `{"severity": {"stereo-one-sided-bond": "off"}}`,
	})
	stdout, stderr, status := runCheck(t, "", filepath.Join(dir, "a"), filepath.Join(dir, "b"))
	if strings.Contains(stdout, "two.smi") {
		t.Errorf("the nearer configuration switches the code off for two.smi:\n%s", stdout)
	}
	if !strings.Contains(stdout, "one.smi:1:2: warning:") || !strings.Contains(stdout, "three.smi:1:2: error:") {
		t.Errorf("want one.smi as a warning and three.smi as an error:\n%s", stdout)
	}
	if status != 1 {
		t.Errorf("status %d, want 1 (three.smi is an error by configuration); %s", status, stderr)
	}
	_, stderr, status = runCheck(t, "", filepath.Join(dir, "c"))
	if status != 2 || !strings.Contains(stderr, configFileName) || !strings.Contains(stderr, "severty") {
		t.Errorf("a misspelt setting: status %d, stderr %q; want 2 naming the file and the setting", status, stderr)
	}
	stdout, _, _ = runCheck(t, "", filepath.Join(dir, "d"))
	if !strings.Contains(stdout, "five.tab.txt:2:4:") {
		t.Errorf("the configured file pattern and column should find the record:\n%s", stdout)
	}
	// --config replaces the configuration found by walking up.
	strict := filepath.Join(dir, "b", configFileName)
	stdout, _, _ = runCheck(t, "", "--config", strict, filepath.Join(dir, "e"))
	if !strings.Contains(stdout, "six.smi:1:2: error:") {
		t.Errorf("--config should apply to six.smi:\n%s", stdout)
	}
	_, stderr, status = runCheck(t, "", "--config", filepath.Join(dir, "missing.json"), filepath.Join(dir, "e"))
	if status != 2 || !strings.Contains(stderr, "missing.json") {
		t.Errorf("a missing --config file: status %d, stderr %q", status, stderr)
	}
}

// TestCheckSameAsEditor checks the promise of one engine: the JSON Lines
// of check are, finding for finding, what document.Analyze reports for
// the same text, placed by the language server's own mapper in UTF-16
// positions (LSP 3.17's default position encoding).
func TestCheckSameAsEditor(t *testing.T) {
	files := []string{
		filepath.Join(goldenTree, "list.smi"),
		filepath.Join(goldenTree, "table.csv"),
		filepath.Join(goldenTree, "sub", "script.py"),
	}
	if demo, err := filepath.Glob(filepath.Join(repoRoot, "examples", "*")); err == nil {
		files = append(files, demo...)
	}
	analyzer := document.NewAnalyzer(document.DefaultConfig())
	for _, f := range files {
		content, err := os.ReadFile(f)
		if err != nil {
			t.Fatal(err)
		}
		stdout, stderr, status := runCheck(t, "", "--format", "json", f)
		if status == 2 {
			t.Fatalf("%s: %s", f, stderr)
		}
		var got []jsonFinding
		sc := bufio.NewScanner(strings.NewReader(stdout))
		for sc.Scan() {
			var j jsonFinding
			if err := json.Unmarshal(sc.Bytes(), &j); err != nil {
				t.Fatalf("%s: line %q is not JSON: %v", f, sc.Text(), err)
			}
			got = append(got, j)
		}
		res := analyzer.Analyze(f, "", content)
		m := lsp.NewMapper(content, lsp.EncodingUTF16)
		var want []jsonFinding
		for _, d := range res.Diagnostics() {
			r, err := m.SpanToRange(d.Span)
			if err != nil {
				t.Fatalf("%s: %v", f, err)
			}
			want = append(want, jsonFinding{
				Path: filepath.ToSlash(f),
				Range: jsonRange{
					Start: jsonPosition{int(r.Start.Line), int(r.Start.Character)},
					End:   jsonPosition{int(r.End.Line), int(r.End.Character)},
				},
				Severity: d.Severity.String(), Code: string(d.Code), Message: d.Message,
			})
		}
		if len(got) != len(want) {
			t.Errorf("%s: check reports %d findings, the engine %d", f, len(got), len(want))
			continue
		}
		for i := range got {
			if got[i] != want[i] {
				t.Errorf("%s: finding %d\ncheck:  %+v\nengine: %+v", f, i, got[i], want[i])
			}
		}
	}
}

// TestCheckReadingSetting: the reading setting of .stereoline.json and
// the --lone-pair and --ring-marks options choose how a mark that the
// surveyed readers read differently is read (testdata/survey): methyl
// phenyl sulfoxide written from its sulfur is (R) as RDKit 2022.09.3
// reads it (the default) and (S) with the lone pair in the hydrogen's
// slot, as Open Babel reads it; the finding says both. An option wins
// over the file; a misspelt value is a usage or configuration error.
func TestCheckReadingSetting(t *testing.T) {
	const rec = "[S@](=O)(C)c1ccccc1 LRK-BB-021\n"
	dir := writeFiles(t, map[string]string{
		"plain/list.smi":            rec,
		"slot/list.smi":             rec,
		"slot/" + configFileName:    `{"reading": {"lonePair": "hydrogen-slot"}}`,
		"bad/list.smi":              rec,
		"bad/" + configFileName:     `{"reading": {"lonePair": "first"}}`,
		"unknown/list.smi":          rec,
		"unknown/" + configFileName: `{"reading": {"lonePairs": "last"}}`,
	})
	const rdkitFirst = "read as (R) here and by RDKit 2022.09.3 and @rdkit/rdkit 2026.09.1; as (S) by Open Babel 3.1.1"
	const slotFirst = "read as (S) here and by Open Babel 3.1.1; as (R) by RDKit 2022.09.3 and @rdkit/rdkit 2026.09.1"
	for _, c := range []struct {
		args []string
		want string
	}{
		{[]string{filepath.Join(dir, "plain")}, rdkitFirst},
		{[]string{filepath.Join(dir, "slot")}, slotFirst},
		{[]string{"--lone-pair", "hydrogen-slot", filepath.Join(dir, "plain")}, slotFirst},
		{[]string{"--lone-pair", "last", filepath.Join(dir, "slot")}, rdkitFirst},
	} {
		stdout, stderr, status := runCheck(t, "", c.args...)
		if status != 0 || !strings.Contains(stdout, "list.smi:1:3: warning: "+c.want) || !strings.Contains(stdout, "[stereo-reader-dependent]") {
			t.Errorf("check %v: status %d, output %q (%s); want a warning %q", c.args, status, stdout, stderr, c.want)
		}
	}
	for _, args := range [][]string{{filepath.Join(dir, "bad")}, {filepath.Join(dir, "unknown")}, {"--ring-marks", "opening", filepath.Join(dir, "plain")}} {
		if _, stderr, status := runCheck(t, "", args...); status != 2 {
			t.Errorf("check %v: status %d (stderr %q), want 2", args, status, stderr)
		}
	}
}

// TestCheckNamedListAnySize checks that a record list named on the
// command line is checked past the default largest file scanned (it is
// read a chunk at a time), while the same list found in a folder, or
// named with --max-size or under a maxFileSize setting, is skipped, and a
// Python module named past the default is skipped too (it is found
// whole).
func TestCheckNamedListAnySize(t *testing.T) {
	limit, err := parseSize(defaultMaxSize)
	if err != nil {
		t.Fatal(err)
	}
	// one record with a one-sided double bond, then comment lines past
	// the default limit
	pad := strings.Repeat("# padding, not a record\n", int(limit)/24+1)
	dir := writeFiles(t, map[string]string{
		"large.smi":             "C/C=CC first\n" + pad,
		"large.py":              "s = 'C/C=CC'\n" + pad,
		"set/large.smi":         "C/C=CC first\n" + pad,
		"set/" + configFileName: `{"maxFileSize": "1MB"}`,
	})
	const finding = "large.smi:1:2: warning"
	stdout, stderr, _ := runCheck(t, "", filepath.Join(dir, "large.smi"))
	if !strings.Contains(stdout, finding) || strings.Contains(stderr, "skipped") {
		t.Errorf("a list named past the default limit should be checked: stdout %q, stderr %q", stdout, stderr)
	}
	for _, args := range [][]string{
		{"--max-size", defaultMaxSize, filepath.Join(dir, "large.smi")},
		{dir},
		{filepath.Join(dir, "set", "large.smi")},
		{filepath.Join(dir, "large.py")},
	} {
		stdout, stderr, _ := runCheck(t, "", args...)
		if strings.Contains(stdout, "large.") || !strings.Contains(stderr, "skipped: larger than the largest file scanned") {
			t.Errorf("%v: want the large files skipped; stdout %q, stderr %q", args, stdout, stderr)
		}
	}
}

package main

import (
	"bufio"
	"bytes"
	"encoding/json"
	"fmt"
	"os"
	"path/filepath"
	"slices"
	"strconv"
	"strings"
	"testing"
)

// runDiff runs 'stereoline diff' in-process.
func runDiff(t *testing.T, args ...string) (stdout, stderr string, status int) {
	t.Helper()
	var out, errOut bytes.Buffer
	status = run(append([]string{"diff"}, args...), strings.NewReader(""), &out, &errOut)
	return out.String(), errOut.String(), status
}

// diffLine is what a test reads back from a JSON Lines object.
type diffLine struct {
	Path  string `json:"path"`
	Class string `json:"class"`
	Old   *struct {
		Line  int    `json:"line"`
		Text  string `json:"text"`
		Title string `json:"title"`
	} `json:"old"`
	New *struct {
		Line  int    `json:"line"`
		Text  string `json:"text"`
		Title string `json:"title"`
	} `json:"new"`
	Units []struct {
		Kind     string  `json:"kind"`
		Atoms    []int   `json:"atoms"`
		OldAtoms []int   `json:"old_atoms"`
		Before   *string `json:"before"`
		After    *string `json:"after"`
		Role     string  `json:"role"`
	} `json:"units"`
	Findings []struct {
		Change string `json:"change"`
		Code   string `json:"code"`
		Line   int    `json:"line"`
	} `json:"findings"`
	Explanation string `json:"explanation"`
	Roles       []struct {
		Role  string `json:"role"`
		Class string `json:"class"`
	} `json:"roles"`
	Centres []struct {
		Map    int     `json:"map"`
		Before *string `json:"before"`
		After  *string `json:"after"`
	} `json:"centers"`
}

func parseDiffJSON(t *testing.T, out string) []diffLine {
	t.Helper()
	var lines []diffLine
	sc := bufio.NewScanner(strings.NewReader(out))
	sc.Buffer(make([]byte, 1<<16), 1<<24)
	for sc.Scan() {
		var l diffLine
		if err := json.Unmarshal(sc.Bytes(), &l); err != nil {
			t.Fatalf("not JSON: %v\n%s", err, sc.Text())
		}
		lines = append(lines, l)
	}
	return lines
}

// readFixture reads a tab-separated fixture of testdata/rdkit into rows
// of named columns, skipping the '#' header (the last '#' line names the
// columns).
func readFixture(t *testing.T, name string) []map[string]string {
	t.Helper()
	data, err := os.ReadFile(filepath.Join("..", "..", "testdata", "rdkit", name))
	if err != nil {
		t.Fatal(err)
	}
	var cols []string
	var rows []map[string]string
	for _, line := range strings.Split(strings.TrimRight(string(data), "\n"), "\n") {
		if strings.HasPrefix(line, "#") {
			cols = strings.Split(strings.TrimPrefix(line, "#"), "\t")
			continue
		}
		f := strings.Split(line, "\t")
		if len(f) != len(cols) {
			t.Fatalf("%s: %d fields, want %d: %q", name, len(f), len(cols), line)
		}
		row := map[string]string{}
		for i, c := range cols {
			row[c] = f[i]
		}
		rows = append(rows, row)
	}
	return rows
}

// commitThenWrite makes a repository with old committed as name, then
// writes new over it in the working tree.
func commitThenWrite(t *testing.T, name, old, new string) string {
	t.Helper()
	dir := gitRepo(t, map[string]string{name: old})
	if err := os.WriteFile(filepath.Join(dir, name), []byte(new), 0o644); err != nil {
		t.Fatal(err)
	}
	return dir
}

// TestDiffRewritingsAgainstRDKit: 1,000 pairs of random writings of one
// molecule (testdata/rdkit/identity.tsv, written by RDKit 2022.09.3's
// MolToRandomSmilesVect; each pair has the same canonical isomeric
// SMILES there) in a list committed with the first writing and edited to
// the second: every pair is rewritten, none is a false alarm.
func TestDiffRewritingsAgainstRDKit(t *testing.T) {
	rows := readFixture(t, "identity.tsv")
	type writing struct{ smiles, canon string }
	byIsomer := map[string][]writing{}
	var order []string
	for _, r := range rows {
		k := r["group"] + "/" + r["isomer"] + "/" + r["stereo"]
		if _, ok := byIsomer[k]; !ok {
			order = append(order, k)
		}
		byIsomer[k] = append(byIsomer[k], writing{r["smiles"], r["canon_iso"]})
	}
	var old, new strings.Builder
	pairs := 0
	for _, k := range order {
		ws := byIsomer[k]
		if len(ws) < 2 || pairs == 1000 {
			continue
		}
		// the reference library says the two are one molecule
		if ws[0].canon != ws[1].canon {
			t.Fatalf("%s: fixture pair with different canonical SMILES", k)
		}
		fmt.Fprintf(&old, "%s LRK-RW-%04d\n", ws[0].smiles, pairs)
		fmt.Fprintf(&new, "%s LRK-RW-%04d\n", ws[1].smiles, pairs)
		pairs++
	}
	if pairs != 1000 {
		t.Fatalf("%d pairs in the fixture, want 1000", pairs)
	}
	dir := commitThenWrite(t, "writings.smi", old.String(), new.String())
	stdout, stderr, status := runDiff(t, "--format", "json", "--fail-on", "enantiomer,epimer,diastereomer,bond-flipped,stereo-added,stereo-removed,constitution-changed,unreadable,added,removed", dir)
	if status != 0 {
		t.Errorf("status %d; stderr %s", status, stderr)
	}
	rewritten := 0
	for _, l := range parseDiffJSON(t, stdout) {
		if l.Class != "rewritten" {
			t.Errorf("false alarm: %s %s -> %s: %s: %s", l.New.Title, l.Old.Text, l.New.Text, l.Class, l.Explanation)
			continue
		}
		rewritten++
	}
	t.Logf("%d of 1000 pairs listed as rewritten (the others are written the same), 0 false alarms expected", rewritten)
}

// TestDiffAgainstRDKit: pairs made by testdata/rdkit/gen_review.py
// (RDKit 2022.09.3): a centre inverted, double bonds flipped, several
// units changed, the mirror image, a mark removed or added, a carbon
// added, re-writings; each written at random on both sides. The class
// agrees with RDKit's canonical isomeric SMILES of both sides (the same
// string: rewritten; another constitution: constitution-changed; the
// mirror's string: enantiomer) and, beyond them, with the units RDKit
// changed; the units named are the ones RDKit changed, or atoms
// equivalent to them by the symmetry of the constitution.
func TestDiffAgainstRDKit(t *testing.T) {
	rows := readFixture(t, "review.tsv")
	var old, new strings.Builder
	for i, r := range rows {
		fmt.Fprintf(&old, "%s LRK-RV-%04d\n", r["old"], i)
		fmt.Fprintf(&new, "%s LRK-RV-%04d\n", r["new"], i)
	}
	dir := commitThenWrite(t, "pairs.smi", old.String(), new.String())
	stdout, stderr, status := runDiff(t, "--format", "json", dir)
	if status != 0 {
		t.Fatalf("status %d; stderr %s", status, stderr)
	}
	got := map[string]diffLine{}
	for _, l := range parseDiffJSON(t, stdout) {
		if l.New == nil || l.Old == nil {
			t.Errorf("unpaired record: %+v", l)
			continue
		}
		got[l.New.Title] = l
	}
	agree, byClass := 0, map[string]int{}
	for i, r := range rows {
		title := fmt.Sprintf("LRK-RV-%04d", i)
		l, listed := got[title]
		class := l.Class
		if !listed {
			class = "rewritten" // the same text on both sides: not listed
		}
		// what the canonical strings alone say
		switch {
		case r["canon_old"] == r["canon_new"]:
			if class != "rewritten" {
				t.Errorf("%s %s: %s -> %s: RDKit writes both %s, we say %s: %s", title, r["op"], r["old"], r["new"], r["canon_new"], class, l.Explanation)
				continue
			}
		case r["nostereo_old"] != r["nostereo_new"]:
			if class != "constitution-changed" {
				t.Errorf("%s %s: %s -> %s: RDKit's constitutions differ, we say %s", title, r["op"], r["old"], r["new"], class)
				continue
			}
		case r["canon_new"] == r["canon_mirror_old"]:
			if class != "enantiomer" {
				t.Errorf("%s %s: %s -> %s: RDKit's mirror of the old side is the new one, we say %s: %s", title, r["op"], r["old"], r["new"], class, l.Explanation)
				continue
			}
		}
		if class != r["class"] {
			t.Errorf("%s %s: %s -> %s: RDKit's view gives %s, we say %s: %s", title, r["op"], r["old"], r["new"], r["class"], class, l.Explanation)
			continue
		}
		switch class {
		case "epimer", "bond-flipped", "stereo-added", "stereo-removed", "diastereomer":
			if msg := sameUnits(l, r); msg != "" {
				t.Errorf("%s %s: %s -> %s: %s", title, r["op"], r["old"], r["new"], msg)
				continue
			}
		}
		agree++
		byClass[class]++
	}
	t.Logf("%d of %d pairs agree with RDKit: %v", agree, len(rows), byClass)
}

// sameUnits compares the units we name with the fixture's, atom by atom
// up to the symmetry classes of the constitution; "" when they agree.
func sameUnits(l diffLine, r map[string]string) string {
	classesOf := func(col string) []string { return strings.Fields(r[col]) }
	newClasses, oldClasses := classesOf("classes_new"), classesOf("classes_old")
	sig := func(names string, classes []string) []string {
		var out []string
		if names == "-" {
			return out
		}
		for _, n := range strings.Fields(names) {
			var parts []string
			for _, a := range strings.Split(n, "=") {
				k, _ := strconv.Atoi(a)
				if k < 1 || k > len(classes) {
					return []string{"bad atom " + n}
				}
				parts = append(parts, classes[k-1])
			}
			slices.Sort(parts)
			out = append(out, strings.Join(parts, "="))
		}
		slices.Sort(out)
		return out
	}
	want := sig(r["atoms_new"], newClasses)
	var ours []string
	for _, u := range l.Units {
		atoms, classes := u.Atoms, newClasses
		if u.After == nil && u.OldAtoms != nil {
			// a unit the new side leaves open is named in the old
			// numbering; compare it with the old side's classes
			atoms, classes = u.OldAtoms, oldClasses
		}
		var parts []string
		for _, a := range atoms {
			if a < 1 || a > len(classes) {
				return fmt.Sprintf("unit atom %d out of range", a)
			}
			parts = append(parts, classes[a-1])
		}
		slices.Sort(parts)
		ours = append(ours, strings.Join(parts, "="))
	}
	slices.Sort(ours)
	wantOld := sig(r["atoms_old"], oldClasses)
	if slices.Equal(ours, want) || slices.Equal(ours, wantOld) {
		return ""
	}
	return fmt.Sprintf("units %v (classes %v), RDKit changed %s (classes %v): %s", l.Units, ours, r["atoms_new"], want, l.Explanation)
}

package readings_test

import (
	"bufio"
	"os"
	"path/filepath"
	"slices"
	"sort"
	"strings"
	"testing"

	"stereoline/notation"
	"stereoline/stereo"
	"stereoline/stereo/transform"
)

// The portable rewrites: testdata/survey/portable.tsv, made by
// testdata/survey/gen_portable.py, which flags the survey's writings with
// stereoline describe, rewrites the flagged ones with stereoline
// transform --portable under each reader setting, and reads the rewrites
// with RDKit 2022.09.3 (Debian's python3-rdkit), the npm package
// @rdkit/rdkit and Open Babel 3.1.1 (Debian's python3-openbabel).
var portablePath = filepath.Join("..", "..", "testdata", "survey", "portable.tsv")

type portableRow struct {
	structure, writing, setting, smiles, rewrite string
	config                                       map[string]map[string]string // library -> element -> key, of the rewrite
	canonical                                    map[string][2]string         // library -> original, rewrite
}

func readPortable(t *testing.T) []portableRow {
	f, err := os.Open(portablePath)
	if err != nil {
		t.Skipf("portable fixture not found at %s (made by testdata/survey/gen_portable.py): %v", portablePath, err)
	}
	defer f.Close()
	var rows []portableRow
	sc := bufio.NewScanner(f)
	sc.Buffer(make([]byte, 1<<20), 1<<20)
	for sc.Scan() {
		line := sc.Text()
		if line == "" || strings.HasPrefix(line, "#") {
			continue
		}
		c := strings.Split(line, "\t")
		if len(c) != 11 {
			t.Fatalf("portable row with %d columns: %q", len(c), line)
		}
		r := portableRow{structure: c[0], writing: c[1], setting: c[2], smiles: c[3], rewrite: c[4],
			config: map[string]map[string]string{}, canonical: map[string][2]string{}}
		for i, lib := range libraries {
			cfg := c[5+i]
			if cfg == "=" {
				cfg = c[5]
			}
			r.config[lib] = parseConfig(cfg)
			orig, rew, _ := strings.Cut(c[8+i], " ")
			if rew == "=" {
				rew = orig
			}
			r.canonical[lib] = [2]string{orig, rew}
		}
		rows = append(rows, r)
	}
	if err := sc.Err(); err != nil {
		t.Fatal(err)
	}
	return rows
}

// flaggedWritings returns the distinct writings of the survey that carry
// a stereo-reader-dependent warning under a setting: the writings the
// portable rewrite is for ('@' on an allene is information only, with no
// portable writing).
func flaggedWritings(t *testing.T, rows []row, setting string) map[string]bool {
	out := map[string]bool{}
	r := readingOf(t, setting)
	for _, w := range rows {
		if out[w.smiles] {
			continue
		}
		for _, d := range stereo.Analyze(notation.ReadWith(w.smiles, r)).Diagnostics {
			if d.Code == stereo.CodeReaderDependent && d.Severity == notation.SeverityWarning {
				out[w.smiles] = true
			}
		}
	}
	return out
}

// TestPortableRewrites checks the portable rewrite of every writing of
// the survey flagged under each setting against the libraries: the
// fixture holds every flagged writing and today's rewrite of it; every
// library that configures an element of the rewrite configures it alike
// (Open Babel keeps no configuration for amine nitrogens, phosphines and
// selenium centres: those elements are compared between the RDKit
// releases only, and counted); the libraries the setting is named for
// give the rewrite the canonical SMILES of the original, so the rewrite
// means what the original means under the setting; and Stereoline reads
// the rewrite under every setting as each library does, with no mark
// left that readers read differently.
func TestPortableRewrites(t *testing.T) {
	survey := readSurvey(t)
	rows := readPortable(t)
	bySetting := map[string]map[string]bool{}
	for _, r := range rows {
		if bySetting[r.setting] == nil {
			bySetting[r.setting] = map[string]bool{}
		}
		bySetting[r.setting][r.smiles] = true
	}
	for _, setting := range settings {
		want := flaggedWritings(t, survey, setting)
		var missing, extra []string
		for s := range want {
			if !bySetting[setting][s] {
				missing = append(missing, s)
			}
		}
		for s := range bySetting[setting] {
			if !want[s] {
				extra = append(extra, s)
			}
		}
		sort.Strings(missing)
		sort.Strings(extra)
		if len(missing) > 0 || len(extra) > 0 {
			t.Errorf("setting %q: the fixture is stale (run testdata/survey/gen_portable.py): flagged writings missing %v, rows for writings no longer flagged %v", setting, missing, extra)
		}
	}
	type tally struct{ rewrites, allThree, rdkitOnly, elements int }
	stats := map[string]*tally{}
	for _, r := range rows {
		reading := readingOf(t, r.setting)
		s := stats[r.setting]
		if s == nil {
			s = &tally{}
			stats[r.setting] = s
		}
		s.rewrites++
		// today's rewrite
		m := notation.ReadWith(r.smiles, reading)
		tr, err := transform.Portable(m)
		got := r.smiles
		if err == nil {
			got, err = notation.ApplyEdits(m.Text, tr.Edits)
		}
		if err != nil || got != r.rewrite {
			t.Errorf("%s %s (%s): today's rewrite is %q (%v), the fixture holds %q: run testdata/survey/gen_portable.py", r.structure, r.smiles, r.setting, got, err, r.rewrite)
			continue
		}
		// every library configures the rewrite alike
		elements := map[string]bool{}
		for _, lib := range libraries {
			for el := range r.config[lib] {
				elements[el] = true
			}
		}
		for el := range elements {
			var keys []string
			var keeping []string
			for _, lib := range libraries {
				if k, ok := r.config[lib][el]; ok {
					keys = append(keys, k)
					keeping = append(keeping, lib)
				}
			}
			slices.Sort(keys)
			if len(slices.Compact(keys)) > 1 {
				t.Errorf("%s (%s): the rewrite %s is read differently at %s: %v by %v", r.smiles, r.setting, r.rewrite, el, keys, keeping)
			}
			s.elements++
			switch {
			case len(keeping) == 3:
				s.allThree++
			case len(keeping) == 2 && !slices.Contains(keeping, openBabel):
				s.rdkitOnly++
			}
		}
		// the named libraries read the rewrite as they read the original
		for _, lib := range settingLibraries[r.setting] {
			if c := r.canonical[lib]; c[0] != c[1] {
				t.Errorf("%s (%s): %s reads the original as %s but the rewrite %s as %s", r.smiles, r.setting, lib, c[0], r.rewrite, c[1])
			}
		}
		// we read the rewrite as every library does, under every setting
		for _, other := range settings {
			ours := readOurs(t, r.rewrite, other)
			for _, lib := range libraries {
				for el, k := range r.config[lib] {
					if o, ok := ours.keys[el]; ok && o != k {
						t.Errorf("%s: we read the rewrite %s at %s as %q under %q, %s as %q", r.smiles, r.rewrite, el, o, other, lib, k)
					}
				}
			}
			for _, d := range stereo.Analyze(notation.ReadWith(r.rewrite, readingOf(t, other))).Diagnostics {
				if d.Code == stereo.CodeReaderDependent && d.Severity == notation.SeverityWarning {
					t.Errorf("%s: the rewrite %s still has a mark readers read differently under %q: %s", r.smiles, r.rewrite, other, d.Msg)
				}
			}
		}
	}
	for _, setting := range settings {
		if s := stats[setting]; s != nil {
			t.Logf("setting %q: %d rewrites; %d stereo elements of the rewrites, %d configured alike by all three libraries, %d by the two RDKit releases alike where Open Babel keeps no configuration (amine nitrogen, phosphine, selenium)",
				setting, s.rewrites, s.elements, s.allThree, s.rdkitOnly)
		}
	}
}

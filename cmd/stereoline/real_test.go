package main

import (
	"bufio"
	"bytes"
	"fmt"
	"io/fs"
	"os"
	"os/exec"
	"path/filepath"
	"sort"
	"strings"
	"testing"

	"stereoline/notation"
	"stereoline/stereo/document"
)

// The real corpus is public code and data on this machine that nobody on
// the project wrote: Debian's python3-rdkit (the RDKit Python package,
// its modules, docstrings and notebooks full of SMILES and SMARTS), its
// rdkit-data (lists, tables and SMARTS catalogues) and Open Babel's data
// files. None of it is copied into the repository; the test reads it
// where it is installed and skips what is absent or of another version.
//
// Files are found as the checker finds them (by extension), plus the
// list files a user would point the checker at with a files setting
// (the SMARTS catalogues, whose extension says nothing).

// realCorpus is one installed tree.
type realCorpus struct {
	name    string
	pkg     string // the Debian package whose version the expectations are for
	version string
	root    string // a glob; the first match is read
	files   map[string]string
	// reading is the reading setting of the program that wrote the
	// corpus's records, as its user would set it (README, reading):
	// Open Babel writes its data files with the lone pair in the
	// hydrogen's slot, and its cage fragments (quinuclidines, the
	// hexamethylenetetramine family) read with the default would put
	// bridgehead lone pairs inside their cages
	reading document.ReadingConfig
}

var realCorpora = []realCorpus{
	{name: "rdkit-python", pkg: "python3-rdkit", version: "202209.3-1", root: "/usr/lib/python3/dist-packages/rdkit"},
	{name: "rdkit-data", pkg: "rdkit-data", version: "202209.3-1", root: "/usr/share/RDKit/Data", files: map[string]string{
		"Salts.txt": "smi", "FunctionalGroups.txt": "smi", "Functional_Group_Hierarchy.txt": "smi",
		"Crippen.txt": "smi", "RLewis_smarts.txt": "smi", "patty_rules.txt": "smi", "test_set3.txt": "smi",
	}},
	{name: "openbabel-data", pkg: "openbabel", version: "3.1.1+dfsg-9+b3", root: "/usr/share/openbabel/3.*", files: map[string]string{
		"SMARTS_InteLigand.txt": "smi", "patterns.txt": "smi", "superatom.txt": "smi", "torsion.txt": "smi",
		"rigid-fragments-index.txt": "smi",
	}, reading: document.ReadingConfig{LonePair: "hydrogen-slot", RingMarks: "dropped"}},
}

// realFindings lists the findings of severity error and warning on the
// real corpus, reviewed one by one with the reason beside each: true
// ones, and the few known to be false (a reason starting with FALSE,
// counted and logged). Anything else the checker reports there fails the
// test, as does an entry no longer reported.
var realFindings = filepath.Join(repoRoot, "testdata", "real", "findings.tsv")

type realFinding struct {
	key, reason string
	line        int
}

func readRealFindings(t *testing.T) map[string]realFinding {
	t.Helper()
	f, err := os.Open(realFindings)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	out := map[string]realFinding{}
	sc := bufio.NewScanner(f)
	for n := 1; sc.Scan(); n++ {
		line := sc.Text()
		if line == "" || strings.HasPrefix(line, "#") {
			continue
		}
		col := strings.SplitN(line, "\t", 5)
		if len(col) != 5 || strings.TrimSpace(col[4]) == "" {
			t.Fatalf("%s:%d: want corpus, file:line, code, count and a reason", realFindings, n)
		}
		out[col[0]+"\t"+col[1]+"\t"+col[2]+"\t"+col[3]] = realFinding{key: col[0] + "/" + col[1], reason: col[4], line: n}
	}
	return out
}

// debianVersion returns the installed version of a package, or "".
func debianVersion(pkg string) string {
	out, err := exec.Command("dpkg-query", "-W", "-f=${Version}", pkg).Output()
	if err != nil {
		return ""
	}
	return strings.TrimSpace(string(out))
}

// TestRealCorpus checks every file of the installed corpora: every
// finding of severity error or warning must be one of the reviewed true
// findings of testdata/real/findings.tsv (the goal is that none is
// false), and every reviewed finding must still be reported. With
// STEREOLINE_REAL_DUMP set to a file name it writes every occurrence
// found there (corpus, file, line, dialect, reason, text, title) for
// testdata/real/measure.py, which measures precision and recall against
// RDKit.
func TestRealCorpus(t *testing.T) {
	accepted := readRealFindings(t)
	used := map[string]bool{}
	var dump *bufio.Writer
	if p := os.Getenv("STEREOLINE_REAL_DUMP"); p != "" {
		f, err := os.Create(p)
		if err != nil {
			t.Fatal(err)
		}
		defer f.Close()
		dump = bufio.NewWriter(f)
		defer dump.Flush()
	}
	checked := 0
	// known counts the findings the review calls false (a reason
	// starting with FALSE): reported, not failed, so that a fault outside
	// the finder is tracked rather than hidden.
	known := map[string]int{}
	for _, c := range realCorpora {
		roots, _ := filepath.Glob(c.root)
		if len(roots) == 0 {
			t.Logf("%s: %s not installed here; skipped", c.name, c.root)
			continue
		}
		if v := debianVersion(c.pkg); v != c.version {
			t.Logf("%s: Debian package %s is %q, the expectations are for %q; skipped", c.name, c.pkg, v, c.version)
			continue
		}
		checked++
		root := roots[0]
		cfg := document.DefaultConfig()
		cfg.Files = c.files
		cfg.Reading = c.reading
		// the findings were reviewed against the reference library, which
		// knows no time limit: the record time budget, whose findings
		// depend on the machine and its load, is off
		cfg.Limits.RecordTime = "off"
		a := document.NewAnalyzer(cfg)
		var files, occurrences int
		severities := map[notation.Severity]int{}
		err := filepath.WalkDir(root, func(path string, d fs.DirEntry, err error) error {
			if err != nil {
				return err
			}
			if strings.HasPrefix(d.Name(), ".") && path != root {
				if d.IsDir() {
					return filepath.SkipDir
				}
				return nil
			}
			if d.IsDir() || !a.Handles(path) {
				return nil
			}
			content, err := os.ReadFile(path)
			if err != nil || len(content) > 10<<20 || bytes.IndexByte(content[:min(len(content), 8000)], 0) >= 0 {
				return nil
			}
			rel, _ := filepath.Rel(root, path)
			rel = filepath.ToSlash(rel)
			files++
			res := a.Analyze(path, "", content)
			lineOf := func(off int) int { return 1 + bytes.Count(content[:off], []byte{'\n'}) }
			counts := map[string]int{}
			for _, d := range res.Diagnostics() {
				severities[d.Severity]++
				if d.Severity > notation.SeverityWarning {
					continue
				}
				counts[fmt.Sprintf("%s\t%d\t%s", rel, lineOf(d.Span.Start), d.Code)]++
			}
			for k, n := range counts {
				key := c.name + "\t" + strings.Replace(k, "\t", ":", 1) + "\t" + fmt.Sprint(n)
				if f, ok := accepted[key]; ok {
					used[key] = true
					if strings.HasPrefix(f.reason, "FALSE") {
						known[c.name]++
					}
					continue
				}
				t.Errorf("%s/%s: a finding not reviewed as true (a false finding?): %s", c.name, rel, strings.ReplaceAll(key, "\t", " "))
			}
			occurrences += len(res.Records) + len(res.Queries)
			if dump != nil {
				clean := strings.NewReplacer("\t", " ", "\n", " ", "\r", " ").Replace
				for _, rec := range res.Records {
					fmt.Fprintf(dump, "%s\t%s\t%d\tsmiles\t%s\t%s\t%s\n", c.name, rel, lineOf(rec.Occ.Span.Start), rec.Occ.Reason, clean(rec.Occ.Text), clean(rec.Occ.Title))
				}
				for _, q := range res.Queries {
					fmt.Fprintf(dump, "%s\t%s\t%d\tsmarts\t%s\t%s\t%s\n", c.name, rel, lineOf(q.Occ.Span.Start), q.Occ.Reason, clean(q.Occ.Text), clean(q.Occ.Title))
				}
			}
			return nil
		})
		if err != nil {
			t.Fatal(err)
		}
		t.Logf("%s (%s): %d files, %d occurrences; findings: %d errors, %d warnings, %d information, %d hints; %d of the errors and warnings known to be false (testdata/real/findings.tsv)",
			c.name, root, files, occurrences, severities[notation.SeverityError], severities[notation.SeverityWarning],
			severities[notation.SeverityInformation], severities[notation.SeverityHint], known[c.name])
	}
	if checked == 0 {
		t.Skip("no corpus of the expected version is installed (python3-rdkit, rdkit-data, openbabel)")
	}
	var stale []string
	for k, f := range accepted {
		corpus := strings.SplitN(k, "\t", 2)[0]
		if !used[k] && installed(corpus) {
			stale = append(stale, fmt.Sprintf("%s:%d %s", realFindings, f.line, strings.ReplaceAll(k, "\t", " ")))
		}
	}
	sort.Strings(stale)
	for _, s := range stale {
		t.Errorf("reviewed finding no longer reported: %s", s)
	}
}

// installed reports whether the named corpus was checked (present, of
// the expected version).
func installed(name string) bool {
	for _, c := range realCorpora {
		if c.name != name {
			continue
		}
		roots, _ := filepath.Glob(c.root)
		return len(roots) > 0 && debianVersion(c.pkg) == c.version
	}
	return false
}

package main

import (
	"os"
	"os/exec"
	"path/filepath"
	"reflect"
	"strings"
	"testing"
)

// gitRepo makes a temporary repository with one commit of the files and
// returns its folder.
func gitRepo(t *testing.T, files map[string]string) string {
	t.Helper()
	if _, err := exec.LookPath("git"); err != nil {
		t.Skip("git is not installed")
	}
	dir := writeFiles(t, files)
	for _, args := range [][]string{
		{"init", "-q"},
		{"add", "."},
		{"-c", "user.name=Test", "-c", "user.email=test@example.invalid", "commit", "-q", "-m", "base"},
	} {
		if _, err := git(dir, args...); err != nil {
			t.Fatal(err)
		}
	}
	return dir
}

func TestCheckChangedSince(t *testing.T) {
	base := "C/C=CC line 1, one-sided before the change\n" +
		"CCO line 2\n" +
		"C1CCC/C=C/1 line 3, strained before the change\n" +
		"CCN line 4\n"
	dir := gitRepo(t, map[string]string{"blocks.smi": base, "other.smi": "C/C=CC untouched\n", "with space.smi": "CCO\n"})
	// Change line 2 to a one-sided bond and line 4 to a strained ring;
	// lines 1 and 3 keep their old findings.
	changed := strings.Replace(base, "CCO line 2", "C/C=CC line 2, new", 1)
	changed = strings.Replace(changed, "CCN line 4", "C1CCC/C=C/1 line 4, new", 1)
	if err := os.WriteFile(filepath.Join(dir, "blocks.smi"), []byte(changed), 0o644); err != nil {
		t.Fatal(err)
	}
	// A name with a space (git marks the end of such names with a tab).
	if err := os.WriteFile(filepath.Join(dir, "with space.smi"), []byte("CCO\nC/C=CC spaced\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	// A file git does not track is new in every line.
	if err := os.WriteFile(filepath.Join(dir, "new.smi"), []byte("C/C=CC brand new\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	stdout, stderr, status := runCheck(t, "", "--changed-since", "HEAD", dir)
	var lines []string
	for _, l := range strings.Split(strings.TrimSpace(stdout), "\n") {
		if l != "" {
			lines = append(lines, strings.TrimPrefix(filepath.ToSlash(l), filepath.ToSlash(dir)+"/"))
		}
	}
	want := []string{
		"blocks.smi:2:1: warning: the same structure as line 1 (line 1, one-sided before the change) [list-duplicate]",
		"blocks.smi:2:2: warning: only one end of this double bond is marked, so its configuration is open [stereo-one-sided-bond]",
		"blocks.smi:4:1: warning: the same structure as line 3 (line 3, strained before the change) [list-duplicate]",
		"blocks.smi:4:6: error: trans double bond in a ring of 6 atoms; the smallest ring that holds one has 8 [stereo-strained-ring]",
		"new.smi:1:2: warning: only one end of this double bond is marked, so its configuration is open [stereo-one-sided-bond]",
		"with space.smi:2:2: warning: only one end of this double bond is marked, so its configuration is open [stereo-one-sided-bond]",
	}
	if !reflect.DeepEqual(lines, want) {
		t.Errorf("findings on changed lines:\n%s\nwant:\n%s", strings.Join(lines, "\n"), strings.Join(want, "\n"))
	}
	if status != 1 || !strings.Contains(stderr, "on changed lines") {
		t.Errorf("status %d (want 1), stderr %q", status, stderr)
	}
	// Without the filter the old findings are there too.
	all, _, _ := runCheck(t, "", dir)
	if n := strings.Count(all, "\n"); n != 9 {
		t.Errorf("without --changed-since want 9 findings, got %d:\n%s", n, all)
	}
	// A revision git does not know is a usage error naming it.
	_, stderr, status = runCheck(t, "", "--changed-since", "no-such-rev", dir)
	if status != 2 || !strings.Contains(stderr, "no-such-rev") {
		t.Errorf("unknown revision: status %d, stderr %q", status, stderr)
	}
	// Outside a repository the filter cannot work.
	outside := writeFiles(t, map[string]string{"x.smi": "C/C=CC\n"})
	if _, err := git(outside, "rev-parse", "--show-toplevel"); err == nil {
		t.Skip("the temporary folder is inside a git repository")
	}
	_, stderr, status = runCheck(t, "", "--changed-since", "HEAD", outside)
	if status != 2 || !strings.Contains(stderr, "not in a git repository") {
		t.Errorf("outside a repository: status %d, stderr %q", status, stderr)
	}
}

// TestParseUnifiedZero reads hunk headers in the unified format git
// writes with -U0 (git-diff(1), "generating patch text with -p"): "+c,d"
// names d new lines from line c, "+c" one line, "+c,0" none.
func TestParseUnifiedZero(t *testing.T) {
	diff := "diff --git a/x.smi b/x.smi\n" +
		"--- a/x.smi\n+++ b/x.smi\n" +
		"@@ -2 +2 @@\n-CCO\n+CCN\n" +
		"@@ -5,0 +6,2 @@\n+C\n+N\n" +
		"@@ -9,3 +10,0 @@\n-a\n-b\n-c\n" +
		"diff --git a/gone.smi b/gone.smi\n--- a/gone.smi\n+++ /dev/null\n@@ -1 +0,0 @@\n-C\n"
	got := parseUnifiedZero(diff)
	want := map[string]lineSet{"x.smi": {lines: map[int]bool{1: true, 5: true, 6: true}}}
	if !reflect.DeepEqual(got, want) {
		t.Errorf("got %+v, want %+v", got, want)
	}
}

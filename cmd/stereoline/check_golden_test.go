package main

import (
	"bytes"
	"flag"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// update rewrites golden files instead of comparing with them:
// go test ./cmd/stereoline -run Golden -update. Other tests of this
// package that keep golden files should use this flag too.
var update = flag.Bool("update", false, "rewrite the golden files under testdata/")

// goldenTree is the small tree the golden tests check: a list, a table,
// a Python script with non-ASCII text before a notation, and entries the
// walk must skip (a hidden folder, a binary file, a file of no host
// kind).
const goldenTree = "testdata/check/tree"

// compareGolden compares got with testdata/check/NAME, or rewrites it.
func compareGolden(t *testing.T, name string, got []byte) {
	t.Helper()
	path := filepath.Join("testdata", "check", name)
	if *update {
		if err := os.WriteFile(path, got, 0o644); err != nil {
			t.Fatal(err)
		}
		return
	}
	want, err := os.ReadFile(path)
	if err != nil {
		t.Fatalf("%v (run with -update to create it)", err)
	}
	if !bytes.Equal(got, want) {
		t.Errorf("%s differs from the output (run with -update if the change is intended)\n--- got\n%s\n--- want\n%s", path, got, want)
	}
}

// runCheck runs the command in-process and returns its output.
func runCheck(t *testing.T, stdin string, args ...string) (stdout, stderr string, status int) {
	t.Helper()
	var out, errOut bytes.Buffer
	status = run(append([]string{"check"}, args...), strings.NewReader(stdin), &out, &errOut)
	return out.String(), errOut.String(), status
}

func TestCheckGolden(t *testing.T) {
	for _, c := range []struct{ golden, format string }{
		{"text.golden", "text"},
		{"json.golden", "json"},
		{"sarif.golden", "sarif"},
	} {
		t.Run(c.format, func(t *testing.T) {
			stdout, stderr, status := runCheck(t, "", "--format", c.format, goldenTree)
			// The tree holds errors: the default --fail-on error exits 1.
			if status != 1 {
				t.Errorf("exit status %d, want 1; stderr:\n%s", status, stderr)
			}
			// stderr is not a terminal here: no progress line.
			if strings.Contains(stderr, "\r") || strings.Contains(stderr, "checked ") {
				t.Errorf("progress output on a non-terminal stderr: %q", stderr)
			}
			compareGolden(t, c.golden, []byte(stdout+"--- stderr\n"+stderr))
		})
	}
}

// TestCheckGoldenDeterministic checks that the output does not depend on
// the number of workers.
func TestCheckGoldenDeterministic(t *testing.T) {
	one, _, _ := runCheck(t, "", "--jobs", "1", "--format", "json", goldenTree)
	many, _, _ := runCheck(t, "", "--jobs", "8", "--format", "json", goldenTree)
	if one != many {
		t.Errorf("output with 8 jobs differs from 1 job:\n%s\n---\n%s", many, one)
	}
	if one == "" {
		t.Error("no output at all")
	}
}

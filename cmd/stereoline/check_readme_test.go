package main

import (
	"bytes"
	"errors"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
)

// quickStart returns the commands of the README's "Quick start" block.
func quickStart(t *testing.T) []string {
	t.Helper()
	data, err := os.ReadFile(filepath.Join(repoRoot, "README.md"))
	if err != nil {
		t.Skipf("no README: %v", err)
	}
	text := string(data)
	i := strings.Index(text, "## Quick start")
	if i < 0 {
		t.Fatal("README.md has no Quick start section")
	}
	block := text[i:]
	start := strings.Index(block, "```sh\n")
	if start < 0 {
		t.Fatal("the Quick start section has no sh block")
	}
	block = block[start+len("```sh\n"):]
	end := strings.Index(block, "```")
	if end < 0 {
		t.Fatal("the Quick start block is not closed")
	}
	var cmds []string
	for _, l := range strings.Split(block[:end], "\n") {
		if l = strings.TrimSpace(l); l != "" {
			cmds = append(cmds, l)
		}
	}
	return cmds
}

// TestREADMEQuickStart runs the README's quick start in a fresh clone of
// the repository, so it tests what a newcomer gets from the committed
// tree, not the working copy. The first command runs as written. The
// second, go test ./..., would run this test again inside the clone; it
// runs as one small test of this package instead, which still proves
// that the clone builds and its tests run.
func TestREADMEQuickStart(t *testing.T) {
	if testing.Short() {
		t.Skip("clones the repository and builds it: skipped with -short")
	}
	cmds := quickStart(t)
	if len(cmds) != 2 || cmds[0] != "go run ./cmd/stereoline check examples/" || cmds[1] != "go test ./..." {
		t.Fatalf("the Quick start block should hold exactly the two commands this test runs, found %q", cmds)
	}
	if _, err := exec.LookPath("git"); err != nil {
		t.Skip("git is not installed")
	}
	if _, err := git(repoRoot, "rev-parse", "--show-toplevel"); err != nil {
		t.Skip("not in a git checkout")
	}
	clone := filepath.Join(t.TempDir(), "stereoline")
	if out, err := exec.Command("git", "clone", "--quiet", "--no-hardlinks", repoRoot, clone).CombinedOutput(); err != nil {
		t.Fatalf("git clone: %v\n%s", err, out)
	}

	// The demo has errors: the command prints its findings and exits 1.
	var stdout, stderr bytes.Buffer
	cmd := exec.Command("go", "run", "./cmd/stereoline", "check", "examples/")
	cmd.Dir = clone
	cmd.Stdout, cmd.Stderr = &stdout, &stderr
	err := cmd.Run()
	var exit *exec.ExitError
	if !errors.As(err, &exit) || exit.ExitCode() != 1 {
		t.Fatalf("%s: %v, want exit status 1\nstderr:\n%s", cmds[0], err, stderr.String())
	}
	lines := strings.Split(strings.TrimSpace(stdout.String()), "\n")
	// The demo's deliberate mistakes that the engine reports today; the
	// README's table of the demo names them.
	for _, want := range []string{"[stereo-strained-ring]", "[host-escape]", "[stereo-one-sided-bond]", "[stereo-reader-dependent]"} {
		if !strings.Contains(stdout.String(), want) {
			t.Errorf("the demo check does not report %s:\n%s", want, stdout.String())
		}
	}
	for _, l := range lines {
		if !strings.HasPrefix(l, "examples/") {
			t.Errorf("finding outside examples/: %q", l)
		}
	}
	if !strings.Contains(stderr.String(), "5 files") {
		t.Errorf("summary should count the five demo files: %s", stderr.String())
	}

	cmd = exec.Command("go", "test", "-count=1", "-run", "^TestCheckExitStatus$", "./cmd/stereoline/")
	cmd.Dir = clone
	if out, err := cmd.CombinedOutput(); err != nil {
		t.Errorf("go test in the clone: %v\n%s", err, out)
	}
}

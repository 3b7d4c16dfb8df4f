package lsp

import (
	"encoding/json"
	"net/url"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
)

// gitRepo makes a repository in a temporary folder with the files
// committed, or skips the test when git is absent.
func gitRepo(t *testing.T, files map[string]string) string {
	t.Helper()
	if _, err := exec.LookPath("git"); err != nil {
		t.Skip("git is not installed")
	}
	dir := t.TempDir()
	run := func(args ...string) {
		cmd := exec.Command("git", args...)
		cmd.Dir = dir
		cmd.Env = append(os.Environ(), "GIT_AUTHOR_NAME=Fenwick Row", "GIT_AUTHOR_EMAIL=pool@example.org",
			"GIT_COMMITTER_NAME=Fenwick Row", "GIT_COMMITTER_EMAIL=pool@example.org", "GIT_CONFIG_GLOBAL=/dev/null")
		if out, err := cmd.CombinedOutput(); err != nil {
			t.Fatalf("git %v: %v\n%s", args, err, out)
		}
	}
	run("init", "-q")
	for name, text := range files {
		if err := os.WriteFile(filepath.Join(dir, name), []byte(text), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	run("add", ".")
	run("commit", "-q", "-m", "blocks")
	return dir
}

func fileURI(path string) string {
	return (&url.URL{Scheme: "file", Path: filepath.ToSlash(path)}).String()
}

type lens struct {
	Range   json.RawMessage `json:"range"`
	Command struct {
		Title     string            `json:"title"`
		Command   string            `json:"command"`
		Arguments []json.RawMessage `json:"arguments"`
	} `json:"command"`
}

// changeLensTitles returns the titles of a document's change lenses.
func changeLensTitles(c *fakeClient, uri string) ([]string, []lens) {
	var lenses []lens
	c.mustCall("textDocument/codeLens", map[string]any{"textDocument": textDoc(uri)}, &lenses)
	var titles []string
	var changes []lens
	for _, l := range lenses {
		if l.Command.Command == commandShowChange {
			titles = append(titles, l.Command.Title)
			changes = append(changes, l)
		}
	}
	return titles, changes
}

// TestChangeLens: an edited record of a file in git gets a lens that
// says what it now means against HEAD (the second centre of
// 3-chlorobutan-2-ol inverted is an epimer; the chemistry is textbook,
// common practice); the hover says it too; an unchanged record gets
// none; the reviewBase setting moves the base or turns the lens off.
func TestChangeLens(t *testing.T) {
	old := "C[C@H](O)[C@@H](Cl)C LRK-BB-001\nN[C@@H](C)C(=O)O LRK-BB-002\n"
	dir := gitRepo(t, map[string]string{"blocks.smi": old})
	now := "C[C@H](O)[C@H](Cl)C LRK-BB-001\nN[C@@H](C)C(=O)O LRK-BB-002\nC/C=C/C LRK-BB-003\n"
	u := fileURI(filepath.Join(dir, "blocks.smi"))

	c := start(t, clientSetup{})
	c.open(u, "smi", 1, now)
	titles, lenses := changeLensTitles(c, u)
	want := []string{"epimer at C4 vs HEAD", "added since HEAD"}
	if strings.Join(titles, "|") != strings.Join(want, "|") {
		t.Fatalf("change lenses %q, want %q", titles, want)
	}
	var msg string
	c.mustCall("workspace/executeCommand", map[string]any{"command": commandShowChange, "arguments": lenses[0].Command.Arguments}, &msg)
	if !strings.Contains(msg, "C4 is now R (was S)") || !strings.Contains(msg, "analytical confirmation") {
		t.Errorf("command answered %q", msg)
	}
	h := hoverAt(t, c, u, position(t, now, "@H](Cl)", 0, EncodingUTF16))
	if h == nil || !strings.Contains(h.Contents.Value, "**Against HEAD:** epimer: C4 is now R (was S)") {
		t.Errorf("hover lacks the change: %+v", h)
	}
	h = hoverAt(t, c, u, position(t, now, "N[C@@H]", 0, EncodingUTF16))
	if h == nil || strings.Contains(h.Contents.Value, "Against HEAD") {
		t.Errorf("unchanged record's hover: %+v", h)
	}

	off := start(t, clientSetup{initOpts: map[string]any{"reviewBase": "off"}})
	off.open(u, "smi", 1, now)
	if titles, _ := changeLensTitles(off, u); len(titles) != 0 {
		t.Errorf("reviewBase off: lenses %q", titles)
	}
	bad := start(t, clientSetup{initOpts: map[string]any{"reviewBase": "no-such-branch"}})
	bad.open(u, "smi", 1, now)
	if titles, _ := changeLensTitles(bad, u); len(titles) != 0 {
		t.Errorf("unknown revision: lenses %q", titles)
	}
}

// TestChangeLensOutsideGit: a file outside any repository has no base
// version and gets no change lens.
func TestChangeLensOutsideGit(t *testing.T) {
	dir := t.TempDir()
	u := fileURI(filepath.Join(dir, "blocks.smi"))
	c := start(t, clientSetup{})
	c.open(u, "smi", 1, "C[C@H](O)CC LRK-BB-001\n")
	if titles, _ := changeLensTitles(c, u); len(titles) != 0 {
		t.Errorf("lenses %q", titles)
	}
}

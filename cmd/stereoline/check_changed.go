package main

import (
	"bufio"
	"bytes"
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"strconv"
	"strings"
)

// lineSet is the set of changed lines of one file, 0-based. all marks a
// file git does not track yet: every line of it is new.
type lineSet struct {
	all   bool
	lines map[int]bool
}

// touches reports whether a finding from start to end lies on a changed
// line. A range that ends at the very start of a line does not reach
// into that line.
func (s lineSet) touches(start, end position) bool {
	if s.all {
		return true
	}
	last := end.Line
	if last > start.Line && end.CharCP == 0 {
		last--
	}
	for l := start.Line; l <= last; l++ {
		if s.lines[l] {
			return true
		}
	}
	return false
}

// changedLines holds the lines changed since a revision, per file, for
// every repository the checked files live in.
type changedLines struct {
	rev    string
	byFile map[string]lineSet // by absolute path with symbolic links resolved
}

// forFile returns the changed lines of a checked file. Standard input is
// looked up by its --stdin-name.
func (c *changedLines) forFile(f checkFile) lineSet {
	p := f.osPath
	if f.stdin {
		p = filepath.FromSlash(f.path)
	}
	return c.byFile[canonicalPath(p)]
}

// canonicalPath makes a path comparable with the paths git prints: absolute,
// with symbolic links resolved (a temporary folder is often a link).
func canonicalPath(p string) string {
	abs, err := filepath.Abs(p)
	if err != nil {
		return p
	}
	if real, err := filepath.EvalSymlinks(abs); err == nil {
		return real
	}
	// The file may not exist (standard input named after a new file):
	// resolve its folder instead.
	if dir, err := filepath.EvalSymlinks(filepath.Dir(abs)); err == nil {
		return filepath.Join(dir, filepath.Base(abs))
	}
	return abs
}

// loadChanges asks git, once per repository, which lines changed since
// the revision: 'git diff -U0 REV' compares the revision with the working
// tree, so committed, staged and unstaged changes all count, and files
// git does not track count as wholly changed.
func (r *checkRun) loadChanges(files []checkFile) error {
	c := &changedLines{rev: r.opts.changedSince, byFile: map[string]lineSet{}}
	repos := map[string]bool{}
	topOf := map[string]string{}
	for _, f := range files {
		p := f.osPath
		if f.stdin {
			p = filepath.FromSlash(f.path)
		}
		dir := filepath.Dir(canonicalPath(p))
		top, ok := topOf[dir]
		if !ok {
			out, err := git(dir, "rev-parse", "--show-toplevel")
			if err != nil {
				return fmt.Errorf("%s: not in a git repository", f.path)
			}
			top = canonicalPath(strings.TrimSpace(out))
			topOf[dir] = top
		}
		if repos[top] {
			continue
		}
		repos[top] = true
		if err := c.addRepo(top); err != nil {
			return err
		}
	}
	r.changes = c
	return nil
}

// addRepo runs git diff in one repository and records its changed lines.
func (c *changedLines) addRepo(top string) error {
	// core.quotepath=off keeps non-ASCII names as they are; --no-ext-diff
	// and --no-color keep the output parseable whatever the user set, and
	// explicit prefixes undo diff.noprefix and diff.mnemonicPrefix.
	out, err := git(top, "-c", "core.quotepath=off", "diff", "-U0", "--no-color", "--no-ext-diff", "--src-prefix=a/", "--dst-prefix=b/", c.rev, "--")
	if err != nil {
		return err
	}
	for file, set := range parseUnifiedZero(out) {
		c.byFile[filepath.Join(top, filepath.FromSlash(file))] = set
	}
	untracked, err := git(top, "-c", "core.quotepath=off", "ls-files", "--others", "--exclude-standard", "-z")
	if err != nil {
		return err
	}
	for _, name := range strings.Split(untracked, "\x00") {
		if name != "" {
			c.byFile[filepath.Join(top, filepath.FromSlash(name))] = lineSet{all: true}
		}
	}
	return nil
}

// parseUnifiedZero reads the output of 'git diff -U0': for each file (the
// "+++ b/NAME" line) the lines of the new side each hunk header
// "@@ -a,b +c,d @@" names, c to c+d-1 (d is 1 when left out; d is 0 for a
// pure deletion, which adds no line). The format is that of GNU diff's
// unified output as git writes it (git-diff documentation, "combined diff
// format" aside).
func parseUnifiedZero(out string) map[string]lineSet {
	res := map[string]lineSet{}
	var cur string
	sc := bufio.NewScanner(strings.NewReader(out))
	sc.Buffer(make([]byte, 1<<16), 64<<20)
	for sc.Scan() {
		line := sc.Text()
		switch {
		case strings.HasPrefix(line, "+++ "):
			// git ends the line with a tab when the name holds a space.
			name := strings.TrimSuffix(strings.TrimPrefix(line, "+++ "), "\t")
			if name == "/dev/null" {
				cur = ""
				continue
			}
			cur = strings.TrimPrefix(name, "b/")
			if _, ok := res[cur]; !ok {
				res[cur] = lineSet{lines: map[int]bool{}}
			}
		case strings.HasPrefix(line, "@@ ") && cur != "":
			start, count, ok := hunkNewSide(line)
			if !ok {
				continue
			}
			for l := start; l < start+count; l++ {
				res[cur].lines[l-1] = true
			}
		}
	}
	return res
}

// hunkNewSide reads "+c,d" from a hunk header.
func hunkNewSide(header string) (start, count int, ok bool) {
	fields := strings.Fields(header)
	if len(fields) < 3 || !strings.HasPrefix(fields[2], "+") {
		return 0, 0, false
	}
	spec := strings.TrimPrefix(fields[2], "+")
	count = 1
	if i := strings.IndexByte(spec, ','); i >= 0 {
		n, err := strconv.Atoi(spec[i+1:])
		if err != nil {
			return 0, 0, false
		}
		count, spec = n, spec[:i]
	}
	start, err := strconv.Atoi(spec)
	if err != nil {
		return 0, 0, false
	}
	return start, count, true
}

// git runs git in a folder and returns its standard output; a failure
// carries git's own message.
func git(dir string, args ...string) (string, error) {
	cmd := exec.Command("git", args...)
	cmd.Dir = dir
	cmd.Env = append(os.Environ(), "GIT_PAGER=cat", "LC_ALL=C")
	var stdout, stderr bytes.Buffer
	cmd.Stdout, cmd.Stderr = &stdout, &stderr
	if err := cmd.Run(); err != nil {
		msg := strings.TrimSpace(stderr.String())
		if msg == "" {
			msg = err.Error()
		}
		if i := strings.IndexByte(msg, '\n'); i >= 0 {
			msg = msg[:i]
		}
		return "", fmt.Errorf("git %s: %s", gitSubcommand(args), msg)
	}
	return stdout.String(), nil
}

// gitSubcommand names the git command in args for messages, past any
// "-c name=value" settings.
func gitSubcommand(args []string) string {
	for i := 0; i < len(args); i++ {
		if args[i] == "-c" {
			i++
			continue
		}
		return args[i]
	}
	return ""
}

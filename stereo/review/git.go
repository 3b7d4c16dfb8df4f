package review

import (
	"bufio"
	"bytes"
	"errors"
	"fmt"
	"io"
	"os"
	"os/exec"
	"path/filepath"
	"strconv"
	"strings"
)

// This file implements reading the earlier version of files from git:
// the repository a file lives in, a revision resolved to its commit, the
// files of a commit under a folder, and their contents, many at a time
// through one 'git cat-file --batch'.

// Repo is a git working tree.
type Repo struct {
	// Top is the top folder of the working tree, absolute, with symbolic
	// links resolved.
	Top string
}

// ErrNotRepository is returned for a folder outside every git working
// tree.
var ErrNotRepository = errors.New("not in a git repository")

// FindRepo returns the working tree that holds dir.
func FindRepo(dir string) (*Repo, error) {
	out, err := Git(dir, "rev-parse", "--show-toplevel")
	if err != nil {
		if strings.Contains(err.Error(), "not a git repository") {
			return nil, ErrNotRepository
		}
		return nil, err
	}
	return &Repo{Top: RealPath(strings.TrimSpace(out))}, nil
}

// Resolve returns the commit a revision names. A revision that names no
// commit is an error that says so.
func (r *Repo) Resolve(rev string) (string, error) {
	if rev == "" || strings.HasPrefix(rev, "-") {
		return "", fmt.Errorf("%q is not a revision", rev)
	}
	out, err := Git(r.Top, "rev-parse", "--verify", "--quiet", "--end-of-options", rev+"^{commit}")
	if err != nil {
		return "", fmt.Errorf("unknown revision %q (no commit of that name in %s)", rev, r.Top)
	}
	return strings.TrimSpace(out), nil
}

// Rel returns the path of a file relative to the top of the working
// tree, with slashes, as git names it; ok is false for a path outside it.
func (r *Repo) Rel(path string) (string, bool) {
	rel, err := filepath.Rel(r.Top, RealPath(path))
	if err != nil || rel == ".." || strings.HasPrefix(rel, ".."+string(filepath.Separator)) {
		return "", false
	}
	return filepath.ToSlash(rel), true
}

// Files lists the files of a commit below a folder (relative to the top,
// "" or "." for all), with slashes.
func (r *Repo) Files(commit, folder string) ([]string, error) {
	args := []string{"-c", "core.quotepath=off", "ls-tree", "-r", "-z", "--name-only", "--full-tree", commit}
	if folder != "" && folder != "." {
		args = append(args, "--", folder)
	}
	out, err := Git(r.Top, args...)
	if err != nil {
		return nil, err
	}
	return splitZero(out), nil
}

// WorkingFiles lists the files git sees in the working tree below a
// folder: tracked ones (also those deleted from the disk but not from
// the index) and untracked ones that are not ignored.
func (r *Repo) WorkingFiles(folder string) ([]string, error) {
	args := []string{"-c", "core.quotepath=off", "ls-files", "-z", "--cached", "--others", "--exclude-standard", "--full-name"}
	if folder != "" && folder != "." {
		args = append(args, "--", folder)
	}
	out, err := Git(r.Top, args...)
	if err != nil {
		return nil, err
	}
	return splitZero(out), nil
}

// Tracked reports whether git tracks a file (relative to the top).
func (r *Repo) Tracked(rel string) bool {
	out, err := Git(r.Top, "-c", "core.quotepath=off", "ls-files", "-z", "--full-name", "--error-unmatch", "--", rel)
	return err == nil && out != ""
}

// Blob is the content of one file at a commit; Missing is set when the
// commit has no such file.
type Blob struct {
	Content []byte
	Missing bool
}

// Read returns the contents of files (relative to the top) at a commit,
// through one git process. A file larger than limit bytes is not read:
// its Content is nil and Size says how large it is.
func (r *Repo) Read(commit string, files []string, limit int64) (map[string]Blob, map[string]int64, error) {
	blobs := make(map[string]Blob, len(files))
	large := map[string]int64{}
	if len(files) == 0 {
		return blobs, large, nil
	}
	// --batch-check first would cost a second process; the batch
	// output carries the size before the content, so an oversized blob
	// is skipped while it is read.
	cmd := exec.Command("git", "-c", "core.quotepath=off", "cat-file", "--batch")
	cmd.Dir = r.Top
	cmd.Env = gitEnv()
	var stdin bytes.Buffer
	var asked []string
	for _, f := range files {
		if strings.ContainsAny(f, "\n\r") {
			blobs[f] = Blob{Missing: true} // cat-file reads one name a line
			continue
		}
		stdin.WriteString(commit + ":" + f + "\n")
		asked = append(asked, f)
	}
	cmd.Stdin = &stdin
	var stderr bytes.Buffer
	cmd.Stderr = &stderr
	out, err := cmd.StdoutPipe()
	if err != nil {
		return nil, nil, err
	}
	if err := cmd.Start(); err != nil {
		return nil, nil, fmt.Errorf("git cat-file: %v", err)
	}
	br := bufio.NewReaderSize(out, 1<<16)
	var readErr error
	for _, f := range asked {
		header, err := br.ReadString('\n')
		if err != nil {
			readErr = fmt.Errorf("git cat-file: %v", err)
			break
		}
		fields := strings.Fields(header)
		if len(fields) >= 2 && fields[len(fields)-1] == "missing" {
			blobs[f] = Blob{Missing: true}
			continue
		}
		if len(fields) != 3 {
			readErr = fmt.Errorf("git cat-file: unexpected answer %q", strings.TrimSpace(header))
			break
		}
		size, err := strconv.ParseInt(fields[2], 10, 64)
		if err != nil {
			readErr = fmt.Errorf("git cat-file: unexpected answer %q", strings.TrimSpace(header))
			break
		}
		if fields[1] != "blob" {
			// a folder or a submodule under that name: no file
			if _, err := br.Discard(int(size) + 1); err != nil {
				readErr = err
				break
			}
			blobs[f] = Blob{Missing: true}
			continue
		}
		if size > limit {
			large[f] = size
			if _, err := br.Discard(int(size) + 1); err != nil {
				readErr = err
				break
			}
			continue
		}
		data := make([]byte, size+1)
		if _, err := io.ReadFull(br, data); err != nil {
			readErr = fmt.Errorf("git cat-file: %v", err)
			break
		}
		blobs[f] = Blob{Content: data[:size]}
	}
	io.Copy(io.Discard, br)
	if err := cmd.Wait(); err != nil && readErr == nil {
		readErr = fmt.Errorf("git cat-file: %s", firstLine(stderr.String(), err))
	}
	if readErr != nil {
		return nil, nil, readErr
	}
	return blobs, large, nil
}

// Git runs git in a folder and returns its standard output; a failure
// carries git's own first line of complaint.
func Git(dir string, args ...string) (string, error) {
	cmd := exec.Command("git", args...)
	cmd.Dir = dir
	cmd.Env = gitEnv()
	var stdout, stderr bytes.Buffer
	cmd.Stdout, cmd.Stderr = &stdout, &stderr
	if err := cmd.Run(); err != nil {
		return "", fmt.Errorf("git %s: %s", subcommand(args), firstLine(stderr.String(), err))
	}
	return stdout.String(), nil
}

// gitEnv keeps git's output parseable whatever the user set: no pager,
// the C locale, no prompts for credentials.
func gitEnv() []string {
	return append(os.Environ(), "GIT_PAGER=cat", "LC_ALL=C", "GIT_TERMINAL_PROMPT=0")
}

func firstLine(msg string, err error) string {
	msg = strings.TrimSpace(msg)
	if msg == "" {
		return err.Error()
	}
	if i := strings.IndexByte(msg, '\n'); i >= 0 {
		msg = msg[:i]
	}
	return msg
}

// subcommand names the git command in args, past "-c name=value".
func subcommand(args []string) string {
	for i := 0; i < len(args); i++ {
		if args[i] == "-c" {
			i++
			continue
		}
		return args[i]
	}
	return ""
}

func splitZero(out string) []string {
	var names []string
	for _, n := range strings.Split(out, "\x00") {
		if n != "" {
			names = append(names, n)
		}
	}
	return names
}

// RealPath makes a path comparable with the paths git prints: absolute,
// with symbolic links resolved (a temporary folder is often a link). A
// path that does not exist has its folder resolved instead.
func RealPath(p string) string {
	abs, err := filepath.Abs(p)
	if err != nil {
		return p
	}
	if real, err := filepath.EvalSymlinks(abs); err == nil {
		return real
	}
	if dir, err := filepath.EvalSymlinks(filepath.Dir(abs)); err == nil {
		return filepath.Join(dir, filepath.Base(abs))
	}
	return abs
}

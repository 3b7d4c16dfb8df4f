package main

import (
	"bufio"
	"bytes"
	"errors"
	"flag"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"runtime"
	"sort"
	"strings"
	"sync"
	"sync/atomic"

	"stereoline/notation/find"
	"stereoline/stereo/review"
)

const diffUsage = `usage: stereoline diff [--format text|json|html] [--base REV] [--key COLUMN] [--fail-on CLASSES] [PATH...]
       stereoline diff [options] OLD NEW

Says what each edited record now means compared with the git revision REV
(default HEAD): committed, staged and unstaged changes all count, as for
check --changed-since. With no PATH the current folder is reviewed. Two
files of which at least one git does not track (or that lie outside any
repository) are compared with each other directly.

Classes: rewritten, stereo-added, stereo-removed, groups-changed,
bond-flipped, epimer, diastereomer, enantiomer, constitution-changed,
unreadable, added, removed.
Records whose text did not change are not listed.

Exit status: 0 when no record is in a class named by --fail-on (by default
none is named), 1 when one is, 2 for usage errors, unreadable paths and
git errors.

options:
`

// diffOptions are the parsed command-line settings of one diff run.
type diffOptions struct {
	format  string // text, json or html
	base    string
	baseSet bool
	key     string
	failOn  map[review.Class]bool
	paths   []string
	maxSize int64 // the largest file reviewed
}

// diffFile is one file to review: its two versions and how to print it.
type diffFile struct {
	path     string // as printed
	osPath   string // the working-tree file ("" when it is gone)
	oldName  string // the old version's file name when it is another file
	old, new []byte // nil: absent on that side
	skipped  string // why it is not reviewed
	report   *review.Report
}

// diff implements 'stereoline diff'.
func diff(args []string, stdin io.Reader, stdout, stderr io.Writer) int {
	opts, status := parseDiffArgs(args, stderr)
	if status >= 0 {
		return status
	}
	run := newCheckRun(checkOptions{maxSize: opts.maxSize, jobs: runtime.GOMAXPROCS(0)}, stdin, stderr)
	var files []*diffFile
	baseName := opts.base
	direct, err := directPair(opts)
	switch {
	case err != nil:
		fmt.Fprintf(stderr, "stereoline diff: %v\n", err)
		return 2
	case direct:
		f, err := directFiles(opts.paths[0], opts.paths[1], opts.maxSize)
		if err != nil {
			fmt.Fprintf(stderr, "stereoline diff: %v\n", err)
			return 2
		}
		files = []*diffFile{f}
		baseName = opts.paths[0]
	default:
		files, err = gitFiles(run, opts)
		if err != nil {
			fmt.Fprintf(stderr, "stereoline diff: %v\n", err)
			return 2
		}
	}
	reviewAll(run, files, opts)
	for _, f := range files {
		if f.skipped != "" {
			fmt.Fprintf(stderr, "stereoline: %s: skipped: %s\n", f.path, f.skipped)
		}
	}
	out := bufio.NewWriter(stdout)
	switch opts.format {
	case "json":
		err = writeDiffJSON(out, files)
	case "html":
		err = writeDiffHTML(out, files, baseName)
	default:
		err = writeDiffText(out, files, baseName)
	}
	if err == nil {
		err = out.Flush()
	}
	if err != nil {
		fmt.Fprintf(stderr, "stereoline diff: writing the report: %v\n", err)
		return 2
	}
	sum := summarizeDiff(files)
	fmt.Fprintln(stderr, sum.line(baseName))
	if run.failed {
		return 2
	}
	for c := range opts.failOn {
		if sum.byClass[c] > 0 {
			return 1
		}
	}
	return 0
}

// parseDiffArgs reads the options; status is -1 to go on, otherwise the
// exit status to return at once. Options and paths may be mixed; "--"
// ends the options.
func parseDiffArgs(args []string, stderr io.Writer) (diffOptions, int) {
	opts := diffOptions{failOn: map[review.Class]bool{}}
	fs := flag.NewFlagSet("diff", flag.ContinueOnError)
	fs.SetOutput(stderr)
	fs.StringVar(&opts.format, "format", "text", "output format: text, json (JSON Lines) or html (one self-contained page)")
	fs.StringVar(&opts.base, "base", "HEAD", "git `revision` to compare the working tree with")
	fs.StringVar(&opts.key, "key", "", "what identifies a record: a table `column` (header or 1-based number), a 1-based field of a list line, or a member of the objects of a JSON array")
	maxSize := fs.String("max-size", defaultMaxSize, "skip files larger than this (bytes, or with a kB, MB or GB suffix)")
	failOn := fs.String("fail-on", "", "exit 1 when a record is in one of these `classes` (comma-separated)")
	fs.Usage = func() {
		fmt.Fprint(stderr, diffUsage)
		fs.PrintDefaults()
	}
	rest := args
	var tail []string
	for i, a := range args {
		if a == "--" {
			rest, tail = args[:i], args[i+1:]
			break
		}
	}
	for {
		if err := fs.Parse(rest); err != nil {
			if err == flag.ErrHelp {
				return opts, 0
			}
			return opts, 2
		}
		rest = fs.Args()
		if len(rest) == 0 {
			break
		}
		opts.paths = append(opts.paths, rest[0])
		rest = rest[1:]
	}
	opts.paths = append(opts.paths, tail...)
	fs.Visit(func(f *flag.Flag) {
		if f.Name == "base" {
			opts.baseSet = true
		}
	})
	usageErr := func(format string, a ...any) (diffOptions, int) {
		fmt.Fprintf(stderr, "stereoline diff: "+format+"\n", a...)
		return opts, 2
	}
	switch opts.format {
	case "text", "json", "html":
	default:
		return usageErr("--format: expected text, json or html, found %q", opts.format)
	}
	if opts.base == "" {
		return usageErr("--base: expected a revision")
	}
	n, err := parseSize(*maxSize)
	if err != nil {
		return usageErr("--max-size: %v", err)
	}
	opts.maxSize = n
	for _, name := range strings.Split(*failOn, ",") {
		name = strings.TrimSpace(name)
		if name == "" {
			continue
		}
		c, ok := review.ParseClass(name)
		if !ok {
			return usageErr("--fail-on: unknown class %q (expected some of %s)", name, classList())
		}
		opts.failOn[c] = true
	}
	for _, p := range opts.paths {
		if p == "-" {
			return usageErr("standard input cannot be reviewed: name files or folders")
		}
	}
	if len(opts.paths) == 0 {
		opts.paths = []string{"."}
	}
	return opts, -1
}

func classList() string {
	var names []string
	for _, c := range review.Classes() {
		names = append(names, c.String())
	}
	return strings.Join(names, ", ")
}

// directPair decides whether the two paths given are compared with each
// other rather than with git: two regular files of which at least one
// git does not track (untracked, or outside any repository), with no
// --base given.
func directPair(opts diffOptions) (bool, error) {
	if len(opts.paths) != 2 || opts.baseSet {
		return false, nil
	}
	for _, p := range opts.paths {
		st, err := os.Stat(p)
		if err != nil || !st.Mode().IsRegular() {
			return false, nil
		}
	}
	for _, p := range opts.paths {
		repo, err := review.FindRepo(filepath.Dir(review.RealPath(p)))
		if err != nil {
			return true, nil
		}
		rel, ok := repo.Rel(p)
		if !ok || !repo.Tracked(rel) {
			return true, nil
		}
	}
	return false, nil
}

// directFiles reads two files for a direct comparison; the new one's
// path is printed.
func directFiles(oldPath, newPath string, limit int64) (*diffFile, error) {
	f := &diffFile{path: filepath.ToSlash(newPath), osPath: newPath, oldName: filepath.ToSlash(oldPath)}
	var err error
	if f.old, f.skipped, err = readLimited(oldPath, limit); err != nil {
		return nil, err
	}
	if f.skipped == "" {
		if f.new, f.skipped, err = readLimited(newPath, limit); err != nil {
			return nil, err
		}
	}
	return f, nil
}

// readLimited reads a working-tree file; skipped says why it is not
// reviewed (too large, binary). A file that does not exist gives nil.
func readLimited(path string, limit int64) ([]byte, string, error) {
	fh, err := os.Open(path)
	if err != nil {
		if errors.Is(err, fs.ErrNotExist) {
			return nil, "", nil
		}
		return nil, "", err
	}
	defer fh.Close()
	data, err := io.ReadAll(io.LimitReader(fh, limit+1))
	if err != nil {
		return nil, "", fmt.Errorf("%s: %v", path, err)
	}
	if data == nil {
		data = []byte{}
	}
	if why := skipReason(data, int64(len(data)), limit); why != "" {
		return nil, why, nil
	}
	return data, "", nil
}

// skipReason says why content is not reviewed: too large, or binary (a
// NUL byte near the start, as git decides).
func skipReason(data []byte, size, limit int64) string {
	if size > limit {
		return fmt.Sprintf("larger than %d bytes (--max-size)", limit)
	}
	if bytes.IndexByte(data[:min(len(data), binaryProbe)], 0) >= 0 {
		return "binary file"
	}
	return ""
}

// gitFiles collects the files under the paths as git sees them in the
// working tree and at the base revision, and reads both versions of
// each that differ.
func gitFiles(run *checkRun, opts diffOptions) ([]*diffFile, error) {
	type repoState struct {
		repo   *review.Repo
		commit string
		files  []*diffFile
		rels   []string
	}
	repos := map[string]*repoState{}
	var order []*repoState
	var files []*diffFile
	seen := map[string]bool{}
	for _, p := range opts.paths {
		anchor := p
		for {
			if _, err := os.Stat(anchor); err == nil {
				break
			}
			parent := filepath.Dir(anchor)
			if parent == anchor {
				break
			}
			anchor = parent
		}
		dir := anchor
		if st, err := os.Stat(anchor); err != nil || !st.IsDir() {
			dir = filepath.Dir(anchor)
		}
		repo, err := review.FindRepo(dir)
		if err != nil {
			return nil, fmt.Errorf("%s: %v", p, err)
		}
		rs := repos[repo.Top]
		if rs == nil {
			commit, err := repo.Resolve(opts.base)
			if err != nil {
				return nil, fmt.Errorf("--base %s: %v", opts.base, err)
			}
			rs = &repoState{repo: repo, commit: commit}
			repos[repo.Top] = rs
			order = append(order, rs)
		}
		rel, ok := repo.Rel(p)
		if !ok {
			return nil, fmt.Errorf("%s: outside the repository at %s", p, repo.Top)
		}
		st, statErr := os.Stat(p)
		var names []string
		explicit := statErr == nil && !st.IsDir()
		if explicit {
			names = []string{rel}
		} else {
			working, err := repo.WorkingFiles(rel)
			if err != nil {
				return nil, err
			}
			based, err := repo.Files(rs.commit, rel)
			if err != nil {
				return nil, err
			}
			names = unionSorted(working, based)
			if len(names) == 0 && statErr != nil {
				run.pathError(p, statErr)
				continue
			}
		}
		for _, name := range names {
			if !explicit && !reviewable(run, repo, rel, name) {
				continue
			}
			abs := filepath.Join(repo.Top, filepath.FromSlash(name))
			if seen[abs] {
				continue
			}
			seen[abs] = true
			f := &diffFile{path: printedPath(p, rel, name, explicit), osPath: abs}
			files = append(files, f)
			rs.files = append(rs.files, f)
			rs.rels = append(rs.rels, name)
		}
	}
	for _, rs := range order {
		blobs, large, err := rs.repo.Read(rs.commit, rs.rels, opts.maxSize)
		if err != nil {
			return nil, err
		}
		for i, f := range rs.files {
			rel := rs.rels[i]
			if size, ok := large[rel]; ok {
				f.skipped = skipReason(nil, size, opts.maxSize)
				continue
			}
			if b := blobs[rel]; !b.Missing {
				f.old = b.Content
				if f.old == nil {
					f.old = []byte{}
				}
				if why := skipReason(f.old, int64(len(f.old)), opts.maxSize); why != "" {
					f.skipped, f.old = why, nil
					continue
				}
			}
			f.new, f.skipped, err = readLimited(f.osPath, opts.maxSize)
			if err != nil {
				run.pathError(f.path, err)
			}
		}
	}
	return files, nil
}

// reviewable reports whether a file git lists under a folder is one the
// checker would read there: no hidden or dependency folder on the way
// from the folder, and a host kind known by extension or configuration.
func reviewable(run *checkRun, repo *review.Repo, folder, name string) bool {
	below := name
	if folder != "." && folder != "" {
		below = strings.TrimPrefix(name, folder+"/")
	}
	parts := strings.Split(below, "/")
	for i, part := range parts {
		if find.Skipped(part, i < len(parts)-1) {
			return false
		}
	}
	return run.hostKnown(filepath.Join(repo.Top, filepath.FromSlash(name)))
}

// printedPath names a file as the user named its folder: the path given
// joined with the file's place below it.
func printedPath(given, folderRel, name string, explicit bool) string {
	if explicit {
		return filepath.ToSlash(given)
	}
	below := name
	if folderRel != "." && folderRel != "" {
		below = strings.TrimPrefix(name, folderRel+"/")
	}
	if given == "." {
		return below
	}
	return filepath.ToSlash(filepath.Join(given, filepath.FromSlash(below)))
}

func unionSorted(a, b []string) []string {
	set := map[string]bool{}
	for _, x := range a {
		set[x] = true
	}
	for _, x := range b {
		set[x] = true
	}
	out := make([]string, 0, len(set))
	for x := range set {
		out = append(out, x)
	}
	sort.Strings(out)
	return out
}

// reviewAll reviews the files whose two versions differ, several at a
// time; a file that is the same on both sides is not read further.
func reviewAll(run *checkRun, files []*diffFile, opts diffOptions) {
	eachOnAllCores(len(files), func(i int) { reviewFile(run, files[i], opts) })
}

// eachOnAllCores calls f(0) ... f(n-1) on all cores; a panic in f is
// raised again in the caller, so the command's recovery reports it.
func eachOnAllCores(n int, f func(int)) {
	var next atomic.Int64
	var wg sync.WaitGroup
	var failed atomic.Value
	for w := 0; w < min(runtime.GOMAXPROCS(0), max(n, 1)); w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			defer func() {
				if r := recover(); r != nil {
					failed.CompareAndSwap(nil, fmt.Sprint(r))
				}
			}()
			for {
				i := int(next.Add(1) - 1)
				if i >= n {
					return
				}
				f(i)
			}
		}()
	}
	wg.Wait()
	if r := failed.Load(); r != nil {
		panic(r)
	}
}

func reviewFile(run *checkRun, f *diffFile, opts diffOptions) {
	defer func() {
		if p := recover(); p != nil {
			run.pathError(f.path, fmt.Errorf("internal error: %v", p))
		}
	}()
	if f.skipped != "" || f.old == nil && f.new == nil || bytes.Equal(f.old, f.new) && f.old != nil {
		return
	}
	cfgPath := f.osPath
	lc := run.loadedFor(cfgPath)
	if lc.err != nil {
		run.configError(lc)
		return
	}
	name, oldName := filepath.ToSlash(f.osPath), f.oldName
	if oldName == "" {
		oldName = name
	}
	f.report = review.Review(lc.analyzer, review.Version{Name: oldName, Content: f.old}, review.Version{Name: name, Content: f.new}, review.Options{Key: opts.key})
}

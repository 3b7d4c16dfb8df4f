package main

import (
	"bufio"
	"bytes"
	"context"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"

	"stereoline/notation/find"
)

// checkFile is one file to check, in the order of the output.
type checkFile struct {
	path     string // as printed: slash-separated, as the user named it
	osPath   string // for opening; empty for standard input
	stdin    bool
	explicit bool // named on the command line rather than found in a folder
}

// binaryProbe is how much of a file is looked at for a NUL byte. Git
// decides "binary" the same way, on its first 8000 bytes (common
// practice).
const binaryProbe = 8000

// collect expands the command-line paths into files, in a stable order:
// paths in the order given, folders walked in lexical order by the
// finder's walk (find.WalkHosts, which the language server's workspace
// diagnostics share): hidden files and folders and dependency folders are
// skipped inside folders, but a path named on the command line is
// checked whatever its name.
func (r *checkRun) collect() []checkFile {
	var files []checkFile
	seen := map[string]bool{}
	add := func(f checkFile) {
		key := f.osPath
		if f.stdin {
			key = "\x00stdin"
		}
		if seen[key] {
			return
		}
		seen[key] = true
		files = append(files, f)
	}
	for _, p := range r.opts.paths {
		if p == "-" {
			name := r.opts.stdinName
			if name == "" {
				name = "<stdin>"
			}
			add(checkFile{path: filepath.ToSlash(name), stdin: true, explicit: true})
			continue
		}
		info, err := os.Stat(p)
		if err != nil {
			r.pathError(p, err)
			continue
		}
		if !info.IsDir() {
			add(checkFile{path: filepath.ToSlash(p), osPath: p, explicit: true})
			continue
		}
		err = find.WalkHosts(context.Background(), p, r.hostKnown, func(path string, d fs.DirEntry) error {
			add(checkFile{path: filepath.ToSlash(path), osPath: path})
			return nil
		}, r.pathError)
		if err != nil {
			r.pathError(p, err)
		}
	}
	return files
}

// hostKnown reports whether a file found in a folder is a host the finder
// searches: by its extension, or by a file pattern of its configuration.
func (r *checkRun) hostKnown(path string) bool {
	if find.KindForName(path) != find.KindUnknown {
		return true
	}
	cfg, err := r.configFor(path)
	if err != nil {
		return true // let analysis report the configuration problem
	}
	base := filepath.Base(path)
	for pat, kind := range cfg.Files {
		if ok, _ := filepath.Match(pat, base); ok && find.KindFor(kind) != find.KindUnknown {
			return true
		}
	}
	return false
}

// errSkipped says why a file was not analysed; it is not a failure.
type errSkipped struct{ reason string }

func (e errSkipped) Error() string { return e.reason }

// readCheckFile reads a file, refusing files over the size limit and
// binary files (a NUL byte near the start).
func (r *checkRun) readCheckFile(f checkFile, limit int64) ([]byte, error) {
	var src io.Reader
	if f.stdin {
		src = r.stdin
	} else {
		fh, err := os.Open(f.osPath)
		if err != nil {
			return nil, err
		}
		defer fh.Close()
		// A regular file over the limit is told by its size, unread.
		if st, err := fh.Stat(); err == nil && st.Mode().IsRegular() && st.Size() > limit {
			return nil, errTooLarge(limit)
		}
		src = fh
	}
	// Read one byte past the limit to tell "at the limit" from "over".
	// A binary file is told by its start, before the rest is read.
	br := bufio.NewReaderSize(src, binaryProbe)
	if head, _ := br.Peek(binaryProbe); bytes.IndexByte(head, 0) >= 0 {
		return nil, errSkipped{"binary file"}
	}
	data, err := io.ReadAll(io.LimitReader(br, limit+1))
	if err != nil {
		return nil, err
	}
	if int64(len(data)) > limit {
		return nil, errTooLarge(limit)
	}
	return data, nil
}

// errTooLarge is the skip of a file over the largest file scanned.
func errTooLarge(limit int64) errSkipped {
	return errSkipped{fmt.Sprintf("larger than the largest file scanned, %d bytes (--max-size, or the maxFileSize setting)", limit)}
}

// pathError reports a path that cannot be read, naming it, and marks the
// run as failed (exit status 2).
func (r *checkRun) pathError(path string, err error) {
	var pe *fs.PathError
	if errors.As(err, &pe) {
		err = pe.Err
	}
	r.mu.Lock()
	defer r.mu.Unlock()
	fmt.Fprintf(r.stderr, "stereoline: %s: %v\n", filepath.ToSlash(path), err)
	r.note(path, "error", "not checked: "+err.Error())
	r.failed = true
}

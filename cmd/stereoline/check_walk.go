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
	"sync/atomic"
	"time"

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

// fileData is a file's content as check reads it: in the heap, or, for
// a large regular file where the system allows (mapfile_linux.go),
// mapped, so that the run holds only the pages it is reading rather than
// the whole file (a list of millions of records is hundreds of MB).
type fileData struct {
	bytes  []byte
	mapped bool
	stop   chan struct{} // closed by release: the dropper ends
	ended  chan struct{} // closed by the dropper when it ends
}

// mapAtLeast is the size from which a regular file is mapped rather than
// read: below it the copy costs less than the mapping.
var mapAtLeast int64 = 16 << 20 // a variable for the tests

// dropInterval is how often the pages of a mapped file are dropped while
// it is analysed. The finder and the line tables scan the whole content
// at first (a layout pragma may sit anywhere), at some GB a second: at
// this pace not more than some tens of MB of it are ever in memory,
// where drops by records read left the whole file in memory after the
// first scan. Pages touched again (a record read again for the message
// of a relation) come back from the page cache; a drop of a mapping
// mostly out of memory costs microseconds.
var dropInterval = 10 * time.Millisecond // a variable for the tests

// mapData returns the data of a mapped file and starts its dropper.
func mapData(b []byte) fileData {
	d := fileData{bytes: b, mapped: true, stop: make(chan struct{}), ended: make(chan struct{})}
	go func() {
		defer close(d.ended)
		tick := time.NewTicker(dropInterval)
		defer tick.Stop()
		for {
			select {
			case <-d.stop:
				return
			case <-tick.C:
				dropPages(b)
			}
		}
	}()
	return d
}

// release ends the mapping of a mapped file; nothing may use the bytes
// afterwards (the findings kept are copies).
func (d *fileData) release() {
	if d.mapped {
		close(d.stop)
		<-d.ended
		unmapFile(d.bytes)
		d.bytes, d.mapped = nil, false
	}
}

// filesMapped counts the files mapped, for the tests.
var filesMapped atomic.Int64

// readCheckFile reads a file, refusing files over the size limit and
// binary files (a NUL byte near the start). The caller releases what it
// returns.
func (r *checkRun) readCheckFile(f checkFile, limit int64) (fileData, error) {
	var src io.Reader
	size := int64(-1) // unknown
	if f.stdin {
		src = r.stdin
	} else {
		fh, err := os.Open(f.osPath)
		if err != nil {
			return fileData{}, err
		}
		defer fh.Close()
		if st, err := fh.Stat(); err == nil && st.Mode().IsRegular() {
			// A regular file over the limit is told by its size, unread.
			if st.Size() > limit {
				return fileData{}, errTooLarge(limit)
			}
			size = st.Size()
			if canMap && size >= mapAtLeast {
				if b, err := mapFile(fh, size); err == nil {
					filesMapped.Add(1)
					d := mapData(b)
					if bytes.IndexByte(b[:binaryProbe], 0) >= 0 {
						d.release()
						return fileData{}, errSkipped{"binary file"}
					}
					return d, nil
				}
				// not mappable (some file systems): read it
			}
		}
		src = fh
	}
	// Read one byte past the limit to tell "at the limit" from "over".
	// A binary file is told by its start, before the rest is read.
	br := bufio.NewReaderSize(src, binaryProbe)
	if head, _ := br.Peek(binaryProbe); bytes.IndexByte(head, 0) >= 0 {
		return fileData{}, errSkipped{"binary file"}
	}
	data, err := readAllSized(io.LimitReader(br, limit+1), size)
	if err != nil {
		return fileData{}, err
	}
	if int64(len(data)) > limit {
		return fileData{}, errTooLarge(limit)
	}
	return fileData{bytes: data}, nil
}

// readAllSized is io.ReadAll with room for size bytes made at once when
// the size is known (>= 0): a file is not copied through ever larger
// buffers, which for a large one briefly held it about twice.
func readAllSized(r io.Reader, size int64) ([]byte, error) {
	if size < 0 || size >= 1<<40 {
		return io.ReadAll(r)
	}
	b := make([]byte, 0, int(size)+1) // the byte past the limit, or EOF
	for {
		n, err := r.Read(b[len(b):cap(b)])
		b = b[:len(b)+n]
		if err == io.EOF {
			return b, nil
		}
		if err != nil {
			return b, err
		}
		if len(b) == cap(b) { // the file grew since its size was taken
			b = append(b, 0)[:len(b)]
		}
	}
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

package main

import (
	"cmp"
	"errors"
	"fmt"
	"io"
	"iter"
	"math"
	"os"
	"path/filepath"
	"runtime/debug"
	"slices"
	"sync"
	"sync/atomic"
	"time"

	"stereoline/lsp"
	"stereoline/notation"
	"stereoline/notation/find"
	"stereoline/stereo/document"
)

// checkRun is the state of one 'stereoline check' invocation.
type checkRun struct {
	opts   checkOptions
	stdin  io.Reader
	stderr io.Writer

	mu          sync.Mutex // guards failed, cfgReported, notes and writes to stderr
	failed      bool
	cfgReported map[*loadedConfig]bool
	notes       []runNote // what was said on standard error, for a SARIF log

	cfgMu        sync.Mutex
	configs      map[string]*loadedConfig // by configuration file path
	dirConfig    map[string]*loadedConfig // by absolute folder
	baseAnalyzer *document.Analyzer

	changes *changedLines // nil unless --changed-since
}

func newCheckRun(opts checkOptions, stdin io.Reader, stderr io.Writer) *checkRun {
	return &checkRun{
		opts: opts, stdin: stdin, stderr: stderr,
		configs: map[string]*loadedConfig{}, dirConfig: map[string]*loadedConfig{},
		cfgReported: map[*loadedConfig]bool{},
	}
}

// runNote is a note of the run about a file rather than a finding in
// it: a file skipped, a path that cannot be read, a bad configuration.
type runNote struct {
	path  string // "" when the note is about no one file
	level string // SARIF: "warning" for a skip, "error" for a failure
	text  string
}

// note keeps a note for the report; r.mu must be held.
func (r *checkRun) note(path, level, text string) {
	r.notes = append(r.notes, runNote{path: filepath.ToSlash(path), level: level, text: text})
}

// sortedNotes returns the notes by path, then text: workers add them in
// any order.
func (r *checkRun) sortedNotes() []runNote {
	r.mu.Lock()
	defer r.mu.Unlock()
	ns := slices.Clone(r.notes)
	slices.SortStableFunc(ns, func(a, b runNote) int {
		if c := cmp.Compare(a.path, b.path); c != 0 {
			return c
		}
		return cmp.Compare(a.text, b.text)
	})
	return ns
}

// position is one end of a finding's range in the three conventions the
// output formats need.
type position struct {
	Line   int // 0-based
	Char16 int // 0-based, UTF-16 code units (LSP)
	CharCP int // 0-based, Unicode code points (text and SARIF columns)
}

// finding is one diagnostic ready to print.
type finding struct {
	Start, End position
	Severity   notation.Severity
	Code       notation.Code
	Message    string
}

// fileReport is what one checked file contributed.
type fileReport struct {
	Path     string
	Skipped  string // why the file was not analysed, if it was not
	Records  int
	Findings findingList
}

// analyzeAll analyses the files on --jobs workers and hands each report
// to each in the order of files, whatever order the workers finish in, so
// output is the same on one core and on many. A report is handed over as
// soon as it and every report before it are done, so a run keeps only
// the reports of files finished ahead of a slower one, not all of them.
// each is called by one goroutine at a time.
func (r *checkRun) analyzeAll(files []checkFile, each func(fileReport)) {
	var next, done atomic.Int64
	stop := r.startProgress(len(files), &done)
	var (
		seqMu   sync.Mutex
		pending = map[int]fileReport{}
		head    int
	)
	finished := func(i int, rep fileReport) {
		seqMu.Lock()
		defer seqMu.Unlock()
		pending[i] = rep
		for {
			rep, ok := pending[head]
			if !ok {
				return
			}
			delete(pending, head)
			head++
			each(rep)
		}
	}
	var wg sync.WaitGroup
	for w := 0; w < min(r.opts.jobs, max(len(files), 1)); w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for {
				i := int(next.Add(1) - 1)
				if i >= len(files) {
					return
				}
				finished(i, r.analyzeFile(files[i]))
				done.Add(1)
			}
		}()
	}
	wg.Wait()
	stop()
}

// analyzeFile reads and analyses one file. A panic in the engine is
// reported against the file instead of ending the run.
func (r *checkRun) analyzeFile(f checkFile) (rep fileReport) {
	rep.Path = f.path
	var data fileData
	defer func() {
		if p := recover(); p != nil {
			r.pathError(f.path, readFailure(p, data.mapped))
		}
		data.release()
	}()
	defer debug.SetPanicOnFault(debug.SetPanicOnFault(true)) // a mapped file cut short
	data, lc, skipped, ok := r.readForAnalysis(f)
	if !ok {
		rep.Skipped = skipped
		return rep
	}
	// The findings stream out of the engine a chunk of records at a time
	// and are converted to positions chunk by chunk: only the compact
	// findings are kept, so memory grows with them rather than with the
	// analyses, or the engine's diagnostics, of a long list.
	conv := r.newConverter(f, data.bytes)
	rep.Records = lc.analyzer.WithoutFixes().Stream(f.path, "", data.bytes, func(ds []document.Diagnostic) { // check prints no fixes
		sortDiagnostics(ds) // the slice is ours (Stream)
		for i := range ds {
			conv.add(&ds[i])
		}
	})
	rep.Findings = conv.done()
	return rep
}

// readFailure is the error a panic while reading a file is reported as:
// a fault in a mapped file means the file was cut short while it was
// read (debug.SetPanicOnFault); anything else is the engine's.
func readFailure(p any, mapped bool) error {
	if _, fault := p.(interface{ Addr() uintptr }); fault && mapped {
		return errors.New("the file changed (was cut short) while it was read")
	}
	return fmt.Errorf("internal error: %v", p)
}

// sortDiagnostics puts findings in the order of Analyze: by host span,
// relations after the other findings at the same span.
func sortDiagnostics(ds []document.Diagnostic) {
	slices.SortStableFunc(ds, func(x, y document.Diagnostic) int {
		if c := cmp.Compare(x.Span.Start, y.Span.Start); c != 0 {
			return c
		}
		if c := cmp.Compare(x.Span.End, y.Span.End); c != 0 {
			return c
		}
		return cmp.Compare(b2i(document.IsRelation(x.Code)), b2i(document.IsRelation(y.Code)))
	})
}

// compareFindings is sortDiagnostics's order on converted findings:
// lines and characters grow with byte offsets, so it is the same order.
func compareFindings(x, y finding) int {
	if c := comparePositions(x.Start, y.Start); c != 0 {
		return c
	}
	if c := comparePositions(x.End, y.End); c != 0 {
		return c
	}
	return cmp.Compare(b2i(document.IsRelation(x.Code)), b2i(document.IsRelation(y.Code)))
}

func comparePositions(a, b position) int {
	if c := cmp.Compare(a.Line, b.Line); c != 0 {
		return c
	}
	return cmp.Compare(a.Char16, b.Char16)
}

func b2i(b bool) int {
	if b {
		return 1
	}
	return 0
}

// readForAnalysis reads a file under the size limit of its configuration
// (--max-size wins over the maxFileSize setting; a list or table named on
// the command line has none unless one of them is set) and returns it
// with the configuration; ok is false when the file is not to be analysed: a
// failure, reported, or a skip (skipped says why).
func (r *checkRun) readForAnalysis(f checkFile) (data fileData, lc *loadedConfig, skipped string, ok bool) {
	cfgPath := f.osPath
	if f.stdin {
		cfgPath = filepath.FromSlash(f.path)
	}
	lc = r.loadedFor(cfgPath)
	if lc.err != nil {
		r.configError(lc)
		return fileData{}, nil, "", false
	}
	limit := r.opts.maxSize
	if limit == 0 {
		limit = lc.maxSize
		if f.explicit && !f.stdin && !lc.sizeSet && find.BoundedByName(f.path) {
			// a list or table the user named is checked whatever its
			// size: its records are read a chunk at a time from the
			// mapped file, so memory does not grow with it
			limit = math.MaxInt64 - 1 // and readCheckFile reads one byte more
		}
	}
	data, err := r.readCheckFile(f, limit)
	if err != nil {
		var skip errSkipped
		if errors.As(err, &skip) {
			if f.explicit || skip.reason != "binary file" {
				r.mu.Lock()
				fmt.Fprintf(r.stderr, "stereoline: %s: skipped: %s\n", f.path, skip.reason)
				r.note(f.path, "warning", "not checked: "+skip.reason)
				r.mu.Unlock()
			}
			return fileData{}, lc, skip.reason, false
		}
		r.pathError(f.path, err)
		return fileData{}, lc, "", false
	}
	return data, lc, "", true
}

// configError reports a bad configuration file once.
func (r *checkRun) configError(lc *loadedConfig) {
	r.mu.Lock()
	defer r.mu.Unlock()
	if !r.cfgReported[lc] {
		r.cfgReported[lc] = true
		fmt.Fprintf(r.stderr, "stereoline: %v\n", lc.err)
		r.note("", "error", lc.err.Error())
	}
	r.failed = true
}

// converter turns the engine's diagnostics (host byte offsets) into the
// positions of the output formats as they stream in, keeping only
// changed lines when asked.
type converter struct {
	content  []byte
	m16, m32 *lsp.BlockMapper // built on the first finding
	filter   bool
	changed  lineSet
	out      findingList // in compareFindings order
	last     finding     // the last finding added to out
	// runs are earlier lists in compareFindings order: a finding that
	// comes before the last one starts a new list (the relations of a
	// list related in parts, query patterns), and done merges them.
	runs []findingList
}

// mapperBlock is the number of lines of a block of the positions' line
// table (lsp.BlockMapper): some hundreds of KB of a list.
const mapperBlock = 4096

// maxRuns bounds the sorted lists a converter holds before it merges
// them into one; runHold is what each list after the first keeps in
// memory before it writes to its temporary file.
const (
	maxRuns = 16
	runHold = 1 << 20
)

func (r *checkRun) newConverter(f checkFile, content []byte) *converter {
	c := &converter{content: content}
	if r.changes != nil {
		c.filter, c.changed = true, r.changes.forFile(f)
	}
	return c
}

// pos converts a byte offset. The language server's mapper is the one
// place that turns byte offsets into lines and characters, so check and
// the editor agree; text and SARIF columns count code points (its UTF-32
// encoding), JSON Lines count UTF-16 units as LSP does.
func (c *converter) pos(off int) position {
	if c.m16 == nil {
		// the findings come in order, but for a few runs: a table of
		// blocks, not of every line of a long list
		c.m16 = lsp.NewBlockMapper(c.content, lsp.EncodingUTF16, mapperBlock)
		c.m32 = c.m16.WithEncoding(lsp.EncodingUTF32) // one table
	}
	off = max(0, min(off, len(c.content)))
	p16, err16 := c.m16.OffsetToPosition(off)
	p32, err32 := c.m32.OffsetToPosition(off)
	if err16 != nil || err32 != nil {
		return position{} // unreachable: off is clamped to the text
	}
	return position{Line: int(p16.Line), Char16: int(p16.Character), CharCP: int(p32.Character)}
}

// add converts one diagnostic; the strings are shared, nothing else of
// it is kept.
func (c *converter) add(d *document.Diagnostic) {
	fd := finding{Start: c.pos(d.Span.Start), End: c.pos(d.Span.End), Severity: d.Severity, Code: d.Code, Message: d.Message}
	if c.filter && !c.changed.touches(fd.Start, fd.End) {
		return
	}
	c.addFinding(fd)
}

// addFinding adds a converted finding.
func (c *converter) addFinding(fd finding) {
	if c.out.Len() > 0 && compareFindings(c.last, fd) > 0 {
		c.out.done()
		c.runs = append(c.runs, c.out)
		if len(c.runs) == maxRuns {
			// the runs after the first (the records' own findings, the
			// longest) are merged into one, which keeps their place in
			// the order of runs and so the merge stable
			c.runs = append(c.runs[:1:1], mergeRuns(c.runs[1:], runHold))
		}
		c.out = findingList{hold: runHold}
	}
	c.out.add(fd)
	c.last = fd
}

// done returns the findings in sortDiagnostics order. The engine streams
// them in host order but for what it emits out of order: each run of
// findings in order is a sorted list, and a stable sort of runs each
// sorted stably is their merge, ties taken from the earlier run.
func (c *converter) done() findingList {
	if len(c.runs) > 0 {
		c.out.done()
		c.out = mergeRuns(append(c.runs, c.out), 0)
		c.runs = nil
	}
	c.out.done()
	return c.out
}

// mergeRuns merges lists in compareFindings order into one, stably (a
// tie goes to the earlier list), and closes them; the result keeps hold
// bytes in memory before it writes to its temporary file (0: the
// default). A failure to read one back is the result's Err.
func mergeRuns(runs []findingList, hold int) findingList {
	out := findingList{hold: hold}
	type head struct {
		f    finding
		ok   bool
		next func() (finding, bool)
		stop func()
	}
	heads := make([]head, len(runs))
	for k := range runs {
		next, stop := iter.Pull(runs[k].All())
		f, ok := next()
		heads[k] = head{f, ok, next, stop}
	}
	for {
		best := -1
		for k := range heads {
			if heads[k].ok && (best < 0 || compareFindings(heads[k].f, heads[best].f) < 0) {
				best = k
			}
		}
		if best < 0 {
			break
		}
		out.add(heads[best].f)
		heads[best].f, heads[best].ok = heads[best].next()
	}
	for k := range heads {
		heads[k].stop()
		if err := runs[k].Err(); err != nil && out.err == nil {
			out.err = err
		}
		runs[k].close()
	}
	out.done()
	return out
}

// startProgress shows "checked N/M files" on stderr while a run takes
// longer than a moment, and only when stderr is a terminal: a CI log gets
// no carriage returns. The returned function clears the line.
func (r *checkRun) startProgress(total int, done *atomic.Int64) func() {
	if !isTerminal(r.stderr) || total < 2 {
		return func() {}
	}
	quit := make(chan struct{})
	finished := make(chan struct{})
	go func() {
		defer close(finished)
		shown := false
		delay := time.NewTimer(500 * time.Millisecond)
		defer delay.Stop()
		tick := time.NewTicker(100 * time.Millisecond)
		defer tick.Stop()
		for {
			select {
			case <-quit:
				if shown {
					r.mu.Lock()
					fmt.Fprint(r.stderr, "\r\x1b[K")
					r.mu.Unlock()
				}
				return
			case <-delay.C:
				shown = true
			case <-tick.C:
				if shown {
					r.mu.Lock()
					fmt.Fprintf(r.stderr, "\rchecked %d/%d files", done.Load(), total)
					r.mu.Unlock()
				}
			}
		}
	}()
	return func() { close(quit); <-finished }
}

// isTerminal reports whether w is a character device (a terminal), the
// usual test for interactive output without a terminal library.
func isTerminal(w io.Writer) bool {
	f, ok := w.(*os.File)
	if !ok {
		return false
	}
	st, err := f.Stat()
	return err == nil && st.Mode()&os.ModeCharDevice != 0
}

package main

import (
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"sort"
	"sync"
	"sync/atomic"
	"time"

	"stereoline/lsp"
	"stereoline/notation"
	"stereoline/stereo/document"
)

// checkRun is the state of one 'stereoline check' invocation.
type checkRun struct {
	opts   checkOptions
	stdin  io.Reader
	stderr io.Writer

	mu          sync.Mutex // guards failed, cfgReported and writes to stderr
	failed      bool
	cfgReported map[*loadedConfig]bool

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
	Findings []finding
}

// analyzeAll analyses the files on --jobs workers. Reports come back in
// the order of files, whatever order the workers finish in, so output is
// the same on one core and on many.
func (r *checkRun) analyzeAll(files []checkFile) []fileReport {
	reports := make([]fileReport, len(files))
	var next, done atomic.Int64
	stop := r.startProgress(len(files), &done)
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
				reports[i] = r.analyzeFile(files[i])
				done.Add(1)
			}
		}()
	}
	wg.Wait()
	stop()
	return reports
}

// analyzeFile reads and analyses one file. A panic in the engine is
// reported against the file instead of ending the run.
func (r *checkRun) analyzeFile(f checkFile) (rep fileReport) {
	rep.Path = f.path
	defer func() {
		if p := recover(); p != nil {
			r.pathError(f.path, fmt.Errorf("internal error: %v", p))
		}
	}()
	data, lc, skipped, ok := r.readForAnalysis(f)
	if !ok {
		rep.Skipped = skipped
		return rep
	}
	// The findings stream out of the engine a chunk of records at a time;
	// only they are kept, converted to positions, so memory grows with
	// the findings rather than with the analyses of a long list.
	var diags []document.Diagnostic
	rep.Records = lc.analyzer.Stream(f.path, "", data, func(ds []document.Diagnostic) {
		for _, d := range ds {
			d.Fixes, d.Related = nil, nil
			diags = append(diags, d)
		}
	})
	// The order of Analyze: by host span, relations after the other
	// findings at the same span.
	sort.SliceStable(diags, func(i, j int) bool {
		x, y := diags[i], diags[j]
		if x.Span.Start != y.Span.Start {
			return x.Span.Start < y.Span.Start
		}
		if x.Span.End != y.Span.End {
			return x.Span.End < y.Span.End
		}
		return !document.IsRelation(x.Code) && document.IsRelation(y.Code)
	})
	rep.Findings = r.findings(f, data, diags)
	return rep
}

// readForAnalysis reads a file under the size limit of its configuration
// (--max-size wins over the maxFileSize setting) and returns it with the
// configuration; ok is false when the file is not to be analysed: a
// failure, reported, or a skip (skipped says why).
func (r *checkRun) readForAnalysis(f checkFile) (data []byte, lc *loadedConfig, skipped string, ok bool) {
	cfgPath := f.osPath
	if f.stdin {
		cfgPath = filepath.FromSlash(f.path)
	}
	lc = r.loadedFor(cfgPath)
	if lc.err != nil {
		r.configError(lc)
		return nil, nil, "", false
	}
	limit := r.opts.maxSize
	if limit == 0 {
		limit = lc.maxSize
	}
	data, err := r.readCheckFile(f, limit)
	if err != nil {
		var skip errSkipped
		if errors.As(err, &skip) {
			if f.explicit || skip.reason != "binary file" {
				r.mu.Lock()
				fmt.Fprintf(r.stderr, "stereoline: %s: skipped: %s\n", f.path, skip.reason)
				r.mu.Unlock()
			}
			return nil, lc, skip.reason, false
		}
		r.pathError(f.path, err)
		return nil, lc, "", false
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
	}
	r.failed = true
}

// findings converts the engine's diagnostics (host byte offsets) to the
// positions of the output formats, keeping only changed lines when asked.
func (r *checkRun) findings(f checkFile, content []byte, diags []document.Diagnostic) []finding {
	if len(diags) == 0 {
		return nil
	}
	// The language server's mapper is the one place that turns byte
	// offsets into lines and characters, so check and the editor agree;
	// text and SARIF columns count code points (its UTF-32 encoding),
	// JSON Lines count UTF-16 units as LSP does.
	m16 := lsp.NewMapper(content, lsp.EncodingUTF16)
	m32 := lsp.NewMapper(content, lsp.EncodingUTF32)
	pos := func(off int) position {
		off = max(0, min(off, len(content)))
		p16, err16 := m16.OffsetToPosition(off)
		p32, err32 := m32.OffsetToPosition(off)
		if err16 != nil || err32 != nil {
			return position{} // unreachable: off is clamped to the text
		}
		return position{Line: int(p16.Line), Char16: int(p16.Character), CharCP: int(p32.Character)}
	}
	var changed lineSet
	if r.changes != nil {
		changed = r.changes.forFile(f)
	}
	out := make([]finding, 0, len(diags))
	for _, d := range diags {
		fd := finding{Start: pos(d.Span.Start), End: pos(d.Span.End), Severity: d.Severity, Code: d.Code, Message: d.Message}
		if r.changes != nil && !changed.touches(fd.Start, fd.End) {
			continue
		}
		out = append(out, fd)
	}
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

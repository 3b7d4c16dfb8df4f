package lsp

import (
	"context"
	"errors"
	"fmt"
	"path"
	"runtime"
	"runtime/metrics"
	"sync"
	"sync/atomic"
	"time"

	"go.lsp.dev/protocol"
	"go.uber.org/zap"

	"stereoline/stereo/document"
)

// analysis is the engine's result for one document version under one
// configuration. It is computed at most once, by whoever needs it first
// (the diagnostics worker or a request), on a goroutine of its own, so a
// cancelled request stops waiting without wasting the work.
//
// It comes in two stages: the records with their own findings, then the
// whole result with the relations between the records of a list, which
// can take longer than everything else on a large list. Requests wait
// for the whole result; the worker may publish the first stage before.
type analysis struct {
	file   *fileVersion
	config configured
	// prev is the analysis of the version this one was edited from,
	// under the same configuration, or nil: when its result (or that of
	// an earlier version in the chain) is ready, the engine reads again
	// only what the edits touched. It is dropped once the analysis
	// starts, so versions do not hold on to each other.
	prev atomic.Pointer[analysis]

	once sync.Once

	recordsDone chan struct{} // closed when records is set, or the analysis failed
	records     *document.Result
	recordsTook time.Duration // how long the first stage took, set with records

	done   chan struct{}
	took   time.Duration // how long the whole analysis took, set before done is closed
	result *document.Result
	err    error
	// tooLarge is set when the document is larger than the
	// maxDocumentSize setting: its result is empty.
	tooLarge bool
}

func newAnalysis(f *fileVersion, c configured) *analysis {
	return &analysis{file: f, config: c, recordsDone: make(chan struct{}), done: make(chan struct{})}
}

// errAnalysis is returned when the engine panicked on a document; the
// panic itself is logged where it happened.
var errAnalysis = errors.New("internal error while analysing the document")

// get returns the result, starting the analysis if nobody has, and
// waiting for it unless ctx ends first.
func (a *analysis) get(ctx context.Context, log *zap.Logger) (*document.Result, error) {
	a.start(log)
	select {
	case <-a.done:
		return a.result, a.err
	case <-ctx.Done():
		return nil, ctx.Err()
	}
}

// start starts the analysis unless it has started.
func (a *analysis) start(log *zap.Logger) { a.once.Do(func() { go a.run(log) }) }

func (a *analysis) run(log *zap.Logger) {
	recordsClosed := false
	closeRecords := func() {
		if !recordsClosed {
			recordsClosed = true
			close(a.recordsDone)
		}
	}
	start, faults := time.Now(), minorFaults(log)
	defer close(a.done)
	defer func() { a.took = time.Since(start) }()
	defer closeRecords() // after a panic in the first stage
	defer func() {
		if r := recover(); r != nil {
			log.Error("internal error", zap.String("uri", a.file.URI), zap.Int32("version", a.file.Version),
				zap.Any("panic", r), zap.Stack("stack"))
			a.result, a.err = nil, errAnalysis
		}
	}()
	cfg := a.config.analyzer.Config()
	if content := a.file.content(); len(content) > cfg.DocumentLimit() {
		a.prev.Store(nil)
		a.tooLarge = true
		a.result = a.config.analyzer.Analyze(a.file.Name, a.file.LanguageID, nil)
		a.records = a.result
		closeRecords()
		return
	}
	if prev := a.previousResult(); prev != nil {
		a.result = a.config.analyzer.Reanalyze(prev, a.file.Name, a.file.LanguageID, a.file.content())
		a.records = a.result
		closeRecords()
		log.Debug("analysed again", zap.String("uri", a.file.URI), zap.Int32("version", a.file.Version),
			zap.Int("records", len(a.result.Records)), zap.Duration("took", time.Since(start)),
			zap.Int64("page faults", minorFaults(log)-faults))
		return
	}
	a.records = a.config.analyzer.AnalyzeRecords(a.file.Name, a.file.LanguageID, a.file.content())
	recorded := time.Since(start)
	a.recordsTook = recorded
	closeRecords()
	a.result = a.records.Relate()
	log.Debug("analysed", zap.String("uri", a.file.URI), zap.Int32("version", a.file.Version),
		zap.Int("records", len(a.result.Records)), zap.Duration("records took", recorded), zap.Duration("took", time.Since(start)))
}

// quick reports whether a's analysis is done, without error, and took
// less than d.
func (a *analysis) quick(d time.Duration) bool {
	return a != nil && a.finished() && a.err == nil && a.took < d
}

// previousResult returns the result of the nearest earlier version
// whose analysis is done, or nil, and drops the chain.
func (a *analysis) previousResult() *document.Result {
	for p := a.prev.Swap(nil); p != nil; p = p.prev.Load() {
		if p.finished() {
			return p.result
		}
	}
	return nil
}

// getRecords returns the first stage, starting the analysis if nobody
// has, and waiting for it unless ctx ends first.
func (a *analysis) getRecords(ctx context.Context, log *zap.Logger) (*document.Result, error) {
	a.start(log)
	select {
	case <-a.recordsDone:
		if a.records == nil {
			return nil, errAnalysis // the first stage panicked; the log says why
		}
		return a.records, nil
	case <-ctx.Done():
		return nil, ctx.Err()
	}
}

// finished reports whether the whole result is ready.
func (a *analysis) finished() bool {
	select {
	case <-a.done:
		return true
	default:
		return false
	}
}

// result is the common start of every document request: the document, its
// analysis, or ok false when the document is not open.
func (s *Server) result(ctx context.Context, snap *snapshot, uri string) (*fileVersion, *document.Result, bool, error) {
	f, a, ok := snap.lookup(uri)
	if !ok {
		return nil, nil, false, nil
	}
	res, err := a.get(ctx, s.log)
	if err != nil {
		return nil, nil, false, err
	}
	return f, res, true, nil
}

// worker analyses documents after they change and publishes their
// diagnostics. Edits are debounced per document: a document is published
// once its last change is older than the debounce time, and only its
// latest version is. Its analysis starts then too, or at once when the
// version before was analysed in less than the debounce (change, in
// sync.go), with its publication made before the debounce ends
// (prepare): a one-line edit of a list of 100,000 records is then
// analysed while the server waits for the typing to pause. Documents are
// published concurrently, so a small file is not kept waiting behind a
// large one, but at most one publication per document runs at a time: a
// version that arrives while one is being analysed is published after
// it.
type worker struct {
	s        *Server
	mu       sync.Mutex
	due      map[string]time.Time
	inflight map[string]bool
	again    map[string]bool
	sent     map[string]bool // documents with diagnostics on the client
	// published holds the last publication made of each open document,
	// for the next to take the JSON of unchanged findings from; it is
	// read or replaced only with making held
	published map[string]*publication
	// making is held while a publication is made from the last one and
	// written, or the last one dropped: the next may give buffers of the
	// last back for reuse only once its parts are written (prepare makes
	// one outside publishOnce)
	making sync.Mutex
	wake   chan struct{}
	// collecting is set while an idle collection runs (collectIfIdle);
	// collected is closed when the last one started ends
	collecting atomic.Bool
	collected  atomic.Pointer[chan struct{}]
	pub        sync.Mutex // orders the check that a version is current with its publication
}

func newWorker(s *Server) *worker {
	return &worker{
		s:         s,
		due:       map[string]time.Time{},
		inflight:  map[string]bool{},
		again:     map[string]bool{},
		sent:      map[string]bool{},
		published: map[string]*publication{},
		wake:      make(chan struct{}, 1),
	}
}

// schedule asks for uri to be published after delay (0: now). The
// debounce of an edit is quiet time for a collection (collectIfIdle).
func (w *worker) schedule(uri string, delay time.Duration) {
	w.mu.Lock()
	w.due[uri] = time.Now().Add(delay)
	w.mu.Unlock()
	select {
	case w.wake <- struct{}{}:
	default:
	}
	if delay >= collectSlack {
		w.collectIfIdle()
	}
}

// take removes and returns the documents that are due and not being
// published, and the time the next one will be due.
func (w *worker) take(now time.Time) (ready []string, next time.Time) {
	w.mu.Lock()
	defer w.mu.Unlock()
	for uri, t := range w.due {
		if !t.After(now) {
			delete(w.due, uri)
			if w.inflight[uri] {
				w.again[uri] = true
				continue
			}
			w.inflight[uri] = true
			ready = append(ready, uri)
		} else if next.IsZero() || t.Before(next) {
			next = t
		}
	}
	return ready, next
}

func (w *worker) run(ctx context.Context) {
	timer := time.NewTimer(time.Hour)
	defer timer.Stop()
	for {
		ready, next := w.take(time.Now())
		for _, uri := range ready {
			go w.publishOnce(ctx, uri)
		}
		wait := time.Hour
		if !next.IsZero() {
			wait = time.Until(next)
		}
		timer.Reset(wait)
		select {
		case <-ctx.Done():
			return
		case <-w.wake:
		case <-timer.C:
		}
		if !timer.Stop() {
			select {
			case <-timer.C:
			default:
			}
		}
	}
}

// publishOnce publishes uri, then again if it changed meanwhile.
func (w *worker) publishOnce(ctx context.Context, uri string) {
	w.awaitCollection()
	w.publish(ctx, uri)
	w.mu.Lock()
	delete(w.inflight, uri)
	again := w.again[uri]
	delete(w.again, uri)
	w.mu.Unlock()
	if again {
		w.schedule(uri, 0)
		return
	}
	// The garbage of this publication is collected in the debounce of
	// the next edit (schedule): collected now, the collection would run
	// while the next edit is read, or the requests that follow an edit
	// (hovers, code actions) are answered, and slow them.
}

// collectSlack is the least time before the next analysis is due that a
// collection may start in: it takes some 50 ms on two cores for a live
// heap of 200 MB, mostly in the debounce of the edit that arrived.
const collectSlack = 50 * time.Millisecond

// idleGarbage is how much garbage the heap must hold for an idle worker
// to collect it: about half of what one edit of a list of 100,000
// records leaves behind (its arrays of records, parts of findings, the
// text and the JSON written afresh, some 30 MB). Smaller documents
// seldom get there. The garbage of a large one is collected in the
// debounce of each edit: the edit then finds the memory the last one
// freed, already touched, where it would otherwise grow the heap into
// memory the process must fault in, which on some virtual machines
// costs more than the edit's work. On the 100,000-record list
// (lsp/testdata/scaleclient, 5 edits of each kind, with the publication
// buffers pooled and the debounce counted from the change's arrival)
// the edits took 26-36 ms (a mark), 29-33 (a title), 52-56 (an insert)
// and 48-71 ms (a delete) net of the debounce, and the peak RSS was
// 400 MB after 1,000 hovers; with the idle collection at 96 MB of
// garbage, after publications, they had taken 50-70, 26-47, 53-67 and
// 50-69 ms, and the peak RSS 390-420 MB.
const idleGarbage = 16 << 20

// collectIfIdle runs a garbage collection when no document is being
// analysed or published, none is due within collectSlack, and the last
// publications left much garbage: the collection then runs in quiet time
// (the debounce of the edit that just arrived) rather than during an
// edit's analysis, which it would slow on a machine of few cores (with a
// live heap of 200 MB, a collection costs about 100 ms of processor
// time).
func (w *worker) collectIfIdle() {
	w.mu.Lock()
	idle := len(w.inflight) == 0
	soon := time.Now().Add(collectSlack)
	for _, t := range w.due {
		if t.Before(soon) {
			idle = false
		}
	}
	w.mu.Unlock()
	if !idle || heapGarbage() < idleGarbage || !w.collecting.CompareAndSwap(false, true) {
		return
	}
	done := make(chan struct{})
	w.collected.Store(&done)
	go func() {
		defer func() {
			w.collecting.Store(false)
			close(done)
		}()
		begun, garbage := time.Now(), heapGarbage()
		runtime.GC()
		if w.s != nil {
			w.s.log.Debug("collected", zap.Uint64("garbage MB", garbage>>20), zap.Duration("took", time.Since(begun)))
		}
	}()
}

// awaitCollection waits, for at most collectWait, for an idle collection
// that is running to end: an analysis that started during one would run
// on what the collection leaves of two cores and pay for its own
// allocations in assists.
func (w *worker) awaitCollection() {
	if !w.collecting.Load() {
		return
	}
	if done := w.collected.Load(); done != nil {
		select {
		case <-*done:
		case <-time.After(collectWait):
		}
	}
}

// collectWait bounds the wait of an analysis for an idle collection.
const collectWait = 100 * time.Millisecond

// heapGarbage is the heap held by objects beyond those the last
// collection found live: garbage, and what was allocated since.
func heapGarbage() uint64 {
	samples := []metrics.Sample{{Name: "/memory/classes/heap/objects:bytes"}, {Name: "/gc/heap/live:bytes"}}
	metrics.Read(samples)
	if samples[0].Value.Kind() != metrics.KindUint64 || samples[1].Value.Kind() != metrics.KindUint64 {
		return 0
	}
	objects, live := samples[0].Value.Uint64(), samples[1].Value.Uint64()
	if objects < live {
		return 0
	}
	return objects - live
}

// publish analyses the current version of uri and pushes its
// diagnostics, or clears them when the document was closed. A version
// that was replaced while it was analysed is not published: its
// successor is already scheduled.
func (w *worker) publish(ctx context.Context, uri string) {
	defer w.s.recoverPanic("publishDiagnostics")
	s := w.s
	f, a, open := s.current().lookup(uri)
	if !open {
		// making before pub, as send takes them
		w.making.Lock()
		defer w.making.Unlock()
		w.pub.Lock()
		defer w.pub.Unlock()
		if _, _, reopened := s.current().lookup(uri); reopened {
			return
		}
		// The clearing is sent whether or not findings were: a document
		// closed before its first publication may have one in flight,
		// and an empty list is harmless to a client that has none.
		w.mu.Lock()
		delete(w.sent, uri)
		last := w.published[uri]
		delete(w.published, uri)
		w.mu.Unlock()
		last.release(nil)
		if s.pushesDiagnostics() {
			s.notify("textDocument/publishDiagnostics", publishDiagnosticsParams{URI: uri, Diagnostics: []protocol.Diagnostic{}})
		}
		return
	}
	go w.showProgress(ctx, a)
	if !s.pushesDiagnostics() {
		a.start(s.log) // the analysis is warm for the pull that will come
		return
	}
	first, err := a.getRecords(ctx, s.log)
	if err != nil {
		return
	}
	if a.tooLarge {
		name := f.Name
		if name == "" {
			name = f.URI
		}
		s.showWarning(fmt.Sprintf("stereoline: %s is %d bytes, more than the maxDocumentSize setting (%d): it is not analysed",
			path.Base(name), len(f.content()), a.config.analyzer.Config().DocumentLimit()))
	}
	w.mu.Lock()
	shown := w.sent[uri]
	w.mu.Unlock()
	if !shown && !w.finishes(ctx, a) {
		// Nothing is shown for the document yet and its relations are
		// slow: show its own findings now. A document whose findings
		// are shown keeps them until the whole result replaces them,
		// so an edit does not make the relations blink.
		if !w.send(f, a, first) {
			return
		}
	} else {
		first = nil
	}
	if !w.await(ctx, uri, a) {
		return
	}
	if a.err != nil || first != nil && a.result.DiagnosticCount() == first.DiagnosticCount() {
		return // failed, or the relations added nothing to what was sent
	}
	w.send(f, a, a.result)
}

// finishes reports whether the whole result of a is ready within the
// relation grace time (and the share of the time its records took), so
// one publication can carry it.
func (w *worker) finishes(ctx context.Context, a *analysis) bool {
	if a.finished() {
		return true
	}
	grace := time.NewTimer(w.s.relationGrace + time.Duration(w.s.relationShare*float64(a.recordsTook)))
	defer grace.Stop()
	select {
	case <-a.done:
		return true
	case <-grace.C:
	case <-ctx.Done():
	}
	return a.finished()
}

// await waits for the whole result of a, giving up when a stops being
// the document's current analysis (an edit or a close replaced it), so a
// newer version is not kept waiting behind the relations of an old one.
func (w *worker) await(ctx context.Context, uri string, a *analysis) bool {
	for {
		s := w.s
		s.mu.Lock()
		current := s.snap.analyses[uri] == a
		changed := s.changed
		s.mu.Unlock()
		if !current {
			return false
		}
		select {
		case <-a.done:
			return true
		case <-changed:
		case <-ctx.Done():
			return false
		}
	}
}

// send publishes res for the document version of a, unless a is no
// longer the document's current analysis: a stale publication would
// replace newer findings on the client. It reports whether it sent.
func (w *worker) send(f *fileVersion, a *analysis, res *document.Result) bool {
	s := w.s
	version := f.Version
	w.making.Lock()
	defer w.making.Unlock()
	begun, faults := time.Now(), minorFaults(s.log)
	p, err := w.make(f, res)
	if err != nil {
		s.log.Error("internal error", zap.String("uri", f.URI), zap.Error(fmt.Errorf("diagnostics: %w", err)))
		return false
	}
	w.pub.Lock()
	defer w.pub.Unlock()
	if cur := s.current(); cur.analyses[f.URI] != a {
		return false
	}
	w.mu.Lock()
	w.sent[f.URI] = true
	w.mu.Unlock()
	made, madeFaults := time.Now(), minorFaults(s.log)
	s.notifyJSONParts("textDocument/publishDiagnostics", p.parts)
	s.log.Debug("published", zap.String("uri", f.URI), zap.Int32("version", version), zap.Int("parts", len(p.parts)),
		zap.Duration("made in", made.Sub(begun)), zap.Duration("written in", time.Since(made)),
		zap.Int64("page faults", minorFaults(s.log)-faults), zap.Int64("page faults writing", minorFaults(s.log)-madeFaults))
	return true
}

// make returns the publication of res for document version f, made from
// the document's last publication, which it replaces, unless that is the
// publication of res already (prepare made it). w.making must be held.
func (w *worker) make(f *fileVersion, res *document.Result) (*publication, error) {
	version := f.Version
	w.mu.Lock()
	last := w.published[f.URI]
	w.mu.Unlock()
	if last != nil && last.res == res && last.version == version && last.uri == f.URI {
		return last, nil
	}
	p, err := publish(last, f, res, &version)
	if err != nil {
		return nil, err
	}
	p.res = res
	// The last publication was written (or dropped) before this one was
	// made: its buffers this one does not use can serve the next.
	last.release(p)
	w.mu.Lock()
	w.published[f.URI] = p
	w.mu.Unlock()
	return p, nil
}

// prepare makes the publication of a's whole result, an analysis that
// ran during the debounce of its edit (change, in sync.go), so that the
// worker only writes it once the debounce ends (make finds it). It makes
// nothing when a is no longer the document's current analysis, failed,
// or would not be published as a whole: a document that shows nothing
// yet may have its records' own findings published first.
func (w *worker) prepare(a *analysis) {
	s := w.s
	defer s.recoverPanic("prepare diagnostics")
	if !s.pushesDiagnostics() || a.err != nil || a.result == nil || a.tooLarge {
		return
	}
	uri := a.file.URI
	w.making.Lock()
	defer w.making.Unlock()
	w.mu.Lock()
	shown := w.sent[uri]
	w.mu.Unlock()
	if _, cur, open := s.current().lookup(uri); !open || cur != a || !shown {
		return
	}
	if _, err := w.make(a.file, a.result); err != nil {
		s.log.Error("internal error", zap.String("uri", uri), zap.Error(fmt.Errorf("diagnostics: %w", err)))
	}
}

// showProgress reports an analysis that takes longer than the progress
// delay as work done progress the server starts (LSP 3.17,
// "window/workDoneProgress/create"), so a large list does not look like
// a server that hangs. It returns when the analysis is done.
func (w *worker) showProgress(ctx context.Context, a *analysis) {
	s := w.s
	s.mu.Lock()
	supported := s.caps.Window.WorkDoneProgress
	s.mu.Unlock()
	if !supported {
		return
	}
	a.start(s.log)
	delay := time.NewTimer(s.opts.ProgressDelay)
	defer delay.Stop()
	select {
	case <-a.done:
		return
	case <-ctx.Done():
		return
	case <-delay.C:
	}
	token := protocol.NewProgressToken(fmt.Sprintf("stereoline/analysis/%d", progressIDs.Add(1)))
	if err := s.callClient(ctx, "window/workDoneProgress/create", map[string]any{"token": token}, nil); err != nil {
		s.log.Info("no progress token", zap.Error(err))
		return
	}
	name := a.file.Name
	if name == "" {
		name = a.file.URI
	}
	s.notify("$/progress", progressParams{Token: token, Value: &protocol.WorkDoneProgressBegin{
		Kind:    protocol.WorkDoneProgressKindBegin,
		Title:   "Reading stereo marks",
		Message: path.Base(name),
	}})
	select {
	case <-a.done:
	case <-ctx.Done():
	}
	s.notify("$/progress", progressParams{Token: token, Value: &protocol.WorkDoneProgressEnd{Kind: protocol.WorkDoneProgressKindEnd}})
}

var progressIDs atomic.Uint64

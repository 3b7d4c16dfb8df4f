// Package lsp is the Stereoline language server. It speaks the Language
// Server Protocol over a JSON-RPC stream and answers from the document
// engine (stereoline/stereo/document); it is the only package that knows
// LSP.
//
// The layers follow one direction of knowledge: protocol glue
// (protocol.go, server.go), immutable snapshots of the open documents at
// their versions (snapshot.go), one analysis per document version
// (analysis.go), one converter between byte offsets and positions
// (mapper.go), the settings layers and the workspace folders that bound
// them (config.go, project.go, folders.go), then a thin
// handler per feature (sync.go, notebook.go, initialize.go,
// diagnostics.go, hover.go, inlay.go, codeaction.go, symbols.go).
//
// Notifications are handled in order on the connection's reader, where
// they only build a new snapshot; requests run on goroutines of their own
// against the snapshot current when they arrived, so long analysis never
// blocks the reader and $/cancelRequest can reach a running request.
package lsp

import (
	"bufio"
	"bytes"
	"context"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"strings"
	"sync"
	"time"

	"go.lsp.dev/jsonrpc2"
	"go.uber.org/zap"

	"stereoline/stereo/document"
)

// DefaultDebounce is how long the server waits after an edit before it
// analyses and publishes, so a burst of keystrokes costs one analysis.
const DefaultDebounce = 100 * time.Millisecond

// Options tune a server; the zero value is the default.
type Options struct {
	// Debounce is the quiet time after an edit before analysis; zero
	// means DefaultDebounce.
	Debounce time.Duration
	// Version is reported to the client in serverInfo.
	Version string
	// ProgressDelay is how long an analysis runs before the client is
	// shown its progress; zero means DefaultProgressDelay.
	ProgressDelay time.Duration
}

// DefaultProgressDelay keeps progress reports away from the quick
// analyses of ordinary files.
const DefaultProgressDelay = 500 * time.Millisecond

// state is where the server is in the LSP lifecycle.
type state int

const (
	stateNew         state = iota // before initialize
	stateInitialized              // initialize answered
	stateShutdown                 // shutdown answered; only exit is expected
)

// requestFunc answers one request against the snapshot current when it
// arrived. A nil result is sent as JSON null.
type requestFunc func(ctx context.Context, snap *snapshot, params json.RawMessage) (any, error)

// notificationFunc handles one notification on the reader goroutine.
type notificationFunc func(params json.RawMessage) error

// Server is one language server session on one connection.
type Server struct {
	conn jsonrpc2.Conn
	out  *tolerantStream // the stream under conn, for notifications written as JSON already
	log  *zap.Logger
	opts Options

	ctx  context.Context // cancelled when the session ends
	stop context.CancelFunc

	requests      map[string]requestFunc
	notifications map[string]notificationFunc
	preread       *prereadSlot // large didOpen frames read by the stream

	// settingsMu orders the settings the server applies, and settingsGen
	// counts them: settings pulled with workspace/configuration are
	// dropped when newer ones were applied while the client answered.
	settingsMu  sync.Mutex
	settingsGen uint64

	mu          sync.Mutex
	state       state
	caps        clientCapabilities
	drawings    drawingFolder   // files the drawing command wrote (drawing.go)
	changeCache changeCache     // base versions and reviews of the change lens (review.go)
	baseCfg     document.Config // defaults with initializationOptions applied
	snap        *snapshot
	changed     chan struct{} // closed and replaced at every new snapshot
	notebooks   map[string][]string
	running     map[jsonrpc2.ID]context.CancelFunc
	status      int
	exited      chan struct{}

	work     *worker
	projects projectConfigs

	// relationGrace is how long the worker waits, once a document's
	// records are analysed, for the relations between them before it
	// publishes the records' own findings alone (tests shorten it), and
	// relationShare the part of the time the records took that it waits
	// beyond that.
	relationGrace time.Duration
	relationShare float64
}

// defaultRelationGrace keeps the relations of an ordinary list in the
// first publication; only a list whose relations take longer is
// published twice.
const defaultRelationGrace = 50 * time.Millisecond

// defaultRelationShare keeps the relations of a large list in the first
// publication when they come soon after its records (within a fifth of
// the time the records took): an early publication of the records' own
// findings would then only delay the whole one, which the client must
// wait for while it takes the first in (100,000 records: 10 MB of JSON).
// Relations that take longer still follow a publication of their own.
const defaultRelationShare = 0.2

// Serve runs a server on a stream (standard input and output, or one end
// of a pipe in tests) until the client sends exit, the stream ends or ctx
// is cancelled. It returns the process exit status LSP 3.17 prescribes:
// 0 after shutdown then exit, 1 otherwise.
func Serve(ctx context.Context, stream io.ReadWriteCloser, log *zap.Logger, opts Options) int {
	return serve(ctx, stream, log, opts, nil)
}

// serve is Serve with a hook that tests use to add handlers.
func serve(ctx context.Context, stream io.ReadWriteCloser, log *zap.Logger, opts Options, hook func(*Server)) int {
	if log == nil {
		log = zap.NewNop()
	}
	if opts.Debounce <= 0 {
		opts.Debounce = DefaultDebounce
	}
	if opts.ProgressDelay <= 0 {
		opts.ProgressDelay = DefaultProgressDelay
	}
	s := newServer(ctx, log, opts)
	if hook != nil {
		hook(s)
	}
	frames := newFrameStream(stream)
	frames.preread = s.preread
	s.out = &tolerantStream{Stream: frames, log: log, raw: stream}
	s.conn = jsonrpc2.NewConn(s.out)
	s.conn.Go(s.ctx, s.handle)
	go s.work.run(s.ctx)

	status := 1
	select {
	case <-s.exited:
	case <-s.conn.Done():
		if err := s.conn.Err(); err != nil {
			log.Info("stream closed", zap.Error(err))
		}
	case <-ctx.Done():
	}
	// exit is handled on the reader before it reads the end of the
	// stream, so a closed exited channel always wins.
	select {
	case <-s.exited:
		s.mu.Lock()
		status = s.status
		s.mu.Unlock()
	default:
	}
	s.stop()
	s.conn.Close()
	s.drawings.clean()
	return status
}

// tolerantStream skips a message whose JSON cannot be decoded instead of
// ending the session: its frame was read whole, so the next one starts
// cleanly. Broken framing still ends the stream, as nothing after it can
// be trusted.
type tolerantStream struct {
	jsonrpc2.Stream
	log *zap.Logger
	// raw is the stream jsonrpc2.Stream writes to; mu orders the
	// messages jsonrpc2 writes with those writeNotification writes.
	raw io.Writer
	mu  sync.Mutex
}

func (t *tolerantStream) Write(ctx context.Context, msg jsonrpc2.Message) (int64, error) {
	t.mu.Lock()
	defer t.mu.Unlock()
	return t.Stream.Write(ctx, msg)
}

// writeNotification writes a notification whose params are JSON
// already, framed as jsonrpc2 frames messages, so that megabytes of
// diagnostics are not marshalled again twice on their way out.
func (t *tolerantStream) writeNotification(method string, params ...[]byte) error {
	head := appendString([]byte(`{"jsonrpc":"2.0","method":`), method)
	head = append(head, `,"params":`...)
	n := len(head) + 1
	for _, p := range params {
		n += len(p)
	}
	t.mu.Lock()
	defer t.mu.Unlock()
	// The small parts (the frame's header, the commas between runs of
	// findings, a finding written afresh) go out together; a large part
	// is written from where it lies.
	w := bufio.NewWriterSize(t.raw, 64<<10)
	fmt.Fprintf(w, "Content-Length: %d\r\n\r\n", n)
	w.Write(head)
	for _, p := range params {
		w.Write(p)
	}
	w.WriteByte('}')
	return w.Flush()
}

func (t *tolerantStream) Read(ctx context.Context) (jsonrpc2.Message, int64, error) {
	for {
		msg, n, err := t.Stream.Read(ctx)
		if err != nil && isDecodeError(err) {
			t.log.Warn("message skipped", zap.Error(err))
			continue
		}
		return msg, n, err
	}
}

// isDecodeError tells a frame whose content is not a JSON-RPC message
// from a failure to read the stream. jsonrpc2 returns both as plain
// errors; a decode failure is the invalid-request error or an unmarshal
// error, which never wraps an I/O error.
func isDecodeError(err error) bool {
	if errors.Is(err, jsonrpc2.ErrInvalidRequest) {
		return true
	}
	return strings.HasPrefix(err.Error(), "unmarshaling jsonrpc message")
}

func newServer(ctx context.Context, log *zap.Logger, opts Options) *Server {
	s := &Server{
		log:       log,
		opts:      opts,
		baseCfg:   document.DefaultConfig(),
		changed:   make(chan struct{}),
		notebooks: map[string][]string{},
		preread:   &prereadSlot{},
		running:   map[jsonrpc2.ID]context.CancelFunc{},
		exited:    make(chan struct{}),

		relationGrace: defaultRelationGrace,
		relationShare: defaultRelationShare,
	}
	s.ctx, s.stop = context.WithCancel(ctx)
	s.snap = newSnapshot(newConfigured(document.NewAnalyzer(s.baseCfg)), EncodingUTF16)
	s.work = newWorker(s)
	s.requests = map[string]requestFunc{
		"textDocument/hover":          s.hover,
		methodInlayHint:               s.inlayHints,
		"textDocument/codeAction":     s.codeActions,
		methodCodeActionResolve:       s.resolveCodeAction,
		"textDocument/documentSymbol": s.documentSymbols,
		methodDocumentDiagnostic:      s.documentDiagnostic,
		methodWorkspaceDiagnostic:     s.workspaceDiagnostic,
		"textDocument/codeLens":       s.codeLenses,
		"workspace/executeCommand":    s.executeCommand,
	}
	s.notifications = map[string]notificationFunc{
		"initialized":                         s.initialized,
		"textDocument/didOpen":                s.didOpen,
		methodPrereadOpen:                     s.didOpenRead,
		"textDocument/didChange":              s.didChange,
		"textDocument/didClose":               s.didClose,
		"textDocument/didSave":                s.didSave,
		"workspace/didChangeWatchedFiles":     s.didChangeWatchedFiles,
		methodNotebookDidOpen:                 s.didOpenNotebook,
		methodNotebookDidChange:               s.didChangeNotebook,
		methodNotebookDidSave:                 ignore,
		methodNotebookDidClose:                s.didCloseNotebook,
		"workspace/didChangeConfiguration":    s.didChangeConfiguration,
		"$/cancelRequest":                     s.cancelRequest,
		"$/setTrace":                          ignore,
		"workspace/didChangeWorkspaceFolders": s.didChangeWorkspaceFolders,
	}
	return s
}

func ignore(json.RawMessage) error { return nil }

// handle is the connection's handler. It runs on the reader goroutine and
// must not block: it never returns an error, since jsonrpc2 closes the
// connection on one.
func (s *Server) handle(_ context.Context, reply jsonrpc2.Replier, req jsonrpc2.Request) error {
	if call, ok := req.(*jsonrpc2.Call); ok {
		s.call(call, reply)
		return nil
	}
	s.notification(req.Method(), req.Params())
	return nil
}

// notification handles a notification in order with the others.
func (s *Server) notification(method string, params json.RawMessage) {
	defer s.recoverPanic(method)
	if method == "exit" {
		s.exit()
		return
	}
	s.mu.Lock()
	st := s.state
	s.mu.Unlock()
	if st != stateInitialized {
		// LSP 3.17: notifications before initialize are dropped, and
		// after shutdown only exit is expected.
		if method == methodPrereadOpen {
			s.preread.take()
		}
		s.log.Debug("notification dropped", zap.String("method", method))
		return
	}
	h, ok := s.notifications[method]
	if !ok {
		s.log.Debug("notification not handled", zap.String("method", method))
		return
	}
	if err := h(params); err != nil {
		s.log.Warn("notification failed", zap.String("method", method), zap.Error(err))
	}
}

// call answers a request: lifecycle requests in order on the reader,
// everything else on a goroutine of its own.
func (s *Server) call(call *jsonrpc2.Call, reply jsonrpc2.Replier) {
	method := call.Method()
	send := func(result any, err error) {
		// A cancelled request context must not stop the reply itself.
		if werr := reply(context.Background(), result, err); werr != nil {
			s.log.Info("reply not sent", zap.String("method", method), zap.Error(werr))
		}
	}
	s.mu.Lock()
	st := s.state
	s.mu.Unlock()
	switch {
	case method == "initialize":
		send(s.guard(method, func() (any, error) { return s.initialize(call.Params()) }))
		return
	case st == stateNew:
		send(nil, jsonrpc2.NewError(jsonrpc2.ServerNotInitialized, "server not initialized"))
		return
	case st == stateShutdown:
		send(nil, jsonrpc2.NewError(jsonrpc2.InvalidRequest, "server is shut down"))
		return
	case method == "shutdown":
		send(s.guard(method, s.shutdown))
		return
	}
	h, ok := s.requests[method]
	if !ok {
		send(nil, jsonrpc2.Errorf(jsonrpc2.MethodNotFound, "method not found: %s", method))
		return
	}
	ctx, cancel := context.WithCancel(s.ctx)
	id := call.ID()
	s.mu.Lock()
	s.running[id] = cancel
	snap := s.snap
	s.mu.Unlock()
	go func() {
		defer cancel()
		begun := time.Now()
		result, err := s.guard(method, func() (any, error) { return h(ctx, snap, call.Params()) })
		s.log.Debug("request", zap.String("method", method), zap.Duration("took", time.Since(begun)), zap.Error(err))
		s.mu.Lock()
		delete(s.running, id)
		s.mu.Unlock()
		if err != nil && ctx.Err() != nil {
			err = jsonrpc2.NewError(codeRequestCancelled, "request cancelled")
		}
		send(result, err)
	}()
}

// guard runs f, turning a panic into an internal error reply and a log
// entry, so no input reaches the user as a crash.
func (s *Server) guard(method string, f func() (any, error)) (result any, err error) {
	defer func() {
		if r := recover(); r != nil {
			s.log.Error("internal error", zap.String("method", method), zap.Any("panic", r), zap.Stack("stack"))
			result, err = nil, jsonrpc2.Errorf(jsonrpc2.InternalError, "internal error in %s", method)
		}
	}()
	result, err = f()
	if err != nil {
		if _, ok := err.(*jsonrpc2.Error); !ok {
			err = jsonrpc2.NewError(jsonrpc2.InternalError, err.Error())
		}
	}
	return result, err
}

// recoverPanic logs a panic in a notification handler.
func (s *Server) recoverPanic(method string) {
	if r := recover(); r != nil {
		s.log.Error("internal error", zap.String("method", method), zap.Any("panic", r), zap.Stack("stack"))
	}
}

// cancelRequest handles $/cancelRequest: the request's context is
// cancelled and it answers RequestCancelled unless it already finished.
func (s *Server) cancelRequest(params json.RawMessage) error {
	var p cancelParams
	if err := json.Unmarshal(params, &p); err != nil {
		return err
	}
	s.mu.Lock()
	cancel := s.running[p.ID]
	s.mu.Unlock()
	if cancel != nil {
		cancel()
	}
	return nil
}

// current returns the latest snapshot.
func (s *Server) current() *snapshot {
	s.mu.Lock()
	defer s.mu.Unlock()
	return s.snap
}

// setSnapshot installs a new snapshot; s.mu must be held. Waiters on the
// previous one learn of the change.
func (s *Server) setSnapshot(next *snapshot) {
	s.snap = next
	close(s.changed)
	s.changed = make(chan struct{})
}

// decode unmarshals request parameters, answering InvalidParams on
// failure.
func decode(params json.RawMessage, v any) error {
	if err := json.Unmarshal(params, v); err != nil {
		return jsonrpc2.Errorf(jsonrpc2.InvalidParams, "invalid params: %v", err)
	}
	return nil
}

// notify sends a notification to the client, logging a failure.
// notifyJSON sends a notification whose params are JSON already.
func (s *Server) notifyJSON(method string, params json.RawMessage) {
	if s.out == nil {
		s.notify(method, params)
		return
	}
	if err := s.out.writeNotification(method, params); err != nil {
		s.log.Info("notification not sent", zap.String("method", method), zap.Error(err))
	}
}

// notifyJSONParts is notifyJSON with params written in parts, one after
// the other.
func (s *Server) notifyJSONParts(method string, params [][]byte) {
	if s.out == nil {
		s.notify(method, json.RawMessage(bytes.Join(params, nil)))
		return
	}
	if err := s.out.writeNotification(method, params...); err != nil {
		s.log.Info("notification not sent", zap.String("method", method), zap.Error(err))
	}
}

func (s *Server) notify(method string, params any) {
	if err := s.conn.Notify(s.ctx, method, params); err != nil {
		s.log.Info("notification not sent", zap.String("method", method), zap.Error(err))
	}
}

// callClient sends a request to the client and waits for the answer. It
// must not be called on the reader goroutine, which delivers the answer.
func (s *Server) callClient(ctx context.Context, method string, params, result any) error {
	ctx, cancel := context.WithTimeout(ctx, 30*time.Second)
	defer cancel()
	if _, err := s.conn.Call(ctx, method, params, result); err != nil {
		return fmt.Errorf("%s: %w", method, err)
	}
	return nil
}

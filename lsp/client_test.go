package lsp

import (
	"bytes"
	"context"
	"encoding/json"
	"errors"
	"net"
	"strings"
	"sync"
	"testing"
	"time"
	"unicode/utf16"
	"unicode/utf8"

	"go.lsp.dev/jsonrpc2"
	"go.lsp.dev/protocol"
	"go.uber.org/zap"
	"go.uber.org/zap/zapcore"
)

// This file is the test harness: a fake editor that drives a server over
// an in-memory pipe with jsonrpc2 on both ends, as a real client does, and
// collects what the server sends on its own (diagnostics, progress,
// messages, settings requests).

// waitLimit bounds every wait, so a broken server fails a test instead of
// hanging it.
const waitLimit = 10 * time.Second

// testDebounce keeps the tests quick while still debouncing.
const testDebounce = 20 * time.Millisecond

// fakeClient is one editor session.
type fakeClient struct {
	t      testing.TB
	conn   jsonrpc2.Conn
	raw    net.Conn // the client's end of the pipe, for writing broken frames
	logs   *syncBuffer
	status chan int
	calls  int // requests sent so far: the next request's id is calls+1
	limit  time.Duration

	mu       sync.Mutex
	changed  chan struct{} // closed and replaced on every message from the server
	diags    []publishDiagnosticsParams
	progress []progressRecord
	messages []string
	asked    int             // workspace/configuration requests received
	settings json.RawMessage // the answer to workspace/configuration
	// configDelay: see clientSetup
	configDelay time.Duration
	refresh     []string // requests without an answer of substance: refreshes, registrations, progress tokens
	exited      bool
}

type progressRecord struct {
	Token json.RawMessage
	Kind  string
}

// syncBuffer is a log sink that tests read while the server writes.
type syncBuffer struct {
	mu  sync.Mutex
	buf bytes.Buffer
}

func (b *syncBuffer) Write(p []byte) (int, error) {
	b.mu.Lock()
	defer b.mu.Unlock()
	return b.buf.Write(p)
}

func (b *syncBuffer) Sync() error { return nil }

func (b *syncBuffer) String() string {
	b.mu.Lock()
	defer b.mu.Unlock()
	return b.buf.String()
}

// clientSetup configures a session before it starts.
type clientSetup struct {
	caps     map[string]any  // client capabilities; nil means none
	initOpts any             // initializationOptions
	settings json.RawMessage // workspace settings section served on request
	rootURI  string
	folders  []string // workspace folder URIs sent at initialize
	debounce time.Duration
	progress time.Duration // Options.ProgressDelay
	hook     func(*Server)
	noInit   bool          // do not send initialize
	limit    time.Duration // how long to wait for the server; 0 means waitLimit
	// configDelay delays the answer to workspace/configuration, which
	// carries the settings held when the request came
	configDelay time.Duration
}

// start runs a server on one end of a pipe and initializes it from the
// other.
func start(t testing.TB, setup clientSetup) *fakeClient {
	t.Helper()
	serverEnd, clientEnd := net.Pipe()
	logs := &syncBuffer{}
	log := zap.New(zapcore.NewCore(zapcore.NewJSONEncoder(zap.NewProductionEncoderConfig()), logs, zapcore.DebugLevel))
	c := &fakeClient{t: t, logs: logs, status: make(chan int, 1), changed: make(chan struct{}), settings: setup.settings, limit: setup.limit,
		configDelay: setup.configDelay}
	if c.limit == 0 {
		c.limit = waitLimit
	}
	debounce := setup.debounce
	if debounce == 0 {
		debounce = testDebounce
	}
	ctx, cancel := context.WithCancel(context.Background())
	go func() {
		c.status <- serve(ctx, serverEnd, log, Options{Debounce: debounce, Version: "test", ProgressDelay: setup.progress}, setup.hook)
		serverEnd.Close()
	}()
	c.raw = clientEnd
	c.conn = jsonrpc2.NewConn(jsonrpc2.NewStream(clientEnd))
	c.conn.Go(ctx, c.handle)
	t.Cleanup(func() {
		c.mu.Lock()
		exited := c.exited
		c.mu.Unlock()
		if !exited {
			c.conn.Call(context.Background(), "shutdown", nil, nil)
			c.conn.Notify(context.Background(), "exit", nil)
			select {
			case <-c.status:
			case <-time.After(waitLimit):
				t.Errorf("server did not exit")
			}
		}
		cancel()
		clientEnd.Close()
	})
	if setup.noInit {
		return c
	}
	params := map[string]any{"processId": nil, "capabilities": setup.caps}
	if params["capabilities"] == nil {
		params["capabilities"] = map[string]any{}
	}
	if setup.initOpts != nil {
		params["initializationOptions"] = setup.initOpts
	}
	if setup.rootURI != "" {
		params["rootUri"] = setup.rootURI
	}
	if setup.folders != nil {
		var folders []map[string]string
		for _, f := range setup.folders {
			folders = append(folders, map[string]string{"uri": f, "name": f})
		}
		params["workspaceFolders"] = folders
	}
	var res json.RawMessage
	if err := c.call("initialize", params, &res); err != nil {
		t.Fatalf("initialize: %v", err)
	}
	c.notify("initialized", map[string]any{})
	return c
}

// handle receives what the server sends of its own accord.
func (c *fakeClient) handle(ctx context.Context, reply jsonrpc2.Replier, req jsonrpc2.Request) error {
	c.mu.Lock()
	defer func() {
		close(c.changed)
		c.changed = make(chan struct{})
		c.mu.Unlock()
	}()
	switch req.Method() {
	case "textDocument/publishDiagnostics":
		var p publishDiagnosticsParams
		if err := json.Unmarshal(req.Params(), &p); err != nil {
			c.t.Errorf("publishDiagnostics: %v", err)
		}
		c.diags = append(c.diags, p)
	case "$/progress":
		var p struct {
			Token json.RawMessage `json:"token"`
			Value struct {
				Kind string `json:"kind"`
			} `json:"value"`
		}
		json.Unmarshal(req.Params(), &p)
		c.progress = append(c.progress, progressRecord{p.Token, p.Value.Kind})
	case "window/showMessage", "window/logMessage":
		var p struct {
			Message string `json:"message"`
		}
		json.Unmarshal(req.Params(), &p)
		c.messages = append(c.messages, p.Message)
	case "workspace/configuration":
		c.asked++
		settings := c.settings
		if settings == nil {
			settings = json.RawMessage("null")
		}
		if c.configDelay > 0 {
			go func() {
				time.Sleep(c.configDelay)
				reply(ctx, []json.RawMessage{settings}, nil)
			}()
			return nil
		}
		return reply(ctx, []json.RawMessage{settings}, nil)
	case methodInlayHintRefresh, methodDiagnosticRefresh, "client/registerCapability", "window/workDoneProgress/create":
		c.refresh = append(c.refresh, req.Method())
		return reply(ctx, nil, nil)
	default:
		if _, ok := req.(*jsonrpc2.Call); ok {
			return reply(ctx, nil, jsonrpc2.ErrMethodNotFound)
		}
	}
	return reply(ctx, nil, nil)
}

// call sends a request and decodes its answer.
func (c *fakeClient) call(method string, params, result any) error {
	c.t.Helper()
	ctx, cancel := context.WithTimeout(context.Background(), c.limit)
	defer cancel()
	c.calls++
	_, err := c.conn.Call(ctx, method, params, result)
	if errors.Is(err, context.DeadlineExceeded) {
		c.t.Fatalf("%s: no answer in %v", method, c.limit)
	}
	return err
}

// mustCall is call for requests that must succeed.
func (c *fakeClient) mustCall(method string, params, result any) {
	c.t.Helper()
	if err := c.call(method, params, result); err != nil {
		c.t.Fatalf("%s: %v", method, err)
	}
}

func (c *fakeClient) notify(method string, params any) {
	c.t.Helper()
	if err := c.conn.Notify(context.Background(), method, params); err != nil {
		c.t.Fatalf("%s: %v", method, err)
	}
}

// open sends didOpen.
func (c *fakeClient) open(uri, languageID string, version int32, text string) {
	c.t.Helper()
	c.notify("textDocument/didOpen", map[string]any{"textDocument": map[string]any{
		"uri": uri, "languageId": languageID, "version": version, "text": text,
	}})
}

// change sends didChange with the given content changes.
func (c *fakeClient) change(uri string, version int32, changes ...map[string]any) {
	c.t.Helper()
	c.notify("textDocument/didChange", map[string]any{
		"textDocument":   map[string]any{"uri": uri, "version": version},
		"contentChanges": changes,
	})
}

// edit is an incremental content change.
func edit(startLine, startChar, endLine, endChar int, text string) map[string]any {
	return map[string]any{
		"range": map[string]any{
			"start": map[string]any{"line": startLine, "character": startChar},
			"end":   map[string]any{"line": endLine, "character": endChar},
		},
		"text": text,
	}
}

// until waits for cond to hold over the collected messages.
func (c *fakeClient) until(what string, cond func() bool) {
	c.t.Helper()
	deadline := time.After(c.limit)
	for {
		c.mu.Lock()
		ok := cond()
		ch := c.changed
		c.mu.Unlock()
		if ok {
			return
		}
		select {
		case <-ch:
		case <-deadline:
			c.t.Fatalf("waited %v for %s", c.limit, what)
		}
	}
}

// diagnostics waits for the diagnostics of uri at version.
func (c *fakeClient) diagnostics(uri string, version int32) []protocol.Diagnostic {
	c.t.Helper()
	var got []protocol.Diagnostic
	c.until("diagnostics of "+uri, func() bool {
		for i := len(c.diags) - 1; i >= 0; i-- {
			p := c.diags[i]
			if p.URI == uri && p.Version != nil && *p.Version == version {
				got = p.Diagnostics
				return true
			}
		}
		return false
	})
	return got
}

// cleared waits until the last publication for uri is the empty list
// without a version that clears a closed document's diagnostics.
func (c *fakeClient) cleared(uri string) {
	c.t.Helper()
	c.until("diagnostics of "+uri+" cleared", func() bool {
		for i := len(c.diags) - 1; i >= 0; i-- {
			if p := c.diags[i]; p.URI == uri {
				return p.Version == nil && len(p.Diagnostics) == 0
			}
		}
		return false
	})
}

// published returns every publication for uri so far.
func (c *fakeClient) published(uri string) []publishDiagnosticsParams {
	c.mu.Lock()
	defer c.mu.Unlock()
	var out []publishDiagnosticsParams
	for _, p := range c.diags {
		if p.URI == uri {
			out = append(out, p)
		}
	}
	return out
}

// stop shuts the server down and waits for it to exit, so a benchmark
// does not keep every iteration's server alive.
func (c *fakeClient) stop() {
	c.t.Helper()
	c.mustCall("shutdown", nil, nil)
	if st := c.exit(); st != 0 {
		c.t.Fatalf("exit status %d after shutdown", st)
	}
}

// exit sends exit and returns the server's exit status.
func (c *fakeClient) exit() int {
	c.t.Helper()
	c.mu.Lock()
	c.exited = true
	c.mu.Unlock()
	c.notify("exit", nil)
	select {
	case st := <-c.status:
		return st
	case <-time.After(waitLimit):
		c.t.Fatalf("server did not exit")
	}
	return -1
}

// rangeText returns the text a range covers, computed independently of
// the server's mapper: lines split at \n, \r\n or \r, characters counted
// in the negotiated encoding through Go's UTF-16 and UTF-8 packages (LSP
// 3.17, "Position").
func rangeText(t testing.TB, text string, r protocol.Range, enc PositionEncoding) string {
	t.Helper()
	start := positionOffset(t, text, r.Start, enc)
	end := positionOffset(t, text, r.End, enc)
	if end < start {
		t.Fatalf("range %v ends before it starts", r)
	}
	return text[start:end]
}

func positionOffset(t testing.TB, text string, p protocol.Position, enc PositionEncoding) int {
	t.Helper()
	lineStart, line := 0, 0
	for line < int(p.Line) {
		i := strings.IndexAny(text[lineStart:], "\r\n")
		if i < 0 {
			t.Fatalf("position %v: the text has %d lines", p, line+1)
		}
		lineStart += i
		if strings.HasPrefix(text[lineStart:], "\r\n") {
			lineStart += 2
		} else {
			lineStart++
		}
		line++
	}
	rest := text[lineStart:]
	if i := strings.IndexAny(rest, "\r\n"); i >= 0 {
		rest = rest[:i]
	}
	switch enc {
	case EncodingUTF8:
		ch := int(p.Character)
		if ch > len(rest) || ch < len(rest) && !utf8.RuneStart(rest[ch]) {
			t.Fatalf("position %v is not a character boundary of %q", p, rest)
		}
		return lineStart + int(p.Character)
	default:
		units := utf16.Encode([]rune(rest))
		if int(p.Character) > len(units) {
			t.Fatalf("position %v past the end of %q", p, rest)
		}
		return lineStart + len(string(utf16.Decode(units[:p.Character])))
	}
}

// position is the inverse of positionOffset, for building requests: the
// position of the first byte of the n-th occurrence (from 0) of find.
func position(t *testing.T, text, find string, n int, enc PositionEncoding) protocol.Position {
	t.Helper()
	off := -1
	for i := 0; i <= n; i++ {
		j := strings.Index(text[off+1:], find)
		if j < 0 {
			t.Fatalf("%q occurs fewer than %d times", find, n+1)
		}
		off += 1 + j
	}
	return offsetPosition(text, off, enc)
}

func offsetPosition(text string, off int, enc PositionEncoding) protocol.Position {
	before := text[:off]
	line := strings.Count(before, "\n") + strings.Count(before, "\r") - strings.Count(before, "\r\n")
	lineStart := strings.LastIndexAny(before, "\r\n") + 1
	col := before[lineStart:]
	if enc == EncodingUTF8 {
		return protocol.Position{Line: uint32(line), Character: uint32(len(col))}
	}
	return protocol.Position{Line: uint32(line), Character: uint32(len(utf16.Encode([]rune(col))))}
}

// textDoc is the textDocument member of a request.
func textDoc(uri string) map[string]any { return map[string]any{"uri": uri} }

// wholeRange covers a text.
func wholeRange(text string) map[string]any {
	end := offsetPosition(text, len(text), EncodingUTF16)
	return map[string]any{"start": map[string]any{"line": 0, "character": 0}, "end": end}
}

// rpcCode returns the JSON-RPC error code of err, or 0.
func rpcCode(err error) jsonrpc2.Code {
	var e *jsonrpc2.Error
	if errors.As(err, &e) {
		return e.Code
	}
	return 0
}

package lsp

import (
	"context"
	"encoding/json"
	"fmt"
	"strings"
	"testing"

	"go.lsp.dev/jsonrpc2"
)

// The lifecycle follows LSP 3.17, "Server lifetime": requests before
// initialize answer ServerNotInitialized (-32002); shutdown then exit ends
// with status 0, exit alone with 1; after shutdown only exit is expected.

func TestInitializeNegotiatesEncoding(t *testing.T) {
	tests := []struct {
		name    string
		offered []string
		want    string
	}{
		{"no positionEncodings: UTF-16, the default", nil, "utf-16"},
		{"UTF-8 offered", []string{"utf-16", "utf-8"}, "utf-8"},
		{"only UTF-32 offered: UTF-16 is mandatory", []string{"utf-32"}, "utf-16"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			c := start(t, clientSetup{noInit: true})
			caps := map[string]any{}
			if tt.offered != nil {
				caps["general"] = map[string]any{"positionEncodings": tt.offered}
			}
			var res struct {
				Capabilities struct {
					PositionEncoding string `json:"positionEncoding"`
					TextDocumentSync struct {
						OpenClose bool `json:"openClose"`
						Change    int  `json:"change"`
					} `json:"textDocumentSync"`
					InlayHintProvider  bool `json:"inlayHintProvider"`
					CodeActionProvider struct {
						CodeActionKinds []string `json:"codeActionKinds"`
						ResolveProvider bool     `json:"resolveProvider"`
					} `json:"codeActionProvider"`
					DiagnosticProvider *struct {
						WorkspaceDiagnostics bool `json:"workspaceDiagnostics"`
					} `json:"diagnosticProvider"`
					NotebookDocumentSync *json.RawMessage `json:"notebookDocumentSync"`
				} `json:"capabilities"`
				ServerInfo struct {
					Name string `json:"name"`
				} `json:"serverInfo"`
			}
			c.mustCall("initialize", map[string]any{"capabilities": caps}, &res)
			got := res.Capabilities
			if got.PositionEncoding != tt.want {
				t.Errorf("positionEncoding = %q, want %q", got.PositionEncoding, tt.want)
			}
			// TextDocumentSyncKind.Incremental is 2 (LSP 3.17).
			if !got.TextDocumentSync.OpenClose || got.TextDocumentSync.Change != 2 {
				t.Errorf("textDocumentSync = %+v, want open/close and incremental", got.TextDocumentSync)
			}
			if !got.InlayHintProvider || got.DiagnosticProvider == nil || !got.DiagnosticProvider.WorkspaceDiagnostics || got.NotebookDocumentSync == nil {
				t.Errorf("capabilities lack inlay hints, pull diagnostics or notebook sync: %+v", got)
			}
			kinds := strings.Join(got.CodeActionProvider.CodeActionKinds, " ")
			for _, k := range []string{"quickfix", "refactor.rewrite.stereo.mirror", "refactor.rewrite.stereo.invert", "refactor.rewrite.stereo.flip", "refactor.rewrite.stereo.set"} {
				if !strings.Contains(kinds, k) {
					t.Errorf("code action kinds %q lack %s", kinds, k)
				}
			}
			if !got.CodeActionProvider.ResolveProvider || res.ServerInfo.Name != "stereoline" {
				t.Errorf("resolveProvider %v, serverInfo %+v", got.CodeActionProvider.ResolveProvider, res.ServerInfo)
			}
		})
	}
}

func TestRequestBeforeInitialize(t *testing.T) {
	c := start(t, clientSetup{noInit: true})
	err := c.call("textDocument/hover", map[string]any{"textDocument": textDoc("file:///x.smi"), "position": map[string]any{"line": 0, "character": 0}}, nil)
	if rpcCode(err) != jsonrpc2.ServerNotInitialized {
		t.Errorf("hover before initialize: %v, want code %d", err, jsonrpc2.ServerNotInitialized)
	}
}

func TestShutdownThenExit(t *testing.T) {
	c := start(t, clientSetup{})
	c.mustCall("shutdown", nil, nil)
	err := c.call("textDocument/documentSymbol", map[string]any{"textDocument": textDoc("file:///x.smi")}, nil)
	if rpcCode(err) != jsonrpc2.InvalidRequest {
		t.Errorf("request after shutdown: %v, want code %d", err, jsonrpc2.InvalidRequest)
	}
	if st := c.exit(); st != 0 {
		t.Errorf("exit after shutdown: status %d, want 0", st)
	}
}

func TestExitWithoutShutdown(t *testing.T) {
	c := start(t, clientSetup{})
	if st := c.exit(); st != 1 {
		t.Errorf("exit without shutdown: status %d, want 1", st)
	}
}

func TestStreamEndWithoutExit(t *testing.T) {
	c := start(t, clientSetup{})
	c.mu.Lock()
	c.exited = true
	c.mu.Unlock()
	c.conn.Close()
	if st := <-c.status; st != 1 {
		t.Errorf("end of stream: status %d, want 1", st)
	}
}

func TestUnknownMethod(t *testing.T) {
	c := start(t, clientSetup{})
	err := c.call("textDocument/noSuchThing", map[string]any{}, nil)
	if rpcCode(err) != jsonrpc2.MethodNotFound {
		t.Errorf("unknown method: %v, want code %d", err, jsonrpc2.MethodNotFound)
	}
	// An unknown notification is ignored and the server goes on.
	c.notify("$/noSuchNotification", map[string]any{})
	var syms []json.RawMessage
	c.mustCall("textDocument/documentSymbol", map[string]any{"textDocument": textDoc("file:///x.smi")}, &syms)
}

// A panic in a handler is recovered at the request boundary: the request
// answers InternalError, the log says "internal error", and the session
// goes on.
func TestPanicIsRecovered(t *testing.T) {
	c := start(t, clientSetup{hook: func(s *Server) {
		s.requests["stereoline/test/panic"] = func(context.Context, *snapshot, json.RawMessage) (any, error) {
			panic("deliberate")
		}
		s.notifications["stereoline/test/panic"] = func(json.RawMessage) error { panic("deliberate too") }
	}})
	err := c.call("stereoline/test/panic", nil, nil)
	if rpcCode(err) != jsonrpc2.InternalError {
		t.Errorf("panicking request: %v, want code %d", err, jsonrpc2.InternalError)
	}
	c.notify("stereoline/test/panic", nil)
	c.open("file:///after.smi", "", 1, "C[C@H](C)C\n")
	if d := c.diagnostics("file:///after.smi", 1); len(d) != 1 {
		t.Errorf("after the panics: %d diagnostics, want 1", len(d))
	}
	logs := c.logs.String()
	if strings.Count(logs, `"internal error"`) < 2 || !strings.Contains(logs, "deliberate too") {
		t.Errorf("log lacks the internal errors:\n%s", logs)
	}
}

// $/cancelRequest reaches a running request, which answers
// RequestCancelled (-32800, LSP 3.17); a slow request does not hold up
// others, since requests run off the reader.
func TestCancelRequest(t *testing.T) {
	started := make(chan struct{})
	c := start(t, clientSetup{hook: func(s *Server) {
		s.requests["stereoline/test/slow"] = func(ctx context.Context, _ *snapshot, _ json.RawMessage) (any, error) {
			close(started)
			<-ctx.Done()
			return nil, ctx.Err()
		}
	}})
	id := c.calls + 1
	errc := make(chan error, 1)
	go func() {
		_, err := c.conn.Call(context.Background(), "stereoline/test/slow", nil, nil)
		errc <- err
	}()
	<-started
	c.calls++
	var syms []json.RawMessage
	c.mustCall("textDocument/documentSymbol", map[string]any{"textDocument": textDoc("file:///x.smi")}, &syms)
	c.notify("$/cancelRequest", map[string]any{"id": id})
	if err := <-errc; rpcCode(err) != codeRequestCancelled {
		t.Errorf("cancelled request: %v, want code %d", err, codeRequestCancelled)
	}
}

// A frame whose content is not JSON-RPC is skipped (LSP 3.17, "Base
// Protocol": the header gives the length, so the next frame is found); the
// session goes on.
func TestMalformedMessageIsSkipped(t *testing.T) {
	c := start(t, clientSetup{})
	for _, body := range []string{"{not json", `{"jsonrpc":"2.0"}`, "[1,2,3]"} {
		if _, err := fmt.Fprintf(c.raw, "Content-Length: %d\r\n\r\n%s", len(body), body); err != nil {
			t.Fatal(err)
		}
	}
	var syms []json.RawMessage
	c.mustCall("textDocument/documentSymbol", map[string]any{"textDocument": textDoc("file:///x.smi")}, &syms)
	if logs := c.logs.String(); strings.Count(logs, "message skipped") != 3 {
		t.Errorf("log does not show three skipped messages:\n%s", logs)
	}
}

// A second initialize is refused (LSP 3.17: initialize is sent once);
// notifications before initialize are dropped, so a document opened then
// is not known after.
func TestInitializeOnceAndEarlyNotifications(t *testing.T) {
	c := start(t, clientSetup{noInit: true})
	c.open("file:///work/early.smi", "", 1, "C[C@H](C)C\n")
	c.mustCall("initialize", map[string]any{"capabilities": map[string]any{}}, nil)
	if err := c.call("initialize", map[string]any{"capabilities": map[string]any{}}, nil); rpcCode(err) != jsonrpc2.InvalidRequest {
		t.Errorf("second initialize: %v, want code %d", err, jsonrpc2.InvalidRequest)
	}
	var syms []json.RawMessage
	c.mustCall("textDocument/documentSymbol", map[string]any{"textDocument": textDoc("file:///work/early.smi")}, &syms)
	if len(syms) != 0 {
		t.Errorf("a document opened before initialize is known: %s", syms)
	}
}

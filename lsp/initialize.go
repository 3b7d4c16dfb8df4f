package lsp

import (
	"encoding/json"
	"fmt"
	"path/filepath"

	"go.lsp.dev/jsonrpc2"
	"go.lsp.dev/protocol"
	"go.uber.org/zap"

	"stereoline/stereo/document"
)

// initialize answers the first request: it negotiates the position
// encoding, reads the client's capabilities and initializationOptions,
// and lists what the server offers.
func (s *Server) initialize(params json.RawMessage) (any, error) {
	var p initializeParams
	if err := decode(params, &p); err != nil {
		return nil, err
	}
	s.mu.Lock()
	defer s.mu.Unlock()
	if s.state != stateNew {
		return nil, jsonrpc2.NewError(jsonrpc2.InvalidRequest, "initialize sent twice")
	}
	enc := chooseEncoding(p.Capabilities.General.PositionEncodings)
	cfg := document.DefaultConfig()
	if err := cfg.Merge(settingsSection(p.InitializationOptions)); err != nil {
		// A bad setting must not keep the server from starting; the
		// defaults stand and the log says why.
		s.log.Warn("initializationOptions ignored", zap.Error(err))
		s.showWarning(fmt.Sprintf("stereoline: initializationOptions ignored: %v", err))
		cfg = document.DefaultConfig()
	}
	s.caps = p.Capabilities
	s.baseCfg = cfg
	next := newSnapshot(newConfigured(document.NewAnalyzer(cfg)), enc)
	next.roots = workspaceRoots(p)
	s.setSnapshot(next)
	s.state = stateInitialized
	s.log.Info("initialized", zap.String("positionEncoding", string(enc)), zap.Strings("roots", next.roots))
	return initializeResult{Capabilities: capabilities(enc), ServerInfo: &protocol.ServerInfo{Name: "stereoline", Version: s.opts.Version}}, nil
}

// chooseEncoding picks UTF-8 when the client offers it, since offsets are
// then bytes, and otherwise UTF-16, which every client must support (LSP
// 3.17, "Position Encoding Kind").
func chooseEncoding(offered []string) PositionEncoding {
	for _, e := range offered {
		if PositionEncoding(e) == EncodingUTF8 {
			return EncodingUTF8
		}
	}
	return EncodingUTF16
}

// capabilities lists the server's features.
func capabilities(enc PositionEncoding) serverCapabilities {
	kinds := []protocol.CodeActionKind{
		document.KindQuickFix, document.KindMirror, document.KindInvert, document.KindFlip, document.KindSet,
	}
	return serverCapabilities{
		ServerCapabilities: protocol.ServerCapabilities{
			TextDocumentSync: &protocol.TextDocumentSyncOptions{
				OpenClose: true,
				Change:    protocol.TextDocumentSyncKindIncremental,
				// didSave tells of a saved project configuration file.
				Save: &protocol.SaveOptions{},
			},
			HoverProvider:          true,
			CodeLensProvider:       &protocol.CodeLensOptions{},
			ExecuteCommandProvider: &protocol.ExecuteCommandOptions{Commands: []string{commandShowDrawing, commandShowChange}},
			CodeActionProvider:     &protocol.CodeActionOptions{CodeActionKinds: kinds, ResolveProvider: true},
			DocumentSymbolProvider: true,
			// The folders decide which project files apply and which
			// files a workspace pull covers (folders.go).
			Workspace: &protocol.ServerCapabilitiesWorkspace{
				WorkspaceFolders: &protocol.ServerCapabilitiesWorkspaceFolders{Supported: true, ChangeNotifications: true},
			},
		},
		PositionEncoding:  enc,
		InlayHintProvider: true,
		DiagnosticProvider: &diagnosticOptions{
			Identifier:           document.Source,
			WorkspaceDiagnostics: true,
		},
		NotebookDocumentSync: &notebookSyncOptions{NotebookSelector: []notebookSelector{{Notebook: "*"}}},
	}
}

// workspaceRoots returns the paths of the workspace folders on disk: the
// folders the client names, or its root when it names none (a client
// without workspace folder support, LSP 3.17 "InitializeParams").
func workspaceRoots(p initializeParams) []string {
	var roots []string
	for _, f := range p.WorkspaceFolders {
		if path := fileURIPath(string(f.URI)); path != "" {
			roots = changeRoots(roots, []string{cleanPath(path)}, nil)
		}
	}
	if len(roots) == 0 {
		if path := fileURIPath(p.RootURI); path != "" {
			roots = append(roots, cleanPath(path))
		} else if p.RootPath != "" {
			roots = append(roots, filepath.Clean(p.RootPath))
		}
	}
	return roots
}

// initialized is the client's acknowledgement; the server then asks for
// the workspace settings and a watcher on project files, off the reader
// goroutine that will deliver the answers.
func (s *Server) initialized(json.RawMessage) error {
	s.mu.Lock()
	pull := s.caps.Workspace.Configuration
	watch := s.caps.Workspace.DidChangeWatchedFiles.DynamicRegistration
	s.mu.Unlock()
	if pull {
		go s.fetchConfiguration()
	}
	if watch {
		go s.watchProjectFiles()
	}
	return nil
}

// shutdown stops background work; the session ends at exit.
func (s *Server) shutdown() (any, error) {
	s.mu.Lock()
	s.state = stateShutdown
	for _, cancel := range s.running {
		cancel()
	}
	s.mu.Unlock()
	return nil, nil
}

// exit ends the session: status 0 after shutdown, 1 without (LSP 3.17,
// "Exit Notification").
func (s *Server) exit() {
	s.mu.Lock()
	defer s.mu.Unlock()
	select {
	case <-s.exited:
		return
	default:
	}
	if s.state == stateShutdown {
		s.status = 0
	} else {
		s.status = 1
	}
	close(s.exited)
}

// pushesDiagnostics reports whether diagnostics are pushed. A client that
// pulls them (it has the textDocument.diagnostic capability) would show
// pushed ones a second time.
func (s *Server) pushesDiagnostics() bool {
	s.mu.Lock()
	defer s.mu.Unlock()
	return s.caps.TextDocument.Diagnostic == nil
}

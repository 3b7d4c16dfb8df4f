package lsp

import (
	"encoding/json"

	"go.lsp.dev/jsonrpc2"
	"go.lsp.dev/protocol"
)

// This file holds the wire types the server needs beyond what
// go.lsp.dev/protocol v0.12.0 (LSP 3.15) has: the LSP 3.16 and 3.17
// additions (position encodings, inlay hints, pull diagnostics, notebook
// sync, code action data) and a few messages decoded more loosely than
// the typed ones allow. Field names follow the LSP 3.17 specification.

// LSP error codes beyond JSON-RPC's (LSP 3.17, "Response Message").
const (
	codeRequestCancelled jsonrpc2.Code = -32800
	codeContentModified  jsonrpc2.Code = -32801
)

// Method names the typed package does not know.
const (
	methodInlayHint           = "textDocument/inlayHint"
	methodDocumentDiagnostic  = "textDocument/diagnostic"
	methodWorkspaceDiagnostic = "workspace/diagnostic"
	methodCodeActionResolve   = "codeAction/resolve"
	methodNotebookDidOpen     = "notebookDocument/didOpen"
	methodNotebookDidChange   = "notebookDocument/didChange"
	methodNotebookDidSave     = "notebookDocument/didSave"
	methodNotebookDidClose    = "notebookDocument/didClose"
	methodInlayHintRefresh    = "workspace/inlayHint/refresh"
	methodDiagnosticRefresh   = "workspace/diagnostic/refresh"
)

// initializeParams is the part of InitializeParams the server reads. It is
// decoded loosely: clients send capability shapes newer than any typed
// package (semanticTokens.requests.range as an object, for one).
type initializeParams struct {
	ProcessID             *int                       `json:"processId"`
	RootURI               string                     `json:"rootUri"`
	RootPath              string                     `json:"rootPath"`
	WorkspaceFolders      []protocol.WorkspaceFolder `json:"workspaceFolders"`
	InitializationOptions json.RawMessage            `json:"initializationOptions"`
	Capabilities          clientCapabilities         `json:"capabilities"`
}

// clientCapabilities lists the client features that change what the
// server sends.
type clientCapabilities struct {
	General struct {
		PositionEncodings []string `json:"positionEncodings"`
		// Markdown names the client's markdown renderer (LSP 3.16);
		// a client that declares one renders images in hovers.
		Markdown *struct {
			Parser string `json:"parser"`
		} `json:"markdown"`
	} `json:"general"`
	Workspace struct {
		Configuration bool `json:"configuration"`
		WorkspaceEdit struct {
			DocumentChanges bool `json:"documentChanges"`
		} `json:"workspaceEdit"`
		InlayHint struct {
			RefreshSupport bool `json:"refreshSupport"`
		} `json:"inlayHint"`
		Diagnostics struct {
			RefreshSupport bool `json:"refreshSupport"`
		} `json:"diagnostics"`
		DidChangeWatchedFiles struct {
			DynamicRegistration bool `json:"dynamicRegistration"`
		} `json:"didChangeWatchedFiles"`
	} `json:"workspace"`
	Window struct {
		WorkDoneProgress bool `json:"workDoneProgress"`
		ShowDocument     *struct {
			Support bool `json:"support"`
		} `json:"showDocument"`
	} `json:"window"`
	TextDocument struct {
		CodeAction struct {
			CodeActionLiteralSupport *json.RawMessage `json:"codeActionLiteralSupport"`
			ResolveSupport           *struct {
				Properties []string `json:"properties"`
			} `json:"resolveSupport"`
		} `json:"codeAction"`
		DocumentSymbol struct {
			HierarchicalDocumentSymbolSupport bool `json:"hierarchicalDocumentSymbolSupport"`
		} `json:"documentSymbol"`
		// Diagnostic is present when the client pulls diagnostics.
		Diagnostic *json.RawMessage `json:"diagnostic"`
	} `json:"textDocument"`
}

// initializeResult is InitializeResult with the 3.16/3.17 capabilities.
type initializeResult struct {
	Capabilities serverCapabilities   `json:"capabilities"`
	ServerInfo   *protocol.ServerInfo `json:"serverInfo,omitempty"`
}

// serverCapabilities embeds the typed capabilities and adds the newer
// ones; the two marshal into one JSON object.
type serverCapabilities struct {
	protocol.ServerCapabilities
	PositionEncoding     PositionEncoding     `json:"positionEncoding,omitempty"`
	InlayHintProvider    bool                 `json:"inlayHintProvider,omitempty"`
	DiagnosticProvider   *diagnosticOptions   `json:"diagnosticProvider,omitempty"`
	NotebookDocumentSync *notebookSyncOptions `json:"notebookDocumentSync,omitempty"`
}

type diagnosticOptions struct {
	Identifier            string `json:"identifier,omitempty"`
	InterFileDependencies bool   `json:"interFileDependencies"`
	WorkspaceDiagnostics  bool   `json:"workspaceDiagnostics"`
}

type notebookSyncOptions struct {
	NotebookSelector []notebookSelector `json:"notebookSelector"`
	Save             bool               `json:"save,omitempty"`
}

type notebookSelector struct {
	// Notebook is a notebook type, "*" for every notebook.
	Notebook string `json:"notebook"`
}

// didChangeParams is DidChangeTextDocumentParams with a pointer range, so
// a full-text change (no range) is told from an insertion at 0:0.
type didChangeParams struct {
	TextDocument   protocol.VersionedTextDocumentIdentifier `json:"textDocument"`
	ContentChanges []contentChange                          `json:"contentChanges"`
}

// contentChange is one TextDocumentContentChangeEvent.
type contentChange struct {
	Range *protocol.Range `json:"range,omitempty"`
	Text  string          `json:"text"`
}

// publishDiagnosticsParams carries the document version as LSP defines
// it: an integer that may be 0 and is left out when unknown.
type publishDiagnosticsParams struct {
	URI         string                `json:"uri"`
	Version     *int32                `json:"version,omitempty"`
	Diagnostics []protocol.Diagnostic `json:"diagnostics"`
}

// documentDiagnosticParams is the textDocument/diagnostic request.
type documentDiagnosticParams struct {
	TextDocument     protocol.TextDocumentIdentifier `json:"textDocument"`
	Identifier       string                          `json:"identifier,omitempty"`
	PreviousResultID string                          `json:"previousResultId,omitempty"`
}

// documentDiagnosticReport is a full or unchanged report; Items is left
// out of an unchanged one.
type documentDiagnosticReport struct {
	Kind     string                `json:"kind"` // "full" or "unchanged"
	ResultID string                `json:"resultId,omitempty"`
	Items    []protocol.Diagnostic `json:"items,omitempty"`
}

// MarshalJSON keeps "items" in a full report even when it is empty, as
// the specification requires.
func (r documentDiagnosticReport) MarshalJSON() ([]byte, error) {
	if r.Kind == "full" {
		items := r.Items
		if items == nil {
			items = []protocol.Diagnostic{}
		}
		return json.Marshal(struct {
			Kind     string                `json:"kind"`
			ResultID string                `json:"resultId,omitempty"`
			Items    []protocol.Diagnostic `json:"items"`
		}{r.Kind, r.ResultID, items})
	}
	return json.Marshal(struct {
		Kind     string `json:"kind"`
		ResultID string `json:"resultId"`
	}{r.Kind, r.ResultID})
}

// workspaceDiagnosticParams is the workspace/diagnostic request.
type workspaceDiagnosticParams struct {
	Identifier        string                  `json:"identifier,omitempty"`
	PreviousResultIDs []previousResultID      `json:"previousResultIds"`
	WorkDoneToken     *protocol.ProgressToken `json:"workDoneToken,omitempty"`
}

type previousResultID struct {
	URI   string `json:"uri"`
	Value string `json:"value"`
}

type workspaceDiagnosticReport struct {
	Items []workspaceDocumentReport `json:"items"`
}

// workspaceDocumentReport is a document report with its URI and version
// (null for a file that is not open).
type workspaceDocumentReport struct {
	documentDiagnosticReport
	URI     string
	Version *int32
}

// MarshalJSON flattens the embedded report and adds uri and version.
func (r workspaceDocumentReport) MarshalJSON() ([]byte, error) {
	inner, err := r.documentDiagnosticReport.MarshalJSON()
	if err != nil {
		return nil, err
	}
	var fields map[string]json.RawMessage
	if err := json.Unmarshal(inner, &fields); err != nil {
		return nil, err
	}
	fields["uri"], _ = json.Marshal(r.URI)
	fields["version"], _ = json.Marshal(r.Version)
	return json.Marshal(fields)
}

// inlayHintParams is the textDocument/inlayHint request.
type inlayHintParams struct {
	TextDocument protocol.TextDocumentIdentifier `json:"textDocument"`
	Range        protocol.Range                  `json:"range"`
}

// inlayHint is one inline label.
type inlayHint struct {
	Position     protocol.Position `json:"position"`
	Label        string            `json:"label"`
	Tooltip      string            `json:"tooltip,omitempty"`
	PaddingLeft  bool              `json:"paddingLeft,omitempty"`
	PaddingRight bool              `json:"paddingRight,omitempty"`
}

// codeActionParams is the textDocument/codeAction request.
type codeActionParams struct {
	TextDocument protocol.TextDocumentIdentifier `json:"textDocument"`
	Range        protocol.Range                  `json:"range"`
	Context      struct {
		Diagnostics []protocol.Diagnostic `json:"diagnostics"`
		Only        []string              `json:"only"`
	} `json:"context"`
}

// codeAction is a CodeAction with the data field of LSP 3.16, which
// codeAction/resolve receives back.
type codeAction struct {
	Title       string                  `json:"title"`
	Kind        string                  `json:"kind,omitempty"`
	Diagnostics []protocol.Diagnostic   `json:"diagnostics,omitempty"`
	IsPreferred bool                    `json:"isPreferred,omitempty"`
	Edit        *protocol.WorkspaceEdit `json:"edit,omitempty"`
	Data        *actionData             `json:"data,omitempty"`
}

// actionData identifies an action so resolve can compute its edits
// again: the document and version it was offered for, the span asked
// about and the action's place in the list.
type actionData struct {
	URI     string `json:"uri"`
	Version int32  `json:"version"`
	Start   int    `json:"start"`
	End     int    `json:"end"`
	Index   int    `json:"index"`
}

// Notebook document sync (LSP 3.17, "Notebook Document Synchronization").

type notebookDocument struct {
	URI          string         `json:"uri"`
	NotebookType string         `json:"notebookType"`
	Version      int32          `json:"version"`
	Cells        []notebookCell `json:"cells"`
}

type notebookCell struct {
	Kind     int    `json:"kind"` // 1 markup, 2 code
	Document string `json:"document"`
}

type didOpenNotebookParams struct {
	NotebookDocument  notebookDocument            `json:"notebookDocument"`
	CellTextDocuments []protocol.TextDocumentItem `json:"cellTextDocuments"`
}

type didChangeNotebookParams struct {
	NotebookDocument struct {
		URI     string `json:"uri"`
		Version int32  `json:"version"`
	} `json:"notebookDocument"`
	Change struct {
		Cells *struct {
			Structure *struct {
				Array struct {
					Start       int            `json:"start"`
					DeleteCount int            `json:"deleteCount"`
					Cells       []notebookCell `json:"cells"`
				} `json:"array"`
				DidOpen  []protocol.TextDocumentItem       `json:"didOpen"`
				DidClose []protocol.TextDocumentIdentifier `json:"didClose"`
			} `json:"structure"`
			TextContent []cellTextChange `json:"textContent"`
		} `json:"cells"`
	} `json:"change"`
}

// cellTextChange is the text change of one cell inside a notebook change.
type cellTextChange struct {
	Document protocol.VersionedTextDocumentIdentifier `json:"document"`
	Changes  []contentChange                          `json:"changes"`
}

type didCloseNotebookParams struct {
	NotebookDocument struct {
		URI string `json:"uri"`
	} `json:"notebookDocument"`
	CellTextDocuments []protocol.TextDocumentIdentifier `json:"cellTextDocuments"`
}

// progressParams is a $/progress notification.
type progressParams struct {
	Token *protocol.ProgressToken `json:"token"`
	Value any                     `json:"value"`
}

// cancelParams is a $/cancelRequest notification.
type cancelParams struct {
	ID jsonrpc2.ID `json:"id"`
}

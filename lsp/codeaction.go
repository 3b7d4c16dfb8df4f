package lsp

import (
	"context"
	"encoding/json"
	"strings"

	"go.lsp.dev/jsonrpc2"
	"go.lsp.dev/protocol"
	"go.lsp.dev/uri"

	"stereoline/notation"
	"stereoline/stereo/document"
)

// codeActions answers textDocument/codeAction with the engine's quick
// fixes and stereo rewrites for the range (a cursor or a selection). When
// the client resolves actions lazily the edits are left out and computed
// by codeAction/resolve, since rewrites of a large selection are not free.
func (s *Server) codeActions(ctx context.Context, snap *snapshot, params json.RawMessage) (any, error) {
	var p codeActionParams
	if err := decode(params, &p); err != nil {
		return nil, err
	}
	out := []codeAction{}
	f, res, ok, err := s.result(ctx, snap, string(p.TextDocument.URI))
	if err != nil || !ok {
		return out, err
	}
	span, err := f.mapper.RangeToSpan(p.Range)
	if err != nil {
		return out, nil
	}
	lazy := s.resolvesEdits()
	preferred := map[int]bool{}
	for i, act := range res.Actions(span) {
		if !kindWanted(act.Kind, p.Context.Only) {
			continue
		}
		ca := codeAction{Title: act.Title, Kind: act.Kind}
		if fixed := res.Diagnostic(act.Diagnostic); fixed != nil {
			d, err := toDiagnostic(f, fixed)
			if err != nil {
				return nil, err
			}
			ca.Diagnostics = []protocol.Diagnostic{d}
			// The first fix offered for a finding is the one an editor
			// applies with its "fix all" or auto-fix gesture.
			ca.IsPreferred = !preferred[act.Diagnostic]
			preferred[act.Diagnostic] = true
		}
		if lazy {
			ca.Data = &actionData{URI: f.URI, Version: f.Version, Start: span.Start, End: span.End, Index: i}
		} else if ca.Edit, err = s.workspaceEdit(f, act.Edits); err != nil {
			return nil, err
		}
		out = append(out, ca)
	}
	return out, nil
}

// kindWanted reports whether an action kind is among the kinds a client
// asked for: equal to one, or below it in the dotted hierarchy (LSP 3.17,
// "CodeActionKind").
func kindWanted(kind string, only []string) bool {
	if len(only) == 0 {
		return true
	}
	for _, o := range only {
		if kind == o || strings.HasPrefix(kind, o+".") {
			return true
		}
	}
	return false
}

// resolvesEdits reports whether the client fills in an action's edit
// through codeAction/resolve.
func (s *Server) resolvesEdits() bool {
	s.mu.Lock()
	defer s.mu.Unlock()
	rs := s.caps.TextDocument.CodeAction.ResolveSupport
	if rs == nil {
		return false
	}
	for _, p := range rs.Properties {
		if p == "edit" {
			return true
		}
	}
	return false
}

// resolveCodeAction answers codeAction/resolve: the action's edits for
// the version it was offered for. A document that changed since answers
// ContentModified, and the client asks again.
func (s *Server) resolveCodeAction(ctx context.Context, snap *snapshot, params json.RawMessage) (any, error) {
	var ca codeAction
	if err := decode(params, &ca); err != nil {
		return nil, err
	}
	if ca.Data == nil || ca.Edit != nil {
		return ca, nil
	}
	d := ca.Data
	f, res, ok, err := s.result(ctx, snap, d.URI)
	if err != nil {
		return nil, err
	}
	if !ok || f.Version != d.Version {
		return nil, jsonrpc2.NewError(codeContentModified, "the document changed since the action was offered")
	}
	acts := res.Actions(notation.Span{Start: d.Start, End: d.End})
	if d.Index < 0 || d.Index >= len(acts) || acts[d.Index].Title != ca.Title {
		return nil, jsonrpc2.NewError(codeContentModified, "the action is no longer offered")
	}
	if ca.Edit, err = s.workspaceEdit(f, acts[d.Index].Edits); err != nil {
		return nil, err
	}
	ca.Data = nil
	return ca, nil
}

// workspaceEdit converts host edits of one document. With documentChanges
// support the edit names the version, so a client refuses to apply it to
// a text that changed since.
func (s *Server) workspaceEdit(f *fileVersion, edits []document.Edit) (*protocol.WorkspaceEdit, error) {
	tes := make([]protocol.TextEdit, 0, len(edits))
	for _, e := range edits {
		rng, err := f.mapper.SpanToRange(e.Span)
		if err != nil {
			return nil, err
		}
		tes = append(tes, protocol.TextEdit{Range: rng, NewText: e.NewText})
	}
	s.mu.Lock()
	versioned := s.caps.Workspace.WorkspaceEdit.DocumentChanges
	s.mu.Unlock()
	if versioned {
		v := f.Version
		return &protocol.WorkspaceEdit{DocumentChanges: []protocol.TextDocumentEdit{{
			TextDocument: protocol.OptionalVersionedTextDocumentIdentifier{
				TextDocumentIdentifier: protocol.TextDocumentIdentifier{URI: uri.URI(f.URI)},
				Version:                &v,
			},
			Edits: tes,
		}}}, nil
	}
	return &protocol.WorkspaceEdit{Changes: map[uri.URI][]protocol.TextEdit{uri.URI(f.URI): tes}}, nil
}

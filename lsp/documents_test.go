package lsp

import (
	"testing"
)

// Requests about documents that are not open answer an empty result (or,
// for resolve, ContentModified), never an error that looks like a crash.
func TestClosedAndUnknownDocuments(t *testing.T) {
	c := start(t, clientSetup{caps: map[string]any{"textDocument": map[string]any{"codeAction": map[string]any{
		"resolveSupport": map[string]any{"properties": []string{"edit"}},
	}}}})
	const u = "file:///work/gone.smi"
	text := "C[C@H](C)C\n"
	c.open(u, "", 1, text)
	if len(c.diagnostics(u, 1)) != 1 {
		t.Fatalf("no diagnostic before closing")
	}
	const py = "file:///work/rings.py"
	c.open(py, "python", 1, pyEscape)
	var acts []action
	c.mustCall("textDocument/codeAction", map[string]any{"textDocument": textDoc(py), "range": wholeRange(pyEscape), "context": map[string]any{"diagnostics": []any{}}}, &acts)
	if len(acts) == 0 {
		t.Fatalf("no actions for the host escape")
	}
	c.notify("textDocument/didClose", map[string]any{"textDocument": textDoc(u)})
	c.notify("textDocument/didClose", map[string]any{"textDocument": textDoc(py)})
	c.cleared(u)
	c.cleared(py)

	for _, doc := range []string{u, py, "file:///work/never-opened.py", "untitled:Untitled-1"} {
		pos := map[string]any{"line": 0, "character": 3}
		var hover *hoverResult
		c.mustCall("textDocument/hover", map[string]any{"textDocument": textDoc(doc), "position": pos}, &hover)
		var hints []hint
		c.mustCall(methodInlayHint, map[string]any{"textDocument": textDoc(doc), "range": wholeRange(text)}, &hints)
		var got []action
		c.mustCall("textDocument/codeAction", map[string]any{"textDocument": textDoc(doc), "range": wholeRange(text), "context": map[string]any{"diagnostics": []any{}}}, &got)
		var syms []any
		c.mustCall("textDocument/documentSymbol", map[string]any{"textDocument": textDoc(doc)}, &syms)
		var rep struct {
			Kind  string `json:"kind"`
			Items []any  `json:"items"`
		}
		c.mustCall(methodDocumentDiagnostic, map[string]any{"textDocument": textDoc(doc)}, &rep)
		if hover != nil || len(hints) != 0 || len(got) != 0 || len(syms) != 0 || rep.Kind != "full" || len(rep.Items) != 0 {
			t.Errorf("%s: hover %v hints %v actions %v symbols %v report %+v, want all empty", doc, hover, hints, got, syms, rep)
		}
	}
	for _, a := range acts {
		if err := c.call(methodCodeActionResolve, a, nil); rpcCode(err) != codeContentModified {
			t.Errorf("resolve on a closed document: %v, want code %d", err, codeContentModified)
		}
	}
	// Malformed parameters answer InvalidParams.
	if err := c.call("textDocument/hover", []int{1, 2}, nil); rpcCode(err) != -32602 {
		t.Errorf("malformed hover: %v, want InvalidParams", err)
	}
}

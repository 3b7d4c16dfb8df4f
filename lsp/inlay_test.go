package lsp

import (
	"testing"

	"go.lsp.dev/protocol"
)

type hint struct {
	Position protocol.Position `json:"position"`
	Label    string            `json:"label"`
}

// Descriptors, common practice: L-alanine N[C@@H](C)C(=O)O is (S);
// F/C=C/F is (E)-1,2-difluoroethene (OpenSMILES specification, "Cis/trans
// configuration").
func TestInlayHints(t *testing.T) {
	text := "N[C@@H](C)C(=O)O L-alanine é😀\r\nF/C=C/F trans\r\n"
	c := start(t, clientSetup{})
	const u = "file:///work/labels.smi"
	c.open(u, "", 1, text)
	var hints []hint
	c.mustCall(methodInlayHint, map[string]any{"textDocument": textDoc(u), "range": wholeRange(text)}, &hints)
	if len(hints) != 2 {
		t.Fatalf("hints = %+v, want 2", hints)
	}
	want := []struct {
		label, after string
	}{{"S", "N[C@@H]"}, {"E", "F/C="}}
	for i, w := range want {
		h := hints[i]
		line := []string{"N[C@@H](C)C(=O)O L-alanine é😀", "F/C=C/F trans"}[i]
		if h.Label != w.label || h.Position.Line != uint32(i) || line[:h.Position.Character] != w.after {
			t.Errorf("hint %d = %+v, want %s after %q", i, h, w.label, w.after)
		}
	}
	// A range over the second line only.
	c.mustCall(methodInlayHint, map[string]any{"textDocument": textDoc(u), "range": map[string]any{
		"start": map[string]any{"line": 1, "character": 0}, "end": map[string]any{"line": 2, "character": 0},
	}}, &hints)
	if len(hints) != 1 || hints[0].Label != "E" {
		t.Errorf("hints of line 2 = %+v, want E", hints)
	}
}

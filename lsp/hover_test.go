package lsp

import (
	"strings"
	"testing"

	"go.lsp.dev/protocol"
)

// L-alanine, N[C@@H](C)C(=O)O, is (S) and belongs to the L family
// (common practice; the notation as in the OpenSMILES specification's
// chirality examples).
const pyAlanine = "# é😀 amino acids\nalanine_smiles = \"N[C@@H](C)C(=O)O\"  # L\n"

type hoverResult struct {
	Contents struct {
		Kind  string `json:"kind"`
		Value string `json:"value"`
	} `json:"contents"`
	Range *protocol.Range `json:"range"`
}

func hoverAt(t *testing.T, c *fakeClient, uri string, pos protocol.Position) *hoverResult {
	t.Helper()
	var h *hoverResult
	c.mustCall("textDocument/hover", map[string]any{"textDocument": textDoc(uri), "position": pos}, &h)
	return h
}

func TestHover(t *testing.T) {
	for _, enc := range []PositionEncoding{EncodingUTF16, EncodingUTF8} {
		t.Run(string(enc), func(t *testing.T) {
			c := start(t, clientSetup{caps: map[string]any{"general": map[string]any{"positionEncodings": []string{string(enc)}}}})
			const u = "file:///work/amino.py"
			c.open(u, "python", 1, pyAlanine)
			h := hoverAt(t, c, u, position(t, pyAlanine, "@@", 0, enc))
			if h == nil {
				t.Fatalf("no hover on the centre")
			}
			if h.Contents.Kind != "markdown" || !strings.Contains(h.Contents.Value, "(S)") {
				t.Errorf("hover = %+v, want markdown with (S)", h.Contents)
			}
			if h.Range == nil || rangeText(t, pyAlanine, *h.Range, enc) != "[C@@H]" {
				t.Errorf("hover range %v, want the bracket atom", h.Range)
			}
			// Over the comment there is nothing to say.
			if h := hoverAt(t, c, u, position(t, pyAlanine, "amino", 0, enc)); h != nil {
				t.Errorf("hover over the comment = %+v, want null", h)
			}
			// A position past the last line is over nothing, not an error.
			if h := hoverAt(t, c, u, protocol.Position{Line: 40, Character: 2}); h != nil {
				t.Errorf("hover past the end = %+v", h)
			}
		})
	}
}

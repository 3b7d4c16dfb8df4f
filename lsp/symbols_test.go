package lsp

import (
	"testing"

	"go.lsp.dev/protocol"
)

// The outline of a list file has one entry per record over its notation,
// named by its title (OpenSMILES 4.5: the title follows the notation after
// whitespace) or, without one, by the notation itself.
func TestDocumentSymbols(t *testing.T) {
	text := "CCO ethanol\r\nN[C@@H](C)C(=O)O L-alanine é\r\nC1CCCCC1\r\n"
	for _, hierarchical := range []bool{true, false} {
		caps := map[string]any{"textDocument": map[string]any{"documentSymbol": map[string]any{"hierarchicalDocumentSymbolSupport": hierarchical}}}
		c := start(t, clientSetup{caps: caps})
		const u = "file:///work/outline.smi"
		c.open(u, "", 1, text)
		var syms []struct {
			Name     string              `json:"name"`
			Kind     protocol.SymbolKind `json:"kind"`
			Range    *protocol.Range     `json:"range"`
			Location *protocol.Location  `json:"location"`
		}
		c.mustCall("textDocument/documentSymbol", map[string]any{"textDocument": textDoc(u)}, &syms)
		want := []struct{ name, covers string }{
			{"ethanol", "CCO"},
			{"L-alanine é", "N[C@@H](C)C(=O)O"},
			{"C1CCCCC1", "C1CCCCC1"},
		}
		if len(syms) != len(want) {
			t.Fatalf("hierarchical %v: symbols = %+v", hierarchical, syms)
		}
		for i, w := range want {
			rng := syms[i].Range
			if !hierarchical {
				if syms[i].Location == nil || string(syms[i].Location.URI) != u {
					t.Fatalf("flat symbol without a location: %+v", syms[i])
				}
				rng = &syms[i].Location.Range
			}
			if syms[i].Name != w.name || rng == nil || rangeText(t, text, *rng, EncodingUTF16) != w.covers {
				t.Errorf("hierarchical %v: symbol %d = %q over %v, want %q over %q", hierarchical, i, syms[i].Name, rng, w.name, w.covers)
			}
		}
	}
}

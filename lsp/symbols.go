package lsp

import (
	"context"
	"encoding/json"

	"go.lsp.dev/protocol"
	"go.lsp.dev/uri"
)

// documentSymbols answers textDocument/documentSymbol with one entry per
// record, so the outline of a list file shows its titles. Clients without
// hierarchical support get the flat SymbolInformation form.
func (s *Server) documentSymbols(ctx context.Context, snap *snapshot, params json.RawMessage) (any, error) {
	var p protocol.DocumentSymbolParams
	if err := decode(params, &p); err != nil {
		return nil, err
	}
	f, res, ok, err := s.result(ctx, snap, string(p.TextDocument.URI))
	if err != nil || !ok {
		return []protocol.DocumentSymbol{}, err
	}
	s.mu.Lock()
	hierarchical := s.caps.TextDocument.DocumentSymbol.HierarchicalDocumentSymbolSupport
	s.mu.Unlock()
	tree := []protocol.DocumentSymbol{}
	flat := []protocol.SymbolInformation{}
	for _, sym := range res.Symbols() {
		rng, err := f.mapper.SpanToRange(sym.Span)
		if err != nil {
			return nil, err
		}
		name := sym.Name
		if name == "" {
			name = "(empty record)" // clients reject empty names
		}
		if hierarchical {
			tree = append(tree, protocol.DocumentSymbol{Name: name, Kind: protocol.SymbolKindStruct, Range: rng, SelectionRange: rng})
		} else {
			flat = append(flat, protocol.SymbolInformation{Name: name, Kind: protocol.SymbolKindStruct,
				Location: protocol.Location{URI: uri.URI(f.URI), Range: rng}})
		}
	}
	if hierarchical {
		return tree, nil
	}
	return flat, nil
}

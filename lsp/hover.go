package lsp

import (
	"context"
	"encoding/json"

	"go.lsp.dev/protocol"
)

// hover answers textDocument/hover with the engine's markdown for the
// atom, bond, mark or record under the cursor, and the range it is about.
func (s *Server) hover(ctx context.Context, snap *snapshot, params json.RawMessage) (any, error) {
	var p protocol.TextDocumentPositionParams
	if err := decode(params, &p); err != nil {
		return nil, err
	}
	f, res, ok, err := s.result(ctx, snap, string(p.TextDocument.URI))
	if err != nil || !ok {
		return nil, err
	}
	off, err := f.mapper.PositionToOffset(p.Position)
	if err != nil {
		return nil, nil // a position outside the text is over nothing
	}
	md, span, ok := res.Hover(off)
	if !ok {
		return nil, nil
	}
	md += s.hoverChange(snap, f, res, off)
	md += s.hoverDrawing(res, off)
	rng, err := f.mapper.SpanToRange(span)
	if err != nil {
		return nil, err
	}
	return &protocol.Hover{
		Contents: protocol.MarkupContent{Kind: protocol.Markdown, Value: md},
		Range:    &rng,
	}, nil
}

package lsp

import (
	"context"
	"encoding/json"
)

// inlayHints answers textDocument/inlayHint: the descriptor after each
// labelled atom or bond inside the requested range. The engine returns
// none when the setting turns them off.
func (s *Server) inlayHints(ctx context.Context, snap *snapshot, params json.RawMessage) (any, error) {
	var p inlayHintParams
	if err := decode(params, &p); err != nil {
		return nil, err
	}
	hints := []inlayHint{}
	f, res, ok, err := s.result(ctx, snap, string(p.TextDocument.URI))
	if err != nil || !ok {
		return hints, err
	}
	span, err := f.mapper.RangeToSpan(p.Range)
	if err != nil {
		return hints, nil
	}
	for _, l := range res.InlayLabels() {
		if l.Offset < span.Start || l.Offset > span.End {
			continue
		}
		pos, err := f.mapper.OffsetToPosition(l.Offset)
		if err != nil {
			return nil, err
		}
		hints = append(hints, inlayHint{
			Position: pos,
			Label:    l.Text,
			Tooltip:  "stereo descriptor read from the notation as written",
		})
	}
	return hints, nil
}

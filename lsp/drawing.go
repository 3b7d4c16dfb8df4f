package lsp

import (
	"bytes"
	"context"
	"encoding/base64"
	"encoding/json"
	"fmt"
	"net/url"
	"os"
	"path/filepath"
	"sync"

	"go.lsp.dev/jsonrpc2"
	"go.lsp.dev/protocol"
	"go.uber.org/zap"

	"stereoline/notation"
	"stereoline/stereo/depict"
	"stereoline/stereo/document"
)

// This file implements the drawing in the hover: for clients that render
// markdown with a parser of their own (they declare it in
// general.markdown, LSP 3.16), the record under the cursor is drawn as
// an SVG image in a data URI under the text, with its Fischer projection
// where it has one. Other clients get the text hover alone.

// hoverDrawing returns the markdown of the drawing of the record at off,
// or "" when the client renders no images or there is no record.
func (s *Server) hoverDrawing(res *document.Result, off int) string {
	s.mu.Lock()
	images := s.caps.General.Markdown != nil && s.caps.General.Markdown.Parser != ""
	s.mu.Unlock()
	if !images {
		return ""
	}
	ri := res.RecordAt(off)
	if ri < 0 {
		return ""
	}
	rec := &res.Records[ri]
	if rec.Mol() == nil || len(rec.Mol().Atoms) > maxHoverAtoms {
		return ""
	}
	opt := depict.Options{Analysis: rec.Stereo()}
	if rec.Reaction() != nil {
		opt.Diagnostics = rec.Reaction().Diagnostics
	}
	out := "\n\n" + svgImage("structure diagram", depict.Draw(rec.Mol(), opt))
	if f, _ := depict.FischerOf(rec.Mol(), rec.Stereo()); f != nil {
		out += "\n\n" + svgImage("Fischer projection", f.Drawing(depict.Options{}))
	}
	return out
}

// maxHoverAtoms is the largest record drawn in a hover, which must
// answer at once; the drawing command draws any record.
const maxHoverAtoms = 300

// svgImage is a markdown image of the drawing as an SVG data URI.
func svgImage(alt string, d *depict.Drawing) string {
	var buf bytes.Buffer
	if err := depict.WriteSVG(&buf, d); err != nil {
		return ""
	}
	return "![" + alt + "](data:image/svg+xml;base64," + base64.StdEncoding.EncodeToString(buf.Bytes()) + ")"
}

// commandShowDrawing is the command of each record's code lens: it
// writes the record's drawing (and its Fischer projection where there is
// one) as SVG files into a folder of the server's and asks the client to
// open them (window/showDocument, LSP 3.16). The folder is removed when
// the server ends.
const commandShowDrawing = "stereoline.showDrawing"

// maxLenses bounds the code lenses of one document.
const maxLenses = 2000

// drawingFolder is the temporary folder of the drawing command.
type drawingFolder struct {
	mu  sync.Mutex
	dir string
	n   int
}

// write stores data under a new name ending in suffix and returns its
// path.
func (f *drawingFolder) write(suffix string, data []byte) (string, error) {
	f.mu.Lock()
	defer f.mu.Unlock()
	if f.dir == "" {
		dir, err := os.MkdirTemp("", "stereoline-drawings-")
		if err != nil {
			return "", err
		}
		f.dir = dir
	}
	f.n++
	path := filepath.Join(f.dir, fmt.Sprintf("drawing-%d%s", f.n, suffix))
	return path, os.WriteFile(path, data, 0o600)
}

// clean removes the folder and its files.
func (f *drawingFolder) clean() {
	f.mu.Lock()
	defer f.mu.Unlock()
	if f.dir != "" {
		os.RemoveAll(f.dir)
		f.dir = ""
	}
}

// codeLenses answers textDocument/codeLens: a lens that runs
// commandShowDrawing on each record the drawingLens setting names (by
// default the records of lists and tables).
func (s *Server) codeLenses(ctx context.Context, snap *snapshot, params json.RawMessage) (any, error) {
	var p protocol.CodeLensParams
	if err := decode(params, &p); err != nil {
		return nil, err
	}
	f, res, ok, err := s.result(ctx, snap, string(p.TextDocument.URI))
	if err != nil || !ok {
		return []protocol.CodeLens{}, err
	}
	lenses := []protocol.CodeLens{}
	for k, i := range res.DrawingLenses() {
		if k == maxLenses {
			break
		}
		sp := res.Records[i].Occ.Span
		rng, err := f.mapper.SpanToRange(notation.Span{Start: sp.Start, End: sp.Start})
		if err != nil {
			continue
		}
		lenses = append(lenses, protocol.CodeLens{Range: rng, Command: &protocol.Command{
			Title: "drawing", Command: commandShowDrawing,
			Arguments: []any{string(p.TextDocument.URI), sp.Start},
		}})
	}
	lenses = append(lenses, s.changeLenses(snap, f, res)...)
	return lenses, nil
}

// executeCommand runs commandShowDrawing: arguments are the document
// URI and a byte offset inside the record. It returns the paths written.
func (s *Server) executeCommand(ctx context.Context, snap *snapshot, params json.RawMessage) (any, error) {
	var p struct {
		Command   string            `json:"command"`
		Arguments []json.RawMessage `json:"arguments"`
	}
	if err := decode(params, &p); err != nil {
		return nil, err
	}
	if p.Command == commandShowChange {
		return s.showChange(ctx, snap, p.Arguments)
	}
	var uri string
	var off int
	if p.Command != commandShowDrawing || len(p.Arguments) != 2 ||
		json.Unmarshal(p.Arguments[0], &uri) != nil || json.Unmarshal(p.Arguments[1], &off) != nil {
		return nil, jsonrpc2.NewError(jsonrpc2.InvalidParams, "unknown command or arguments")
	}
	_, res, ok, err := s.result(ctx, snap, uri)
	if err != nil {
		return nil, err
	}
	ri := -1
	if ok {
		ri = res.RecordAt(off)
	}
	if ri < 0 {
		return nil, jsonrpc2.NewError(jsonrpc2.InvalidParams, "no record there; the document may have changed")
	}
	rec := &res.Records[ri]
	title := rec.Occ.Title
	if title == "" {
		title = rec.Occ.Text
	}
	opt := depict.Options{Analysis: rec.Stereo(), Title: title}
	if rec.Reaction() != nil {
		opt.Diagnostics = rec.Reaction().Diagnostics
	}
	drawings := []*depict.Drawing{depict.Draw(rec.Mol(), opt)}
	if f, _ := depict.FischerOf(rec.Mol(), rec.Stereo()); f != nil {
		drawings = append(drawings, f.Drawing(depict.Options{Title: title + " (Fischer projection)"}))
	}
	s.mu.Lock()
	show := s.caps.Window.ShowDocument != nil && s.caps.Window.ShowDocument.Support
	s.mu.Unlock()
	var paths []string
	for _, d := range drawings {
		var buf bytes.Buffer
		if err := depict.WriteSVG(&buf, d); err != nil {
			return nil, err
		}
		path, err := s.drawings.write(".svg", buf.Bytes())
		if err != nil {
			return nil, err
		}
		paths = append(paths, path)
		if show {
			var r struct {
				Success bool `json:"success"`
			}
			u := (&url.URL{Scheme: "file", Path: filepath.ToSlash(path)}).String()
			if err := s.callClient(ctx, "window/showDocument", map[string]any{"uri": u, "takeFocus": true}, &r); err != nil {
				s.log.Info("showDocument failed", zap.Error(err))
			}
		}
	}
	return paths, nil
}

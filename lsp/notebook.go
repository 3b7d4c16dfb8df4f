package lsp

import (
	"encoding/json"
	"fmt"

	"go.lsp.dev/protocol"
)

// Notebook document sync (LSP 3.17): the client sends a notebook's cells
// inside notebook notifications instead of textDocument ones. Each cell is
// its own document under its own URI; its language (python, markdown, ...)
// picks how notation is found in it, so the cell is given no file name.

// didOpenNotebook opens every cell of a notebook.
func (s *Server) didOpenNotebook(params json.RawMessage) error {
	var p didOpenNotebookParams
	if err := json.Unmarshal(params, &p); err != nil {
		return err
	}
	nb := p.NotebookDocument.URI
	for _, c := range p.CellTextDocuments {
		s.openCell(nb, c)
	}
	cells := make([]string, len(p.NotebookDocument.Cells))
	for i, c := range p.NotebookDocument.Cells {
		cells[i] = c.Document
	}
	s.mu.Lock()
	s.notebooks[nb] = cells
	s.mu.Unlock()
	return nil
}

func (s *Server) openCell(notebook string, c protocol.TextDocumentItem) {
	s.open(&fileVersion{
		URI:        string(c.URI),
		LanguageID: string(c.LanguageID),
		Version:    c.Version,
		Notebook:   notebook,
	}, []byte(c.Text))
}

// didChangeNotebook applies a change of cell structure (cells added,
// removed, moved) and of cell text.
func (s *Server) didChangeNotebook(params json.RawMessage) error {
	var p didChangeNotebookParams
	if err := json.Unmarshal(params, &p); err != nil {
		return err
	}
	nb := p.NotebookDocument.URI
	cells := p.Change.Cells
	if cells == nil {
		return nil // metadata only
	}
	if st := cells.Structure; st != nil {
		s.mu.Lock()
		order, ok := s.notebooks[nb]
		s.mu.Unlock()
		if !ok {
			return fmt.Errorf("change to a notebook that is not open: %s", nb)
		}
		a := st.Array
		if a.Start < 0 || a.DeleteCount < 0 || a.Start+a.DeleteCount > len(order) {
			return fmt.Errorf("notebook %s: cell change %d+%d outside %d cells", nb, a.Start, a.DeleteCount, len(order))
		}
		next := append([]string{}, order[:a.Start]...)
		for _, c := range a.Cells {
			next = append(next, c.Document)
		}
		next = append(next, order[a.Start+a.DeleteCount:]...)
		s.mu.Lock()
		s.notebooks[nb] = next
		s.mu.Unlock()
		var closed []string
		for _, c := range st.DidClose {
			closed = append(closed, string(c.URI))
		}
		if len(closed) > 0 {
			s.close(closed...)
		}
		for _, c := range st.DidOpen {
			s.openCell(nb, c)
		}
	}
	var first error
	for _, tc := range cells.TextContent {
		if err := s.change(string(tc.Document.URI), tc.Document.Version, tc.Changes); err != nil && first == nil {
			first = err
		}
	}
	return first
}

// didCloseNotebook closes the notebook's cells.
func (s *Server) didCloseNotebook(params json.RawMessage) error {
	var p didCloseNotebookParams
	if err := json.Unmarshal(params, &p); err != nil {
		return err
	}
	nb := p.NotebookDocument.URI
	s.mu.Lock()
	uris := append([]string{}, s.notebooks[nb]...)
	delete(s.notebooks, nb)
	s.mu.Unlock()
	for _, c := range p.CellTextDocuments {
		uris = append(uris, string(c.URI))
	}
	s.close(uris...)
	return nil
}

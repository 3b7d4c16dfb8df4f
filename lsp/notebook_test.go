package lsp

import (
	"testing"
)

// Notebook document sync follows LSP 3.17, "Notebook Document
// Synchronization": cells arrive inside notebookDocument/* notifications,
// each cell a text document of its own with its own language and version.

const (
	notebookURI = "file:///work/assay.ipynb"
	cellCode    = "vscode-notebook-cell:/work/assay.ipynb#W0sZmlsZQ%3D%3D"
	cellText    = "vscode-notebook-cell:/work/assay.ipynb#W1sZmlsZQ%3D%3D"
	cellAdded   = "vscode-notebook-cell:/work/assay.ipynb#W2sZmlsZQ%3D%3D"
)

func TestNotebookSync(t *testing.T) {
	c := start(t, clientSetup{})
	code := "# é😀\nsmiles = \"C[C@H](C)C\"\n"
	prose := "The mark in `F/C=CF` is one-sided.\n"
	c.notify(methodNotebookDidOpen, map[string]any{
		"notebookDocument": map[string]any{
			"uri": notebookURI, "notebookType": "jupyter-notebook", "version": 1,
			"cells": []any{
				map[string]any{"kind": 2, "document": cellCode},
				map[string]any{"kind": 1, "document": cellText},
			},
		},
		"cellTextDocuments": []any{
			map[string]any{"uri": cellCode, "languageId": "python", "version": 1, "text": code},
			map[string]any{"uri": cellText, "languageId": "markdown", "version": 1, "text": prose},
		},
	})
	if got := codes(t, c, cellCode, 1, code); len(got) != 1 || got[0] != "stereo-ineffective-center @" {
		t.Errorf("python cell: %v", got)
	}
	if got := codes(t, c, cellText, 1, prose); len(got) != 1 || got[0] != "stereo-one-sided-bond /" {
		t.Errorf("markdown cell: %v", got)
	}

	// Edit the code cell and add a third cell in one change.
	added := "ok_smiles = 'N[C@@H](C)C(=O)O'\n"
	c.notify(methodNotebookDidChange, map[string]any{
		"notebookDocument": map[string]any{"uri": notebookURI, "version": 2},
		"change": map[string]any{"cells": map[string]any{
			"structure": map[string]any{
				"array":   map[string]any{"start": 2, "deleteCount": 0, "cells": []any{map[string]any{"kind": 2, "document": cellAdded}}},
				"didOpen": []any{map[string]any{"uri": cellAdded, "languageId": "python", "version": 1, "text": added}},
			},
			"textContent": []any{map[string]any{
				"document": map[string]any{"uri": cellCode, "version": 2},
				"changes":  []any{edit(1, 13, 1, 14, "")},
			}},
		}},
	})
	code = "# é😀\nsmiles = \"C[CH](C)C\"\n"
	if got := codes(t, c, cellCode, 2, code); len(got) != 0 {
		t.Errorf("python cell after removing the mark: %v", got)
	}
	if got := codes(t, c, cellAdded, 1, added); len(got) != 0 {
		t.Errorf("added cell: %v", got)
	}
	var hints []struct {
		Label string `json:"label"`
	}
	c.mustCall(methodInlayHint, map[string]any{"textDocument": textDoc(cellAdded), "range": wholeRange(added)}, &hints)
	// L-alanine is (S) (common practice).
	if len(hints) != 1 || hints[0].Label != "S" {
		t.Errorf("hints in the added cell = %+v, want S", hints)
	}

	// Closing the notebook clears every cell's diagnostics.
	c.notify(methodNotebookDidClose, map[string]any{
		"notebookDocument":  map[string]any{"uri": notebookURI},
		"cellTextDocuments": []any{map[string]any{"uri": cellCode}, map[string]any{"uri": cellText}, map[string]any{"uri": cellAdded}},
	})
	for _, u := range []string{cellCode, cellText, cellAdded} {
		c.cleared(u)
	}
	var syms []any
	c.mustCall("textDocument/documentSymbol", map[string]any{"textDocument": textDoc(cellCode)}, &syms)
	if len(syms) != 0 {
		t.Errorf("symbols of a closed cell = %v", syms)
	}
}

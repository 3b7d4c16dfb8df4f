package lsp

import (
	"context"
	"os"
	"path/filepath"
	"sort"
	"strings"
	"testing"
	"time"

	"go.lsp.dev/protocol"
	"go.lsp.dev/uri"
)

// Facts of the trade behind the expected findings (common practice): in
// C[C@H](C)C the marked carbon carries three methyl groups, so the mark
// changes nothing; F/C=CF marks only one end of its double bond; in
// C/C(\F)=C/C both substituents of the first carbon are marked on the same
// side. Python reads "\1" inside an ordinary string literal as the octal
// escape for U+0001 (The Python Language Reference, "String and Bytes
// literals", escape sequences).

// pyEscape is a Python file with non-ASCII text before the notation: é is
// one UTF-16 unit in two bytes, the emoji two units in four bytes.
const pyEscape = "# é😀 ring closure kept as written\nring_smiles = \"C1CC\\1\"\n"

func TestPushDiagnosticsPython(t *testing.T) {
	for _, enc := range []PositionEncoding{EncodingUTF16, EncodingUTF8} {
		t.Run(string(enc), func(t *testing.T) {
			c := start(t, clientSetup{caps: map[string]any{"general": map[string]any{"positionEncodings": []string{string(enc)}}}})
			const u = "file:///work/rings.py"
			c.open(u, "python", 7, pyEscape)
			diags := c.diagnostics(u, 7)
			var found bool
			for _, d := range diags {
				if d.Code != "host-escape" {
					continue
				}
				found = true
				if got := rangeText(t, pyEscape, d.Range, enc); got != `\1` {
					t.Errorf("host-escape range %v covers %q, want \\1", d.Range, got)
				}
				// The same range as the client counts it: line 1,
				// after `ring_smiles = "C1CC`, which is ASCII.
				if d.Range.Start.Line != 1 || d.Range.Start.Character != uint32(len(`ring_smiles = "C1CC`)) {
					t.Errorf("host-escape starts at %v", d.Range.Start)
				}
				if d.Severity != protocol.DiagnosticSeverityError || d.Source != "stereoline" {
					t.Errorf("host-escape severity %v source %q", d.Severity, d.Source)
				}
			}
			if !found {
				t.Errorf("no host-escape diagnostic: %+v", diags)
			}
		})
	}
}

// On the comment line the emoji sits after é: UTF-16 and UTF-8 columns of
// a diagnostic there must differ by exactly the encodings' widths.
func TestPushDiagnosticsColumnsAfterNonASCII(t *testing.T) {
	for _, enc := range []PositionEncoding{EncodingUTF16, EncodingUTF8} {
		t.Run(string(enc), func(t *testing.T) {
			c := start(t, clientSetup{caps: map[string]any{"general": map[string]any{"positionEncodings": []string{string(enc)}}}})
			const u = "file:///work/comment.md"
			// Markdown: the inline code is unmistakably notation.
			md := "Note é😀: `C[C@H](C)C` here\r\n"
			c.open(u, "markdown", 2, md)
			diags := c.diagnostics(u, 2)
			if len(diags) != 1 || diags[0].Code != "stereo-ineffective-center" {
				t.Fatalf("diagnostics = %+v, want one ineffective centre", diags)
			}
			d := diags[0]
			if got := rangeText(t, md, d.Range, enc); got != "@" {
				t.Errorf("range %v covers %q, want @", d.Range, got)
			}
			want := uint32(len("Note é😀: `C[C")) // bytes
			if enc == EncodingUTF16 {
				want = uint32(len("Note ")) + 1 + 2 + uint32(len(": `C[C"))
			}
			if d.Range.Start.Character != want {
				t.Errorf("%s column %d, want %d", enc, d.Range.Start.Character, want)
			}
			if len(d.Tags) != 1 || d.Tags[0] != protocol.DiagnosticTagUnnecessary {
				t.Errorf("ineffective mark tags = %v, want Unnecessary", d.Tags)
			}
		})
	}
}

// A .smi file with CRLF line ends: line numbers count CRLF as one break,
// and related information points at the other mark of a conflict.
func TestPushDiagnosticsCRLF(t *testing.T) {
	text := "CCO ethanol\r\nC[C@H](C)C isobutane, marked\r\nC/C(\\F)=C/C conflict\r\n"
	c := start(t, clientSetup{})
	const u = "file:///work/list.smi"
	c.open(u, "", 1, text)
	diags := c.diagnostics(u, 1)
	byCode := map[string]protocol.Diagnostic{}
	for _, d := range diags {
		byCode[d.Code.(string)] = d
	}
	ine, ok := byCode["stereo-ineffective-center"]
	if !ok || ine.Range.Start.Line != 1 || rangeText(t, text, ine.Range, EncodingUTF16) != "@" {
		t.Errorf("ineffective centre = %+v", ine)
	}
	con, ok := byCode["stereo-conflicting-marks"]
	if !ok {
		t.Fatalf("no conflicting-marks diagnostic: %+v", diags)
	}
	if con.Range.Start.Line != 2 || rangeText(t, text, con.Range, EncodingUTF16) != `\` {
		t.Errorf("conflict range %v covers %q", con.Range, rangeText(t, text, con.Range, EncodingUTF16))
	}
	if len(con.RelatedInformation) != 1 {
		t.Fatalf("conflict related = %+v", con.RelatedInformation)
	}
	rel := con.RelatedInformation[0]
	if string(rel.Location.URI) != u || rel.Location.Range.Start.Line != 2 || rangeText(t, text, rel.Location.Range, EncodingUTF16) != "/" {
		t.Errorf("related %+v", rel)
	}
	if rel.Location.Range.Start.Character != 1 {
		t.Errorf("related mark at character %d, want 1 (the / after the first C)", rel.Location.Range.Start.Character)
	}
}

// A client that pulls diagnostics gets none pushed, full reports with a
// result id, and an unchanged report for an id that still holds (LSP
// 3.17, "Pull Diagnostics").
func TestPullDiagnostics(t *testing.T) {
	c := start(t, clientSetup{caps: map[string]any{"textDocument": map[string]any{"diagnostic": map[string]any{}}}})
	const u = "file:///work/pull.smi"
	text := "F/C=CF one end\n"
	c.open(u, "", 3, text)
	var rep struct {
		Kind     string                `json:"kind"`
		ResultID string                `json:"resultId"`
		Items    []protocol.Diagnostic `json:"items"`
	}
	c.mustCall(methodDocumentDiagnostic, map[string]any{"textDocument": textDoc(u)}, &rep)
	if rep.Kind != "full" || len(rep.Items) != 1 || rep.Items[0].Code != "stereo-one-sided-bond" {
		t.Fatalf("report = %+v", rep)
	}
	if got := rangeText(t, text, rep.Items[0].Range, EncodingUTF16); got != "/" {
		t.Errorf("one-sided range covers %q", got)
	}
	first := rep.ResultID
	rep.Items = nil
	c.mustCall(methodDocumentDiagnostic, map[string]any{"textDocument": textDoc(u), "previousResultId": first}, &rep)
	if rep.Kind != "unchanged" || rep.ResultID != first || rep.Items != nil {
		t.Errorf("second pull = %+v, want unchanged %s", rep, first)
	}
	c.change(u, 4, edit(0, 5, 0, 5, "/"))
	c.mustCall(methodDocumentDiagnostic, map[string]any{"textDocument": textDoc(u), "previousResultId": first}, &rep)
	if rep.Kind != "full" || rep.ResultID == first || len(rep.Items) != 0 {
		t.Errorf("after marking the other end = %+v, want a new full report without findings", rep)
	}
	if p := c.published(u); len(p) != 0 {
		t.Errorf("a pulling client got pushed diagnostics: %+v", p)
	}
}

// workspace/diagnostic reports the open documents and the host files on
// disk, with $/progress on the client's token.
func TestWorkspaceDiagnostics(t *testing.T) {
	dir := t.TempDir()
	write := func(name, text string) {
		p := filepath.Join(dir, name)
		os.MkdirAll(filepath.Dir(p), 0o755)
		if err := os.WriteFile(p, []byte(text), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	write("disk.smi", "C[C@H](C)C marked\n")
	write("notes.txt", "C[C@H](C)C is not read: no host kind\n")
	write(".cache/hidden.smi", "C[C@H](C)C hidden folder\n")
	write("open.smi", "CCO\n")
	c := start(t, clientSetup{rootURI: string(uri.File(dir)), caps: map[string]any{"textDocument": map[string]any{"diagnostic": map[string]any{}}}})
	openURI := string(uri.File(filepath.Join(dir, "open.smi")))
	c.open(openURI, "", 5, "F/C=CF\n") // the editor's text, not the disk's
	// An open notebook's cells are reported, not its file.
	write("assay.ipynb", `{"cells": [], "metadata": {}, "nbformat": 4, "nbformat_minor": 5}`)
	nb := string(uri.File(filepath.Join(dir, "assay.ipynb")))
	cell := "vscode-notebook-cell:" + filepath.Join(dir, "assay.ipynb") + "#W0"
	c.notify(methodNotebookDidOpen, map[string]any{
		"notebookDocument":  map[string]any{"uri": nb, "notebookType": "jupyter-notebook", "version": 1, "cells": []any{map[string]any{"kind": 2, "document": cell}}},
		"cellTextDocuments": []any{map[string]any{"uri": cell, "languageId": "python", "version": 1, "text": "smiles = 'C[C@H](C)C'\n"}},
	})
	var rep struct {
		Items []struct {
			URI      string                `json:"uri"`
			Version  *int32                `json:"version"`
			Kind     string                `json:"kind"`
			ResultID string                `json:"resultId"`
			Items    []protocol.Diagnostic `json:"items"`
		} `json:"items"`
	}
	c.mustCall(methodWorkspaceDiagnostic, map[string]any{"previousResultIds": []any{}, "workDoneToken": "scan-1"}, &rep)
	seen := map[string]bool{}
	for _, it := range rep.Items {
		name := filepath.Base(it.URI)
		seen[name] = true
		switch name {
		case "open.smi":
			if it.Version == nil || *it.Version != 5 || len(it.Items) != 1 || it.Items[0].Code != "stereo-one-sided-bond" {
				t.Errorf("open document report %+v", it)
			}
		case "assay.ipynb#W0":
			if it.Version == nil || len(it.Items) != 1 || it.Items[0].Code != "stereo-ineffective-center" {
				t.Errorf("notebook cell report %+v", it)
			}
		case "disk.smi":
			if it.Version != nil || len(it.Items) != 1 || it.Items[0].Code != "stereo-ineffective-center" {
				t.Errorf("disk file report %+v", it)
			}
		default:
			t.Errorf("unexpected report for %s", it.URI)
		}
	}
	if !seen["open.smi"] || !seen["disk.smi"] || !seen["assay.ipynb#W0"] {
		t.Errorf("reports for %v, want open.smi, the notebook cell and disk.smi", seen)
	}

	// The next pull names every result id: nothing changed, so the server
	// holds it until an edit.
	var prev []map[string]string
	for _, it := range rep.Items {
		prev = append(prev, map[string]string{"uri": it.URI, "value": it.ResultID})
	}
	type answer struct {
		items []string
		err   error
	}
	held := make(chan answer, 1)
	go func() {
		var rep2 struct {
			Items []struct {
				URI  string `json:"uri"`
				Kind string `json:"kind"`
			} `json:"items"`
		}
		_, err := c.conn.Call(context.Background(), methodWorkspaceDiagnostic, map[string]any{"previousResultIds": prev}, &rep2)
		var kinds []string
		for _, it := range rep2.Items {
			kinds = append(kinds, filepath.Base(it.URI)+" "+it.Kind)
		}
		held <- answer{kinds, err}
	}()
	select {
	case a := <-held:
		t.Fatalf("an all-unchanged pull was answered at once: %+v", a)
	case <-time.After(200 * time.Millisecond):
	}
	c.change(openURI, 6, map[string]any{"text": "F/C=C/F\n"})
	select {
	case a := <-held:
		sort.Strings(a.items)
		if a.err != nil || strings.Join(a.items, ", ") != "assay.ipynb#W0 unchanged, disk.smi unchanged, open.smi full" {
			t.Errorf("held pull answered %+v", a)
		}
	case <-time.After(waitLimit):
		t.Fatalf("held pull not answered after an edit")
	}

	c.until("progress end", func() bool {
		return len(c.progress) > 0 && c.progress[len(c.progress)-1].Kind == "end"
	})
	c.mu.Lock()
	if c.progress[0].Kind != "begin" || strings.Trim(string(c.progress[0].Token), `"`) != "scan-1" {
		t.Errorf("progress = %+v, want begin on token scan-1 first", c.progress)
	}
	c.mu.Unlock()
}

// A duplicate record points at the earlier one through related
// information (the requirement; the two lines are the same
// notation of (S)-butan-2-ol, so they are duplicates by any identity).
func TestDuplicateRelatedInformation(t *testing.T) {
	c := start(t, clientSetup{})
	const u = "file:///work/dupes.smi"
	text := "C[C@@H](O)CC first é\r\nC[C@@H](O)CC second\r\n"
	c.open(u, "", 1, text)
	var dup *protocol.Diagnostic
	for _, d := range c.diagnostics(u, 1) {
		if d.Range.Start.Line == 1 && len(d.RelatedInformation) > 0 {
			d := d
			dup = &d
		}
	}
	if dup == nil {
		t.Skip("the engine relates no records yet")
	}
	rel := dup.RelatedInformation[0].Location
	if string(rel.URI) != u || rel.Range.Start.Line != 0 || rangeText(t, text, rel.Range, EncodingUTF16) != "C[C@@H](O)CC" {
		t.Errorf("duplicate %s relates to %+v, want the first record's notation", dup.Code, rel)
	}
}

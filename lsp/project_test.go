package lsp

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"go.lsp.dev/protocol"
	"go.lsp.dev/uri"
)

// A project file (.stereoline.json, the checker's configuration file) in
// the document's folder or above is laid over the editor's settings; a
// change to it, saved in the editor, is applied to the open documents.
func TestProjectConfigFile(t *testing.T) {
	dir := t.TempDir()
	sub := filepath.Join(dir, "assays", "batch1")
	if err := os.MkdirAll(sub, 0o755); err != nil {
		t.Fatal(err)
	}
	project := filepath.Join(dir, ".stereoline.json")
	writeFile := func(text string) {
		if err := os.WriteFile(project, []byte(text), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	writeFile(`{"severity": {"stereo-ineffective-center": "error"}}`)
	c := start(t, clientSetup{
		initOpts: map[string]any{"severity": map[string]string{
			"stereo-ineffective-center": "hint",
			"stereo-one-sided-bond":     "information",
		}},
		caps: map[string]any{"workspace": map[string]any{"didChangeWatchedFiles": map[string]any{"dynamicRegistration": true}}},
	})
	c.until("a watcher on project files", func() bool { return len(c.refresh) > 0 && c.refresh[0] == "client/registerCapability" })
	u := string(uri.File(filepath.Join(sub, "list.smi")))
	text := isobutane + "F/C=CF one end\n"
	c.open(u, "", 1, text)
	diags := c.diagnostics(u, 1)
	// The file sets the first code; the editor's setting of the second
	// stands, since the file leaves it out.
	if severityOf(diags, "stereo-ineffective-center") != protocol.DiagnosticSeverityError ||
		severityOf(diags, "stereo-one-sided-bond") != protocol.DiagnosticSeverityInformation {
		t.Errorf("diagnostics under the project file: %+v", diags)
	}
	// An untitled document has no folder: the editor's settings apply.
	c.open("untitled:Untitled-1", "smiles", 1, text)
	if s := severityOf(c.diagnostics("untitled:Untitled-1", 1), "stereo-ineffective-center"); s != protocol.DiagnosticSeverityHint {
		t.Errorf("untitled document severity %v, want the editor's hint", s)
	}

	writeFile(`{"severity": {"stereo-ineffective-center": "off"}}`)
	c.notify("textDocument/didSave", map[string]any{"textDocument": textDoc(string(uri.File(project)))})
	c.until("republished under the saved project file", func() bool {
		for i := len(c.diags) - 1; i >= 0; i-- {
			if p := c.diags[i]; p.URI == u {
				return severityOf(p.Diagnostics, "stereo-ineffective-center") == 0 && len(p.Diagnostics) == 1
			}
		}
		return false
	})

	// A file with a setting the checker refuses is ignored with a
	// warning that names it.
	writeFile(`{"severty": {}}`)
	c.notify("workspace/didChangeWatchedFiles", map[string]any{"changes": []any{map[string]any{"uri": string(uri.File(project)), "type": 2}}})
	c.until("a warning about the project file", func() bool {
		for _, m := range c.messages {
			if strings.Contains(m, ".stereoline.json") {
				return true
			}
		}
		return false
	})
	c.until("the editor's settings again", func() bool {
		for i := len(c.diags) - 1; i >= 0; i-- {
			if p := c.diags[i]; p.URI == u {
				return severityOf(p.Diagnostics, "stereo-ineffective-center") == protocol.DiagnosticSeverityHint
			}
		}
		return false
	})
}

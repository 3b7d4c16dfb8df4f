package lsp

import (
	"encoding/json"
	"strings"
	"testing"
	"time"

	"go.lsp.dev/protocol"
)

// Settings layers: initializationOptions, then the workspace section
// pulled with workspace/configuration, then pushed changes (LSP 3.17,
// "Configuration Request" and "DidChangeConfiguration Notification").

const isobutane = "C[C@H](C)C marked isobutane\n" // an ineffective mark, a warning by default

func severityOf(diags []protocol.Diagnostic, code string) protocol.DiagnosticSeverity {
	for _, d := range diags {
		if d.Code == code {
			return d.Severity
		}
	}
	return 0
}

func TestInitializationOptions(t *testing.T) {
	c := start(t, clientSetup{initOpts: map[string]any{"stereoline": map[string]any{
		"severity":   map[string]string{"stereo-ineffective-center": "error"},
		"inlayHints": false,
	}}})
	const u = "file:///work/opts.smi"
	c.open(u, "", 1, isobutane+"N[C@@H](C)C(=O)O\n")
	if s := severityOf(c.diagnostics(u, 1), "stereo-ineffective-center"); s != protocol.DiagnosticSeverityError {
		t.Errorf("severity = %v, want error from initializationOptions", s)
	}
	var hints []hint
	c.mustCall(methodInlayHint, map[string]any{"textDocument": textDoc(u), "range": wholeRange(isobutane)}, &hints)
	if len(hints) != 0 {
		t.Errorf("hints switched off, got %+v", hints)
	}
}

// TestReadingSetting: the reading setting from the editor chooses how a
// lone-pair centre written first is read (testdata/survey): methyl
// phenyl sulfoxide written from its sulfur is (S) with the lone pair in
// the hydrogen's slot, as Open Babel reads it, and (R) by default, as
// RDKit 2022.09.3 reads it; the finding says so.
func TestReadingSetting(t *testing.T) {
	for _, c := range []struct {
		opts map[string]any
		want string
	}{
		{map[string]any{}, "read as (R) here"},
		{map[string]any{"reading": map[string]any{"lonePair": "hydrogen-slot"}}, "read as (S) here"},
	} {
		cl := start(t, clientSetup{initOpts: map[string]any{"stereoline": c.opts}})
		const u = "file:///work/sulfoxide.smi"
		cl.open(u, "", 1, "[S@](=O)(C)c1ccccc1 LRK-BB-021\n")
		found := false
		for _, d := range cl.diagnostics(u, 1) {
			found = found || d.Code == "stereo-reader-dependent" && strings.HasPrefix(d.Message, c.want)
		}
		if !found {
			t.Errorf("settings %v: no stereo-reader-dependent finding starting %q", c.opts, c.want)
		}
	}
}

func TestWorkspaceConfiguration(t *testing.T) {
	c := start(t, clientSetup{
		caps: map[string]any{"workspace": map[string]any{
			"configuration": true,
			"inlayHint":     map[string]any{"refreshSupport": true},
		}},
		settings: json.RawMessage(`{"severity": {"stereo-ineffective-center": "hint"}}`),
	})
	c.until("workspace/configuration", func() bool { return c.asked > 0 })
	const u = "file:///work/settings.smi"
	c.open(u, "", 1, isobutane)
	c.until("hint severity", func() bool {
		for _, p := range c.diags {
			if p.URI == u && severityOf(p.Diagnostics, "stereo-ineffective-center") == protocol.DiagnosticSeverityHint {
				return true
			}
		}
		return false
	})

	// A pushed change switches the code off: the open document is
	// published again without it, and the client is asked to refresh its
	// inlay hints.
	before := len(c.published(u))
	c.notify("workspace/didChangeConfiguration", map[string]any{"settings": map[string]any{
		"stereoline": map[string]any{"severity": map[string]string{"stereo-ineffective-center": "off"}},
	}})
	c.until("republished without the code", func() bool {
		n := 0
		for _, p := range c.diags {
			if p.URI == u {
				n++
				if n > before && len(p.Diagnostics) == 0 {
					return true
				}
			}
		}
		return false
	})
	c.until("inlay hint refresh", func() bool { return len(c.refresh) > 0 })

	// Null settings mean "ask me" (the pull model).
	asked := c.asked
	c.mu.Lock()
	c.settings = json.RawMessage(`{"severity": {"stereo-ineffective-center": "information"}}`)
	c.mu.Unlock()
	c.notify("workspace/didChangeConfiguration", map[string]any{"settings": nil})
	c.until("a second workspace/configuration", func() bool { return c.asked > asked })
	var rep struct {
		Items []protocol.Diagnostic `json:"items"`
	}
	c.until("information severity", func() bool {
		for i := len(c.diags) - 1; i >= 0; i-- {
			if p := c.diags[i]; p.URI == u {
				return severityOf(p.Diagnostics, "stereo-ineffective-center") == protocol.DiagnosticSeverityInformation
			}
		}
		return false
	})
	c.mustCall(methodDocumentDiagnostic, map[string]any{"textDocument": textDoc(u)}, &rep)
	if severityOf(rep.Items, "stereo-ineffective-center") != protocol.DiagnosticSeverityInformation {
		t.Errorf("pulled after the change: %+v", rep.Items)
	}
}

// A setting the engine cannot honour is refused with a message to the
// user; the settings in force stay.
func TestBadSettings(t *testing.T) {
	c := start(t, clientSetup{})
	c.notify("workspace/didChangeConfiguration", map[string]any{"settings": map[string]any{
		"stereoline": map[string]any{"severity": map[string]string{"stereo-ineffective-center": "loud"}},
	}})
	c.until("a warning message", func() bool { return len(c.messages) > 0 })
	c.mu.Lock()
	msg := c.messages[0]
	c.mu.Unlock()
	if !strings.Contains(msg, "loud") {
		t.Errorf("message %q does not name the bad value", msg)
	}
	const u = "file:///work/still.smi"
	c.open(u, "", 1, isobutane)
	if s := severityOf(c.diagnostics(u, 1), "stereo-ineffective-center"); s != protocol.DiagnosticSeverityWarning {
		t.Errorf("severity after a refused setting = %v, want the default warning", s)
	}
}

func TestBadInitializationOptions(t *testing.T) {
	c := start(t, clientSetup{initOpts: map[string]any{"detection": "everything"}})
	c.until("a warning message", func() bool { return len(c.messages) > 0 })
	c.mu.Lock()
	msg := c.messages[0]
	c.mu.Unlock()
	if !strings.Contains(msg, "everything") {
		t.Errorf("message %q does not name the bad value", msg)
	}
	const u = "file:///work/defaults.smi"
	c.open(u, "", 1, isobutane)
	if s := severityOf(c.diagnostics(u, 1), "stereo-ineffective-center"); s != protocol.DiagnosticSeverityWarning {
		t.Errorf("severity under the defaults = %v, want warning", s)
	}
}

// The finder's settings reach it through the server: a CSV column whose
// header names no structure is read by its content, or because it is
// configured, and detection "names" stops the guessing by content, in
// tables as in the unnamed inline code of Markdown.
func TestFinderSettings(t *testing.T) {
	csv := "id,compound\r\n1,C[C@H](C)C\r\n"
	md := "Marked `C[C@H](C)C` by mistake.\n"
	tests := []struct {
		name     string
		settings map[string]any
		csv, md  int // diagnostics expected
	}{
		{"defaults", map[string]any{}, 1, 1},
		{"a configured column", map[string]any{"columns": []string{"compound"}, "detection": "names"}, 1, 0},
		{"names only", map[string]any{"detection": "names"}, 0, 0},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			c := start(t, clientSetup{initOpts: tt.settings})
			c.open("file:///work/assay.csv", "csv", 1, csv)
			c.open("file:///work/notes.md", "markdown", 1, md)
			if got := codes(t, c, "file:///work/assay.csv", 1, csv); len(got) != tt.csv {
				t.Errorf("csv: %v, want %d findings", got, tt.csv)
			}
			if got := codes(t, c, "file:///work/notes.md", 1, md); len(got) != tt.md {
				t.Errorf("markdown: %v, want %d findings", got, tt.md)
			}
		})
	}
}

// TestPulledSettingsDoNotOverrideNewer checks that settings the client
// pushes while it answers a workspace/configuration request (LSP 3.17)
// are not overridden by that answer when it comes: the pushed ones are
// newer. The client answers the server's first pull late, with the
// settings it held when asked.
func TestPulledSettingsDoNotOverrideNewer(t *testing.T) {
	c := start(t, clientSetup{
		caps:        map[string]any{"workspace": map[string]any{"configuration": true}},
		settings:    json.RawMessage(`{"severity": {"stereo-ineffective-center": "hint"}}`),
		configDelay: 300 * time.Millisecond,
	})
	c.until("workspace/configuration", func() bool { return c.asked > 0 })
	c.notify("workspace/didChangeConfiguration", map[string]any{"settings": map[string]any{
		"stereoline": map[string]any{"severity": map[string]string{"stereo-ineffective-center": "off"}},
	}})
	// The log says when the late answer came (no message tells the
	// client).
	handled := func() bool {
		logs := c.logs.String()
		return strings.Contains(logs, "pulled settings dropped") || strings.Count(logs, `"settings applied"`) > 1
	}
	for deadline := time.Now().Add(waitLimit); !handled(); {
		if time.Now().After(deadline) {
			t.Fatalf("the late answer to the pull did not come:\n%s", c.logs.String())
		}
		time.Sleep(10 * time.Millisecond)
	}
	const u = "file:///work/late.smi"
	c.open(u, "", 1, isobutane)
	c.until("a publication", func() bool {
		for _, p := range c.diags {
			if p.URI == u {
				return true
			}
		}
		return false
	})
	for _, p := range c.published(u) {
		if severityOf(p.Diagnostics, "stereo-ineffective-center") != 0 {
			t.Fatalf("the late answer to the pull overrode the pushed settings: %+v", p.Diagnostics)
		}
	}
}

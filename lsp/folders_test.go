package lsp

import (
	"context"
	"encoding/json"
	"os"
	"path/filepath"
	"sort"
	"strings"
	"testing"
	"time"

	"go.lsp.dev/protocol"
	"go.lsp.dev/uri"
)

// The messages and fields these tests send are those of LSP 3.17:
// "Workspace folders" (workspace.workspaceFolders in the client
// capabilities, workspaceFolders in InitializeParams, the
// workspace/didChangeWorkspaceFolders notification and its added and
// removed lists), "DidChangeWatchedFiles Notification" (FileChangeType 1
// created, 2 changed, 3 deleted) and "Workspace Diagnostics". The
// ineffective mark of isobutane is a warning by default (config_test.go).

// projectTree makes folders under a temporary directory, each with the
// project file given for it ("" for none), and returns their paths.
func projectTree(t *testing.T, projectFiles map[string]string) map[string]string {
	t.Helper()
	dir := t.TempDir()
	out := map[string]string{}
	for name, config := range projectFiles {
		p := filepath.Join(dir, name)
		if err := os.MkdirAll(p, 0o755); err != nil {
			t.Fatal(err)
		}
		if config != "" {
			writeTestFile(t, filepath.Join(p, ".stereoline.json"), config)
		}
		out[name] = p
	}
	return out
}

func writeTestFile(t *testing.T, path, text string) {
	t.Helper()
	if err := os.WriteFile(path, []byte(text), 0o644); err != nil {
		t.Fatal(err)
	}
}

// folderChange is the parameter of workspace/didChangeWorkspaceFolders.
func folderChange(added, removed []string) map[string]any {
	list := func(paths []string) []any {
		out := []any{}
		for _, p := range paths {
			out = append(out, map[string]string{"uri": string(uri.File(p)), "name": filepath.Base(p)})
		}
		return out
	}
	return map[string]any{"event": map[string]any{"added": list(added), "removed": list(removed)}}
}

// untilSeverity waits for the last publication for u to give code the
// severity want.
func (c *fakeClient) untilSeverity(u, code string, want protocol.DiagnosticSeverity) {
	c.t.Helper()
	c.until(u+" with "+code+" at severity "+severityName[want], func() bool {
		for i := len(c.diags) - 1; i >= 0; i-- {
			if p := c.diags[i]; p.URI == u {
				return severityOf(p.Diagnostics, code) == want
			}
		}
		return false
	})
}

// severityName names the severities of LSP 3.17, "DiagnosticSeverity";
// none is a report without the code.
var severityName = map[protocol.DiagnosticSeverity]string{
	0: "none", protocol.DiagnosticSeverityError: "error", protocol.DiagnosticSeverityWarning: "warning",
	protocol.DiagnosticSeverityInformation: "information", protocol.DiagnosticSeverityHint: "hint",
}

// quiet gives the server time to publish what it scheduled, so a test can
// check that it published nothing more.
func quiet() { time.Sleep(15 * testDebounce) }

const foldersCap = `{"workspace": {"workspaceFolders": true}}`

func capsFrom(t *testing.T, s string) map[string]any {
	var m map[string]any
	if err := json.Unmarshal([]byte(s), &m); err != nil {
		t.Fatal(err)
	}
	return m
}

// The server announces workspace folder support with change
// notifications, and a folder added later brings its project file to the
// open documents under it; documents elsewhere keep their analyses.
func TestFolderAdded(t *testing.T) {
	dirs := projectTree(t, map[string]string{
		"a": "",
		"b": `{"severity": {"stereo-ineffective-center": "error"}}`,
	})
	c := start(t, clientSetup{caps: capsFrom(t, foldersCap), folders: []string{string(uri.File(dirs["a"]))}})
	var init struct {
		Capabilities struct {
			Workspace struct {
				WorkspaceFolders struct {
					Supported           bool `json:"supported"`
					ChangeNotifications any  `json:"changeNotifications"`
				} `json:"workspaceFolders"`
			} `json:"workspace"`
		} `json:"capabilities"`
	}
	// initialize may not be sent twice; a fresh session shows what the
	// first one announced.
	c2 := start(t, clientSetup{noInit: true})
	c2.mustCall("initialize", map[string]any{"processId": nil, "capabilities": capsFrom(t, foldersCap)}, &init)
	if wf := init.Capabilities.Workspace.WorkspaceFolders; !wf.Supported || wf.ChangeNotifications != true {
		t.Errorf("workspace folders announced as %+v, want supported with change notifications", wf)
	}

	ua := string(uri.File(filepath.Join(dirs["a"], "list.smi")))
	ub := string(uri.File(filepath.Join(dirs["b"], "list.smi")))
	c.open(ua, "", 1, isobutane)
	c.open(ub, "", 1, isobutane)
	// b is not in the workspace yet, so its project file is not read.
	if s := severityOf(c.diagnostics(ub, 1), "stereo-ineffective-center"); s != protocol.DiagnosticSeverityWarning {
		t.Errorf("before b is added: severity %v, want the default warning", s)
	}
	c.diagnostics(ua, 1)
	c.notify("workspace/didChangeWorkspaceFolders", folderChange([]string{dirs["b"]}, nil))
	c.untilSeverity(ub, "stereo-ineffective-center", protocol.DiagnosticSeverityError)
	quiet()
	if n := len(c.published(ua)); n != 1 {
		t.Errorf("a's document published %d times, want once: its settings did not change", n)
	}
}

// Removing a folder drops its project file from the documents under it
// and from the server's cache, and a workspace pull then clears the
// reports of its files on disk once; adding it back reports them again.
func TestFolderRemoved(t *testing.T) {
	dirs := projectTree(t, map[string]string{
		"a": "",
		"b": `{"severity": {"stereo-ineffective-center": "error"}}`,
	})
	folders := []string{string(uri.File(dirs["a"])), string(uri.File(dirs["b"]))}

	t.Run("push", func(t *testing.T) {
		var srv *Server
		c := start(t, clientSetup{caps: capsFrom(t, foldersCap), folders: folders, hook: func(s *Server) { srv = s }})
		ub := string(uri.File(filepath.Join(dirs["b"], "list.smi")))
		c.open(ub, "", 1, isobutane)
		if s := severityOf(c.diagnostics(ub, 1), "stereo-ineffective-center"); s != protocol.DiagnosticSeverityError {
			t.Fatalf("under b's project file: severity %v, want error", s)
		}
		c.notify("workspace/didChangeWorkspaceFolders", folderChange(nil, []string{dirs["b"]}))
		c.untilSeverity(ub, "stereo-ineffective-center", protocol.DiagnosticSeverityWarning)
		srv.projects.mu.Lock()
		for file := range srv.projects.entries {
			if strings.HasPrefix(file, dirs["b"]) {
				t.Errorf("project file %s of a removed folder still cached", file)
			}
		}
		srv.projects.mu.Unlock()
	})

	t.Run("pull", func(t *testing.T) {
		writeTestFile(t, filepath.Join(dirs["a"], "x.smi"), isobutane)
		writeTestFile(t, filepath.Join(dirs["b"], "y.smi"), isobutane)
		caps := capsFrom(t, foldersCap)
		caps["textDocument"] = map[string]any{"diagnostic": map[string]any{}}
		c := start(t, clientSetup{caps: caps, folders: folders})
		type report struct {
			URI      string                `json:"uri"`
			Kind     string                `json:"kind"`
			ResultID string                `json:"resultId"`
			Items    []protocol.Diagnostic `json:"items"`
		}
		var ids []map[string]string
		pull := func() []report {
			var rep struct {
				Items []report `json:"items"`
			}
			c.mustCall(methodWorkspaceDiagnostic, map[string]any{"previousResultIds": ids}, &rep)
			known := map[string]string{}
			for _, id := range ids {
				known[id["uri"]] = id["value"]
			}
			for _, it := range rep.Items {
				known[it.URI] = it.ResultID
			}
			ids = nil
			for u, v := range known {
				ids = append(ids, map[string]string{"uri": u, "value": v})
			}
			return rep.Items
		}
		summary := func(items []report) string {
			var out []string
			for _, it := range items {
				s := filepath.Base(it.URI) + " " + it.Kind
				if it.Kind == "full" {
					s += " " + severityName[severityOf(it.Items, "stereo-ineffective-center")]
				}
				out = append(out, s)
			}
			sort.Strings(out)
			return strings.Join(out, ", ")
		}
		if got, want := summary(pull()), "x.smi full warning, y.smi full error"; got != want {
			t.Errorf("first pull: %s, want %s", got, want)
		}
		c.notify("workspace/didChangeWorkspaceFolders", folderChange(nil, []string{dirs["b"]}))
		if got, want := summary(pull()), "x.smi unchanged, y.smi full none"; got != want {
			t.Errorf("pull after b is removed: %s, want %s (y.smi cleared)", got, want)
		}
		// All unchanged now, so the pull is held; adding b back answers
		// it, with y.smi reported again and nothing cleared twice.
		held := make(chan string, 1)
		go func() {
			var rep struct {
				Items []report `json:"items"`
			}
			ctx, cancel := context.WithTimeout(context.Background(), waitLimit)
			defer cancel()
			if _, err := c.conn.Call(ctx, methodWorkspaceDiagnostic, map[string]any{"previousResultIds": ids}, &rep); err != nil {
				held <- err.Error()
				return
			}
			held <- summary(rep.Items)
		}()
		select {
		case got := <-held:
			t.Fatalf("an all-unchanged pull was answered at once: %s", got)
		case <-time.After(200 * time.Millisecond):
		}
		c.notify("workspace/didChangeWorkspaceFolders", folderChange([]string{dirs["b"]}, nil))
		select {
		case got := <-held:
			if want := "x.smi unchanged, y.smi full error"; got != want {
				t.Errorf("pull after b is added back: %s, want %s", got, want)
			}
		case <-time.After(waitLimit):
			t.Fatalf("held pull not answered after a folder change")
		}
	})
}

// A project file above a workspace folder applies to the documents in it,
// as it does for the checker: the folder may be a subfolder of the
// project.
func TestProjectFileAboveFolder(t *testing.T) {
	dirs := projectTree(t, map[string]string{
		"repo":           `{"severity": {"stereo-ineffective-center": "error"}}`,
		"repo/assays":    "",
		"repo/assays/b1": `{"severity": {"stereo-ineffective-center": "hint"}}`,
	})
	c := start(t, clientSetup{caps: capsFrom(t, foldersCap), folders: []string{string(uri.File(dirs["repo/assays"]))}})
	top := string(uri.File(filepath.Join(dirs["repo/assays"], "list.smi")))
	nested := string(uri.File(filepath.Join(dirs["repo/assays/b1"], "list.smi")))
	c.open(top, "", 1, isobutane)
	c.open(nested, "", 1, isobutane)
	if s := severityOf(c.diagnostics(top, 1), "stereo-ineffective-center"); s != protocol.DiagnosticSeverityError {
		t.Errorf("under the repository's project file: severity %v, want error", s)
	}
	if s := severityOf(c.diagnostics(nested, 1), "stereo-ineffective-center"); s != protocol.DiagnosticSeverityHint {
		t.Errorf("under a nearer project file: severity %v, want its hint", s)
	}
}

// A changed project file reaches the documents under it, through a
// watcher the server registers when the client allows it, and only them.
func TestProjectFileChangedInOneFolder(t *testing.T) {
	dirs := projectTree(t, map[string]string{
		"a": `{"severity": {"stereo-ineffective-center": "hint"}}`,
		"b": `{"severity": {"stereo-ineffective-center": "information"}}`,
	})
	caps := capsFrom(t, `{"workspace": {"workspaceFolders": true, "didChangeWatchedFiles": {"dynamicRegistration": true}}}`)
	c := start(t, clientSetup{caps: caps, folders: []string{string(uri.File(dirs["a"])), string(uri.File(dirs["b"]))}})
	c.until("a watcher on project files", func() bool {
		for _, m := range c.refresh {
			if m == "client/registerCapability" {
				return true
			}
		}
		return false
	})
	ua := string(uri.File(filepath.Join(dirs["a"], "list.smi")))
	ub := string(uri.File(filepath.Join(dirs["b"], "list.smi")))
	c.open(ua, "", 1, isobutane)
	c.open(ub, "", 1, isobutane)
	if s := severityOf(c.diagnostics(ua, 1), "stereo-ineffective-center"); s != protocol.DiagnosticSeverityHint {
		t.Errorf("a: severity %v, want its project file's hint", s)
	}
	if s := severityOf(c.diagnostics(ub, 1), "stereo-ineffective-center"); s != protocol.DiagnosticSeverityInformation {
		t.Errorf("b: severity %v, want its project file's information", s)
	}
	projectA := filepath.Join(dirs["a"], ".stereoline.json")
	writeTestFile(t, projectA, `{"severity": {"stereo-ineffective-center": "error"}}`)
	c.notify("workspace/didChangeWatchedFiles", map[string]any{"changes": []any{map[string]any{"uri": string(uri.File(projectA)), "type": 2}}})
	c.untilSeverity(ua, "stereo-ineffective-center", protocol.DiagnosticSeverityError)
	quiet()
	if n := len(c.published(ub)); n != 1 {
		t.Errorf("b's document published %d times, want once: its project file did not change", n)
	}
	// Deleted: the editor's settings apply again.
	if err := os.Remove(projectA); err != nil {
		t.Fatal(err)
	}
	c.notify("workspace/didChangeWatchedFiles", map[string]any{"changes": []any{map[string]any{"uri": string(uri.File(projectA)), "type": 3}}})
	c.untilSeverity(ua, "stereo-ineffective-center", protocol.DiagnosticSeverityWarning)
}

// A client without workspace folder support names its root only: that
// is the one folder, project files outside it are not read, no watcher
// is registered without dynamic registration, and a workspace pull covers
// the root alone.
func TestClientWithoutWorkspaceFolders(t *testing.T) {
	dirs := projectTree(t, map[string]string{
		"root":  `{"severity": {"stereo-ineffective-center": "error"}}`,
		"other": `{"severity": {"stereo-ineffective-center": "hint"}}`,
	})
	writeTestFile(t, filepath.Join(dirs["root"], "disk.smi"), isobutane)
	writeTestFile(t, filepath.Join(dirs["other"], "elsewhere.smi"), isobutane)
	c := start(t, clientSetup{rootURI: string(uri.File(dirs["root"]))})
	in := string(uri.File(filepath.Join(dirs["root"], "in.smi")))
	out := string(uri.File(filepath.Join(dirs["other"], "out.smi")))
	c.open(in, "", 1, isobutane)
	c.open(out, "", 1, isobutane)
	if s := severityOf(c.diagnostics(in, 1), "stereo-ineffective-center"); s != protocol.DiagnosticSeverityError {
		t.Errorf("inside the root: severity %v, want the project file's error", s)
	}
	if s := severityOf(c.diagnostics(out, 1), "stereo-ineffective-center"); s != protocol.DiagnosticSeverityWarning {
		t.Errorf("outside the root: severity %v, want the default warning", s)
	}
	var rep struct {
		Items []struct {
			URI string `json:"uri"`
		} `json:"items"`
	}
	c.mustCall(methodWorkspaceDiagnostic, map[string]any{"previousResultIds": []any{}}, &rep)
	var names []string
	for _, it := range rep.Items {
		names = append(names, filepath.Base(it.URI))
	}
	sort.Strings(names)
	if got := strings.Join(names, " "); got != "disk.smi in.smi out.smi" {
		t.Errorf("workspace pull reports %s, want disk.smi and the open documents", got)
	}
	c.mu.Lock()
	defer c.mu.Unlock()
	for _, m := range c.refresh {
		if m == "client/registerCapability" {
			t.Errorf("a watcher was registered with a client that cannot register one")
		}
	}
}

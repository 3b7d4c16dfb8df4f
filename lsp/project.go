package lsp

import (
	"fmt"
	"os"
	"path/filepath"
	"sync"
	"time"

	"go.uber.org/zap"

	"stereoline/stereo/document"
)

// A project configuration file (document.ConfigFileName) in a document's
// folder or a folder above applies to it, as it does for the checker: the
// nearest one wins, for documents in the workspace folders (folders.go).
// It is the top layer, over the editor's settings, so the editor reports
// what 'stereoline check' reports; settings the file leaves out come from
// the editor.

// projectConfigs caches the configurations read from project files, per
// file and per editor configuration.
type projectConfigs struct {
	mu      sync.Mutex
	entries map[string]projectEntry
}

type projectEntry struct {
	modTime time.Time
	size    int64
	editor  uint64 // the editor configuration it was laid over
	config  configured
	err     error
}

// configFor picks the configuration of a document: the nearest project
// file laid over the snapshot's editor settings, or those settings alone.
func (s *Server) configFor(snap *snapshot, path string) configured {
	if path == "" {
		return snap.editor
	}
	file, ok := projectFileFor(snap.roots, path)
	if !ok {
		return snap.editor
	}
	st, err := os.Stat(file)
	if err != nil {
		return snap.editor
	}
	p := &s.projects
	p.mu.Lock()
	e, cached := p.entries[file]
	p.mu.Unlock()
	if cached && e.modTime.Equal(st.ModTime()) && e.size == st.Size() && e.editor == snap.editor.id {
		if e.err != nil {
			return snap.editor
		}
		return e.config
	}
	e = projectEntry{modTime: st.ModTime(), size: st.Size(), editor: snap.editor.id}
	e.config, e.err = readProjectConfig(file, snap.editor)
	p.mu.Lock()
	if p.entries == nil {
		p.entries = map[string]projectEntry{}
	}
	p.entries[file] = e
	p.mu.Unlock()
	if e.err != nil {
		// Said once per version of the file: the entry is cached.
		s.log.Warn("project configuration ignored", zap.String("file", file), zap.Error(e.err))
		s.showWarning(fmt.Sprintf("stereoline: %s ignored: %v", file, e.err))
		return snap.editor
	}
	s.log.Info("project configuration", zap.String("file", file))
	return e.config
}

// readProjectConfig validates a project file as the checker does and lays
// the settings it names over the editor's.
func readProjectConfig(file string, editor configured) (configured, error) {
	if _, err := document.ReadConfigFile(file); err != nil {
		return configured{}, err
	}
	data, err := os.ReadFile(file)
	if err != nil {
		return configured{}, err
	}
	cfg := cloneConfig(editor.analyzer.Config())
	if err := cfg.Merge(data); err != nil {
		return configured{}, err
	}
	return newConfigured(editor.analyzer.WithConfig(cfg)), nil
}

// cloneConfig copies the maps and lists of a configuration, so merging
// settings into the copy leaves the original as it was.
func cloneConfig(c document.Config) document.Config {
	if c.Severity != nil {
		m := make(map[string]string, len(c.Severity))
		for k, v := range c.Severity {
			m[k] = v
		}
		c.Severity = m
	}
	if c.Files != nil {
		m := make(map[string]string, len(c.Files))
		for k, v := range c.Files {
			m[k] = v
		}
		c.Files = m
	}
	c.Columns = append([]string(nil), c.Columns...)
	c.Names = append([]string(nil), c.Names...)
	return c
}

// projectFilePath returns the path of the project configuration file a
// URI names, or "" when it names another file.
func projectFilePath(uri string) string {
	p := fileURIPath(uri)
	if p == "" || filepath.Base(p) != document.ConfigFileName {
		return ""
	}
	return cleanPath(p)
}

// forgetFile drops what was read from one project file, so the next
// lookup reads it again even if a change kept its size and time. The
// others stay cached, so documents under them keep their analyses.
func (p *projectConfigs) forgetFile(file string) {
	p.mu.Lock()
	delete(p.entries, file)
	p.mu.Unlock()
}

// forgetUnder drops what was read from the project files under a folder
// that left the workspace.
func (p *projectConfigs) forgetUnder(root string) {
	p.mu.Lock()
	for file := range p.entries {
		if within(root, file) {
			delete(p.entries, file)
		}
	}
	p.mu.Unlock()
}

// watchProjectFiles asks the client to report changes to project files
// made outside the editor, when it can register watchers.
func (s *Server) watchProjectFiles() {
	defer s.recoverPanic("client/registerCapability")
	params := map[string]any{"registrations": []any{map[string]any{
		"id":     "stereoline-project-files",
		"method": "workspace/didChangeWatchedFiles",
		"registerOptions": map[string]any{"watchers": []any{
			map[string]any{"globPattern": "**/" + document.ConfigFileName},
		}},
	}}}
	if err := s.callClient(s.ctx, "client/registerCapability", params, nil); err != nil {
		s.log.Info("no watcher for project files", zap.Error(err))
	}
}

package lsp

import (
	"encoding/json"
	"fmt"

	"go.uber.org/zap"

	"stereoline/stereo/document"
)

// Settings come in three layers, each over the one before: the engine's
// defaults, the client's initializationOptions, then the "stereoline"
// section of the workspace settings (pulled with workspace/configuration
// or pushed with workspace/didChangeConfiguration). A partial object
// changes only what it names.

// configSection is the settings section the server reads.
const configSection = "stereoline"

// settingsSection returns the "stereoline" member of a settings object
// when it has one, and the object itself otherwise, so both
// {"stereoline": {...}} and {...} work as initializationOptions.
func settingsSection(raw json.RawMessage) json.RawMessage {
	var obj map[string]json.RawMessage
	if json.Unmarshal(raw, &obj) == nil {
		if v, ok := obj[configSection]; ok {
			return v
		}
	}
	return raw
}

// fetchConfiguration asks the client for the workspace settings and
// applies them.
func (s *Server) fetchConfiguration() {
	defer s.recoverPanic("workspace/configuration")
	s.settingsMu.Lock()
	gen := s.settingsGen
	s.settingsMu.Unlock()
	params := map[string]any{"items": []map[string]string{{"section": configSection}}}
	var result []json.RawMessage
	if err := s.callClient(s.ctx, "workspace/configuration", params, &result); err != nil {
		s.log.Info("no workspace settings", zap.Error(err))
		return
	}
	if len(result) == 0 {
		return
	}
	s.settingsMu.Lock()
	defer s.settingsMu.Unlock()
	if s.settingsGen != gen {
		// The client pushed settings while it answered: those are newer.
		s.log.Info("pulled settings dropped: newer ones were pushed meanwhile")
		return
	}
	s.settingsGen++
	if err := s.applySettings(result[0]); err != nil {
		s.log.Warn("workspace settings ignored", zap.Error(err))
		s.showWarning(fmt.Sprintf("stereoline: settings ignored: %v", err))
	}
}

// didChangeConfiguration applies pushed settings, or pulls them when the
// notification carries none of ours (clients that use the pull model send
// null).
func (s *Server) didChangeConfiguration(params json.RawMessage) error {
	var p struct {
		Settings json.RawMessage `json:"settings"`
	}
	if err := json.Unmarshal(params, &p); err != nil {
		return err
	}
	var obj map[string]json.RawMessage
	if json.Unmarshal(p.Settings, &obj) == nil {
		if section, ok := obj[configSection]; ok {
			s.settingsMu.Lock()
			defer s.settingsMu.Unlock()
			s.settingsGen++
			if err := s.applySettings(section); err != nil {
				s.showWarning(fmt.Sprintf("stereoline: settings ignored: %v", err))
				return err
			}
			return nil
		}
	}
	s.mu.Lock()
	pull := s.caps.Workspace.Configuration
	s.mu.Unlock()
	if pull {
		go s.fetchConfiguration()
	}
	return nil
}

// applySettings makes a configuration from the base layer and a settings
// section, then analyses every open document again under it and asks the
// client to refresh what it pulls.
func (s *Server) applySettings(section json.RawMessage) error {
	s.mu.Lock()
	cfg := cloneConfig(s.baseCfg)
	s.mu.Unlock()
	if err := cfg.Merge(section); err != nil {
		return err
	}
	s.log.Info("settings applied", zap.Any("config", cfg))
	s.reconfigure(&cfg)
	return nil
}

// reconfigure analyses the open documents again under new editor
// settings when cfg is not nil, and under the project files as they now
// are; then it asks the client to refresh what it pulls.
func (s *Server) reconfigure(cfg *document.Config) {
	s.resettle(func(next *snapshot) {
		if cfg != nil {
			next.editor = newConfigured(next.editor.analyzer.WithConfig(*cfg))
		}
	})
}

// resettle builds the next snapshot with change applied to it (editor
// settings, workspace folders, or nothing when a project file changed),
// analyses and publishes again the open documents whose configuration
// that alters, and asks the client to refresh what it pulls: files on
// disk may have changed configuration too.
func (s *Server) resettle(change func(next *snapshot)) {
	s.mu.Lock()
	next := s.snap.clone()
	change(next)
	changed := next.reresolve(func(snap *snapshot, f *fileVersion) configured {
		return s.configFor(snap, f.path())
	})
	s.setSnapshot(next)
	caps := s.caps
	s.mu.Unlock()
	for _, uri := range changed {
		s.work.schedule(uri, 0)
	}
	if caps.Workspace.InlayHint.RefreshSupport && len(changed) > 0 {
		go s.refresh(methodInlayHintRefresh)
	}
	if caps.Workspace.Diagnostics.RefreshSupport {
		go s.refresh(methodDiagnosticRefresh)
	}
}

// refresh sends a refresh request, whose answer carries nothing.
func (s *Server) refresh(method string) {
	if err := s.callClient(s.ctx, method, nil, nil); err != nil {
		s.log.Info("refresh failed", zap.String("method", method), zap.Error(err))
	}
}

// showWarning tells the user something the log alone would hide. It does
// not wait for the write, since callers may hold the server's lock.
func (s *Server) showWarning(msg string) {
	go s.notify("window/showMessage", map[string]any{"type": 2, "message": msg})
}

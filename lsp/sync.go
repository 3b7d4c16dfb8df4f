package lsp

import (
	"encoding/json"
	"fmt"
	"time"

	"go.lsp.dev/protocol"
	"go.uber.org/zap"
)

// didOpen adds a document and analyses it at once: nothing was typed yet,
// so there is nothing to wait for.
func (s *Server) didOpen(params json.RawMessage) error {
	var p protocol.DidOpenTextDocumentParams
	if err := json.Unmarshal(params, &p); err != nil {
		return err
	}
	d := p.TextDocument
	s.open(&fileVersion{
		URI:        string(d.URI),
		Name:       uriPath(string(d.URI)),
		LanguageID: string(d.LanguageID),
		Version:    d.Version,
	}, []byte(d.Text))
	return nil
}

// open installs a document version in a new snapshot and schedules its
// diagnostics.
func (s *Server) open(f *fileVersion, content []byte) {
	s.mu.Lock()
	enc := s.snap.encoding
	s.mu.Unlock()
	// The encoding is fixed at initialize, so the line table of a large
	// file is built without holding the lock.
	f.mapper = NewMapper(content, enc)
	s.mu.Lock()
	next := s.snap.clone()
	next.put(f, s.configFor(next, f.path()))
	s.setSnapshot(next)
	s.mu.Unlock()
	s.work.schedule(f.URI, 0)
}

// didChange applies full or incremental changes in order and schedules
// diagnostics after the debounce time.
func (s *Server) didChange(params json.RawMessage) error {
	var p didChangeParams
	if err := json.Unmarshal(params, &p); err != nil {
		return err
	}
	return s.change(string(p.TextDocument.URI), p.TextDocument.Version, p.ContentChanges)
}

// change makes the next version of an open document.
func (s *Server) change(uri string, version int32, changes []contentChange) error {
	s.mu.Lock()
	old, ok := s.snap.files[uri]
	enc := s.snap.encoding
	s.mu.Unlock()
	if !ok {
		return fmt.Errorf("change to a document that is not open: %s", uri)
	}
	if version <= old.Version {
		s.log.Warn("document version did not increase", zap.String("uri", uri),
			zap.Int32("had", old.Version), zap.Int32("got", version))
	}
	begun := time.Now()
	mapper, err := applyChanges(old.mapper, enc, changes)
	s.log.Debug("changed", zap.String("uri", uri), zap.Int32("version", version), zap.Duration("took", time.Since(begun)))
	if err != nil {
		// The client and the server now disagree on the text; keeping
		// the old version is the least wrong, and the log says so.
		return fmt.Errorf("%s version %d: %w", uri, version, err)
	}
	next := *old
	next.Version = version
	next.mapper = mapper
	s.mu.Lock()
	if cur := s.snap.files[uri]; cur != old {
		s.mu.Unlock()
		return fmt.Errorf("document changed concurrently: %s", uri)
	}
	snap := s.snap.clone()
	prev := snap.analyses[uri]
	snap.put(&next, s.configFor(snap, next.path()))
	a := snap.analyses[uri]
	if prev != nil && prev.config.id == a.config.id {
		a.prev.Store(prev)
	}
	s.setSnapshot(snap)
	s.mu.Unlock()
	// The debounce counts from the change's arrival: applying it (a copy
	// of a large text) is part of the wait, not added to it.
	s.work.schedule(uri, max(0, s.opts.Debounce-time.Since(begun)))
	if prev != nil && prev.config.id == a.config.id && prev.quick(s.opts.Debounce) {
		// The last version was analysed in less than the debounce: this
		// one is analysed during the debounce, after the collection that
		// schedule may have started (the two at once slow each other on
		// a machine of few cores), and its publication made (prepare) and
		// written when the typing pauses.
		// A version replaced meanwhile costs one such analysis; the next
		// one waits for its debounce, as its predecessor is not done, so
		// fast typing analyses at most every other version.
		go func() {
			s.work.awaitCollection()
			a.start(s.log)
			<-a.done
			s.work.prepare(a)
		}()
	}
	return nil
}

// applyChanges applies content changes to a text in order: a change
// without a range replaces the whole text, one with a range replaces that
// range of the text as the previous change left it (LSP 3.17,
// "DidChangeTextDocument Notification"). It returns the mapper of the
// new text, whose line table is moved from the old one's where a change
// has a range.
func applyChanges(m *Mapper, enc PositionEncoding, changes []contentChange) (*Mapper, error) {
	for i, ch := range changes {
		if ch.Range == nil {
			m = NewMapper([]byte(ch.Text), enc)
			continue
		}
		content := m.Content()
		span, err := m.RangeToSpan(*ch.Range)
		if err != nil {
			return nil, fmt.Errorf("change %d: %w", i, err)
		}
		next := make([]byte, 0, len(content)-span.Len()+len(ch.Text))
		next = append(next, content[:span.Start]...)
		next = append(next, ch.Text...)
		next = append(next, content[span.End:]...)
		m = m.Replace(span.Start, span.End, len(ch.Text), next)
	}
	return m, nil
}

// didClose drops a document; its diagnostics are cleared.
func (s *Server) didClose(params json.RawMessage) error {
	var p protocol.DidCloseTextDocumentParams
	if err := json.Unmarshal(params, &p); err != nil {
		return err
	}
	s.close(string(p.TextDocument.URI))
	return nil
}

func (s *Server) close(uris ...string) {
	s.mu.Lock()
	next := s.snap.clone()
	for _, uri := range uris {
		next.remove(uri)
	}
	s.setSnapshot(next)
	s.mu.Unlock()
	for _, uri := range uris {
		s.work.schedule(uri, 0)
	}
}

// didSave notices a saved project configuration file: every open
// document is analysed again under it.
func (s *Server) didSave(params json.RawMessage) error {
	var p protocol.DidSaveTextDocumentParams
	if err := json.Unmarshal(params, &p); err != nil {
		return err
	}
	if file := projectFilePath(string(p.TextDocument.URI)); file != "" {
		s.projects.forgetFile(file)
		s.reconfigure(nil)
	}
	return nil
}

// didChangeWatchedFiles does the same for project files created, changed
// or deleted outside the editor: a created one may now be the nearest for
// documents below it, a deleted one no longer applies. Only documents
// whose configuration that alters are analysed again.
func (s *Server) didChangeWatchedFiles(params json.RawMessage) error {
	var p struct {
		Changes []struct {
			URI string `json:"uri"`
		} `json:"changes"`
	}
	if err := json.Unmarshal(params, &p); err != nil {
		return err
	}
	found := false
	for _, c := range p.Changes {
		if file := projectFilePath(c.URI); file != "" {
			s.projects.forgetFile(file)
			found = true
		}
	}
	if found {
		s.reconfigure(nil)
	}
	return nil
}

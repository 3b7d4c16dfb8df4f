package lsp

import (
	"net/url"
	"path/filepath"
	"sort"
	"sync/atomic"

	"stereoline/stereo/document"
)

// fileVersion is one document at one version. It never changes: an edit
// makes a new fileVersion.
type fileVersion struct {
	URI        string // as the client wrote it, echoed back unchanged
	Name       string // the path the engine picks the host kind from; "" for notebook cells
	LanguageID string
	Version    int32
	Notebook   string // URI of the notebook holding this cell, or ""
	mapper     *Mapper
}

func (f *fileVersion) content() []byte { return f.mapper.Content() }

// snapshot is the state of every open document at one moment: immutable
// once built, so a request answers from the versions that existed when it
// arrived however the documents change meanwhile.
type snapshot struct {
	id       uint64
	encoding PositionEncoding
	editor   configured // the editor's settings; a project file may override them per document
	roots    []string   // workspace folder paths on disk (clean); shared between snapshots, never changed
	files    map[string]*fileVersion
	analyses map[string]*analysis
}

// configured is an analyzer and a number that names its configuration,
// so a pull report's result id changes when the settings do.
type configured struct {
	analyzer *document.Analyzer
	id       uint64
}

var snapshotIDs, configIDs atomic.Uint64

func newConfigured(a *document.Analyzer) configured {
	return configured{analyzer: a, id: configIDs.Add(1)}
}

func newSnapshot(editor configured, enc PositionEncoding) *snapshot {
	return &snapshot{
		id:       snapshotIDs.Add(1),
		encoding: enc,
		editor:   editor,
		files:    map[string]*fileVersion{},
		analyses: map[string]*analysis{},
	}
}

// lookup returns a document and its analysis; ok is false when the
// document is not open.
func (s *snapshot) lookup(uri string) (*fileVersion, *analysis, bool) {
	f, ok := s.files[uri]
	if !ok {
		return nil, nil, false
	}
	return f, s.analyses[uri], true
}

// clone copies the maps so the copy can be changed; analyses of
// unchanged documents are shared, so their results are computed once.
func (s *snapshot) clone() *snapshot {
	next := &snapshot{
		id:       snapshotIDs.Add(1),
		encoding: s.encoding,
		editor:   s.editor,
		roots:    s.roots,
		files:    make(map[string]*fileVersion, len(s.files)+1),
		analyses: make(map[string]*analysis, len(s.analyses)+1),
	}
	for k, v := range s.files {
		next.files[k] = v
	}
	for k, v := range s.analyses {
		next.analyses[k] = v
	}
	return next
}

// put adds or replaces a document in a snapshot being built, to be
// analysed under c.
func (s *snapshot) put(f *fileVersion, c configured) {
	s.files[f.URI] = f
	s.analyses[f.URI] = newAnalysis(f, c)
}

// remove drops a document from a snapshot being built.
func (s *snapshot) remove(uri string) {
	delete(s.files, uri)
	delete(s.analyses, uri)
}

// reresolve asks resolve again for the configuration of every document of
// a snapshot being built (after a change of settings, of a project file
// or of the workspace folders) and analyses again the documents whose
// configuration is not the one their analysis used; it returns those.
// The others keep their analyses, so they are neither analysed nor
// published again.
func (s *snapshot) reresolve(resolve func(*snapshot, *fileVersion) configured) []string {
	var changed []string
	for uri, f := range s.files {
		c := resolve(s, f)
		if a := s.analyses[uri]; a != nil && a.config.id == c.id {
			continue
		}
		s.analyses[uri] = newAnalysis(f, c)
		changed = append(changed, uri)
	}
	sort.Strings(changed)
	return changed
}

// path returns the file a document is on disk, or "" (an untitled
// document); a notebook cell is in its notebook's file.
func (f *fileVersion) path() string {
	if p := fileURIPath(f.URI); p != "" {
		return filepath.FromSlash(p)
	}
	return filepath.FromSlash(fileURIPath(f.Notebook))
}

// uriPath returns the path part of a document URI, which names the file
// for the engine ("/home/a/x.smi" for file:///home/a/x.smi). URIs stay
// opaque strings everywhere else: clients use schemes (untitled:,
// notebook cells) that a file-only URI type rejects.
func uriPath(uri string) string {
	u, err := url.Parse(uri)
	if err != nil {
		return uri
	}
	if u.Path != "" {
		return u.Path
	}
	if u.Opaque != "" {
		return u.Opaque
	}
	return uri
}

// fileURIPath returns the path of a file: URI, or "" for other schemes.
func fileURIPath(uri string) string {
	u, err := url.Parse(uri)
	if err != nil || u.Scheme != "file" {
		return ""
	}
	return u.Path
}

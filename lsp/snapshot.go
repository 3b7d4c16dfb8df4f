package lsp

import (
	"net/url"
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
	config   uint64 // configuration generation, part of result ids
	encoding PositionEncoding
	analyzer *document.Analyzer
	files    map[string]*fileVersion
	analyses map[string]*analysis
}

var snapshotIDs atomic.Uint64

func newSnapshot(a *document.Analyzer, enc PositionEncoding) *snapshot {
	return &snapshot{
		id:       snapshotIDs.Add(1),
		encoding: enc,
		analyzer: a,
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
		config:   s.config,
		encoding: s.encoding,
		analyzer: s.analyzer,
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

// put adds or replaces a document in a snapshot being built.
func (s *snapshot) put(f *fileVersion) {
	s.files[f.URI] = f
	s.analyses[f.URI] = newAnalysis(f, s.analyzer)
}

// remove drops a document from a snapshot being built.
func (s *snapshot) remove(uri string) {
	delete(s.files, uri)
	delete(s.analyses, uri)
}

// withAnalyzer returns a snapshot whose every document is analysed again
// by another analyzer (after a configuration change).
func (s *snapshot) withAnalyzer(a *document.Analyzer) *snapshot {
	next := s.clone()
	next.analyzer = a
	next.config++
	for _, f := range next.files {
		next.analyses[f.URI] = newAnalysis(f, a)
	}
	return next
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

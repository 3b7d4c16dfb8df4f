package lsp

import (
	"context"
	"encoding/json"
	"path/filepath"
	"sync"
	"time"

	"go.lsp.dev/jsonrpc2"
	"go.lsp.dev/protocol"
	"go.uber.org/zap"

	"stereoline/notation"
	"stereoline/stereo/document"
	"stereoline/stereo/review"
)

// This file implements the change lens: on each record of a document
// that differs from the version at a git revision (the reviewBase
// setting, HEAD by default), a code lens and a line of the hover say
// what the record now means against it ("epimer at C3 vs HEAD"), as
// 'stereoline diff' does for a whole change. The server reads the base
// version with git; a document outside a repository, or new since the
// revision, gets no such lens.

// commandShowChange is the command of a change lens: it shows the whole
// explanation of the record's change (window/showMessage) and returns
// it.
const commandShowChange = "stereoline.showChange"

// baseRecheck is how long a base version is trusted before git is asked
// again whether the revision still names the same commit (a commit or a
// checkout moves HEAD).
const baseRecheck = 2 * time.Second

// changeCache holds base versions and reviews, so a lens request after
// each keystroke costs a lookup.
type changeCache struct {
	mu      sync.Mutex
	bases   map[string]*baseVersion // by file path and revision
	reviews map[reviewKey]*review.Report
}

type baseVersion struct {
	commit  string
	content []byte // nil when the file is not in the commit
	err     error
	checked time.Time
	// refreshing is set (under changeCache.mu) while git is asked again.
	refreshing bool
}

type reviewKey struct {
	uri     string
	version int32
	commit  string
	config  uint64
}

// maxReviews bounds the reviews kept; the oldest half goes when full.
const maxReviews = 64

// base returns the version of a file at a revision. A version checked
// longer than baseRecheck ago is returned as it is while git is asked
// again in the background, so a hover or lens never waits for git once
// the file's base is known.
func (c *changeCache) base(path, rev string) *baseVersion {
	key := path + "\x00" + rev
	c.mu.Lock()
	b := c.bases[key]
	refresh := b != nil && time.Since(b.checked) >= baseRecheck && !b.refreshing
	if refresh {
		b.refreshing = true
	}
	c.mu.Unlock()
	if b != nil {
		if refresh {
			go c.store(key, c.load(path, rev, b))
		}
		return b
	}
	next := c.load(path, rev, nil)
	c.store(key, next)
	return next
}

// load reads the version of a file at a revision with git; b is the
// version read before, whose content is kept when the commit is the same.
func (c *changeCache) load(path, rev string, b *baseVersion) *baseVersion {
	next := &baseVersion{checked: time.Now()}
	repo, err := review.FindRepo(filepath.Dir(path))
	if err == nil {
		next.commit, err = repo.Resolve(rev)
	}
	switch {
	case err != nil:
		next.err = err
	case b != nil && b.err == nil && b.commit == next.commit:
		next.content = b.content
	default:
		rel, ok := repo.Rel(path)
		if !ok {
			next.err = review.ErrNotRepository
			break
		}
		blobs, _, err := repo.Read(next.commit, []string{rel}, maxLensFile)
		if err != nil {
			next.err = err
			break
		}
		next.content = blobs[rel].Content
	}
	return next
}

// store keeps a base version.
func (c *changeCache) store(key string, b *baseVersion) {
	c.mu.Lock()
	if c.bases == nil {
		c.bases = map[string]*baseVersion{}
	}
	c.bases[key] = b
	c.mu.Unlock()
}

// maxLensFile is the largest base version read for the lens (the
// checker's default size limit).
const maxLensFile = 10_000_000

// changes returns the review of a document against its base revision,
// or nil when there is none to show.
func (s *Server) changes(snap *snapshot, f *fileVersion, res *document.Result) (*review.Report, string) {
	_, a, ok := snap.lookup(f.URI)
	if !ok || f.Notebook != "" {
		return nil, ""
	}
	cfg := a.config.analyzer.Config()
	rev := cfg.ReviewBase
	switch rev {
	case "off":
		return nil, ""
	case "":
		rev = "HEAD"
	}
	path := f.path()
	if path == "" || !filepath.IsAbs(path) {
		return nil, ""
	}
	b := s.changeCache.base(path, rev)
	if b.err != nil || b.content == nil {
		return nil, "" // outside git, an unknown revision, or a file new since it
	}
	key := reviewKey{uri: f.URI, version: f.Version, commit: b.commit, config: a.config.id}
	s.changeCache.mu.Lock()
	rep := s.changeCache.reviews[key]
	s.changeCache.mu.Unlock()
	if rep != nil {
		return rep, rev
	}
	rep = review.Review(a.config.analyzer, review.Version{Name: f.Name, LanguageID: f.LanguageID, Content: b.content},
		review.Version{Name: f.Name, LanguageID: f.LanguageID, Content: res.Content}, review.Options{})
	s.changeCache.mu.Lock()
	if s.changeCache.reviews == nil || len(s.changeCache.reviews) >= maxReviews {
		s.changeCache.reviews = map[reviewKey]*review.Report{}
	}
	s.changeCache.reviews[key] = rep
	s.changeCache.mu.Unlock()
	return rep, rev
}

// changeLenses returns a lens per record that differs from its base
// version, on the record's first line.
func (s *Server) changeLenses(snap *snapshot, f *fileVersion, res *document.Result) []protocol.CodeLens {
	rep, rev := s.changes(snap, f, res)
	if rep == nil {
		return nil
	}
	var out []protocol.CodeLens
	for i := range rep.Pairs {
		p := &rep.Pairs[i]
		if p.New == nil || len(out) == maxLenses {
			continue
		}
		start := p.New.Occ.Span.Start
		rng, err := f.mapper.SpanToRange(notation.Span{Start: start, End: start})
		if err != nil {
			continue
		}
		title := p.Summary + " vs " + rev
		if p.Class == review.Added {
			title = "added since " + rev
		}
		out = append(out, protocol.CodeLens{Range: rng, Command: &protocol.Command{
			Title: title, Command: commandShowChange, Arguments: []any{f.URI, start},
		}})
	}
	return out
}

// hoverChange is the hover's line about the change of the record at off,
// "" when it did not change.
func (s *Server) hoverChange(snap *snapshot, f *fileVersion, res *document.Result, off int) string {
	rep, rev := s.changes(snap, f, res)
	if rep == nil {
		return ""
	}
	if p := pairAt(rep, off); p != nil {
		return "\n\n**Against " + rev + ":** " + p.Class.String() + ": " + p.Explanation
	}
	return ""
}

// pairAt returns the pair whose new record holds off.
func pairAt(rep *review.Report, off int) *review.Pair {
	for i := range rep.Pairs {
		p := &rep.Pairs[i]
		if p.New != nil && off >= p.New.Occ.Span.Start && off <= p.New.Occ.Span.End {
			return p
		}
	}
	return nil
}

// showChange runs commandShowChange: arguments are the document URI and
// a byte offset inside the record.
func (s *Server) showChange(ctx context.Context, snap *snapshot, args []json.RawMessage) (any, error) {
	var uri string
	var off int
	if len(args) != 2 || json.Unmarshal(args[0], &uri) != nil || json.Unmarshal(args[1], &off) != nil {
		return nil, jsonrpc2.NewError(jsonrpc2.InvalidParams, "unknown command or arguments")
	}
	f, res, ok, err := s.result(ctx, snap, uri)
	if err != nil {
		return nil, err
	}
	if ok {
		if rep, rev := s.changes(snap, f, res); rep != nil {
			if p := pairAt(rep, off); p != nil {
				msg := "Against " + rev + ": " + p.Class.String() + ": " + p.Explanation + ". " + cautionLine
				s.notify("window/showMessage", map[string]any{"type": 3, "message": msg})
				return msg, nil
			}
		}
	}
	s.log.Debug("no change at the lens", zap.String("uri", uri), zap.Int("offset", off))
	return nil, jsonrpc2.NewError(jsonrpc2.InvalidParams, "no changed record there; the document may have changed")
}

// cautionLine ends every explanation the server shows on its own.
const cautionLine = "Labels are computed from the notation as written; critical assignments need analytical confirmation and qualified review."

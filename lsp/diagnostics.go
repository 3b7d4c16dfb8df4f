package lsp

import (
	"context"
	"encoding/json"
	"fmt"
	"io/fs"
	"os"
	"path"
	"path/filepath"
	"sort"
	"time"

	"go.lsp.dev/protocol"
	"go.lsp.dev/uri"

	"stereoline/notation"
	"stereoline/notation/find"
	"stereoline/stereo/document"
)

// toDiagnostics converts the engine's findings to LSP diagnostics: code,
// source, severity, the Unnecessary tag for marks that change nothing, and
// related places in the same document.
func (s *Server) toDiagnostics(f *fileVersion, res *document.Result) ([]protocol.Diagnostic, error) {
	out := make([]protocol.Diagnostic, 0, res.DiagnosticCount())
	for _, part := range res.DiagnosticParts() {
		for i := range part {
			d, err := toDiagnostic(f, &part[i])
			if err != nil {
				return nil, err
			}
			out = append(out, d)
		}
	}
	return out, nil
}

func toDiagnostic(f *fileVersion, d *document.Diagnostic) (protocol.Diagnostic, error) {
	rng, err := f.mapper.SpanToRange(d.Span)
	if err != nil {
		return protocol.Diagnostic{}, fmt.Errorf("%s: %w", d.Code, err)
	}
	pd := protocol.Diagnostic{
		Range:    rng,
		Severity: toSeverity(d.Severity),
		Code:     string(d.Code),
		Source:   document.Source,
		Message:  d.Message,
	}
	if d.Unnecessary {
		pd.Tags = []protocol.DiagnosticTag{protocol.DiagnosticTagUnnecessary}
	}
	for _, rel := range d.Related {
		r, err := f.mapper.SpanToRange(rel.Span)
		if err != nil {
			return protocol.Diagnostic{}, fmt.Errorf("%s related: %w", d.Code, err)
		}
		pd.RelatedInformation = append(pd.RelatedInformation, protocol.DiagnosticRelatedInformation{
			Location: protocol.Location{URI: uri.URI(f.URI), Range: r},
			Message:  rel.Message,
		})
	}
	return pd, nil
}

// toSeverity maps the engine's severities, which follow the protocol's
// order from 0, to the protocol's numbers from 1.
func toSeverity(s notation.Severity) protocol.DiagnosticSeverity {
	switch s {
	case notation.SeverityWarning:
		return protocol.DiagnosticSeverityWarning
	case notation.SeverityInformation:
		return protocol.DiagnosticSeverityInformation
	case notation.SeverityHint:
		return protocol.DiagnosticSeverityHint
	}
	return protocol.DiagnosticSeverityError
}

// resultID names what a pull report was computed from: the document
// version and the configuration.
func resultID(a *analysis) string {
	return fmt.Sprintf("v%d.c%d", a.file.Version, a.config.id)
}

// documentDiagnostic answers textDocument/diagnostic for the version the
// request saw. A document that is not open has no findings.
func (s *Server) documentDiagnostic(ctx context.Context, snap *snapshot, params json.RawMessage) (any, error) {
	var p documentDiagnosticParams
	if err := decode(params, &p); err != nil {
		return nil, err
	}
	f, res, ok, err := s.result(ctx, snap, string(p.TextDocument.URI))
	if err != nil {
		return nil, err
	}
	if !ok {
		return documentDiagnosticReport{Kind: "full"}, nil
	}
	_, a, _ := snap.lookup(f.URI)
	id := resultID(a)
	if p.PreviousResultID == id {
		return documentDiagnosticReport{Kind: "unchanged", ResultID: id}, nil
	}
	diags, err := s.toDiagnostics(f, res)
	if err != nil {
		return nil, err
	}
	return documentDiagnosticReport{Kind: "full", ResultID: id, Items: diags}, nil
}

// Bounds of a workspace scan, so a huge tree costs bounded time and
// memory.
const (
	maxScanFiles    = 20_000
	maxScanFileSize = 32 << 20
	progressEvery   = 25
)

// holdLimit bounds how long a workspace pull whose every report is
// unchanged is held open waiting for a change.
const holdLimit = time.Minute

// workspaceDiagnostic answers workspace/diagnostic: the open documents
// (at the request's snapshot) and every host file under the workspace
// folders that is not open. Progress goes to the client's work-done token
// when it gave one; cancellation is checked between files.
//
// Clients send the next workspace pull as soon as one is answered and
// expect the server to hold it (LSP 3.17, "Workspace Diagnostics": the
// server may keep the request open). So a pull whose reports would all be
// unchanged waits for the next edit, up to holdLimit, and is then
// computed again.
func (s *Server) workspaceDiagnostic(ctx context.Context, snap *snapshot, params json.RawMessage) (any, error) {
	var p workspaceDiagnosticParams
	if err := decode(params, &p); err != nil {
		return nil, err
	}
	previous := map[string]string{}
	for _, r := range p.PreviousResultIDs {
		previous[r.URI] = r.Value
	}
	token := p.WorkDoneToken
	held := time.NewTimer(holdLimit)
	defer held.Stop()
	for {
		s.mu.Lock()
		changed := s.changed
		s.mu.Unlock()
		report, fresh, err := s.scanWorkspace(ctx, snap, token, previous)
		if err != nil || fresh > 0 || len(previous) == 0 {
			return report, err
		}
		token = nil // a token's progress ends once
		select {
		case <-changed:
			snap = s.current()
		case <-held.C:
			return report, nil
		case <-ctx.Done():
			return nil, ctx.Err()
		}
	}
}

// scanWorkspace builds one workspace report and counts its full
// (changed) document reports.
func (s *Server) scanWorkspace(ctx context.Context, snap *snapshot, token *protocol.ProgressToken, previous map[string]string) (workspaceDiagnosticReport, int, error) {
	report := workspaceDiagnosticReport{Items: []workspaceDocumentReport{}}
	roots := snap.roots
	openPaths := map[string]bool{}
	uris := make([]string, 0, len(snap.files))
	for u, f := range snap.files {
		uris = append(uris, u)
		// An open notebook's cells stand for its file on disk.
		for _, open := range []string{f.URI, f.Notebook} {
			if p := fileURIPath(open); p != "" {
				openPaths[filepath.Clean(filepath.FromSlash(p))] = true
			}
		}
	}
	sort.Strings(uris)
	disk := s.hostFiles(ctx, snap, roots, openPaths)

	prog := s.startProgress(token, "Checking stereo marks", len(uris)+len(disk))
	defer prog.end()
	done, fresh := 0, 0
	reported := map[string]bool{}
	add := func(item workspaceDocumentReport) {
		report.Items = append(report.Items, item)
		reported[item.URI] = true
		if item.Kind == "full" {
			fresh++
		}
	}
	for _, u := range uris {
		if err := ctx.Err(); err != nil {
			return report, 0, err
		}
		f, res, ok, err := s.result(ctx, snap, u)
		if err != nil {
			return report, 0, err
		}
		done++
		prog.report(done)
		if !ok {
			continue
		}
		version := f.Version
		item := workspaceDocumentReport{URI: u, Version: &version}
		id := resultID(snap.analyses[u])
		if previous[u] == id {
			item.documentDiagnosticReport = documentDiagnosticReport{Kind: "unchanged", ResultID: id}
		} else {
			diags, err := s.toDiagnostics(f, res)
			if err != nil {
				return report, 0, err
			}
			item.documentDiagnosticReport = documentDiagnosticReport{Kind: "full", ResultID: id, Items: diags}
		}
		add(item)
	}
	for _, file := range disk {
		if err := ctx.Err(); err != nil {
			return report, 0, err
		}
		done++
		prog.report(done)
		if item, ok := s.diskReport(ctx, snap, file, previous); ok {
			add(item)
		}
	}
	// A document the client holds a report for that is neither open nor
	// found now (its folder left the workspace, or it was deleted) gets
	// one empty report, so the client stops showing its findings; a
	// client keeps the last report of a document the server leaves out.
	var gone []string
	for u, id := range previous {
		if !reported[u] && id != resultGone {
			gone = append(gone, u)
		}
	}
	sort.Strings(gone)
	for _, u := range gone {
		add(workspaceDocumentReport{URI: u, documentDiagnosticReport: documentDiagnosticReport{Kind: "full", ResultID: resultGone}})
	}
	return report, fresh, nil
}

// resultGone is the result id of the empty report of a document that left
// the workspace; it is not reported again.
const resultGone = "gone"

// diskFile is a host file found under a workspace folder.
type diskFile struct {
	path string
	info fs.FileInfo
}

// hostFiles lists the files under roots whose names the finder reads,
// walked as the checker walks folders (find.WalkHosts: hidden entries and
// dependency folders are skipped, and with them project configuration
// files, JSON by name but settings rather than records), leaving out
// open documents and files over the size limit. Unreadable entries are
// left out.
func (s *Server) hostFiles(ctx context.Context, snap *snapshot, roots []string, open map[string]bool) []diskFile {
	cfg := snap.editor.analyzer.Config()
	host := func(p string) bool { return !open[filepath.Clean(p)] && isHostFile(cfg, filepath.Base(p)) }
	var out []diskFile
	for _, root := range roots {
		find.WalkHosts(ctx, root, host, func(p string, d fs.DirEntry) error {
			if len(out) >= maxScanFiles {
				return fs.SkipAll
			}
			if info, err := d.Info(); err == nil && info.Size() <= maxScanFileSize {
				out = append(out, diskFile{path: p, info: info})
			}
			return nil
		}, nil)
	}
	return out
}

// isHostFile reports whether the finder reads files of this name: a kind
// it knows from the name, or one of the configured patterns.
func isHostFile(cfg document.Config, name string) bool {
	if find.KindForName(name) != find.KindUnknown {
		return true
	}
	for pat := range cfg.Files {
		if ok, _ := path.Match(pat, name); ok {
			return true
		}
	}
	return false
}

// diskReport analyses a file that is not open. Its result id is its
// modification time and size, so an unchanged file is not read again.
func (s *Server) diskReport(ctx context.Context, snap *snapshot, file diskFile, previous map[string]string) (workspaceDocumentReport, bool) {
	u := string(uri.File(file.path))
	c := s.configFor(snap, file.path)
	id := fmt.Sprintf("d%d.%d.c%d", file.info.ModTime().UnixNano(), file.info.Size(), c.id)
	item := workspaceDocumentReport{URI: u}
	if previous[u] == id {
		item.documentDiagnosticReport = documentDiagnosticReport{Kind: "unchanged", ResultID: id}
		return item, true
	}
	content, err := os.ReadFile(file.path)
	if err != nil {
		return item, false
	}
	f := &fileVersion{URI: u, Name: file.path, mapper: NewMapper(content, snap.encoding)}
	res, err := newAnalysis(f, c).get(ctx, s.log)
	if err != nil {
		return item, false
	}
	diags, err := s.toDiagnostics(f, res)
	if err != nil {
		return item, false
	}
	item.documentDiagnosticReport = documentDiagnosticReport{Kind: "full", ResultID: id, Items: diags}
	return item, true
}

// progress reports work done to a client's token; without a token it
// does nothing.
type progress struct {
	s       *Server
	token   *protocol.ProgressToken
	total   int
	last    int
	started bool
}

func (s *Server) startProgress(token *protocol.ProgressToken, title string, total int) *progress {
	p := &progress{s: s, token: token, total: total}
	if token == nil {
		return p
	}
	p.started = true
	s.notify("$/progress", progressParams{Token: token, Value: &protocol.WorkDoneProgressBegin{
		Kind:       protocol.WorkDoneProgressKindBegin,
		Title:      title,
		Message:    fmt.Sprintf("0/%d files", total),
		Percentage: 0,
	}})
	return p
}

func (p *progress) report(done int) {
	if !p.started || p.total == 0 || (done-p.last < progressEvery && done != p.total) {
		return
	}
	p.last = done
	p.s.notify("$/progress", progressParams{Token: p.token, Value: &protocol.WorkDoneProgressReport{
		Kind:       protocol.WorkDoneProgressKindReport,
		Message:    fmt.Sprintf("%d/%d files", done, p.total),
		Percentage: uint32(done * 100 / p.total),
	}})
}

func (p *progress) end() {
	if !p.started {
		return
	}
	p.s.notify("$/progress", progressParams{Token: p.token, Value: &protocol.WorkDoneProgressEnd{
		Kind:    protocol.WorkDoneProgressKindEnd,
		Message: fmt.Sprintf("%d files", p.total),
	}})
}

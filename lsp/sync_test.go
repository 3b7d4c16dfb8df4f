package lsp

import (
	"strings"
	"testing"
	"time"
)

// Incremental sync follows LSP 3.17, "DidChangeTextDocument Notification":
// changes apply in order, each to the text the previous one left; a change
// without a range replaces the whole text; an empty range inserts.

// codes lists the diagnostic codes with the text each covers.
func codes(t testing.TB, c *fakeClient, uri string, version int32, text string) []string {
	t.Helper()
	var out []string
	for _, d := range c.diagnostics(uri, version) {
		out = append(out, d.Code.(string)+" "+rangeText(t, text, d.Range, EncodingUTF16))
	}
	return out
}

func TestIncrementalSync(t *testing.T) {
	c := start(t, clientSetup{})
	const u = "file:///work/edit.smi"
	text := "CCO ethanol\n"
	c.open(u, "", 1, text)
	if got := codes(t, c, u, 1, text); len(got) != 0 {
		t.Fatalf("ethanol: %v", got)
	}

	// An insertion at 0:0 has a range; it must not be taken for a
	// replacement of the whole text.
	c.change(u, 2, edit(0, 0, 0, 0, "C[C@H](C)C é😀 marked\n"))
	text = "C[C@H](C)C é😀 marked\nCCO ethanol\n"
	if got := codes(t, c, u, 2, text); len(got) != 1 || got[0] != "stereo-ineffective-center @" {
		t.Fatalf("after the insertion: %v", got)
	}

	// Two changes in one notification, the second positioned in the
	// text the first left: the title after the emoji is edited in UTF-16
	// columns, then the mark is removed.
	title := position(t, text, "marked", 0, EncodingUTF16)
	c.change(u, 3,
		edit(0, int(title.Character), 0, int(title.Character)+len("marked"), "mark gone"),
		edit(0, 3, 0, 4, ""),
	)
	text = "C[CH](C)C é😀 mark gone\nCCO ethanol\n"
	if got := codes(t, c, u, 3, text); len(got) != 0 {
		t.Fatalf("after removing the mark: %v", got)
	}

	// A full replacement, then an edit on a second line written with
	// CRLF.
	c.change(u, 4, map[string]any{"text": "CCO\r\nF/C=C/F\r\n"})
	c.change(u, 5, edit(1, 5, 1, 6, ""))
	text = "CCO\r\nF/C=CF\r\n"
	if got := codes(t, c, u, 5, text); len(got) != 1 || got[0] != "stereo-one-sided-bond /" {
		t.Fatalf("after the CRLF edit: %v", got)
	}
	// Only the last version of a burst needs publishing; every version
	// published carries its own number.
	for _, p := range c.published(u) {
		if p.Version == nil || *p.Version < 1 || *p.Version > 5 {
			t.Errorf("publication with version %v", p.Version)
		}
	}
}

// A change that does not fit the text is refused and logged; the server
// keeps the version it had and goes on.
func TestChangeOutsideTheText(t *testing.T) {
	c := start(t, clientSetup{})
	const u = "file:///work/short.smi"
	c.open(u, "", 1, "CCO\n")
	c.diagnostics(u, 1)
	c.change(u, 2, edit(9, 0, 9, 1, "x"))
	c.change("file:///work/never-opened.smi", 1, edit(0, 0, 0, 0, "x"))
	var syms []struct {
		Name string `json:"name"`
	}
	c.mustCall("textDocument/documentSymbol", map[string]any{"textDocument": textDoc(u)}, &syms)
	if len(syms) != 1 || syms[0].Name != "CCO" {
		t.Errorf("symbols after a bad change = %+v, want the old text's", syms)
	}
	if logs := c.logs.String(); !strings.Contains(logs, "outside the text") || !strings.Contains(logs, "not open") {
		t.Errorf("log does not mention the refused changes:\n%s", logs)
	}
}

// A request for a version newer than the last analysis waits for it, or
// starts it: with a long debounce nothing is published yet, but hover
// already answers from the new text.
func TestRequestTriggersAnalysis(t *testing.T) {
	c := start(t, clientSetup{debounce: time.Minute})
	const u = "file:///work/later.smi"
	text := "CCO\n"
	c.open(u, "", 1, text)
	c.diagnostics(u, 1)
	// L-alanine is (S) (common practice).
	c.change(u, 2, map[string]any{"text": "N[C@@H](C)C(=O)O L-alanine\n"})
	var hover struct {
		Contents struct {
			Value string `json:"value"`
		} `json:"contents"`
	}
	c.mustCall("textDocument/hover", map[string]any{"textDocument": textDoc(u), "position": map[string]any{"line": 0, "character": 3}}, &hover)
	if !strings.Contains(hover.Contents.Value, "(S)") {
		t.Errorf("hover on the new text = %q, want (S)", hover.Contents.Value)
	}
	for _, p := range c.published(u) {
		if *p.Version == 2 {
			t.Errorf("version 2 published before its debounce ended")
		}
	}
}

// A long analysis blocks neither the reader nor other documents: while a
// large list is being analysed, a small file opened after it gets its
// hover answer and its diagnostics first.
func TestLargeDocumentDoesNotBlock(t *testing.T) {
	if testing.Short() {
		t.Skip("analyses a 20,000-record list")
	}
	c := start(t, clientSetup{limit: 2 * time.Minute})
	const big, small = "file:///work/big.smi", "file:///work/small.smi"
	c.open(big, "", 1, bigList(20_000))
	text := "N[C@@H](C)C(=O)O L-alanine\nC[C@H](C)C\n"
	c.open(small, "", 1, text)
	h := hoverAt(t, c, small, position(t, text, "@@", 0, EncodingUTF16))
	if h == nil || !strings.Contains(h.Contents.Value, "(S)") {
		t.Errorf("hover on the small file = %+v", h)
	}
	if got := codes(t, c, small, 1, text); len(got) != 1 {
		t.Errorf("small file diagnostics %v", got)
	}
	if p := c.published(big); len(p) != 0 {
		t.Errorf("the large list was published before the small file; the test shows nothing")
	}
	c.diagnostics(big, 1)
}

// An analysis that takes longer than the progress delay shows as work
// done progress the server creates (LSP 3.17, "Server Initiated
// Progress"): a created token, then begin and end on it.
func TestAnalysisProgress(t *testing.T) {
	c := start(t, clientSetup{
		caps:     map[string]any{"window": map[string]any{"workDoneProgress": true}},
		progress: time.Millisecond,
	})
	const u = "file:///work/medium.smi"
	c.open(u, "", 1, bigList(3000))
	c.diagnostics(u, 1)
	c.until("progress begin and end", func() bool {
		return len(c.progress) >= 2 && c.progress[len(c.progress)-1].Kind == "end"
	})
	c.mu.Lock()
	defer c.mu.Unlock()
	if len(c.refresh) == 0 || c.refresh[0] != "window/workDoneProgress/create" {
		t.Errorf("no token was created first: %v", c.refresh)
	}
	if p := c.progress; p[0].Kind != "begin" || string(p[0].Token) != string(p[len(p)-1].Token) {
		t.Errorf("progress %+v, want begin and end on one token", p)
	}
}

// TestMaxDocumentSize checks the maxDocumentSize setting: a document
// larger than it gets no findings and a message that names the setting;
// once an edit brings it under the limit it is analysed.
func TestMaxDocumentSize(t *testing.T) {
	c := start(t, clientSetup{initOpts: map[string]any{"stereoline": map[string]any{"maxDocumentSize": "60"}}})
	defer c.stop()
	const u = "file:///w/limit.smi"
	// The [C@H] of the first record has two equal methyl groups: an
	// ineffective mark, which the analysis would report.
	big := "C[C@H](C)C first\n" + strings.Repeat("CCO filler\n", 10)
	c.open(u, "", 1, big)
	if d := c.diagnostics(u, 1); len(d) != 0 {
		t.Errorf("a document over the limit got %d findings", len(d))
	}
	c.until("the message about the limit", func() bool {
		for _, m := range c.messages {
			if strings.Contains(m, "maxDocumentSize") {
				return true
			}
		}
		return false
	})
	c.change(u, 2, edit(1, 0, 11, 0, ""))
	if d := c.diagnostics(u, 2); len(d) == 0 {
		t.Error("a document under the limit got no findings")
	}
}

// An edit of a document whose last analysis was quick is analysed during
// its debounce, and still published only once the debounce has passed;
// an edit that follows one whose analysis is not done waits for its
// debounce.
func TestAnalysisDuringDebounce(t *testing.T) {
	const debounce = 4 * time.Second
	const u = "file:///work/quick.smi"
	c, srv := startPublished(t, debounce, u)
	// analysisOf waits for version to be the current one (a change is a
	// notification) and returns its analysis.
	analysisOf := func(version int32) *analysis {
		for deadline := time.Now().Add(debounce / 4); ; time.Sleep(time.Millisecond) {
			if f, a, ok := srv.current().lookup(u); ok && f.Version == version {
				return a
			}
			if time.Now().After(deadline) {
				t.Fatalf("version %d did not arrive", version)
			}
		}
	}
	// waitDone reports whether the analysis of version finishes within d.
	waitDone := func(version int32, d time.Duration) bool {
		a := analysisOf(version)
		select {
		case <-a.done:
			return true
		case <-time.After(d):
			return false
		}
	}

	changed := time.Now()
	// a mark between two methyl groups changes nothing (common practice)
	const text2 = "C[C@H](C)Cl two methyls\n"
	c.change(u, 2, map[string]any{"text": text2})
	if !waitDone(2, debounce/2) {
		t.Fatalf("version 2 was not analysed during its debounce of %v", debounce)
	}
	// and its publication is made (prepare), to be written when the
	// debounce ends
	if !prepared(srv, u, 2, debounce/4) {
		t.Errorf("the publication of version 2 was not made during its debounce")
	}
	if since := time.Since(changed); since >= debounce {
		t.Fatalf("the check ran past the debounce (%v); the machine is too slow for this test", since)
	}
	for _, p := range c.published(u) {
		if *p.Version == 2 {
			t.Fatalf("version 2 published before its debounce ended")
		}
	}
	if got := codes(t, c, u, 2, text2); len(got) != 1 || got[0] != "stereo-ineffective-center @" {
		t.Errorf("version 2: %v, want the ineffective mark", got)
	}
	if since := time.Since(changed); since < debounce {
		t.Errorf("version 2 published %v after the change, before its debounce of %v", since, debounce)
	}

	// Two edits at once: whether or not the first is analysed before the
	// second arrives, the last version is the one published.
	c.change(u, 3, map[string]any{"text": "C[C@@H](F)Cl marked\n"})
	c.change(u, 4, map[string]any{"text": "C[C@H](F)Br marked\n"})
	if got := codes(t, c, u, 4, "C[C@H](F)Br marked\n"); len(got) != 0 {
		t.Errorf("version 4: %v", got)
	}
}

// startPublished starts a server with the debounce given, opens uri
// (ethanol, no findings) and waits for its publication.
func startPublished(t *testing.T, debounce time.Duration, uri string) (*fakeClient, *Server) {
	t.Helper()
	var srv *Server
	c := start(t, clientSetup{debounce: debounce, hook: func(s *Server) { srv = s }})
	c.open(uri, "", 1, "CCO ethanol\n")
	c.diagnostics(uri, 1)
	return c, srv
}

// prepared reports whether the last publication srv keeps of uri is of
// version within d: one made before it is written.
func prepared(srv *Server, uri string, version int32, d time.Duration) bool {
	for deadline := time.Now().Add(d); time.Now().Before(deadline); time.Sleep(time.Millisecond) {
		srv.work.mu.Lock()
		p := srv.work.published[uri]
		srv.work.mu.Unlock()
		if p != nil && p.version == version {
			return true
		}
	}
	return false
}

// A document closed after the publication of its last edit was made
// during the debounce, before it was written, is cleared, and that
// publication is never written; opened again, it is published afresh.
func TestCloseAfterPreparedPublication(t *testing.T) {
	const debounce = 2 * time.Second
	const u = "file:///work/closed.smi"
	c, srv := startPublished(t, debounce, u)
	c.change(u, 2, map[string]any{"text": "C[C@H](C)Cl two methyls\n"})
	if !prepared(srv, u, 2, debounce/2) {
		t.Fatalf("the publication of version 2 was not made during its debounce")
	}
	c.notify("textDocument/didClose", map[string]any{"textDocument": textDoc(u)})
	c.cleared(u)
	time.Sleep(debounce + debounce/2)
	for _, p := range c.published(u) {
		if p.Version != nil && *p.Version == 2 {
			t.Errorf("version 2 was written after the document was closed")
		}
	}
	srv.work.mu.Lock()
	_, kept := srv.work.published[u]
	srv.work.mu.Unlock()
	if kept {
		t.Errorf("the closed document's publication is still kept")
	}
	c.open(u, "", 3, "C[C@H](C)Cl two methyls\n")
	if got := codes(t, c, u, 3, "C[C@H](C)Cl two methyls\n"); len(got) != 1 || got[0] != "stereo-ineffective-center @" {
		t.Errorf("reopened: %v, want the ineffective mark", got)
	}
}

// Edits of several documents that come faster and slower than the
// debounce, so that some versions are analysed and their publications
// made during it and then replaced: each document's last publication is
// of its last version, with that version's findings, and no document's
// publication is ever of a version older than one published before it.
func TestEditsAroundTheDebounce(t *testing.T) {
	const debounce = 30 * time.Millisecond
	c := start(t, clientSetup{debounce: debounce})
	// the versions alternate between an ineffective mark (two methyl
	// groups) and a real stereocentre (common practice)
	texts := [2]string{"C[C@H](C)Cl two methyls\nCCO\n", "C[C@H](F)Cl marked\nCCO\n"}
	uris := []string{"file:///work/a.smi", "file:///work/b.smi", "file:///work/c.smi"}
	for _, u := range uris {
		c.open(u, "", 1, texts[1])
		c.diagnostics(u, 1)
	}
	const edits = 40
	for v := int32(2); v <= edits; v++ {
		for _, u := range uris {
			c.change(u, v, map[string]any{"text": texts[v%2]})
		}
		// pauses shorter and longer than the debounce
		time.Sleep(time.Duration(v%4) * debounce / 2)
	}
	for _, u := range uris {
		got := codes(t, c, u, edits, texts[edits%2])
		if len(got) != 1 || got[0] != "stereo-ineffective-center @" {
			t.Errorf("%s version %d: %v, want the ineffective mark", u, edits, got)
		}
		last := int32(0)
		for _, p := range c.published(u) {
			if p.Version == nil {
				continue
			}
			if *p.Version < last {
				t.Errorf("%s: version %d published after version %d", u, *p.Version, last)
			}
			last = *p.Version
			want := 0
			if *p.Version%2 == 0 {
				want = 1
			}
			if len(p.Diagnostics) != want {
				t.Errorf("%s version %d published with %d findings, want %d", u, *p.Version, len(p.Diagnostics), want)
			}
		}
	}
}

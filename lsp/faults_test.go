package lsp

import (
	"encoding/json"
	"fmt"
	"slices"
	"strings"
	"testing"

	"go.lsp.dev/jsonrpc2"
)

// The server under faults: whatever a broken or hurried client sends, the
// session goes on and later answers are right. Other faults have tests
// beside the feature they touch: TestMalformedMessageIsSkipped and
// TestUnknownMethod, TestPanicIsRecovered and TestShutdownThenExit
// (lifecycle_test.go), TestChangeOutsideTheText (sync_test.go),
// TestClosedAndUnknownDocuments (documents_test.go), FuzzServer
// (fuzz_test.go); the exit status of the real binary is checked in
// cmd/stereoline (TestServeBinaryExitStatus).

// symbolNames returns the names of the document's symbols: the records
// as the server holds them.
func symbolNames(c *fakeClient, uri string) []string {
	c.t.Helper()
	var syms []struct {
		Name string `json:"name"`
	}
	c.mustCall("textDocument/documentSymbol", map[string]any{"textDocument": textDoc(uri)}, &syms)
	var out []string
	for _, s := range syms {
		out = append(out, s.Name)
	}
	return out
}

// Bodies that are not JSON-RPC messages, each framed correctly (LSP 3.17,
// "Base Protocol"), are skipped one by one, and requests sent between them
// are answered: an empty body, bytes that are not UTF-8, JSON of the wrong
// shape, a member of the wrong type.
func TestMalformedBodiesBetweenRequests(t *testing.T) {
	c := start(t, clientSetup{})
	const u = "file:///work/malformed.smi"
	c.open(u, "", 1, "C[C@H](C)C\n")
	bodies := []string{"", "\xff\xfe\x00", "null", `"text"`, `{"jsonrpc":"2.0","id":{},"method":"textDocument/hover"}`,
		`{"jsonrpc":"2.0","method":5}`, `{"jsonrpc":"2.0","id":7,"method":"textDocument/hover","params":` + strings.Repeat("[", 200)}
	for _, body := range bodies {
		if _, err := fmt.Fprintf(c.raw, "Content-Length: %d\r\n\r\n%s", len(body), body); err != nil {
			t.Fatal(err)
		}
		if got := symbolNames(c, u); !slices.Equal(got, []string{"C[C@H](C)C"}) {
			t.Fatalf("after %q: symbols %v", body, got)
		}
	}
	if d := c.diagnostics(u, 1); len(d) != 1 {
		t.Errorf("diagnostics after the malformed bodies: %v, want one", d)
	}
}

// A request for a method the server does not have answers MethodNotFound
// (JSON-RPC 2.0, -32601), "$/" requests included (LSP 3.17, "$ Notifications
// and Requests"); an unknown notification, "$/" or not, is ignored.
func TestUnknownMethodsOfEveryKind(t *testing.T) {
	c := start(t, clientSetup{})
	for _, m := range []string{"$/unknownRequest", "workspace/noSuchThing", "textDocument/hover/extra", "initialized"} {
		if err := c.call(m, map[string]any{}, nil); rpcCode(err) != jsonrpc2.MethodNotFound {
			t.Errorf("request %q: %v, want code %d", m, err, jsonrpc2.MethodNotFound)
		}
		c.notify(m, map[string]any{})
	}
	const u = "file:///work/after-unknown.smi"
	c.open(u, "", 1, "C[C@H](C)C\n")
	if d := c.diagnostics(u, 1); len(d) != 1 {
		t.Errorf("after the unknown methods: %d diagnostics, want 1", len(d))
	}
}

// Changes to a document that is not open are refused: nothing is
// published for it, and when it is opened later its own text is analysed,
// not a change sent before.
func TestChangeToUnknownDocument(t *testing.T) {
	c := start(t, clientSetup{})
	const u = "file:///work/unknown.smi"
	c.change(u, 2, map[string]any{"text": "C[C@H](C)C\n"})
	c.change(u, 3, edit(0, 0, 0, 0, "F/C=CF\n"))
	c.notify("textDocument/didClose", map[string]any{"textDocument": textDoc(u)})
	const other = "file:///work/other.smi"
	c.open(other, "", 1, "CCO\n")
	c.diagnostics(other, 1)
	for _, p := range c.published(u) {
		if len(p.Diagnostics) != 0 {
			t.Errorf("diagnostics published for a document never opened: %+v", p)
		}
	}
	c.open(u, "", 1, "CCN\n")
	if d := c.diagnostics(u, 1); len(d) != 0 {
		t.Errorf("the opened text has no findings, got %v", d)
	}
	if got := symbolNames(c, u); !slices.Equal(got, []string{"CCN"}) {
		t.Errorf("symbols %v, want the opened text's", got)
	}
}

// A version lower than the last one is a client's mistake, but the text it
// sends is still the client's latest: the server applies it, logs the
// backwards step, and publishes for that version what the latest text has.
func TestVersionGoesBackwards(t *testing.T) {
	c := start(t, clientSetup{})
	const u = "file:///work/versions.smi"
	c.open(u, "", 5, "CCO\n")
	if d := c.diagnostics(u, 5); len(d) != 0 {
		t.Fatalf("version 5: %v", d)
	}
	c.change(u, 3, map[string]any{"text": "C[C@H](C)C\n"})
	if got := codes(t, c, u, 3, "C[C@H](C)C\n"); !slices.Equal(got, []string{"stereo-ineffective-center @"}) {
		t.Errorf("version 3 after 5: %v", got)
	}
	c.change(u, 3, edit(0, 0, 0, 0, "F/C=CF\n"))
	if got := symbolNames(c, u); !slices.Equal(got, []string{"F/C=CF", "C[C@H](C)C"}) {
		t.Errorf("symbols after a repeated version: %v", got)
	}
	c.change(u, 4, edit(1, 0, 1, 10, "C[C@H](N)CC"))
	text := "F/C=CF\nC[C@H](N)CC\n"
	if got := codes(t, c, u, 4, text); !slices.Equal(got, []string{"stereo-one-sided-bond /"}) {
		t.Errorf("version 4: %v", got)
	}
	if logs := c.logs.String(); !strings.Contains(logs, "version did not increase") {
		t.Errorf("the log does not mention the backwards version:\n%s", logs)
	}
}

// Ranges that do not fit the text: a line past the end and a range that
// ends before it starts are refused (the text is kept); a character past
// the end of its line means the line's end (LSP 3.17, "Position"); a
// later good change applies to the kept text.
func TestEditsPastTheEnd(t *testing.T) {
	c := start(t, clientSetup{})
	const u = "file:///work/past.smi"
	c.open(u, "", 1, "CCO\nCCN\n")
	c.diagnostics(u, 1)
	c.change(u, 2, edit(5, 0, 5, 3, "x"))
	c.change(u, 3, edit(0, 2, 0, 1, "x"))
	// One change of two does not fit: the notification is refused whole.
	c.change(u, 4, edit(0, 0, 0, 0, "C"), edit(7, 0, 7, 0, "x"))
	if got := symbolNames(c, u); !slices.Equal(got, []string{"CCO", "CCN"}) {
		t.Fatalf("after the refused changes: %v", got)
	}
	c.change(u, 5, edit(1, 99, 1, 120, "C[C@H](C)C"))
	text := "CCO\nCCNC[C@H](C)C\n"
	if got := codes(t, c, u, 5, text); !slices.Equal(got, []string{"stereo-ineffective-center @"}) {
		t.Errorf("after the change past the line's end: %v", got)
	}
	if got := symbolNames(c, u); !slices.Equal(got, []string{"CCO", "CCNC[C@H](C)C"}) {
		t.Errorf("symbols: %v", got)
	}
}

// $/cancelRequest for ids the server never saw or already answered, and
// with ids of the wrong type, changes nothing (LSP 3.17: a cancelled
// request that already finished is answered normally).
func TestCancelUnknownRequests(t *testing.T) {
	c := start(t, clientSetup{})
	const u = "file:///work/cancel.smi"
	c.open(u, "", 1, "C[C@H](C)C\n")
	for _, id := range []any{1, 999999, "no-such-request", -1, nil, map[string]any{}, []int{1}, 1.5} {
		c.notify("$/cancelRequest", map[string]any{"id": id})
	}
	c.notify("$/cancelRequest", nil)
	if got := symbolNames(c, u); !slices.Equal(got, []string{"C[C@H](C)C"}) {
		t.Errorf("after the cancellations: %v", got)
	}
	var hover json.RawMessage
	c.mustCall("textDocument/hover", map[string]any{"textDocument": textDoc(u), "position": map[string]any{"line": 0, "character": 3}}, &hover)
	if !strings.Contains(string(hover), "C4H10") {
		t.Errorf("hover after the cancellations: %s", hover)
	}
	if d := c.diagnostics(u, 1); len(d) != 1 {
		t.Errorf("diagnostics: %v, want one", d)
	}
}

// A flood of 10,000 changes, sent as fast as the pipe takes them, ends
// with the diagnostics of the last text: the same as those of a document
// opened with that text at once. Versions in between need not be
// published (edits are debounced), but none published may be newer.
func TestFloodOfChanges(t *testing.T) {
	c := start(t, clientSetup{})
	records := []string{"C[C@H](N)O", "C[C@@H](N)O", "CC(N)O", "F/C=C/F", "C[C@H](C)C", "F/C=CF", "N[C@@H](C)C(=O)O"}
	lines := make([]string, 40)
	for i := range lines {
		lines[i] = fmt.Sprintf("%s r%d", records[i%len(records)], i)
	}
	const u = "file:///work/flood.smi"
	c.open(u, "", 1, strings.Join(lines, "\n")+"\n")
	const n = 10000
	for i := 0; i < n; i++ {
		j := (i * 7) % len(lines)
		old := lines[j]
		lines[j] = fmt.Sprintf("%s r%d", records[(i*3+j)%len(records)], j)
		c.change(u, int32(i+2), edit(j, 0, j, len(old), lines[j]))
	}
	text := strings.Join(lines, "\n") + "\n"
	got := codes(t, c, u, n+1, text)
	const fresh = "file:///work/flood-fresh.smi"
	c.open(fresh, "", 1, text)
	want := codes(t, c, fresh, 1, text)
	if !slices.Equal(got, want) {
		t.Errorf("after %d changes:\n%v\nwant those of the same text opened at once:\n%v", n, got, want)
	}
	if got := symbolNames(c, u); len(got) != len(lines) || got[0] != "r0" || got[len(got)-1] != fmt.Sprintf("r%d", len(lines)-1) {
		t.Errorf("symbols after the flood: %v", got)
	}
	for _, p := range c.published(u) {
		if p.Version != nil && *p.Version > n+1 {
			t.Errorf("published version %d, newer than any sent", *p.Version)
		}
	}
}

// A request whose method is the empty string is a request all the same
// (JSON-RPC 2.0): it answers MethodNotFound once, and is not taken for a
// response. The hand-written client of FuzzServer counts the answers.
func TestEmptyMethodRequest(t *testing.T) {
	s := newFuzzSession(t)
	s.mu.Lock()
	s.sent[`"empty"`] = "unknown"
	s.sent["77"] = "unknown"
	s.mu.Unlock()
	s.frame(`{"jsonrpc":"2.0","id":"empty","method":""}`)
	s.frame(`{"jsonrpc":"2.0","id":77,"method":"","params":{"x":1}}`)
	s.frame(`{"jsonrpc":"2.0","id":78,"result":null}`) // an answer to nothing: dropped
	s.finish()
}

// TestReadBody reads bodies whole and cut short, below and above the
// size read into one buffer: a cut body is an error, never more bytes
// than came.
func TestReadBody(t *testing.T) {
	for _, length := range []int64{5, bodyAtOnce + 3} {
		body := strings.Repeat("x", 20)
		got, err := readBody(strings.NewReader(body), length)
		if length <= int64(len(body)) {
			if err != nil || string(got) != body[:length] {
				t.Errorf("length %d: got %q, %v", length, got, err)
			}
			continue
		}
		if err == nil || len(got) != len(body) {
			t.Errorf("length %d of a 20-byte body: %d bytes, error %v; want the 20 and an error", length, len(got), err)
		}
	}
}

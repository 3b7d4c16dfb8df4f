package lsp

import (
	"bytes"
	"encoding/json"
	"math/rand"
	"strings"
	"sync/atomic"
	"testing"

	"go.lsp.dev/jsonrpc2"
	"go.lsp.dev/protocol"
)

// decodeDidOpen reads a didOpen frame the ordinary way: jsonrpc2's
// envelope, then encoding/json.
func decodeDidOpen(data []byte) (protocol.TextDocumentItem, bool) {
	msg, err := jsonrpc2.DecodeMessage(data)
	if err != nil {
		return protocol.TextDocumentItem{}, false
	}
	n, ok := msg.(*jsonrpc2.Notification)
	if !ok || n.Method() != "textDocument/didOpen" {
		return protocol.TextDocumentItem{}, false
	}
	var p protocol.DidOpenTextDocumentParams
	if json.Unmarshal(n.Params(), &p) != nil {
		return protocol.TextDocumentItem{}, false
	}
	return p.TextDocument, true
}

// checkReadDidOpen checks that readDidOpen reads frame as the ordinary
// way does, or declines it and leaves it unchanged; it reports whether
// it read it.
func checkReadDidOpen(t *testing.T, frame string) bool {
	t.Helper()
	want, wantOK := decodeDidOpen([]byte(frame))
	data := []byte(frame)
	got, ok := readDidOpen(data)
	if !ok {
		if string(data) != frame {
			t.Errorf("declined %.80q but changed it", frame)
		}
		return false
	}
	if !wantOK {
		t.Errorf("read %q, which does not decode", frame)
		return true
	}
	if got.uri != string(want.URI) || got.languageID != string(want.LanguageID) || got.version != want.Version || string(got.text) != want.Text {
		t.Errorf("read %.80q as %q %q %d %.40q; decoding gives %q %q %d %.40q", frame,
			got.uri, got.languageID, got.version, got.text, want.URI, want.LanguageID, want.Version, want.Text)
	}
	return true
}

func TestReadDidOpen(t *testing.T) {
	// JSON-RPC 2.0 and LSP 3.17 (didOpen's params) say what the frames
	// mean; encoding/json is the reference each is checked against.
	for _, tc := range []struct {
		frame string
		read  bool // false: left to the ordinary way
	}{
		{`{"jsonrpc":"2.0","method":"textDocument/didOpen","params":{"textDocument":{"uri":"file:///a.smi","languageId":"smiles","version":3,"text":"C[C@H](N)O\tala\nF/C=C/F\r\n"}}}`, true},
		{` { "params" : { "textDocument" : { "text" : "a\"b\\c\/d\b\f" , "version" : -7 , "uri" : "file:///b.py" , "languageId" : "python" } } , "method" : "textDocument/didOpen" , "jsonrpc" : "2.0" } `, true},
		// members encoding/json ignores are skipped
		{`{"jsonrpc":"2.0","method":"textDocument/didOpen","params":{"extra":[1,{"x":null},true,"s",-2.5e3],"textDocument":{"uri":"file:///c","languageId":"","version":0,"text":"","more":{}}}}`, true},
		// a later member of the same name wins, as in encoding/json
		{`{"jsonrpc":"2.0","method":"textDocument/didOpen","params":{"textDocument":{"uri":"file:///d","version":1,"text":"old","text":"new"}}}`, true},
		{`{"jsonrpc":"2.0","method":"textDocument/didOpen","params":{"textDocument":{"uri":"file:///é","version":1,"text":"C1CC1 é ☃ 𝄞"}}}`, true},
		// left to the ordinary way
		{`{"jsonrpc":"2.0","id":1,"method":"textDocument/didOpen","params":{"textDocument":{"uri":"file:///e","version":1,"text":"C"}}}`, false},
		{`{"jsonrpc":"2.0","method":"textDocument/didChange","params":{"textDocument":{"uri":"file:///e","version":1,"text":"C"}}}`, false},
		// \u escapes, surrogate pairs and halves of pairs (U+FFFD)
		{`{"jsonrpc":"2.0","method":"textDocument/didOpen","params":{"textDocument":{"uri":"file:///\u00e9","version":1,"text":"\u0043\ud834\udd1e\u003e\u00E9"}}}`, true},
		{`{"jsonrpc":"2.0","method":"textDocument/didOpen","params":{"textDocument":{"uri":"file:///e","version":1,"text":"\ud800x\udc00\ud800\u0041\ud800\ud800\udc00\ud800"}}}`, true},
		{`{"jsonrpc":"2.0","method":"textDocument/didOpen","params":{"textDocument":{"URI":"file:///e","version":1,"text":"C"}}}`, false},
		{`{"jsonrpc":"2.0","method":"textDocument/didOpen","params":{"textDocument":{"uri":"file:///e","version":1.5,"text":"C"}}}`, false},
		{`{"jsonrpc":"2.0","method":"textDocument/didOpen","params":{"textDocument":{"uri":"file:///e","version":4294967296,"text":"C"}}}`, false},
		{`{"jsonrpc":"2.0","method":"textDocument/didOpen","params":{"textDocument":{"uri":"file:///e","version":1,"text":"C"}}} x`, false},
		{`{"jsonrpc":"2.0","method":"textDocument/didOpen","params":{"textDocument":{"uri":"file:///e","version":1,"text":"C` + "\x01" + `"}}}`, false},
		{`{"jsonrpc":"2.0","method":"textDocument/didOpen","params":{"textDocument":{"uri":"file:///e","version":1,"text":"C` + "\xff" + `"}}}`, false},
		{`{"jsonrpc":"2.0","method":"textDocument/didOpen","params":{"textDocument":{"uri":"file:///e","version":1,"text":"C\q"}}}`, false},
		{`{"jsonrpc":"1.0","method":"textDocument/didOpen","params":{"textDocument":{"uri":"file:///e","version":1,"text":"C"}}}`, false},
		{`{"jsonrpc":"2.0","method":"textDocument/didOpen","params":{"textDocument":{"uri":"file:///e","version":1}}}`, false},
		{`{"jsonrpc":"2.0","method":"textDocument/didOpen","params":{"textDocument":{"uri":"file:///e","version":1,"text":"C"`, false},
		{`{"jsonrpc":"2.0","method":"textDocument/didOpen","params":null}`, false},
		{``, false},
	} {
		if got := checkReadDidOpen(t, tc.frame); got != tc.read {
			t.Errorf("read %.80q: %v, want %v", tc.frame, got, tc.read)
		}
	}
}

// TestReadDidOpenRandom reads frames of random text, written by
// encoding/json with and without its HTML escapes, and byte-mangled
// frames, against encoding/json.
func TestReadDidOpenRandom(t *testing.T) {
	rng := rand.New(rand.NewSource(7))
	alphabet := []string{"C", "c", "[", "@", "@@", "]", "/", "\\", "\t", "\n", "\r\n", `"`, "é", "☃", "𝄞", "<", "&", "\x00", "\x1f", "\u2028", " "}
	read := 0
	for n := 0; n < 2000; n++ {
		var b strings.Builder
		for k := rng.Intn(40); k > 0; k-- {
			b.WriteString(alphabet[rng.Intn(len(alphabet))])
		}
		var frame bytes.Buffer
		enc := json.NewEncoder(&frame)
		enc.SetEscapeHTML(n%2 == 0)
		enc.Encode(map[string]any{"jsonrpc": "2.0", "method": "textDocument/didOpen",
			"params": map[string]any{"textDocument": map[string]any{"uri": "file:///r.smi", "languageId": "smiles", "version": n, "text": b.String()}}})
		data := bytes.TrimSpace(frame.Bytes())
		if checkReadDidOpen(t, string(data)) {
			read++
		}
		// one byte changed anywhere
		i := rng.Intn(len(data))
		const mangles = "\"\\{}[],:0 x\x00"
		data[i] = mangles[rng.Intn(len(mangles))]
		checkReadDidOpen(t, string(data))
	}
	if read != 2000 {
		t.Errorf("%d of 2000 frames as encoding/json writes them were read, want all", read)
	}
}

// TestLargeOpenRead opens a document larger than prereadFrom: the stream
// reads it, and its diagnostics are those of the same findings in a small
// document.
func TestLargeOpenRead(t *testing.T) {
	var reads atomic.Int32
	c := start(t, clientSetup{hook: func(s *Server) {
		h := s.notifications[methodPrereadOpen]
		s.notifications[methodPrereadOpen] = func(p json.RawMessage) error {
			reads.Add(1)
			return h(p)
		}
	}})
	small := "ok = \"C[C@H](N)O\"\nbad = \"C[C@H](C)C\"\nrac = 'C[C@@H](F)Cl |&1:1|'\n\tx = \"\\\\\"\n"
	large := small + "# " + strings.Repeat("a\tb\"c ", prereadFrom/6+1) + "\n"
	c.open("file:///small.py", "python", 1, small)
	want := c.diagnostics("file:///small.py", 1)
	c.open("file:///large.py", "python", 2, large)
	got := c.diagnostics("file:///large.py", 2)
	if len(want) == 0 {
		t.Fatal("the small document has no findings to compare")
	}
	if reads.Load() != 1 {
		t.Errorf("the stream read %d didOpen frames, want 1 (the large one)", reads.Load())
	}
	w, _ := json.Marshal(want)
	g, _ := json.Marshal(got)
	if string(w) != string(g) {
		t.Errorf("large document's findings:\n%s\nsmall document's:\n%s", g, w)
	}
	// a client that sends the notification itself opens nothing
	c.notify(methodPrereadOpen, nil)
	c.open("file:///after.py", "python", 1, small)
	if got := c.diagnostics("file:///after.py", 1); len(got) != len(want) {
		t.Errorf("after a stray %s: %d findings, want %d", methodPrereadOpen, len(got), len(want))
	}
}

// FuzzReadDidOpen checks readDidOpen against encoding/json on any frame:
// it reads a frame as decoding does, or declines it and leaves it as it
// was.
func FuzzReadDidOpen(f *testing.F) {
	f.Add(`{"jsonrpc":"2.0","method":"textDocument/didOpen","params":{"textDocument":{"uri":"file:///a.smi","languageId":"smiles","version":3,"text":"C[C@H](N)O\tala\n"}}}`)
	f.Add(`{"jsonrpc":"2.0","method":"textDocument/didOpen","params":{"x":[{}],"textDocument":{"uri":"\u0066","version":-1,"text":"\ud834\udd1e\ud800\\"}}}`)
	f.Fuzz(func(t *testing.T, frame string) {
		checkReadDidOpen(t, frame)
	})
}

package lsp

import (
	"bufio"
	"context"
	"encoding/json"
	"fmt"
	"io"
	"net"
	"net/textproto"
	"strconv"
	"strings"
	"sync"
	"testing"
	"time"

	"go.uber.org/zap"
	"go.uber.org/zap/zapcore"
)

// FuzzServer drives a server in process with a session decoded from the
// fuzz bytes: documents opened, changed (with ranges anywhere, past the
// end too), hovered, asked for code actions and other requests, closed;
// requests with parameters of the wrong shape, unknown methods,
// cancellations of any id, and frames whose body is not JSON-RPC (with
// correct framing). The session ends with shutdown and exit. The server
// must answer every request exactly once (unknown methods with
// MethodNotFound), never log an internal error (a recovered panic),
// never hang, and exit with status 0. The corpus lives in
// testdata/fuzz/FuzzServer.
func FuzzServer(f *testing.F) {
	f.Add([]byte{0, 0, 0, 3, 0, 1, 4, 0, 0, 1, 2, 5, 0})
	f.Add([]byte{0, 1, 1, 1, 1, 0, 2, 9, 3, 1, 0, 3, 4, 1, 0, 0, 1, 5, 5, 1})
	f.Add([]byte{0, 2, 2, 6, 5, 'n', 'u', 'l', 'l', 7, 3, 8, 0, 9, 7, 2, 2, 200, 200, 4, 2, 0, 0, 9, 9})
	f.Add([]byte{0, 0, 4, 1, 0, 0, 0, 255, 255, 3, 'C', 'C', 'C', 1, 0, 7, 7, 0, 0, 0, 3, 0, 7, 7})
	f.Add([]byte{0, 3, 5, 2, 3, 8, 'C', '[', 'C', '@', 'H', ']', '(', 'F', 9, 1, 9, 0, 6, 3, '{', '"', 'x'})
	f.Add([]byte("\x00\x00\x00\x01\x00\x00\x00\x00\x01\x00\x01\x00\x00\x00\x00\x01\x00\x02\x00\x00\x00\x00\x02\x03\x00\x00"))
	f.Fuzz(func(t *testing.T, data []byte) {
		if len(data) > 512 {
			return
		}
		s := newFuzzSession(t)
		s.run(data)
		s.finish()
	})
}

// fuzzTexts are whole documents the session opens or sets, one per host
// kind, with marks that give findings, relations and code actions.
var fuzzTexts = []string{
	"C[C@H](N)O first\nC[C@@H](N)O second\nF/C=C/F\nC[C@H](C)C\n",
	"smiles = \"F/C=C\\\\F\"\nmol = Chem.MolFromSmiles('C[C@@H](F)Cl')\n",
	"id,smiles\n1,C[C@@H](F)Cl\n2,\"F/C=C\\F\"\n",
	"# Notes\nThe `C[C@H](F)Cl` form and\n```smiles\nF/C=C/F trans\n```\n",
	"{\"smiles\": \"F/C=C/F\", \"list\": [\"C[C@H](O)[C@@H](C)Cl |o1:1,3|\"]}",
	"é😀\r\nC[C@H](F)Cl\r\n\r\n",
	"",
}

var fuzzLanguages = []string{"smiles", "python", "csv", "markdown", "json", "plaintext", "", "jupyter", "yaml"}

var fuzzURIs = []string{"file:///fuzz/a.smi", "file:///fuzz/b.py", "file:///fuzz/c.md", "file:///fuzz/d.yaml", "file:///fuzz/e.sdf", "file:///fuzz/f.json"}

// fuzzSession is a client written by hand over a pipe, so that it can
// send any bytes and count every reply.
type fuzzSession struct {
	t      *testing.T
	conn   net.Conn
	logs   *syncBuffer
	status chan int

	writeMu sync.Mutex
	mu      sync.Mutex
	replies map[string]int    // replies received, by request id
	errors  map[string]int    // the error code of each reply, 0 for a result
	sent    map[string]string // requests sent: id to method
	arrived chan struct{}     // signalled on every reply
	done    chan struct{}     // closed when the reader ends

	next    int
	data    []byte
	pos     int
	version map[string]int32
}

func newFuzzSession(t *testing.T) *fuzzSession {
	serverEnd, clientEnd := net.Pipe()
	logs := &syncBuffer{}
	log := zap.New(zapcore.NewCore(zapcore.NewJSONEncoder(zap.NewProductionEncoderConfig()), logs, zapcore.InfoLevel))
	s := &fuzzSession{
		t: t, conn: clientEnd, logs: logs, status: make(chan int, 1),
		replies: map[string]int{}, errors: map[string]int{}, sent: map[string]string{},
		arrived: make(chan struct{}, 1), done: make(chan struct{}), version: map[string]int32{},
	}
	go func() {
		s.status <- serve(context.Background(), serverEnd, log, Options{Debounce: time.Millisecond, Version: "fuzz"}, nil)
		serverEnd.Close()
	}()
	go s.read()
	s.request("initialize", map[string]any{"processId": nil, "capabilities": map[string]any{}})
	s.notify("initialized", map[string]any{})
	return s
}

// read takes every frame the server sends: replies are counted, requests
// from the server answered with null on a goroutine of their own (the
// server may be writing to us meanwhile).
func (s *fuzzSession) read() {
	defer close(s.done)
	r := bufio.NewReader(s.conn)
	tp := textproto.NewReader(r)
	for {
		h, err := tp.ReadMIMEHeader()
		if err != nil {
			return
		}
		n, err := strconv.Atoi(h.Get("Content-Length"))
		if err != nil {
			s.t.Errorf("server frame without a length: %v", h)
			return
		}
		body := make([]byte, n)
		if _, err := io.ReadFull(r, body); err != nil {
			return
		}
		var msg struct {
			ID     json.RawMessage `json:"id"`
			Method string          `json:"method"`
			Error  *struct {
				Code int `json:"code"`
			} `json:"error"`
		}
		if err := json.Unmarshal(body, &msg); err != nil {
			s.t.Errorf("server sent a body that is not JSON: %q", body)
			continue
		}
		switch {
		case msg.Method != "" && msg.ID != nil:
			id := msg.ID
			go s.frame(fmt.Sprintf(`{"jsonrpc":"2.0","id":%s,"result":null}`, id))
		case msg.Method == "":
			id := string(msg.ID)
			s.mu.Lock()
			s.replies[id]++
			if msg.Error != nil {
				s.errors[id] = msg.Error.Code
			}
			s.mu.Unlock()
			select {
			case s.arrived <- struct{}{}:
			default:
			}
		}
	}
}

// frame writes one correctly framed body.
func (s *fuzzSession) frame(body string) {
	s.writeMu.Lock()
	defer s.writeMu.Unlock()
	s.conn.SetWriteDeadline(time.Now().Add(10 * time.Second))
	fmt.Fprintf(s.conn, "Content-Length: %d\r\n\r\n%s", len(body), body)
}

func (s *fuzzSession) send(msg map[string]any) {
	msg["jsonrpc"] = "2.0"
	b, err := json.Marshal(msg)
	if err != nil {
		s.t.Fatal(err)
	}
	s.frame(string(b))
}

// request sends a request with a fresh id and returns the id as it will
// come back.
func (s *fuzzSession) request(method string, params any) string {
	s.next++
	id := strconv.Itoa(s.next)
	s.mu.Lock()
	s.sent[id] = method
	s.mu.Unlock()
	s.send(map[string]any{"id": s.next, "method": method, "params": params})
	return id
}

func (s *fuzzSession) notify(method string, params any) {
	s.send(map[string]any{"method": method, "params": params})
}

// byte returns the next fuzz byte, 0 past the end.
func (s *fuzzSession) byte() int {
	if s.pos >= len(s.data) {
		return 0
	}
	b := s.data[s.pos]
	s.pos++
	return int(b)
}

// chunk returns the next few fuzz bytes as a string.
func (s *fuzzSession) chunk() string {
	n := s.byte() % 24
	end := min(s.pos+n, len(s.data))
	c := string(s.data[s.pos:end])
	s.pos = end
	return c
}

// text is a whole document from the table or from the fuzz bytes.
func (s *fuzzSession) text() string {
	if k := s.byte(); k < 2*len(fuzzTexts) {
		return fuzzTexts[k%len(fuzzTexts)]
	}
	return s.chunk()
}

func (s *fuzzSession) uri() string { return fuzzURIs[s.byte()%len(fuzzURIs)] }

func (s *fuzzSession) position() map[string]any {
	line, char := s.byte(), s.byte()
	if line > 8 && line < 250 {
		line %= 8
	}
	return map[string]any{"line": line, "character": char % 64}
}

// nextVersion is usually the next version of a document, sometimes an
// older one.
func (s *fuzzSession) nextVersion(uri string) int32 {
	v := s.version[uri] + 1
	if s.byte()%8 == 7 {
		v -= 3
	}
	s.version[uri] = v
	return v
}

// run plays the session the fuzz bytes describe.
func (s *fuzzSession) run(data []byte) {
	s.data = data
	for ops := 0; s.pos < len(s.data) && ops < 64; ops++ {
		switch s.byte() % 10 {
		case 0:
			uri := s.uri()
			lang := fuzzLanguages[s.byte()%len(fuzzLanguages)]
			s.notify("textDocument/didOpen", map[string]any{"textDocument": map[string]any{
				"uri": uri, "languageId": lang, "version": s.nextVersion(uri), "text": s.text()}})
		case 1:
			uri := s.uri()
			s.notify("textDocument/didChange", map[string]any{
				"textDocument":   map[string]any{"uri": uri, "version": s.nextVersion(uri)},
				"contentChanges": []any{map[string]any{"range": map[string]any{"start": s.position(), "end": s.position()}, "text": s.chunk()}},
			})
		case 2:
			uri := s.uri()
			s.notify("textDocument/didChange", map[string]any{
				"textDocument":   map[string]any{"uri": uri, "version": s.nextVersion(uri)},
				"contentChanges": []any{map[string]any{"text": s.text()}},
			})
		case 3:
			s.request("textDocument/hover", map[string]any{"textDocument": textDoc(s.uri()), "position": s.position()})
		case 4:
			s.request("textDocument/codeAction", map[string]any{"textDocument": textDoc(s.uri()),
				"range": map[string]any{"start": s.position(), "end": s.position()}, "context": map[string]any{"diagnostics": []any{}}})
		case 5:
			s.notify("textDocument/didClose", map[string]any{"textDocument": textDoc(s.uri())})
		case 6:
			// A body that is not JSON-RPC, framed correctly: empty,
			// or with a closing brace first, which keeps it from being
			// a message by chance.
			if c := s.chunk(); c == "" {
				s.frame("") // Content-Length: 0
			} else {
				s.frame("}" + c)
			}
		case 7:
			// A request whose parameters have the wrong shape.
			methods := []string{"textDocument/hover", "textDocument/codeAction", methodInlayHint, methodCodeActionResolve,
				"textDocument/documentSymbol", methodDocumentDiagnostic, "textDocument/codeLens", "workspace/executeCommand"}
			method := methods[s.byte()%len(methods)]
			var params any = s.chunk()
			if s.byte()%2 == 0 {
				params = []any{1, "x", nil}
			}
			s.request(method, params)
		case 8:
			id := s.request("stereoline/fuzz/"+strconv.Itoa(s.byte()), map[string]any{})
			s.mu.Lock()
			s.sent[id] = "unknown"
			s.mu.Unlock()
			s.notify("$/fuzz/unknown", map[string]any{})
		case 9:
			switch s.byte() % 5 {
			case 0:
				s.notify("$/cancelRequest", map[string]any{"id": s.next - s.byte()%4})
			case 1:
				s.notify("$/cancelRequest", map[string]any{"id": "no such id"})
			case 2:
				s.request(methodInlayHint, map[string]any{"textDocument": textDoc(s.uri()),
					"range": map[string]any{"start": map[string]any{"line": 0, "character": 0}, "end": s.position()}})
			case 3:
				s.request("textDocument/documentSymbol", map[string]any{"textDocument": textDoc(s.uri())})
			case 4:
				s.request(methodDocumentDiagnostic, map[string]any{"textDocument": textDoc(s.uri())})
			}
		}
	}
}

// finish shuts the session down and checks what it promised.
func (s *fuzzSession) finish() {
	t := s.t
	shutdown := s.request("shutdown", nil)
	deadline := time.After(30 * time.Second)
	for {
		s.mu.Lock()
		all := len(s.replies) >= len(s.sent) && s.replies[shutdown] > 0
		s.mu.Unlock()
		if all {
			break
		}
		select {
		case <-s.arrived:
		case <-s.done:
			t.Fatalf("the server closed the stream before answering every request")
		case <-deadline:
			s.mu.Lock()
			var missing []string
			for id, m := range s.sent {
				if s.replies[id] == 0 {
					missing = append(missing, id+" "+m)
				}
			}
			s.mu.Unlock()
			t.Fatalf("no reply in 30s to %s (%d sent, replies %v)", strings.Join(missing, ", "), len(s.sent), s.replies)
		}
	}
	s.notify("exit", nil)
	select {
	case st := <-s.status:
		if st != 0 {
			t.Errorf("exit after shutdown: status %d, want 0", st)
		}
	case <-time.After(30 * time.Second):
		t.Fatalf("the server did not exit")
	}
	s.conn.Close()
	<-s.done
	s.mu.Lock()
	defer s.mu.Unlock()
	for id, n := range s.replies {
		if _, ok := s.sent[id]; !ok {
			t.Errorf("a reply to id %s, which was never sent", id)
		} else if n != 1 {
			t.Errorf("%d replies to request %s (%s)", n, id, s.sent[id])
		}
	}
	for id, m := range s.sent {
		if m == "unknown" && s.errors[id] != -32601 {
			t.Errorf("unknown method %s: error %d, want MethodNotFound (-32601)", id, s.errors[id])
		}
	}
	if logs := s.logs.String(); strings.Contains(logs, `"internal error"`) {
		t.Errorf("a handler panicked:\n%s", logs)
	}
}

package main

import (
	"bufio"
	"bytes"
	"encoding/json"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"sync"
	"testing"
	"time"
)

// serveFrame writes one message with the base protocol's header (LSP 3.17,
// "Base Protocol": Content-Length, a blank line, the JSON content).
func serveFrame(t *testing.T, w io.Writer, msg map[string]any) {
	t.Helper()
	msg["jsonrpc"] = "2.0"
	b, err := json.Marshal(msg)
	if err != nil {
		t.Fatal(err)
	}
	fmt.Fprintf(w, "Content-Length: %d\r\n\r\n%s", len(b), b)
}

// readServeFrames reads the server's output message by message, failing on
// any byte outside a frame: the protocol owns standard output.
func readServeFrames(t *testing.T, out io.Reader, msgs chan<- map[string]any) {
	defer close(msgs)
	r := bufio.NewReader(out)
	for {
		line, err := r.ReadString('\n')
		if err != nil {
			return
		}
		if !strings.HasPrefix(line, "Content-Length: ") {
			t.Errorf("standard output has %q outside a frame", line)
			return
		}
		n, err := strconv.Atoi(strings.TrimSpace(strings.TrimPrefix(line, "Content-Length: ")))
		if err != nil {
			t.Error(err)
			return
		}
		if blank, _ := r.ReadString('\n'); blank != "\r\n" {
			t.Errorf("header not followed by a blank line: %q", blank)
			return
		}
		body := make([]byte, n)
		if _, err := io.ReadFull(r, body); err != nil {
			t.Error(err)
			return
		}
		var m map[string]any
		if err := json.Unmarshal(body, &m); err != nil {
			t.Errorf("frame %q: %v", body, err)
			return
		}
		msgs <- m
	}
}

// serveSession runs 'stereoline serve' over pipes: initialize, open a list,
// wait for its diagnostics, then shut down (or not) and exit.
func serveSession(t *testing.T, args []string, exitAfterShutdown bool) (status int, msgs []map[string]any, stderr string) {
	t.Helper()
	inR, inW := io.Pipe()
	outR, outW := io.Pipe()
	var errOut serveStderr
	done := make(chan int, 1)
	go func() {
		done <- run(append([]string{"serve"}, args...), inR, outW, &errOut)
		outW.Close()
	}()
	frames := make(chan map[string]any, 16)
	go readServeFrames(t, outR, frames)
	next := func(what string) map[string]any {
		select {
		case m, ok := <-frames:
			if !ok {
				t.Fatalf("output ended before %s", what)
			}
			msgs = append(msgs, m)
			return m
		case <-time.After(10 * time.Second):
			t.Fatalf("no %s", what)
		}
		return nil
	}
	serveFrame(t, inW, map[string]any{"id": 1, "method": "initialize", "params": map[string]any{"capabilities": map[string]any{}}})
	next("initialize answer")
	serveFrame(t, inW, map[string]any{"method": "initialized", "params": map[string]any{}})
	serveFrame(t, inW, map[string]any{"method": "textDocument/didOpen", "params": map[string]any{"textDocument": map[string]any{
		"uri": "file:///tmp/x.smi", "languageId": "", "version": 4, "text": "C[C@H](C)C marked\n",
	}}})
	next("diagnostics")
	if exitAfterShutdown {
		serveFrame(t, inW, map[string]any{"id": 2, "method": "shutdown"})
		next("shutdown answer")
	}
	serveFrame(t, inW, map[string]any{"method": "exit"})
	select {
	case status = <-done:
	case <-time.After(10 * time.Second):
		t.Fatal("serve did not exit")
	}
	inW.Close()
	for m := range frames {
		msgs = append(msgs, m)
	}
	return status, msgs, errOut.String()
}

// serveStderr is standard error shared by the server's goroutines and the
// test.
type serveStderr struct {
	mu sync.Mutex
	b  bytes.Buffer
}

func (s *serveStderr) Write(p []byte) (int, error) {
	s.mu.Lock()
	defer s.mu.Unlock()
	return s.b.Write(p)
}

func (s *serveStderr) String() string {
	s.mu.Lock()
	defer s.mu.Unlock()
	return s.b.String()
}

func TestServe(t *testing.T) {
	status, msgs, stderr := serveSession(t, []string{"--stdio"}, true)
	if status != 0 {
		t.Errorf("shutdown then exit: status %d, want 0", status)
	}
	var published bool
	for _, m := range msgs {
		if m["method"] == "textDocument/publishDiagnostics" {
			published = true
			p := m["params"].(map[string]any)
			if p["version"] != 4.0 || len(p["diagnostics"].([]any)) != 1 {
				t.Errorf("published %v", p)
			}
		}
	}
	if !published || len(msgs) < 3 {
		t.Errorf("messages %v, want the initialize answer, diagnostics and the shutdown answer", msgs)
	}
	if !strings.Contains(stderr, `"initialized"`) {
		t.Errorf("standard error lacks the log: %q", stderr)
	}
}

func TestServeExitWithoutShutdownAndLogFile(t *testing.T) {
	log := filepath.Join(t.TempDir(), "server.log")
	status, _, stderr := serveSession(t, []string{"--log", log}, false)
	if status != 1 {
		t.Errorf("exit without shutdown: status %d, want 1", status)
	}
	b, err := os.ReadFile(log)
	if err != nil || !strings.Contains(string(b), `"initialized"`) {
		t.Errorf("log file %q (%v)", b, err)
	}
	if stderr != "" {
		t.Errorf("standard error with --log: %q", stderr)
	}
}

func TestServeBadArguments(t *testing.T) {
	var out, errOut bytes.Buffer
	if st := run([]string{"serve", "--port", "1"}, strings.NewReader(""), &out, &errOut); st != 2 || out.Len() != 0 {
		t.Errorf("unknown flag: status %d, stdout %q", st, out.String())
	}
}

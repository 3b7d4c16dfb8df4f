package main

import (
	"fmt"
	"os/exec"
	"path/filepath"
	"testing"
	"time"
)

// TestServeBinaryExitStatus runs the real binary as an editor does, over
// its standard input and output, and checks the process's exit status
// (LSP 3.17, "Exit Notification"): 0 after shutdown then exit, even when
// the session saw frames that are not messages; 1 after exit without
// shutdown, and when the input ends without exit.
func TestServeBinaryExitStatus(t *testing.T) {
	if testing.Short() {
		t.Skip("builds the binary")
	}
	bin := filepath.Join(t.TempDir(), "stereoline")
	if out, err := exec.Command("go", "build", "-o", bin, ".").CombinedOutput(); err != nil {
		t.Fatalf("go build: %v\n%s", err, out)
	}
	tests := []struct {
		name     string
		shutdown bool
		exit     bool
		want     int
	}{
		{"shutdown then exit", true, true, 0},
		{"exit without shutdown", false, true, 1},
		{"shutdown, then the input ends", true, false, 1},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			cmd := exec.Command(bin, "serve")
			in, err := cmd.StdinPipe()
			if err != nil {
				t.Fatal(err)
			}
			out, err := cmd.StdoutPipe()
			if err != nil {
				t.Fatal(err)
			}
			if err := cmd.Start(); err != nil {
				t.Fatal(err)
			}
			frames := make(chan map[string]any, 16)
			go readServeFrames(t, out, frames)
			reply := func(id float64) {
				t.Helper()
				timeout := time.After(10 * time.Second)
				for {
					select {
					case m, ok := <-frames:
						if !ok {
							t.Fatalf("output ended before the answer to %v", id)
						}
						if m["id"] == id && m["method"] == nil {
							return
						}
					case <-timeout:
						t.Fatalf("no answer to %v", id)
					}
				}
			}
			serveFrame(t, in, map[string]any{"id": 1, "method": "initialize", "params": map[string]any{"capabilities": map[string]any{}}})
			reply(1)
			serveFrame(t, in, map[string]any{"method": "initialized", "params": map[string]any{}})
			fmt.Fprint(in, "Content-Length: 0\r\n\r\nContent-Length: 5\r\n\r\n{oops")
			serveFrame(t, in, map[string]any{"id": 2, "method": "textDocument/documentSymbol", "params": map[string]any{"textDocument": map[string]any{"uri": "file:///x.smi"}}})
			reply(2)
			if tt.shutdown {
				serveFrame(t, in, map[string]any{"id": 3, "method": "shutdown"})
				reply(3)
			}
			if tt.exit {
				serveFrame(t, in, map[string]any{"method": "exit"})
			} else {
				in.Close()
			}
			done := make(chan error, 1)
			go func() {
				for range frames {
				}
				done <- cmd.Wait()
			}()
			select {
			case <-done:
			case <-time.After(10 * time.Second):
				cmd.Process.Kill()
				t.Fatal("serve did not exit")
			}
			if got := cmd.ProcessState.ExitCode(); got != tt.want {
				t.Errorf("exit status %d, want %d", got, tt.want)
			}
		})
	}
}

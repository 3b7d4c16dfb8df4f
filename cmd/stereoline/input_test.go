package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestEachLineStdinDash: "-" names standard input among files, as it does
// for check, so `transform --mirror -` and `describe a.smi - b.smi` read
// what is piped in, in the order named.
func TestEachLineStdinDash(t *testing.T) {
	dir := t.TempDir()
	file := filepath.Join(dir, "a.smi")
	if err := os.WriteFile(file, []byte("CCO\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	var got []string
	var stderr bytes.Buffer
	status := eachLine([]string{file, "-"}, strings.NewReader("C[C@H](O)CC\n"), &stderr, func(name string, line int, text string) {
		got = append(got, filepath.Base(name)+":"+text)
	})
	want := []string{"a.smi:CCO", "<stdin>:C[C@H](O)CC"}
	if status != 0 || strings.Join(got, " ") != strings.Join(want, " ") {
		t.Errorf("status %d, lines %q, want 0 and %q (stderr %q)", status, got, want, stderr.String())
	}
}

package main

import (
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"
)

// writeRelatedList writes a list whose records are related in every way
// check reports (duplicates, enantiomers, stereoisomers), over many
// constitutions, so that a mapped reading is checked on relations to
// records read again from far back in the file.
func writeRelatedList(t *testing.T, path string, copies int) {
	t.Helper()
	// alanine and its mirror image, E and Z 2-butene, lactic acid, a
	// racemate (common practice)
	seeds := []string{
		"N[C@@H](C)C(=O)O", "N[C@H](C)C(=O)O", "C/C=C/C", "C/C=C\\C",
		"C[C@H](O)C(=O)O", "C[C@@H](O)C(=O)O |&1:1|", "CC(O)C(=O)O",
	}
	var b strings.Builder
	for r := range copies {
		for k, s := range seeds {
			// a chain of r%40+1 carbons makes forty constitutions of each
			fmt.Fprintf(&b, "%s.%s rec-%d-%d\n", strings.Repeat("C", r%40+1), s, r, k)
		}
	}
	if err := os.WriteFile(path, []byte(b.String()), 0o644); err != nil {
		t.Fatal(err)
	}
}

// TestMappedFileFindings checks that a file check maps gives the
// findings of the same file read into memory, its pages dropped every
// 50 microseconds.
func TestMappedFileFindings(t *testing.T) {
	if !canMap {
		t.Skip("files are not mapped on this system")
	}
	path := filepath.Join(t.TempDir(), "related.smi")
	writeRelatedList(t, path, 400)
	saved, savedDrop := mapAtLeast, dropInterval
	t.Cleanup(func() { mapAtLeast, dropInterval = saved, savedDrop })

	mapAtLeast = math.MaxInt64
	before := filesMapped.Load()
	read, _, readStatus := runCheck(t, "", "--format", "json", path)
	if filesMapped.Load() != before {
		t.Fatal("the file was mapped with mapping off")
	}
	mapAtLeast, dropInterval = 0, 50*time.Microsecond
	mapped, stderr, mappedStatus := runCheck(t, "", "--format", "json", path)
	if filesMapped.Load() != before+1 {
		t.Fatal("the file was not mapped")
	}
	if readStatus != mappedStatus || read != mapped {
		t.Errorf("mapped reading differs: status %d against %d, %d against %d bytes; stderr:\n%s",
			mappedStatus, readStatus, len(mapped), len(read), stderr)
	}
	for _, code := range []string{"list-duplicate", "list-enantiomer", "list-stereoisomer"} {
		if !strings.Contains(mapped, code) {
			t.Errorf("no %s in the findings: the list does not test relations", code)
		}
	}
	keysRead := runKeysOut(t, path)
	mapAtLeast = math.MaxInt64
	if keysMapped := runKeysOut(t, path); keysMapped != keysRead {
		t.Error("keys differ between the mapped and the read file")
	}
}

func runKeysOut(t *testing.T, path string) string {
	t.Helper()
	var out, errOut strings.Builder
	if status := run([]string{"keys", path}, strings.NewReader(""), &out, &errOut); status != 0 {
		t.Fatalf("keys: status %d: %s", status, errOut.String())
	}
	return out.String()
}

// TestMappedBinaryFile checks that a mapped file with a NUL byte near
// its start is skipped as binary, as a read one is.
func TestMappedBinaryFile(t *testing.T) {
	if !canMap {
		t.Skip("files are not mapped on this system")
	}
	saved := mapAtLeast
	t.Cleanup(func() { mapAtLeast = saved })
	mapAtLeast = 0
	path := filepath.Join(t.TempDir(), "blob.smi")
	data := append([]byte("CCO\n\x00"), make([]byte, 2*binaryProbe)...)
	if err := os.WriteFile(path, data, 0o644); err != nil {
		t.Fatal(err)
	}
	_, stderr, status := runCheck(t, "", path)
	if status != 0 || !strings.Contains(stderr, "skipped: binary file") {
		t.Errorf("status %d, stderr %q; want 0 and a binary file skipped", status, stderr)
	}
}

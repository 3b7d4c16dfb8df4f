package find

import (
	"context"
	"io/fs"
	"os"
	"path/filepath"
	"slices"
	"testing"
)

// TestWalkHosts: the walk the checker and the language server share
// visits host files in lexical order and leaves out hidden entries and
// dependency folders below the root, but not the root itself.
func TestWalkHosts(t *testing.T) {
	root := filepath.Join(t.TempDir(), ".hidden-root")
	for _, name := range []string{
		"a.smi", "b.txt", "sub/c.py", "sub/.d.smi", ".git/e.smi", "node_modules/pkg/f.smi",
		"__pycache__/g.smi", "src/node_modules.smi", ".stereoline.json", "z/y/h.csv",
	} {
		p := filepath.Join(root, filepath.FromSlash(name))
		if err := os.MkdirAll(filepath.Dir(p), 0o755); err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(p, []byte("CCO\n"), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	host := func(p string) bool { return KindForName(p) != KindUnknown }
	var got []string
	err := WalkHosts(context.Background(), root, host, func(p string, d fs.DirEntry) error {
		rel, _ := filepath.Rel(root, p)
		got = append(got, filepath.ToSlash(rel))
		return nil
	}, func(p string, err error) { t.Errorf("%s: %v", p, err) })
	if err != nil {
		t.Fatal(err)
	}
	want := []string{"a.smi", "src/node_modules.smi", "sub/c.py", "z/y/h.csv"}
	if !slices.Equal(got, want) {
		t.Errorf("visited %v, want %v", got, want)
	}

	// fs.SkipAll from visit and a cancelled context both end the walk
	got = nil
	WalkHosts(context.Background(), root, host, func(p string, d fs.DirEntry) error {
		got = append(got, p)
		return fs.SkipAll
	}, nil)
	if len(got) != 1 {
		t.Errorf("after SkipAll visited %d files, want 1", len(got))
	}
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	got = nil
	WalkHosts(ctx, root, host, func(p string, d fs.DirEntry) error { got = append(got, p); return nil }, nil)
	if len(got) != 0 {
		t.Errorf("a cancelled walk visited %v", got)
	}
}

func TestSkipped(t *testing.T) {
	tests := []struct {
		name string
		dir  bool
		want bool
	}{
		{".git", true, true},
		{".env.smi", false, true},
		{"node_modules", true, true},
		{"node_modules", false, false}, // a file of that name is no dependency folder
		{"__pycache__", true, true},
		{"src", true, false},
		{"list.smi", false, false},
	}
	for _, tt := range tests {
		if got := Skipped(tt.name, tt.dir); got != tt.want {
			t.Errorf("Skipped(%q, %v) = %v, want %v", tt.name, tt.dir, got, tt.want)
		}
	}
}

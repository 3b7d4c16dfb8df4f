package main

import (
	"bytes"
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// drawInput is the golden input of the draw tests: a few facts of the
// trade (L-alanine is (S); D-glucose has its C5 hydroxyl right in the
// Fischer projection, common practice), an allene, a reaction and a
// record that does not read.
const drawInput = "N[C@@H](C)C(=O)O L-alanine\n" +
	"O=C[C@H](O)[C@@H](O)[C@H](O)[C@H](O)CO D-glucose\n" +
	"CC=[C@]=CC (M)-penta-2,3-diene\n" +
	"# a comment line is skipped\n" +
	"\n" +
	"[CH3:1][C@@H:2]([Br:3])[CH2:4][CH3:5].[OH-:6]>>[CH3:1][C@H:2]([OH:6])[CH2:4][CH3:5].[Br-:3] SN2\n" +
	"C1CC(C broken\n"

// TestDrawGolden checks draw --json and draw --fischer --json against
// golden files (go test ./cmd/stereoline -run DrawGolden -update
// rewrites them; review the diff).
func TestDrawGolden(t *testing.T) {
	for _, c := range []struct {
		args   []string
		golden string
	}{
		{[]string{"draw", "--json"}, "draw.json.golden"},
		{[]string{"draw", "--fischer", "--json"}, "draw_fischer.json.golden"},
	} {
		var out, errb bytes.Buffer
		if status := run(c.args, strings.NewReader(drawInput), &out, &errb); status != 0 {
			t.Fatalf("%v: status %d: %s", c.args, status, errb.String())
		}
		lines := strings.Split(strings.TrimSpace(out.String()), "\n")
		if len(lines) != 5 {
			t.Fatalf("%v: %d records, want 5", c.args, len(lines))
		}
		for _, l := range lines {
			if !json.Valid([]byte(l)) {
				t.Errorf("%v: not JSON: %s", c.args, l)
			}
		}
		path := filepath.Join("testdata", c.golden)
		if *update {
			if err := os.WriteFile(path, out.Bytes(), 0o644); err != nil {
				t.Fatal(err)
			}
			continue
		}
		want, err := os.ReadFile(path)
		if err != nil {
			t.Fatal(err)
		}
		if out.String() != string(want) {
			t.Errorf("%v differs from %s (go test ./cmd/stereoline -run DrawGolden -update, then review the diff)", c.args, path)
		}
	}
}

// TestDrawFischerFacts reads the Fischer JSON: D-glucose's rows from C2
// down, C1 on top, D; L-alanine's amino group on the left.
func TestDrawFischerFacts(t *testing.T) {
	var out, errb bytes.Buffer
	run([]string{"draw", "--fischer", "--json"}, strings.NewReader(drawInput), &out, &errb)
	lines := strings.Split(strings.TrimSpace(out.String()), "\n")
	type view struct {
		Fischer *struct {
			Rows []struct {
				Centre, Left, Right int
			}
			Top, Bottom int
			Family      *string
		}
		Reason string
	}
	var ala, glc, allene view
	for i, v := range []*view{&ala, &glc, &allene} {
		if err := json.Unmarshal([]byte(lines[i]), v); err != nil {
			t.Fatal(err)
		}
	}
	if ala.Fischer == nil || *ala.Fischer.Family != "L" || ala.Fischer.Rows[0].Left != 1 || ala.Fischer.Rows[0].Right != 0 {
		t.Errorf("L-alanine: %+v", ala.Fischer)
	}
	if glc.Fischer == nil || *glc.Fischer.Family != "D" || glc.Fischer.Top != 2 || len(glc.Fischer.Rows) != 4 || glc.Fischer.Rows[0].Centre != 3 {
		t.Errorf("D-glucose: %+v", glc.Fischer)
	}
	// C2 right, C3 left, C4 and C5 right: the OH atoms 4, 6, 8, 10
	if glc.Fischer != nil {
		r := glc.Fischer.Rows
		if r[0].Right != 4 || r[1].Left != 6 || r[2].Right != 8 || r[3].Right != 10 {
			t.Errorf("D-glucose rows: %+v", r)
		}
	}
	if allene.Fischer != nil || allene.Reason == "" {
		t.Errorf("allene: %+v", allene)
	}
}

// TestDrawFormats checks the other formats through the command: SVG per
// record on standard output, an SD file of molfiles, PNG files in a
// folder, and --png without --out refused for several records.
func TestDrawFormats(t *testing.T) {
	var out, errb bytes.Buffer
	if status := run([]string{"draw"}, strings.NewReader(drawInput), &out, &errb); status != 0 {
		t.Fatalf("svg: status %d: %s", status, errb.String())
	}
	if n := strings.Count(out.String(), "<svg "); n != 5 {
		t.Errorf("%d SVG documents, want 5", n)
	}
	out.Reset()
	run([]string{"draw", "--molfile"}, strings.NewReader(drawInput), &out, &errb)
	if n := strings.Count(out.String(), "$$$$\n"); n != 5 || strings.Count(out.String(), "M  END") != 5 {
		t.Errorf("%d molfiles, want 5", n)
	}
	dir := t.TempDir()
	if status := run([]string{"draw", "--png", "--out", dir}, strings.NewReader(drawInput), &out, &errb); status != 0 {
		t.Fatalf("png: status %d: %s", status, errb.String())
	}
	files, _ := filepath.Glob(filepath.Join(dir, "*.png"))
	if len(files) != 5 {
		t.Errorf("%d PNG files, want 5: %v", len(files), files)
	}
	errb.Reset()
	if status := run([]string{"draw", "--png"}, strings.NewReader(drawInput), &out, &errb); status != 2 {
		t.Errorf("--png of several records to standard output: status %d, want 2", status)
	}
}

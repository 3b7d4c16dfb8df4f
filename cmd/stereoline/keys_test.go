package main

import (
	"bufio"
	"bytes"
	"compress/gzip"
	"encoding/json"
	"image"
	"image/png"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"
)

// runKeys runs 'stereoline keys' in-process.
func runKeys(t *testing.T, stdin string, args ...string) (stdout, stderr string, status int) {
	t.Helper()
	var out, errb bytes.Buffer
	status = run(append([]string{"keys"}, args...), strings.NewReader(stdin), &out, &errb)
	return out.String(), errb.String(), status
}

// parseKeys reads keys' JSON Lines.
func parseKeys(t *testing.T, s string) []keysRecordJSON {
	t.Helper()
	var out []keysRecordJSON
	sc := bufio.NewScanner(strings.NewReader(s))
	for sc.Scan() {
		var k keysRecordJSON
		if err := json.Unmarshal(sc.Bytes(), &k); err != nil {
			t.Fatalf("%v: %s", err, sc.Text())
		}
		out = append(out, k)
	}
	return out
}

// TestKeys checks the keys of a small list against facts of the trade
// (common practice): two writings of one butan-2-ol share a key (the
// second is the first as Debian python3-rdkit 2022.09.3 writes it), the
// other enantiomer's key is the first one's mirror key, the unmarked and racemic
// forms (the CXSMILES "&1" group of the CXSMILES documentation) share the
// constitution and nothing else, and a cis 1,4-dimethylcyclohexane is its
// own mirror image.
func TestKeys(t *testing.T) {
	list := "C[C@H](O)CC s\nCC[C@H](C)O s-again\nC[C@@H](O)CC r\nCC(O)CC plain\nC[C@H](O)CC |&1:1| rac\nC[C@H](O)CC |o1:1| rel\nC[C@H]1CC[C@@H](C)CC1 cis\nC1CC1C(C bad\n"
	stdout, stderr, status := runKeys(t, list)
	if status != 0 {
		t.Fatalf("status %d: %s", status, stderr)
	}
	k := parseKeys(t, stdout)
	if len(k) != 8 {
		t.Fatalf("want 8 records, got %d:\n%s", len(k), stdout)
	}
	s, s2, r, plain, rac, rel, cis, bad := k[0], k[1], k[2], k[3], k[4], k[5], k[6], k[7]
	if s.Path != "stdin.smi" || s.Line != 1 || s.Column != 1 || s.Title != "s" || s2.Line != 2 {
		t.Errorf("place or title wrong: %+v %+v", s, s2)
	}
	if s.Stereo == "" || s.Stereo != s2.Stereo {
		t.Errorf("two writings of one structure: keys %q and %q", s.Stereo, s2.Stereo)
	}
	if s.Mirror != r.Stereo || r.Mirror != s.Stereo || s.Stereo == r.Stereo {
		t.Errorf("enantiomers: %+v %+v", s, r)
	}
	for _, o := range []keysRecordJSON{s2, r, plain, rac, rel} {
		if o.Constitution != s.Constitution {
			t.Errorf("%s: constitution %q, want %q", o.Title, o.Constitution, s.Constitution)
		}
	}
	for _, o := range []keysRecordJSON{plain, rac, rel} {
		if o.Stereo == s.Stereo || o.Stereo == r.Stereo {
			t.Errorf("%s shares a stereo key with one enantiomer", o.Title)
		}
	}
	if cis.Stereo != cis.Mirror || cis.Constitution == s.Constitution {
		t.Errorf("cis-1,4-dimethylcyclohexane: %+v", cis)
	}
	for _, c := range []struct {
		k    keysRecordJSON
		want string
	}{{s, "absolute"}, {plain, "none"}, {rac, "racemic"}, {rel, "relative"}, {bad, ""}} {
		if c.k.Group != c.want {
			t.Errorf("%s: group %q, want %q", c.k.Title, c.k.Group, c.want)
		}
	}
	if bad.Stereo != "" || bad.Constitution != "" {
		t.Errorf("a record that does not read has no keys: %+v", bad)
	}

	// TSV: a header, then the same fields.
	tsv, _, _ := runKeys(t, list, "--format", "tsv")
	lines := strings.Split(strings.TrimSuffix(tsv, "\n"), "\n")
	if len(lines) != 9 || lines[0] != strings.Join(keysColumns, "\t") {
		t.Fatalf("TSV: %q", tsv)
	}
	if f := strings.Split(lines[1], "\t"); len(f) != len(keysColumns) || f[5] != s.Stereo || f[3] != "s" {
		t.Errorf("TSV row 1: %q", lines[1])
	}
}

// TestKeysSkipsAndLimits: a binary file and a file over the limit give no
// keys and a note; the limit comes from the flag or the maxFileSize
// setting of the configuration file.
func TestKeysSkipsAndLimits(t *testing.T) {
	dir := t.TempDir()
	write := func(name, text string) string {
		p := filepath.Join(dir, name)
		if err := os.WriteFile(p, []byte(text), 0o644); err != nil {
			t.Fatal(err)
		}
		return p
	}
	bin := write("bin.smi", "CCO\x00\x01\x02\n")
	big := write("big.smi", strings.Repeat("C[C@H](O)CC\n", 200))
	stdout, stderr, _ := runKeys(t, "", bin, big)
	if len(parseKeys(t, stdout)) != 200 || !strings.Contains(stderr, "bin.smi: skipped: binary file") {
		t.Errorf("binary file: stdout %d lines, stderr %q", strings.Count(stdout, "\n"), stderr)
	}
	stdout, stderr, _ = runKeys(t, "", "--max-size", "1kB", big)
	if stdout != "" || !strings.Contains(stderr, "big.smi: skipped: larger than the largest file scanned, 1000 bytes") {
		t.Errorf("--max-size 1kB: stdout %q, stderr %q", stdout, stderr)
	}
	write(".stereoline.json", `{"maxFileSize": "2kB"}`)
	stdout, stderr, _ = runKeys(t, "", big)
	if stdout != "" || !strings.Contains(stderr, "2000 bytes") {
		t.Errorf("maxFileSize 2kB: stdout %q, stderr %q", stdout, stderr)
	}
	stdout, _, _ = runKeys(t, "", "--max-size", "1MB", big)
	if len(parseKeys(t, stdout)) != 200 {
		t.Errorf("--max-size wins over the setting: %d records", len(parseKeys(t, stdout)))
	}
	write(".stereoline.json", `{"maxFileSize": "lots"}`)
	if _, stderr, status := runKeys(t, "", big); status != 2 || !strings.Contains(stderr, "maxFileSize") {
		t.Errorf("a bad maxFileSize: status %d, %q", status, stderr)
	}
}

// TestCheckSkipsBinaryFormats: a gzip stream and a PNG image (written by
// the standard library's encoders, to their published formats) and a
// copy of an executable named as lists are skipped as binary with a
// note, not read as a stream of false errors.
func TestCheckSkipsBinaryFormats(t *testing.T) {
	dir := t.TempDir()
	var gz bytes.Buffer
	zw := gzip.NewWriter(&gz)
	zw.Write([]byte(strings.Repeat("C[C@H](O)CC\n", 1000)))
	zw.Close()
	var pic bytes.Buffer
	img := image.NewGray(image.Rect(0, 0, 64, 64))
	if err := png.Encode(&pic, img); err != nil {
		t.Fatal(err)
	}
	files := map[string][]byte{"list.smi.gz.smi": gz.Bytes(), "image.smi": pic.Bytes()}
	if b, err := os.ReadFile("/usr/bin/ls"); err == nil {
		files["program.smi"] = b
	}
	var paths []string
	for name, b := range files {
		p := filepath.Join(dir, name)
		if err := os.WriteFile(p, b, 0o644); err != nil {
			t.Fatal(err)
		}
		paths = append(paths, p)
	}
	stdout, stderr, status := runCheck(t, "", paths...)
	if status != 0 || stdout != "" {
		t.Errorf("status %d, findings %q; want 0 and none", status, stdout)
	}
	for name := range files {
		if !strings.Contains(stderr, name+": skipped: binary file") {
			t.Errorf("no note for %s: %s", name, stderr)
		}
	}
}

// TestKeysFields checks that keys gives each record the field check
// relates it within: the column of a table, 0 in a list. The table is
// our own; its molecules (alanine, from memory) are facts.
func TestKeysFields(t *testing.T) {
	dir := t.TempDir()
	table := filepath.Join(dir, "t.csv")
	list := filepath.Join(dir, "l.smi")
	if err := os.WriteFile(table, []byte("id,a_smiles,b_smiles\n1,C[C@H](N)C(=O)O,C[C@@H](N)C(=O)O\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(list, []byte("C[C@H](N)C(=O)O\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	var out, errb bytes.Buffer
	if status := run([]string{"keys", table, list}, strings.NewReader(""), &out, &errb); status != 0 {
		t.Fatalf("status %d: %s", status, errb.String())
	}
	var fields []uint32
	for _, line := range strings.Split(strings.TrimSpace(out.String()), "\n") {
		var k keysRecordJSON
		if err := json.Unmarshal([]byte(line), &k); err != nil {
			t.Fatal(err)
		}
		fields = append(fields, k.Field)
	}
	if !slices.Equal(fields, []uint32{2, 3, 0}) {
		t.Errorf("fields %v, want [2 3 0] (the table's second and third columns, then the list)", fields)
	}
}

package main

import (
	"bytes"
	"encoding/json"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"
)

// TestDescribeJSON checks the describe --json fields on facts of the
// trade: L-alanine is (S) with formula C3H7NO2 (common practice); an SN2
// displacement at a stereocentre inverts it (common practice: Walden
// inversion), here (R)-2-bromobutane to (S)-butan-2-ol with the hydroxide
// written where the bromide was.
func TestDescribeJSON(t *testing.T) {
	in := "N[C@@H](C)C(=O)O L-alanine\n" +
		"[CH3:1][C@@H:2]([Br:3])[CH2:4][CH3:5].[OH-:6]>>[CH3:1][C@H:2]([OH:6])[CH2:4][CH3:5].[Br-:3] SN2\n" +
		"C1CC broken\n"
	var out, errb bytes.Buffer
	if status := run([]string{"describe", "--json"}, strings.NewReader(in), &out, &errb); status != 0 {
		t.Fatalf("status %d: %s", status, errb.String())
	}
	lines := strings.Split(strings.TrimSpace(out.String()), "\n")
	if len(lines) != 3 {
		t.Fatalf("%d records, want 3:\n%s", len(lines), out.String())
	}
	var recs []map[string]any
	for _, l := range lines {
		var r map[string]any
		if err := json.Unmarshal([]byte(l), &r); err != nil {
			t.Fatalf("%v: %s", err, l)
		}
		recs = append(recs, r)
	}
	ala := recs[0]
	if ala["name"] != "L-alanine" || ala["formula"] != "C3H7NO2" {
		t.Errorf("alanine: name %v formula %v", ala["name"], ala["formula"])
	}
	atoms := ala["atoms"].([]any)
	c2 := atoms[1].(map[string]any)
	if c2["symbol"] != "C" || c2["hydrogens"] != 1.0 || c2["span"].([]any)[0] != 1.0 || c2["span"].([]any)[1] != 7.0 {
		t.Errorf("atom 2 = %v", c2)
	}
	units := ala["stereo"].([]any)
	if len(units) != 1 || units[0].(map[string]any)["cip"] != "S" || units[0].(map[string]any)["kind"] != "tetrahedral" {
		t.Errorf("alanine stereo = %v", units)
	}
	rx := recs[1]["reaction"].(map[string]any)["centers"].([]any)
	if len(rx) != 1 || rx[0].(map[string]any)["change"] != "inversion" || rx[0].(map[string]any)["map"] != 2.0 {
		t.Errorf("reaction centres = %v", rx)
	}
	diags := recs[2]["diagnostics"].([]any)
	if len(diags) == 0 || diags[0].(map[string]any)["code"] != "unclosed-ring" {
		t.Errorf("broken record diagnostics = %v", diags)
	}
}

// TestDescribeReading: --lone-pair chooses the reading of a lone-pair
// centre written first (testdata/survey): methyl phenyl sulfoxide
// written from its sulfur is (R) as RDKit 2022.09.3 labels it (the
// default) and (S) with the lone pair in the hydrogen's slot.
func TestDescribeReading(t *testing.T) {
	for _, c := range []struct {
		args []string
		want string
	}{
		{nil, "R"},
		{[]string{"--lone-pair", "hydrogen-slot"}, "S"},
		{[]string{"--lone-pair", "last"}, "R"},
	} {
		var out, errb bytes.Buffer
		args := append([]string{"describe", "--json"}, c.args...)
		if status := run(args, strings.NewReader("[S@](=O)(C)c1ccccc1\n"), &out, &errb); status != 0 {
			t.Fatalf("%v: status %d: %s", args, status, errb.String())
		}
		var r struct {
			Stereo []struct {
				CIP string `json:"cip"`
			} `json:"stereo"`
		}
		if err := json.Unmarshal(out.Bytes(), &r); err != nil || len(r.Stereo) != 1 || r.Stereo[0].CIP != c.want {
			t.Errorf("%v: %s (%v), want one unit labelled %s", args, out.String(), err, c.want)
		}
	}
	var out, errb bytes.Buffer
	if status := run([]string{"describe", "--lone-pair", "first"}, strings.NewReader("CCO\n"), &out, &errb); status != 2 {
		t.Errorf("a bad --lone-pair: status %d, want 2", status)
	}
}

// TestDescribeHostFiles checks that describe reads the notation check
// finds in a file of a host kind (a table, code, JSON Lines) rather than
// its lines, with titles from the host, and still reads a list line by
// line. The molecules (alanine, from memory) are facts; the files are
// our own.
func TestDescribeHostFiles(t *testing.T) {
	dir := t.TempDir()
	files := map[string]string{
		"t.csv":   "id,smiles,name\n1,C[C@H](N)C(=O)O,L-ala\n2,F/C=C/F,E\n",
		"s.py":    "from rdkit import Chem\nm = Chem.MolFromSmiles(\"C[C@@H](N)C(=O)O\")\nx = 'not notation'\n",
		"d.jsonl": "{\"smiles\": \"C[C@H](N)C(=O)O\", \"name\": \"L-ala\"}\n",
		"l.smi":   "C[C@H](N)C(=O)O L-ala\n# a comment\nF/C=C/F\n",
	}
	want := map[string][]string{
		"t.csv":   {"C[C@H](N)C(=O)O L-ala", "F/C=C/F E"},
		"s.py":    {"C[C@@H](N)C(=O)O "},
		"d.jsonl": {"C[C@H](N)C(=O)O L-ala"},
		"l.smi":   {"C[C@H](N)C(=O)O L-ala", "F/C=C/F "},
	}
	for name, text := range files {
		path := filepath.Join(dir, name)
		if err := os.WriteFile(path, []byte(text), 0o644); err != nil {
			t.Fatal(err)
		}
		var out, errb bytes.Buffer
		if status := run([]string{"describe", "--json", path}, strings.NewReader(""), &out, &errb); status != 0 {
			t.Fatalf("%s: status %d: %s", name, status, errb.String())
		}
		var got []string
		for _, line := range strings.Split(strings.TrimSpace(out.String()), "\n") {
			var d struct{ Input, Name string }
			if err := json.Unmarshal([]byte(line), &d); err != nil {
				t.Fatalf("%s: %v in %q", name, err, line)
			}
			got = append(got, d.Input+" "+d.Name)
		}
		if !slices.Equal(got, want[name]) {
			t.Errorf("%s: described %q, want %q", name, got, want[name])
		}
	}
}

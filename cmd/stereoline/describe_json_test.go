package main

import (
	"bytes"
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"stereoline/notation"
)

// TestDescribeJSONMatchesMarshal checks the hand-written encoder against
// encoding/json on every line of the demo and the finder's corpus and on
// records with isotopes, charges, maps, reaction roles, ring bonds,
// direction marks and titles that need escaping.
func TestDescribeJSONMatchesMarshal(t *testing.T) {
	lines := []string{
		"[13CH3][C@@H]([NH3+])C(=O)[O-] <alanine> & \"quoted\" \\ é\ttab",
		"[CH3:1][C@H:2](Cl)Br>>[CH3:1][C@@H:2](Br)Cl",
		"F/C=C/C1CC[C@]2(CC1)OCC2 |&1:7|",
		"c1ccccc1\u2028",
		"",
	}
	for _, pat := range []string{"../../examples/*", "../../notation/find/testdata/corpus/*.smi"} {
		files, _ := filepath.Glob(pat)
		for _, f := range files {
			data, err := os.ReadFile(f)
			if err != nil {
				t.Fatal(err)
			}
			lines = append(lines, strings.Split(string(data), "\n")...)
		}
	}
	if len(lines) < 50 {
		t.Fatalf("only %d lines to test", len(lines))
	}
	for _, line := range lines {
		d := describeRecord(notation.SplitRecord(line), notation.Reading{})
		want, err := json.Marshal(d)
		if err != nil {
			t.Fatal(err)
		}
		got, err := appendRecordJSON(nil, &d)
		if err != nil {
			t.Fatal(err)
		}
		if !bytes.Equal(got, want) {
			t.Errorf("%q:\n got %s\nwant %s", line, got, want)
		}
	}
}

// TestFloatJSONMatchesMarshal checks the float writer of the record's
// masses against encoding/json on both sides of its exponent bounds.
func TestFloatJSONMatchesMarshal(t *testing.T) {
	for _, f := range []float64{0, 1, -0.5, 12.0107, 180.1574, 1e-6, 9.99e-7, 1e-7, -3e-9, 1e20, 999999999999999999999, 1e21, 2.5e300} {
		want, err := json.Marshal(f)
		if err != nil {
			t.Fatal(err)
		}
		got, err := appendFloatJSON(nil, f)
		if err != nil || !bytes.Equal(got, want) {
			t.Errorf("%g: got %s (%v), want %s", f, got, err, want)
		}
	}
}

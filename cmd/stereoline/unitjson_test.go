package main

import (
	"strings"
	"testing"

	"stereoline/notation"
	"stereoline/stereo"
)

// TestJSON checks the units form (unitjson.go) on L-alanine.
func TestJSON(t *testing.T) {
	a := stereo.Analyze(notation.Read("N[C@@H](C)C(=O)O"))
	b, err := analysisJSON(a)
	if err != nil {
		t.Fatal(err)
	}
	// ranks of L-alanine: N > COOH > CH3 > H (Rule 1a, common practice)
	want := `[{"kind":"tetrahedral","atoms":[2],"specified":true,"cip":"S","ranked":[{"rank":1,"atom":1},{"rank":2,"atom":4},{"rank":3,"atom":3},{"rank":4,"implicit":"hydrogen"}],"decisions":[{"higher":1,"lower":2,"rule":"1a","sphere":1},{"higher":2,"lower":3,"rule":"1a","sphere":2},{"higher":3,"lower":4,"rule":"1a","sphere":1}]}]`
	if string(b) != want {
		t.Errorf("got  %s\nwant %s", b, want)
	}
}

// TestUnspecifiedRankedJSON: an unmarked stereocentre (butan-2-ol)
// renders no cip field (the analysis itself is checked by
// TestUnspecifiedRanked in stereo/facts_test.go).
func TestUnspecifiedRankedJSON(t *testing.T) {
	a := stereo.Analyze(notation.Read("CC(O)CC"))
	b, _ := analysisJSON(a)
	if strings.Contains(string(b), `"cip"`) {
		t.Errorf("unspecified unit renders a cip field: %s", b)
	}
}

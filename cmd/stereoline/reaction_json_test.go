package main

import (
	"encoding/json"
	"strings"
	"testing"

	"stereoline/notation"
	"stereoline/stereo/reaction"
)

func TestReactionJSON(t *testing.T) {
	res := reaction.Analyze(notation.Read("[CH3:1][C@H:2]([OH:3])[CH2:4][CH3:5]>>[CH3:1][C:2](=[O:3])[CH2:4][CH3:5]"))
	b, err := json.Marshal(reactionToJSON(res))
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(string(b), `"centers":[{"map":2,"change":"lost"`) {
		t.Errorf("JSON %s", b)
	}
}

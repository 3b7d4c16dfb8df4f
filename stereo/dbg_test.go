package stereo

import (
	"os"
	"testing"

	"stereoline/notation"
)

func TestDebugOne(t *testing.T) {
	smi := os.Getenv("SMI")
	if smi == "" {
		t.Skip()
	}
	a := Analyze(notation.Read(smi))
	for _, u := range a.Units {
		t.Logf("%v %v %v spec=%v ranked=%v dec=%v", u.Kind, u.Atoms, u.Descriptor, u.Specified, u.Ranked, u.Decisions)
	}
	for _, e := range a.Diagnostics {
		t.Logf("%v", e)
	}
}

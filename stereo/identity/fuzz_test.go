package identity

import (
	"fmt"
	"reflect"
	"strings"
	"testing"

	"stereoline/notation"
	"stereoline/stereo"
)

// FuzzSharedConstitution checks the work shared between consecutive
// molecules of one constitution (stereo/internal/skeleton): a text read
// after its mirror images (every @ and @@ swapped, every / and \
// swapped) and after a writing with one carbon made nitrogen, each read
// into one Rereader's storage, must get the identity keys Identify gives
// it alone and the stereo analysis it gets after an unrelated molecule.
func FuzzSharedConstitution(f *testing.F) {
	for _, s := range []string{"N[C@@H](C)C(=O)O", "F/C=C/F", "C[C@H]1CC[C@@H](C)CC1", "CC=[C@]=CC",
		"C[C@H](O)[C@@H](C)Cl |o1:1,3|", "[H][C@@]([H])(F)Cl", "C/1=C/CCCCCCCC/1", "OC[C@H]1OC(O)[C@H](O)[C@@H](O)[C@@H]1O",
		"c1cc[nH]c1[C@H](F)Cl", "C1=CC=CC=C1[C@@H](N)C"} {
		f.Add(s)
	}
	swap := strings.NewReplacer("@@", "@", "@", "@@")
	turn := strings.NewReplacer("/", "\\", "\\", "/")
	describe := func(a *stereo.Analysis) string { return fmt.Sprintf("%v|%v", a.Units, a.Diagnostics) }
	f.Fuzz(func(t *testing.T, s string) {
		if len(s) > 200 {
			return
		}
		var x Identifier
		var rr notation.Rereader
		stereo.Analyze(notation.Read("CC(C)(F)Cl"))
		want := Identify(notation.Read(s))
		wantStereo := describe(stereo.Analyze(notation.Read(s)))
		for _, before := range []string{swap.Replace(s), turn.Replace(s), swap.Replace(turn.Replace(s)), strings.Replace(s, "C", "N", 1)} {
			x.Identify(rr.ReadWith(before, notation.Reading{}))
			if got := x.Identify(rr.ReadWith(s, notation.Reading{})); !reflect.DeepEqual(got, want) {
				t.Fatalf("%q after %q: keys %+v, alone %+v", s, before, got, want)
			}
			stereo.Analyze(notation.Read(before))
			if got := describe(stereo.Analyze(notation.Read(s))); got != wantStereo {
				t.Fatalf("%q after %q: analysis %s, alone %s", s, before, got, wantStereo)
			}
		}
	})
}

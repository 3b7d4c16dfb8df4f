package transform

import (
	"errors"
	"slices"
	"strings"
	"testing"

	"stereoline/notation"
	"stereoline/stereo"
)

// TestPortable rewrites records whose marks the readers surveyed in
// testdata/survey read differently, under each reading, and checks the
// result: the text expected (worked out from the writer's rules: start at
// the centre's lowest-numbered neighbour, every bond of the centre a
// chain or branch bond; for a ring closure marked the same at both
// digits, the mark the reading uses kept at the opening digit), no mark
// left that the readings read differently, and the label each reading
// gave the original kept under every reading. The libraries' own reading
// of such rewrites is checked in stereo/readings (TestPortableRewrites).
func TestPortable(t *testing.T) {
	slot := notation.Reading{LonePair: notation.LonePairHydrogenSlot, RingMarks: notation.RingMarksDropped}
	tests := []struct {
		name    string
		in      string
		reading notation.Reading
		want    string
	}{
		// methyl phenyl sulfoxide written from the sulfur: (R) by
		// default, as RDKit 2022.09.3 labels it; (S) with the lone pair
		// in the hydrogen's slot, as Open Babel reads it
		{"sulfoxide first, default", "[S@](=O)(C)c1ccccc1", notation.DefaultReading, "O=[S@](C)c1ccccc1"},
		{"sulfoxide first, hydrogen slot", "[S@](=O)(C)c1ccccc1", slot, "O=[S@@](C)c1ccccc1"},
		{"aziridine nitrogen with a ring digit", "C[N@]1CC1C", notation.DefaultReading, "C[N@](C1)C1C"},
		{"a title-free dotted record", "CC.[P@](CC)(C)c1ccccc1", notation.DefaultReading, "CC.C([P@](C)c1ccccc1)C"},
		{"extension block renumbered", "[S@](=O)(C)c1ccccc1 |&1:0|", notation.DefaultReading, "O=[S@](C)c1ccccc1 |&1:1|"},
		{"same mark on both ring digits, closing decides", "C/1=C/CCCCCCCC/1", notation.DefaultReading, `C\1=C/CCCCCCCC1`},
		{"same mark on both ring digits, dropped", "C/1=C/CCCCCCCC/1", slot, "C1=C/CCCCCCCC1"},
		{"nothing open: no edits", "C[S@](=O)c1ccccc1", notation.DefaultReading, "C[S@](=O)c1ccccc1"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			m := notation.ReadWith(tc.in, tc.reading)
			tr, err := Portable(m)
			if err != nil {
				t.Fatalf("%s: %v", tc.in, err)
			}
			got := apply(t, tc.in, tr)
			if got != tc.want {
				t.Errorf("Portable(%s) under %s = %s, want %s", tc.in, tc.reading, got, tc.want)
			}
			want := labels(stereo.Analyze(m))
			for _, r := range notation.Readings() {
				back := notation.ReadWith(got, r)
				if l := labels(stereo.Analyze(back)); l != want {
					t.Errorf("%s read with %s: labels %q, want %q (the original's under %s)", got, r, l, want, tc.reading)
				}
				for _, o := range stereo.OpenMarks(back) {
					t.Errorf("%s read with %s: still open: %+v", got, r, o)
				}
			}
		})
	}
}

// labels is the multiset of CIP labels of an analysis, as letters.
func labels(a *stereo.Analysis) string {
	var out []string
	for _, u := range a.Units {
		if u.Descriptor.Labelled() {
			out = append(out, u.Descriptor.String())
		}
	}
	slices.Sort(out)
	return strings.Join(out, " ")
}

// TestPortableRefuses: a ring of three lone-pair centres (a
// triaziridine) has no writing that every reading reads alike, so the
// rewrite is refused with transform-unverified rather than written; an
// allene mark has no portable writing at all and is noted.
func TestPortableRefuses(t *testing.T) {
	_, err := Portable(notation.Read("C[N@]1[N@](C)[N@@]1C"))
	var e *notation.Error
	if !errors.As(err, &e) || e.Code != CodeNotVerified {
		t.Errorf("triaziridine: error %v, want %s", err, CodeNotVerified)
	}
	tr, err := Portable(notation.Read("CC=[C@]=CC"))
	if err != nil || len(tr.Edits) != 0 || len(tr.Notes) != 1 {
		t.Errorf("allene: %+v, %v; want no edits and one note", tr, err)
	}
}

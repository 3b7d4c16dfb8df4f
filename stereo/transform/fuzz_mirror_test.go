package transform

import (
	"regexp"
	"strings"
	"testing"

	"stereoline/notation"
	"stereoline/stereo/identity"
)

// FuzzMirror checks that mirroring twice is the identity on any record
// that reads without error, under any reading of the marks: the first
// mirror's edits apply and give a record that reads without error, whose
// identity key is the original's mirror key; the second mirror's edits
// apply and give back the original text and key. Inverting a unit twice
// gives back the text too, when the first inversion made a structure
// that can exist and the unit is still one. The corpus lives in testdata/fuzz/FuzzMirror.
func FuzzMirror(f *testing.F) {
	for _, s := range []string{
		"N[C@@H](C)C(=O)O", "F/C=C/F", "CC=[C@]=CC", "C[C@H]1CC[C@@H](C)CC1", "c1ccccc1[C@@H](O)C",
		"[CH3:1][C@@H:2]([Br:3])[CH2:4][CH3:5].[OH-:6]>>[CH3:1][C@H:2]([OH:6])[CH2:4][CH3:5].[Br-:3]",
		"[H][C@@]([H])(F)Cl", "S[As@TB1](F)(Cl)(Br)N", "C[Co@OH25](F)(Cl)(Br)(I)N", "[Pt@SP1](F)(Cl)(Br)I",
		"[S@](=O)(C)c1ccccc1", "C[N@]1[N@](C)[N@@]1C", "C1[N@@]2C[N@@]3C[N@]1C[N@H+](C2)C3",
		"C[C@H](O)[C@@H](C)Cl |o1:1,3|", "C[C@H](O)CC |&1:1,a:3|", "C[C@H](O)CC.C[C@H](N)CC |o1:1,6,&1:3|",
		"O[C@H]1CCCC[C@H]1O", "C[C@@]12CC[C@H](C1)C2", "[C@@H]1(F)CC1", "C[C@H](F)[C@H](F)C", "O[C@@H]1[C@H](O)[C@@H](O)[C@H](O)[C@@H](O)[C@H]1O",
	} {
		f.Add(s, uint8(0))
	}
	readings := notation.Readings()
	f.Fuzz(func(t *testing.T, s string, which uint8) {
		if len(s) > 300 {
			return
		}
		r := readings[int(which)%len(readings)]
		m := notation.ReadWith(s, r)
		if m.Errors.HasErrors() {
			// Mirror must still return, and its edits apply.
			if tr, err := Mirror(m); err == nil {
				if _, err := notation.ApplyEdits(s, tr.Edits); err != nil {
					t.Fatalf("mirror edits of %q do not apply: %v", s, err)
				}
			}
			return
		}
		tr, err := Mirror(m)
		if err != nil {
			t.Fatalf("mirror of %q, which reads: %v", s, err)
		}
		once, err := notation.ApplyEdits(s, tr.Edits)
		if err != nil {
			t.Fatalf("mirror edits of %q do not apply: %v", s, err)
		}
		m1 := notation.ReadWith(once, r)
		if m1.Errors.HasErrors() {
			t.Fatalf("mirror of %q is %q, which does not read: %v", s, once, m1.Errors)
		}
		id, id1 := identity.Identify(m), identity.Identify(m1)
		leftAlone := strings.Contains(strings.Join(tr.Notes, " "), "left as written")
		if !leftAlone && id1.Key != id.MirrorKey {
			t.Fatalf("mirror of %q is %q with key %s, want the mirror key %s", s, once, id1.Key, id.MirrorKey)
		}
		tr2, err := Mirror(m1)
		if err != nil {
			t.Fatalf("mirror of %q (the mirror of %q): %v", once, s, err)
		}
		back, err := notation.ApplyEdits(once, tr2.Edits)
		if err != nil {
			t.Fatalf("mirror edits of %q do not apply: %v", once, err)
		}
		// The text comes back as written, but for a permutation number
		// written with a leading zero ("@OH07"), which the rewrite
		// writes without: 07 becomes 17 becomes 7, the same mark.
		if back != s && (noLeadingZero(back) != noLeadingZero(s) || identity.Identify(notation.ReadWith(back, r)).Key != id.Key) {
			t.Fatalf("mirror twice of %q gave %q (through %q)", s, back, once)
		}
		for a := 0; a < len(m.Atoms) && a < 6; a++ {
			inv, err := Invert(m, a)
			if err != nil {
				continue
			}
			text, err := notation.ApplyEdits(s, inv.Edits)
			if err != nil {
				t.Fatalf("invert atom %d of %q: edits do not apply: %v", a+1, s, err)
			}
			if len(inv.Notes) > 0 {
				// the result cannot exist (a bridgehead of a small
				// cage): it need not invert back
				continue
			}
			inv2, err := Invert(notation.ReadWith(text, r), a)
			if err != nil {
				// In a cage the unit's own configuration can decide
				// whether its ligands differ; the inverted centre may
				// then be no unit.
				continue
			}
			if again, err := notation.ApplyEdits(text, inv2.Edits); err != nil || again != s {
				t.Fatalf("invert atom %d twice of %q gave %q (%v) through %q", a+1, s, again, err, text)
			}
		}
	})
}

// leadingZero matches a permutation number written with a leading zero.
var leadingZero = regexp.MustCompile(`(@(?:TH|AL|SP|TB|OH))0([0-9])`)

// noLeadingZero writes every permutation number without a leading zero.
func noLeadingZero(s string) string { return leadingZero.ReplaceAllString(s, "$1$2") }

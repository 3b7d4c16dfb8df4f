package transform

import (
	"testing"

	"stereoline/notation"
	"stereoline/stereo"
	"stereoline/stereo/identity"
	"stereoline/stereo/reaction"
)

// FuzzIdentityAndTransforms: on any text the reader accepts or not, the
// key, the relations, the reaction check and every transform must return
// without panicking, the transforms with edits that apply, and the key
// text must survive mirroring twice.
func FuzzIdentityAndTransforms(f *testing.F) {
	for _, s := range []string{"N[C@@H](C)C(=O)O", "F/C=C/F", "C/C=C/C=C/C", "CC=[C@]=CC", "C[C@H]1CC[C@@H](C)CC1",
		"[CH3:1][C@@H:2]([Br:3])[CH2:4][CH3:5].[OH-:6]>>[CH3:1][C@H:2]([OH:6])[CH2:4][CH3:5].[Br-:3]", "c1ccccc1", "C1=CC=CC=C1",
		"F/C=C/1.Cl1", "[C@@]", "C(/F)=C/=C", "[H][C@@]([H])(F)Cl", "S[As@TB1](F)(Cl)(Br)N", "C1CC/C=C/CC1",
		"[S@](=O)(C)c1ccccc1", "C/1=C/CCCCCCCC/1", "C[N@]1[N@](C)[N@@]1C", "C1[N@@]2C[N@@]3C[N@]1C[N@H+](C2)C3"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		if len(s) > 200 {
			return
		}
		m := notation.Read(s)
		id := identity.Identify(m)
		x := identity.NewIndex()
		x.Add(id)
		x.Add(id)
		identity.Compare(m, m)
		reaction.Analyze(m)
		identity.Stereoisomers(m)
		tr, err := Mirror(m)
		// mirroring twice must return the text when the reader found no
		// error (in broken text, "@@O" inverted to "@O" lexes as a class)
		if err == nil && !m.Errors.HasErrors() {
			out, err := notation.ApplyEdits(s, tr.Edits)
			if err != nil {
				t.Fatalf("mirror edits of %q do not apply: %v", s, err)
			}
			m2 := notation.Read(out)
			tr2, err := Mirror(m2)
			if err == nil {
				back, err := notation.ApplyEdits(out, tr2.Edits)
				if err == nil && back != s {
					t.Fatalf("mirror twice of %q gave %q", s, back)
				}
			}
		}
		for a := 0; a < len(m.Atoms) && a < 8; a++ {
			for _, fn := range []func() (Transform, error){
				func() (Transform, error) { return Invert(m, a) },
				func() (Transform, error) { return SetDescriptor(m, a, stereo.DescR) },
				func() (Transform, error) { return SetDescriptor(m, a, stereo.DescZ) },
				func() (Transform, error) { return Flip(m, a, a+1) },
			} {
				if tr, err := fn(); err == nil {
					if _, err := notation.ApplyEdits(s, tr.Edits); err != nil {
						t.Fatalf("edits on %q do not apply: %v", s, err)
					}
				}
			}
		}
		Clean(m)
		CompleteOneSided(m)
		// the portable rewrite, under every reading: when it is made,
		// it reads under every reading as the record under its own
		// (Portable checks that itself and refuses otherwise)
		for _, r := range notation.Readings() {
			mr := notation.ReadWith(s, r)
			if tr, err := Portable(mr); err == nil {
				if _, err := notation.ApplyEdits(s, tr.Edits); err != nil {
					t.Fatalf("portable edits on %q do not apply: %v", s, err)
				}
			}
		}
	})
}

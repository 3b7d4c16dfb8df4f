package transform

import (
	"strings"
	"testing"

	"stereoline/notation"
	"stereoline/stereo"
)

// TestTransformsKeepTheBlock: the transforms edit marks of the notation
// only; a CXSMILES extension block after it (here an absolute group,
// coordinates and labels, which mean the same in the mirror image) is
// left byte for byte. What transforms do with or- and and-groups is decided
// by the stereo layer, not here.
func TestTransformsKeepTheBlock(t *testing.T) {
	const block = " |(0,0,;1,0,;1,1,;2,0,;2,-1,;3,0,),$;lbl1;;;;$,a:1,3|"
	const in = "C[C@H](O)[C@@H](C)Cl" + block
	tests := []struct {
		name string
		do   func(m *notation.Molecule) (Transform, error)
		want string
	}{
		{"mirror", Mirror, "C[C@@H](O)[C@H](C)Cl" + block},
		{"invert one centre", func(m *notation.Molecule) (Transform, error) { return Invert(m, 1) }, "C[C@@H](O)[C@@H](C)Cl" + block},
		{"set a descriptor", func(m *notation.Molecule) (Transform, error) { return SetDescriptor(m, 3, stereo.DescS) }, "C[C@H](O)[C@H](C)Cl" + block},
	}
	for _, tt := range tests {
		m := notation.Read(in)
		if m.Errors.HasErrors() {
			t.Fatal(m.Errors)
		}
		tr, err := tt.do(m)
		if err != nil {
			t.Errorf("%s: %v", tt.name, err)
			continue
		}
		got := apply(t, in, tr)
		if got != tt.want || !strings.HasSuffix(got, block) {
			t.Errorf("%s: %q became %q, want %q", tt.name, in, got, tt.want)
		}
	}
}

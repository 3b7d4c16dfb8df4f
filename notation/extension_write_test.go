package notation

import (
	"math/rand/v2"
	"slices"
	"testing"
)

// TestExtensionWriteBack checks writings of records with blocks, the
// expected texts worked out by hand: the writer's order (atoms from the
// start atom, neighbours in the order of their numbers) gives the new
// index of every atom, and each field follows its atoms.
func TestExtensionWriteBack(t *testing.T) {
	tests := []struct {
		why     string
		have    string
		start   int
		want    string
		dropped []int
	}{
		{"unchanged order: copied", "C[C@H](O)CC |&1:1|", 0, "C[C@H](O)CC |&1:1|", nil},
		{"unchanged order keeps the separator and every field", "C[C@H](O)CC\t|w:1.0,xyz:1,&1:1|", 0, "C[C@H](O)CC\t|w:1.0,xyz:1,&1:1|", nil},
		{"unchanged order keeps a block never closed", "CC |a:0", 0, "CC |a:0", nil},
		// order 4 3 1 0 2: the centre moves from 1 to 2
		{"from the last atom: the group follows its centre", "C[C@H](O)CC |&1:1|", 4, "CC[C@H](C)O |&1:2|", nil},
		{"coordinates are permuted with their atoms", "CCO |(0,0,;1,0,;2,0,)|", 2, "OCC |(2,0,;1,0,;0,0,)|", nil},
		{"labels and values too", "CCO |$a;;c$,$_AV:x;y;$|", 2, "OCC |$c;;a$,$_AV:;y;x$|", nil},
		{"missing labels are written empty", "CCO |$a$|", 2, "OCC |$;;a$|", nil},
		{"atom references of other fields are renumbered", "CCO |^1:0,atomProp:2.p.v,SgD:1:note:LRK-001::::|", 2, "OCC |^1:2,atomProp:0.p.v,SgD:1:note:LRK-001::::|", nil},
		{"link nodes and their outer atoms", "C1CC(O)CC1 |LN:1:1.3.0.2|", 3, "OC1CCCC1 |LN:2:1.3.3.1|", nil},
		// order 3 1 0 2: bonds are numbered differently by the libraries,
		// so a field that counts bonds cannot follow them
		{"wavy bond dropped when atoms move", "CC(C)O |w:1.0,a:1|", 3, "OC(C)C |a:1|", []int{0}},
		{"unknown field dropped when atoms move", "CC(C)O |xyz:1,a:1|", 3, "OC(C)C |a:1|", []int{0}},
		{"nothing left: no block", "CC(C)O |w:1.0|", 3, "OC(C)C", []int{0}},
		{"incomplete coordinates dropped when atoms move", "CCO |(0,0,;1,0,)|", 2, "OCC", []int{0}},
		{"flags kept", "C[C@H](O)CC |o1:1,r|", 4, "CC[C@H](C)O |o1:2,r|", nil},
		{"a block never closed is written closed", "CC(C)O |a:1", 3, "OC(C)C |a:1|", nil},
		{"a group with no atom in the record is left out", "CC(C)O |o1:7,a:1,1|", 3, "OC(C)C |a:1|", []int{0}},
	}
	for _, tt := range tests {
		m := Read(tt.have)
		w := Write(m, WriteOptions{Start: tt.start})
		if w.Text != tt.want || !slices.Equal(w.DroppedFields, tt.dropped) {
			t.Errorf("%s: Write(%q, start %d) = %q dropped %v, want %q %v", tt.why, tt.have, tt.start, w.Text, w.DroppedFields, tt.want, tt.dropped)
		}
	}
}

// TestExtensionRandomWritings writes records with blocks from random
// starts with random choices and reads them back: every field says the
// same of the same atoms (see checkRenumbered).
func TestExtensionRandomWritings(t *testing.T) {
	records := []string{
		"C[C@H](O)[C@@H](C)[C@H](F)Cl |(0,0,;1,0,;1,1,;2,0,;2,-1,;3,0,;3,1,;4,0,),$lbl0;;;;;;;$,a:1,o1:3,&1:5|",
		"C[C@H](O)CC>>C[C@@H](O)CC |o1:1,o2:6|",
		"C[C@H](O)CC.[Na+].[Cl-] |&1:1,f:1.2|",
		"*CC(*)C |$star_e;;;star_e;$,Sg:n:1,2:n:ht:::|",
		"C1CC(C)CC1 |LN:1:1.3.0.2,^1:3|",
		"O[C@H]1CC[C@@H](CC1)C(=O)O |&1:1,4,SgD:7:pKa:4.5::::,atomProp:0.tag.LRK-BB-001|",
	}
	rng := rand.New(rand.NewPCG(7, 16))
	for _, s := range records {
		m := Read(s)
		if m.Errors.HasErrors() {
			t.Fatalf("%q: %v", s, m.Errors)
		}
		for k := 0; k < 50; k++ {
			w := Write(m, WriteOptions{Random: rng, Start: rng.IntN(len(m.Atoms)), Kekule: k%2 == 1})
			checkRenumbered(t, s, m, w)
		}
	}
}

// TestGroupEdits checks the minimal edits of stereo groups: the text
// after the edit, read again, has the intended groups and nothing else
// changed.
func TestGroupEdits(t *testing.T) {
	const diol = "C[C@H](O)[C@@H](C)Cl"
	tests := []struct {
		why  string
		have string
		edit func(m *Molecule) ([]Edit, error)
		want string
	}{
		{"a group in a new block", diol, func(m *Molecule) ([]Edit, error) { return AddStereoGroup(m, GroupOr, 1, []int{3, 1}) }, diol + " |o1:1,3|"},
		{"a group at the end of the block", diol + " |a:1|", func(m *Molecule) ([]Edit, error) {
			return AddStereoGroup(m, GroupAnd, FreeGroupNumber(m, GroupAnd), []int{3})
		}, diol + " |a:1,&1:3|"},
		{"after an empty field, no second comma", diol + " |a:1,|", func(m *Molecule) ([]Edit, error) { return AddStereoGroup(m, GroupOr, 2, []int{3}) }, diol + " |a:1,o2:3|"},
		{"the only group: the block goes", diol + " |&1:1,3|", func(m *Molecule) ([]Edit, error) { return RemoveStereoGroup(m, 0) }, diol},
		{"the first of two", diol + " |a:1,&1:3|", func(m *Molecule) ([]Edit, error) { return RemoveStereoGroup(m, 0) }, diol + " |&1:3|"},
		{"the last of two", diol + " |a:1,&1:3|", func(m *Molecule) ([]Edit, error) { return RemoveStereoGroup(m, 1) }, diol + " |a:1|"},
		{"between other fields", diol + " |(0,0,;1,0,;1,1,;2,0,;2,-1,;3,0,),o1:1,3,$;a;;;;$|", func(m *Molecule) ([]Edit, error) { return RemoveStereoGroup(m, 0) }, diol + " |(0,0,;1,0,;1,1,;2,0,;2,-1,;3,0,),$;a;;;;$|"},
		{"an or-group made racemic", diol + " |o1:1,3|", func(m *Molecule) ([]Edit, error) { return SetGroupKind(m, 0, GroupAnd, 1) }, diol + " |&1:1,3|"},
		{"an and-group made absolute", diol + " |&2:1,3|", func(m *Molecule) ([]Edit, error) { return SetGroupKind(m, 0, GroupAbsolute, 0) }, diol + " |a:1,3|"},
		{"an atom in order", diol + " |o1:3|", func(m *Molecule) ([]Edit, error) { return AddGroupAtom(m, 0, 1) }, diol + " |o1:1,3|"},
		{"an atom at the end", diol + " |o1:1|", func(m *Molecule) ([]Edit, error) { return AddGroupAtom(m, 0, 3) }, diol + " |o1:1,3|"},
		{"the first atom of two", diol + " |o1:1,3|", func(m *Molecule) ([]Edit, error) { return RemoveGroupAtom(m, 0, 1) }, diol + " |o1:3|"},
		{"the last atom of two", diol + " |o1:1,3,a:0|", func(m *Molecule) ([]Edit, error) { return RemoveGroupAtom(m, 0, 3) }, diol + " |o1:1,a:0|"},
		{"the only atom: the group goes", diol + " |o1:1,&1:3|", func(m *Molecule) ([]Edit, error) { return RemoveGroupAtom(m, 1, 3) }, diol + " |o1:1|"},
	}
	for _, tt := range tests {
		m := Read(tt.have)
		edits, err := tt.edit(m)
		if err != nil {
			t.Errorf("%s: %q: %v", tt.why, tt.have, err)
			continue
		}
		got, err := ApplyEdits(m.Text, edits)
		if err != nil || got != tt.want {
			t.Errorf("%s: %q edited to %q (%v), want %q", tt.why, tt.have, got, err, tt.want)
			continue
		}
		if m2 := Read(got); m2.Errors.HasErrors() {
			t.Errorf("%s: %q reads with %v", tt.why, got, m2.Errors)
		}
		for _, e := range edits {
			if e.Span.Start < m.NotationEnd() {
				t.Errorf("%s: edit %v touches the notation", tt.why, e)
			}
		}
	}
}

func TestGroupEditErrors(t *testing.T) {
	m := Read("C[C@H](O)[C@@H](C)Cl |o1:1|")
	bad := []struct {
		why string
		err error
	}{
		{"atom already in a group", second(AddStereoGroup(m, GroupAnd, 1, []int{1}))},
		{"number in use", second(AddStereoGroup(m, GroupOr, 1, []int{3}))},
		{"a second absolute group", second(AddStereoGroup(Read("CC(C)C(C)C |a:1|"), GroupAbsolute, 0, []int{3}))},
		{"atom outside the record", second(AddStereoGroup(m, GroupOr, 2, []int{6}))},
		{"no atoms", second(AddStereoGroup(m, GroupOr, 2, nil))},
		{"atom listed twice", second(AddStereoGroup(m, GroupOr, 2, []int{3, 3}))},
		{"no such group", second(RemoveStereoGroup(m, 1))},
		{"retag to a tag in use", second(SetGroupKind(Read("CC(C)C(C)C |o1:1,&1:3|"), 0, GroupAnd, 1))},
		{"atom not in the group", second(RemoveGroupAtom(m, 0, 3))},
		{"atom in another group", second(AddGroupAtom(Read("CC(C)C(C)C |o1:1,&1:3|"), 0, 3))},
		{"block never closed", second(AddStereoGroup(Read("CC(C)C(C)C |o1:1"), GroupAnd, 1, []int{3}))},
	}
	for _, b := range bad {
		if b.err == nil {
			t.Errorf("%s: no error", b.why)
		}
	}
	if n := FreeGroupNumber(Read("CC |o1:0,o3:1|"), GroupOr); n != 2 {
		t.Errorf("FreeGroupNumber = %d, want 2", n)
	}
	if n := FreeGroupNumber(Read("CC |o1:0,o3:1|"), GroupAnd); n != 1 {
		t.Errorf("FreeGroupNumber(and) = %d, want 1", n)
	}
}

func second(_ []Edit, err error) error { return err }

package transform

import (
	"bufio"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"stereoline/notation"
	"stereoline/stereo"
	"stereoline/stereo/identity"
)

// TestGroupTransforms: what mirror, invert and set do inside or and and
// groups, and the rewrites of groups, each as text and as the relation of
// the result to the record (identity.Compare, whose sets agree with
// RDKit's and the npm package's, see identity/groups_rdkit_test.go).
func TestGroupTransforms(t *testing.T) {
	tests := []struct {
		name, in string
		do       func(m *notation.Molecule) (Transform, error)
		want     string
		relation identity.Relation // of the result to the record
	}{
		{"mirror of a relative record is the record", "C[C@H](O)[C@@H](C)Cl |o1:1,3|", Mirror,
			"C[C@H](O)[C@@H](C)Cl |o1:1,3|", identity.Identical},
		{"mirror of a racemate is the racemate", "C[C@H](O)CC |&1:1|", Mirror, "C[C@H](O)CC |&1:1|", identity.Identical},
		{"mirror inverts the absolute centres only", "C[C@H](O)[C@@H](C)Cl |o1:1|", Mirror,
			"C[C@H](O)[C@H](C)Cl |o1:1|", identity.Enantiomers},
		{"invert inside a group: another relative configuration", "C[C@H](O)[C@@H](C)Cl |o1:1,3|",
			func(m *notation.Molecule) (Transform, error) { return Invert(m, 3) },
			"C[C@H](O)[C@H](C)Cl |o1:1,3|", identity.Diastereomers},
		{"invert the only centre of a group: nothing", "C[C@H](O)CC |&1:1|",
			func(m *notation.Molecule) (Transform, error) { return Invert(m, 1) },
			"C[C@H](O)CC |&1:1|", identity.Identical},
		{"set in the group's frame: S* at C4 already", "C[C@H](O)[C@@H](C)Cl |o1:1,3|",
			func(m *notation.Molecule) (Transform, error) { return SetDescriptor(m, 3, stereo.DescS) },
			"C[C@H](O)[C@@H](C)Cl |o1:1,3|", identity.Identical},
		{"set in the group's frame: R* at C4", "C[C@H](O)[C@@H](C)Cl |o1:1,3|",
			func(m *notation.Molecule) (Transform, error) { return SetDescriptor(m, 3, stereo.DescR) },
			"C[C@H](O)[C@H](C)Cl |o1:1,3|", identity.Diastereomers},
		{"make a group absolute as written", "C[C@H](O)[C@@H](C)Cl |o1:1,3|",
			func(m *notation.Molecule) (Transform, error) { return MakeAbsolute(m, 0, -1, stereo.DescNone) },
			"C[C@H](O)[C@@H](C)Cl |a:1,3|", identity.AbsoluteOfRelative},
		{"make a group absolute as the enantiomer with C2 R", "C[C@H](O)[C@@H](C)Cl |&1:1,3|",
			func(m *notation.Molecule) (Transform, error) { return MakeAbsolute(m, 0, 1, stereo.DescR) },
			"C[C@@H](O)[C@H](C)Cl |a:1,3|", identity.AbsoluteOfMixture},
		{"an absolute group takes the atoms", "C[C@H](O)[C@@H](C)Cl |o1:1,a:3|",
			func(m *notation.Molecule) (Transform, error) { return MakeAbsolute(m, 0, -1, stereo.DescNone) },
			"C[C@H](O)[C@@H](C)Cl |a:1,3|", identity.AbsoluteOfRelative},
		{"mark every centre relative", "C[C@H](O)[C@@H](C)Cl title",
			func(m *notation.Molecule) (Transform, error) { return MarkGroup(m, nil, notation.GroupOr) },
			"C[C@H](O)[C@@H](C)Cl |o1:1,3| title", identity.AbsoluteOfRelative},
		{"mark a relative group racemic: the tag changes", "C[C@H](O)[C@@H](C)Cl |o1:1,3,$;;;;;lbl$|",
			func(m *notation.Molecule) (Transform, error) { return MarkGroup(m, nil, notation.GroupAnd) },
			"C[C@H](O)[C@@H](C)Cl |&1:1,3,$;;;;;lbl$|", identity.RelativeAndMixture},
		{"mark one centre racemic, out of its group", "C[C@H](O)[C@@H](C)Cl |o1:1,3,$;;;;;lbl$|",
			func(m *notation.Molecule) (Transform, error) { return MarkGroup(m, []int{1}, notation.GroupAnd) },
			"C[C@H](O)[C@@H](C)Cl |o1:3,$;;;;;lbl$,&1:1|", identity.Diastereomers},
		{"split a group by component", "C[C@H](O)CC.C[C@H](N)CC |o1:1,6|",
			func(m *notation.Molecule) (Transform, error) { return SplitGroup(m, 0) },
			"C[C@H](O)CC.C[C@H](N)CC |o1:1,o2:6|", identity.Diastereomers},
	}
	for _, tt := range tests {
		rec := notation.SplitRecord(tt.in)
		m := notation.Read(rec.Notation)
		tr, err := tt.do(m)
		if err != nil {
			t.Errorf("%s: %v", tt.name, err)
			continue
		}
		out := apply(t, m.Text, tr)
		if got := out + strings.TrimPrefix(tt.in, rec.Notation); got != tt.want {
			t.Errorf("%s: %q became %q, want %q", tt.name, tt.in, got, tt.want)
			continue
		}
		c := identity.Compare(m, notation.Read(out))
		rel := c.Relation
		if rel == identity.Unspecified {
			rel = identity.Diastereomers
		}
		if rel != tt.relation {
			t.Errorf("%s: %q and %q are %v, want %v", tt.name, m.Text, out, c.Relation, tt.relation)
		}
	}
}

// TestGroupRewriteErrors: rewrites that name what is not there.
func TestGroupRewriteErrors(t *testing.T) {
	tests := []struct {
		name, in string
		do       func(m *notation.Molecule) (Transform, error)
		code     notation.Code
	}{
		{"no such group", "C[C@H](O)CC", func(m *notation.Molecule) (Transform, error) { return MakeAbsolute(m, 0, -1, 0) }, CodeNoGroup},
		{"absolute already", "C[C@H](O)CC |a:1|", func(m *notation.Molecule) (Transform, error) { return MakeAbsolute(m, 0, -1, 0) }, CodeNoGroup},
		{"not a member", "C[C@H](O)[C@@H](C)Cl |o1:1|", func(m *notation.Molecule) (Transform, error) { return MakeAbsolute(m, 0, 3, stereo.DescR) }, CodeNoUnit},
		{"not a descriptor of the centre", "C[C@H](O)CC |o1:1|", func(m *notation.Molecule) (Transform, error) { return MakeAbsolute(m, 0, 1, stereo.DescE) }, CodeBadDescriptor},
		{"no marked centre", "CC(O)CC", func(m *notation.Molecule) (Transform, error) { return MarkGroup(m, nil, notation.GroupOr) }, CodeNoUnit},
		{"an unmarked atom", "C[C@H](O)CC", func(m *notation.Molecule) (Transform, error) { return MarkGroup(m, []int{0}, notation.GroupOr) }, CodeNoUnit},
		{"one component", "C[C@H](O)[C@@H](C)Cl |o1:1,3|", func(m *notation.Molecule) (Transform, error) { return SplitGroup(m, 0) }, CodeNoGroup},
		{"a block never closed", "C[C@H](O)CC |o1:1", func(m *notation.Molecule) (Transform, error) { return MarkGroup(m, nil, notation.GroupAnd) }, notation.CodeEditUnsupported},
	}
	for _, tt := range tests {
		_, err := tt.do(notation.Read(tt.in))
		e, ok := err.(*notation.Error)
		if !ok || e.Code != tt.code {
			t.Errorf("%s: %s gives %v, want %s", tt.name, tt.in, err, tt.code)
		}
	}
}

// groupsFixtureRows reads the molecule rows of testdata/rdkit/groups.tsv
// (extension blocks written by RDKit 2022.09.3's CXSMILES writer, see
// gen_groups.py); reactions are left out.
func groupsFixtureRows(t *testing.T) []string {
	path := filepath.Join("..", "..", "testdata", "rdkit", "groups.tsv")
	f, err := os.Open(path)
	if err != nil {
		t.Skipf("fixture not found at %s: %v", path, err)
	}
	defer f.Close()
	var out []string
	sc := bufio.NewScanner(f)
	sc.Buffer(make([]byte, 1<<20), 1<<20)
	for sc.Scan() {
		c := strings.Split(sc.Text(), "\t")
		if strings.HasPrefix(c[0], "#") || len(c) < 4 || c[1] == "reaction" {
			continue
		}
		out = append(out, c[3])
	}
	return out
}

// otherFields returns the texts of the fields of m's block that are no
// stereo group.
func otherFields(m *notation.Molecule) []string {
	var out []string
	if m.Extension == nil {
		return nil
	}
	for _, f := range m.Extension.Fields {
		if f.Kind != notation.FieldStereoGroup {
			out = append(out, m.Text[f.Span.Start:f.Span.End])
		}
	}
	return out
}

// TestLibraryBlocksSurviveRewrites: the extension block of every record
// RDKit 2022.09.3 wrote (groups.tsv: groups, coordinates, labels, values,
// properties, radicals, S-groups) comes out of mirror, invert and set
// byte for byte, and out of the rewrites of groups with every field that
// is no stereo group byte for byte. Each result reads again as what was
// asked: the mirror image is the record's mirror set (the record itself
// when every centre sits in or and and groups), a group made absolute is
// one stereoisomer of the record's set, centres marked racemic are a
// mixture of the record's stereoisomers (or that one structure).
func TestLibraryBlocksSurviveRewrites(t *testing.T) {
	rows := groupsFixtureRows(t)
	counts := map[string]int{}
	for _, s := range rows {
		m := notation.Read(s)
		if m.Errors.HasErrors() || m.Extension == nil {
			t.Fatalf("%s: %v", s, m.Errors)
		}
		block := m.Text[m.Extension.Separator.Start:]
		id := identity.Identify(m)
		keep := func(op string, do func() (Transform, error)) *notation.Molecule {
			tr, err := do()
			if e, ok := err.(*notation.Error); ok && e.Code == CodeNotVerified {
				// refused: the result would be impossible (a bridgehead
				// of a small bicycle inverted on its own)
				counts["refused"]++
				return nil
			}
			if err != nil {
				t.Errorf("%s of %s: %v", op, s, err)
				return nil
			}
			out := apply(t, s, tr)
			return notation.Read(out)
		}
		if r := keep("mirror", func() (Transform, error) { return Mirror(m) }); r != nil {
			counts["mirror"]++
			if !strings.HasSuffix(r.Text, block) {
				t.Errorf("mirror of %s changed the block: %s", s, r.Text)
			}
			if got := identity.Identify(r); got.Key != id.MirrorKey {
				t.Errorf("mirror of %s is not its mirror set: %s", s, r.Text)
			}
		}
		an := stereo.Analyze(m)
		impossible := an.Diagnostics.HasErrors() // RDKit enumerates bridged isomers that cannot exist
		var first *stereo.Unit
		for i := range an.Units {
			if u := &an.Units[i]; u.GroupKind != 0 && u.Descriptor.Labelled() && !u.Descriptor.Pseudo() {
				first = u
				break
			}
		}
		if first != nil {
			if r := keep("invert", func() (Transform, error) { return Invert(m, first.Centre) }); r != nil {
				counts["invert"]++
				if !strings.HasSuffix(r.Text, block) {
					t.Errorf("invert of %s changed the block: %s", s, r.Text)
				}
			}
			if r := keep("set", func() (Transform, error) { return SetDescriptor(m, first.Centre, first.Relative.Mirror()) }); r != nil {
				counts["set"]++
				if !strings.HasSuffix(r.Text, block) {
					t.Errorf("set of %s changed the block: %s", s, r.Text)
				}
			}
		}
		others := otherFields(m)
		for gi, g := range m.Extension.Groups {
			if g.Kind == notation.GroupAbsolute || len(groupCentres(an, gi)) == 0 {
				continue
			}
			if r := keep("absolute", func() (Transform, error) { return MakeAbsolute(m, gi, -1, stereo.DescNone) }); r != nil {
				counts["absolute"]++
				if !slices.Equal(otherFields(r), others) {
					t.Errorf("absolute of %s changed other fields: %s", s, r.Text)
				}
				c := identity.Compare(m, r)
				if c.Relation != identity.Identical && (c.Relation != identity.AbsoluteOfRelative && c.Relation != identity.AbsoluteOfMixture || c.Single != 1) &&
					identity.Identify(r).Set == identity.OneStereoisomer {
					t.Errorf("%s with group %s absolute is %v to the record: %s", s, g.Label(), c.Relation, r.Text)
				}
			}
			break
		}
		if first == nil {
			counts["no centre"]++ // every mark impossible: nothing to mark racemic
			continue
		}
		if r := keep("racemic", func() (Transform, error) { return MarkGroup(m, nil, notation.GroupAnd) }); r != nil {
			counts["racemic"]++
			if !slices.Equal(otherFields(r), others) {
				t.Errorf("racemic of %s changed other fields: %s", s, r.Text)
			}
			if got := identity.Identify(r); !impossible && got.Set != identity.Mixture && got.Set != identity.OneStereoisomer {
				t.Errorf("%s marked racemic stands for %v: %s", s, got.Set, r.Text)
			}
		}
	}
	t.Logf("%d records written by RDKit: %v", len(rows), counts)
	if counts["mirror"] < 2000 || counts["absolute"] < 500 {
		t.Errorf("too few rewrites checked: %v", counts)
	}
}

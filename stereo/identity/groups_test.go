package identity

import (
	"fmt"
	"strings"
	"testing"

	"stereoline/notation"
)

// Hand-checked relations of records with stereo groups (the meaning of
// a, o<n> and &<n> is common practice: the molfile's enhanced stereo and
// CXSMILES). Butan-2-ol: C[C@@H](O)CC is (R) (from memory). cis-
// cyclohexane-1,2-diol, O[C@H]1CCCC[C@H]1O, is meso and trans,
// O[C@H]1CCCC[C@@H]1O, chiral (from memory; the writings confirmed cis
// and trans by RDKit on an embedded conformer, see stereo/groups_test.go).
func TestGroupRelations(t *testing.T) {
	tests := []struct {
		name, a, b string
		want       Relation
		single     int
		pair       bool
	}{
		{"one racemate written from either enantiomer", "C[C@H](O)CC |&1:1|", "C[C@@H](O)CC |&1:1|", Identical, 0, false},
		{"one relative configuration over mirror-image writings", "C[C@H](O)[C@@H](C)Cl |o1:1,3|", "C[C@@H](O)[C@H](C)Cl |o1:1,3|", Identical, 0, false},
		{"the other relative configuration", "C[C@H](O)[C@@H](C)Cl |o1:1,3|", "C[C@@H](O)[C@@H](C)Cl |o1:1,3|", Diastereomers, 0, false},
		{"a racemate and its (R) enantiomer", "C[C@H](O)CC |&1:1|", "C[C@@H](O)CC", AbsoluteOfMixture, 1, true},
		{"the (S) enantiomer and its racemate", "C[C@H](O)CC", "C[C@@H](O)CC |&1:1|", AbsoluteOfMixture, 0, true},
		{"same relative configuration, one absolute", "C[C@H](O)[C@@H](C)Cl", "C[C@@H](O)[C@H](C)Cl |o1:1,3|", AbsoluteOfRelative, 0, true},
		{"one enantiomer unknown which, and the racemate", "C[C@H](O)CC |o1:1|", "C[C@H](O)CC |&1:1|", RelativeAndMixture, 0, true},
		{"an epimer of unknown configuration holds the absolute one", "C[C@H](O)[C@@H](C)Cl |o1:1|", "C[C@@H](O)[C@@H](C)Cl", AbsoluteOfRelative, 1, false},
		{"a mixture of epimers holds one of them", "C[C@H](O)[C@@H](C)Cl |&1:1|", "C[C@@H](O)[C@@H](C)Cl", AbsoluteOfMixture, 1, false},
		{"an absolute group is absolute", "C[C@H](O)CC |a:1|", "C[C@H](O)CC", Identical, 0, false},
		{"a partly relative record mirrored", "C[C@H](O)[C@@H](C)Cl |o1:1|", "C[C@H](O)[C@H](C)Cl |o1:1|", Enantiomers, 0, false},
		// a meso compound in an or group is the meso compound: the group
		// adds nothing (cis-cyclohexane-1,2-diol)
		{"meso in an or group", "O[C@H]1CCCC[C@H]1O |o1:1,6|", "O[C@@H]1CCCC[C@@H]1O", Identical, 0, false},
		{"meso in an and group", "O[C@H]1CCCC[C@H]1O |&1:1,6|", "O[C@H]1CCCC[C@H]1O", Identical, 0, false},
		{"the trans diol in an or group is relative", "O[C@H]1CCCC[C@@H]1O |o1:1,6|", "O[C@@H]1CCCC[C@H]1O", AbsoluteOfRelative, 1, true},
		{"unmarked members change nothing", "CC(O)CC |&1:1|", "CC(O)CC", Identical, 0, false},
	}
	for _, tt := range tests {
		c := Compare(notation.Read(tt.a), notation.Read(tt.b))
		if c.Relation != tt.want || c.Single != tt.single || c.Pair != tt.pair {
			t.Errorf("%s: %s and %s: %v (single %d, pair %v), want %v (single %d, pair %v)",
				tt.name, tt.a, tt.b, c.Relation, c.Single, c.Pair, tt.want, tt.single, tt.pair)
		}
	}
}

// TestGroupSetKinds: what a record stands for.
func TestGroupSetKinds(t *testing.T) {
	tests := []struct {
		have    string
		kind    SetKind
		isomers int
	}{
		{"C[C@H](O)CC", OneStereoisomer, 1},
		{"C[C@H](O)CC |&1:1|", Mixture, 2},
		{"C[C@H](O)CC |o1:1|", OneOf, 2},
		{"C[C@H](O)[C@@H](C)Cl |o1:1,&1:3|", OneOfMixtures, 4},
		{"C[C@H](O)[C@@H](C)Cl |o1:1,o2:3|", OneOf, 4},
		{"C[C@H](O)[C@@H](C)Cl |&1:1,&2:3|", Mixture, 4},
		{"O[C@H]1CCCC[C@H]1O |o1:1,6|", OneStereoisomer, 1},
	}
	for _, tt := range tests {
		id := Identify(notation.Read(tt.have))
		if id.Set != tt.kind || id.Isomers() != tt.isomers {
			t.Errorf("%s: %v of %d, want %v of %d", tt.have, id.Set, id.Isomers(), tt.kind, tt.isomers)
		}
	}
}

// TestGroupIndex: the list index finds the relations of groups in one
// pass, the earliest related record first, after duplicates and mirror
// images.
func TestGroupIndex(t *testing.T) {
	list := []string{
		"C[C@H](O)CC |&1:1|",  // 0
		"C[C@@H](O)CC",        // 1: the (R) enantiomer of 0
		"C[C@@H](O)CC |&1:1|", // 2: 0 again
		"C[C@H](O)CC |o1:1|",  // 3: the same stereoisomers as 0, as one of them
		"C[C@H](O)CC",         // 4: the (S) enantiomer of 0 (1's mirror image first)
		"CC[C@H](C)O |o1:2|",  // 5: 3 again, written otherwise
	}
	want := []struct {
		rel     Relation
		earlier int
		single  int
	}{
		{Different, -1, 0}, {AbsoluteOfMixture, 0, 0}, {Identical, 0, 0}, {RelativeAndMixture, 0, 0},
		{Enantiomers, 1, 0}, {Identical, 3, 0},
	}
	x := NewIndex()
	for i, s := range list {
		m := x.Add(Identify(notation.Read(s)))
		if m.Relation != want[i].rel || m.Earlier != want[i].earlier || m.Single != want[i].single {
			t.Errorf("%d %s: %v of %d (single %d), want %v of %d (single %d)", i, s, m.Relation, m.Earlier, m.Single, want[i].rel, want[i].earlier, want[i].single)
		}
	}
}

// TestGroupFindingsAddNothing: GroupFindings names the or and and groups
// whose inversion is the structure as written.
func TestGroupFindingsAddNothing(t *testing.T) {
	tests := []struct {
		have string
		want []string // the fields reported
	}{
		{"O[C@H]1CCCC[C@H]1O |o1:1,6|", []string{"o1:1,6"}},
		{"O[C@H]1CCCC[C@H]1O |&1:1,6|", []string{"&1:1,6"}},
		{"O[C@H]1CCCC[C@@H]1O |o1:1,6|", nil},
		{"C[C@H](O)CC |&1:1|", nil},
		// cis-1,4-dimethylcyclohexane: its centres are not chiral together
		{"C[C@H]1CC[C@@H](C)CC1 |o1:1,4|", []string{"o1:1,4"}},
		{"O[C@H]1CCCC[C@H]1O |a:1,6|", nil},
	}
	for _, tt := range tests {
		var got []string
		for _, e := range GroupFindings(notation.Read(tt.have)) {
			if e.Code != CodeGroupAddsNothing || e.Severity != notation.SeverityInformation {
				t.Errorf("%s: %v", tt.have, e)
			}
			got = append(got, tt.have[e.Span.Start:e.Span.End])
		}
		if strings.Join(got, " ") != strings.Join(tt.want, " ") {
			t.Errorf("%s: reported %q, want %q", tt.have, got, tt.want)
		}
	}
}

// chainWithGroups writes n marked centres in a chain, C[C@H](O) repeated,
// and a block from groups, which gets the centres' atom indices.
func chainWithGroups(n int, groups func(centres []int) string) string {
	var b strings.Builder
	var centres []int
	atoms := 0
	for i := 0; i < n; i++ {
		mark := "@"
		if i%3 == 0 {
			mark = "@@"
		}
		fmt.Fprintf(&b, "C[C%sH](O)", mark)
		centres = append(centres, atoms+1)
		atoms += 3
	}
	b.WriteString("C " + groups(centres))
	return b.String()
}

func joinAtoms(xs []int) string {
	parts := make([]string, len(xs))
	for i, x := range xs {
		parts[i] = fmt.Sprint(x)
	}
	return strings.Join(parts, ",")
}

// TestManyGroupsAreNotExpanded: a record with more or and and groups
// than expansion allows (maxGroupChoices) gets a key from its written
// configuration and groups: the same for the same writing, different for
// a different configuration, never a panic or a blow-up.
func TestManyGroupsAreNotExpanded(t *testing.T) {
	oneEach := func(centres []int) string {
		var fields []string
		for i, c := range centres {
			fields = append(fields, fmt.Sprintf("&%d:%d", i+1, c))
		}
		return "|" + strings.Join(fields, ",") + "|"
	}
	a := chainWithGroups(14, oneEach)
	b := strings.Replace(a, "[C@@H]", "[C@H]", 1)
	ia, ia2, ib := Identify(notation.Read(a)), Identify(notation.Read(a)), Identify(notation.Read(b))
	if ia.Key != ia2.Key || ia.Key == ib.Key || ia.Set != Mixture || ia.Isomers() != 0 {
		t.Errorf("unexpanded keys: %v %v %v, set %v of %d", ia.Key, ia2.Key, ib.Key, ia.Set, ia.Isomers())
	}
}

// BenchmarkIdentifyLargeGroup: one or group over n centres costs two
// keys of the record (the written one and the group inverted), whatever
// n: compare the grouped and plain ns/op at each size. (The key of such a
// chain grows faster than n even without groups: each round of
// refinement tells one more centre apart.)
func BenchmarkIdentifyLargeGroup(b *testing.B) {
	for _, n := range []int{125, 250, 500} {
		grouped := notation.Read(chainWithGroups(n, func(c []int) string { return "|o1:" + joinAtoms(c) + "|" }))
		plain := notation.Read(strings.TrimSpace(chainWithGroups(n, func(c []int) string { return "" })))
		b.Run(fmt.Sprintf("grouped/%d", n), func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				Identify(grouped)
			}
		})
		b.Run(fmt.Sprintf("plain/%d", n), func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				Identify(plain)
			}
		})
	}
}

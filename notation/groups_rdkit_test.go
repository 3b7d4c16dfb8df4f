package notation

import (
	"bufio"
	"fmt"
	"math/rand/v2"
	"os"
	"path/filepath"
	"slices"
	"strconv"
	"strings"
	"testing"
)

// The expectations in this file come from testdata/rdkit/groups.tsv,
// made by testdata/rdkit/gen_groups.py: extension blocks written by
// RDKit 2022.09.3's CXSMILES writer (Debian package python3-rdkit
// 202209.3-1) for stereoisomers of the NCI records of rdkit-data, with the
// stereo groups RDKit reads from each string, and those the npm package
// @rdkit/rdkit (a newer release, version in the fixture header) reads.

var rdkitGroupsFixture = filepath.Join("..", "testdata", "rdkit", "groups.tsv")

type groupsRow struct {
	line              int
	molecule, variant string
	fields, cxsmiles  string
	rdkit, js         string
}

func readGroupsFixture(t testing.TB) []groupsRow {
	t.Helper()
	f, err := os.Open(rdkitGroupsFixture)
	if err != nil {
		t.Fatalf("open fixture: %v (regenerate with testdata/rdkit/gen_groups.py)", err)
	}
	defer f.Close()
	var rows []groupsRow
	sc := bufio.NewScanner(f)
	sc.Buffer(make([]byte, 1<<20), 1<<20)
	for n := 1; sc.Scan(); n++ {
		line := sc.Text()
		if line == "" || strings.HasPrefix(line, "#") {
			continue
		}
		c := strings.Split(line, "\t")
		if len(c) != 6 {
			t.Fatalf("%s:%d: %d columns, want 6", rdkitGroupsFixture, n, len(c))
		}
		rows = append(rows, groupsRow{n, c[0], c[1], c[2], c[3], c[4], c[5]})
	}
	if err := sc.Err(); err != nil {
		t.Fatal(err)
	}
	if len(rows) < 2000 {
		t.Fatalf("%s: %d rows; the fixture is truncated", rdkitGroupsFixture, len(rows))
	}
	return rows
}

// groupsKey writes groups as the fixture does, kind:atoms with atoms
// ascending, the groups sorted, so that two readings compare as sets.
func groupsKey(groups []StereoGroup) string {
	kinds := map[GroupKind]string{GroupAbsolute: "abs", GroupOr: "or", GroupAnd: "and"}
	var out []string
	for _, g := range groups {
		atoms := slices.Clone(g.Atoms)
		slices.Sort(atoms)
		out = append(out, kinds[g.Kind]+":"+joinInts(atoms))
	}
	slices.Sort(out)
	return strings.Join(out, " ")
}

// fixtureKey sorts the atoms of each group of a fixture column and the
// groups, as groupsKey does.
func fixtureKey(col string) string {
	var out []string
	for _, g := range strings.Fields(col) {
		kind, atoms, _ := strings.Cut(g, ":")
		list := strings.Split(atoms, ",")
		slices.SortFunc(list, func(a, b string) int { return len(a) - len(b) + strings.Compare(a, b)*boolInt(len(a) == len(b)) })
		out = append(out, kind+":"+strings.Join(list, ","))
	}
	slices.Sort(out)
	return strings.Join(out, " ")
}

func boolInt(b bool) int {
	if b {
		return 1
	}
	return 0
}

// TestRDKitGroups checks that the groups read from every RDKit-written
// block equal RDKit 2022.09.3's reading (and the npm package's, where it
// was run), and that the block round-trips: written back unchanged when
// the writing keeps the atom order, and renumbered, with the same
// meaning, when a random writing moves the atoms.
//
// With STEREOLINE_REWRITES=FILE set, it also writes each row's random
// writing to FILE (row line, variant, source, writing, order), for
// testdata/rdkit/check_rewrites.py to read with RDKit.
func TestRDKitGroups(t *testing.T) {
	rows := readGroupsFixture(t)
	var agreeRDKit, agreeJS, ranJS, verbatim, rewritten int
	rng := rand.New(rand.NewPCG(16, 2022))
	var dump *os.File
	if path := os.Getenv("STEREOLINE_REWRITES"); path != "" {
		var err error
		if dump, err = os.Create(path); err != nil {
			t.Fatal(err)
		}
		defer dump.Close()
	}
	for _, row := range rows {
		m := Read(row.cxsmiles)
		if m.Errors.HasErrors() {
			t.Errorf("%s:%d: %q: %v", rdkitGroupsFixture, row.line, row.cxsmiles, m.Errors)
			continue
		}
		if m.Extension == nil {
			t.Errorf("%s:%d: %q: no extension block read", rdkitGroupsFixture, row.line, row.cxsmiles)
			continue
		}
		got := groupsKey(m.Extension.Groups)
		if m.Reaction {
			// RDKit reads a reaction's block into its templates, one
			// molecule per component, so a group whose atoms lie in
			// several components comes back as one group per component.
			// The block says one group; what a group across components
			// means is the stereo layer's question (issue 16: members in
			// different components).
			got = groupsKey(splitByComponent(m, m.Extension.Groups))
		}
		if want := fixtureKey(row.rdkit); got != want {
			t.Errorf("%s:%d: %q: groups %q, RDKit 2022.09.3 reads %q", rdkitGroupsFixture, row.line, row.cxsmiles, got, want)
		} else {
			agreeRDKit++
		}
		if row.js != "-" {
			ranJS++
			if got == fixtureKey(row.js) {
				agreeJS++
			} else {
				t.Errorf("%s:%d: %q: groups %q, @rdkit/rdkit reads %q", rdkitGroupsFixture, row.line, row.cxsmiles, got, fixtureKey(row.js))
			}
		}
		if kept := row.fields != "groups"; kept != hasCode(m.Errors, CodeExtensionKept) {
			t.Errorf("%s:%d: %q: extension-kept reported %v, want %v", rdkitGroupsFixture, row.line, row.cxsmiles, !kept, kept)
		}

		// Written back in the order read: the block is copied.
		w := Write(m, WriteOptions{})
		if identityOrder(w.Order) {
			verbatim++
			if block := w.Text[strings.IndexByte(w.Text, '|'):]; block != row.cxsmiles[m.Extension.Span.Start:] {
				t.Errorf("%s:%d: %q: block written back as %q", rdkitGroupsFixture, row.line, row.cxsmiles, block)
			}
		}
		// Written from another atom, with random choices: the block is
		// renumbered and says the same of the same atoms.
		opt := WriteOptions{Random: rng, Start: rng.IntN(len(m.Atoms))}
		w = Write(m, opt)
		rewritten++
		checkRenumbered(t, row.cxsmiles, m, w)
		if dump != nil {
			order := make([]string, len(w.Order))
			for i, a := range w.Order {
				order[i] = strconv.Itoa(a)
			}
			fmt.Fprintf(dump, "%d\t%s\t%s\t%s\t%s\n", row.line, row.variant, row.cxsmiles, w.Text, strings.Join(order, ","))
		}
	}
	t.Logf("%d rows: groups agree with RDKit 2022.09.3 on %d, with @rdkit/rdkit on %d of %d; %d blocks copied verbatim, %d rewritten from random starts",
		len(rows), agreeRDKit, agreeJS, ranJS, verbatim, rewritten)
}

// splitByComponent splits each group into one group per component its
// atoms lie in.
func splitByComponent(m *Molecule, groups []StereoGroup) []StereoGroup {
	var out []StereoGroup
	for _, g := range groups {
		byComp := map[int][]int{}
		var comps []int
		for _, a := range g.Atoms {
			c := m.Atoms[a].Component
			if _, ok := byComp[c]; !ok {
				comps = append(comps, c)
			}
			byComp[c] = append(byComp[c], a)
		}
		for _, c := range comps {
			out = append(out, StereoGroup{Kind: g.Kind, Number: g.Number, Atoms: byComp[c]})
		}
	}
	return out
}

func hasCode(l ErrorList, c Code) bool {
	for _, e := range l {
		if e.Code == c {
			return true
		}
	}
	return false
}

func identityOrder(order []int) bool {
	for i, a := range order {
		if a != i {
			return false
		}
	}
	return true
}

// checkRenumbered reads a writing of m back and checks that its block
// says of each atom what m's says of it: the same groups, the same
// coordinates, labels and values, the same atom references in every
// other field, the fields in the same order.
func checkRenumbered(t *testing.T, source string, m *Molecule, w Written) {
	t.Helper()
	if len(w.DroppedFields) > 0 {
		t.Errorf("%q: fields %v dropped by the writing %q", source, w.DroppedFields, w.Text)
		return
	}
	m2 := Read(w.Text)
	if m2.Errors.HasErrors() || m2.Extension == nil {
		t.Errorf("%q: writing %q reads with errors %v", source, w.Text, m2.Errors)
		return
	}
	back := func(groups []StereoGroup) []StereoGroup {
		out := slices.Clone(groups)
		for i := range out {
			out[i].Atoms = slices.Clone(out[i].Atoms)
			for k, a := range out[i].Atoms {
				out[i].Atoms[k] = w.Order[a]
			}
		}
		return out
	}
	if got, want := groupsKey(back(m2.Extension.Groups)), groupsKey(m.Extension.Groups); got != want {
		t.Errorf("%q: writing %q has groups %q in the source's numbering, want %q", source, w.Text, got, want)
	}
	f1, f2 := m.Extension.Fields, m2.Extension.Fields
	if len(f1) != len(f2) {
		t.Errorf("%q: writing %q has %d fields, want %d", source, w.Text, len(f2), len(f1))
		return
	}
	for i := range f1 {
		a, b := &f1[i], &f2[i]
		if a.Kind != b.Kind {
			t.Errorf("%q: writing %q: field %d is %s, want %s", source, w.Text, i, b.Kind, a.Kind)
			continue
		}
		for p, old := range w.Order {
			if old < len(a.Entries) && (p >= len(b.Entries) || m.Text[a.Entries[old].Start:a.Entries[old].End] != m2.Text[b.Entries[p].Start:b.Entries[p].End]) {
				t.Errorf("%q: writing %q: the %s of atom %d moved wrongly", source, w.Text, a.Kind, old)
				break
			}
		}
		if a.Kind == FieldStereoGroup {
			continue // compared as sets above; the writer sorts the atoms
		}
		if len(a.Refs) != len(b.Refs) {
			t.Errorf("%q: writing %q: field %d has %d references, want %d", source, w.Text, i, len(b.Refs), len(a.Refs))
			continue
		}
		for k := range a.Refs {
			if a.Refs[k].Kind == RefAtom && w.Order[b.Refs[k].Index] != a.Refs[k].Index {
				t.Errorf("%q: writing %q: field %d reference %d names atom %d, want %d", source, w.Text, i, k, w.Order[b.Refs[k].Index], a.Refs[k].Index)
			}
		}
	}
}

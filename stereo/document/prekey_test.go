package document

import (
	"bufio"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"stereoline/notation"
	"stereoline/stereo/identity"
)

// readFixture returns the rows of a tab-separated fixture under
// testdata/rdkit (RDKit 2022.09.3, Debian python3-rdkit and rdkit-data;
// see testdata/rdkit/README.md), skipping the test when it is absent.
func readFixture(t *testing.T, name string, columns int) [][]string {
	t.Helper()
	path := filepath.Join("..", "..", "testdata", "rdkit", name)
	f, err := os.Open(path)
	if err != nil {
		t.Skipf("fixture not found at %s: %v", path, err)
	}
	defer f.Close()
	var rows [][]string
	sc := bufio.NewScanner(f)
	sc.Buffer(make([]byte, 1<<20), 1<<20)
	for line := 1; sc.Scan(); line++ {
		text := sc.Text()
		if text == "" || strings.HasPrefix(text, "#") {
			continue
		}
		c := strings.Split(text, "\t")
		if len(c) < columns {
			t.Fatalf("%s:%d: %d columns, want %d", name, line, len(c), columns)
		}
		rows = append(rows, c)
	}
	return rows
}

// TestRelationsNeedCollidingPreKeys: a record whose constitution no other
// record shares (ethanol among alanines) gets no identity keys and no
// relation, while the colliding records are related as before (L- and
// D-alanine are mirror images, the same structure written from the other
// end is a duplicate; common practice). Hover still learns the chirality
// of the lone record from keys computed on demand.
func TestRelationsNeedCollidingPreKeys(t *testing.T) {
	text := strings.Join([]string{
		"N[C@@H](C)C(=O)O L-Ala",
		"CCO ethanol",
		"N[C@H](C)C(=O)O D-Ala",
		"OC(=O)[C@H](C)N L-Ala again",
		"C[C@@H](O)CC butan-2-ol",
	}, "\n") + "\n"
	res := analyze(t, "pool.smi", text)
	related := map[int]notation.Code{}
	for _, d := range res.Diagnostics() {
		if strings.HasPrefix(string(d.Code), "list-") {
			related[d.Record] = d.Code
		}
	}
	want := map[int]notation.Code{2: CodeListEnantiomer, 3: CodeListDuplicate}
	if fmt.Sprint(related) != fmt.Sprint(want) {
		t.Errorf("relations by record = %v, want %v", related, want)
	}
	for i, wantKeys := range []bool{true, false, true, true, false} {
		if got := res.Records[i].Identity != nil; got != wantKeys {
			t.Errorf("record %d: identity computed = %v, want %v", i, got, wantKeys)
		}
	}
	if id := res.Records[4].Identify(); id == nil || id.Chirality != identity.Chiral {
		t.Errorf("butan-2-ol identity on demand = %+v, want chiral", id)
	}
	md, _, ok := res.Hover(strings.Index(text, "butan") - 3)
	if !ok || !strings.Contains(md, "; chiral") {
		t.Errorf("hover of butan-2-ol lacks its chirality:\n%s", md)
	}
}

// TestPreKeyKeepsRelations relates a list of random writings of
// stereoisomers (identity.tsv, the stereo part: RDKit 2022.09.3) twice:
// as the document does, with identity keys only where pre-keys collide,
// and with an index fed every record. The relations must be the same.
func TestPreKeyKeepsRelations(t *testing.T) {
	rows := readFixture(t, "identity.tsv", 7)
	limit := 3000
	if testing.Short() {
		limit = 600
	}
	var b strings.Builder
	n := 0
	for _, c := range rows {
		// Every third writing, so that many molecules appear once only
		// and their pre-keys are unique in the list.
		if c[6] != "1" || (c[2] != "0" && c[2] != "3") {
			continue
		}
		fmt.Fprintf(&b, "%s %s-%s-%s\n", c[3], c[0], c[1], c[2])
		if n++; n == limit {
			break
		}
	}
	// Lone constitutions: the plain part's first writings.
	for _, c := range rows {
		if c[6] == "0" && c[2] == "0" && n < limit+limit/3 {
			fmt.Fprintf(&b, "%s plain-%s\n", c[3], c[0])
			n++
		}
	}
	res := analyze(t, "isomers.smi", b.String())

	type relation struct {
		code    notation.Code
		earlier int
	}
	got := map[int]relation{}
	for _, d := range res.Diagnostics() {
		if strings.HasPrefix(string(d.Code), "list-") {
			got[d.Record] = relation{d.Code, res.RecordAt(d.Related[0].Span.Start)}
		}
	}
	want := map[int]relation{}
	idx := identity.NewIndex()
	var order []int
	lone := 0
	for i := range res.Records {
		rec := &res.Records[i]
		id := rec.Identify()
		if id == nil {
			continue
		}
		if rec.Identity == nil {
			lone++
		}
		m := idx.Add(*id)
		order = append(order, i)
		code := map[identity.Relation]notation.Code{
			identity.Identical: CodeListDuplicate, identity.Enantiomers: CodeListEnantiomer,
			identity.Diastereomers: CodeListStereoisomer, identity.Unspecified: CodeListStereoisomer,
		}[m.Relation]
		if m.Earlier >= 0 && code != "" {
			want[i] = relation{code, order[m.Earlier]}
		}
	}
	if len(want) < 100 || lone < 100 {
		t.Fatalf("%d relations and %d records without keys: the list does not test the filter", len(want), lone)
	}
	for i, w := range want {
		if got[i] != w {
			t.Errorf("record %d (%s): relation %v, want %v", i, res.Records[i].Occ.Text, got[i], w)
		}
	}
	for i, g := range got {
		if _, ok := want[i]; !ok {
			t.Errorf("record %d (%s): relation %v, want none", i, res.Records[i].Occ.Text, g)
		}
	}
	t.Logf("%d records, %d relations, %d without identity keys", len(res.Records), len(want), lone)
}

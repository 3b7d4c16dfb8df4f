package identity

import (
	"bufio"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"stereoline/notation"
)

// identityRow is one line of testdata/rdkit/identity.tsv: a random
// writing and RDKit's canonical SMILES of it, with and without stereo
// (RDKit 2022.09.3, Debian python3-rdkit; see testdata/rdkit/README.md).
type identityRow struct {
	group, isomer, smiles, canonIso, canonPlain string
	line                                        int
}

func readIdentityFixture(t testing.TB) []identityRow {
	path := filepath.Join("..", "..", "testdata", "rdkit", "identity.tsv")
	f, err := os.Open(path)
	if err != nil {
		t.Skipf("identity fixture not found at %s: %v", path, err)
	}
	defer f.Close()
	var rows []identityRow
	sc := bufio.NewScanner(f)
	sc.Buffer(make([]byte, 1<<20), 1<<20)
	line := 0
	for sc.Scan() {
		line++
		text := sc.Text()
		if strings.HasPrefix(text, "#") || text == "" {
			continue
		}
		c := strings.Split(text, "\t")
		if len(c) < 7 {
			t.Fatalf("identity.tsv:%d: %d columns", line, len(c))
		}
		rows = append(rows, identityRow{group: c[0], isomer: c[1], smiles: c[3], canonIso: c[4], canonPlain: c[5], line: line})
	}
	return rows
}

// partitionMismatch compares two labellings of the same items as
// partitions: it returns the indices of items whose class under one
// labelling is not exactly their class under the other.
func partitionMismatch(ours, theirs []string) []int {
	// map each of our classes to the reference class of its first member
	// and back; any item breaking either map is a disagreement
	o2t, t2o := map[string]string{}, map[string]string{}
	var bad []int
	for i := range ours {
		if x, ok := o2t[ours[i]]; ok && x != theirs[i] {
			bad = append(bad, i)
			continue
		}
		if x, ok := t2o[theirs[i]]; ok && x != ours[i] {
			bad = append(bad, i)
			continue
		}
		o2t[ours[i]], t2o[theirs[i]] = theirs[i], ours[i]
	}
	return bad
}

// TestIdentityAgainstRDKit: within each group (the stereoisomers of one
// NCI record and ten random writings of each), our keys must partition
// the writings exactly as RDKit's canonical isomeric SMILES do, and the
// constitution key as its canonical SMILES without stereo. The reference
// is RDKit's, not ground truth; known disagreements are listed in
// identityExceptions with their chemical reason.
func TestIdentityAgainstRDKit(t *testing.T) {
	rows := readIdentityFixture(t)
	groups := map[string][]int{}
	var order []string
	for i, r := range rows {
		if _, ok := groups[r.group]; !ok {
			order = append(order, r.group)
		}
		groups[r.group] = append(groups[r.group], i)
	}
	agree, total := 0, 0
	plainAgree, unread := 0, 0
	for _, gname := range order {
		idx := groups[gname]
		var ours, theirs, oursPlain, theirsPlain []string
		var m0 []*notation.Molecule
		for _, i := range idx {
			m := readWithin(rows[i].smiles, 5*time.Second)
			if m == nil {
				t.Errorf("identity.tsv:%d: the reader did not finish within 5 s on %s; group %s skipped", rows[i].line, rows[i].smiles, gname)
				break
			}
			m0 = append(m0, m)
		}
		if len(m0) != len(idx) {
			unread++
			continue
		}
		for k, i := range idx {
			m := m0[k]
			id := Identify(m)
			ours = append(ours, id.Key)
			theirs = append(theirs, rows[i].canonIso)
			oursPlain = append(oursPlain, id.ConstitutionKey)
			theirsPlain = append(theirsPlain, rows[i].canonPlain)
		}
		total++
		bad := partitionMismatch(ours, theirs)
		badPlain := partitionMismatch(oursPlain, theirsPlain)
		if len(badPlain) == 0 {
			plainAgree++
		} else {
			r := rows[idx[badPlain[0]]]
			t.Errorf("identity.tsv:%d group %s: constitution key disagrees with RDKit for %s", r.line, gname, r.smiles)
		}
		if len(bad) == 0 {
			agree++
			continue
		}
		if reason, ok := identityExceptions[gname]; ok {
			t.Logf("group %s: known disagreement: %s", gname, reason)
			continue
		}
		r := rows[idx[bad[0]]]
		t.Errorf("identity.tsv:%d group %s isomer %s: stereo key partition disagrees with RDKit for %s (canonical %s)", r.line, gname, r.isomer, r.smiles, r.canonIso)
	}
	t.Logf("stereo keys agree with RDKit on %d of %d groups; constitution keys on %d; %d groups not read", agree, total, plainAgree, unread)
}

// readWithin reads a notation, giving up after d; a reader that does not
// finish is a fault of the reader that the identity check must not hide
// behind a test timeout.
func readWithin(s string, d time.Duration) *notation.Molecule {
	done := make(chan *notation.Molecule, 1)
	go func() { done <- notation.Read(s) }()
	select {
	case m := <-done:
		return m
	case <-time.After(d):
		return nil
	}
}

// identityExceptions lists groups where our key and RDKit's canonical
// isomeric SMILES partition the writings differently, with the chemical
// reason. Each was examined by hand.
var identityExceptions = map[string]string{}

// TestKeyOverKekuleWritings: testdata/rdkit/reader.tsv holds each NCI
// record as given, two random writings, a Kekulé writing (RDKit's
// kekuleSmiles) and for some records writings with hydrogens as [H]
// atoms or in brackets, all one structure; their keys must agree. This
// checks the aromatic ring recognition of aromatic.go against
// RDKit's aromaticity model on real records. Records RDKit rejects are
// left out.
func TestKeyOverKekuleWritings(t *testing.T) {
	path := filepath.Join("..", "..", "testdata", "rdkit", "reader.tsv")
	f, err := os.Open(path)
	if err != nil {
		t.Skipf("reader fixture not found at %s: %v", path, err)
	}
	defer f.Close()
	type entry struct{ key, smiles, variant string }
	first := map[string]entry{}
	sc := bufio.NewScanner(f)
	sc.Buffer(make([]byte, 1<<20), 1<<20)
	records, bad, unread := map[string]bool{}, map[string]bool{}, 0
	for sc.Scan() {
		c := strings.Split(sc.Text(), "\t")
		if strings.HasPrefix(c[0], "#") || len(c) < 4 || c[3] != "1" || c[1] == "isomer" {
			continue // an "isomer" row is another stereoisomer, not a writing
		}
		m := readWithin(c[2], 5*time.Second)
		if m == nil {
			t.Errorf("the reader did not finish within 5 s on %s", c[2])
			unread++
			continue
		}
		records[c[0]] = true
		k := Identify(m).Key
		e, ok := first[c[0]]
		if !ok {
			first[c[0]] = entry{k, c[2], c[1]}
			continue
		}
		if e.key != k && !bad[c[0]] {
			bad[c[0]] = true
			if reason, ok := kekuleExceptions[c[0]]; ok {
				t.Logf("record %s: known disagreement: %s", c[0], reason)
				continue
			}
			if len(bad) <= 20 {
				t.Errorf("record %s: %s %s and %s %s get different keys", c[0], e.variant, e.smiles, c[1], c[2])
			}
		}
	}
	t.Logf("%d of %d records: all writings share a key; %d writings not read", len(records)-len(bad), len(records), unread)
}

// kekuleExceptions are the records of reader.tsv whose writings get
// different keys, each examined by hand. All come from RDKit's
// aromaticity model reaching beyond what aromatic.go recognises
// (five- to seven-membered rings, alone or in fused pairs), or from a
// second representation of one species.
var kekuleExceptions = map[string]string{
	"879":  "perchloric acid written with a hypervalent chlorine and RDKit's charge-separated [Cl+3] form: two representations of one species, not an aromaticity question",
	"2632": "porphyrin: RDKit finds the 18-electron macrocycle aromatic; only rings up to seven atoms and fused pairs are examined here",
	"2987": "RDKit's writing CC1=c2c(cccc2)=CCN1 keeps a benzene ring aromatic although two of its atoms carry exocyclic double bonds; the Kekulé form has no aromatic sextet there",
	"3929": "copper complex of furan oximes: RDKit counts [o+] bonded to copper as aromatic; charged ring atoms are not counted here",
	"4252": "a ring with [c-] and [n+]=O: charged ring atoms are not counted here",
	"4714": "azulene: RDKit makes the ten-atom perimeter aromatic but keeps the shared bond single (written '-'); the fused pair here marks the shared bond aromatic too",
	"4725": "a fused polycyclic thiophene: RDKit's ring-system search covers more than pairs of rings",
	"4798": "pyromellitic dianhydride: RDKit counts the anhydride rings aromatic through the three-ring system; pairs of rings do not reach 4n+2 here",
}

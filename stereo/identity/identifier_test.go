package identity

import (
	"reflect"
	"strings"
	"testing"

	"stereoline/notation"
)

// flipMarks returns the writings of s with its tetrahedral marks and
// bond directions turned in every combination of the first few: the
// same atoms in the same order, other stereoisomers (or the same one).
func flipMarks(s string) []string {
	type mark struct{ at, n int } // n: 1 for @, 2 for @@, 3 for a direction
	var marks []mark
	for i := 0; i < len(s); i++ {
		switch {
		case strings.HasPrefix(s[i:], "@@"):
			marks = append(marks, mark{i, 2})
			i++
		case s[i] == '@':
			marks = append(marks, mark{i, 1})
		case s[i] == '/' || s[i] == '\\':
			marks = append(marks, mark{i, 3})
		}
	}
	if len(marks) > 4 {
		marks = marks[:4]
	}
	var out []string
	for bits := 1; bits < 1<<len(marks); bits++ {
		var b strings.Builder
		from := 0
		for k, mk := range marks {
			if bits&(1<<k) == 0 {
				continue
			}
			b.WriteString(s[from:mk.at])
			switch mk.n {
			case 1:
				b.WriteString("@@")
				from = mk.at + 1
			case 2:
				b.WriteString("@")
				from = mk.at + 2
			default:
				if s[mk.at] == '/' {
					b.WriteByte('\\')
				} else {
					b.WriteByte('/')
				}
				from = mk.at + 1
			}
		}
		b.WriteString(s[from:])
		out = append(out, b.String())
	}
	return out
}

// TestIdentifierAgreesWithIdentify computes the keys of the writings of
// the identity fixture (RDKit 2022.09.3 writings of stereoisomers, see
// readIdentityFixture), each followed by its marks turned every way, and
// of hand-made texts with the atoms of the one before but another
// constitution, one after another with one Identifier and one Rereader
// (so the molecule before is overwritten): every Identity must be
// Identify's and every pre-key ConstitutionPreKey's, and the shared
// paths must be taken.
func TestIdentifierAgreesWithIdentify(t *testing.T) {
	texts := []string{
		// same atoms in the same order, constitution changed by a
		// charge, an isotope, a hydrogen count, a bond order, aromaticity
		"C[C@H](N)C(=O)O", "C[C@@H](N)C(=O)O", "C[C@H]([NH3+])C(=O)[O-]", "C[C@@H]([13CH3])C(=O)O",
		"C[C@@H]([CH3])C(=O)O", "C[C@@H](N)C(O)O", "C[C@@H](N)C(O)O",
		"F/C=C/c1ccccc1", "F/C=C\\c1ccccc1", "F/C=C\\C1=CC=CC=C1", "F/C=C/C1=CC=CC=C1", "F/C=C/C1CCCCC1",
		"C[C@H]1CC[C@@H](C)CC1", "C[C@@H]1CC[C@@H](C)CC1", "C[C@@H]1CC[C@@H](C)CC1 |&1:1,4|", "C[C@@H]1CC[C@@H](C)CC1 |o1:1,4|",
		"[2H][C@](F)(Cl)Br", "[H][C@](F)(Cl)Br", "[H][C@@](F)(Cl)Br", "[H:1][C@@](F)(Cl)Br",
		"C[C@H](O)[C@@H](C)O", "C[C@H](O)[C@H](C)O", "OC(=O)[C@@H]1CCCN1", "", "C", "C",
	}
	for _, row := range readIdentityFixture(t) {
		texts = append(texts, row.smiles)
		texts = append(texts, flipMarks(row.smiles)...)
	}
	var x Identifier
	var rr notation.Rereader
	for _, s := range texts {
		want := Identify(notation.Read(s))
		m := rr.ReadWith(s, notation.Reading{})
		if got, want := x.PreKey(m), ConstitutionPreKey(notation.Read(s)); got != want {
			t.Errorf("%q: Identifier's pre-key %x, ConstitutionPreKey %x", s, got, want)
		}
		got := x.Identify(m)
		if !reflect.DeepEqual(got, want) {
			t.Errorf("%q: Identifier gives %+v, Identify %+v", s, got, want)
		}
	}
	if x.shared == 0 || x.preShared == 0 {
		t.Errorf("no structure shared the work of the one before (%d texts; keys %d, pre-keys %d)", len(texts), x.shared, x.preShared)
	}
	t.Logf("%d texts, %d shared the keys' work on the constitution of the one before, %d its pre-key", len(texts), x.shared, x.preShared)
}

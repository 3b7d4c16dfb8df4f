package notation

import (
	"slices"
	"strings"
	"testing"
)

// The valid examples below are the worked examples of the OpenSMILES
// specification (opensmiles.org, "OpenSMILES specification", sections
// named beside each), plus a few molecules whose hydrogen counts are
// common practice.
func TestReadValid(t *testing.T) {
	tests := []struct {
		section string
		have    string
		atoms   int
		bonds   int
		hs      []int // total hydrogens per atom, nil to skip
	}{
		{"3.1.1 atomic symbol", "[U]", 1, 0, []int{0}},
		{"3.1.1 wildcard", "[*]", 1, 0, []int{0}},
		{"3.1.2 hydrogens", "[CH4]", 1, 0, []int{4}},
		{"3.1.2 hydrogens", "[ClH]", 1, 0, []int{1}},
		{"3.1.2 hydrogens", "[ClH1]", 1, 0, []int{1}},
		{"3.1.3 charge", "[Cu+2]", 1, 0, []int{0}},
		{"3.1.3 charge", "[Cu++]", 1, 0, []int{0}},
		{"3.1.3 charge", "[CH3-]", 1, 0, []int{3}},
		{"3.1.4 isotope", "[13CH4]", 1, 0, []int{4}},
		{"3.1.4 isotope", "[2H+]", 1, 0, []int{0}},
		{"3.1.4 isotope", "[238U]", 1, 0, []int{0}},
		{"3.1.5 organic subset", "C", 1, 0, []int{4}},
		{"3.1.5 organic subset", "N", 1, 0, []int{3}},
		{"3.1.5 organic subset", "Cl", 1, 0, []int{1}},
		{"3.1.5 organic subset", "[Cl-]", 1, 0, []int{0}},
		{"3.1.7 atom class", "[CH4:2]", 1, 0, []int{4}},
		{"3.2.1 bonds", "CC", 2, 1, []int{3, 3}},
		{"3.2.1 bonds", "C=C", 2, 1, []int{2, 2}},
		{"3.2.1 bonds", "C#N", 2, 1, []int{1, 0}},
		{"3.2.1 quadruple bond", "[Rh-](Cl)(Cl)(Cl)(Cl)$[Rh-](Cl)(Cl)(Cl)Cl", 10, 9, nil},
		{"3.2.3 branches", "CCC(CC)CO", 7, 6, []int{3, 2, 1, 2, 3, 2, 1}},
		{"3.2.3 nested branches", "CC(C(C)(C)C)O", 7, 6, nil},
		{"3.3 rings", "C1CCCCC1", 6, 6, []int{2, 2, 2, 2, 2, 2}},
		{"3.3 ring bond on closure", "C=1CCCCC1", 6, 6, []int{1, 2, 2, 2, 2, 1}},
		{"3.3 ring bond on closure", "C1CCCCC=1", 6, 6, []int{1, 2, 2, 2, 2, 1}},
		{"3.3 two-digit ring", "C%10CCCCC%10", 6, 6, nil},
		{"3.3 ring number reuse", "C1CC1C1CC1", 6, 7, nil},
		{"3.3 fused rings", "C1CC2CCCCC2CC1", 10, 11, nil},
		{"3.3 ring closure across a dot", "C1.C1", 2, 1, []int{3, 3}},
		{"3.4 disconnected", "[Na+].[Cl-]", 2, 0, []int{0, 0}},
		{"3.5 aromaticity", "c1ccccc1", 6, 6, []int{1, 1, 1, 1, 1, 1}},
		{"3.5 aromaticity pyrrole", "c1cc[nH]c1", 5, 5, []int{1, 1, 1, 1, 1}},
		{"3.5 aromaticity pyridine", "n1ccccc1", 6, 6, []int{0, 1, 1, 1, 1, 1}},
		{"3.5 aromaticity furan", "o1cccc1", 5, 5, []int{0, 1, 1, 1, 1}},
		{"3.5 aromaticity thiophene", "c1ccsc1", 5, 5, []int{1, 1, 1, 0, 1}},
		{"3.5 naphthalene", "c1ccc2ccccc2c1", 10, 11, []int{1, 1, 1, 0, 1, 1, 1, 1, 0, 1}},
		{"3.5 2-pyridone, common practice", "O=c1cccc[nH]1", 7, 7, []int{0, 0, 1, 1, 1, 1, 1}},
		{"3.5 biphenyl, implied bond between rings", "c1ccccc1c1ccccc1", 12, 13, nil},
		{"3.5 pyridinium, common practice", "C[n+]1ccccc1", 7, 7, []int{3, 0, 1, 1, 1, 1, 1}},
		{"3.5 cyclopentadienide, common practice", "[cH-]1cccc1", 5, 5, []int{1, 1, 1, 1, 1}},
		{"3.5 tropylium, common practice", "[cH+]1cccccc1", 7, 7, nil},
		{"3.5 azulene, odd rings", "c1cc2cccccc2c1", 10, 11, nil},
		{"3.6 cis/trans", "F/C=C/F", 4, 3, []int{0, 1, 1, 0}},
		{"3.6 cis/trans", "F/C=C\\F", 4, 3, nil},
		{"3.7 tetrahedral", "N[C@@H](C)C(=O)O", 6, 5, []int{2, 1, 3, 0, 0, 1}},
		{"3.8 allene", "NC(Br)=[C@]=C(O)C", 7, 6, nil},
		{"3.9 square planar", "F[Po@SP1](Cl)(Br)I", 5, 4, nil},
		{"3.9 trigonal bipyramidal", "S[As@TB1](F)(Cl)(Br)N", 6, 5, nil},
		{"3.9 octahedral", "C[Co@](F)(Cl)(Br)(I)S", 7, 6, nil},
		{"4.3 reaction", "[CH3:1][OH:2]>>[CH2:1]=[O:2]", 4, 2, nil},
		{"4.3 reaction with agent", "CC(=O)O.OCC>[H+]>CC(=O)OCC.O", 15, 10, nil},
		{"3.5 sulfone, hypervalent S", "CS(=O)(=O)C", 5, 4, []int{3, 0, 0, 0, 3}},
		{"3.5 phosphate, hypervalent P", "OP(=O)(O)O", 5, 4, nil},
		{"xenon tetrafluoride, common practice", "F[Xe](F)(F)F", 5, 4, nil},
		{"periodate, common practice", "[O-]I(=O)(=O)=O", 5, 4, nil},
	}
	for _, tt := range tests {
		m := Read(tt.have)
		if len(m.Errors) != 0 {
			t.Errorf("%s: Read(%q) errors: %v", tt.section, tt.have, m.Errors)
			continue
		}
		if len(m.Atoms) != tt.atoms || len(m.Bonds) != tt.bonds {
			t.Errorf("%s: Read(%q) = %d atoms, %d bonds; want %d, %d", tt.section, tt.have, len(m.Atoms), len(m.Bonds), tt.atoms, tt.bonds)
		}
		if tt.hs != nil {
			var got []int
			for i := range m.Atoms {
				got = append(got, m.Atoms[i].HydrogenCount())
			}
			if !equalInts(got, tt.hs) {
				t.Errorf("%s: Read(%q) hydrogens = %v, want %v", tt.section, tt.have, got, tt.hs)
			}
		}
		for i, a := range m.Atoms {
			if !strings.HasPrefix(tt.have[a.Span.Start:a.Span.End], strings.TrimPrefix(a.Symbol, "")) && !a.Bracket {
				t.Errorf("%s: atom %d span %v does not cover %q", tt.have, i+1, a.Span, a.Symbol)
			}
		}
	}
}

func equalInts(a, b []int) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if a[i] != b[i] {
			return false
		}
	}
	return true
}

// TestReadErrors checks codes and places. In each case the offending text
// is marked with « and »; the markers are removed before reading and give
// the span the first error must have.
func TestReadErrors(t *testing.T) {
	tests := []struct {
		source string
		have   string
		code   Code
	}{
		{"OpenSMILES 3.3 unclosed ring", "C«1»CCCC", CodeUnclosedRing},
		{"OpenSMILES 3.3 ring bond mismatch", "C=1CCCC«#1»", CodeRingBondMismatch},
		{"OpenSMILES 3.3 ring closure duplicating a bond", "C12CCCCC1«2»", CodeRingDuplicate},
		{"OpenSMILES 3.3 ring closure to itself", "C1«1»", CodeRingSelf},
		{"OpenSMILES 3.3 ring closure after the chain bond", "C1«1»C", CodeRingSelf},
		{"OpenSMILES 3.3 adjacent ring closure", "CC1«1»", CodeRingSelf},
		{"OpenSMILES 3.1.1 unknown element", "C[«Xx»]C", CodeUnknownElement},
		{"OpenSMILES 3.1.5 element outside the organic subset", "C«Na»C", CodeSyntax},
		{"OpenSMILES 3.5 kekulization", "c1cc«c»c1", CodeKekulize},
		{"OpenSMILES 3.5 pyrrole without [nH]", "c1cc«n»c1", CodeKekulize},
		{"OpenSMILES 3.5 aromatic atom outside a ring", "C«c»", CodeKekulize},
		{"OpenSMILES 3.9 chirality class out of range", "F[C«@TH3»](Cl)(Br)I", CodeBadChirality},
		{"OpenSMILES 3.9 chirality class out of range", "F[Po«@SP4»](Cl)(Br)I", CodeBadChirality},
		{"valence, common practice", "«C»(C)(C)(C)(C)C", CodeValence},
		{"valence of a neutral bracket nitrogen, common practice", "C«[N]»(=O)=O", CodeValence},
		{"OpenSMILES 3.1.5 nitrogen above its highest normal valence", "C«N»(=O)(=O)=O", CodeValence},
		{"OpenSMILES 2 grammar: ring digit after a branch", "c12ccccc1NC=CC(=O)«2»", CodeRingAfterBranch},
		{"OpenSMILES 3.5 aromatic atom in a ring of single bonds", "«c»1CCCCC1", CodeKekulize},
		{"valence of fluorine, common practice", "C«F»C", CodeValence},
		{"OpenSMILES grammar: branch before any atom", "«(»C)C", CodeSyntax},
		{"OpenSMILES grammar: close without open", "CC«)»C", CodeSyntax},
		{"OpenSMILES grammar: unclosed branch", "C«(»CC", CodeSyntax},
		{"OpenSMILES grammar: bond at the end", "CC«=»", CodeSyntax},
		{"OpenSMILES grammar: two bonds", "C=«#»C", CodeSyntax},
		{"OpenSMILES grammar: empty branch", "C«()»C", CodeSyntax},
		{"OpenSMILES grammar: unclosed bracket", "C[CH3«(»C", CodeSyntax},
		{"OpenSMILES grammar: dot at start", "«.»C", CodeEmpty},
		{"OpenSMILES grammar: empty", "«»", CodeEmpty},
		{"OpenSMILES grammar: percent needs two digits", "C«%1»CC", CodeSyntax},
		{"OpenSMILES grammar: lowercase non-aromatic", "C[«si»]C", CodeBadAromatic},
		{"control character", "C«\x01»C", CodeEncoding},
		{"invalid UTF-8", "C«\xff»C", CodeEncoding},
		{"OpenSMILES 4.3 reaction with one arrow", "CC«>»CC", CodeReaction},
		{"OpenSMILES 4.3 reaction with three arrows", "C>C>C«>»C", CodeReaction},
		{"space inside the notation", "C« »C", CodeSyntax},
	}
	for _, tt := range tests {
		text, want := unmark(tt.have)
		m := Read(text)
		if len(m.Errors) == 0 {
			t.Errorf("%s: Read(%q): no error, want %s at %v", tt.source, text, tt.code, want)
			continue
		}
		found := false
		for _, e := range m.Errors {
			if e.Code == tt.code && e.Span == want {
				found = true
			}
			if e.Span.Start < 0 || e.Span.End > len(text) || e.Span.Start > e.Span.End {
				t.Errorf("%s: Read(%q): span %v outside the text", tt.source, text, e.Span)
			}
			if e.Msg == "" || strings.ToLower(e.Msg[:1]) != e.Msg[:1] {
				t.Errorf("%s: message %q should be a lowercase fragment", tt.source, e.Msg)
			}
		}
		if !found {
			t.Errorf("%s: Read(%q) = %v; want %s at %v", tt.source, text, m.Errors, tt.code, want)
		}
	}
}

// unmark removes « » markers and returns the span they enclosed.
func unmark(s string) (string, Span) {
	i := strings.Index(s, "«")
	j := strings.Index(s, "»")
	if i < 0 || j < 0 {
		return s, Span{}
	}
	text := s[:i] + s[i+len("«"):j] + s[j+len("»"):]
	return text, Span{i, j - len("«")}
}

// TestNeighbourOrder checks the stereo neighbour order of OpenSMILES 3.7:
// the preceding atom, the bracket hydrogen, ring closures in the order
// their digits are written, then branches and the chain.
func TestNeighbourOrder(t *testing.T) {
	tests := []struct {
		have   string
		atom   int   // 0-based
		want   []int // neighbour atom numbers, 0-based
		hasPrv bool
	}{
		{"N[C@@H](C)C(=O)O", 1, []int{0, 2, 3}, true},
		{"[C@@H](N)(C)C", 0, []int{1, 2, 3}, false},
		{"C[C@]1(F)CCCC1", 1, []int{0, 6, 2, 3}, true},
		{"C[C@@]12CCCC1CC2", 1, []int{0, 5, 7, 2}, true},
		{"C1CCCC[C@]1(F)Cl", 5, []int{4, 0, 6, 7}, true},
		{"[C@]1(F)(Cl)CC1", 0, []int{4, 1, 2, 3}, false},
	}
	for _, tt := range tests {
		m := Read(tt.have)
		if len(m.Errors) > 0 {
			t.Fatalf("Read(%q): %v", tt.have, m.Errors)
		}
		var got []int
		for i := range m.Atoms[tt.atom].Bonds {
			got = append(got, m.Neighbour(tt.atom, i))
		}
		if !equalInts(got, tt.want) || m.Atoms[tt.atom].HasPrev != tt.hasPrv {
			t.Errorf("Read(%q) atom %d neighbours %v hasPrev %v; want %v %v", tt.have, tt.atom+1, got, m.Atoms[tt.atom].HasPrev, tt.want, tt.hasPrv)
		}
	}
}

func TestChiralityAndDirections(t *testing.T) {
	m := Read("F/C=C\\[C@@H](Cl)[Po@SP3](F)(Cl)Br")
	if len(m.Errors) > 0 {
		t.Fatal(m.Errors)
	}
	if d := m.Bonds[0].Dir; d != DirUp {
		t.Errorf("first bond direction = %v, want /", d)
	}
	if d := m.Bonds[2].Dir; d != DirDown {
		t.Errorf("third bond direction = %v, want \\", d)
	}
	c := m.Atoms[3].Chirality
	if c.Class != ChiralTH || c.Num != 2 || !c.Short || m.Text[c.Span.Start:c.Span.End] != "@@" {
		t.Errorf("atom 4 chirality = %+v", c)
	}
	c = m.Atoms[5].Chirality
	if c.Class != ChiralSP || c.Num != 3 || m.Text[c.Span.Start:c.Span.End] != "@SP3" {
		t.Errorf("atom 6 chirality = %+v", c)
	}
	// A direction mark on a ring closure is kept at each end.
	m = Read("F/C=C/1.C\\1")
	if len(m.Errors) > 0 {
		t.Fatal(m.Errors)
	}
	var ring *Bond
	ri := -1
	for i := range m.Bonds {
		if m.Bonds[i].Ring {
			ring, ri = &m.Bonds[i], i
		}
	}
	if ring == nil || ring.Dir != DirUp || ring.CloseDir != DirDown || m.BondDir(ri, ring.Begin) != DirUp {
		t.Errorf("ring closure bond = %+v", ring)
	}
}

func TestReaction(t *testing.T) {
	m := Read("[CH3:1][OH:2].[Na+]>O>[CH3:1][O-:2]")
	if len(m.Errors) > 0 {
		t.Fatal(m.Errors)
	}
	roles := []Role{RoleReactant, RoleReactant, RoleReactant, RoleAgent, RoleProduct, RoleProduct}
	for i, r := range roles {
		if m.Atoms[i].Role != r {
			t.Errorf("atom %d role %v, want %v", i+1, m.Atoms[i].Role, r)
		}
	}
	if !m.Reaction || len(m.Arrows) != 2 || m.Atoms[4].Map != 1 {
		t.Errorf("reaction = %v arrows %v map %d", m.Reaction, m.Arrows, m.Atoms[4].Map)
	}
	if m.Components != 4 {
		t.Errorf("components = %d, want 4", m.Components)
	}
}

func TestSplitRecord(t *testing.T) {
	r := SplitRecord("C[C@H](N)O\tAX-0042 batch 7\r\n")
	if r.Notation != "C[C@H](N)O" || r.Title != "AX-0042 batch 7" || r.TitleSpan.Start != 11 {
		t.Errorf("SplitRecord = %+v", r)
	}
	r = SplitRecord("  CCO  ")
	if r.Notation != "CCO" || r.Title != "" || r.NotationSpan != (Span{2, 5}) {
		t.Errorf("SplitRecord = %+v", r)
	}
}

// TestHostileInput checks that large and deep inputs are read in linear
// cost without exhausting the stack.
func TestHostileInput(t *testing.T) {
	deep := strings.Repeat("C(", 100000) + "C" + strings.Repeat(")", 100000)
	if m := Read(deep); len(m.Errors) != 0 || len(m.Atoms) != 100001 {
		t.Errorf("deep branches: %d atoms, errors %v", len(m.Atoms), m.Errors.Err())
	}
	var b strings.Builder
	for i := 0; i < 20000; i++ {
		b.WriteString("C%(" + itoa(i+100) + ")")
	}
	for i := 0; i < 20000; i++ {
		b.WriteString("C%(" + itoa(i+100) + ")")
	}
	if m := Read(b.String()); len(m.Errors) != 0 || len(m.Bonds) != 40000-1+20000 {
		t.Errorf("20,000 ring closures: %d bonds, errors %v", len(m.Bonds), m.Errors.Err())
	}
	big := strings.Repeat("c1ccccc1", 1<<20/8)
	m := Read(big)
	if len(m.Errors) != 0 {
		t.Errorf("1 MB record: %v", m.Errors.Err())
	}
	garbage := strings.Repeat("(]\x00%", 1<<18)
	m = Read(garbage)
	if len(m.Errors) == 0 || len(m.Errors) > maxErrors+1 {
		t.Errorf("garbage: %d errors, want between 1 and %d", len(m.Errors), maxErrors+1)
	}
	unclosed := strings.Repeat("C1", 1) + strings.Repeat("C(", 50000)
	if m := Read(unclosed); len(m.Errors) == 0 {
		t.Errorf("unclosed branches: no error")
	}
}

// BenchmarkManyClosuresOnTwoAtoms reads a record whose two atoms share
// thousands of ring closures (each after the first a duplicate bond): the
// duplicate check must not make reading quadratic.
func BenchmarkManyClosuresOnTwoAtoms(b *testing.B) {
	var sb strings.Builder
	sb.WriteString("C")
	for i := 0; i < 50000; i++ {
		sb.WriteString("%(" + itoa(i+100) + ")")
	}
	sb.WriteString("C")
	for i := 0; i < 50000; i++ {
		sb.WriteString("%(" + itoa(i+100) + ")")
	}
	text := sb.String()
	b.SetBytes(int64(len(text)))
	for b.Loop() {
		Read(text)
	}
}

// TestKekulizeFusedSystems reads polycyclic aromatics whose Kekulé
// structure the greedy start does not find, so the augmenting search runs
// more than once in one ring system (the second search once looped
// forever). Each aromatic carbon must end with exactly one double bond
// (common practice: every carbon of these hydrocarbons is sp2 with one
// double bond in any Kekulé structure).
func TestKekulizeFusedSystems(t *testing.T) {
	for _, s := range []string{
		"c12c3c(sc2c2c4c(ccc2)cccc14)c1c2c3cccc2ccc1", // a thiophene-fused polycycle
		"c1cc2ccc3ccc4ccc5ccc6ccc1c7c2c3c4c5c67",      // coronene
		"c1ccc2c(c1)c1cccc3c1c2ccc3",                  // fluoranthene written from the outside
		"c1cc2cccc3c2c(c1)c1cccc2cccc3c21",            // perylene
	} {
		m := Read(s)
		if len(m.Errors) > 0 {
			t.Errorf("%s: %v", s, m.Errors)
			continue
		}
		for i := range m.Atoms {
			if !m.Atoms[i].Aromatic || m.Atoms[i].Number != ElemC {
				continue
			}
			doubles := 0
			for _, bi := range m.Atoms[i].Bonds {
				if m.Bonds[bi].Kekule == 2 {
					doubles++
				}
			}
			if doubles != 1 {
				t.Errorf("%s: atom %d has %d double bonds", s, i+1, doubles)
			}
		}
	}
}

// TestKekulizeMessagePlace checks that the message for an aromatic atom
// without aromatic ring bonds says where the atom is: a ring of single
// bonds is a ring, a chain is none.
func TestKekulizeMessagePlace(t *testing.T) {
	tests := []struct{ have, want string }{
		{"c1CCCCC1", "in a ring"},
		{"c1-c-c-c-c-c1", "in a ring"},
		{"Cc", "outside any ring"},
		{"[n:1]([c:2])[c:3]", "outside any ring"},
	}
	for _, tt := range tests {
		m := Read(tt.have)
		found := false
		for _, e := range m.Errors {
			if e.Code == CodeKekulize && strings.Contains(e.Msg, tt.want) {
				found = true
			}
		}
		if !found {
			t.Errorf("Read(%q): want a kekulize message saying %q, got %v", tt.have, tt.want, m.Errors)
		}
	}
}

// TestKekulizeChains checks that aromatic atoms without aromatic ring
// bonds that are bonded to one another are one finding over their text,
// and atoms apart are one each. RDKit 2022.09 rejects each of these
// records (Chem.MolFromSmiles returns None; observed with Debian's
// python3-rdkit).
func TestKekulizeChains(t *testing.T) {
	tests := []struct {
		have  string
		spans []string
	}{
		{"[*:2]cccccc[*:1]", []string{"cccccc"}},
		{"Cc(c)C", []string{"c(c"}},
		{"CcCCc", []string{"c", "c"}},
		{"C1CCCc2c1cccc2-cc", []string{"cc"}},
	}
	for _, tt := range tests {
		m := Read(tt.have)
		var got []string
		for _, e := range m.Errors {
			if e.Code == CodeKekulize {
				got = append(got, tt.have[e.Span.Start:e.Span.End])
			}
		}
		if !slices.Equal(got, tt.spans) {
			t.Errorf("Read(%q): kekulize findings over %q, want %q", tt.have, got, tt.spans)
		}
	}
}

// BenchmarkReadLongChain reads the million-atom chain of the hostile
// records: the reader's cost per atom, allocation included.
func BenchmarkReadLongChain(b *testing.B) {
	text := strings.Repeat("C", 1_000_000)
	b.ReportAllocs()
	for b.Loop() {
		Read(text)
	}
}

// TestCountAtoms compares CountAtoms with the atoms Read finds, on the
// records of the OpenSMILES examples this file reads and on a few with
// brackets, two-letter symbols, reactions and an extension block.
func TestCountAtoms(t *testing.T) {
	for _, text := range []string{
		"C", "CCl", "BrC(Br)Br", "[nH]1cccc1", "c1ccccc1[N+](=O)[O-]",
		"[2H][C@@H]([13CH3])Cl", "CC(=O)O>>CC(=O)[O-].[Na+]", "*C*",
		"C[C@H](O)CC |&1:1|", "F/C=C/[Se]C", "[C@H](F)[C@H](F)",
		strings.Repeat("C", 1000), strings.Repeat("[C@H](F)", 300),
	} {
		m := Read(text)
		if m.Errors.HasErrors() {
			t.Fatalf("%q: the test records must read without error: %v", text, m.Errors)
		}
		if got := CountAtoms(text); got != len(m.Atoms) {
			t.Errorf("CountAtoms(%q) = %d, Read finds %d atoms", text, got, len(m.Atoms))
		}
	}
}

// TestBranchWithoutAtom checks the warning on a branch of ring-closure
// digits alone. OpenSMILES (grammar: branch ::= '(' chain ')' |
// '(' bond chain ')' | '(' dot chain ')') wants a chain in a branch;
// RDKit 2022.09.3 (Debian python3-rdkit) rejects "C(1)CC1", Open Babel
// 3.1.1 reads "C(2)**2" as "C1**1" (both run on this machine). The
// reading here is Open Babel's: the digit bonds the atom before the
// branch, so "C(1)CC1" is cyclopropane, three atoms in one ring. A
// branch with an atom, and an empty "()", which is an error, give no
// such warning.
func TestBranchWithoutAtom(t *testing.T) {
	for _, c := range []struct {
		text            string
		warnings        int
		atoms, ringBond int
	}{
		{"C(1)CC1", 1, 3, 1},
		{"C(=1)CC=1", 1, 3, 1},
		{"C(1)(2)CC1C2", 2, 4, 2},
		{"C(2)**2", 1, 3, 1},
		{"C1CC1", 0, 3, 1},
		{"C(C1)C1", 0, 3, 1},
	} {
		m := Read(c.text)
		warnings := 0
		for _, e := range m.Errors {
			switch {
			case e.Code == CodeBranchWithoutAtom && e.Severity == SeverityWarning:
				warnings++
			case e.Severity == SeverityError:
				t.Errorf("%s: error %v", c.text, e)
			}
		}
		rings := 0
		for i := range m.Bonds {
			if m.Bonds[i].Ring {
				rings++
			}
		}
		if warnings != c.warnings || len(m.Atoms) != c.atoms || rings != c.ringBond {
			t.Errorf("%s: %d branch-without-atom warnings, %d atoms, %d ring bonds; want %d, %d, %d",
				c.text, warnings, len(m.Atoms), rings, c.warnings, c.atoms, c.ringBond)
		}
	}
	// An empty branch is an error of its own, and a branch whose atom
	// does not read ('a' is no SMILES atom) has that error: neither gets
	// the warning besides.
	for _, text := range []string{"C()C", "C(:a)C"} {
		m := Read(text)
		for _, e := range m.Errors {
			if e.Code == CodeBranchWithoutAtom {
				t.Errorf("%s: %v besides the error", text, e)
			}
		}
		if !m.Errors.HasErrors() {
			t.Errorf("%s: no error", text)
		}
	}
}

package notation

import (
	"fmt"
	"strings"
	"testing"
)

// Sources of the extension syntax checked here: the RDKit documentation
// (RDKit Book, "CXSMILES extensions"; the C++ reference of
// SmilesWrite::CXSmilesFields for the fields RDKit writes); what RDKit
// 2022.09.3 (Debian python3-rdkit 202209.3-1) writes and reads, run by
// hand and named "RDKit 2022.09.3" beside the case (the strings it wrote
// are copied verbatim); the CDK's CXSMILES documentation for Sg:; fields
// whose syntax is known to us only from memory say so.

// fieldSummary describes a field for comparison: its kind, its text, its
// references as a0 (atom 0), b1 (bond 1), c2 (component 2), and its
// per-atom entry count.
func fieldSummary(m *Molecule, f *Field) string {
	var sb strings.Builder
	fmt.Fprintf(&sb, "%s %q", f.Kind, m.Text[f.Span.Start:f.Span.End])
	for _, r := range f.Refs {
		fmt.Fprintf(&sb, " %c%d", "?abc"[r.Kind], r.Index)
	}
	if len(f.Entries) > 0 {
		fmt.Fprintf(&sb, " entries=%d", len(f.Entries))
	}
	return sb.String()
}

func TestExtensionFields(t *testing.T) {
	tests := []struct {
		source string
		have   string
		want   []string // fieldSummary of each field
	}{
		{"RDKit 2022.09.3 writes, issue 16", "C[C@H](O)[C@@H](C)Cl |o1:1,3|", []string{`stereo groups "o1:1,3" a1 a3`}},
		{"RDKit 2022.09.3 writes", "C[C@H](O)[C@@H](C)Cl |a:1,&1:3|", []string{`stereo groups "a:1" a1`, `stereo groups "&1:3" a3`}},
		{"RDKit 2022.09.3 reads a tag without number", "C[C@H](O)CC |o:1|", []string{`stereo groups "o:1" a1`}},
		{"RDKit 2022.09.3 writes 2D coordinates with an empty z", "C[C@H](O)CC |(1.5,1.29904,;0.75,0,;1.5,-1.29904,;-0.75,0,;-1.5,-1.29904,),&1:1|",
			[]string{`coordinates "(1.5,1.29904,;0.75,0,;1.5,-1.29904,;-0.75,0,;-1.5,-1.29904,)" entries=5`, `stereo groups "&1:1" a1`}},
		{"coordinates in 3D, RDKit Book", "CO |(0,0,0;1.4,0,-0.2)|", []string{`coordinates "(0,0,0;1.4,0,-0.2)" entries=2`}},
		{"RDKit 2022.09.3 writes atom labels", "CC1=CC=CC=C1 |$R1;;;;;;$|", []string{`atom labels "$R1;;;;;;$" entries=7`}},
		{"RDKit 2022.09.3 reads a label holding '|'", "CC |$a|b;$|", []string{`atom labels "$a|b;$" entries=2`}},
		{"RDKit 2022.09.3 writes atom values", "CC |$_AV:1.5;foo$|", []string{`atom values "$_AV:1.5;foo$" entries=2`}},
		{"RDKit 2022.09.3 writes atom properties", "CCO |atomProp:0.p1.5:1.p2.abc|", []string{`atom properties "atomProp:0.p1.5:1.p2.abc" a0 a1`}},
		{"RDKit 2022.09.3 writes radicals", "[CH3][CH2]C |^1:0,^5:1|", []string{`radicals "^1:0" a0`, `radicals "^5:1" a1`}},
		{"the relative flag, from memory; RDKit 2022.09.3 reads it", "C[C@H](O)CC |o1:1,r|", []string{`stereo groups "o1:1" a1`, `relative flag "r"`}},
		{"ring double bonds, bond indices, from memory; RDKit 2022.09.3 reads them", "C1CCCCCCC=CC1 |c:8,t:7,ctu:9|",
			[]string{`cis ring double bonds "c:8" b8`, `trans ring double bonds "t:7" b7`, `unspecified ring double bonds "ctu:9" b9`}},
		{"wedge hints atom.bond, from memory; RDKit 2022.09.3 reads them", "CC(C)O |wU:1.0,wD:1.2|", []string{`wedge hints "wU:1.0" a1 b0`, `wedge hints "wD:1.2" a1 b2`}},
		{"RDKit 2022.09.3 writes wavy bonds", "CC(C)O |w:1.0|", []string{`wavy bonds "w:1.0" a1 b0`}},
		{"coordinate bonds atom.bond, RDKit 2022.09.3 reads them", "C[Fe]C |C:1.0|", []string{`coordinate bonds "C:1.0" a1 b0`}},
		{"hydrogen bonds, from memory", "OCCO |H:0.2|", []string{`hydrogen bonds "H:0.2" a0 b2`}},
		{"zero-order bonds, from memory", "C[Fe] |Z:0|", []string{`zero-order bonds "Z:0" b0`}},
		{"RDKit 2022.09.3 writes polymer S-groups; CDK docs", "*CC(*)C |$star_e;;;star_e;$,Sg:n:1,2:n:ht:::|",
			[]string{`atom labels "$star_e;;;star_e;$" entries=5`, `polymer S-groups "Sg:n:1,2:n:ht:::" a1 a2`}},
		{"RDKit 2022.09.3 writes data S-groups", "CCO |SgD:2:pKa:4.5::::,SgD:0,1:note:hello world::::|",
			[]string{`data S-groups "SgD:2:pKa:4.5::::" a2`, `data S-groups "SgD:0,1:note:hello world::::" a0 a1`}},
		{"S-group hierarchy, RDKit 2022.09.3 reads it", "CC(C)O |SgH:0:1|", []string{`S-group hierarchy "SgH:0:1"`}},
		{"RDKit 2022.09.3 writes link nodes", "C1CCCC1 |LN:2:1.3|", []string{`link nodes "LN:2:1.3" a2`}},
		{"link nodes with outer atoms, RDKit 2022.09.3 reads them", "C1CC(C)CC1 |LN:1:1.3.0.2|", []string{`link nodes "LN:1:1.3.0.2" a1 a0 a2`}},
		{"multicentre attachment, RDKit 2022.09.3 reads it", "*C.c1ccccc1 |m:0:2.3.4.5.6.7|", []string{`multicentre attachments "m:0:2.3.4.5.6.7" a0 a2 a3 a4 a5 a6 a7`}},
		{"fragment grouping, RDKit 2022.09.3 reads it", "C[C@H](O)CC.[Na+] |f:0.1|", []string{`fragment grouping "f:0.1" c0 c1`}},
		{"lone pairs, ring-bond counts, substitution, unsaturation (CXSMARTS), from memory", "CCO |lp:2:2,rb:0:*,s:0:2,u:1|",
			[]string{`lone pairs "lp:2:2" a2`, `ring-bond counts "rb:0:*" a0`, `substitution counts "s:0:2" a0`, `unsaturation "u:1" a1`}},
		{"local parities, from memory", "CCO |@:1,@@:0|", []string{`local parities "@:1" a1`, `local parities "@@:0" a0`}},
		{"RDKit 2022.09.3 writes an empty field after a group", "CC(O)CC |o1:1,,SgD:2:note:::::|",
			[]string{`stereo groups "o1:1" a1`, `data S-groups "SgD:2:note:::::" a2`}},
		{"an unknown field is kept", "CC |xyz:1,2,o1:0|", []string{`unknown field "xyz:1,2"`, `stereo groups "o1:0" a0`}},
		{"a comma ends a field only where a field starts", "CC |Sg:n:0,1:n:ht,o1:1|", []string{`polymer S-groups "Sg:n:0,1:n:ht" a0 a1`, `stereo groups "o1:1" a1`}},
		{"issue 16: indices run over all components of all roles", "C[C@H](O)CC>>C[C@@H](O)CC |o1:1,o2:6|",
			[]string{`stereo groups "o1:1" a1`, `stereo groups "o2:6" a6`}},
		{"a tab before the block, RDKit 2022.09.3 reads it", "C[C@H](O)CC\t|&1:1|", []string{`stereo groups "&1:1" a1`}},
	}
	for _, tt := range tests {
		m := Read(tt.have)
		if m.Errors.HasErrors() {
			t.Errorf("%s: Read(%q): %v", tt.source, tt.have, m.Errors)
			continue
		}
		if m.Extension == nil {
			t.Errorf("%s: Read(%q): no block", tt.source, tt.have)
			continue
		}
		var got []string
		for i := range m.Extension.Fields {
			got = append(got, fieldSummary(m, &m.Extension.Fields[i]))
		}
		if strings.Join(got, "\n") != strings.Join(tt.want, "\n") {
			t.Errorf("%s: Read(%q) fields\n%s\nwant\n%s", tt.source, tt.have, strings.Join(got, "\n"), strings.Join(tt.want, "\n"))
		}
		// The notation before the block is read as without it.
		plain := Read(tt.have[:m.NotationEnd()])
		if len(plain.Atoms) != len(m.Atoms) || len(plain.Bonds) != len(m.Bonds) {
			t.Errorf("%s: %q: %d atoms %d bonds, without the block %d and %d", tt.source, tt.have, len(m.Atoms), len(m.Bonds), len(plain.Atoms), len(plain.Bonds))
		}
	}
}

func TestStereoGroupsRead(t *testing.T) {
	m := Read("C[C@H](O)[C@@H](C)[C@H](F)Cl |a:1,o2:3,&1:5|")
	if m.Errors.HasErrors() {
		t.Fatal(m.Errors)
	}
	want := []struct {
		kind   GroupKind
		number int
		label  string
		atoms  []int
	}{{GroupAbsolute, 0, "a", []int{1}}, {GroupOr, 2, "o2", []int{3}}, {GroupAnd, 1, "&1", []int{5}}}
	g := m.Extension.Groups
	if len(g) != len(want) {
		t.Fatalf("groups %+v", g)
	}
	for i, w := range want {
		if g[i].Kind != w.kind || g[i].Number != w.number || g[i].Label() != w.label || !equalInts(g[i].Atoms, w.atoms) {
			t.Errorf("group %d = %+v (label %s), want %+v", i, g[i], g[i].Label(), w)
		}
		if f := m.Extension.Fields[g[i].Field]; f.Group != i {
			t.Errorf("group %d field %d points to group %d", i, g[i].Field, f.Group)
		}
		s := g[i].AtomSpans[0]
		if m.Text[s.Start:s.End] != fmt.Sprint(w.atoms[0]) {
			t.Errorf("group %d atom span %v is %q", i, s, m.Text[s.Start:s.End])
		}
	}
	ag := m.AtomGroups()
	if ag[1] != 0 || ag[3] != 1 || ag[5] != 2 || ag[0] != -1 {
		t.Errorf("AtomGroups() = %v", ag)
	}
	if m.NotationEnd() != strings.Index(m.Text, " ") {
		t.Errorf("NotationEnd() = %d", m.NotationEnd())
	}
}

// TestExtensionErrors: the offending text is marked with « and », as in
// TestReadErrors; the rest of the record is still read.
func TestExtensionErrors(t *testing.T) {
	tests := []struct {
		why  string
		have string
		code Code
	}{
		{"unterminated block (RDKit 2022.09.3 rejects the record)", "C[C@H](O)CC «|&1:1»", CodeExtensionUnclosed},
		{"unterminated block runs to the end", "C[C@H](O)CC «|&1:1 LRK-BB-001»", CodeExtensionUnclosed},
		{"atom index past the record", "C[C@H](O)CC |&1:«5»|", CodeExtensionIndex},
		{"atom index past a reaction", "CC>>CC |o1:«4»|", CodeExtensionIndex},
		{"huge index (RDKit 2022.09.3 rejects it)", "CC |o1:«99999999999999999999»|", CodeExtensionIndex},
		{"bond index past the record", "CC=CC |c:«3»|", CodeExtensionIndex},
		{"component index past the record", "CC.O |f:0.«2»|", CodeExtensionIndex},
		{"atom of a link node past the record", "C1CCCC1 |LN:«5»:1.3|", CodeExtensionIndex},
		{"more coordinates than atoms", "CC |(0,0,;1,0,;«2,0,»)|", CodeExtensionIndex},
		{"more labels than atoms", "CC |$a;b;«c»$|", CodeExtensionIndex},
		{"atom in two groups", "C[C@H](O)[C@@H](C)Cl |o1:1,3,&1:«3»|", CodeGroupOverlap},
		{"atom twice in one group", "C[C@H](O)[C@@H](C)Cl |o1:1,«1»|", CodeGroupOverlap},
		{"';' between indices (RDKit 2022.09.3 drops what follows)", "C[C@H](O)[C@@H](C)Cl |o1:1«;3»|", CodeExtensionField},
		{"a sign before an index", "C[C@H](O)CC |o1:«+1»|", CodeExtensionField},
		{"a group without atoms", "C[C@H](O)CC |«o1:»|", CodeExtensionField},
		{"a group number too long", "C[C@H](O)CC |«o1234567890:1»|", CodeExtensionField},
		{"radical kind outside 1 to 7", "CC |«^8:0»|", CodeExtensionField},
		{"a letter among coordinates", "CC |(0,0,;«x»,0,)|", CodeExtensionField},
		{"four numbers for one atom", "CC |(0,0,0«,0»;1,0,0)|", CodeExtensionField},
		{"coordinates not closed", "CC |«(0,0,;1,0,»|", CodeExtensionField},
		{"labels not closed", "CC |«$a;b»|", CodeExtensionField},
		{"wedge hint without its bond", "CC(C)O |wU:«1»|", CodeExtensionField},
		{"text after the block", "C[C@H](O)CC |&1:1|« LRK-BB-001»", CodeSyntax},
		{"issue 17: a record ending in a dot", "CC«.»", CodeEmpty},
		{"a record ending in a dot before its block", "C[C@H](O)CC«.» |&1:1|", CodeEmpty},
		{"a dot ending the reactants", "CC«.»>>CC", CodeEmpty},
		{"a dot ending a branch", "C(C«.»)C", CodeEmpty},
	}
	for _, tt := range tests {
		text, want := unmark(tt.have)
		m := Read(text)
		found := false
		for _, e := range m.Errors {
			if e.Code == tt.code && e.Span == want {
				found = true
			}
			if e.Span.Start < 0 || e.Span.End > len(text) || e.Span.End < e.Span.Start {
				t.Errorf("%s: %q: error span %v outside the text", tt.why, text, e.Span)
			}
		}
		if !found {
			t.Errorf("%s: Read(%q): want %s at %v %q, got %v", tt.why, text, tt.code, want, text[want.Start:want.End], m.Errors)
		}
		// The notation is read whatever the block holds.
		if plain := Read(text[:m.NotationEnd()]); len(plain.Atoms) != len(m.Atoms) {
			t.Errorf("%s: %q: %d atoms, without the block %d", tt.why, text, len(m.Atoms), len(plain.Atoms))
		}
	}
}

// TestExtensionKept checks the information on fields kept as written.
func TestExtensionKept(t *testing.T) {
	tests := []struct {
		have string
		want string // the message, "" when none
	}{
		{"C[C@H](O)CC |&1:1|", ""},
		{"C[C@H](O)CC |(0,0,;1,0,;1,1,;2,0,;3,0,),&1:1|", "extension block kept as written, not interpreted: coordinates"},
		{"CC |$a;b$,(0,0,;1,0,),$c;d$,xyz:1|", "extension block kept as written, not interpreted: atom labels, coordinates, unknown field 'xyz'"},
		{"CC |a:0", ""}, // only the missing '|' is reported in a block never closed
	}
	for _, tt := range tests {
		m := Read(tt.have)
		got := ""
		for _, e := range m.Errors {
			if e.Code == CodeExtensionKept {
				got = e.Msg
				if e.Severity != SeverityInformation || e.Span != m.Extension.Span {
					t.Errorf("%q: %s at %v with severity %s, want information on the block %v", tt.have, e.Code, e.Span, e.Severity, m.Extension.Span)
				}
			}
		}
		if got != tt.want {
			t.Errorf("%q: got %q, want %q", tt.have, got, tt.want)
		}
	}
}

// TestRecordEnd: the block belongs to the record and the title follows
// it, as RDKit 2022.09.3 reads "C[C@H](O)CC |o1:1|title" (title "title").
func TestRecordEnd(t *testing.T) {
	tests := []struct {
		line          string
		notation, rec string
		title         string
	}{
		{"C[C@H](O)CC |&1:1| title", "C[C@H](O)CC", "C[C@H](O)CC |&1:1|", "title"},
		{"C[C@H](O)CC |o1:1|title", "C[C@H](O)CC", "C[C@H](O)CC |o1:1|", "title"},
		{"C[C@H](O)CC\t|o1:1|\tLRK-BB-001 batch 2", "C[C@H](O)CC", "C[C@H](O)CC\t|o1:1|", "LRK-BB-001 batch 2"},
		{"  CC  |a:0|  ", "CC", "CC  |a:0|", ""},
		{"CCO ethanol", "CCO", "CCO", "ethanol"},
		{"CCO ethanol |x|", "CCO", "CCO", "ethanol |x|"},
		{"CC |$a|b;$| LRK-BB-003", "CC", "CC |$a|b;$|", "LRK-BB-003"},
		{"CC |$a;b| LRK-BB-004", "CC", "CC |$a;b|", "LRK-BB-004"},
		{"CC |o1:1 LRK-BB-005  ", "CC", "CC |o1:1 LRK-BB-005", ""},
		{"CC |o1:1\r\n", "CC", "CC |o1:1", ""},
		{"CC|a:0| title", "CC|a:0|", "CC|a:0|", "title"},
		{"", "", "", ""},
		{" |a:0|", "|a:0|", "|a:0|", ""}, // no notation before the bar: the bar is a word
	}
	for _, tt := range tests {
		rec := SplitRecord(tt.line)
		if rec.Notation != tt.rec || rec.Title != tt.title || tt.line[rec.NotationSpan.Start:rec.NotationSpan.End] != tt.rec {
			t.Errorf("SplitRecord(%q) = record %q title %q, want %q %q", tt.line, rec.Notation, rec.Title, tt.rec, tt.title)
		}
		if tt.rec != tt.notation && tt.line[rec.Extension.Start] != '|' {
			t.Errorf("SplitRecord(%q): extension span %v", tt.line, rec.Extension)
		}
		trimmed := strings.TrimLeft(tt.line, " ")
		n, end := RecordEnd(trimmed)
		if trimmed[:n] != tt.notation || trimmed[:end] != tt.rec {
			t.Errorf("RecordEnd(%q) = %q %q, want %q %q", trimmed, trimmed[:n], trimmed[:end], tt.notation, tt.rec)
		}
		if n2, end2 := RecordEnd([]byte(trimmed)); n2 != n || end2 != end {
			t.Errorf("RecordEnd of bytes differs: %d %d, %d %d", n2, end2, n, end)
		}
	}
}

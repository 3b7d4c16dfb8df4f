package find

import (
	"strings"

	"stereoline/notation"
)

// notationByte marks the bytes that may appear in a record: the
// OpenSMILES alphabet (atoms, bonds, branches, ring closures, brackets,
// charges, classes, reaction arrows) and the few extra operators of
// query notation. Blanks and quotes are not in it.
var notationByte = func() (t [256]bool) {
	for c := 'a'; c <= 'z'; c++ {
		t[c] = true
	}
	for c := 'A'; c <= 'Z'; c++ {
		t[c] = true
	}
	for c := '0'; c <= '9'; c++ {
		t[c] = true
	}
	for _, c := range "[]()=#$:/\\@+-.%*>~,;&!" {
		t[c] = true
	}
	return t
}()

// fileSuffixes are extensions that make a plausible-looking word a file
// name ("input.smi", "out.csv").
var fileSuffixes = []string{
	".smi", ".smiles", ".rsmi", ".csv", ".tsv", ".txt", ".sdf", ".mol", ".json", ".yaml",
	".yml", ".py", ".gz", ".zip", ".xlsx", ".parquet", ".pkl", ".md", ".html", ".log",
}

// plausible reports whether s could be a record at all: not empty, only
// notation bytes (before an extension block), not a file name or URL.
// Text taken because a name says so must still pass this, so that
// smiles = "" or smiles = "see table" are not reported as broken
// notation.
func plausible(s string) bool {
	if s == "" || len(s) > 1<<16 {
		return false
	}
	// A record may end in a CXSMILES extension block; the notation
	// before it must look like a record.
	if n, end := notation.RecordEnd(s); end == len(s) && end > n {
		s = s[:n]
	}
	for i := 0; i < len(s); i++ {
		if !notationByte[s[i]] {
			return false
		}
	}
	if strings.Contains(s, "://") || !hasAtom(s) {
		return false
	}
	// A record starts with an atom, or with '>' when a reaction has no
	// reactants; "--input", "=SUM(A1)" and "-1" are not records.
	if c := s[0] | 0x20; !(c >= 'a' && c <= 'z' || s[0] == '[' || s[0] == '*' || s[0] == '>') {
		return false
	}
	for _, suf := range fileSuffixes {
		if strings.HasSuffix(s, suf) {
			return false
		}
	}
	return true
}

// hasAtom reports whether s has a byte that can start an atom (a letter,
// '*' or '['): "\\" or "=" alone is not a record.
func hasAtom(s string) bool {
	for i := 0; i < len(s); i++ {
		c := s[i] | 0x20
		if c >= 'a' && c <= 'z' || s[i] == '*' || s[i] == '[' {
			return true
		}
	}
	return false
}

// unmistakableText reports whether a literal nobody names is notation anyway:
// it reads without error and carries something ordinary text does not —
// a chirality mark, a bond direction mark in a molecule that has a double
// bond for it to mean something, a ring closure, or a bracket atom with a
// charge, isotope, hydrogen count or class. Element-like words ("Cl",
// "CO", "NO", "SCSS"), "I/O" and "N/A", paths, dates and versions fail one
// of these tests.
func unmistakableText(s string) bool {
	if len(s) < 3 || !plausible(s) {
		return false
	}
	c := s[0]
	if c >= '0' && c <= '9' || c == '/' || c == '.' || c == '-' || c == '\\' {
		return false
	}
	if strings.Contains(s, "//") || strings.Contains(s, "..") {
		return false
	}
	if !strings.ContainsAny(s, "@/\\[0123456789%") {
		return false
	}
	if !organicShape(s) {
		return false
	}
	m := notation.ReadIfReads(s) // most words fail early, before the costly part of a reading
	if m == nil || outsideGrammar(m) || wildcardsOnly(m) {
		return false
	}
	return hasEvidence(m)
}

// wildcardsOnly reports whether every atom is a wildcard without an
// atom map: such a text says no chemistry of its own, and an unnamed one
// is far more often a pattern of another language ("[*-]" is a regular
// expression's class). A mapped wildcard is an attachment point
// ("[*:1]", as matched-pair code writes them).
func wildcardsOnly(m *notation.Molecule) bool {
	for i := range m.Atoms {
		if m.Atoms[i].Number != 0 || m.Atoms[i].Map != 0 {
			return false
		}
	}
	return true
}

// outsideGrammar reports whether a reading warned of a branch without an
// atom, which some readers accept and others reject: a text nobody names
// that holds one is no record ("C(2)**2" in a docstring is arithmetic).
// A digit after a branch (ring-after-branch) is common in real data and
// read alike by widely used readers, so it does not count here.
func outsideGrammar(m *notation.Molecule) bool {
	for _, e := range m.Errors {
		if e.Code == notation.CodeBranchWithoutAtom {
			return true
		}
	}
	return false
}

// hasEvidence reports whether a molecule carries a stereo mark, ring or
// bracket detail that an ordinary word would not.
func hasEvidence(m *notation.Molecule) bool {
	double := false
	for i := range m.Bonds {
		if m.Bonds[i].Order == notation.OrderDouble {
			double = true
		}
	}
	for i := range m.Bonds {
		b := &m.Bonds[i]
		if b.Ring && len(m.Atoms) >= 3 {
			return true
		}
		if double && (b.Dir != notation.DirNone || b.CloseDir != notation.DirNone) {
			return true
		}
	}
	for i := range m.Atoms {
		a := &m.Atoms[i]
		if a.Chirality.Class != notation.ChiralNone {
			return true
		}
		if a.Bracket && (a.Charge != 0 || a.Isotope != 0 || a.BracketH != 0 || a.Map != 0) {
			return true
		}
	}
	return false
}

// organicShape is a quick check, before the reader runs, that the letters
// outside brackets are symbols of the organic subset of OpenSMILES
// (section 3.1.5: B C N O P S F Cl Br I and aromatic b c n o p s) or the
// wildcard: most words fail here at no cost ("R2D2", "A1:C10", "Hello").
func organicShape(s string) bool {
	depth := 0
	for i := 0; i < len(s); i++ {
		c := s[i]
		switch {
		case c == '[':
			depth++
		case c == ']':
			depth--
		case depth > 0:
		case c == 'C' && i+1 < len(s) && s[i+1] == 'l', c == 'B' && i+1 < len(s) && s[i+1] == 'r':
			i++
		case c >= 'A' && c <= 'Z' || c >= 'a' && c <= 'z':
			if strings.IndexByte("BCNOPSFIbcnops", c) < 0 {
				return false
			}
		}
	}
	return depth == 0
}

package notation

import (
	"sort"
	"strconv"
	"strings"
)

// Edit replaces the bytes of Span in a text with New. An empty Span
// inserts at its start.
type Edit struct {
	Span Span
	New  string
}

// Codes of the errors the edit functions return.
const (
	CodeEditOverlap     Code = "edit-overlap"     // two edits touch the same bytes or insert at the same offset
	CodeEditRange       Code = "edit-range"       // an edit outside the text, or a span that ends before it starts
	CodeEditUnsupported Code = "edit-unsupported" // the requested change cannot be written at this place
)

func editError(span Span, code Code, msg string) *Error {
	return &Error{Span: span, Code: code, Severity: SeverityError, Msg: msg}
}

// SortEdits returns the edits ordered by position, checked: each lies
// inside a text of length n and no two overlap (two insertions at the
// same offset count as overlapping, since their order would be a guess).
// The argument is not changed.
func SortEdits(n int, edits []Edit) ([]Edit, error) {
	sorted := append([]Edit(nil), edits...)
	sort.SliceStable(sorted, func(i, j int) bool {
		if sorted[i].Span.Start != sorted[j].Span.Start {
			return sorted[i].Span.Start < sorted[j].Span.Start
		}
		return sorted[i].Span.End < sorted[j].Span.End
	})
	for i, e := range sorted {
		if e.Span.Start < 0 || e.Span.End < e.Span.Start || e.Span.End > n {
			return nil, editError(e.Span, CodeEditRange, "edit outside the text")
		}
		if i > 0 && sorted[i-1].Span.Overlaps(e.Span) {
			err := editError(e.Span, CodeEditOverlap, "edit overlaps another edit")
			err.Related = []Related{{Span: sorted[i-1].Span, Msg: "the other edit"}}
			return nil, err
		}
	}
	return sorted, nil
}

// ApplyEdits returns text with the edits made. Bytes outside the edits'
// spans are copied unchanged. On error (an edit out of range, or two
// edits overlapping) it returns text unchanged and an *Error.
func ApplyEdits(text string, edits []Edit) (string, error) {
	sorted, err := SortEdits(len(text), edits)
	if err != nil {
		return text, err
	}
	var sb strings.Builder
	last := 0
	for _, e := range sorted {
		sb.WriteString(text[last:e.Span.Start])
		sb.WriteString(e.New)
		last = e.Span.End
	}
	sb.WriteString(text[last:])
	return sb.String(), nil
}

// InvertChirality returns the edit that turns an atom's tetrahedral or
// allene mark into the opposite one: '@' and '@@' swap, as do '@TH1' and
// '@TH2', '@AL1' and '@AL2'. Only the mark's bytes change.
func InvertChirality(m *Molecule, atom int) ([]Edit, error) {
	at, err := atomAt(m, atom)
	if err != nil {
		return nil, err
	}
	c := at.Chirality
	if c.Class != ChiralTH && c.Class != ChiralAL {
		return nil, editError(at.Span, CodeEditUnsupported, "atom has no tetrahedral or allene mark to invert")
	}
	c.Num = 3 - c.Num
	if c.Num != 1 && c.Num != 2 {
		return nil, editError(c.Span, CodeEditUnsupported, "mark number out of range")
	}
	return []Edit{{Span: c.Span, New: chiralityText(c)}}, nil
}

// SetChirality returns the edits that give an atom the chirality mark
// mark ("@", "@@", "@TH2", "@SP1", ...), or remove its mark when mark is
// "". An atom written without brackets gets them with its hydrogens
// spelt out (C with one implied hydrogen becomes [C@H]). Removing the
// last thing that needs brackets removes them too, when the organic
// subset implies exactly the atom's hydrogens ([C@@H] becomes C). The
// edit covers the atom token only.
func SetChirality(m *Molecule, atom int, mark string) ([]Edit, error) {
	at, err := atomAt(m, atom)
	if err != nil {
		return nil, err
	}
	if !validMark(mark) {
		return nil, editError(at.Span, CodeEditUnsupported, "not a chirality mark: "+strconv.Quote(mark))
	}
	switch {
	case mark == "" && at.Chirality.Class == ChiralNone:
		return nil, nil
	case mark == "":
		if impliedHydrogensWithoutBrackets(m, atom) {
			return []Edit{{Span: at.Span, New: at.Symbol}}, nil
		}
		return []Edit{{Span: at.Chirality.Span, New: ""}}, nil
	case at.Chirality.Class != ChiralNone:
		return []Edit{{Span: at.Chirality.Span, New: mark}}, nil
	case at.Bracket:
		end := symbolEnd(m, at)
		return []Edit{{Span: Span{end, end}, New: mark}}, nil
	}
	sym := m.Text[at.Span.Start:at.Span.End]
	var sb strings.Builder
	sb.WriteString("[" + sym + mark)
	if h := at.ImplicitH; h > 0 {
		sb.WriteByte('H')
		if h > 1 {
			sb.WriteString(strconv.Itoa(h))
		}
	}
	sb.WriteByte(']')
	return []Edit{{Span: at.Span, New: sb.String()}}, nil
}

// SetBondDirection returns the edits that make bond b read as dir when
// followed from atom from towards the other end ('/' is DirUp), or
// remove its direction when dir is DirNone. Only single bonds carry
// directions. For a ring closure the mark is written at the opening
// number and any mark at the closing number is removed, so that the two
// cannot disagree.
func SetBondDirection(m *Molecule, b, from int, dir Direction) ([]Edit, error) {
	if b < 0 || b >= len(m.Bonds) {
		return nil, editError(Span{}, CodeEditRange, "no such bond")
	}
	bd := &m.Bonds[b]
	if from != bd.Begin && from != bd.End {
		return nil, editError(bd.Span, CodeEditRange, "atom is not an end of the bond")
	}
	if bd.Order != OrderSingle {
		return nil, editError(bd.Span, CodeEditUnsupported, "only a single bond can carry a direction")
	}
	d := dir
	if from != bd.Begin {
		d = dir.Reverse()
	}
	// plain is what stands for the bond without a direction: nothing,
	// or '-' where nothing would mean an aromatic bond.
	plain := ""
	if m.Atoms[bd.Begin].Aromatic && m.Atoms[bd.End].Aromatic {
		plain = "-"
	}
	symbol := plain
	if d != DirNone {
		symbol = d.String()
	}
	open, ok := bondSymbolSpan(m, bd.Span, bd.Ring)
	if !ok {
		return nil, editError(bd.Span, CodeEditUnsupported, "bond symbol not found in the text")
	}
	var edits []Edit
	current := m.Text[open.Start:open.End]
	directed := current == "/" || current == "\\"
	if current != symbol && (d != DirNone || directed) {
		edits = append(edits, Edit{Span: open, New: symbol})
	}
	if bd.Ring {
		closeSpan, ok := bondSymbolSpan(m, bd.CloseSpan, true)
		if ok && bd.CloseDir != DirNone {
			edits = append(edits, Edit{Span: closeSpan, New: ""})
		}
	}
	return edits, nil
}

// bondSymbolSpan finds the bytes of a bond symbol: a chain bond's span
// is the symbol itself (empty when implied); a ring closure's span starts
// with the symbol, if any, before its number.
func bondSymbolSpan(m *Molecule, s Span, ring bool) (Span, bool) {
	if s.Start < 0 || s.End > len(m.Text) || s.End < s.Start {
		return Span{}, false
	}
	if !ring {
		if s.Len() > 1 {
			return Span{}, false
		}
		return s, true
	}
	if s.Len() > 0 && strings.IndexByte("-=#$:/\\", m.Text[s.Start]) >= 0 {
		return Span{s.Start, s.Start + 1}, true
	}
	return Span{s.Start, s.Start}, true
}

func atomAt(m *Molecule, atom int) (*Atom, error) {
	if atom < 0 || atom >= len(m.Atoms) {
		return nil, editError(Span{}, CodeEditRange, "no such atom")
	}
	at := &m.Atoms[atom]
	if at.Span.Start < 0 || at.Span.End > len(m.Text) || at.Span.Len() == 0 {
		return nil, editError(at.Span, CodeEditRange, "atom has no place in the text")
	}
	c := at.Chirality.Span
	if at.Chirality.Class != ChiralNone && (c.Start < at.Span.Start || c.End > at.Span.End || c.Len() == 0) {
		return nil, editError(at.Span, CodeEditRange, "chirality mark has no place in the atom")
	}
	if at.Bracket && (at.Span.Len() < 2 || symbolEnd(m, at) > at.Span.End-1) {
		return nil, editError(at.Span, CodeEditRange, "bracket atom symbol not found")
	}
	return at, nil
}

// validMark accepts "", "@", "@@" and '@' followed by a class name and
// its number.
func validMark(mark string) bool {
	switch mark {
	case "", "@", "@@":
		return true
	}
	if !strings.HasPrefix(mark, "@") || len(mark) < 4 {
		return false
	}
	// the highest permutation number of each class (OpenSMILES 3.9)
	limit := map[string]int{"TH": 2, "AL": 2, "SP": 3, "TB": 20, "OH": 30}[mark[1:3]]
	n, err := strconv.Atoi(mark[3:])
	return err == nil && mark[3] >= '1' && mark[3] <= '9' && n <= limit
}

// isotopeLen returns the number of isotope digits after '[' in a bracket
// atom.
func isotopeLen(m *Molecule, at *Atom) int {
	i := at.Span.Start + 1
	for i < at.Span.End && m.Text[i] >= '0' && m.Text[i] <= '9' {
		i++
	}
	return i - at.Span.Start - 1
}

// symbolEnd returns the offset just after the element symbol of a
// bracket atom, where a chirality mark goes.
func symbolEnd(m *Molecule, at *Atom) int {
	return at.Span.Start + 1 + isotopeLen(m, at) + len(at.Symbol)
}

// impliedHydrogensWithoutBrackets reports whether a bracket atom whose
// chirality mark is removed can drop its brackets: an organic-subset
// element written without isotope, charge or class, whose bracket
// hydrogens are exactly those the reader implies for the bare symbol
// (OpenSMILES 3.1.5; for an aromatic atom, counting the double bond it
// takes in the Kekulé structure).
func impliedHydrogensWithoutBrackets(m *Molecule, atom int) bool {
	at := &m.Atoms[atom]
	if !at.Bracket || at.Isotope != 0 || at.Charge != 0 || at.Map != 0 {
		return false
	}
	vals, ok := organicValences[at.Number]
	if !ok {
		return false
	}
	if at.Aromatic {
		if !organicAromatic[at.Symbol] {
			return false
		}
	}
	inner := m.Text[at.Span.Start+1 : at.Span.End-1]
	// Only the symbol, the mark and an 'H' count may be written; anything
	// else (a charge written as "+0", say) keeps the brackets.
	rest := strings.Replace(inner, m.Text[at.Chirality.Span.Start:at.Chirality.Span.End], "", 1)
	rest = strings.TrimPrefix(rest, at.Symbol)
	if rest != "" && rest != "H" && rest != "H"+strconv.Itoa(at.BracketH) {
		return false
	}
	sum, double := 0, false
	for _, b := range at.Bonds {
		k := m.Bonds[b].Kekule
		if k == 0 {
			k = 1
		}
		sum += k
		double = double || k == 2
	}
	if at.Aromatic && !double {
		return at.BracketH == 0
	}
	for _, v := range vals {
		if v >= sum {
			return v-sum == at.BracketH
		}
	}
	return at.BracketH == 0
}

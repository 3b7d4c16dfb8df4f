// This file implements the rewriting of direction marks: flipping a
// double bond, marking one, removing marks that say nothing (Clean),
// completing one-sided bonds.

package transform

import (
	"fmt"

	"stereoline/notation"
	"stereoline/stereo"
	"stereoline/stereo/identity"
)

// Rewriting the direction marks of double bonds. A double bond's
// configuration lives in the marks on the single bonds at its two ends;
// reversing every mark at one end flips it. A marked single bond between
// two double bonds (C/C=C/C=C/C) serves both, so reversing it would flip
// the neighbour too; the flip then either takes the other end or flips
// the neighbour back at its far end, whichever rewrites fewer marks.

// flipUnit returns the edits that flip double-bond unit u.
func flipUnit(m *notation.Molecule, an *stereo.Analysis, u *stereo.Unit) (Transform, error) {
	f := &flipper{m: m, an: an}
	bonds, ok := f.bestFlip(u, map[*stereo.Unit]bool{})
	var t Transform
	if !ok {
		// every choice runs into a ring of conjugated marks: flip one end
		// and say that a neighbour changes too
		bonds = f.markedAt(u.Atoms[0])
		t.Notes = append(t.Notes, fmt.Sprintf("flipping %d-%d also changes a conjugated double bond that shares its marks", u.Atoms[0]+1, u.Atoms[1]+1))
	}
	for _, bi := range uniqueInts(bonds) {
		t.Edits = append(t.Edits, reverseMarks(m, bi)...)
	}
	if !flipped(m, u, t.Edits) {
		return Transform{}, transformError(atomSpan(m, u.Atoms[0]), CodeNotVerified, "the rewritten marks do not flip the double bond %d-%d", u.Atoms[0]+1, u.Atoms[1]+1)
	}
	return t, nil
}

// flipped checks that the edits flip unit u: on the configuration read
// from the marks for a plain double bond, on the E/Z label for a
// cumulene, which the key graph does not read.
func flipped(m *notation.Molecule, u *stereo.Unit, edits []notation.Edit) bool {
	text, err := notation.ApplyEdits(m.Text, edits)
	if err != nil {
		return false
	}
	k := unitID{stereo.KindDoubleBond, u.Bond}
	if before := configurations(m); before[k] != 0 {
		return configurations(notation.ReadWith(text, m.Reading))[k] == -before[k]
	}
	got, ok := labelAfter(m, edits, u)
	switch u.Descriptor {
	case stereo.DescE, stereo.DescPseudoE:
		return ok && (got == stereo.DescZ || got == stereo.DescPseudoZ)
	case stereo.DescZ, stereo.DescPseudoZ:
		return ok && (got == stereo.DescE || got == stereo.DescPseudoE)
	}
	return true
}

type flipper struct {
	m  *notation.Molecule
	an *stereo.Analysis
}

// markedAt lists the single bonds at atom t that carry a direction mark.
func (f *flipper) markedAt(t int) []int {
	var out []int
	for _, bi := range f.m.Atoms[t].Bonds {
		b := &f.m.Bonds[bi]
		if b.Order == notation.OrderSingle && (b.Dir != notation.DirNone || b.CloseDir != notation.DirNone) {
			out = append(out, bi)
		}
	}
	return out
}

// sharer returns the other specified double bond whose end is x, if any.
func (f *flipper) sharer(u *stereo.Unit, x int) *stereo.Unit {
	for i := range f.an.Units {
		v := &f.an.Units[i]
		if v == u || v.Kind != stereo.KindDoubleBond || !v.Specified {
			continue
		}
		for _, y := range v.Atoms {
			if y == x {
				return v
			}
		}
	}
	return nil
}

// bestFlip returns the fewest marked bonds to reverse so that u flips
// and no other double bond does; false when no such set exists.
func (f *flipper) bestFlip(u *stereo.Unit, visiting map[*stereo.Unit]bool) ([]int, bool) {
	if visiting[u] {
		return nil, false
	}
	visiting[u] = true
	defer delete(visiting, u)
	var best []int
	found := false
	for e := 0; e < 2; e++ {
		bonds, ok := f.flipAt(u, u.Atoms[e], visiting)
		if ok && (!found || len(bonds) < len(best)) {
			best, found = bonds, true
		}
	}
	return best, found
}

// flipAt reverses the marks at end t of u, compensating any neighbour
// that shares one of them by flipping it at its far end.
func (f *flipper) flipAt(u *stereo.Unit, t int, visiting map[*stereo.Unit]bool) ([]int, bool) {
	bonds := f.markedAt(t)
	if len(bonds) == 0 {
		return nil, false
	}
	out := append([]int(nil), bonds...)
	for _, bi := range bonds {
		x := f.m.Bonds[bi].Other(t)
		v := f.sharer(u, x)
		if v == nil {
			continue
		}
		if visiting[v] {
			return nil, false
		}
		far := v.Atoms[0]
		if far == x {
			far = v.Atoms[1]
		}
		visiting[u] = true
		more, ok := f.flipAt(v, far, visiting)
		if !ok {
			return nil, false
		}
		// a bond reversed twice is not reversed at all: it cannot be
		// both the shared bond and one of the far end's
		for _, b := range more {
			if b == bi {
				return nil, false
			}
		}
		out = append(out, more...)
	}
	return out, true
}

func uniqueInts(xs []int) []int {
	seen := map[int]bool{}
	var out []int
	for _, x := range xs {
		if !seen[x] {
			seen[x] = true
			out = append(out, x)
		}
	}
	return out
}

// reverseMarks returns the edits that turn every '/' written for bond bi
// into '\' and back: the chain bond symbol, or the symbols before the
// opening and closing digits of a ring closure. One byte each.
func reverseMarks(m *notation.Molecule, bi int) []notation.Edit {
	b := &m.Bonds[bi]
	var out []notation.Edit
	for _, sp := range []notation.Span{b.Span, b.CloseSpan} {
		if sp.Len() == 0 || sp.Start < 0 || sp.Start >= len(m.Text) {
			continue
		}
		switch m.Text[sp.Start] {
		case '/':
			out = append(out, notation.Edit{Span: notation.Span{Start: sp.Start, End: sp.Start + 1}, New: "\\"})
		case '\\':
			out = append(out, notation.Edit{Span: notation.Span{Start: sp.Start, End: sp.Start + 1}, New: "/"})
		}
		if !b.Ring {
			break
		}
	}
	return out
}

// markDoubleBond adds marks to an unmarked double bond: one substituent
// bond at each end, the first read as dir from its end atom and the
// second as '/' from its end, so the two choices of dir give the two
// isomers. An end that already carries a mark keeps it.
func markDoubleBond(m *notation.Molecule, u *stereo.Unit, dir notation.Direction) ([]notation.Edit, error) {
	var edits []notation.Edit
	f := &flipper{m: m}
	for e := 0; e < 2; e++ {
		t := u.Atoms[e]
		if len(f.markedAt(t)) > 0 {
			continue
		}
		bi := plainSubstituentBond(m, t)
		if bi < 0 {
			return nil, transformError(atomSpan(m, t), CodeNotVerified, "atom %d has no single bond to mark", t+1)
		}
		d := notation.DirUp
		if e == 0 {
			d = dir
		}
		ed, err := notation.SetBondDirection(m, bi, t, d)
		if err != nil {
			return nil, err
		}
		edits = append(edits, ed...)
	}
	return edits, nil
}

// plainSubstituentBond picks the single bond at t to carry a new mark:
// a chain bond before a ring closure, one whose far atom has no double
// bond of its own before one that has (so no neighbour is disturbed).
func plainSubstituentBond(m *notation.Molecule, t int) int {
	best, score := -1, 1<<30
	for _, bi := range m.Atoms[t].Bonds {
		b := &m.Bonds[bi]
		if b.Order != notation.OrderSingle {
			continue
		}
		s := 0
		if b.Ring {
			s += 2
		}
		x := b.Other(t)
		for _, bj := range m.Atoms[x].Bonds {
			if m.Bonds[bj].Order == notation.OrderDouble {
				s++
			}
		}
		if s < score {
			best, score = bi, s
		}
	}
	return best
}

// Clean returns the edits that remove the marks the engine reports as
// ineffective: chirality marks on atoms that are no stereocentre (with
// the brackets, where the bare symbol implies the same hydrogens) and
// direction marks next to no stereogenic double bond.
func Clean(m *notation.Molecule) (Transform, error) {
	var t Transform
	if m == nil {
		return t, nil
	}
	an := stereo.Analyze(m)
	doneAtom, doneBond := map[int]bool{}, map[int]bool{}
	for _, d := range an.Diagnostics {
		switch d.Code {
		case stereo.CodeIneffectiveCenter:
			for a := range m.Atoms {
				at := &m.Atoms[a]
				if doneAtom[a] || at.Chirality.Class == notation.ChiralNone || !at.Span.Overlaps(d.Span) {
					continue
				}
				doneAtom[a] = true
				e, err := notation.SetChirality(m, a, "")
				if err != nil {
					return Transform{}, err
				}
				t.Edits = append(t.Edits, e...)
			}
		case stereo.CodeIneffectiveBond:
			for bi := range m.Bonds {
				b := &m.Bonds[bi]
				if doneBond[bi] || (b.Dir == notation.DirNone && b.CloseDir == notation.DirNone) {
					continue
				}
				if !b.Span.Overlaps(d.Span) && !(b.Ring && b.CloseSpan.Overlaps(d.Span)) {
					continue
				}
				doneBond[bi] = true
				e, err := notation.SetBondDirection(m, bi, b.Begin, notation.DirNone)
				if err != nil {
					return Transform{}, err
				}
				t.Edits = append(t.Edits, e...)
			}
		}
	}
	return t, nil
}

// CompleteOneSided returns the edits that add the missing partner mark to
// every double bond marked at one end only. The marks cannot say which
// isomer was meant, so the new mark puts the two marked substituents
// trans; each completed bond gets a note asking for review.
func CompleteOneSided(m *notation.Molecule) (Transform, error) {
	var t Transform
	if m == nil {
		return t, nil
	}
	an := stereo.Analyze(m)
	f := &flipper{m: m, an: an}
	for i := range an.Units {
		u := &an.Units[i]
		if u.Kind != stereo.KindDoubleBond || u.Specified || len(u.Atoms) != 2 {
			continue
		}
		var marked [2][]int
		for e := 0; e < 2; e++ {
			marked[e] = f.markedAt(u.Atoms[e])
		}
		if (len(marked[0]) == 0) == (len(marked[1]) == 0) {
			continue
		}
		have := 0
		if len(marked[0]) == 0 {
			have = 1
		}
		t0, t1 := u.Atoms[have], u.Atoms[1-have]
		ref := marked[have][0]
		side := m.BondDir(ref, m.Bonds[ref].Other(t0))
		bi := plainSubstituentBond(m, t1)
		if bi < 0 {
			continue
		}
		e, err := notation.SetBondDirection(m, bi, t1, side)
		if err != nil {
			return Transform{}, err
		}
		if d, ok := labelAfter(m, e, u); ok {
			t.Edits = append(t.Edits, e...)
			t.Notes = append(t.Notes, fmt.Sprintf("double bond %d-%d completed as %s (marked substituents trans); check that this is the isomer meant", u.Atoms[0]+1, u.Atoms[1]+1, d))
		}
	}
	return t, nil
}

// unitID names a marked unit: its kind and its centre, or for a double
// bond its bond (identity.UnitID).
type unitID struct {
	kind stereo.Kind
	at   int
}

// configurations reads every marked unit of m and gives its
// configuration on the atom order itself (identity.Configurations).
func configurations(m *notation.Molecule) map[unitID]int {
	out := map[unitID]int{}
	for id, p := range identity.Configurations(m) {
		out[unitID{id.Kind, id.At}] = p
	}
	return out
}

package notation

import (
	"sort"
	"strconv"
	"strings"
)

// This file implements writing the extension block back after Write has
// written the notation, renumbered for the new order of the atoms.

// writeExtension returns the block to write after the notation text just
// written, with its separator ("" when m has no block or nothing of it
// can be written), and the fields left out.
//
// When the atoms keep their order the block is copied byte for byte,
// except that fields counting bonds need the very same notation text:
// bond numbering differs between readers (RDKit 2022.09.3 numbers ring
// closures after every other bond, in the order of their digits), so only
// an unchanged text keeps it. Otherwise each field is rewritten: atom
// indices through the new order, per-atom lists (coordinates, labels,
// values) permuted, component indices through the new order of the
// components; fields that count bonds, fields with indices beyond the
// record, incomplete coordinates and unknown fields cannot be renumbered
// and are left out (listed in dropped).
func writeExtension(m *Molecule, text string, order []int) (block string, dropped []int) {
	ext := m.Extension
	if ext == nil {
		return "", nil
	}
	sep := m.Text[ext.Separator.Start:ext.Separator.End]
	identity := len(order) == len(m.Atoms)
	for i, a := range order {
		if a != i {
			identity = false
			break
		}
	}
	sameText := text == m.Text[:m.NotationEnd()]
	if identity && (sameText || !countsBonds(ext)) {
		return sep + m.Text[ext.Span.Start:ext.Span.End], nil
	}
	rn := newRenumbering(m, order)
	var parts []string
	for i := range ext.Fields {
		f := &ext.Fields[i]
		s, ok := rn.field(f, identity && sameText)
		if !ok {
			dropped = append(dropped, i)
			continue
		}
		parts = append(parts, s)
	}
	if len(parts) == 0 {
		return "", dropped
	}
	return sep + "|" + strings.Join(parts, ",") + "|", dropped
}

// countsBonds reports whether a field of the block refers to bonds.
func countsBonds(ext *Extension) bool {
	for i := range ext.Fields {
		for _, r := range ext.Fields[i].Refs {
			if r.Kind == RefBond {
				return true
			}
		}
	}
	return false
}

// renumbering maps old atom and component indices to new ones.
type renumbering struct {
	m         *Molecule
	order     []int // new position -> old atom
	atom      []int // old atom -> new position
	component []int // old component -> new component
}

func newRenumbering(m *Molecule, order []int) *renumbering {
	rn := &renumbering{m: m, order: order, atom: make([]int, len(m.Atoms)), component: make([]int, m.Components)}
	for i := range rn.atom {
		rn.atom[i] = -1
	}
	for i := range rn.component {
		rn.component[i] = -1
	}
	next := 0
	for pos, a := range order {
		rn.atom[a] = pos
		if c := m.Atoms[a].Component; c >= 0 && c < len(rn.component) && rn.component[c] < 0 {
			rn.component[c] = next
			next++
		}
	}
	return rn
}

// field returns the text of f for the new order, or false when it cannot
// be renumbered.
func (rn *renumbering) field(f *Field, sameText bool) (string, bool) {
	text := rn.m.Text
	switch f.Kind {
	case FieldStereoGroup:
		// a group is written with the atoms read: indices beyond the
		// record and repeats (reported by the reader) are left out
		if f.Group < 0 || len(rn.m.Extension.Groups[f.Group].Atoms) == 0 {
			return "", false
		}
		return rn.group(f), true
	case FieldCoordinates:
		if len(f.Entries) < len(rn.m.Atoms) {
			return "", false
		}
		return "(" + rn.entries(f) + ")", true
	case FieldAtomLabels:
		return "$" + rn.entries(f) + "$", true
	case FieldAtomValues:
		return "$_AV:" + rn.entries(f) + "$", true
	case FieldRelative, FieldSgroupHierarchy:
		// no reference to atoms, bonds or components
		return text[f.Span.Start:f.Span.End], true
	case FieldUnknown:
		return "", false
	}
	var edits []Edit
	for _, r := range f.Refs {
		var to int
		switch {
		case r.Kind == RefBond && sameText:
			continue
		case r.Kind == RefBond:
			return "", false
		case r.Index < 0:
			return "", false
		case r.Kind == RefAtom && r.Index < len(rn.atom):
			to = rn.atom[r.Index]
		case r.Kind == RefComponent && r.Index < len(rn.component):
			to = rn.component[r.Index]
		default:
			return "", false
		}
		if to < 0 {
			return "", false
		}
		edits = append(edits, Edit{Span: r.Span.Shift(-f.Span.Start), New: strconv.Itoa(to)})
	}
	out, err := ApplyEdits(text[f.Span.Start:f.Span.End], edits)
	if err != nil {
		return "", false
	}
	return out, true
}

// group writes a stereo group with its atoms renumbered, in ascending
// order as the libraries write them.
func (rn *renumbering) group(f *Field) string {
	g := &rn.m.Extension.Groups[f.Group]
	atoms := make([]int, 0, len(g.Atoms))
	for _, a := range g.Atoms {
		atoms = append(atoms, rn.atom[a])
	}
	sort.Ints(atoms)
	return rn.m.Text[f.Tag.Start:f.Tag.End] + ":" + joinInts(atoms)
}

// entries writes per-atom entries in the new order, separated by ';'; an
// atom without an entry gets an empty one.
func (rn *renumbering) entries(f *Field) string {
	var sb strings.Builder
	for pos, a := range rn.order {
		if pos > 0 {
			sb.WriteByte(';')
		}
		if a < len(f.Entries) {
			e := f.Entries[a]
			sb.WriteString(rn.m.Text[e.Start:e.End])
		}
	}
	return sb.String()
}

func joinInts(v []int) string {
	var sb strings.Builder
	for i, x := range v {
		if i > 0 {
			sb.WriteByte(',')
		}
		sb.WriteString(strconv.Itoa(x))
	}
	return sb.String()
}

package notation

import "strconv"

// This file holds the model of the CXSMILES extension block: the text
// "|...|" that may follow the notation of a record, after whitespace, and
// holds what the line notation cannot say (stereo groups, coordinates,
// atom labels, ...).
//
// Sources of the field list: the RDKit documentation (the RDKit Book,
// section "CXSMILES extensions", and the C++ API reference of
// RDKit::SmilesWrite::CXSmilesFields, which names the fields RDKit writes:
// atom labels, molfile atom values, coordinates, radicals, atom
// properties, link nodes, enhanced stereo, S-groups, polymer S-groups,
// bond configurations, atropisomer bonds, coordinate bonds, hydrogen
// bonds, zero-order bonds); the CDK's CXSMILES documentation for polymer
// S-groups (Sg:) and the CXSMARTS query fields. Where the syntax of a field
// is known only from what RDKit 2022.09.3 writes and reads, the reader
// says so beside the field (extension_read.go).

// Extension is the CXSMILES extension block of a record.
type Extension struct {
	// Span covers the block from its opening '|' to its closing '|'
	// inclusive (to the end of the text when Closed is false).
	Span Span
	// Separator is the whitespace between the notation and the block.
	Separator Span
	// Closed is false when the text ends before the closing '|'.
	Closed bool
	// Fields are the fields in the order written. Empty fields (",,",
	// which RDKit 2022.09.3 writes after some stereo groups) are not
	// listed.
	Fields []Field
	// Groups are the stereo groups (a:, o<n>:, &<n>:) in the order
	// written; Groups[i].Field is the field that holds group i.
	Groups []StereoGroup
}

// Field is one comma-separated field of an extension block.
type Field struct {
	Kind FieldKind
	// Span is the field without the comma that separates it from the
	// next. Tag is its leading name: "o1", "^1", "Sg", "atomProp", "("
	// for coordinates, "$" for atom labels, "$_AV" for atom values.
	Span Span
	Tag  Span
	// Refs are the numbers in the field that refer to atoms, bonds or
	// components of the record, in the order written.
	Refs []Ref
	// Entries are the per-atom entries of coordinates, atom labels and
	// atom values: Entries[i] belongs to atom i (there may be fewer
	// entries than atoms, never more without an error).
	Entries []Span
	// Group is the index in Extension.Groups of a stereo group field,
	// -1 for other fields.
	Group int
}

// Ref is a number in a field that refers to an atom, a bond or a
// dot-separated component of the record, counted from 0 through the whole
// record (over all components of all roles of a reaction, in the order
// written).
type Ref struct {
	Kind RefKind
	// Index is the number as written, or -1 when it is too large to be
	// an index of any record.
	Index int
	Span  Span
}

// RefKind is what a Ref refers to.
type RefKind uint8

// Kinds of references.
const (
	RefAtom      RefKind = iota + 1 // an atom, numbered in the order atoms are written
	RefBond                         // a bond, in the numbering of the reader that wrote the block
	RefComponent                    // a dot-separated component
)

// FieldKind is the kind of an extension field, recognised by its tag.
type FieldKind uint8

// Field kinds. FieldUnknown is a field whose tag no library documents;
// it is kept as written.
const (
	FieldUnknown         FieldKind = iota
	FieldStereoGroup               // a:, o<n>:, &<n>: (interpreted)
	FieldCoordinates               // (x,y,z;...) one triple per atom
	FieldAtomLabels                // $label;label;...$ one per atom
	FieldAtomValues                // $_AV:value;...$ one per atom (molfile atom values)
	FieldAtomProps                 // atomProp:atom.name.value:...
	FieldRadicals                  // ^1: to ^7: atom lists by radical kind
	FieldRelative                  // r: the marks are relative (the molfile chiral flag unset)
	FieldCisRing                   // c: bond list, cis ring double bonds
	FieldTransRing                 // t: bond list, trans ring double bonds
	FieldUnspecifiedRing           // ctu: bond list, ring double bonds of unknown configuration
	FieldWedgeUp                   // wU:atom.bond wedge hints
	FieldWedgeDown                 // wD:atom.bond
	FieldWavy                      // w:atom.bond wavy (either) bonds
	FieldCoordinateBonds           // C:atom.bond dative bonds
	FieldHydrogenBonds             // H:atom.bond hydrogen bonds
	FieldZeroBonds                 // Z: bond list, zero-order bonds
	FieldPolymerSgroup             // Sg:type:atoms:subscript:superscript:head:tail:
	FieldDataSgroup                // SgD:atoms:name:value:operator:unit:tag:coordinates
	FieldSgroupHierarchy           // SgH:parent:child.child,...
	FieldLinkNodes                 // LN:atom:min.max[.outer.outer]
	FieldMulticentre               // m:atom:atom.atom...
	FieldFragmentGroups            // f:component.component,... (reaction fragment grouping)
	FieldLonePairs                 // lp:atom:count
	FieldRingBondCounts            // rb:atom:count (CXSMARTS)
	FieldSubstitution              // s:atom:count (CXSMARTS)
	FieldUnsaturation              // u:atom list (CXSMARTS)
	FieldLocalParity               // @: and @@: atom lists of local parities
)

var fieldKindNames = [...]string{
	FieldUnknown:         "unknown field",
	FieldStereoGroup:     "stereo groups",
	FieldCoordinates:     "coordinates",
	FieldAtomLabels:      "atom labels",
	FieldAtomValues:      "atom values",
	FieldAtomProps:       "atom properties",
	FieldRadicals:        "radicals",
	FieldRelative:        "relative flag",
	FieldCisRing:         "cis ring double bonds",
	FieldTransRing:       "trans ring double bonds",
	FieldUnspecifiedRing: "unspecified ring double bonds",
	FieldWedgeUp:         "wedge hints",
	FieldWedgeDown:       "wedge hints",
	FieldWavy:            "wavy bonds",
	FieldCoordinateBonds: "coordinate bonds",
	FieldHydrogenBonds:   "hydrogen bonds",
	FieldZeroBonds:       "zero-order bonds",
	FieldPolymerSgroup:   "polymer S-groups",
	FieldDataSgroup:      "data S-groups",
	FieldSgroupHierarchy: "S-group hierarchy",
	FieldLinkNodes:       "link nodes",
	FieldMulticentre:     "multicentre attachments",
	FieldFragmentGroups:  "fragment grouping",
	FieldLonePairs:       "lone pairs",
	FieldRingBondCounts:  "ring-bond counts",
	FieldSubstitution:    "substitution counts",
	FieldUnsaturation:    "unsaturation",
	FieldLocalParity:     "local parities",
}

// String returns a short lowercase description ("coordinates").
func (k FieldKind) String() string {
	if int(k) < len(fieldKindNames) {
		return fieldKindNames[k]
	}
	return "unknown field"
}

// Interpreted reports whether Stereoline gives the field kind a meaning;
// every other field is kept as written. Only stereo groups are
// interpreted so far.
func (k FieldKind) Interpreted() bool { return k == FieldStereoGroup }

// GroupKind is the kind of a stereo group.
type GroupKind uint8

// Stereo group kinds, as the molfile enhanced stereo and CXSMILES define
// them (common practice).
const (
	// GroupAbsolute ("a"): the centres have the configuration written.
	GroupAbsolute GroupKind = iota + 1
	// GroupOr ("o<n>"): the substance is one of the two: as written, or
	// all centres of the group inverted; which one is unknown.
	GroupOr
	// GroupAnd ("&<n>"): the substance is a mixture of both.
	GroupAnd
)

// String returns the name used in JSON: "absolute", "or", "and".
func (k GroupKind) String() string {
	switch k {
	case GroupAbsolute:
		return "absolute"
	case GroupOr:
		return "or"
	case GroupAnd:
		return "and"
	}
	return "none"
}

// Prefix returns the tag letter of the kind: "a", "o" or "&".
func (k GroupKind) Prefix() string {
	switch k {
	case GroupAbsolute:
		return "a"
	case GroupOr:
		return "o"
	case GroupAnd:
		return "&"
	}
	return ""
}

// StereoGroup is one stereo group as written.
type StereoGroup struct {
	Kind GroupKind
	// Number is the n of o<n> and &<n>; 0 for an absolute group and for
	// a tag written without a number ("o:", which RDKit 2022.09.3 reads).
	// Two fields with the same tag are two groups here, as RDKit reads
	// them.
	Number int
	// Atoms are the atom indices (0-based, through the whole record) in
	// the order written, and AtomSpans their digits. Indices beyond the
	// record are reported (extension-index) and left out.
	Atoms     []int
	AtomSpans []Span
	// Field is the index of the group's field in Extension.Fields.
	Field int
}

// Label returns the group's tag as written in canonical form: "a",
// "o1", "&2".
func (g *StereoGroup) Label() string {
	if g.Kind == GroupAbsolute {
		return "a"
	}
	return g.Kind.Prefix() + strconv.Itoa(g.Number)
}

// AtomGroups returns, for each atom of m, the index in
// m.Extension.Groups of the stereo group that lists it, or -1. An atom
// listed in two groups (an error the reader reports) is given the first.
func (m *Molecule) AtomGroups() []int {
	out := make([]int, len(m.Atoms))
	for i := range out {
		out[i] = -1
	}
	if m.Extension == nil {
		return out
	}
	for gi := range m.Extension.Groups {
		for _, a := range m.Extension.Groups[gi].Atoms {
			if a >= 0 && a < len(out) && out[a] < 0 {
				out[a] = gi
			}
		}
	}
	return out
}

// NotationEnd returns the offset where the line notation of m.Text ends:
// before the whitespace that precedes an extension block, or the length
// of the text when there is no block.
func (m *Molecule) NotationEnd() int {
	if m.Extension == nil {
		return len(m.Text)
	}
	return m.Extension.Separator.Start
}

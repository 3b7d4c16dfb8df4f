package notation

// Molecule is the graph read from one record: atoms in order of
// appearance, bonds in order of appearance, and everything the stereo
// engine needs to interpret marks. A reaction record is one Molecule whose
// atoms carry the Role of the part they were written in; atoms are
// numbered through the whole record.
//
// A Molecule is built once by Read and not changed afterwards; code that
// derives new facts returns them in values of its own.
type Molecule struct {
	Text   string // the record the spans refer to: the notation and its extension block, if any
	Atoms  []Atom
	Bonds  []Bond
	Errors ErrorList

	// Reaction is true when the record contains '>' separators; Arrows
	// holds their spans (two for a well-formed reaction).
	Reaction bool
	Arrows   []Span

	// Components counts the dot-separated parts (over all roles).
	Components int

	// Extension is the CXSMILES extension block written after the
	// notation ("C[C@H](O)CC |&1:1|"), nil when there is none.
	Extension *Extension

	// Reading is how the marks OpenSMILES leaves open are read
	// (reading.go): set by ReadWith, the default for Read.
	Reading Reading

	// ringBonds holds which bonds lie on a ring, as the reader found them
	// for the Kekulé structure (RingBonds).
	ringBonds []bool
}

// RingBonds reports which bonds lie on a ring: CyclicBonds(m, nil), as
// the reader found it, or computed afresh for a molecule the reader did
// not make. The slice is shared: callers must not change it.
func (m *Molecule) RingBonds() []bool {
	if len(m.ringBonds) == len(m.Bonds) && m.ringBonds != nil {
		return m.ringBonds
	}
	return CyclicBonds(m, nil)
}

// Role is the part of a reaction an atom was written in.
type Role uint8

// Roles. RoleNone is used for records that are not reactions.
const (
	RoleNone Role = iota
	RoleReactant
	RoleAgent
	RoleProduct
)

func (r Role) String() string {
	switch r {
	case RoleReactant:
		return "reactant"
	case RoleAgent:
		return "agent"
	case RoleProduct:
		return "product"
	}
	return "none"
}

// Atom is one atom as written, with the hydrogens the standard implies.
type Atom struct {
	Number   int    // atomic number; 0 for '*'
	Symbol   string // symbol as written ("c", "Cl", "se", "*")
	Isotope  int    // mass number; 0 when not written
	Charge   int
	Aromatic bool
	Bracket  bool // written in square brackets

	// BracketH is the hydrogen count written inside brackets ([CH3] is 3).
	// ImplicitH is the count the organic subset implies. Hydrogens written
	// as atoms of their own ([H]) are separate atoms and counted in
	// neither.
	BracketH  int
	ImplicitH int

	Map int // atom class (':n' in brackets); 0 when absent

	Chirality Chirality

	Span      Span // the whole atom token, brackets included
	Role      Role
	Component int // index of the dot-separated part, over the whole record

	// Bonds lists the atom's bond indices in the order the standard
	// defines for stereo: the bond to the preceding atom, then ring
	// closures in the order their digits are written, then branches and
	// the chain in order. The implicit or bracket hydrogen, which the
	// standard places right after the preceding atom, is not a bond; see
	// HydrogenSlot.
	Bonds []int

	// HasPrev is true when the first entry of Bonds is the bond to the
	// atom written before this one (false for the first atom of a
	// component).
	HasPrev bool
}

// HydrogenCount returns all hydrogens attached without being atoms of
// their own.
func (a *Atom) HydrogenCount() int { return a.BracketH + a.ImplicitH }

// HydrogenSlot returns the position in the stereo neighbour order that the
// bracket hydrogens occupy: 1 after a preceding atom, 0 when the atom opens
// its component. The result is meaningful only when BracketH > 0.
func (a *Atom) HydrogenSlot() int {
	if a.HasPrev {
		return 1
	}
	return 0
}

// ChiralClass is the stereo class of a chirality mark.
type ChiralClass uint8

// Chirality classes of OpenSMILES. ChiralNone means no mark.
const (
	ChiralNone ChiralClass = iota
	ChiralTH               // @ @@ @TH1 @TH2
	ChiralAL               // @AL1 @AL2 (and @ @@ read on an allene centre)
	ChiralSP               // @SP1-3
	ChiralTB               // @TB1-20
	ChiralOH               // @OH1-30
)

func (c ChiralClass) String() string {
	switch c {
	case ChiralTH:
		return "TH"
	case ChiralAL:
		return "AL"
	case ChiralSP:
		return "SP"
	case ChiralTB:
		return "TB"
	case ChiralOH:
		return "OH"
	}
	return ""
}

// Chirality is a chirality mark as written. '@' is {ChiralTH, 1, Short},
// '@@' is {ChiralTH, 2, Short}; '@TH2' is {ChiralTH, 2, false}. Whether a
// short form means TH or AL depends on the atom's surroundings and is
// decided by the stereo engine, not here.
type Chirality struct {
	Class ChiralClass
	Num   int  // 1 (anticlockwise) or 2 (clockwise) for TH and AL; the permutation number otherwise
	Short bool // written as '@' or '@@' without a class name
	Span  Span // the mark inside the bracket, from '@' to its last digit
}

// BondOrder is the order of a bond as the notation states or implies it.
type BondOrder uint8

// Bond orders. OrderAromatic is an aromatic bond (':' or implied between
// two aromatic atoms).
const (
	OrderNone BondOrder = iota
	OrderSingle
	OrderDouble
	OrderTriple
	OrderQuadruple
	OrderAromatic
)

func (o BondOrder) String() string {
	switch o {
	case OrderSingle:
		return "single"
	case OrderDouble:
		return "double"
	case OrderTriple:
		return "triple"
	case OrderQuadruple:
		return "quadruple"
	case OrderAromatic:
		return "aromatic"
	}
	return "none"
}

// Direction is a '/' or '\' mark on a single bond.
type Direction uint8

// Directions. DirUp is '/', DirDown is '\'.
const (
	DirNone Direction = iota
	DirUp
	DirDown
)

// Reverse returns the direction as seen when the bond is read the other
// way round.
func (d Direction) Reverse() Direction {
	switch d {
	case DirUp:
		return DirDown
	case DirDown:
		return DirUp
	}
	return DirNone
}

func (d Direction) String() string {
	switch d {
	case DirUp:
		return "/"
	case DirDown:
		return "\\"
	}
	return ""
}

// Bond joins two atoms. Begin is the atom written first: for a chain or
// branch bond the atom before the symbol, for a ring closure the atom
// carrying the opening digit.
type Bond struct {
	Begin, End int
	Order      BondOrder // as written or implied; aromatic stays aromatic
	Kekule     int       // 1, 2, 3 or 4 after kekulization (aromatic bonds resolved)

	// Written is the bond symbol as written ('-', '=', '#', '$', ':',
	// '/', '\\'), or 0 when implied.
	Written byte
	// Dir is the direction mark read from Begin to End ('/' is DirUp).
	Dir Direction

	// Span is the bond symbol for chain and branch bonds (empty at the
	// position between the atoms when implied); for a ring closure it is
	// the opening digits together with any bond symbol before them.
	Span Span

	// Ring closures also record the closing end. CloseSpan covers the
	// closing digits and their bond symbol; CloseWritten and CloseDir are
	// what is written there, CloseDir read from End to Begin.
	Ring         bool
	CloseSpan    Span
	CloseWritten byte
	CloseDir     Direction
}

// Other returns the atom at the other end of the bond from atom a.
func (b *Bond) Other(a int) int {
	if b.Begin == a {
		return b.End
	}
	return b.Begin
}

// Neighbour returns the i-th neighbour atom of atom a in stereo order,
// skipping the hydrogen slot.
func (m *Molecule) Neighbour(a, i int) int {
	return m.Bonds[m.Atoms[a].Bonds[i]].Other(a)
}

// Degree returns the number of atoms bonded to atom a (hydrogens that are
// not atoms of their own are not counted).
func (m *Molecule) Degree(a int) int { return len(m.Atoms[a].Bonds) }

// BondBetween returns the index of the bond joining atoms a and b, or -1.
func (m *Molecule) BondBetween(a, b int) int {
	for _, bi := range m.Atoms[a].Bonds {
		if bi >= 0 && m.Bonds[bi].Other(a) == b {
			return bi
		}
	}
	return -1
}

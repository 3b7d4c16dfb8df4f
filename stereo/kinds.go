// Package stereo finds the stereogenic units of a molecule read by
// package notation, interprets the stereo marks written on them, labels
// them by the Cahn-Ingold-Prelog rules (IUPAC 2013 recommendations, P-92,
// with the 2018 revisions for machine implementation) and reports marks
// that mean nothing or cannot be true.
package stereo

// Descriptor is a stereodescriptor: a CIP label, or the absence of one.
type Descriptor uint8

// Descriptors. DescNone means no label applies (the unit is not
// stereogenic or carries no configuration); DescUndetermined means the
// labeller gave up (the node cap was hit).
const (
	DescNone Descriptor = iota
	DescUndetermined
	DescR
	DescS
	DescPseudoR // r
	DescPseudoS // s
	DescE
	DescZ
	DescPseudoE // e
	DescPseudoZ // z
	DescM
	DescP
	DescPseudoM // m
	DescPseudoP // p
)

var descriptorNames = [...]string{"", "?", "R", "S", "r", "s", "E", "Z", "e", "z", "M", "P", "m", "p"}

func (d Descriptor) String() string {
	if int(d) < len(descriptorNames) {
		return descriptorNames[d]
	}
	return "?"
}

// Labelled reports whether the descriptor is a real CIP label.
func (d Descriptor) Labelled() bool { return d >= DescR }

// Pseudo reports whether the descriptor is one of the lowercase
// (pseudoasymmetric) labels.
func (d Descriptor) Pseudo() bool {
	switch d {
	case DescPseudoR, DescPseudoS, DescPseudoE, DescPseudoZ, DescPseudoM, DescPseudoP:
		return true
	}
	return false
}

// Mirror returns the descriptor of the same unit in the mirror image.
// Chiral labels swap (R and S, M and P). Pseudoasymmetric r, s, m and p
// stay: such a unit is its own mirror image, its ligands trading places
// with their enantiomorphs (IUPAC 2013, P-93.5.1.1). E and Z stay, as
// reflection keeps a double bond's geometry; e and z swap, since a bond
// labelled so owes its ranking to enantiomorphic ligands at one end.
func (d Descriptor) Mirror() Descriptor {
	switch d {
	case DescR:
		return DescS
	case DescS:
		return DescR
	case DescM:
		return DescP
	case DescP:
		return DescM
	case DescPseudoE:
		return DescPseudoZ
	case DescPseudoZ:
		return DescPseudoE
	}
	return d
}

// Parity is the handedness of an ordered list of ligands: whether an even
// or odd permutation takes it to a reference order.
type Parity int8

// Parities. ParityNone means unknown or not applicable.
const (
	ParityNone Parity = 0
	ParityEven Parity = 1
	ParityOdd  Parity = -1
)

func (p Parity) String() string {
	switch p {
	case ParityEven:
		return "even"
	case ParityOdd:
		return "odd"
	}
	return "none"
}

// Flip returns the opposite parity.
func (p Parity) Flip() Parity { return -p }

// Kind is the geometry of a stereogenic unit.
type Kind uint8

// Kinds of stereogenic unit.
const (
	KindTetrahedral Kind = iota
	KindDoubleBond
	KindAllene
	KindSquarePlanar
	KindTrigonalBipyramidal
	KindOctahedral
)

var kindNames = [...]string{"tetrahedral", "double-bond", "allene", "square-planar", "trigonal-bipyramidal", "octahedral"}

func (k Kind) String() string {
	if int(k) < len(kindNames) {
		return kindNames[k]
	}
	return "unknown"
}

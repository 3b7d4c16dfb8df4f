// This file implements the vocabulary of results: descriptors, kinds of
// unit and the implicit neighbour.

package stereo

import "stereoline/stereo/internal/ringgeom"

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

// ImplicitNeighbour stands for an implicit or bracket hydrogen, or a
// lone pair, where a list names ligands by atom: RankedLigand.Atom, the
// neighbour orders of NeighbourOrder, and the ligand lists of every
// engine below this package.
const ImplicitNeighbour = ringgeom.Implicit

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

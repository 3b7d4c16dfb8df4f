// Package reaction checks mapped reactions. Atom-map numbers pair the
// atoms of the reactants with those of the products, so a stereocentre
// can be followed across the arrow. Whether it keeps or inverts its
// configuration is judged from geometry: the ligands that persist
// (bonded to the centre on both sides, recognised by their map numbers)
// are compared in the written order of each side, with the written hand.
// A ligand that leaves and one that arrives take the same position (a
// substitution writes the nucleophile where the leaving group was). The
// CIP label is not used for this, because it can change with priorities
// while the arrangement stays; the result says so where the two
// disagree.
package reaction

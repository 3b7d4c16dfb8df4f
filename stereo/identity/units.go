// This file implements CompareUnits: Compare with the units named for
// mirror images too.

package identity

import "stereoline/notation"

// CompareUnits relates two structures as Compare does and, for mirror
// images, also lists the units the mirror inverts (every configured
// tetrahedral centre and allene), which Compare leaves out because the
// relation says it all. Atoms and OtherAtoms line the units of the two
// structures up, so a review of a change can name each inverted unit in
// both writings.
func CompareUnits(a, b *notation.Molecule) Comparison {
	ia, ib := Identify(a), Identify(b)
	c := compareIdentities(ia, ib, func() bool {
		return notation.MolecularFormula(a).String() == notation.MolecularFormula(b).String()
	})
	if c.Relation == Enantiomers {
		c.Differing = unitDifferences(ia.units, ib.units)
	}
	return c
}

package notation

// finish completes a molecule after the text is read: it removes the
// slots of ring closures that were never made, resolves aromatic bonds
// to a Kekulé structure, adds the implied hydrogens of the organic subset
// and checks valences. The order matters: whether an aromatic atom takes
// a double bond decides its hydrogen count, and valence is checked on the
// Kekulé orders.
func finish(m *Molecule) {
	for i := range m.Atoms {
		a := &m.Atoms[i]
		k := a.Bonds[:0]
		for _, b := range a.Bonds {
			if b >= 0 {
				k = append(k, b)
			}
		}
		a.Bonds = k
	}
	for i := range m.Bonds {
		b := &m.Bonds[i]
		switch b.Order {
		case OrderDouble:
			b.Kekule = 2
		case OrderTriple:
			b.Kekule = 3
		case OrderQuadruple:
			b.Kekule = 4
		default:
			b.Kekule = 1
		}
	}
	inRing := cyclicBondsInto(m, nil, m.ringBonds)
	m.ringBonds = inRing
	if len(inRing) == 0 {
		m.ringBonds = nil // as a molecule read afresh has it
	}
	pi := kekulize(m, inRing)
	implicitHydrogens(m, pi)
	checkValences(m)
}

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
	inRing := ringBonds(m)
	pi := kekulize(m, inRing)
	implicitHydrogens(m, pi)
	checkValences(m)
}

// ringBonds marks the bonds that lie on a cycle, that is the bonds that
// are not bridges of the graph. It runs an iterative depth-first search
// (no recursion, so a 100,000-atom chain is safe) computing low-links.
func ringBonds(m *Molecule) []bool {
	n := len(m.Atoms)
	inRing := make([]bool, len(m.Bonds))
	disc := make([]int, n)
	low := make([]int, n)
	for i := range disc {
		disc[i] = -1
	}
	type frame struct {
		atom, viaBond, next int
	}
	var stack []frame
	clock := 0
	for root := 0; root < n; root++ {
		if disc[root] >= 0 {
			continue
		}
		disc[root], low[root] = clock, clock
		clock++
		stack = append(stack[:0], frame{root, -1, 0})
		for len(stack) > 0 {
			f := &stack[len(stack)-1]
			a := &m.Atoms[f.atom]
			if f.next < len(a.Bonds) {
				bi := a.Bonds[f.next]
				f.next++
				if bi == f.viaBond {
					continue
				}
				to := m.Bonds[bi].Other(f.atom)
				if disc[to] < 0 {
					disc[to], low[to] = clock, clock
					clock++
					stack = append(stack, frame{to, bi, 0})
				} else {
					// A back edge always closes a cycle.
					inRing[bi] = true
					if disc[to] < low[f.atom] {
						low[f.atom] = disc[to]
					}
				}
				continue
			}
			stack = stack[:len(stack)-1]
			if len(stack) > 0 {
				parent := stack[len(stack)-1].atom
				if low[f.atom] < low[parent] {
					low[parent] = low[f.atom]
				}
				if low[f.atom] <= disc[parent] {
					inRing[f.viaBond] = true
				}
			}
		}
	}
	return inRing
}

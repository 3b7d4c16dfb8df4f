package depict

import (
	"slices"

	"stereoline/notation"
	"stereoline/stereo"
)

// This file implements the canonical order of atoms that every layout
// choice follows: classes refined from graph invariants (element, degree,
// hydrogens, charge, bond orders, ring membership, CIP label) by the
// neighbour classes until stable, ties broken by singling out one atom of
// the first tied class and refining again. Atoms that stay tied are
// exchanged by a symmetry of the graph, so which of them comes first does
// not change the picture beyond a symmetry of it.

func mix(h, v uint64) uint64 {
	h ^= v + 0x9e3779b97f4a7c15 + (h << 6) + (h >> 2)
	h *= 0xff51afd7ed558ccd
	return h ^ (h >> 33)
}

// canonicalRanks returns a rank per atom, 0 first, all distinct.
func canonicalRanks(m *notation.Molecule, ringAtom []bool, an *stereo.Analysis) []int {
	return ranks(m, ringAtom, an, true)
}

// symmetryClasses returns the refined classes of the constitution alone
// (no labels, no tie breaking): atoms a symmetry of the graph may
// exchange share a class.
func symmetryClasses(m *notation.Molecule, ringAtom []bool) []int {
	return ranks(m, ringAtom, nil, false)
}

func ranks(m *notation.Molecule, ringAtom []bool, an *stereo.Analysis, distinct bool) []int {
	n := len(m.Atoms)
	desc := make([]uint64, n)
	if an != nil {
		for i := range an.Units {
			u := &an.Units[i]
			for _, a := range u.Atoms {
				if a >= 0 && a < n {
					desc[a] = mix(desc[a], uint64(u.Descriptor)+1)
				}
			}
		}
	}
	inv := make([]uint64, n)
	for i := range m.Atoms {
		a := &m.Atoms[i]
		h := mix(uint64(a.Number), uint64(len(a.Bonds)))
		h = mix(h, uint64(a.HydrogenCount()))
		h = mix(h, uint64(a.Charge+16))
		h = mix(h, uint64(a.Isotope))
		if ringAtom[i] {
			h = mix(h, 7)
		}
		order := 0
		for _, bi := range a.Bonds {
			order += 1 << (4 * bondClass(&m.Bonds[bi]))
		}
		h = mix(h, uint64(order))
		inv[i] = mix(h, desc[i])
	}
	cls := denseRanks(inv)
	if !distinct {
		return refine(m, cls)
	}
	limit := n
	if n > 300 {
		limit = 0 // large records: ties broken by position at once
	}
	for {
		cls = refine(m, cls)
		if countDistinct(cls) == n {
			break
		}
		if limit == 0 {
			break
		}
		limit--
		// single out the first atom of the lowest tied class
		seen := make(map[int]int, n)
		for _, c := range cls {
			seen[c]++
		}
		pick, best := -1, n+1
		for i, c := range cls {
			if seen[c] > 1 && c < best {
				best, pick = c, i
			}
		}
		next := make([]uint64, n)
		for i, c := range cls {
			next[i] = uint64(c) * 2
			if i == pick {
				next[i]--
			}
		}
		cls = denseRanks(next)
	}
	// break what is left by position
	idx := make([]int, n)
	for i := range idx {
		idx[i] = i
	}
	slices.SortStableFunc(idx, func(a, b int) int { return cls[a] - cls[b] })
	rank := make([]int, n)
	for r, i := range idx {
		rank[i] = r
	}
	return rank
}

func kekule(b *notation.Bond) int {
	if b.Kekule >= 1 && b.Kekule <= 4 {
		return b.Kekule
	}
	switch b.Order {
	case notation.OrderDouble:
		return 2
	case notation.OrderTriple:
		return 3
	case notation.OrderQuadruple:
		return 4
	}
	return 1
}

// bondClass is the bond order canonical choices see: aromatic bonds
// alike whatever Kekulé structure the writing led to.
func bondClass(b *notation.Bond) int {
	if b.Order == notation.OrderAromatic {
		return 5
	}
	return kekule(b)
}

// refine splits classes by the classes of the neighbours until the count
// stops growing.
func refine(m *notation.Molecule, cls []int) []int {
	n := len(cls)
	count := countDistinct(cls)
	buf := make([]uint64, 0, 8)
	for iter := 0; iter < n+1; iter++ {
		next := make([]uint64, n)
		for i := range m.Atoms {
			buf = buf[:0]
			for _, bi := range m.Atoms[i].Bonds {
				b := &m.Bonds[bi]
				buf = append(buf, uint64(cls[b.Other(i)])<<3|uint64(bondClass(b)))
			}
			slices.Sort(buf)
			h := uint64(cls[i]) << 32
			for _, v := range buf {
				h = mix(h, v)
			}
			next[i] = h
		}
		// keep the old order as the major key so refinement only splits
		for i := range next {
			next[i] = uint64(cls[i])<<40 | (next[i] & (1<<40 - 1))
		}
		nc := denseRanks(next)
		c := countDistinct(nc)
		cls = nc
		if c == count {
			break
		}
		count = c
	}
	return cls
}

// denseRanks maps values to 0..k-1 in ascending order.
func denseRanks(v []uint64) []int {
	idx := make([]int, len(v))
	for i := range idx {
		idx[i] = i
	}
	slices.SortFunc(idx, func(a, b int) int {
		switch {
		case v[a] < v[b]:
			return -1
		case v[a] > v[b]:
			return 1
		}
		return a - b
	})
	out := make([]int, len(v))
	r := -1
	for k, i := range idx {
		if k == 0 || v[i] != v[idx[k-1]] {
			r++
		}
		out[i] = r
	}
	return out
}

func countDistinct(c []int) int {
	mx := -1
	for _, x := range c {
		mx = max(mx, x)
	}
	return mx + 1
}

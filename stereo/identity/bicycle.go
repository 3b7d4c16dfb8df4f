// This file implements the coupled bridgeheads of small bicycles, for
// stereoisomer counts.

package identity

import (
	"stereoline/stereo"
	"stereoline/stereo/internal/ringgeom"
)

// Bridgeheads of small bicycles. The two bridgeheads of a bicycle whose
// rings are small cannot be configured independently: each one's
// outward ligand must point away from the cage, so only one relative
// configuration exists (camphor has two stereocentres and two
// stereoisomers, not four; common practice). Seen from its outward
// ligand, the three bridges turn one way round one bridgehead and the
// other way round the other, since the two are viewed from opposite ends
// of the cage.

// bicyclePair is two coupled bridgehead units and, for each, its
// ligands in the order (outward ligand, bridge 1, bridge 2, bridge 3),
// with bridge i the same bridge at both ends.
type bicyclePair struct {
	unit  [2]int // indices into the unit list
	order [2][]int
}

// smallBicycles finds the pairs of tetrahedral units at the two
// bridgeheads of a small bicycle: every bridge a chain of ring atoms
// with two ring bonds each; bridged systems (every bridge at least one
// atom) count as small up to rings of eight atoms, fused ones (a direct
// bond between the bridgeheads) up to six round the perimeter: no
// trans-fused bicyclo[2.2.0]hexane or bicyclo[3.1.0]hexane is known,
// while trans-bicyclo[3.3.0]octane and bicyclo[4.2.0]octane exist and the
// strained seven-atom ones are left possible (common practice; the same
// line as ringgeom.MaxFusedPerimeter).
func smallBicycles(g *keyGraph, units []keyUnit) []bicyclePair {
	g.findRingSystems()
	m := g.mol
	at := map[int]int{}
	for i := range units {
		if units[i].kind == keyTetrahedral {
			at[units[i].centre] = i
		}
	}
	ringDegree := g.geom.RingDegree
	var out []bicyclePair
	for x, ux := range at {
		if ringDegree(x) != 3 {
			continue
		}
		// walk the three bridges from x
		var starts, ends, lengths []int
		for _, bi := range m.Atoms[x].Bonds {
			if !g.ring[bi] {
				continue
			}
			prev, cur, length := x, m.Bonds[bi].Other(x), 0
			for ringDegree(cur) == 2 && length <= g.n {
				next := -1
				for _, bj := range m.Atoms[cur].Bonds {
					if g.ring[bj] && m.Bonds[bj].Other(cur) != prev {
						next = m.Bonds[bj].Other(cur)
					}
				}
				if next < 0 {
					break
				}
				prev, cur = cur, next
				length++
			}
			starts = append(starts, m.Bonds[bi].Other(x))
			ends = append(ends, cur)
			lengths = append(lengths, length)
		}
		if len(ends) != 3 || ends[0] != ends[1] || ends[1] != ends[2] || ends[0] == x {
			continue
		}
		y := ends[0]
		uy, ok := at[y]
		if !ok || y < x || ringDegree(y) != 3 {
			continue // each pair once, from its lower atom
		}
		if !smallBicycle(lengths) {
			continue
		}
		// the atom each bridge reaches y through
		var yStarts []int
		for i := range starts {
			yStarts = append(yStarts, bridgeEnd(g, x, starts[i], y, lengths[i]))
		}
		ox, okx := outwardOrder(g, x, starts)
		oy, oky := outwardOrder(g, y, yStarts)
		if okx && oky {
			out = append(out, bicyclePair{unit: [2]int{ux, uy}, order: [2][]int{ox, oy}})
		}
	}
	return out
}

// smallBicycle reports whether a bicycle with bridges of these lengths
// (inner atoms; 0 for the direct bond of a fused bicycle) is small. A
// bridged one counts by its largest ring, up to that of a bicycle whose
// bridges all have ringgeom.MaxSmallBridge atoms (bicyclo[3.3.3]undecane,
// eight atoms): unlike the labeller's bicycles, one long bridge beside
// two short ones (bicyclo[4.1.1]octane) counts too.
func smallBicycle(lengths []int) bool {
	largest, fused := 0, false
	for i := range lengths {
		if lengths[i] == 0 {
			fused = true
		}
		for j := i + 1; j < len(lengths); j++ {
			largest = max(largest, lengths[i]+lengths[j]+2)
		}
	}
	if fused {
		return largest <= ringgeom.MaxFusedPerimeter
	}
	return largest <= 2*ringgeom.MaxSmallBridge+2
}

// bridgeEnd returns the neighbour of y on the bridge that leaves x
// through start and has length inner atoms (x itself for a direct bond).
func bridgeEnd(g *keyGraph, x, start, y, length int) int {
	if length == 0 {
		return x
	}
	m := g.mol
	prev, cur := x, start
	for step := 1; step < length; step++ {
		for _, bj := range m.Atoms[cur].Bonds {
			if o := m.Bonds[bj].Other(cur); g.ring[bj] && o != prev {
				prev, cur = cur, o
				break
			}
		}
	}
	return cur
}

// outwardOrder lists the ligands of bridgehead a as (outward ligand,
// bridges in the given order); the outward ligand is the one that is not
// a bridge start (a hydrogen when it has one).
func outwardOrder(g *keyGraph, a int, bridges []int) ([]int, bool) {
	m := g.mol
	out := -2
	for _, bi := range m.Atoms[a].Bonds {
		o := g.ligandOf(m.Bonds[bi].Other(a))
		if o == stereo.ImplicitNeighbour || !g.ring[bi] {
			out = o
		}
	}
	if out == -2 && g.hydro[a] == 1 {
		out = stereo.ImplicitNeighbour
	}
	if out == -2 {
		return nil, false
	}
	return append([]int{out}, bridges...), true
}

// handIn returns the hand of a tetrahedral unit with its ligands taken
// in the given order: Anticlockwise when that order reads as '@'.
func handIn(u *keyUnit, order []int) (ringgeom.Hand, bool) {
	pos := make([]int, len(u.ligands))
	used := make([]bool, len(order))
	for i, x := range u.ligands {
		pos[i] = -1
		for j, y := range order {
			if !used[j] && x == y {
				pos[i], used[j] = j, true
				break
			}
		}
		if pos[i] < 0 {
			return ringgeom.NoHand, false
		}
	}
	p, distinct := ringgeom.PermutationParity(pos)
	if !distinct {
		return ringgeom.NoHand, false
	}
	return u.hand.Permuted(p), true
}

// feasible reports whether every coupled pair of bridgeheads has its two
// bridge arrangements turning opposite ways.
func feasible(units []keyUnit, pairs []bicyclePair) bool {
	for _, p := range pairs {
		hx, okx := handIn(&units[p.unit[0]], p.order[0])
		hy, oky := handIn(&units[p.unit[1]], p.order[1])
		if okx && oky && hx == hy {
			return false
		}
	}
	return true
}

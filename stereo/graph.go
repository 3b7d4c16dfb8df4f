package stereo

import "stereoline/notation"

// graph is the stereo engine's read-only view of a molecule: neighbours in
// stereo order with their bond orders, hydrogen counts, ring membership
// and the mancude ring systems the CIP rules treat specially. It is built
// once per Analyze call and shared by every digraph.
type graph struct {
	mol  *notation.Molecule
	n    int
	adj  [][]edge // neighbours in the stereo order of notation.Atom.Bonds
	hyd  []int    // hydrogens that are not atoms of their own
	z    []int
	mass []float64 // mass used by Rule 2

	ringBond   []bool // bond lies on a ring
	ringAtom   []bool
	rings      [][]int   // smallest ring through each ring bond, deduplicated
	mancudeZ   []float64 // for an atom of a mancude ring system, the atomic number of its duplicate
	mancudeM   []float64 // and the mass of that duplicate, averaged the same way
	smallRing  []int     // per bond: size of the smallest ring containing it, 0 when acyclic
	ringOf     [][]int   // per bond: the atoms of that smallest ring
	components []int
}

// edge is one neighbour of an atom.
type edge struct {
	to, bond int
	order    int // Kekulé order 1..4
	cip      int // the order the digraph duplicates (see cipOrder)
}

// cipOrder is the bond order the hierarchical digraph uses. A double bond
// from phosphorus, sulfur, selenium or tellurium to a terminal oxygen,
// sulfur, selenium or tellurium (phosphoryl, sulfinyl, sulfonyl) is
// taken as the single bond of its dipolar form, P+-O-, without duplicate
// atoms: the validation suite of Hanson et al. 2018 ranks sulfinate and
// phosphonate centres that way (VS014, VS038, VS122, VS177).
func cipOrder(m *notation.Molecule, b *notation.Bond) int {
	o := bondOrder(b)
	if o != 2 {
		return o
	}
	for _, pair := range [2][2]int{{b.Begin, b.End}, {b.End, b.Begin}} {
		c, t := &m.Atoms[pair[0]], &m.Atoms[pair[1]]
		if hypervalentCentre(c.Number) && chalcogen(t.Number) && len(t.Bonds) == 1 && t.HydrogenCount() == 0 {
			return 1
		}
	}
	return o
}

func hypervalentCentre(z int) bool {
	return z == notation.ElemP || z == notation.ElemS || z == notation.ElemSe || z == notation.ElemTe || z == notation.ElemAs
}

func chalcogen(z int) bool {
	return z == notation.ElemO || z == notation.ElemS || z == notation.ElemSe || z == notation.ElemTe
}

func newGraph(m *notation.Molecule) *graph {
	g := &graph{mol: m, n: len(m.Atoms)}
	g.adj = make([][]edge, g.n)
	g.hyd = make([]int, g.n)
	g.z = make([]int, g.n)
	g.mass = make([]float64, g.n)
	for i := range m.Atoms {
		a := &m.Atoms[i]
		g.z[i] = a.Number
		g.hyd[i] = a.HydrogenCount()
		g.mass[i] = atomMass(a.Number, a.Isotope)
		for _, bi := range a.Bonds {
			if bi < 0 || bi >= len(m.Bonds) {
				continue
			}
			b := &m.Bonds[bi]
			g.adj[i] = append(g.adj[i], edge{to: b.Other(i), bond: bi, order: bondOrder(b), cip: cipOrder(m, b)})
		}
	}
	g.findRings()
	g.findMancude()
	return g
}

func bondOrder(b *notation.Bond) int {
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

// degree counts the atoms bonded to a plus its hydrogens.
func (g *graph) degree(a int) int { return len(g.adj[a]) + g.hyd[a] }

// valence is the sum of bond orders plus hydrogens.
func (g *graph) valence(a int) int {
	v := g.hyd[a]
	for _, e := range g.adj[a] {
		v += e.order
	}
	return v
}

// doubleBonds counts the bonds of order 2 or more at a.
func (g *graph) doubleBonds(a int) (n int) {
	for _, e := range g.adj[a] {
		if e.order >= 2 {
			n++
		}
	}
	return n
}

// findRings marks ring bonds and records, for every ring bond, the
// smallest ring through it (a breadth-first search from one end to the
// other that avoids the bond itself).
func (g *graph) findRings() {
	m := g.mol
	g.ringBond = make([]bool, len(m.Bonds))
	g.smallRing = make([]int, len(m.Bonds))
	g.ringOf = make([][]int, len(m.Bonds))
	g.ringAtom = make([]bool, g.n)
	seen := map[string]bool{}
	prev := make([]int, g.n)
	dist := make([]int, g.n)
	for bi := range m.Bonds {
		b := &m.Bonds[bi]
		if b.Begin < 0 || b.Begin >= g.n || b.End < 0 || b.End >= g.n {
			continue
		}
		for i := range dist {
			dist[i] = -1
		}
		src, dst := b.Begin, b.End
		dist[src] = 0
		queue := []int{src}
		found := false
		for len(queue) > 0 && !found {
			u := queue[0]
			queue = queue[1:]
			for _, e := range g.adj[u] {
				if e.bond == bi || dist[e.to] >= 0 {
					continue
				}
				dist[e.to] = dist[u] + 1
				prev[e.to] = u
				if e.to == dst {
					found = true
					break
				}
				queue = append(queue, e.to)
			}
		}
		if !found {
			continue
		}
		g.ringBond[bi] = true
		ring := []int{dst}
		for v := dst; v != src; {
			v = prev[v]
			ring = append(ring, v)
		}
		g.smallRing[bi] = len(ring)
		g.ringOf[bi] = ring
		for _, a := range ring {
			g.ringAtom[a] = true
		}
		key := ringKey(ring)
		if !seen[key] {
			seen[key] = true
			g.rings = append(g.rings, ring)
		}
	}
}

func ringKey(ring []int) string {
	s := append([]int(nil), ring...)
	for i := 1; i < len(s); i++ {
		for j := i; j > 0 && s[j] < s[j-1]; j-- {
			s[j], s[j-1] = s[j-1], s[j]
		}
	}
	b := make([]byte, 0, 4*len(s))
	for _, v := range s {
		b = append(b, byte(v), byte(v>>8), byte(v>>16), ',')
	}
	return string(b)
}

// findMancude finds the rings with the most non-cumulative double bonds
// (aromatic rings, written aromatic or in a Kekulé form) and gives each of
// their atoms the duplicate atomic number P-92.1.4.4 asks for: the
// average of the atomic numbers of the atoms it is double-bonded to in
// the Kekulé structures, approximated by its neighbours in the system.
func (g *graph) findMancude() {
	g.mancudeZ = make([]float64, g.n)
	g.mancudeM = make([]float64, g.n)
	in := make([]bool, g.n)
	sp2 := make([]bool, g.n)
	for a := 0; a < g.n; a++ {
		if g.mol.Atoms[a].Aromatic {
			sp2[a] = true
			continue
		}
		if !g.ringAtom[a] {
			continue
		}
		// one double bond, on a ring bond
		d := 0
		ring := false
		for _, e := range g.adj[a] {
			if e.order == 2 {
				d++
				ring = g.ringBond[e.bond]
			} else if e.order > 2 {
				d += 2
			}
		}
		sp2[a] = d == 1 && ring
	}
	changed := true
	for changed {
		changed = false
		for _, ring := range g.rings {
			if len(ring) < 5 || len(ring) > 7 {
				continue
			}
			electrons, ok := 0, true
			done := true
			for _, a := range ring {
				if !in[a] {
					done = false
				}
				switch {
				case sp2[a] && g.mol.Atoms[a].Aromatic && (g.z[a] != notation.ElemC) && g.doubleBonds(a) == 0 && (g.hyd[a] > 0 || g.z[a] != notation.ElemN || len(g.adj[a]) == 3):
					electrons += 2 // pyrrole-type nitrogen, furan oxygen
				case sp2[a]:
					electrons++
				case len(ring) == 5 && g.doubleBonds(a) == 0 && (g.z[a] == notation.ElemN || g.z[a] == notation.ElemO || g.z[a] == notation.ElemS):
					electrons += 2
				default:
					ok = false
				}
			}
			if !ok || done || electrons%4 != 2 {
				continue
			}
			for _, a := range ring {
				if !in[a] {
					in[a] = true
					changed = true
				}
			}
		}
	}
	for a := 0; a < g.n; a++ {
		if !in[a] || !sp2[a] {
			continue
		}
		sum, cnt, mass := 0, 0, 0.0
		for _, e := range g.adj[a] {
			if in[e.to] && sp2[e.to] && g.ringBond[e.bond] {
				sum += g.z[e.to]
				mass += g.mass[e.to]
				cnt++
			}
		}
		if cnt > 0 {
			g.mancudeZ[a] = float64(sum) / float64(cnt)
			g.mancudeM[a] = mass / float64(cnt)
		}
	}
}

// inMancude reports whether the bond joins two atoms of one mancude
// system, so that its duplicate atoms take averaged atomic numbers.
func (g *graph) inMancude(a, b int) bool {
	return g.mancudeZ[a] > 0 && g.mancudeZ[b] > 0
}

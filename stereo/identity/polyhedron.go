// This file implements square-planar, trigonal-bipyramidal and octahedral
// centres in the key.

package identity

import (
	"slices"

	"stereoline/notation"
)

// Square-planar, trigonal-bipyramidal and octahedral centres in the
// canonical form. Such a centre is written as the symmetry classes of its
// ligands placed on the polyhedron its mark describes, read in a fixed
// order of positions, minimised over the rotations of the polyhedron; a
// rotation never changes the compound, so every writing of it gives the
// same code, while cis- and trans-diamminedichloroplatinum (classes a a b
// b round the square, or a b a b) do not. The mirror image is read the
// same way after a reflection, which reverses the turn around the axis.

// polyhedronCodes returns, for every marked polyhedral centre, its
// position in the order, its class and its code; cls gives the symmetry
// class of each atom (-1 for folded hydrogens), mirrored reflects every
// centre first.
func polyhedronCodes(m *notation.Molecule, rank, cls []int, folded []bool, mirrored bool) [][]int {
	var out [][]int
	for a := range m.Atoms {
		at := &m.Atoms[a]
		g := at.Chirality.Class
		if folded[a] || g != notation.ChiralSP && g != notation.ChiralTB && g != notation.ChiralOH {
			continue
		}
		ligands := polyhedronLigands(m, a, cls)
		from, to, ring, ok := notation.Arrangement(g, at.Chirality.Num, len(ligands))
		if !ok {
			continue
		}
		ring = slices.Clone(ring)
		if mirrored && g != notation.ChiralSP {
			slices.Reverse(ring)
		}
		code := []int{rank[a], int(g)}
		code = append(code, polyhedronCode(g, ligands, from, to, ring)...)
		out = append(out, code)
	}
	slices.SortFunc(out, compareInts)
	return out
}

// polyhedronLigands lists the classes of a centre's ligands in its stereo
// neighbour order, a bracket hydrogen at its slot as -1.
func polyhedronLigands(m *notation.Molecule, a int, cls []int) []int {
	at := &m.Atoms[a]
	var out []int
	for i := range at.Bonds {
		if i == at.HydrogenSlot() && at.BracketH > 0 {
			out = append(out, -1)
		}
		out = append(out, cls[m.Neighbour(a, i)])
	}
	if at.BracketH > 0 && at.HydrogenSlot() >= len(at.Bonds) {
		out = append(out, -1)
	}
	return out
}

// polyhedronCode is the smallest reading of the ligand classes over the
// rotations of the polyhedron.
func polyhedronCode(g notation.ChiralClass, lig []int, from, to int, ring []int) []int {
	var best []int
	try := func(c []int) {
		if best == nil || compareInts(c, best) < 0 {
			best = c
		}
	}
	switch g {
	case notation.ChiralSP:
		// the eight symmetries of a square, turning it over included:
		// in space, turning over is a rotation
		for _, r := range [][]int{ring, reversed(ring)} {
			for k := 0; k < 4; k++ {
				try([]int{lig[r[k]], lig[r[(k+1)%4]], lig[r[(k+2)%4]], lig[r[(k+3)%4]]})
			}
		}
	case notation.ChiralTB:
		// the axis either way up (seen from the other end the ring
		// turns the other way), the ring from each of its atoms
		for _, v := range []struct {
			top, bottom int
			r           []int
		}{{from, to, ring}, {to, from, reversed(ring)}} {
			for k := 0; k < 3; k++ {
				try([]int{lig[v.top], lig[v.bottom], lig[v.r[k]], lig[v.r[(k+1)%3]], lig[v.r[(k+2)%3]]})
			}
		}
	case notation.ChiralOH:
		// the 24 rotations of an octahedron: any of the six positions
		// on top, then the four turns about that axis
		pos := map[int][3]int{from: {0, 0, 1}, to: {0, 0, -1},
			ring[0]: {1, 0, 0}, ring[1]: {0, 1, 0}, ring[2]: {-1, 0, 0}, ring[3]: {0, -1, 0}}
		at := map[[3]int]int{}
		for i, p := range pos {
			at[p] = i
		}
		for _, rot := range octahedronRotations {
			c := make([]int, 0, 6)
			for _, target := range octahedronReadOrder {
				// the ligand that the rotation brings to target
				src := rotate(transpose(rot), target)
				c = append(c, lig[at[src]])
			}
			try(c)
		}
	}
	return best
}

func reversed(r []int) []int {
	out := slices.Clone(r)
	slices.Reverse(out)
	return out
}

// octahedronReadOrder is the fixed order in which the six positions are
// read.
var octahedronReadOrder = [6][3]int{{0, 0, 1}, {0, 0, -1}, {1, 0, 0}, {0, 1, 0}, {-1, 0, 0}, {0, -1, 0}}

// octahedronRotations are the 24 proper rotations of a cube: signed
// permutation matrices of determinant +1.
var octahedronRotations = func() [][3][3]int {
	var out [][3][3]int
	perms := [][3]int{{0, 1, 2}, {0, 2, 1}, {1, 0, 2}, {1, 2, 0}, {2, 0, 1}, {2, 1, 0}}
	for _, p := range perms {
		for s := 0; s < 8; s++ {
			var m [3][3]int
			for i := 0; i < 3; i++ {
				v := 1
				if s&(1<<i) != 0 {
					v = -1
				}
				m[i][p[i]] = v
			}
			if det3(m) == 1 {
				out = append(out, m)
			}
		}
	}
	return out
}()

func det3(m [3][3]int) int {
	return m[0][0]*(m[1][1]*m[2][2]-m[1][2]*m[2][1]) - m[0][1]*(m[1][0]*m[2][2]-m[1][2]*m[2][0]) + m[0][2]*(m[1][0]*m[2][1]-m[1][1]*m[2][0])
}

func rotate(m [3][3]int, v [3]int) [3]int {
	var out [3]int
	for i := 0; i < 3; i++ {
		out[i] = m[i][0]*v[0] + m[i][1]*v[1] + m[i][2]*v[2]
	}
	return out
}

func transpose(m [3][3]int) [3][3]int {
	var t [3][3]int
	for i := 0; i < 3; i++ {
		for j := 0; j < 3; j++ {
			t[i][j] = m[j][i]
		}
	}
	return t
}

// hasPolyhedra reports whether m has a square-planar, trigonal-bipyramidal
// or octahedral mark, and whether one of them can change in a mirror
// (square-planar ones cannot).
func hasPolyhedra(m *notation.Molecule) (any, chiral bool) {
	for a := range m.Atoms {
		switch m.Atoms[a].Chirality.Class {
		case notation.ChiralSP:
			any = true
		case notation.ChiralTB, notation.ChiralOH:
			any, chiral = true, true
		}
	}
	return any, chiral
}

package depict

import (
	"math"

	"stereoline/notation"
)

// This file implements the fallback layout for records too large for the
// full one: atoms in depth-first order along a serpentine, every bond a
// straight line, no stereo. It is linear in the size of the record.

func fallbackDrawing(m *notation.Molecule, opt Options, reason string) *Drawing {
	n := len(m.Atoms)
	d := &Drawing{Title: opt.Title, Notation: m.Text, Numbers: opt.Numbers, Simplified: true}
	nbr := make([][]int, n)
	for bi := range m.Bonds {
		b := &m.Bonds[bi]
		if b.Begin < 0 || b.End < 0 || b.Begin >= n || b.End >= n {
			continue
		}
		nbr[b.Begin] = append(nbr[b.Begin], b.End)
		nbr[b.End] = append(nbr[b.End], b.Begin)
	}
	order := make([]int, 0, n)
	seen := make([]bool, n)
	var stack []int
	for s := 0; s < n; s++ {
		if seen[s] {
			continue
		}
		stack = append(stack[:0], s)
		seen[s] = true
		for len(stack) > 0 {
			x := stack[len(stack)-1]
			stack = stack[:len(stack)-1]
			order = append(order, x)
			for k := len(nbr[x]) - 1; k >= 0; k-- {
				if y := nbr[x][k]; !seen[y] {
					seen[y] = true
					stack = append(stack, y)
				}
			}
		}
	}
	width := max(8, int(math.Sqrt(float64(n))*1.5))
	pos := make([]Point, n)
	for k, a := range order {
		row, col := k/width, k%width
		if row%2 == 1 {
			col = width - 1 - col
		}
		y := -float64(row) * 1.6
		if col%2 == 1 {
			y += 0.5
		}
		pos[a] = Point{float64(col) * 0.87, y}
	}
	for i := range m.Atoms {
		a := &m.Atoms[i]
		at := Atom{N: i + 1, Element: a.Number, Symbol: symbolOf(a), P: pos[i], Hydrogens: a.HydrogenCount(),
			Charge: a.Charge, Isotope: a.Isotope, Role: a.Role}
		d.Atoms = append(d.Atoms, at)
	}
	for bi := range m.Bonds {
		b := &m.Bonds[bi]
		if b.Begin < 0 || b.End < 0 || b.Begin >= n || b.End >= n {
			continue
		}
		db := Bond{A: b.Begin, B: b.End, Order: kekule(b), Narrow: -1}
		switch {
		case b.Order == notation.OrderAromatic:
			db.Style = StyleAromatic
		case db.Order == 2:
			db.Style = StyleDouble
		case db.Order >= 3:
			db.Style = StyleTriple
		}
		d.Bonds = append(d.Bonds, db)
	}
	nb := make([][]int, n)
	for _, b := range d.Bonds {
		nb[b.A] = append(nb[b.A], b.B)
		nb[b.B] = append(nb[b.B], b.A)
	}
	for i := range d.Atoms {
		labelAtom(d, i, nb[i])
	}
	d.Notes = append(d.Notes, Note{Text: reason})
	highlight(d, m, nil, opt.Diagnostics)
	return d
}

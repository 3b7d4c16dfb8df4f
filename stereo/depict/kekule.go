package depict

import (
	"slices"

	"stereoline/notation"
)

// This file implements the Kekulé structure the drawing shows for bonds
// written aromatic. The reader's Kekulé structure follows the order of
// the text, so two writings of one ring could draw their double bonds in
// different places; the drawing matches the same atoms again, in
// canonical order: which atoms take a double bond is the reader's
// (valence decides it), which bonds carry them is chosen here.

// maxKekuleWork bounds the augmenting-path search; past it the reader's
// structure is kept.
const maxKekuleWork = 200000

// canonicalKekule returns the order to draw for each bond of the
// molecule: the reader's, but for bonds written aromatic, matched again
// in canonical order.
func (l *layout) canonicalKekule() []int {
	m := l.m
	order := make([]int, len(m.Bonds))
	need := make([]bool, l.n)
	any := false
	for bi := range m.Bonds {
		b := &m.Bonds[bi]
		order[bi] = kekule(b)
		if b.Order == notation.OrderAromatic && b.Begin >= 0 && b.End >= 0 {
			any = true
			if b.Kekule == 2 {
				need[b.Begin], need[b.End] = true, true
			}
		}
	}
	if !any {
		return order
	}
	aromatic := func(a, y int) int {
		bi := m.BondBetween(a, y)
		if bi >= 0 && m.Bonds[bi].Order == notation.OrderAromatic {
			return bi
		}
		return -1
	}
	mate := make([]int, l.n)
	for i := range mate {
		mate[i] = -1
	}
	atoms := make([]int, 0, l.n)
	for a := 0; a < l.n; a++ {
		if need[a] {
			atoms = append(atoms, a)
		}
	}
	slices.SortFunc(atoms, func(a, b int) int { return l.rank[a] - l.rank[b] })
	// greedy in canonical order, then augmenting paths
	for _, a := range atoms {
		if mate[a] >= 0 {
			continue
		}
		for _, y := range l.nbr[a] {
			if need[y] && mate[y] < 0 && aromatic(a, y) >= 0 {
				mate[a], mate[y] = y, a
				break
			}
		}
	}
	work := 0
	for _, a := range atoms {
		if mate[a] >= 0 {
			continue
		}
		// breadth-first search for an augmenting path from a
		prev := map[int]int{a: -1}
		q := []int{a}
		end := -1
		for k := 0; k < len(q) && end < 0; k++ {
			x := q[k]
			for _, y := range l.nbr[x] {
				work++
				if work > maxKekuleWork {
					return l.readerKekule()
				}
				if !need[y] || aromatic(x, y) < 0 || y == mate[x] {
					continue
				}
				if _, seen := prev[y]; seen {
					continue
				}
				prev[y] = x
				if mate[y] < 0 {
					end = y
					break
				}
				z := mate[y]
				if _, seen := prev[z]; !seen {
					prev[z] = y
					q = append(q, z)
				}
			}
		}
		if end < 0 {
			return l.readerKekule() // no perfect matching: keep the reader's
		}
		for y := end; y >= 0; {
			x := prev[y]
			nx := mate[x]
			mate[x], mate[y] = y, x
			if x == a {
				break
			}
			y = nx
		}
	}
	for bi := range m.Bonds {
		b := &m.Bonds[bi]
		if b.Order != notation.OrderAromatic || b.Begin < 0 || b.End < 0 {
			continue
		}
		order[bi] = 1
		if mate[b.Begin] == b.End {
			order[bi] = 2
		}
	}
	return order
}

// readerKekule is the reader's Kekulé structure.
func (l *layout) readerKekule() []int {
	order := make([]int, len(l.m.Bonds))
	for bi := range l.m.Bonds {
		order[bi] = kekule(&l.m.Bonds[bi])
	}
	return order
}

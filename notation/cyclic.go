package notation

import "sync"

// CyclicBonds marks the bonds that lie on a ring, as FindRings's
// BondInRing says, on the graph of the bonds keep accepts (nil: every
// bond): every bond that is no bridge of that graph (Tarjan's low links,
// with an explicit stack, so a chain of a million atoms is safe). Bonds
// with an end out of range or joining an atom to itself are left out
// (the reader makes neither); two bonds between one pair of atoms form a
// ring. Its working storage is pooled: the reader and the identity keys
// of every record of a list ask for it.
func CyclicBonds(m *Molecule, keep func(*Bond) bool) []bool {
	return cyclicBondsInto(m, keep, nil)
}

// cyclicBondsInto is CyclicBonds writing into dst's storage when it is
// large enough (a reused molecule's).
func cyclicBondsInto(m *Molecule, keep func(*Bond) bool, dst []bool) []bool {
	n := len(m.Atoms)
	usable := func(b *Bond) bool {
		return b.Begin >= 0 && b.Begin < n && b.End >= 0 && b.End < n && b.Begin != b.End && (keep == nil || keep(b))
	}
	sc := cyclicScratches.Get().(*cyclicScratch)
	defer sc.put()
	start := grownTo(sc.start, n+1)
	clear(start)
	for i := range m.Bonds {
		if b := &m.Bonds[i]; usable(b) {
			start[b.Begin+1]++
			start[b.End+1]++
		}
	}
	for a := 0; a < n; a++ {
		start[a+1] += start[a]
	}
	arcs := grownTo(sc.arcs, start[n])
	fill := grownTo(sc.fill, n)
	copy(fill, start[:n])
	for i := range m.Bonds {
		if b := &m.Bonds[i]; usable(b) {
			arcs[fill[b.Begin]] = cyclicArc{i, b.End}
			fill[b.Begin]++
			arcs[fill[b.End]] = cyclicArc{i, b.Begin}
			fill[b.End]++
		}
	}
	inRing := grownTo(dst, len(m.Bonds))
	clear(inRing)
	disc, low := fill, grownTo(sc.low, n) // fill is spent: it holds the discovery times now
	for i := range disc {
		disc[i] = -1
	}
	stack := sc.stack[:0]
	clock := 0
	for root := 0; root < n; root++ {
		if disc[root] >= 0 {
			continue
		}
		disc[root], low[root] = clock, clock
		clock++
		stack = append(stack[:0], cyclicFrame{root, -1, start[root]})
		for len(stack) > 0 {
			f := &stack[len(stack)-1]
			if f.next < start[f.atom+1] {
				e := arcs[f.next]
				f.next++
				if e.bond == f.via {
					continue
				}
				if disc[e.to] < 0 {
					disc[e.to], low[e.to] = clock, clock
					clock++
					stack = append(stack, cyclicFrame{e.to, e.bond, start[e.to]})
					continue
				}
				inRing[e.bond] = true // a bond back up the tree closes a ring
				low[f.atom] = min(low[f.atom], disc[e.to])
				continue
			}
			done := *f
			stack = stack[:len(stack)-1]
			if len(stack) > 0 {
				p := stack[len(stack)-1].atom
				low[p] = min(low[p], low[done.atom])
				if low[done.atom] <= disc[p] {
					inRing[done.via] = true
				}
			}
		}
	}
	sc.start, sc.arcs, sc.fill, sc.low, sc.stack = start, arcs, fill, low, stack
	return inRing
}

// cyclicScratch is the working storage of CyclicBonds, kept between
// calls: the keys of every record of a list ask for the ring bonds.
type cyclicScratch struct {
	start, fill, low []int
	arcs             []cyclicArc
	stack            []cyclicFrame
}

type cyclicArc struct{ bond, to int }

type cyclicFrame struct{ atom, via, next int }

var cyclicScratches = sync.Pool{New: func() any { return new(cyclicScratch) }}

// put gives sc back to the pool unless a large record grew it past
// cyclicKeep atoms, which the pool does not keep.
func (sc *cyclicScratch) put() {
	if cap(sc.start) <= cyclicKeep && cap(sc.arcs) <= 4*cyclicKeep {
		cyclicScratches.Put(sc)
	}
}

const cyclicKeep = 4096

// grownTo returns xs with length n, reusing its memory when it can.
func grownTo[T any](xs []T, n int) []T {
	if cap(xs) < n {
		return make([]T, n)
	}
	return xs[:n]
}

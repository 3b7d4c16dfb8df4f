// This file implements the constitution pre-key.

package identity

import (
	"sync"

	"stereoline/notation"
	"stereoline/stereo/internal/ringgeom"
)

// A cheap key of a record's constitution, computed before the identity
// keys. Two records can be duplicates, mirror images or stereoisomers of
// each other only if they have the same constitution, so a record whose
// pre-key no other record of the list shares needs no identity key: the
// expensive canonical ordering runs only for the records whose pre-keys
// collide. The pre-key must therefore never tell apart two writings that
// the identity key takes for one constitution; it may take different
// constitutions for one (a collision costs only an identity key).
//
// It is built from what the identity key's atom invariants already
// distinguish (canon.go: atomic number, isotope, charge, hydrogen
// count, neighbours), and deliberately from nothing the key normalises:
//   - bond orders are left out, since a Kekulé ring and its aromatic
//     writing are one constitution to the key;
//   - hydrogen atoms are not vertices: each is counted on the heavy atom
//     it is bonded to, so C[H] and [CH4]-style writings agree whether or
//     not the key folds that [H] (its isotope and charge, which a folded
//     [H] lacks, count too);
//   - atom classes (":1") are left out, as the key ignores them.
//
// On the heavy-atom graph so labelled, colour refinement (repeatedly
// hashing an atom's label with the multiset of its neighbours' labels;
// common practice, the Weisfeiler-Lehman test) separates almost all
// constitutions that differ, while isomorphic graphs always get the same
// hash, whatever order the atoms were written in. The labeller's
// symmetry classes (stereo/perceive.go) refine by bond order and valence
// as well and stop once the classes stop splitting; neither would do
// here.

// preKeyRounds bounds the refinement rounds, so a very large molecule
// costs time linear in its size; a chain longer than this may collide
// with a rearranged one, which is allowed.
const preKeyRounds = 32

// preKeyScratch is the working memory of one pre-key, reused between
// records: a list of 100,000 records would otherwise allocate it 100,000
// times.
type preKeyScratch struct {
	heavy []int    // atom -> heavy vertex, -1 for hydrogen atoms
	start []int    // vertex -> first of its neighbours in nbrs (one more entry than vertices)
	nbrs  []int    // neighbours of every vertex, one after another
	label []uint64 // current colour of each vertex
	next  []uint64
	table []uint64 // classes's hash table
}

var preKeyScratches = sync.Pool{New: func() any { return new(preKeyScratch) }}

// grow returns xs with length n, reusing its memory when it can.
func grow[T any](xs []T, n int) []T {
	if cap(xs) < n {
		return make([]T, n)
	}
	return xs[:n]
}

// ConstitutionPreKey returns the pre-key of a molecule that read without
// error.
func ConstitutionPreKey(m *notation.Molecule) uint64 {
	sc := preKeyScratches.Get().(*preKeyScratch)
	defer preKeyScratches.Put(sc)
	n := len(m.Atoms)
	sc.heavy = grow(sc.heavy, n)
	hydrogens, hAtoms, vertices := 0, 0, 0
	for a := range m.Atoms {
		at := &m.Atoms[a]
		hydrogens += at.HydrogenCount()
		if at.Number == 1 {
			hAtoms++
			sc.heavy[a] = -1
			continue
		}
		sc.heavy[a] = vertices
		vertices++
	}
	sc.label = grow(sc.label, vertices)
	sc.start = grow(sc.start, vertices+1)
	sc.nbrs = sc.nbrs[:0]
	for a := range m.Atoms {
		v := sc.heavy[a]
		if v < 0 {
			continue
		}
		sc.start[v] = len(sc.nbrs)
		at := &m.Atoms[a]
		h := at.HydrogenCount()
		var hKinds uint64 // isotopes and charges of hydrogen atoms; a folded [H] has neither, and Scramble(0) is 0
		for _, bi := range at.Bonds {
			if bi < 0 || bi >= len(m.Bonds) {
				continue
			}
			o := m.Bonds[bi].Other(a)
			switch {
			case o < 0 || o >= n || o == a:
			case sc.heavy[o] < 0:
				h++ // a hydrogen atom counts on its heavy neighbour
				hKinds += ringgeom.Scramble(uint64(int64(m.Atoms[o].Isotope))<<8 ^ uint64(int64(m.Atoms[o].Charge)))
			default:
				sc.nbrs = append(sc.nbrs, sc.heavy[o])
			}
		}
		degree := len(sc.nbrs) - sc.start[v]
		sc.label[v] = mix(mix(mix(mix(uint64(at.Number), uint64(int64(at.Isotope))), uint64(int64(at.Charge))), uint64(h)), uint64(degree)) + hKinds
	}
	sc.start[vertices] = len(sc.nbrs)
	label := sc.refineColours(vertices)
	// Hydrogens counted on atoms and written as atoms together: the key
	// folds some [H] atoms into counts, so neither number alone is fixed.
	key := mix(mix(uint64(vertices), uint64(len(sc.nbrs))), uint64(hydrogens+hAtoms))
	var sum uint64
	for _, l := range label {
		sum += ringgeom.Scramble(l) // a sum of scrambled labels is a hash of the multiset
	}
	return mix(key, sum)
}

// refineColours runs colour refinement until the colours stop
// splitting, and then one round more, for at most as many rounds as
// there are atoms and at most preKeyRounds. Stopping when the colours
// alone stop splitting would not do: two molecules can each reach
// distinct colours for every atom after one round and still differ
// further away (a chain segment written the other way round). The one
// round more is what tells them apart. Once a round splits no class,
// each atom's next label says which classes its neighbours are in, how
// many of each, so the multiset of those labels fixes the class sizes
// and how the classes are joined: two molecules whose multisets agree
// then stay alike in every further round (refinement cannot tell them
// apart, common practice: equitable partitions), and two whose
// multisets differ already get different keys. The round the colours
// stop splitting in is the same for every writing of one constitution,
// so the key still never tells writings apart; it saves most rounds,
// since most molecules stop splitting within a few rounds.
func (sc *preKeyScratch) refineColours(vertices int) []uint64 {
	label := sc.label
	next := grow(sc.next, vertices)
	classes := sc.classes(label)
	for round := 0; round < min(vertices, preKeyRounds); round++ {
		for v := range label {
			// the labels are scrambled already (mix), so their sum is a
			// hash of the neighbours' multiset as it stands
			var around uint64
			for _, w := range sc.nbrs[sc.start[v]:sc.start[v+1]] {
				around += label[w]
			}
			next[v] = mix(label[v], around)
		}
		label, next = next, label
		c := sc.classes(label)
		if c == classes {
			break // no class split: this round was the one more
		}
		classes = c
	}
	sc.label, sc.next = label, next
	return label
}

// classes counts the distinct values among labels, in an open-addressing
// table of the scratch space.
func (sc *preKeyScratch) classes(labels []uint64) int {
	size := 16
	for size < 2*len(labels) {
		size *= 2
	}
	table := grow(sc.table, size)
	clear(table)
	sc.table = table
	mask := uint64(size - 1)
	n, zero := 0, false
	for _, l := range labels {
		if l == 0 { // the empty slot's value, counted aside
			if !zero {
				zero = true
				n++
			}
			continue
		}
		for i := l & mask; ; i = (i + 1) & mask {
			if table[i] == l {
				break
			}
			if table[i] == 0 {
				table[i] = l
				n++
				break
			}
		}
	}
	return n
}

// mix combines a hash with one more value, order-sensitively.
func mix(h, x uint64) uint64 {
	return ringgeom.Scramble(h*0x9e3779b97f4a7c15 + x + 1)
}

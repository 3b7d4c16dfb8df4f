package notation

import (
	"slices"
	"sort"
	"strings"
	"sync"
)

// kekulizeBudget bounds the matching work of one record, so that a huge
// aromatic sheet written to defeat the greedy start ends in a kekulize
// error instead of a long wait.
const kekulizeBudget = 50_000_000

// kekulize turns the aromatic bonds of m into a Kekulé structure: every
// aromatic atom that needs a double bond (pi) gets exactly one, on an
// aromatic ring bond to another such atom. That is a perfect matching on
// the graph of those atoms, found by a greedy start and augmenting paths
// (Edmonds' blossom method, since fused rings give odd cycles). It
// returns which atoms take a double bond and reports atoms that cannot.
func kekulize(m *Molecule, inRing []bool) []bool {
	pi := make([]bool, len(m.Atoms))
	any := false
	for i := range m.Atoms {
		if m.Atoms[i].Aromatic {
			any = true
			break
		}
	}
	if !any {
		return pi
	}
	// Which aromatic bonds belong to the aromatic system: aromatic bonds
	// between aromatic ring atoms. A direction mark between two aromatic
	// ring atoms ("c/c", which writers put on the ring bonds next to an
	// exocyclic double bond) is read as a single bond, as OpenSMILES
	// says; when that leaves the ring without a Kekule structure, it is
	// taken as the aromatic bond it stands in, as RDKit 2022.09 reads it
	// (aromatic, with its direction).
	arom := aromaticBonds(m, inRing, false)
	pi, unringed, match := kekuleAttempt(m, arom)
	var match2 *matcher
	if (len(unringed) > 0 || match.unmatched()) && hasMarkedAromaticBond(m, inRing) {
		arom2 := aromaticBonds(m, inRing, true)
		var pi2 []bool
		var unringed2 []int
		pi2, unringed2, match2 = kekuleAttempt(m, arom2)
		if len(unringed2) < len(unringed) || !match2.unmatched() {
			arom, pi, unringed, match = arom2, pi2, unringed2, match2
		}
	}
	reportUnringed(m, unringed, inRing)
	for bi := range m.Bonds {
		if arom[bi] {
			m.Bonds[bi].Kekule = 1
		}
	}
	for v, w := range match.mate {
		if w > v {
			a, b := match.atoms[v], match.atoms[w]
			m.Bonds[m.BondBetween(a, b)].Kekule = 2
		}
	}
	match.report()
	match.release()
	if match2 != nil && match2 != match {
		match2.release()
	}
	return pi
}

// aromaticBonds marks the bonds of the aromatic system; marked, when
// set, adds the direction-marked single bonds between aromatic ring
// atoms.
func aromaticBonds(m *Molecule, inRing []bool, marked bool) []bool {
	arom := make([]bool, len(m.Bonds))
	for bi := range m.Bonds {
		b := &m.Bonds[bi]
		if !m.Atoms[b.Begin].Aromatic || !m.Atoms[b.End].Aromatic || !inRing[bi] {
			continue
		}
		if b.Order == OrderAromatic || marked && b.Order == OrderSingle && (b.Dir != DirNone || b.CloseDir != DirNone) {
			arom[bi] = true
		}
	}
	return arom
}

// hasMarkedAromaticBond reports a direction mark between two aromatic
// ring atoms.
func hasMarkedAromaticBond(m *Molecule, inRing []bool) bool {
	for bi := range m.Bonds {
		b := &m.Bonds[bi]
		if inRing[bi] && b.Order == OrderSingle && (b.Dir != DirNone || b.CloseDir != DirNone) &&
			m.Atoms[b.Begin].Aromatic && m.Atoms[b.End].Aromatic {
			return true
		}
	}
	return false
}

// kekuleAttempt decides which aromatic atoms need a double bond over
// the aromatic bonds arom and matches them; unringed lists the aromatic
// atoms (other than '*') with no aromatic bond at all.
func kekuleAttempt(m *Molecule, arom []bool) (pi []bool, unringed []int, match *matcher) {
	pi = make([]bool, len(m.Atoms))
	for i := range m.Atoms {
		a := &m.Atoms[i]
		if !a.Aromatic {
			continue
		}
		ringed := false
		for _, bi := range a.Bonds {
			if arom[bi] {
				ringed = true
			}
		}
		if !ringed {
			if a.Number != 0 {
				unringed = append(unringed, i)
			}
			continue
		}
		pi[i] = needsDoubleBond(m, i)
	}
	match = newMatcher(m, pi, arom)
	match.run()
	return pi, unringed, match
}

// unmatched reports whether an atom other than '*' was left without its
// double bond.
func (x *matcher) unmatched() bool {
	for v, w := range x.mate {
		if w < 0 && x.m.Atoms[x.atoms[v]].Number != 0 {
			return true
		}
	}
	return false
}

// ringPlace says where an aromatic atom without aromatic ring bonds sits,
// for the kekulize message: in a ring whose bonds to it are not aromatic
// (c1CCCCC1, c1-c-c-c-c-c1), or in no ring at all.
func ringPlace(a *Atom, inRing []bool) string {
	for _, bi := range a.Bonds {
		if inRing[bi] {
			return "in a ring without aromatic bonds to it"
		}
	}
	return "outside any ring"
}

// needsDoubleBond decides whether aromatic atom i takes a double bond in
// the Kekulé structure: it does when its valence, counting each aromatic
// bond once, falls short of the next allowed valence (pyridine n, every
// c), and does not when its bonds already fill an allowed valence (furan
// o, thiophene s, pyrrole [nH], the c of a ring C=O).
func needsDoubleBond(m *Molecule, i int) bool {
	a := &m.Atoms[i]
	sum := bondOrderSum(m, i) // aromatic bonds still count 1 here
	if a.Number == 0 {
		return true // '*' fills whatever the ring needs; matched if possible
	}
	var vals []int
	if a.Bracket {
		sum += a.BracketH
		vals = AllowedValences(a.Number, a.Charge)
	} else {
		vals = organicValences[a.Number]
	}
	for _, v := range vals {
		if v >= sum {
			return v > sum
		}
	}
	return false
}

// matcher finds a maximum matching on the aromatic atoms that need a
// double bond, one connected part at a time.
type matcher struct {
	m     *Molecule
	atoms []int // local index -> atom index
	adj   [][]int
	mate  []int
	work  int

	// blossom search state, reused across searches; used and inBlossom
	// are meaningful only on the vertices of the current search's
	// component, which each search resets
	parent, base    []int
	used, inBlossom []bool
	queue           []int

	// reach marks vertices while a component is collected; it is all
	// false between calls (a search leaves used set on its vertices, so
	// collecting with used would miss them)
	reach []bool

	// storage kept for the next record (matchers)
	local, backing []int
}

// matchers keeps matchers and their storage for the next record: every
// aromatic record of a list needs one, and a large one is not kept.
var matchers = sync.Pool{New: func() any { return new(matcher) }}

// maxPooledMatcher is the most atoms a matcher kept for reuse may have
// been sized for.
const maxPooledMatcher = 4096

// ints returns s resized to n, reusing its storage when it can; the
// contents are not cleared.
func ints(s []int, n int) []int {
	if cap(s) >= n {
		return s[:n]
	}
	return make([]int, n)
}

// bools returns s resized to n and all false.
func bools(s []bool, n int) []bool {
	if cap(s) >= n {
		s = s[:n]
		clear(s)
		return s
	}
	return make([]bool, n)
}

func newMatcher(m *Molecule, pi []bool, arom []bool) *matcher {
	x := matchers.Get().(*matcher)
	x.m, x.work = m, 0
	// local index of each atom (-1 off the graph), and the neighbours of
	// every vertex in one backing array, in the order of the atoms' bonds
	local := ints(x.local, len(m.Atoms))
	x.local = local
	n := 0
	for i := range m.Atoms {
		local[i] = -1
		if pi[i] {
			local[i] = n
			n++
		}
	}
	x.atoms = ints(x.atoms, n)[:0]
	for i := range m.Atoms {
		if pi[i] {
			x.atoms = append(x.atoms, i)
		}
	}
	neighbour := func(a, bi int) int {
		if !arom[bi] {
			return -1
		}
		if o := m.Bonds[bi].Other(a); o >= 0 && o < len(local) {
			return local[o]
		}
		return -1
	}
	degree := ints(x.mate, n)
	clear(degree)
	total := 0
	for v, a := range x.atoms {
		for _, bi := range m.Atoms[a].Bonds {
			if neighbour(a, bi) >= 0 {
				degree[v]++
				total++
			}
		}
	}
	backing := ints(x.backing, total)
	x.backing = backing
	if cap(x.adj) >= n {
		x.adj = x.adj[:n]
	} else {
		x.adj = make([][]int, n)
	}
	for v := range x.adj {
		x.adj[v], backing = backing[:0:degree[v]], backing[degree[v]:]
	}
	for v, a := range x.atoms {
		for _, bi := range m.Atoms[a].Bonds {
			if w := neighbour(a, bi); w >= 0 {
				x.adj[v] = append(x.adj[v], w)
			}
		}
	}
	x.mate = degree // spent: reused for the matching
	for i := range x.mate {
		x.mate[i] = -1
	}
	x.reach = bools(x.reach, n)
	return x
}

// release gives the matcher back for the next record; it must not be
// used after.
func (x *matcher) release() {
	if x == nil || len(x.local) > maxPooledMatcher {
		return
	}
	x.m = nil
	matchers.Put(x)
}

func (x *matcher) run() {
	n := len(x.atoms)
	// Greedy start: atoms with a single candidate first, then in order.
	for v := 0; v < n; v++ {
		if x.mate[v] < 0 && len(x.adj[v]) == 1 && x.mate[x.adj[v][0]] < 0 {
			w := x.adj[v][0]
			x.mate[v], x.mate[w] = w, v
		}
	}
	for v := 0; v < n; v++ {
		if x.mate[v] >= 0 {
			continue
		}
		for _, w := range x.adj[v] {
			if x.mate[w] < 0 {
				x.mate[v], x.mate[w] = w, v
				break
			}
		}
	}
	x.parent = ints(x.parent, n)
	x.base = ints(x.base, n)
	x.used = bools(x.used, n)
	x.inBlossom = bools(x.inBlossom, n)
	for v := 0; v < n; v++ {
		if x.mate[v] >= 0 || len(x.adj[v]) == 0 {
			continue
		}
		if x.work > kekulizeBudget {
			break
		}
		if end := x.search(v); end >= 0 {
			for end >= 0 {
				pv := x.parent[end]
				next := x.mate[pv]
				x.mate[end], x.mate[pv] = pv, end
				end = next
			}
		}
	}
}

// component lists the local vertices reachable from root, so that one
// search costs the size of its own ring system, not of the record.
func (x *matcher) component(root int) []int {
	seen := x.reach
	comp := []int{root}
	seen[root] = true
	for i := 0; i < len(comp); i++ {
		for _, w := range x.adj[comp[i]] {
			if !seen[w] {
				seen[w] = true
				comp = append(comp, w)
			}
		}
	}
	for _, v := range comp {
		seen[v] = false
	}
	return comp
}

// search looks for an augmenting path from the free vertex root and
// returns its free far end, or -1.
func (x *matcher) search(root int) int {
	comp := x.component(root)
	x.work += len(comp)
	for _, v := range comp {
		x.used[v] = false
		x.parent[v] = -1
		x.base[v] = v
	}
	x.used[root] = true
	x.queue = append(x.queue[:0], root)
	for qi := 0; qi < len(x.queue); qi++ {
		v := x.queue[qi]
		for _, to := range x.adj[v] {
			x.work++
			if x.base[v] == x.base[to] || x.mate[v] == to {
				continue
			}
			if to == root || x.mate[to] >= 0 && x.parent[x.mate[to]] >= 0 {
				cur := x.lca(v, to, comp)
				for _, u := range comp {
					x.inBlossom[u] = false
				}
				x.markPath(v, cur, to)
				x.markPath(to, cur, v)
				x.work += len(comp)
				for _, u := range comp {
					if x.inBlossom[x.base[u]] {
						x.base[u] = cur
						if !x.used[u] {
							x.used[u] = true
							x.queue = append(x.queue, u)
						}
					}
				}
			} else if x.parent[to] < 0 {
				x.parent[to] = v
				if x.mate[to] < 0 {
					return to
				}
				x.used[x.mate[to]] = true
				x.queue = append(x.queue, x.mate[to])
			}
		}
	}
	return -1
}

func (x *matcher) lca(a, b int, comp []int) int {
	seen := x.inBlossom
	for _, u := range comp {
		seen[u] = false
	}
	for {
		a = x.base[a]
		seen[a] = true
		if x.mate[a] < 0 {
			break
		}
		a = x.parent[x.mate[a]]
	}
	for {
		b = x.base[b]
		if seen[b] {
			return b
		}
		b = x.parent[x.mate[b]]
	}
}

func (x *matcher) markPath(v, b, child int) {
	for x.base[v] != b {
		x.inBlossom[x.base[v]] = true
		x.inBlossom[x.base[x.mate[v]]] = true
		x.parent[v] = child
		child = x.mate[v]
		v = x.parent[x.mate[v]]
	}
}

// report adds one kekulize error per aromatic system that kept atoms
// without a double bond, naming those atoms.
func (x *matcher) report() {
	if !slices.Contains(x.mate, -1) {
		return // every atom has its double bond
	}
	seen := make([]bool, len(x.atoms))
	for v := range x.atoms {
		if x.mate[v] >= 0 || seen[v] {
			continue
		}
		comp := x.component(v)
		var free []int
		for _, u := range comp {
			seen[u] = true
			if x.mate[u] < 0 && x.m.Atoms[x.atoms[u]].Number != 0 {
				free = append(free, x.atoms[u])
			}
		}
		if len(free) == 0 {
			continue // only wildcard atoms left over: '*' may stand for anything
		}
		sort.Ints(free)
		names := make([]string, 0, min(len(free), 8))
		for i, a := range free {
			if i == 8 {
				names = append(names, "...")
				break
			}
			names = append(names, x.m.Atoms[a].Symbol+itoa(a+1))
		}
		first := &x.m.Atoms[free[0]]
		e := x.m.Errors.Add(first.Span, CodeKekulize, "expected a Kekulé structure for the aromatic atoms, found none: no double bond fits at %s", strings.Join(names, ", "))
		for _, a := range free[1:min(len(free), 20)] {
			e.Related = append(e.Related, Related{x.m.Atoms[a].Span, "also without a double bond"})
		}
	}
}

// reportUnringed reports the aromatic atoms without aromatic ring bonds:
// one finding for each chain of them bonded to one another, over the
// chain's text, so that "[*]cccccc[*]" is one mistake, not six.
func reportUnringed(m *Molecule, unringed []int, inRing []bool) {
	if len(unringed) == 0 {
		return
	}
	chain := make(map[int]int, len(unringed)) // atom -> chain, -1 before it is reached
	for _, i := range unringed {
		chain[i] = -1
	}
	n := 0
	for _, first := range unringed {
		if chain[first] >= 0 {
			continue
		}
		chain[first] = n
		stack := []int{first}
		span, count := m.Atoms[first].Span, 0
		for len(stack) > 0 {
			i := stack[len(stack)-1]
			stack = stack[:len(stack)-1]
			count++
			span.Start, span.End = min(span.Start, m.Atoms[i].Span.Start), max(span.End, m.Atoms[i].Span.End)
			for _, bi := range m.Atoms[i].Bonds {
				j := m.Bonds[bi].Other(i)
				if c, ok := chain[j]; ok && c < 0 {
					chain[j] = n
					stack = append(stack, j)
				}
			}
		}
		a := &m.Atoms[first]
		if count == 1 {
			m.Errors.Add(a.Span, CodeKekulize, "expected an aromatic atom to be in an aromatic ring, found %s %s", a.Symbol, ringPlace(a, inRing))
		} else {
			m.Errors.Add(span, CodeKekulize, "expected aromatic atoms to be in an aromatic ring, found a chain of %d %s", count, ringPlace(a, inRing))
		}
		n++
	}
}

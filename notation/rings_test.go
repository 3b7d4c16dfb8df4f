package notation

import (
	"math/rand"
	"sort"
	"strconv"
	"strings"
	"testing"
	"time"
)

// graphMolecule builds a carbon skeleton by hand: n atoms and the listed
// bonds. It lets the ring tests run without the reader.
func graphMolecule(n int, bonds [][2]int) *Molecule {
	m := &Molecule{Atoms: make([]Atom, n), Components: 1}
	for i := range m.Atoms {
		m.Atoms[i] = Atom{Number: ElemC, Symbol: "C"}
	}
	for _, b := range bonds {
		i := len(m.Bonds)
		m.Bonds = append(m.Bonds, Bond{Begin: b[0], End: b[1], Order: OrderSingle, Kekule: 1})
		m.Atoms[b[0]].Bonds = append(m.Atoms[b[0]].Bonds, i)
		m.Atoms[b[1]].Bonds = append(m.Atoms[b[1]].Bonds, i)
	}
	return m
}

func cycleBonds(atoms ...int) [][2]int {
	var out [][2]int
	for i := range atoms {
		out = append(out, [2]int{atoms[i], atoms[(i+1)%len(atoms)]})
	}
	return out
}

func ringSizes(r *Rings) string {
	var s []int
	for _, ring := range r.SSSR {
		s = append(s, ring.Size())
	}
	sort.Ints(s)
	var sb strings.Builder
	for i, v := range s {
		if i > 0 {
			sb.WriteByte(' ')
		}
		sb.WriteString(strconv.Itoa(v))
	}
	return sb.String()
}

// The expected ring sets are the textbook SSSR of each skeleton (common
// practice: benzene one 6-ring, naphthalene two 6-rings, cubane five
// 4-rings, adamantane three 6-rings, norbornane two 5-rings (the 6-ring is their sum),
// spiro[4.5]decane one 5- and one 6-ring, bicyclo[1.1.0]butane two
// 3-rings).
func TestFindRingsSkeletons(t *testing.T) {
	cubane := append(append(cycleBonds(0, 1, 2, 3), cycleBonds(4, 5, 6, 7)...),
		[2]int{0, 4}, [2]int{1, 5}, [2]int{2, 6}, [2]int{3, 7})
	// adamantane: bridgeheads 0 1 2 3, methylenes 4..9
	adamantane := [][2]int{{0, 4}, {4, 1}, {0, 5}, {5, 2}, {0, 6}, {6, 3},
		{1, 7}, {7, 2}, {1, 8}, {8, 3}, {2, 9}, {9, 3}}
	naphthalene := append(cycleBonds(0, 1, 2, 3, 4, 5), cycleBonds(4, 6, 7, 8, 9, 5)[:5]...)
	norbornane := [][2]int{{0, 1}, {1, 2}, {2, 3}, {3, 4}, {4, 5}, {5, 0}, {0, 6}, {6, 3}}
	spiro := append(cycleBonds(0, 1, 2, 3, 4), cycleBonds(0, 5, 6, 7, 8, 9)...)
	bicyclobutane := [][2]int{{0, 1}, {1, 2}, {2, 0}, {0, 3}, {3, 2}}
	tests := []struct {
		name      string
		n         int
		bonds     [][2]int
		sssr      string
		atomSizes []int
	}{
		{"hexane", 6, [][2]int{{0, 1}, {1, 2}, {2, 3}, {3, 4}, {4, 5}}, "", []int{0, 0, 0, 0, 0, 0}},
		{"benzene", 6, cycleBonds(0, 1, 2, 3, 4, 5), "6", []int{6, 6, 6, 6, 6, 6}},
		{"toluene skeleton", 7, append(cycleBonds(0, 1, 2, 3, 4, 5), [2]int{0, 6}), "6", []int{6, 6, 6, 6, 6, 6, 0}},
		{"naphthalene", 10, naphthalene, "6 6", []int{6, 6, 6, 6, 6, 6, 6, 6, 6, 6}},
		{"cubane", 8, cubane, "4 4 4 4 4", []int{4, 4, 4, 4, 4, 4, 4, 4}},
		{"adamantane", 10, adamantane, "6 6 6", []int{6, 6, 6, 6, 6, 6, 6, 6, 6, 6}},
		{"norbornane", 7, norbornane, "5 5", []int{5, 5, 5, 5, 5, 5, 5}},
		{"spirodecane", 10, spiro, "5 6", []int{5, 5, 5, 5, 5, 6, 6, 6, 6, 6}},
		{"bicyclobutane", 4, bicyclobutane, "3 3", []int{3, 3, 3, 3}},
		{"two benzenes apart", 12, append(cycleBonds(0, 1, 2, 3, 4, 5), cycleBonds(6, 7, 8, 9, 10, 11)...), "6 6",
			[]int{6, 6, 6, 6, 6, 6, 6, 6, 6, 6, 6, 6}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			m := graphMolecule(tt.n, tt.bonds)
			r := FindRings(m)
			if got := ringSizes(r); got != tt.sssr {
				t.Errorf("SSSR sizes = %q, want %q", got, tt.sssr)
			}
			if len(r.SSSR) != r.Expected || r.Approximate {
				t.Errorf("got %d rings, expected %d (approximate %v)", len(r.SSSR), r.Expected, r.Approximate)
			}
			for a, want := range tt.atomSizes {
				if r.AtomSize[a] != want {
					t.Errorf("atom %d smallest ring %d, want %d", a, r.AtomSize[a], want)
				}
			}
			checkRingsAreCycles(t, m, r)
		})
	}
}

// checkRingsAreCycles checks that every reported ring is a closed path
// of the molecule's bonds.
func checkRingsAreCycles(t *testing.T, m *Molecule, r *Rings) {
	t.Helper()
	for _, ring := range r.SSSR {
		if len(ring.Atoms) != len(ring.Bonds) || len(ring.Atoms) < 2 {
			t.Fatalf("malformed ring %+v", ring)
		}
		for i, b := range ring.Bonds {
			x, y := ring.Atoms[i], ring.Atoms[(i+1)%len(ring.Atoms)]
			bd := m.Bonds[b]
			if !(bd.Begin == x && bd.End == y) && !(bd.Begin == y && bd.End == x) {
				t.Fatalf("ring bond %d does not join %d and %d", b, x, y)
			}
		}
	}
}

// bruteRings enumerates every simple cycle of a small graph (as bond
// sets) and derives smallest sizes and the minimum basis weight by the
// textbook greedy over all cycles. It is an independent, slow oracle.
func bruteRings(n int, bonds [][2]int) (bondSize []int, basisWeight int) {
	type arc struct{ bond, to int }
	adj := make([][]arc, n)
	for i, b := range bonds {
		adj[b[0]] = append(adj[b[0]], arc{i, b[1]})
		adj[b[1]] = append(adj[b[1]], arc{i, b[0]})
	}
	seen := map[uint64]bool{}
	var cycles []uint64
	var dfs func(start, at int, used uint64, visited uint64)
	dfs = func(start, at int, used, visited uint64) {
		for _, a := range adj[at] {
			if used&(1<<a.bond) != 0 {
				continue
			}
			if a.to == start {
				c := used | 1<<a.bond
				if !seen[c] {
					seen[c] = true
					cycles = append(cycles, c)
				}
				continue
			}
			if visited&(1<<a.to) != 0 || a.to < start {
				continue
			}
			dfs(start, a.to, used|1<<a.bond, visited|1<<a.to)
		}
	}
	for s := 0; s < n; s++ {
		dfs(s, s, 0, 1<<s)
	}
	pop := func(x uint64) int {
		c := 0
		for ; x != 0; x &= x - 1 {
			c++
		}
		return c
	}
	bondSize = make([]int, len(bonds))
	for _, c := range cycles {
		for b := range bonds {
			if c&(1<<b) != 0 && (bondSize[b] == 0 || pop(c) < bondSize[b]) {
				bondSize[b] = pop(c)
			}
		}
	}
	sort.Slice(cycles, func(i, j int) bool { return pop(cycles[i]) < pop(cycles[j]) })
	var basis []uint64 // reduced by highest bit
	for _, c := range cycles {
		v := c
		for _, p := range basis {
			hi := uint64(1) << (63 - leadingZeros(p))
			if v&hi != 0 {
				v ^= p
			}
		}
		if v != 0 {
			basis = append(basis, v)
			sort.Slice(basis, func(i, j int) bool { return basis[i] > basis[j] })
			basisWeight += pop(c)
		}
	}
	return bondSize, basisWeight
}

func leadingZeros(x uint64) int {
	n := 0
	for i := 63; i >= 0 && x&(1<<i) == 0; i-- {
		n++
	}
	return n
}

// TestFindRingsAgainstBruteForce compares small random graphs with the
// exhaustive oracle above: smallest ring of every bond, and total size
// of the minimum cycle basis (every minimum basis has the same weight).
func TestFindRingsAgainstBruteForce(t *testing.T) {
	rng := rand.New(rand.NewSource(7))
	for iter := 0; iter < 300; iter++ {
		n := 3 + rng.Intn(8)
		var bonds [][2]int
		has := map[[2]int]bool{}
		for tries := 0; tries < n+rng.Intn(2*n) && len(bonds) < 20; tries++ {
			a, b := rng.Intn(n), rng.Intn(n)
			if a == b || has[[2]int{a, b}] || has[[2]int{b, a}] {
				continue
			}
			has[[2]int{a, b}] = true
			bonds = append(bonds, [2]int{a, b})
		}
		m := graphMolecule(n, bonds)
		r := FindRings(m)
		wantSizes, wantWeight := bruteRings(n, bonds)
		for b := range bonds {
			if r.BondSize[b] != wantSizes[b] {
				t.Fatalf("graph %v: bond %d smallest ring %d, want %d", bonds, b, r.BondSize[b], wantSizes[b])
			}
		}
		weight := 0
		for _, ring := range r.SSSR {
			weight += ring.Size()
		}
		if weight != wantWeight || len(r.SSSR) != r.Expected {
			t.Fatalf("graph %v: basis weight %d with %d rings, want %d with %d", bonds, weight, len(r.SSSR), wantWeight, r.Expected)
		}
		checkRingsAreCycles(t, m, r)
	}
}

// TestFindRingsLarge checks that big records stay fast: a chain of 200,000
// atoms, 20,000 rings strung on a chain, a ladder of 20,000 fused rings and
// a 100,000-atom macrocycle.
func TestFindRingsLarge(t *testing.T) {
	chain := func(n int) [][2]int {
		var b [][2]int
		for i := 1; i < n; i++ {
			b = append(b, [2]int{i - 1, i})
		}
		return b
	}
	strung := func(rings int) (int, [][2]int) {
		var b [][2]int
		n := 0
		for i := 0; i < rings; i++ {
			b = append(b, cycleBonds(n, n+1, n+2, n+3, n+4, n+5)...)
			if i > 0 {
				b = append(b, [2]int{n - 3, n})
			}
			n += 6
		}
		return n, b
	}
	ladder := func(rings int) (int, [][2]int) {
		// polyacene-like: rungs 2i-(2i+1), rails 2i-(2i+2) and (2i+1)-(2i+3)
		var b [][2]int
		for i := 0; i <= rings; i++ {
			b = append(b, [2]int{2 * i, 2*i + 1})
			if i < rings {
				b = append(b, [2]int{2 * i, 2*i + 2}, [2]int{2*i + 1, 2*i + 3})
			}
		}
		return 2 * (rings + 1), b
	}
	macro := func(n int) [][2]int { return append(chain(n), [2]int{n - 1, 0}) }
	sn, sb := strung(20000)
	ln, lb := ladder(20000)
	tests := []struct {
		name  string
		n     int
		bonds [][2]int
		rings int
		size  int // size of every ring
	}{
		{"chain", 200000, chain(200000), 0, 0},
		{"strung rings", sn, sb, 20000, 6},
		{"ladder", ln, lb, 20000, 4},
		{"macrocycle", 100000, macro(100000), 1, 100000},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			m := graphMolecule(tt.n, tt.bonds)
			start := time.Now()
			r := FindRings(m)
			if d := time.Since(start); d > slowdown*15*time.Second {
				t.Errorf("took %v", d)
			}
			if len(r.SSSR) != tt.rings || r.Approximate {
				t.Fatalf("got %d rings (approximate %v), want %d", len(r.SSSR), r.Approximate, tt.rings)
			}
			for _, ring := range r.SSSR {
				if ring.Size() != tt.size {
					t.Fatalf("ring of size %d, want %d", ring.Size(), tt.size)
				}
			}
		})
	}
}

func BenchmarkFindRingsLadder(b *testing.B) {
	var bonds [][2]int
	const rings = 2000
	for i := 0; i <= rings; i++ {
		bonds = append(bonds, [2]int{2 * i, 2*i + 1})
		if i < rings {
			bonds = append(bonds, [2]int{2 * i, 2*i + 2}, [2]int{2*i + 1, 2*i + 3})
		}
	}
	m := graphMolecule(2*(rings+1), bonds)
	b.ReportAllocs()
	for b.Loop() {
		FindRings(m)
	}
}

func BenchmarkFindRingsCubane(b *testing.B) {
	cubane := append(append(cycleBonds(0, 1, 2, 3), cycleBonds(4, 5, 6, 7)...),
		[2]int{0, 4}, [2]int{1, 5}, [2]int{2, 6}, [2]int{3, 7})
	m := graphMolecule(8, cubane)
	b.ReportAllocs()
	for b.Loop() {
		FindRings(m)
	}
}

// TestFindRingsRead checks ring perception on molecules read from text:
// cubane, adamantane, spiro[3.3]heptane, caffeine and a ring closure
// across a dot (textbook SSSR, common practice).
func TestFindRingsRead(t *testing.T) {
	tests := []struct{ name, smiles, sssr string }{
		{"cubane", "C12C3C4C1C5C2C3C45", "4 4 4 4 4"},
		{"adamantane", "C1C2CC3CC1CC(C2)C3", "6 6 6"},
		{"spiroheptane", "C1CC[C@]12CCC2", "4 4"},
		{"caffeine", "Cn1cnc2c1c(=O)n(C)c(=O)n2C", "5 6"},
		{"ring bonds across a dot", "C12CC.C1C2", "3"},
		{"reaction", "C1CC1>>C=CC", "3"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			m := Read(tt.smiles)
			if m.Errors.HasErrors() {
				t.Fatalf("read: %v", m.Errors)
			}
			r := FindRings(m)
			if got := ringSizes(r); got != tt.sssr || len(r.SSSR) != r.Expected {
				t.Errorf("SSSR %q (expected count %d), want %q", got, r.Expected, tt.sssr)
			}
			checkRingsAreCycles(t, m, r)
		})
	}
}

// TestLargeRecords reads, perceives rings in and writes a record of about
// a megabyte with 20,000 ring closures, and a long chain, within a time
// that rules out quadratic behaviour.
func TestLargeRecords(t *testing.T) {
	if testing.Short() {
		t.Skip("megabyte records skipped in short mode")
	}
	var sb strings.Builder
	for i := 0; i < 20000; i++ {
		sb.WriteString("C1CCC(CC1)C(=O)NC(C)(C)") // a ring and a chain unit
		sb.WriteString("c1ccc2ccccc2c1OCC")
	}
	sb.WriteString("C")
	huge := sb.String()
	for _, text := range []string{huge, strings.Repeat("CC(C)O", 150000) + "C", strings.Repeat("[Na+].[Cl-].", 50000) + "O"} {
		start := time.Now()
		m := Read(text)
		read := time.Since(start)
		r := FindRings(m)
		rings := time.Since(start) - read
		w := Write(m, WriteOptions{})
		written := time.Since(start) - read - rings
		if rings > slowdown*15*time.Second || written > slowdown*15*time.Second { // quadratic work would take hours; the margin absorbs a loaded machine
			t.Errorf("%d bytes: rings took %v, writing %v", len(text), rings, written)
		}
		if m.Errors.HasErrors() {
			t.Fatalf("read: %v", m.Errors[0])
		}
		if len(r.SSSR) != r.Expected || r.Approximate {
			t.Errorf("%d rings of %d expected (approximate %v)", len(r.SSSR), r.Expected, r.Approximate)
		}
		if len(w.Order) != len(m.Atoms) {
			t.Errorf("wrote %d atoms of %d", len(w.Order), len(m.Atoms))
		}
		t.Logf("%d bytes, %d atoms, %d rings: read %v, rings %v, write %v", len(text), len(m.Atoms), len(r.SSSR), read, rings, written)
	}
}

// FuzzFindRings checks, for whatever the reader makes of a text, that
// ring perception ends, reports rings that are cycles of the molecule,
// and finds as many rings as the cyclomatic number.
func FuzzFindRings(f *testing.F) {
	for _, s := range []string{"C12C3C4C1C5C2C3C45", "C1C2CC3CC1CC(C2)C3", "c1ccc2ccccc2c1", "C1CC.C1", "C1CC1>>C"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		if len(s) > 4000 {
			return
		}
		m := Read(s)
		r := FindRings(m)
		checkRingsAreCycles(t, m, r)
		if !r.Approximate && len(r.SSSR) != r.Expected {
			t.Fatalf("%q: %d rings, cyclomatic number %d", s, len(r.SSSR), r.Expected)
		}
	})
}

// TestFindRingsBudget builds a ring system whose smallest rings are
// larger than one search may visit (three 3,000-atom paths joining two
// atoms): the result must come quickly, say it is approximate, and give
// sizes that are upper bounds.
func TestFindRingsBudget(t *testing.T) {
	const path = 3000
	var bonds [][2]int
	n := 2
	for k := 0; k < 3; k++ {
		prev := 0
		for i := 0; i < path; i++ {
			bonds = append(bonds, [2]int{prev, n})
			prev = n
			n++
		}
		bonds = append(bonds, [2]int{prev, 1})
	}
	m := graphMolecule(n, bonds)
	start := time.Now()
	r := FindRings(m)
	if d := time.Since(start); d > slowdown*10*time.Second {
		t.Errorf("took %v", d)
	}
	if !r.Approximate {
		t.Errorf("not marked approximate")
	}
	const smallest = 2 * (path + 1)
	for b, size := range r.BondSize {
		if size < smallest {
			t.Fatalf("bond %d smallest ring %d, below the true %d", b, size, smallest)
		}
	}
	if r.Expected != 2 || len(r.SSSR) != 2 {
		t.Errorf("%d rings, cyclomatic number %d, want 2 and 2", len(r.SSSR), r.Expected)
	}
	checkRingsAreCycles(t, m, r)
}

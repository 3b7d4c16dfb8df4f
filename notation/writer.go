package notation

import (
	"math/rand/v2"
	"sort"
	"strconv"
	"strings"
)

// WriteOptions chooses among the many valid writings of one molecule.
// The zero value writes each part from its lowest-numbered atom, visits
// neighbours in the order of their atom numbers (so a molecule read from
// text comes out much as it was written) and keeps aromatic atoms
// aromatic.
type WriteOptions struct {
	// Start is the atom the writing of its part begins with. Other parts
	// begin with their lowest-numbered atom (or a random one). Zero is
	// the default: atom 0, or a random atom when Random is set.
	Start int
	// Random, when set, shuffles the order in which neighbours are
	// visited, ring-closure digits are written and parts other than
	// Start's begin. Property tests use it to produce many writings of
	// one structure.
	Random *rand.Rand
	// Kekule writes aromatic bonds with the single and double bonds the
	// reader's Kekulé structure assigned, and aromatic atoms in capitals.
	Kekule bool
}

// Written is the result of Write.
type Written struct {
	Text string
	// Order maps positions to atoms: Order[i] is the atom of the written
	// molecule that became the i-th atom of Text.
	Order []int
	// Unadjusted lists atoms whose chirality mark could not be rewritten
	// for the new order of their neighbours (an allene with a CH2 end, a
	// mark whose number does not fit its neighbours): their mark is
	// copied as written and may no longer describe the same arrangement.
	Unadjusted []int
	// Dropped lists bonds that could not be written: bonds joining atoms
	// of different reaction roles.
	Dropped []int
	// DroppedFields lists the fields of the molecule's extension block
	// (indices into m.Extension.Fields) left out of Text because the new
	// writing moves what they refer to and they cannot be renumbered:
	// fields that count bonds, unknown fields, fields with indices
	// beyond the record, incomplete coordinates (see writeExtension).
	DroppedFields []int

	lonePairs    int  // the centres of m whose mark counts a lone pair
	lonePairOpen bool // one of them is written where the readings disagree
}

// Write serialises m as OpenSMILES. Atoms are written without brackets
// whenever the organic subset implies exactly their hydrogens; ring
// closures use the lowest free number; chirality marks are rewritten
// for the new neighbour order (a transposition of two neighbours of a
// tetrahedral or allene centre turns '@' into '@@'), and bond direction
// marks are written as seen in the direction the bond is written, so
// both kinds of stereo keep their meaning. A reaction keeps its
// reactant>agent>product layout. A CXSMILES extension block is written
// after the notation, renumbered for the new order of the atoms, or
// copied as written when the order is unchanged (see writeExtension).
//
// Write takes time linear in the size of the molecule (times the number
// of ring closures open at once, for choosing free numbers) and does not
// recurse, so a long chain cannot exhaust the stack.
func Write(m *Molecule, opt WriteOptions) Written {
	out := write(m, opt, -1)
	if !out.lonePairOpen {
		return out
	}
	// Some centre whose mark counts a lone pair is left open: its bonds
	// and those of other such centres close a ring (the triazinane ring
	// of a hexamethylenetetramine cage), so one of them is a ring
	// closure. A centre is read alike by every reading also when it
	// starts its part and carries one such digit (or any odd number, on
	// a centre of single bonds): try each atom as the start and each
	// order of taking the centres' bonds, and keep the first writing
	// that leaves no centre open.
	for attempt := 0; attempt < min(len(m.Atoms)*out.lonePairs, maxLonePairAttempts); attempt++ {
		if alt := write(m, opt, attempt); !alt.lonePairOpen {
			return alt
		}
	}
	return out
}

// maxLonePairAttempts bounds the writings Write tries for a molecule
// whose lone-pair centres close a ring among themselves.
const maxLonePairAttempts = 64

// lonePairOpen reports whether the writing leaves a centre whose mark
// counts a lone pair at a place the lone-pair rules put at positions of
// opposite parity (Molecule.LonePairOpen, for the text written).
func (w *writer) lonePairOpen() bool {
	for a, lp := range w.lonePair {
		if !lp {
			continue
		}
		single := true
		for _, b := range w.m.Atoms[a].Bonds {
			single = single && w.m.Bonds[b].Order == OrderSingle
		}
		hasPrev, digits := w.parent[a] >= 0, len(w.rings[a])
		if (LonePairPlace(LonePairLast, hasPrev, digits, single)-LonePairPlace(LonePairHydrogenSlot, hasPrev, digits, single))%2 != 0 {
			return true
		}
	}
	return false
}

// write is one writing of m; attempt < 0 is the plain one, and attempt k
// starts every part that holds a lone-pair centre at its (k mod n)-th
// atom (n its atom count) and takes the centres' bonds into the tree
// starting from the (k div n)-th centre.
func write(m *Molecule, opt WriteOptions, attempt int) Written {
	w := &writer{m: m, opt: opt, attempt: attempt}
	w.init()
	groups := []Role{RoleNone}
	if m.Reaction {
		groups = []Role{RoleReactant, RoleAgent, RoleProduct}
	}
	for gi, role := range groups {
		if gi > 0 {
			w.sb.WriteByte('>')
		}
		first := true
		for _, root := range w.roots(role) {
			if !first {
				w.sb.WriteByte('.')
			}
			first = false
			w.component(root)
		}
	}
	w.out.Text = w.fixAllenes(w.sb.String())
	w.out.lonePairOpen = w.lonePairOpen()
	for _, lp := range w.lonePair {
		if lp {
			w.out.lonePairs++
		}
	}
	if m.Extension != nil {
		block, dropped := writeExtension(m, w.out.Text, w.out.Order)
		w.out.Text += block
		w.out.DroppedFields = dropped
	}
	sort.Ints(w.out.Unadjusted)
	sort.Ints(w.out.Dropped)
	return w.out
}

// writer is the state of one Write call.
type writer struct {
	m       *Molecule
	opt     WriteOptions
	attempt int // see write
	sb      strings.Builder
	out     Written

	aromatic []bool // atom written in lowercase
	seen     []bool // atom placed in the depth-first tree
	bondUsed []bool

	parent   []int   // bond to the parent atom, -1 at a root
	children [][]int // tree bonds to children, in writing order
	ringBond []int   // bonds left out of the tree, in the order found
	opens    [][]int // ring bonds opened at the atom
	closes   [][]int // ring bonds closed at the atom
	// lonePair marks the atoms whose mark counts a lone pair (a
	// tetrahedral mark, three neighbours, no hydrogen); required marks
	// their bonds, which the tree takes whenever it can (see buildTree),
	// and joined is the disjoint-set forest of the bonds taken or
	// required so far
	lonePair []bool
	required []bool
	joined   []int
	preorder []int   // position of each atom in the part being written, made on first use
	rings    [][]int // ring bonds in the order their digits were written
	digit    []int   // ring-closure number of each ring bond
	free     []bool  // free[d] when number d is not in use
	position []int   // position of each atom in Text
	partOf   []int   // connected part of each atom, -1 before it is found
	scratch  []int   // room for every atom's neighbour order, taken once per atom
	allenes  []alleneFix
	parts    []int // atom count of each part
}

func (w *writer) init() {
	n, nb := len(w.m.Atoms), len(w.m.Bonds)
	w.aromatic = make([]bool, n)
	w.seen = make([]bool, n)
	w.bondUsed = make([]bool, nb)
	w.parent = make([]int, n)
	w.children = make([][]int, n)
	w.opens = make([][]int, n)
	w.closes = make([][]int, n)
	w.rings = make([][]int, n)
	w.digit = make([]int, nb)
	w.position = make([]int, n)
	w.partOf = make([]int, n)
	total := 0
	for i := range w.m.Atoms {
		total += len(w.m.Atoms[i].Bonds)
	}
	w.scratch = make([]int, total)
	for i := range w.m.Atoms {
		w.aromatic[i] = w.writtenAromatic(i)
		w.position[i] = -1
		w.partOf[i] = -1
	}
	w.requireLonePairBonds()
}

// requireLonePairBonds marks the atoms whose mark counts a lone pair and
// their bonds. Where the lone pair stands is read differently by
// general-purpose readers when such a centre starts its part or carries
// ring-closure digits (notation.Reading): the writer starts no part at
// one (roots) and writes all its bonds as chain and branch bonds, taking
// them into the spanning tree first, so that what it writes means the
// same under every reading. Bonds of two such centres that would close a
// cycle cannot all be tree bonds; those are left to the search, and their
// marks are written for the molecule's reading. A molecule without such
// centres (most) allocates nothing here, and its tree is the plain
// depth-first one.
func (w *writer) requireLonePairBonds() {
	n := len(w.m.Atoms)
	var centres []int
	for a := range w.m.Atoms {
		if w.m.Atoms[a].Chirality.Class != ChiralNone && w.lonePairCentre(a) && w.geometry(a) == ChiralTH {
			centres = append(centres, a)
		}
	}
	if len(centres) == 0 {
		return
	}
	w.joined = make([]int, n)
	for i := range w.joined {
		w.joined[i] = i
	}
	w.lonePair = make([]bool, n)
	w.required = make([]bool, len(w.m.Bonds))
	for _, a := range centres {
		w.lonePair[a] = true
	}
	if w.attempt > 0 && len(centres) > 0 {
		k := (w.attempt / max(n, 1)) % len(centres)
		centres = append(centres[k:], centres[:k]...)
	}
	for _, a := range centres {
		for _, b := range w.m.Atoms[a].Bonds {
			bd := &w.m.Bonds[b]
			if w.required[b] || bd.Begin == bd.End || w.m.Reaction && w.m.Atoms[bd.Begin].Role != w.m.Atoms[bd.End].Role {
				continue
			}
			if w.join(bd.Begin, bd.End) {
				w.required[b] = true
			}
		}
	}
}

// lonePairCentre reports whether a tetrahedral mark on atom a counts a
// lone pair: three neighbours and no hydrogen.
func (w *writer) lonePairCentre(a int) bool {
	at := &w.m.Atoms[a]
	return len(at.Bonds) == 3 && at.HydrogenCount() == 0
}

// find and join are the disjoint-set forest over atoms; join reports
// whether a and b were apart.
func (w *writer) find(a int) int {
	for w.joined[a] != a {
		w.joined[a] = w.joined[w.joined[a]]
		a = w.joined[a]
	}
	return a
}

func (w *writer) join(a, b int) bool {
	ra, rb := w.find(a), w.find(b)
	if ra == rb {
		return false
	}
	w.joined[ra] = rb
	return true
}

// writtenAromatic decides the case of an atom. In Kekulé form an atom
// stays lowercase only when one of its aromatic bonds has no Kekulé order
// (a molecule built by hand without one).
func (w *writer) writtenAromatic(a int) bool {
	at := &w.m.Atoms[a]
	if !at.Aromatic {
		return false
	}
	if !w.opt.Kekule {
		return true
	}
	for _, b := range at.Bonds {
		if bd := &w.m.Bonds[b]; bd.Order == OrderAromatic && bd.Kekule == 0 {
			return true
		}
	}
	return false
}

// roots returns one start atom for each connected part of a role, in the
// order of the parts' lowest atoms.
func (w *writer) roots(role Role) []int {
	var roots []int
	for a := range w.m.Atoms {
		if w.partOf[a] >= 0 || !w.inGroup(a, role) {
			continue
		}
		id := len(w.parts)
		part := w.part(a, id)
		w.parts = append(w.parts, len(part))
		root := a
		switch {
		case w.opt.Start > 0 && w.opt.Start < len(w.m.Atoms) && w.partOf[w.opt.Start] == id:
			root = w.opt.Start
		case w.opt.Random != nil:
			root = part[w.opt.Random.IntN(len(part))]
		}
		if w.attempt >= 0 && w.partHasLonePair(part) {
			root = part[w.attempt%len(part)]
		} else {
			root = w.awayFromLonePair(root, part)
		}
		roots = append(roots, root)
	}
	return roots
}

// awayFromLonePair returns root, or, when root is a centre whose mark
// counts a lone pair, the nearest atom of its part that is none (a
// neighbour, the lowest-numbered or a random one): a part that starts at
// such a centre is read differently by general-purpose readers.
func (w *writer) awayFromLonePair(root int, part []int) int {
	if w.lonePair == nil || !w.lonePair[root] {
		return root
	}
	seen := map[int]bool{root: true}
	for layer := []int{root}; len(layer) > 0; {
		var next []int
		for _, x := range layer {
			for _, b := range w.m.Atoms[x].Bonds {
				y := w.m.Bonds[b].Other(x)
				if !seen[y] && w.partOf[y] == w.partOf[root] {
					seen[y] = true
					next = append(next, y)
				}
			}
		}
		var free []int
		for _, y := range next {
			if !w.lonePair[y] {
				free = append(free, y)
			}
		}
		if len(free) > 0 {
			if w.opt.Random != nil {
				return free[w.opt.Random.IntN(len(free))]
			}
			return slicesMin(free)
		}
		layer = next
	}
	return root
}

func (w *writer) partHasLonePair(part []int) bool {
	if w.lonePair == nil {
		return false
	}
	for _, a := range part {
		if w.lonePair[a] {
			return true
		}
	}
	return false
}

func slicesMin(s []int) int {
	m := s[0]
	for _, v := range s[1:] {
		m = min(m, v)
	}
	return m
}

func containsInt(s []int, v int) bool {
	for _, x := range s {
		if x == v {
			return true
		}
	}
	return false
}

func (w *writer) inGroup(a int, role Role) bool {
	return !w.m.Reaction || w.m.Atoms[a].Role == role
}

// part lists the atoms connected to a within its role, giving them the
// part number id.
func (w *writer) part(a, id int) []int {
	role := w.m.Atoms[a].Role
	w.partOf[a] = id
	list := []int{a}
	for i := 0; i < len(list); i++ {
		x := list[i]
		for _, b := range w.m.Atoms[x].Bonds {
			y := w.m.Bonds[b].Other(x)
			if w.partOf[y] < 0 && (!w.m.Reaction || w.m.Atoms[y].Role == role) {
				w.partOf[y] = id
				list = append(list, y)
			}
		}
	}
	return list
}

// component writes the part that contains root: a depth-first search
// first builds the spanning tree and ring closures, then a second walk
// emits the text.
func (w *writer) component(root int) {
	w.buildTree(root)
	w.placeRingBonds(root)
	w.emitTree(root)
}

// neighbourBonds returns the bonds of atom a in the order they are
// explored: by the neighbour's position in the molecule (so a molecule
// read from text is written much as it was read), or shuffled.
func (w *writer) neighbourBonds(a int) []int {
	src := w.m.Atoms[a].Bonds
	bonds := w.scratch[:len(src):len(src)]
	w.scratch = w.scratch[len(src):]
	copy(bonds, src)
	if w.opt.Random != nil {
		w.opt.Random.Shuffle(len(bonds), func(i, j int) { bonds[i], bonds[j] = bonds[j], bonds[i] })
		return bonds
	}
	// insertion sort: degrees are small, and it allocates nothing
	for i := 1; i < len(bonds); i++ {
		for j := i; j > 0 && w.m.Bonds[bonds[j]].Other(a) < w.m.Bonds[bonds[j-1]].Other(a); j-- {
			bonds[j], bonds[j-1] = bonds[j-1], bonds[j]
		}
	}
	return bonds
}

// buildTree grows the spanning tree of root's part by a depth-first
// search. A bond to an atom not yet reached joins the tree, unless the
// atom is already tied to this one by required bonds (those of centres
// whose mark counts a lone pair, requireLonePairBonds) not yet taken:
// the atom is then reached through them, and this bond becomes a ring
// closure. Without required bonds this is the plain search, whose ring
// closures all lead back to an atom on the stack.
func (w *writer) buildTree(root int) {
	type frame struct {
		atom  int
		bonds []int
		next  int
	}
	role := w.m.Atoms[root].Role
	w.seen[root] = true
	w.parent[root] = -1
	w.ringBond = w.ringBond[:0]
	stack := []frame{{root, w.neighbourBonds(root), 0}}
	for len(stack) > 0 {
		f := &stack[len(stack)-1]
		if f.next == len(f.bonds) {
			stack = stack[:len(stack)-1]
			continue
		}
		b := f.bonds[f.next]
		f.next++
		if w.bondUsed[b] {
			continue
		}
		w.bondUsed[b] = true
		u := f.atom
		v := w.m.Bonds[b].Other(u)
		if v == u || (w.m.Reaction && w.m.Atoms[v].Role != role) {
			w.out.Dropped = append(w.out.Dropped, b)
			continue
		}
		if !w.seen[v] && (w.required == nil || w.required[b] || w.join(u, v)) {
			w.seen[v] = true
			w.parent[v] = b
			w.children[u] = append(w.children[u], b)
			stack = append(stack, frame{v, w.neighbourBonds(v), 0})
			continue
		}
		if w.required == nil {
			// the plain search: v was reached before and this bond is
			// unused, so v is an ancestor of u still on the stack, and
			// the ring opens at v
			w.opens[v] = append(w.opens[v], b)
			w.closes[u] = append(w.closes[u], b)
			continue
		}
		w.ringBond = append(w.ringBond, b)
	}
}

// placeRingBonds puts each ring closure of root's part that buildTree
// left to it (those of a tree with required bonds, which may join two
// branches) at its two ends: it opens at the end written first (in the
// order emitTree writes the tree) and closes at the other.
func (w *writer) placeRingBonds(root int) {
	if len(w.ringBond) == 0 {
		return
	}
	if w.preorder == nil {
		w.preorder = make([]int, len(w.m.Atoms))
	}
	order, n := w.preorder, 0
	stack := []int{root}
	for len(stack) > 0 {
		a := stack[len(stack)-1]
		stack = stack[:len(stack)-1]
		order[a] = n
		n++
		kids := w.children[a]
		for i := len(kids) - 1; i >= 0; i-- {
			stack = append(stack, w.m.Bonds[kids[i]].Other(a))
		}
	}
	for _, b := range w.ringBond {
		x, y := w.m.Bonds[b].Begin, w.m.Bonds[b].End
		if order[y] < order[x] {
			x, y = y, x
		}
		w.opens[x] = append(w.opens[x], b)
		w.closes[y] = append(w.closes[y], b)
	}
}

func (w *writer) emitTree(root int) {
	type frame struct{ atom, next int }
	w.emitAtom(root)
	stack := []frame{{root, 0}}
	for len(stack) > 0 {
		f := &stack[len(stack)-1]
		kids := w.children[f.atom]
		if f.next < len(kids) {
			b := kids[f.next]
			f.next++
			if f.next < len(kids) {
				w.sb.WriteByte('(')
			}
			from := f.atom
			to := w.m.Bonds[b].Other(from)
			w.sb.WriteString(w.bondSymbol(b, from))
			w.emitAtom(to)
			stack = append(stack, frame{to, 0})
			continue
		}
		stack = stack[:len(stack)-1]
		if len(stack) > 0 {
			p := stack[len(stack)-1]
			if p.next < len(w.children[p.atom]) {
				w.sb.WriteByte(')')
			}
		}
	}
}

// emitAtom writes the atom token and its ring-closure numbers: first the
// rings it closes, then those it opens. New rings take the lowest free
// number; numbers closed here are released only afterwards, so one token
// never closes and reopens the same number.
func (w *writer) emitAtom(a int) {
	w.position[a] = len(w.out.Order)
	w.out.Order = append(w.out.Order, a)
	closes, opens := w.closes[a], w.opens[a]
	if w.opt.Random != nil {
		w.opt.Random.Shuffle(len(closes), func(i, j int) { closes[i], closes[j] = closes[j], closes[i] })
		w.opt.Random.Shuffle(len(opens), func(i, j int) { opens[i], opens[j] = opens[j], opens[i] })
	}
	w.rings[a] = append(append(w.rings[a], closes...), opens...)
	if at := &w.m.Atoms[a]; at.Chirality.Class != ChiralNone && w.geometry(a) == ChiralAL {
		tok := w.atomToken(a, at.Chirality)
		mark := chiralityText(at.Chirality)
		if k := strings.Index(tok, mark); k >= 0 {
			w.allenes = append(w.allenes, alleneFix{atom: a, offset: w.sb.Len() + k, mark: mark})
		}
		w.sb.WriteString(tok)
	} else {
		w.sb.WriteString(w.atomToken(a, w.newChirality(a)))
	}
	for _, b := range closes {
		w.sb.WriteString(ringNumber(w.digit[b]))
	}
	for _, b := range opens {
		d := w.takeDigit()
		w.digit[b] = d
		w.sb.WriteString(w.bondSymbol(b, a))
		w.sb.WriteString(ringNumber(d))
	}
	for _, b := range closes {
		w.free[w.digit[b]] = true
	}
}

func (w *writer) takeDigit() int {
	for d := 1; d < len(w.free); d++ {
		if w.free[d] {
			w.free[d] = false
			return d
		}
	}
	if len(w.free) == 0 {
		w.free = append(w.free, false) // number 0 is never used
	}
	w.free = append(w.free, false)
	return len(w.free) - 1
}

// ringNumber writes a ring-closure number: one digit, '%' and two digits,
// or, past 99 rings open at once, the '%(n)' form some readers accept.
func ringNumber(d int) string {
	switch {
	case d < 10:
		return strconv.Itoa(d)
	case d < 100:
		return "%" + strconv.Itoa(d)
	}
	return "%(" + strconv.Itoa(d) + ")"
}

// bondSymbol returns the symbol for bond b written from atom from: empty
// where the notation implies the bond.
func (w *writer) bondSymbol(b, from int) string {
	bd := &w.m.Bonds[b]
	to := bd.Other(from)
	bothAromatic := w.aromatic[from] && w.aromatic[to]
	order := bd.Order
	if order == OrderAromatic && w.opt.Kekule && bd.Kekule > 0 {
		order = [...]BondOrder{OrderSingle, OrderSingle, OrderDouble, OrderTriple, OrderQuadruple}[min(bd.Kekule, 4)]
	}
	switch order {
	case OrderDouble:
		return "="
	case OrderTriple:
		return "#"
	case OrderQuadruple:
		return "$"
	case OrderAromatic:
		if bothAromatic {
			return ""
		}
		return ":"
	}
	if d := w.m.BondDir(b, from); d != DirNone {
		return d.String()
	}
	if bothAromatic {
		return "-"
	}
	return ""
}

// atomToken writes one atom, in brackets unless the organic subset says
// everything about it.
func (w *writer) atomToken(a int, chirality Chirality) string {
	at := &w.m.Atoms[a]
	sym := ElementSymbol(at.Number)
	if at.Number == 0 && at.Symbol != "" && at.Symbol != "*" {
		sym = at.Symbol // an unknown element: keep what was written
	}
	if w.aromatic[a] {
		if _, ok := aromaticSymbols[strings.ToLower(sym)]; ok {
			sym = strings.ToLower(sym)
		}
	}
	if w.organic(a, sym) {
		return sym
	}
	var sb strings.Builder
	sb.WriteByte('[')
	if at.Isotope > 0 {
		sb.WriteString(strconv.Itoa(at.Isotope))
	}
	sb.WriteString(sym)
	sb.WriteString(chiralityText(chirality))
	if h := at.HydrogenCount(); h > 0 {
		sb.WriteByte('H')
		if h > 1 {
			sb.WriteString(strconv.Itoa(h))
		}
	}
	switch c := at.Charge; {
	case c == 1:
		sb.WriteByte('+')
	case c == -1:
		sb.WriteByte('-')
	case c > 1:
		sb.WriteString("+" + strconv.Itoa(c))
	case c < -1:
		sb.WriteString(strconv.Itoa(c))
	}
	if at.Map > 0 {
		sb.WriteString(":" + strconv.Itoa(at.Map))
	}
	sb.WriteByte(']')
	return sb.String()
}

// chiralityText writes a chirality mark, already adjusted for the new
// neighbour order by newChirality.
func chiralityText(c Chirality) string {
	if c.Class == ChiralNone {
		return ""
	}
	if c.Short && (c.Class == ChiralTH || c.Class == ChiralAL) {
		if c.Num == 2 {
			return "@@"
		}
		return "@"
	}
	return "@" + c.Class.String() + strconv.Itoa(c.Num)
}

// organicAromatic are the aromatic symbols allowed without brackets
// (OpenSMILES 3.5).
var organicAromatic = map[string]bool{"b": true, "c": true, "n": true, "o": true, "p": true, "s": true}

// organic reports whether atom a can be written without brackets: an
// element of the organic subset (or '*') with no isotope, charge, class or
// chirality, whose hydrogens are exactly those the reader will imply.
func (w *writer) organic(a int, sym string) bool {
	at := &w.m.Atoms[a]
	if at.Isotope != 0 || at.Charge != 0 || at.Map != 0 || at.Chirality.Class != ChiralNone {
		return false
	}
	if sym == "*" {
		return at.HydrogenCount() == 0
	}
	vals, ok := organicValences[at.Number]
	if !ok {
		return false
	}
	if w.aromatic[a] {
		if !organicAromatic[sym] {
			return false
		}
		// The hydrogens of an aromatic atom follow from the Kekulé
		// structure the reader finds; with the same neighbours it finds
		// the same, so an atom read without brackets can be written
		// without them.
		return !at.Bracket
	}
	sum := 0
	for _, b := range at.Bonds {
		bd := &w.m.Bonds[b]
		switch {
		case bd.Order == OrderAromatic && bd.Kekule > 0:
			sum += bd.Kekule
		case bd.Order == OrderDouble:
			sum += 2
		case bd.Order == OrderTriple:
			sum += 3
		case bd.Order == OrderQuadruple:
			sum += 4
		default:
			sum++
		}
	}
	implied := 0
	for _, v := range vals {
		if v >= sum {
			implied = v - sum
			break
		}
	}
	return implied == at.HydrogenCount()
}

// implicitSlot stands for the implicit hydrogen or lone pair of a
// centre in neighbour orders.
const implicitSlot = -1

// geometry returns the arrangement a chirality mark on atom a describes:
// the class as written, except that the short forms '@' and '@@' mean an
// allene on an atom with two double bonds, and the first two
// trigonal-bipyramidal or octahedral forms on atoms with five or six
// neighbours (OpenSMILES 3.9).
func (w *writer) geometry(a int) ChiralClass {
	c := w.m.Atoms[a].Chirality
	if c.Class != ChiralTH || !c.Short {
		return c.Class
	}
	if w.alleneCentre(a) {
		return ChiralAL
	}
	switch len(w.m.Atoms[a].Bonds) + min(w.m.Atoms[a].BracketH, 1) {
	case 5:
		return ChiralTB
	case 6:
		return ChiralOH
	}
	return ChiralTH
}

// newChirality returns the mark atom a needs in the new writing. A
// tetrahedral mark flips when the new neighbour order is an odd
// permutation of the old one; square planar, trigonal bipyramidal and
// octahedral marks get the number that describes the same arrangement in
// the new order. Allene marks are settled after the whole text is
// written (see fixAllenes), since their ligands come later.
func (w *writer) newChirality(a int) Chirality {
	at := &w.m.Atoms[a]
	c := at.Chirality
	g := w.geometry(a)
	if c.Class == ChiralNone || g == ChiralAL {
		return c
	}
	before := w.readOrder(a, g)
	after := w.writtenOrder(a, g)
	if sameInts(before, after) {
		return c
	}
	var num int
	switch g {
	case ChiralTH:
		if odd, ok := permutationOdd(before, after); ok && len(before) == 4 && (c.Num == 1 || c.Num == 2) {
			num = c.Num
			if odd {
				num = 3 - c.Num
			}
		}
	case ChiralSP, ChiralTB, ChiralOH:
		num = renumber(g, before, c.Num, after)
	}
	if num == 0 {
		w.out.Unadjusted = append(w.out.Unadjusted, a)
		return c
	}
	if c.Short && num <= 2 {
		c.Num = num // '@' and '@@' keep their short form
		return c
	}
	return Chirality{Class: g, Num: num, Span: c.Span}
}

// readOrder is the neighbour order the mark was written against: the
// atom's bonds as read, with the implicit hydrogen in its slot, or, for
// a tetrahedral centre without one, the lone pair where the molecule's
// reading puts it.
func (w *writer) readOrder(a int, g ChiralClass) []int {
	at := &w.m.Atoms[a]
	var order []int
	for _, b := range at.Bonds {
		order = append(order, w.m.Bonds[b].Other(a))
	}
	if implicitMember(g, len(order), at.BracketH) {
		slot := at.HydrogenSlot()
		if g == ChiralTH && w.lonePairCentre(a) {
			slot = w.m.LonePairSlot(a)
		}
		order = insertAt(order, slot, implicitSlot)
	}
	return order
}

// writtenOrder is the neighbour order in the new text: the parent, the
// implicit slot, ring closures in the order their numbers were written,
// then branches and the chain. A lone pair stands where the molecule's
// reading puts it; the tree is built so that every reading puts it in
// the same place where it can (requireLonePairBonds).
func (w *writer) writtenOrder(a int, g ChiralClass) []int {
	var order []int
	hasPrev := w.parent[a] >= 0
	if hasPrev {
		order = append(order, w.m.Bonds[w.parent[a]].Other(a))
	}
	for _, b := range w.rings[a] {
		order = append(order, w.m.Bonds[b].Other(a))
	}
	for _, b := range w.children[a] {
		order = append(order, w.m.Bonds[b].Other(a))
	}
	if implicitMember(g, len(order), w.m.Atoms[a].BracketH) {
		slot := 0
		if hasPrev {
			slot = 1
		}
		if g == ChiralTH && w.lonePairCentre(a) {
			single := true
			for _, b := range w.m.Atoms[a].Bonds {
				single = single && w.m.Bonds[b].Order == OrderSingle
			}
			slot = min(LonePairPlace(w.m.Reading.LonePair, hasPrev, len(w.rings[a]), single), len(order))
		}
		order = insertAt(order, slot, implicitSlot)
	}
	return order
}

// implicitMember reports whether a centre's neighbour order includes an
// implicit member: the hydrogen written inside the brackets, or the lone
// pair of a three-coordinate tetrahedral centre.
func implicitMember(g ChiralClass, bonds, brackH int) bool {
	if g == ChiralTH {
		return bonds == 3
	}
	return brackH == 1
}

// polyhedron is the arrangement a square planar, trigonal bipyramidal or
// octahedral mark describes, in terms of atoms: the axis from one atom
// towards another, and the atoms around the axis in anticlockwise order
// seen from its start. Square planar centres have no axis (-2, -2) and
// their ring is the order around the square.
type polyhedron struct {
	from, to int
	ring     []int
	key      string // set by canonical
}

// tbAxes gives, for @TB1 to @TB20, the positions of the viewing axis in
// the neighbour order and whether the other three are anticlockwise
// (OpenSMILES 3.9, trigonal bipyramidal table).
var tbAxes = [21]struct {
	from, to      int
	anticlockwise bool
}{
	1: {0, 4, true}, 2: {0, 4, false}, 3: {0, 3, true}, 4: {0, 3, false},
	5: {0, 2, true}, 6: {0, 2, false}, 7: {0, 1, true}, 8: {0, 1, false},
	9: {1, 4, true}, 11: {1, 4, false}, 10: {1, 3, true}, 12: {1, 3, false},
	13: {1, 2, true}, 14: {1, 2, false}, 15: {2, 4, true}, 20: {2, 4, false},
	16: {2, 3, true}, 19: {2, 3, false}, 17: {3, 4, true}, 18: {3, 4, false},
}

// Shapes of four atoms drawn in a square (OpenSMILES 3.9): the ring
// positions the atoms take in the order they are listed. U goes round
// the square; Z goes along one side, across, and along the opposite
// side; '4' goes across, along a side, and across again.
var (
	shapeU    = [4]int{0, 1, 2, 3}
	shapeZ    = [4]int{0, 1, 3, 2}
	shapeFour = [4]int{0, 2, 3, 1}
)

// ohAxes gives, for @OH1 to @OH30, the axis end (the axis always starts
// at the first neighbour), the shape of the other four and whether they
// wind anticlockwise (OpenSMILES 3.9, octahedral table).
var ohAxes = [31]struct {
	to            int
	shape         [4]int
	anticlockwise bool
}{
	1: {5, shapeU, true}, 2: {5, shapeU, false}, 3: {4, shapeU, true}, 16: {4, shapeU, false},
	6: {3, shapeU, true}, 18: {3, shapeU, false}, 19: {2, shapeU, true}, 24: {2, shapeU, false},
	25: {1, shapeU, true}, 30: {1, shapeU, false},
	4: {5, shapeZ, true}, 14: {5, shapeZ, false}, 5: {4, shapeZ, true}, 15: {4, shapeZ, false},
	7: {3, shapeZ, true}, 17: {3, shapeZ, false}, 20: {2, shapeZ, true}, 23: {2, shapeZ, false},
	26: {1, shapeZ, true}, 29: {1, shapeZ, false},
	10: {5, shapeFour, true}, 8: {5, shapeFour, false}, 11: {4, shapeFour, true}, 9: {4, shapeFour, false},
	13: {3, shapeFour, true}, 12: {3, shapeFour, false}, 22: {2, shapeFour, true}, 21: {2, shapeFour, false},
	28: {1, shapeFour, true}, 27: {1, shapeFour, false},
}

// spShapes gives the shape of @SP1 to @SP3: U, '4' and Z.
var spShapes = [4][4]int{1: shapeU, 2: shapeFour, 3: shapeZ}

// classLimit is the highest number of each class.
func classLimit(g ChiralClass) int {
	switch g {
	case ChiralSP:
		return 3
	case ChiralTB:
		return 20
	case ChiralOH:
		return 30
	}
	return 2
}

// decodePolyhedron turns a mark number and a neighbour order into the
// arrangement it describes, in canonical form (see canonical), or false
// when the number or the count of neighbours does not fit the class.
func decodePolyhedron(g ChiralClass, order []int, num int) (polyhedron, bool) {
	if num < 1 || num > classLimit(g) {
		return polyhedron{}, false
	}
	others := func(from, to int) []int {
		var rest []int
		for i, v := range order {
			if i != from && i != to {
				rest = append(rest, v)
			}
		}
		return rest
	}
	placeInRing := func(listed []int, shape [4]int) []int {
		ring := make([]int, 4)
		for i, pos := range shape {
			ring[pos] = listed[i]
		}
		return ring
	}
	var p polyhedron
	switch g {
	case ChiralSP:
		if len(order) != 4 {
			return p, false
		}
		p = polyhedron{from: -2, to: -2, ring: placeInRing(order, spShapes[num])}
	case ChiralTB:
		ax := tbAxes[num]
		if len(order) != 5 {
			return p, false
		}
		p = polyhedron{from: order[ax.from], to: order[ax.to], ring: others(ax.from, ax.to)}
		if !ax.anticlockwise {
			reverseInts(p.ring)
		}
	case ChiralOH:
		ax := ohAxes[num]
		if len(order) != 6 {
			return p, false
		}
		p = polyhedron{from: order[0], to: order[ax.to], ring: placeInRing(others(0, ax.to), ax.shape)}
		if !ax.anticlockwise {
			reverseInts(p.ring)
		}
	default:
		return p, false
	}
	return p.canonical(g), true
}

// canonical puts an arrangement in one form and sets its key, which is
// equal for two arrangements exactly when they are the same. Trigonal
// bipyramids have one axis: it is made to start at the smaller atom
// (seen from the other end the ring turns the other way) and the ring to
// start at its smallest atom. A square has no sense of turning: its ring
// starts at the smallest atom and runs towards the smaller neighbour. An
// octahedron has three equivalent axes, so it is keyed by its three trans
// pairs and the handedness of one atom from each pair.
func (p polyhedron) canonical(g ChiralClass) polyhedron {
	if g == ChiralOH {
		p.key = octahedronKey(p.from, p.to, p.ring)
		return p
	}
	ring := append([]int(nil), p.ring...)
	if g != ChiralSP && p.to < p.from {
		p.from, p.to = p.to, p.from
		reverseInts(ring)
	}
	least := 0
	for i, v := range ring {
		if v < ring[least] {
			least = i
		}
	}
	ring = append(ring[least:], ring[:least]...)
	if g == ChiralSP && len(ring) == 4 && ring[3] < ring[1] {
		reverseInts(ring[1:])
	}
	p.ring = ring
	var sb strings.Builder
	for _, v := range append([]int{p.from, p.to}, ring...) {
		sb.WriteString(strconv.Itoa(v))
		sb.WriteByte(' ')
	}
	p.key = sb.String()
	return p
}

// octahedronKey places the atoms on the axes (from on +z, to on -z, the
// ring anticlockwise seen from +z: +x, +y, -x, -y), pairs the atoms that
// are trans, and records the sign of the triple product of the smaller
// atom of each pair, taken in order of those atoms.
func octahedronKey(from, to int, ring []int) string {
	if len(ring) != 4 {
		return "invalid"
	}
	pos := map[int][3]int{
		from: {0, 0, 1}, to: {0, 0, -1},
		ring[0]: {1, 0, 0}, ring[1]: {0, 1, 0}, ring[2]: {-1, 0, 0}, ring[3]: {0, -1, 0},
	}
	pairs := [][2]int{
		{min(from, to), max(from, to)},
		{min(ring[0], ring[2]), max(ring[0], ring[2])},
		{min(ring[1], ring[3]), max(ring[1], ring[3])},
	}
	sort.Slice(pairs, func(i, j int) bool { return pairs[i][0] < pairs[j][0] })
	u, v, w := pos[pairs[0][0]], pos[pairs[1][0]], pos[pairs[2][0]]
	det := u[0]*(v[1]*w[2]-v[2]*w[1]) - u[1]*(v[0]*w[2]-v[2]*w[0]) + u[2]*(v[0]*w[1]-v[1]*w[0])
	var sb strings.Builder
	for _, pr := range pairs {
		sb.WriteString(strconv.Itoa(pr[0]) + "-" + strconv.Itoa(pr[1]) + " ")
	}
	if det > 0 {
		sb.WriteString("right")
	} else {
		sb.WriteString("left")
	}
	return sb.String()
}

func (p polyhedron) equal(q polyhedron) bool { return p.key == q.key }

// renumber returns the number of class g that describes, for the
// neighbour order after, the arrangement mark num describes for the
// order before; 0 when there is none. The classes are small (at most 30
// numbers), so every number is tried.
func renumber(g ChiralClass, before []int, num int, after []int) int {
	want, ok := decodePolyhedron(g, before, num)
	if !ok {
		return 0
	}
	for n := 1; n <= classLimit(g); n++ {
		if got, ok := decodePolyhedron(g, after, n); ok && got.equal(want) {
			return n
		}
	}
	return 0
}

// alleneFix is an allene mark written into the text, to be checked once
// the positions of its ligands are known.
type alleneFix struct {
	atom   int
	offset int // of the mark in the text
	mark   string
}

// fixAllenes rewrites allene marks for the new order of their ligands.
// OpenSMILES 3.9 reads an extended tetrahedral mark as a tetrahedral one
// whose neighbours are the substituents of the two terminal atoms of the
// cumulated system, in the order they appear in the text (see
// alleneOrder). A mark flips when the written order is an odd
// permutation of the read one. When the substituents are not four
// distinct ones (an end with two hydrogens, an end that is not an atom
// with two substituents), their order has no meaning; the mark is then
// reported as unadjusted unless the order is unchanged.
func (w *writer) fixAllenes(text string) string {
	var edits []Edit
	for _, fix := range w.allenes {
		ends, ok := w.alleneEnds(fix.atom)
		if !ok || w.alleneDropped(ends) {
			w.out.Unadjusted = append(w.out.Unadjusted, fix.atom)
			continue
		}
		before, okBefore := w.alleneOrder(ends, w.readPlace)
		after, okAfter := w.alleneOrder(ends, w.writtenPlace)
		if !okBefore || !okAfter {
			if !sameInts(before, after) {
				w.out.Unadjusted = append(w.out.Unadjusted, fix.atom)
			}
			continue
		}
		odd, ok := permutationOdd(before, after)
		if !ok {
			w.out.Unadjusted = append(w.out.Unadjusted, fix.atom)
			continue
		}
		if odd {
			c := w.m.Atoms[fix.atom].Chirality
			c.Num = 3 - c.Num
			edits = append(edits, Edit{Span: Span{fix.offset, fix.offset + len(fix.mark)}, New: chiralityText(c)})
		}
	}
	if len(edits) == 0 {
		return text
	}
	out, err := ApplyEdits(text, edits)
	if err != nil {
		panic("internal error: allene marks overlap: " + err.Error())
	}
	return out
}

// alleneEnd is a terminal atom of a cumulated system and its neighbour
// inside the system, which is not one of its substituents.
type alleneEnd struct{ atom, inner int }

// alleneEnds follows the cumulated double bonds from centre a to the
// terminal atom on each side; false when a does not have two sides or
// the two sides meet (a ring of cumulated bonds).
func (w *writer) alleneEnds(a int) ([]alleneEnd, bool) {
	var ends []alleneEnd
	for _, b := range w.m.Atoms[a].Bonds {
		prev, end := a, w.m.Bonds[b].Other(a)
		for steps := 0; w.alleneCentre(end) && end != a && steps < len(w.m.Atoms); steps++ {
			next := -1
			for _, b2 := range w.m.Atoms[end].Bonds {
				if x := w.m.Bonds[b2].Other(end); x != prev {
					next = x
				}
			}
			prev, end = end, next
		}
		ends = append(ends, alleneEnd{end, prev})
	}
	ok := len(ends) == 2 && ends[0].atom != ends[1].atom && ends[0].atom != a && ends[1].atom != a
	return ends, ok
}

// alleneDropped reports whether a bond of a terminal atom was left out
// of the text, so a substituent is missing from the writing.
func (w *writer) alleneDropped(ends []alleneEnd) bool {
	for _, e := range ends {
		for _, b := range w.m.Atoms[e.atom].Bonds {
			if containsInt(w.out.Dropped, b) {
				return true
			}
		}
	}
	return false
}

// textPlace is where a substituent is named in a text: the position of
// an atom among the atoms, and a rank among the things written with it:
// 0 for the atom itself, 1 for its implicit hydrogens, then its
// ring-closure digits from 2. (An atom can be both a terminal atom with
// a hydrogen and a substituent of the other end, when the cumulated
// atoms close a ring of three; the atom comes first, as its token
// starts before the hydrogen count inside it.)
type textPlace struct{ atom, rank int }

func (p textPlace) less(q textPlace) bool {
	return p.atom < q.atom || (p.atom == q.atom && p.rank < q.rank)
}

// alleneHydrogen stands for the implicit hydrogens of terminal atom t in
// an allene's substituent order; it differs from every atom number and
// from the hydrogen of the other end.
func alleneHydrogen(t int) int { return -2 - t }

// alleneOrder lists the substituents of the terminal atoms in the order
// OpenSMILES 3.9 gives them for an extended tetrahedral mark: as they
// appear in the text, a neighbour reached through a ring closure at its
// digit on the terminal atom, and the implicit hydrogen of a terminal
// atom at that atom, so after its preceding atom and before its digits
// and branches, as for a tetrahedral centre. place says where bond b of
// terminal t names its other atom, in the text read or the one written.
// ok is false unless the list has four distinct members.
func (w *writer) alleneOrder(ends []alleneEnd, place func(t, b int) textPlace) (order []int, ok bool) {
	type named struct {
		ligand int
		at     textPlace
	}
	var list []named
	for _, e := range ends {
		at := &w.m.Atoms[e.atom]
		for h := 0; h < at.HydrogenCount(); h++ {
			list = append(list, named{alleneHydrogen(e.atom), place(e.atom, -1)})
		}
		for _, b := range at.Bonds {
			if x := w.m.Bonds[b].Other(e.atom); x != e.inner {
				list = append(list, named{x, place(e.atom, b)})
			}
		}
	}
	sort.SliceStable(list, func(i, j int) bool { return list[i].at.less(list[j].at) })
	for _, n := range list {
		order = append(order, n.ligand)
	}
	return order, len(order) == 4 && distinctInts(order)
}

// readPlace is where bond b of terminal t named its other atom in the
// text the molecule was read from (b < 0: where t's hydrogens stand).
// Atoms are numbered in the order they appear and a terminal atom's
// bonds are listed in the order their neighbours or digits appear, so
// the numbers say it.
func (w *writer) readPlace(t, b int) textPlace {
	if b < 0 {
		return textPlace{t, 1}
	}
	if w.m.Bonds[b].Ring {
		for i, x := range w.m.Atoms[t].Bonds {
			if x == b {
				return textPlace{t, 2 + i}
			}
		}
	}
	return textPlace{w.m.Bonds[b].Other(t), 0}
}

// writtenPlace is where bond b of terminal t names its other atom in the
// text being written (b < 0: where t's hydrogens stand).
func (w *writer) writtenPlace(t, b int) textPlace {
	if b < 0 {
		return textPlace{w.position[t], 1}
	}
	for i, x := range w.rings[t] {
		if x == b {
			return textPlace{w.position[t], 2 + i}
		}
	}
	return textPlace{w.position[w.m.Bonds[b].Other(t)], 0}
}

func distinctInts(s []int) bool {
	for i := range s {
		for j := i + 1; j < len(s); j++ {
			if s[i] == s[j] {
				return false
			}
		}
	}
	return true
}

// alleneCentre reports whether atom a has exactly two bonds, both double:
// the centre (or an inner atom) of a cumulated system.
func (w *writer) alleneCentre(a int) bool {
	bonds := w.m.Atoms[a].Bonds
	if len(bonds) != 2 {
		return false
	}
	for _, b := range bonds {
		if w.m.Bonds[b].Order != OrderDouble {
			return false
		}
	}
	return true
}

func insertAt(s []int, i, v int) []int {
	s = append(s, 0)
	copy(s[i+1:], s[i:])
	s[i] = v
	return s
}

func sameInts(a, b []int) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if a[i] != b[i] {
			return false
		}
	}
	return true
}

// permutationOdd reports whether after is an odd permutation of before,
// and false for ok when the two do not hold the same distinct items.
func permutationOdd(before, after []int) (odd, ok bool) {
	if len(before) != len(after) {
		return false, false
	}
	where := make(map[int]int, len(before))
	for i, v := range before {
		if _, dup := where[v]; dup {
			return false, false
		}
		where[v] = i
	}
	perm := make([]int, len(after))
	for i, v := range after {
		j, found := where[v]
		if !found {
			return false, false
		}
		perm[i] = j
	}
	seen := make([]bool, len(perm))
	swaps := 0
	for i := range perm {
		for j := i; !seen[j]; j = perm[j] {
			seen[j] = true
			if perm[j] != i {
				swaps++
			}
		}
	}
	return swaps%2 == 1, true
}

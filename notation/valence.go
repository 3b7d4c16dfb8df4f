package notation

// neutralValences are the valences an element may show when neutral. The
// reader reports a valence error only when an atom has more bonds than
// the largest of them: fewer is read as a radical, as the standard allows
// for bracket atoms. Hypervalent states are listed where chemistry knows
// them (sulfones, phosphates, periodates, xenon fluorides); common
// practice, from memory.
var neutralValences = map[int][]int{
	ElemH:  {1},
	2:      {0}, // He
	ElemB:  {3},
	ElemC:  {4},
	ElemN:  {3},
	ElemO:  {2},
	ElemF:  {1},
	10:     {0}, // Ne
	13:     {3}, // Al
	ElemSi: {4},
	ElemP:  {3, 5},
	ElemS:  {2, 4, 6},
	ElemCl: {1, 3, 5, 7},
	18:     {0}, // Ar
	31:     {3}, // Ga
	ElemGe: {4},
	ElemAs: {3, 5},
	ElemSe: {2, 4, 6},
	ElemBr: {1, 3, 5, 7},
	36:     {0, 2}, // Kr
	49:     {3},    // In
	50:     {2, 4}, // Sn
	51:     {3, 5}, // Sb
	ElemTe: {2, 4, 6},
	ElemI:  {1, 3, 5, 7},
	ElemXe: {0, 2, 4, 6, 8},
}

// pBlockPeriods are the atomic-number ranges, from group 13 to group 18,
// inside which a charge shifts an atom to the valences of its
// isoelectronic neighbour (N+ behaves as C, O- as F).
var pBlockPeriods = [][2]int{{5, 10}, {13, 18}, {31, 36}, {49, 54}}

// AllowedValences returns the valences an atom of element z with the
// given charge may show, or nil when the reader has no rule for it (metals,
// lanthanides, wildcards), in which case no valence error is reported.
func AllowedValences(z, charge int) []int {
	if charge == 0 {
		return neutralValence(z)
	}
	if z == ElemH {
		return []int{0}
	}
	for _, p := range pBlockPeriods {
		if z >= p[0] && z <= p[1] {
			iso := z - charge
			if iso >= p[0] && iso <= p[1] {
				return neutralValence(iso)
			}
			return nil
		}
	}
	return nil
}

// valenceTable is neutralValences by atomic number, read without a map
// lookup (once per atom of every record).
var valenceTable = func() (t [128][]int) {
	for z, v := range neutralValences {
		if z >= 0 && z < len(t) {
			t[z] = v
		}
	}
	return t
}()

// neutralValence returns the allowed valences of the neutral element z.
func neutralValence(z int) []int {
	if z >= 0 && z < len(valenceTable) {
		return valenceTable[z]
	}
	return neutralValences[z]
}

// bondOrderSum adds the Kekulé orders of an atom's bonds.
func bondOrderSum(m *Molecule, a int) int {
	s := 0
	for _, bi := range m.Atoms[a].Bonds {
		s += m.Bonds[bi].Kekule
	}
	return s
}

// implicitHydrogens fills Atom.ImplicitH for the organic subset
// (OpenSMILES 3.1.5): the smallest normal valence that covers the bonds,
// counting the double bond an aromatic atom takes in the Kekulé structure
// (pi marks those atoms).
func implicitHydrogens(m *Molecule, pi []bool) {
	for i := range m.Atoms {
		a := &m.Atoms[i]
		if a.Bracket || a.Number == 0 {
			continue
		}
		vals := organicValences[a.Number]
		sum := bondOrderSum(m, i)
		if a.Aromatic && !pi[i] {
			// An aromatic atom that takes no double bond has all its
			// valence in its sigma bonds (furan oxygen, pyrrole-type
			// nitrogen with three bonds).
			a.ImplicitH = 0
			continue
		}
		if a.Aromatic && !hasDoubleBond(m, i) {
			// The matching left this atom without its double bond (a
			// kekulize error is reported); count it as placed so the
			// hydrogen count is what the writer meant.
			sum++
		}
		for _, v := range vals {
			if v >= sum {
				a.ImplicitH = v - sum
				break
			}
		}
	}
}

// checkValences reports atoms with more bonds than their element allows.
// An atom of the organic subset may also take the highest normal valence
// of OpenSMILES ("Reading SMILES", section 3.1.5, Organic Subset: N 3 or
// 5, P 3 or 5, S 2, 4 or 6), so the nitro group written CN(=O)=O and the
// N-oxide O=n1ccccc1 read without error; a bracket atom is held to
// AllowedValences alone, as the specification leaves it to the toolkit.
func checkValences(m *Molecule) {
	for i := range m.Atoms {
		a := &m.Atoms[i]
		vals := AllowedValences(a.Number, a.Charge)
		if ov := organicValences[a.Number]; !a.Bracket && len(ov) > 0 && (len(vals) == 0 || ov[len(ov)-1] > vals[len(vals)-1]) {
			vals = ov
		}
		if len(vals) == 0 {
			continue
		}
		total := bondOrderSum(m, i) + a.HydrogenCount()
		top := vals[len(vals)-1]
		if total > top {
			m.Errors.Add(a.Span, CodeValence, "expected a valence of at most %d for %s, found %d", top, describeAtom(a), total)
		}
	}
}

// describeAtom names an atom for messages: "carbon", "N+".
func describeAtom(a *Atom) string {
	sym := ElementSymbol(a.Number)
	switch {
	case a.Charge > 0:
		return sym + chargeSuffix(a.Charge)
	case a.Charge < 0:
		return sym + chargeSuffix(a.Charge)
	}
	return sym
}

func chargeSuffix(c int) string {
	switch {
	case c == 1:
		return "+"
	case c == -1:
		return "-"
	case c > 0:
		return "+" + itoa(c)
	case c < 0:
		return "-" + itoa(-c)
	}
	return ""
}

func hasDoubleBond(m *Molecule, a int) bool {
	for _, bi := range m.Atoms[a].Bonds {
		if m.Bonds[bi].Kekule >= 2 {
			return true
		}
	}
	return false
}

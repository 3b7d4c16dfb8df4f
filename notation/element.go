package notation

// elementSymbols lists the element symbols by atomic number (index 0 is
// the '*' wildcard atom). Source: the IUPAC periodic table (common practice).
var elementSymbols = [...]string{
	"*",
	"H", "He",
	"Li", "Be", "B", "C", "N", "O", "F", "Ne",
	"Na", "Mg", "Al", "Si", "P", "S", "Cl", "Ar",
	"K", "Ca", "Sc", "Ti", "V", "Cr", "Mn", "Fe", "Co", "Ni", "Cu", "Zn", "Ga", "Ge", "As", "Se", "Br", "Kr",
	"Rb", "Sr", "Y", "Zr", "Nb", "Mo", "Tc", "Ru", "Rh", "Pd", "Ag", "Cd", "In", "Sn", "Sb", "Te", "I", "Xe",
	"Cs", "Ba",
	"La", "Ce", "Pr", "Nd", "Pm", "Sm", "Eu", "Gd", "Tb", "Dy", "Ho", "Er", "Tm", "Yb", "Lu",
	"Hf", "Ta", "W", "Re", "Os", "Ir", "Pt", "Au", "Hg", "Tl", "Pb", "Bi", "Po", "At", "Rn",
	"Fr", "Ra",
	"Ac", "Th", "Pa", "U", "Np", "Pu", "Am", "Cm", "Bk", "Cf", "Es", "Fm", "Md", "No", "Lr",
	"Rf", "Db", "Sg", "Bh", "Hs", "Mt", "Ds", "Rg", "Cn", "Nh", "Fl", "Mc", "Lv", "Ts", "Og",
}

var elementBySymbol = func() map[string]int {
	m := make(map[string]int, len(elementSymbols))
	for i, s := range elementSymbols {
		m[s] = i
	}
	return m
}()

// MaxElement is the highest atomic number the reader knows.
const MaxElement = len(elementSymbols) - 1

// ElementSymbol returns the symbol of atomic number z, or "" when z is out
// of range. ElementSymbol(0) is "*".
func ElementSymbol(z int) string {
	if z < 0 || z >= len(elementSymbols) {
		return ""
	}
	return elementSymbols[z]
}

// ElementNumber returns the atomic number of a symbol written with a
// capital first letter ("Cl"), and whether the symbol is known.
func ElementNumber(sym string) (int, bool) {
	// the symbols of the organic subset without a map lookup: the reader
	// asks for one per atom
	switch sym {
	case "C":
		return ElemC, true
	case "N":
		return ElemN, true
	case "O":
		return ElemO, true
	case "S":
		return ElemS, true
	case "F":
		return ElemF, true
	case "Cl":
		return ElemCl, true
	case "Br":
		return ElemBr, true
	case "P":
		return ElemP, true
	case "I":
		return ElemI, true
	case "H":
		return ElemH, true
	case "B":
		return ElemB, true
	}
	z, ok := elementBySymbol[sym]
	return z, ok
}

// Atomic numbers used by name in the reader and the stereo engine.
const (
	ElemH  = 1
	ElemB  = 5
	ElemC  = 6
	ElemN  = 7
	ElemO  = 8
	ElemF  = 9
	ElemSi = 14
	ElemP  = 15
	ElemS  = 16
	ElemCl = 17
	ElemGe = 32
	ElemAs = 33
	ElemSe = 34
	ElemBr = 35
	ElemTe = 52
	ElemI  = 53
	ElemXe = 54
)

// aromaticSymbols are the lowercase symbols OpenSMILES allows for
// aromatic atoms (section 3.5): in brackets all of them, outside brackets
// only b c n o p s.
// aromaticNumber is the atomic number of an aromatic symbol, the
// common ones without a map lookup.
func aromaticNumber(sym string) (int, bool) {
	switch sym {
	case "c":
		return ElemC, true
	case "n":
		return ElemN, true
	case "o":
		return ElemO, true
	case "s":
		return ElemS, true
	}
	z, ok := aromaticSymbols[sym]
	return z, ok
}

var aromaticSymbols = map[string]int{
	"b": ElemB, "c": ElemC, "n": ElemN, "o": ElemO, "p": ElemP, "s": ElemS,
	"se": ElemSe, "as": ElemAs, "te": ElemTe,
}

// organicValences are the normal valences of the organic subset
// (OpenSMILES 3.1.5): an atom written without brackets gets implicit
// hydrogens up to the smallest of these that covers its bond orders.
var organicValences = map[int][]int{
	ElemB:  {3},
	ElemC:  {4},
	ElemN:  {3, 5},
	ElemO:  {2},
	ElemP:  {3, 5},
	ElemS:  {2, 4, 6},
	ElemF:  {1},
	ElemCl: {1},
	ElemBr: {1},
	ElemI:  {1},
}

package notation

import (
	"sort"
	"strconv"
	"strings"
)

// Formula is the elemental composition of a set of atoms with its masses.
// Hydrogens are counted wherever they are: implicit, inside brackets
// ([CH3]) and as atoms of their own ([H], [2H]).
type Formula struct {
	// Counts is the number of atoms of each element by atomic number.
	// Wildcard '*' atoms and atoms of unknown elements are not counted
	// here; see Unknown.
	Counts [MaxElement + 1]int

	// Charge is the net formal charge. String leaves it out; ChargedString
	// appends it.
	Charge int

	// Unknown counts the atoms that have no element ('*' or an unknown
	// bracket symbol); they add nothing to the masses.
	Unknown int

	// AverageMass is the molecular weight from standard atomic weights,
	// in daltons. An atom written with an isotope contributes that
	// isotope's mass instead of its element's average.
	AverageMass float64

	// MonoisotopicMass is the mass built from the most abundant isotope of
	// each element (or the isotope written), less the mass of the
	// electrons a positive charge removes (plus those a negative charge
	// adds), as a mass spectrometer sees the ion.
	MonoisotopicMass float64

	// Estimated is set when some mass is a guess: a written isotope
	// missing from the isotope table is taken at its mass number, and an
	// unknown atom adds nothing.
	Estimated bool
}

// MolecularFormula returns the formula of every atom of m. For a reaction
// that mixes all roles; use RoleFormula for one side.
func MolecularFormula(m *Molecule) Formula {
	return FormulaOf(m, func(int) bool { return true })
}

// RoleFormula returns the formula of the atoms written in one part of a
// reaction (reactants, agents or products).
func RoleFormula(m *Molecule, r Role) Formula {
	return FormulaOf(m, func(a int) bool { return m.Atoms[a].Role == r })
}

// ComponentFormula returns the formula of one dot-separated part.
func ComponentFormula(m *Molecule, component int) Formula {
	return FormulaOf(m, func(a int) bool { return m.Atoms[a].Component == component })
}

// electronMass is the electron's mass in daltons (CODATA 2018, from memory).
const electronMass = 0.000548579909

// FormulaOf returns the formula of the atoms of m for which include is true.
func FormulaOf(m *Molecule, include func(atom int) bool) Formula {
	var f Formula
	for i := range m.Atoms {
		if !include(i) {
			continue
		}
		a := &m.Atoms[i]
		f.Charge += a.Charge
		h := a.HydrogenCount()
		if h > 0 {
			f.Counts[ElemH] += h
			f.AverageMass += float64(h) * standardWeights[ElemH]
			f.MonoisotopicMass += float64(h) * commonIsotopes[ElemH].mass
		}
		z := a.Number
		if z <= 0 || z > MaxElement {
			f.Unknown++
			f.Estimated = true
			continue
		}
		f.Counts[z]++
		if a.Isotope > 0 {
			mass, known := IsotopeMass(z, a.Isotope)
			if !known {
				f.Estimated = true
			}
			f.AverageMass += mass
			f.MonoisotopicMass += mass
			continue
		}
		f.AverageMass += standardWeights[z]
		f.MonoisotopicMass += commonIsotopes[z].mass
	}
	f.MonoisotopicMass -= float64(f.Charge) * electronMass
	return f
}

// String returns the formula in the Hill system: with carbon present, C
// first, H second, then the other symbols alphabetically; without carbon
// all symbols alphabetically, H included. A count of one is not written;
// isotopes and charge are not shown.
func (f Formula) String() string {
	type part struct {
		sym string
		n   int
	}
	var parts []part
	for z, n := range f.Counts {
		if n > 0 {
			parts = append(parts, part{ElementSymbol(z), n})
		}
	}
	carbon := f.Counts[ElemC] > 0
	rank := func(s string) int {
		if !carbon {
			return 2
		}
		switch s {
		case "C":
			return 0
		case "H":
			return 1
		}
		return 2
	}
	sort.Slice(parts, func(i, j int) bool {
		ri, rj := rank(parts[i].sym), rank(parts[j].sym)
		if ri != rj {
			return ri < rj
		}
		return parts[i].sym < parts[j].sym
	})
	var sb strings.Builder
	for _, p := range parts {
		sb.WriteString(p.sym)
		if p.n > 1 {
			sb.WriteString(strconv.Itoa(p.n))
		}
	}
	return sb.String()
}

// ChargedString returns String followed by the net charge written the
// chemist's way: "+" or "-" for one, "2+" or "3-" for more, nothing when
// neutral (C2H3O2-, H4N+, O4S2-).
func (f Formula) ChargedString() string {
	s := f.String()
	c := f.Charge
	switch {
	case c == 1:
		return s + "+"
	case c == -1:
		return s + "-"
	case c > 1:
		return s + strconv.Itoa(c) + "+"
	case c < -1:
		return s + strconv.Itoa(-c) + "-"
	}
	return s
}

// IsotopeMass returns the mass in daltons of the isotope with atomic
// number z and mass number a, and whether it is in the table. Isotopes
// outside the table are given their mass number, which is within a few
// tenths of a dalton.
func IsotopeMass(z, a int) (float64, bool) {
	if z > 0 && z <= MaxElement && commonIsotopes[z].number == a {
		return commonIsotopes[z].mass, true
	}
	if m, ok := labelIsotopes[[2]int{z, a}]; ok {
		return m, true
	}
	return float64(a), false
}

// StandardAtomicWeight returns the conventional atomic weight of element
// z in daltons, or 0 when z is out of range.
func StandardAtomicWeight(z int) float64 {
	if z <= 0 || z > MaxElement {
		return 0
	}
	return standardWeights[z]
}

// standardWeights are the IUPAC CIAAW standard atomic weights 2021,
// abridged to five significant figures, with the conventional value for
// elements given as an interval (H 1.008, C 12.011, N 14.007, O 15.999,
// ...). Elements without stable isotopes carry the mass number of their
// longest-lived isotope, as the IUPAC periodic table prints it in
// brackets. All values are from memory.
var standardWeights = [MaxElement + 1]float64{
	0,
	1.008, 4.0026, // H He
	6.94, 9.0122, 10.81, 12.011, 14.007, 15.999, 18.998, 20.180, // Li..Ne
	22.990, 24.305, 26.982, 28.085, 30.974, 32.06, 35.45, 39.95, // Na..Ar
	39.098, 40.078, 44.956, 47.867, 50.942, 51.996, 54.938, 55.845, 58.933, // K..Co
	58.693, 63.546, 65.38, 69.723, 72.630, 74.922, 78.971, 79.904, 83.798, // Ni..Kr
	85.468, 87.62, 88.906, 91.222, 92.906, 95.95, 97, 101.07, 102.91, // Rb..Rh
	106.42, 107.87, 112.41, 114.82, 118.71, 121.76, 127.60, 126.90, 131.29, // Pd..Xe
	132.91, 137.33, // Cs Ba
	138.91, 140.12, 140.91, 144.24, 145, 150.36, 151.96, 157.25, // La..Gd
	158.93, 162.50, 164.93, 167.26, 168.93, 173.05, 174.97, // Tb..Lu
	178.49, 180.95, 183.84, 186.21, 190.23, 192.22, 195.08, 196.97, 200.59, // Hf..Hg
	204.38, 207.2, 208.98, 209, 210, 222, // Tl..Rn
	223, 226, // Fr Ra
	227, 232.04, 231.04, 238.03, 237, 244, 243, 247, // Ac..Cm
	247, 251, 252, 257, 258, 259, 262, // Bk..Lr
	267, 268, 269, 270, 269, 278, 281, 282, 285, // Rf..Cn
	286, 289, 290, 293, 294, 294, // Nh..Og
}

// isotope is a mass number with its atomic mass in daltons.
type isotope struct {
	number int
	mass   float64
}

// commonIsotopes gives, for each element, its most abundant isotope
// (for elements without stable isotopes, the isotope whose mass number
// standardWeights uses) with its atomic mass from the Atomic Mass
// Evaluation AME2020. All values are from memory.
var commonIsotopes = [MaxElement + 1]isotope{
	{0, 0},
	{1, 1.00782503223}, {4, 4.00260325413},
	{7, 7.0160034366}, {9, 9.012183065}, {11, 11.00930536}, {12, 12}, {14, 14.00307400443},
	{16, 15.99491461957}, {19, 18.99840316273}, {20, 19.9924401762},
	{23, 22.989769282}, {24, 23.985041697}, {27, 26.98153853}, {28, 27.97692653465},
	{31, 30.97376199842}, {32, 31.9720711744}, {35, 34.968852682}, {40, 39.9623831237},
	{39, 38.9637064864}, {40, 39.962590863}, {45, 44.95590828}, {48, 47.94794198},
	{51, 50.94395704}, {52, 51.94050623}, {55, 54.93804391}, {56, 55.93493633},
	{59, 58.93319429}, {58, 57.93534241}, {63, 62.92959772}, {64, 63.92914201},
	{69, 68.9255735}, {74, 73.921177761}, {75, 74.92159457}, {80, 79.9165218},
	{79, 78.9183376}, {84, 83.9114977282},
	{85, 84.9117897379}, {88, 87.9056125}, {89, 88.9058403}, {90, 89.9046977},
	{93, 92.906373}, {98, 97.90540482}, {97, 96.9063667}, {102, 101.9043441},
	{103, 102.905498}, {106, 105.9034804}, {107, 106.9050916}, {114, 113.90336509},
	{115, 114.903878776}, {120, 119.90220163}, {121, 120.903812}, {130, 129.906222748},
	{127, 126.9044719}, {132, 131.9041550856},
	{133, 132.905451961}, {138, 137.905247},
	{139, 138.9063563}, {140, 139.9054431}, {141, 140.9076576}, {142, 141.907729},
	{145, 144.9127559}, {152, 151.9197397}, {153, 152.921238}, {158, 157.9241123},
	{159, 158.9253547}, {164, 163.9291819}, {165, 164.9303288}, {166, 165.9302995},
	{169, 168.9342179}, {174, 173.9388664}, {175, 174.9407752},
	{180, 179.946557}, {181, 180.9479958}, {184, 183.95093092}, {187, 186.9557501},
	{192, 191.961477}, {193, 192.9629216}, {195, 194.9647917}, {197, 196.96656879},
	{202, 201.9706434}, {205, 204.9744278}, {208, 207.9766525}, {209, 208.9803991},
	{209, 208.9824308}, {210, 209.9871479}, {222, 222.0175782},
	{223, 223.019736}, {226, 226.0254103},
	{227, 227.0277523}, {232, 232.0380558}, {231, 231.0358842}, {238, 238.0507884},
	{237, 237.0481736}, {244, 244.0642053}, {243, 243.0613813}, {247, 247.0703541},
	{247, 247.0703073}, {251, 251.0795886}, {252, 252.08298}, {257, 257.0951061},
	{258, 258.0984315}, {259, 259.10103}, {262, 262.10961},
	{267, 267.12179}, {268, 268.12567}, {269, 269.12863}, {270, 270.13336},
	{269, 269.13375}, {278, 278.15631}, {281, 281.16451}, {282, 282.16912},
	{285, 285.17712}, {286, 286.18221}, {289, 289.19042}, {290, 290.19598},
	{293, 293.20449}, {294, 294.21046}, {294, 294.21392},
}

// labelIsotopes are the other isotopes commonly written in labelled
// compounds and tracers, by atomic number and mass number, with masses
// from AME2020 (from memory).
var labelIsotopes = map[[2]int]float64{
	{1, 2}: 2.01410177812, {1, 3}: 3.01604928,
	{6, 11}: 11.0114336, {6, 13}: 13.00335483507, {6, 14}: 14.0032419884,
	{7, 13}: 13.00573861, {7, 15}: 15.00010889888,
	{8, 15}: 15.0030656, {8, 17}: 16.99913175650, {8, 18}: 17.99915961286,
	{9, 18}:  18.0009380,
	{15, 32}: 31.97390764, {15, 33}: 32.9717257,
	{16, 33}: 32.9714589098, {16, 34}: 33.967867004, {16, 35}: 34.96903231, {16, 36}: 35.96708071,
	{17, 36}: 35.96830682, {17, 37}: 36.965902602,
	{35, 81}: 80.9162897, {35, 76}: 75.924541, {35, 82}: 81.9168018,
	{53, 123}: 122.905589, {53, 124}: 123.9062094, {53, 125}: 124.9046294, {53, 131}: 130.9061246,
	{5, 10}: 10.01293695, {3, 6}: 6.0151228874,
	{14, 29}: 28.9764946649, {14, 30}: 29.973770136,
	{26, 54}: 53.93960899, {26, 57}: 56.93539284, {26, 58}: 57.93327443,
	{29, 65}: 64.92778970, {30, 66}: 65.92603381, {30, 68}: 67.92484455,
	{34, 78}: 77.91730928, {34, 77}: 76.9199142,
	{43, 99}: 98.9062508, {43, 98}: 97.9072124,
	{92, 235}: 235.0439301,
}

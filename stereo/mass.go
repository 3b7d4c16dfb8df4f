// This file implements the atomic masses Rule 2 compares.

package stereo

// atomMass returns the mass Rule 2 compares: the exact mass of the
// isotope when one is written, the standard atomic weight otherwise
// (Hanson et al. 2018 compare natural-abundance atoms by their average
// mass, so [16O] ranks below O and [1H] below H).
func atomMass(z, isotope int) float64 {
	if isotope > 0 {
		if m, ok := isotopeMass[[2]int{z, isotope}]; ok {
			return m
		}
		return float64(isotope)
	}
	if z >= 0 && z < len(atomicWeight) {
		return atomicWeight[z]
	}
	return float64(2 * z)
}

// isotopeMass holds exact masses of isotopes whose mass number lies close
// to the element's standard atomic weight, where the difference decides.
// Values from the AME atomic mass evaluation (from memory, four decimals).
var isotopeMass = map[[2]int]float64{
	{1, 1}: 1.0078, {1, 2}: 2.0141, {1, 3}: 3.0160,
	{6, 12}: 12.0000, {6, 13}: 13.0034, {6, 14}: 14.0032,
	{7, 14}: 14.0031, {7, 15}: 15.0001,
	{8, 16}: 15.9949, {8, 17}: 16.9991, {8, 18}: 17.9992,
	{9, 19}: 18.9984, {15, 31}: 30.9738, {16, 32}: 31.9721, {16, 34}: 33.9679,
	{17, 35}: 34.9689, {17, 37}: 36.9659, {35, 79}: 78.9183, {35, 81}: 80.9163,
	{53, 127}: 126.9045, {53, 125}: 124.9046, {53, 123}: 122.9056, {53, 131}: 130.9061,
}

// atomicWeight is the standard atomic weight by atomic number (IUPAC
// table, from memory, to about three decimals; only order matters).
var atomicWeight = [...]float64{
	0, 1.008, 4.003, 6.94, 9.012, 10.81, 12.011, 14.007, 15.999, 18.998, 20.180,
	22.990, 24.305, 26.982, 28.085, 30.974, 32.06, 35.45, 39.95, 39.098, 40.078,
	44.956, 47.867, 50.942, 51.996, 54.938, 55.845, 58.933, 58.693, 63.546, 65.38,
	69.723, 72.630, 74.922, 78.971, 79.904, 83.798, 85.468, 87.62, 88.906, 91.224,
	92.906, 95.95, 98, 101.07, 102.91, 106.42, 107.87, 112.41, 114.82, 118.71,
	121.76, 127.60, 126.90, 131.29, 132.91, 137.33, 138.91, 140.12, 140.91, 144.24,
	145, 150.36, 151.96, 157.25, 158.93, 162.50, 164.93, 167.26, 168.93, 173.05,
	174.97, 178.49, 180.95, 183.84, 186.21, 190.23, 192.22, 195.08, 196.97, 200.59,
	204.38, 207.2, 208.98, 209, 210, 222, 223, 226, 227, 232.04, 231.04, 238.03,
}

// This file implements the one permutation parity and the one typed
// handedness of the stereo engines.

package ringgeom

// Parity is the parity of a permutation as a sign, Even +1 and Odd -1,
// so that parities compose by multiplication.
type Parity int8

// Parities.
const (
	Even Parity = 1
	Odd  Parity = -1
)

// PermutationParity returns the parity of the permutation that sorts xs:
// Odd when an odd number of pairs stand in decreasing order. distinct is
// false when two entries are equal; the parity then counts only the
// pairs strictly out of order.
func PermutationParity(xs []int) (p Parity, distinct bool) {
	inversions := 0
	distinct = true
	for i := range xs {
		for j := i + 1; j < len(xs); j++ {
			switch {
			case xs[i] == xs[j]:
				distinct = false
			case xs[i] > xs[j]:
				inversions++
			}
		}
	}
	if inversions%2 == 1 {
		return Odd, distinct
	}
	return Even, distinct
}

// Hand is the sense of a stereo unit as a sign, one type for every
// geometry, so that a sense read in one order becomes the sense in
// another by multiplying with the parity of the permutation between
// them (Permuted). For a tetrahedral or allene mark, Anticlockwise is
// '@' and Clockwise '@@': seen from the first ligand, the others turn
// that way (OpenSMILES 3.9). For a double bond, Trans says that two
// reference substituents, one at each end, lie on opposite sides, Cis
// that they lie on one side. NoHand means not known.
type Hand int8

// Hands. Trans and Cis share the values of Anticlockwise and Clockwise:
// each pair is one sense and its reverse.
const (
	NoHand        Hand = 0
	Anticlockwise Hand = 1
	Clockwise     Hand = -1
	Trans         Hand = 1
	Cis           Hand = -1
)

// MarkHand returns the hand of a chirality mark's number as OpenSMILES
// writes it: 1 ('@', @TH1, @AL1) is Anticlockwise, 2 ('@@', @TH2, @AL2)
// Clockwise. Any other number (the reader gives 0 to a number it
// rejects, as in @TH3, and reports it) has NoHand: the caller decides.
func MarkHand(num int) Hand {
	switch num {
	case 1:
		return Anticlockwise
	case 2:
		return Clockwise
	}
	return NoHand
}

// Reversed returns the opposite sense.
func (h Hand) Reversed() Hand { return -h }

// Permuted returns the sense of the same arrangement read in an order
// that the permutation of parity p takes the original order to.
func (h Hand) Permuted(p Parity) Hand { return h * Hand(p) }

package review

// This file implements the vocabulary of the review: the class of a pair.

// Class is what a change did to a record. The names are public: the
// diff command prints them and --fail-on takes them.
type Class uint8

// Classes of a pair of records, from the mildest change to the gravest,
// then the records present on one side only. A reaction takes the
// gravest class of its roles.
const (
	// Rewritten: the same compound with the same configuration, written
	// differently (atom order, ring digits, aromatic or Kekulé form).
	Rewritten Class = iota
	// StereoAdded: marks fix units the earlier version left open.
	StereoAdded
	// StereoRemoved: units the earlier version fixed are now open.
	StereoRemoved
	// BondFlipped: the configuration of double bonds changed (E/Z), and
	// nothing else.
	BondFlipped
	// Epimer: one stereocentre inverted, others kept.
	Epimer
	// Diastereomer: several units changed, but not into the mirror
	// image.
	Diastereomer
	// Enantiomer: the mirror image.
	Enantiomer
	// ConstitutionChanged: another compound (other atoms or bonds).
	ConstitutionChanged
	// Unreadable: one side does not read without error.
	Unreadable
	// Added: a record with no counterpart in the earlier version.
	Added
	// Removed: a record of the earlier version with no counterpart now.
	Removed
)

var classNames = [...]string{
	Rewritten:           "rewritten",
	StereoAdded:         "stereo-added",
	StereoRemoved:       "stereo-removed",
	BondFlipped:         "bond-flipped",
	Epimer:              "epimer",
	Diastereomer:        "diastereomer",
	Enantiomer:          "enantiomer",
	ConstitutionChanged: "constitution-changed",
	Unreadable:          "unreadable",
	Added:               "added",
	Removed:             "removed",
}

// String returns the public name of the class ("epimer").
func (c Class) String() string {
	if int(c) < len(classNames) {
		return classNames[c]
	}
	return "unknown"
}

// Classes returns every class in the order of the constants, the order
// summaries list them in.
func Classes() []Class {
	out := make([]Class, len(classNames))
	for i := range out {
		out[i] = Class(i)
	}
	return out
}

// ParseClass reads a name String returns.
func ParseClass(s string) (Class, bool) {
	for i, n := range classNames {
		if n == s {
			return Class(i), true
		}
	}
	return 0, false
}

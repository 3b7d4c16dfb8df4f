package notation

import "fmt"

// This file implements the readings of the marks that general-purpose
// readers read differently (testdata/survey): where the lone pair of a
// stereocentre without hydrogen stands in its neighbour order, and what
// the same direction mark on both digits of one ring closure means.
// OpenSMILES leaves the first open (3.8.2 places a bracket hydrogen, not a
// lone pair) and contradicts itself on the second (3.4 asks for the same
// bond symbol at both digits, 3.8.3 reads a mark relative to the atom it
// follows). A Reading chooses; the zero value is the default, the reading
// of the majority of the surveyed readers.

// Reading chooses how the marks OpenSMILES leaves open are read. The
// zero value is DefaultReading. A Molecule carries the reading it was
// read under; every engine that reads its marks (labels, identity keys,
// transforms, the writer) asks it through LonePairSlot and BondDir.
type Reading struct {
	LonePair  LonePairRule
	RingMarks RingMarkRule
}

// DefaultReading is the reading of the two RDKit releases surveyed
// (2022.09.3 and 2026.09.1), two of the three readers; Open Babel 3.1.1
// reads both cases the other way.
var DefaultReading = Reading{}

// LonePairRule says where the lone pair of a tetrahedral centre with
// three neighbours and no hydrogen stands in its neighbour order.
type LonePairRule uint8

const (
	// LonePairLast puts the lone pair after the written neighbours; on a
	// centre whose bonds are all single, each ring-closure digit on the
	// centre inverts the reading once more. RDKit 2022.09.3 and
	// 2026.09.1 read so.
	LonePairLast LonePairRule = iota
	// LonePairHydrogenSlot puts the lone pair where a bracket hydrogen
	// would stand (OpenSMILES 3.8.2): right after the preceding atom,
	// first when the centre starts its part. Open Babel 3.1.1 reads so.
	LonePairHydrogenSlot
)

// RingMarkRule says what the same direction mark on both digits of one
// ring closure means (C/1=C/CCCCCCCC/1): read relative to the atom each
// follows (OpenSMILES 3.8.3), the two contradict each other.
type RingMarkRule uint8

const (
	// RingMarksClosing lets the mark at the closing digit decide. RDKit
	// 2022.09.3 and 2026.09.1 read so.
	RingMarksClosing RingMarkRule = iota
	// RingMarksDropped drops both marks: the other marks of the double
	// bond decide. Open Babel 3.1.1 reads so.
	RingMarksDropped
)

var (
	lonePairNames  = [...]string{LonePairLast: "last", LonePairHydrogenSlot: "hydrogen-slot"}
	ringMarksNames = [...]string{RingMarksClosing: "closing", RingMarksDropped: "dropped"}
)

func (r LonePairRule) String() string {
	if int(r) < len(lonePairNames) {
		return lonePairNames[r]
	}
	return fmt.Sprintf("LonePairRule(%d)", r)
}

func (r RingMarkRule) String() string {
	if int(r) < len(ringMarksNames) {
		return ringMarksNames[r]
	}
	return fmt.Sprintf("RingMarkRule(%d)", r)
}

// ParseLonePairRule reads the name of a lone-pair rule ("last",
// "hydrogen-slot").
func ParseLonePairRule(s string) (LonePairRule, bool) {
	for i, n := range lonePairNames {
		if n == s {
			return LonePairRule(i), true
		}
	}
	return 0, false
}

// ParseRingMarkRule reads the name of a ring-mark rule ("closing",
// "dropped").
func ParseRingMarkRule(s string) (RingMarkRule, bool) {
	for i, n := range ringMarksNames {
		if n == s {
			return RingMarkRule(i), true
		}
	}
	return 0, false
}

// LonePairRules and RingMarkRules list every value, for code that reads
// a record under every reading.
var (
	LonePairRules = []LonePairRule{LonePairLast, LonePairHydrogenSlot}
	RingMarkRules = []RingMarkRule{RingMarksClosing, RingMarksDropped}
)

// Readings returns every combination of the rules, the default first.
func Readings() []Reading {
	var out []Reading
	for _, lp := range LonePairRules {
		for _, rm := range RingMarkRules {
			out = append(out, Reading{LonePair: lp, RingMarks: rm})
		}
	}
	return out
}

func (r Reading) String() string {
	return "lonePair=" + r.LonePair.String() + " ringMarks=" + r.RingMarks.String()
}

// ReadWith reads text as Read does, under reading r.
func ReadWith(text string, r Reading) *Molecule {
	m := Read(text)
	m.Reading = r
	return m
}

// WithReading returns a copy of m that reads its marks under r. The copy
// shares m's atoms, bonds and errors, which neither changes.
func (m *Molecule) WithReading(r Reading) *Molecule {
	c := *m
	c.Reading = r
	return &c
}

// LonePairPlace returns the position of the lone pair in the neighbour
// order of a tetrahedral centre with three written neighbours, under rule
// r: hasPrev says whether the centre follows a preceding atom, ringDigits
// counts the ring-closure digits on it, allSingle whether all its bonds
// are single. The writer calls it for the order it writes; LonePairSlot
// for the order read.
func LonePairPlace(r LonePairRule, hasPrev bool, ringDigits int, allSingle bool) int {
	if r == LonePairHydrogenSlot {
		if hasPrev {
			return 1
		}
		return 0
	}
	// last: after the three neighbours; one more inversion is one
	// transposition, the lone pair before the last neighbour
	if allSingle && ringDigits%2 == 1 {
		return 2
	}
	return 3
}

// LonePairSlot returns the position of the lone pair in the neighbour
// order of atom a, a tetrahedral centre with three neighbours and no
// hydrogen, under the molecule's reading.
func (m *Molecule) LonePairSlot(a int) int { return m.lonePairSlot(a, m.Reading.LonePair) }

func (m *Molecule) lonePairSlot(a int, r LonePairRule) int {
	at := &m.Atoms[a]
	digits, single := 0, true
	for _, bi := range at.Bonds {
		b := &m.Bonds[bi]
		if b.Ring {
			digits++
		}
		if b.Order != OrderSingle {
			single = false
		}
	}
	return min(LonePairPlace(r, at.HasPrev, digits, single), len(at.Bonds))
}

// LonePairOpen reports whether the place of the lone pair of atom a (a
// tetrahedral centre with three neighbours and no hydrogen) depends on
// the reading: the rules put it at positions of opposite parity.
func (m *Molecule) LonePairOpen(a int) bool {
	return (m.lonePairSlot(a, LonePairLast)-m.lonePairSlot(a, LonePairHydrogenSlot))%2 != 0
}

// RingMarksContradict reports whether ring-closure bond b carries a
// direction mark at both digits that, each read relative to the atom it
// follows, contradict each other: the same symbol at both digits.
func (b *Bond) RingMarksContradict() bool {
	return b.Ring && b.Dir != DirNone && b.CloseDir != DirNone && b.CloseDir != b.Dir.Reverse()
}

// BondDir returns the direction of bond bi read from atom a towards the
// other end, under the molecule's reading. A ring closure combines the
// marks at its two digits: one mark, or two that agree, say the same;
// two that contradict each other are read by m.Reading.RingMarks.
func (m *Molecule) BondDir(bi, a int) Direction {
	b := &m.Bonds[bi]
	d := b.Dir
	switch {
	case b.RingMarksContradict():
		if m.Reading.RingMarks == RingMarksDropped {
			return DirNone
		}
		d = b.CloseDir.Reverse()
	case d == DirNone && b.Ring:
		d = b.CloseDir.Reverse()
	}
	if a == b.Begin {
		return d
	}
	return d.Reverse()
}

// MarkSpan returns the span of the direction mark that decides bond bi
// under the molecule's reading: the closing digit's when it alone is
// marked or the closing rule decides a contradicting pair, the bond's
// own span otherwise.
func (m *Molecule) MarkSpan(bi int) Span {
	b := &m.Bonds[bi]
	if b.Ring && b.CloseDir != DirNone && (b.Dir == DirNone || b.RingMarksContradict() && m.Reading.RingMarks == RingMarksClosing) {
		return b.CloseSpan
	}
	return b.Span
}

// The readers surveyed (testdata/survey), by the rule they follow.
const (
	readersRDKit     = "RDKit 2022.09.3 and @rdkit/rdkit 2026.09.1"
	readersOpenBabel = "Open Babel 3.1.1"
	// ReadersAll names every reader surveyed.
	ReadersAll = "RDKit 2022.09.3, @rdkit/rdkit 2026.09.1 and Open Babel 3.1.1"
)

// Readers names the general-purpose readers that follow rule r, as the
// survey (testdata/survey) found them.
func (r LonePairRule) Readers() string {
	if r == LonePairHydrogenSlot {
		return readersOpenBabel
	}
	return readersRDKit
}

// Readers names the general-purpose readers that follow rule r, as the
// survey (testdata/survey) found them.
func (r RingMarkRule) Readers() string {
	if r == RingMarksDropped {
		return readersOpenBabel
	}
	return readersRDKit
}

// Other returns the other rule.
func (r LonePairRule) Other() LonePairRule {
	if r == LonePairHydrogenSlot {
		return LonePairLast
	}
	return LonePairHydrogenSlot
}

// Other returns the other rule.
func (r RingMarkRule) Other() RingMarkRule {
	if r == RingMarksDropped {
		return RingMarksClosing
	}
	return RingMarksDropped
}

// Package depict draws structure diagrams of molecules read by package
// notation, with the stereo the marks state: 2D coordinates from our own
// layout (ring systems first, then chains and substituents, then overlap
// resolution), wedge and hash bonds for tetrahedral centres and allenes,
// double bonds with their written E/Z geometry, wavy bonds for
// stereogenic units left open, CIP descriptors beside each unit and the
// atoms and bonds that carry a diagnostic highlighted. It also builds
// Fischer projections (fischer.go) and writes drawings as SVG, PNG, JSON
// and MDL molfiles.
//
// Coordinates are in bond lengths, y pointing up. Every choice the layout
// makes follows a canonical order of the atoms computed from graph
// invariants (canon.go), not the order of the text, so two writings of
// one structure give the same picture up to rotation.
package depict

import (
	"fmt"
	"time"

	"stereoline/notation"
	"stereoline/stereo"
)

// Style is how a bond is drawn.
type Style uint8

// Bond styles. A wavy double bond is drawn crossed: its configuration is
// open.
const (
	StyleSingle Style = iota
	StyleDouble
	StyleTriple
	StyleAromatic
	StyleWedge
	StyleHash
	StyleWavy
)

var styleNames = [...]string{"single", "double", "triple", "aromatic", "wedge", "hash", "wavy"}

func (s Style) String() string {
	if int(s) < len(styleNames) {
		return styleNames[s]
	}
	return "single"
}

// Mark is the highlight an atom or bond carries for a diagnostic.
type Mark uint8

// Highlights, weakest first.
const (
	MarkNone Mark = iota
	MarkWarning
	MarkError
	// MarkChange is set by callers, never by Draw: the atoms and bonds
	// of a unit a change of the record touched (the review page of
	// 'stereoline diff'), in a colour of their own.
	MarkChange
)

// HSide is where an atom label writes its hydrogens.
type HSide uint8

// Hydrogen placements.
const (
	HRight HSide = iota
	HLeft
	HAbove
	HBelow
)

// Point is a position in bond lengths, y up.
type Point struct{ X, Y float64 }

// Atom is one drawn atom.
type Atom struct {
	// N is the 1-based number of the atom in the record, as describe
	// prints it. Hydrogens the drawing adds to carry a wedge are numbered
	// after the record's last atom and have Added set.
	N       int
	Added   bool
	Element int
	Symbol  string
	P       Point
	// Label is the text drawn at the atom ("" for a plain carbon of the
	// skeleton): the symbol, its hydrogens and charge, e.g. "NH2", "O-".
	Label     string
	Hydrogens int
	Charge    int
	Isotope   int
	HSide     HSide
	// Condensed marks a label that stands for a group (a Fischer
	// projection's "CH2OH"): drawn as written, digits as subscripts.
	Condensed bool
	Mark      Mark
	Role      notation.Role
}

// Bond is one drawn bond between Atoms[A] and Atoms[B].
type Bond struct {
	A, B  int
	Order int // 1, 2, 3 (Kekulé order; aromatic bonds keep theirs)
	Style Style
	// Narrow is the index of the narrow end of a wedge, hash or wavy
	// bond (A or B), -1 otherwise.
	Narrow int
	// Side places the second line of a double bond: +1 left of A→B, -1
	// right, 0 centred.
	Side int
	Ring bool
	Mark Mark
}

// Descriptor is a CIP label drawn beside its unit.
type Descriptor struct {
	Text string
	P    Point
	Unit stereo.Kind
}

// Note is a line of text under the drawing: a diagnostic or a remark of
// the layout.
type Note struct {
	Text string
	Mark Mark
}

// Arrow is the reaction arrow from From to To, with the agents drawn over
// it.
type Arrow struct{ From, To Point }

// Plus is a '+' between the components of one side of a reaction.
type Plus struct{ P Point }

// Drawing is a structure diagram.
type Drawing struct {
	Title       string
	Notation    string
	Atoms       []Atom
	Bonds       []Bond
	Descriptors []Descriptor
	Arrows      []Arrow
	Pluses      []Plus
	Notes       []Note
	// Numbers asks the renderers to print atom numbers.
	Numbers bool
	// Simplified is set when the record was too large for the full
	// layout and the drawing uses the fallback layout.
	Simplified bool
}

// Options tune Draw; the zero value is the default.
type Options struct {
	Title   string
	Numbers bool
	// Analysis is the stereo analysis of the molecule; nil means Draw
	// computes it.
	Analysis *stereo.Analysis
	// Diagnostics are further findings to highlight (reaction checks, a
	// host file's escapes); the reader's errors and the analysis's
	// diagnostics are always highlighted.
	Diagnostics notation.ErrorList
	// Budget bounds the time the layout spends tidying; 0 means the
	// default (200 ms). The full layout is skipped for records above
	// MaxAtoms atoms.
	Budget time.Duration
}

// MaxAtoms is the largest record that gets the full layout and a stereo
// analysis; larger ones get the fallback layout (fallback.go).
const MaxAtoms = 1000

// Draw lays out m and returns its drawing. It never panics: an internal
// error gives the fallback drawing with a note.
func Draw(m *notation.Molecule, opt Options) (d *Drawing) {
	if m == nil {
		m = &notation.Molecule{}
	}
	defer func() {
		if r := recover(); r != nil {
			d = fallbackDrawing(m, opt, fmt.Sprintf("internal error in the layout (%v); simplified layout, stereo not drawn", r))
		}
	}()
	return drawUnguarded(m, opt)
}

// drawUnguarded is Draw without the recovery, for the fuzz target.
func drawUnguarded(m *notation.Molecule, opt Options) (d *Drawing) {
	if len(m.Atoms) > MaxAtoms {
		return fallbackDrawing(m, opt, fmt.Sprintf("simplified layout: %d atoms, more than the %d the full layout draws; stereo is not drawn", len(m.Atoms), MaxAtoms))
	}
	if len(m.Atoms) == 0 {
		d = &Drawing{Title: opt.Title, Notation: m.Text, Numbers: opt.Numbers}
		highlight(d, m, nil, opt.Diagnostics)
		d.Notes = append([]Note{{Text: "nothing to draw: no atom was read", Mark: MarkError}}, d.Notes...)
		return d
	}
	an := opt.Analysis
	if an == nil {
		an = stereo.Analyze(m)
	}
	budget := opt.Budget
	if budget <= 0 {
		budget = 200 * time.Millisecond
	}
	l := newLayout(m, an, time.Now().Add(budget))
	l.run()
	d = l.drawing(opt)
	highlight(d, m, an, opt.Diagnostics)
	return d
}

// highlight marks the atoms and bonds each diagnostic's span covers and
// adds a note per diagnostic.
func highlight(d *Drawing, m *notation.Molecule, an *stereo.Analysis, extra notation.ErrorList) {
	var all notation.ErrorList
	all = append(all, m.Errors...)
	if an != nil {
		all = append(all, an.Diagnostics...)
	}
	all = append(all, extra...)
	all.Sort()
	for _, e := range all {
		mk := MarkWarning
		switch e.Severity {
		case notation.SeverityError:
			mk = MarkError
		case notation.SeverityWarning:
		default:
			continue // information and hints are not drawn
		}
		hit := false
		for i := range d.Atoms {
			a := &d.Atoms[i]
			if a.Added || a.N < 1 || a.N > len(m.Atoms) {
				continue
			}
			if overlaps(m.Atoms[a.N-1].Span, e.Span) {
				a.Mark = max(a.Mark, mk)
				hit = true
			}
		}
		for i := range d.Bonds {
			b := &d.Bonds[i]
			x, y := d.Atoms[b.A], d.Atoms[b.B]
			if x.Added || y.Added {
				continue
			}
			bi := m.BondBetween(x.N-1, y.N-1)
			if bi < 0 {
				continue
			}
			mb := &m.Bonds[bi]
			if overlaps(mb.Span, e.Span) || (mb.Ring && overlaps(mb.CloseSpan, e.Span)) {
				b.Mark = max(b.Mark, mk)
				hit = true
			}
		}
		if !hit {
			// the span lies between atoms or after the last: mark the
			// atom written just before it
			best := -1
			for i := range m.Atoms {
				if m.Atoms[i].Span.Start <= e.Span.Start {
					best = i
				}
			}
			if best < 0 && len(m.Atoms) > 0 {
				best = 0
			}
			for i := range d.Atoms {
				if !d.Atoms[i].Added && d.Atoms[i].N == best+1 {
					d.Atoms[i].Mark = max(d.Atoms[i].Mark, mk)
				}
			}
		}
		where := ""
		if e.Span.Len() > 0 && e.Span.End <= len(m.Text) {
			where = fmt.Sprintf(" at %q", m.Text[e.Span.Start:e.Span.End])
		} else {
			where = fmt.Sprintf(" at byte %d", e.Span.Start)
		}
		d.Notes = append(d.Notes, Note{Text: fmt.Sprintf("%s: %s [%s]%s", e.Severity, e.Msg, e.Code, where), Mark: mk})
	}
}

// overlaps reports whether two half-open spans share a byte, counting an
// empty span as the byte it stands before.
func overlaps(a, b notation.Span) bool {
	bs, be := b.Start, b.End
	if be <= bs {
		be = bs + 1
	}
	as, ae := a.Start, a.End
	if ae <= as {
		ae = as + 1
	}
	return as < be && bs < ae
}

// Caution is the line every rendered drawing carries.
const Caution = "Labels are computed from the notation as written; critical assignments need analytical confirmation."

// This file implements Analyze, the entry point of perception and
// labelling, and the reading of chirality marks.

package stereo

import (
	"slices"
	"time"

	"stereoline/notation"
)

// Unit is one stereogenic unit of a molecule, marked or not.
type Unit struct {
	Kind Kind
	// Atoms are 0-based: the centre for tetrahedral and higher classes;
	// the two atoms of a double bond or the two terminal atoms of a
	// cumulene; the two terminal atoms of an allene.
	Atoms []int
	// Centre is the marked atom for tetrahedral, allene and higher
	// classes, -1 otherwise. Bond is the (middle) double bond of a
	// cis/trans unit, -1 otherwise.
	Centre, Bond int
	// Specified is true when the marks fix the configuration.
	Specified bool
	// Descriptor is the CIP label; DescNone when unspecified,
	// DescUndetermined when the labeller gave up.
	Descriptor Descriptor
	// Permutation is the number of a square-planar, trigonal-bipyramidal
	// or octahedral mark (@SP1 is 1); 0 for other kinds.
	Permutation int
	// Ranked lists the ligands by CIP priority; Decisions say which rule
	// at which sphere told each neighbouring pair apart.
	Ranked    []RankedLigand
	Decisions []Decision
	// Marks are the spans of the marks that specify the unit.
	Marks []notation.Span

	// Group is the index in Analysis.Groups of the stereo group of the
	// extension block that holds the unit, -1 when none does. GroupKind
	// says how the configuration of a specified chiral unit (a
	// tetrahedral centre or an allene) is known: GroupAbsolute in no
	// group or in an absolute one, as the libraries read it, GroupOr
	// (relative) or GroupAnd (racemic); it is 0 for other units.
	// Relative is the descriptor in the frame of the unit's or or and
	// group (groups.go); Descriptor elsewhere.
	Group     int
	GroupKind notation.GroupKind
	Relative  Descriptor
}

// Analysis is the result of Analyze. It is a value of its own: nothing in
// the molecule is changed.
type Analysis struct {
	Units []Unit
	// Groups are the stereo groups of the extension block as the engine
	// reads them (groups.go).
	Groups      []Group
	Diagnostics notation.ErrorList
}

// Options tune Analyze; the zero value is the default.
type Options struct {
	// NodeCap bounds the nodes of each digraph; 0 means DefaultNodeCap.
	NodeCap int
	// Budget is the time the call may take; 0 or less means no limit
	// (the engine passes its limits setting, DefaultBudget by default).
	// A record that needs more comes back with the units left unlabelled
	// reported under CodeBudget.
	Budget time.Duration
	// Start is when the budget started (StartBudget), when the caller
	// spent some of it before the call (reading the record); unset means
	// the call's start.
	Start Instant
	// shared, when set, replaces Budget: the analyses a call runs
	// inside itself (portable.go, groups.go) share their caller's budget.
	shared *budget
	// noOpenMarks leaves out the report of marks read differently by
	// other readers: set for the second analysis that report runs
	noOpenMarks bool

	// skipGroups leaves the stereo groups unread: the labels of a group
	// inverted are computed by analysing the inverted record so.
	skipGroups bool

	// FindingsOnly leaves out what only explains the findings: the
	// ligands of the unmarked stereogenic units are not ranked (their
	// Unit.Ranked and Decisions stay nil), unless the record has stereo
	// groups, whose reading looks at every ranking. The findings are the
	// same; a record near its time budget may spend less of it.
	FindingsOnly bool
}

// Analyze finds the stereogenic units of m, labels them and reports the
// marks that mean nothing or cannot be true.
func Analyze(m *notation.Molecule) *Analysis { return AnalyzeWith(m, Options{}) }

// AnalyzeWith is Analyze with options.
func AnalyzeWith(m *notation.Molecule, opt Options) (res *Analysis) {
	res = &Analysis{}
	if m == nil || len(m.Atoms) == 0 {
		return res
	}
	ws := takeWorkspace()
	ws.g.build(m)
	ws.cfg.reset()
	b, owned := newBudget(opt)
	if owned {
		defer b.release()
	}
	l := &labeller{g: &ws.g, cfg: &ws.cfg, nodeCap: opt.NodeCap, res: res, spare: ws.spare, budget: b}
	l.classes = &lazyClasses{g: l.g}
	l.unranked = opt.FindingsOnly && (m.Extension == nil || len(m.Extension.Groups) == 0)
	if ws.classed.Same(m) {
		l.classes.class, l.classes.shared = ws.g.store.class[:ws.g.n], true
		sharedClasses.Add(1)
	} else {
		ws.classed.Forget() // the storage is about to hold other classes
	}
	defer func() {
		// an internal error must not reach the user; the analysis so far
		// is kept and the failure reported at the start of the text. The
		// workspace of a failed call is left to the collector: its state
		// is not known.
		if r := recover(); r != nil {
			res.Diagnostics.Add(notation.Span{}, CodeUndetermined, "internal error in stereo analysis: %v", r)
			return
		}
		ws.giveBack(l)
	}()
	if l.nodeCap <= 0 {
		l.nodeCap = defaultNodeCap
	}
	opt.shared = l.budget
	l.readCentres()
	l.checkBridgeheads()
	l.readBonds()
	l.checkCages()
	l.labelAll()
	if !l.budget.check() {
		l.perceiveUnmarked()
	}
	l.reportStrayBondMarks()
	l.reportBudget()
	if !opt.noOpenMarks {
		reportOpenMarks(m, res, opt)
	}
	slices.SortStableFunc(res.Units, func(a, b Unit) int { return unitKey(&a) - unitKey(&b) })
	l.readGroups(opt.skipGroups)
	res.Diagnostics.Sort()
	return res
}

func unitKey(u *Unit) int {
	k := 1 << 30
	for _, a := range u.Atoms {
		k = min(k, a)
	}
	return k
}

// labeller holds the state of one Analyze call. AnalyzeWith runs its
// phases in order: reading the marks (readCentres, readBonds), checking
// them against the geometry (checkBridgeheads, checkCages), labelling the marked units (labelAll), perceiving the
// unmarked ones (perceiveUnmarked) and reporting stray marks. The fields
// are grouped by the phase that sets them.
type labeller struct {
	// Set up by AnalyzeWith; read by every phase.
	g   *graph    // the molecule's view, storage from the workspace
	res *Analysis // the result being built: units and diagnostics
	// cfg holds the configurations read from the marks; the checks
	// drop the ones they report as impossible or meaningless
	cfg *configs
	// nodeCap bounds each digraph made now: the caller's cap, lowered
	// to explainCap while withExplainCap ranks an unmarked unit
	nodeCap int
	spare   []*digraph // storage of digraphs already used, for reuse (digraph_reuse.go)
	budget  *budget    // the call's time budget (budget.go)
	// unranked leaves the unmarked units' ligands unranked
	// (Options.FindingsOnly)
	unranked bool
	// overBudget are the marked units left undetermined because the
	// budget was spent, in the order met; reportBudget reports them
	overBudget []notation.Span
	classes    *lazyClasses // constitutional symmetry classes, computed on first use (perceive.go)

	// Set while reading the marks (readCentres, readBonds).
	anyMarks      bool          // some atom or bond is marked: unmarked units are then information, not hints
	usedBondMarks []bool        // by bond: single bonds whose marks sit next to some double bond
	oneSided      []*bondConfig // double bonds marked at one end only
	// unitAtoms and unitBonds say, by atom and by bond, what is already
	// reported as a unit or a diagnostic; every later phase adds to them
	// and perception skips what they hold
	unitAtoms []bool
	unitBonds []bool

	// Found on first use by the checks and perception (bridgehead.go).
	bicycleList   []bicycle // small bicycles
	bicyclesFound bool

	// Set while labelling the marked units (labelAll, units.go).
	effective  markUse  // by bond: marks that configure a labelled double bond
	quietMarks markUse  // by bond: marks warnQuietBond reported already
	halfMarked []member // marked units that may be stereogenic together (together.go)

	// Set while perceiving the unmarked units (perceive.go, together.go).
	blocks   []int // by bond: ring system, found on first use
	unjoined []int // ring-paired atoms that found no partner
}

func (l *labeller) warn(sp notation.Span, code notation.Code, format string, args ...any) *notation.Error {
	e := l.res.Diagnostics.Add(sp, code, format, args...)
	e.Severity = notation.SeverityWarning
	return e
}

func (l *labeller) fail(sp notation.Span, code notation.Code, format string, args ...any) *notation.Error {
	return l.res.Diagnostics.Add(sp, code, format, args...)
}

// readCentres reads every chirality mark.
func (l *labeller) readCentres() {
	g, m := l.g, l.g.mol
	l.unitAtoms = sized(&g.store.unitAtoms, len(m.Atoms))
	for a := range m.Atoms {
		at := &m.Atoms[a]
		ch := at.Chirality
		if ch.Class == notation.ChiralNone {
			continue
		}
		l.anyMarks = true
		sp := ch.Span
		if ch.Span.Len() == 0 {
			sp = at.Span
		}
		count := len(at.Bonds) + at.HydrogenCount()
		switch ch.Class {
		case notation.ChiralTH, notation.ChiralAL:
			if _, _, ok := g.alleneEnds(a); ok && (ch.Short || ch.Class == notation.ChiralAL) {
				if c := g.readAllene(a, ch); c != nil && len(c.ligands) == 4 {
					l.cfg.allene[a] = c
				} else {
					l.fail(sp, CodeImpossibleCenter, "extended tetrahedral mark needs two substituents or hydrogens at each end")
				}
				continue
			}
			if ch.Class == notation.ChiralAL {
				l.fail(sp, CodeImpossibleCenter, "allene mark on an atom that is not the centre of an allene")
				continue
			}
			if count < 3 || count > 4 || at.HydrogenCount() > 1 {
				l.fail(sp, CodeImpossibleCenter, "tetrahedral mark needs 3 or 4 neighbours, found %d", count)
				continue
			}
			if at.Aromatic {
				l.fail(sp, CodeImpossibleCenter, "tetrahedral mark on an aromatic atom, which is planar")
				continue
			}
			if (at.Number == notation.ElemC || at.Number == notation.ElemN || at.Number == notation.ElemB) && g.doubleBonds(a) > 0 {
				l.fail(sp, CodeImpossibleCenter, "tetrahedral mark on a double-bonded atom, which is planar")
				continue
			}
			if count == 3 && !hasLonePair(at, g.valence(a)) {
				l.fail(sp, CodeImpossibleCenter, "tetrahedral mark on a three-coordinate atom without a lone pair")
				continue
			}
			ligs := stereoLigands(m, a)
			if count == 3 {
				// the lone pair stands where the molecule's reading puts
				// it (notation.Reading; OpenSMILES 3.8.2 places only a
				// hydrogen)
				ligs = slices.Insert(ligs, m.LonePairSlot(a), ImplicitNeighbour)
			}
			l.cfg.addTetra(&tetraConfig{centre: a, ligands: ligs, hand: markHand(ch),
				lonePair: count == 3, span: sp})
		case notation.ChiralSP, notation.ChiralTB, notation.ChiralOH:
			kind, need := KindSquarePlanar, 4
			if ch.Class == notation.ChiralTB {
				kind, need = KindTrigonalBipyramidal, 5
			} else if ch.Class == notation.ChiralOH {
				kind, need = KindOctahedral, 6
			}
			if count != need {
				l.fail(sp, CodeImpossibleCenter, "@%s mark needs %d neighbours, found %d", ch.Class, need, count)
				continue
			}
			l.cfg.higher[a] = &higherConfig{centre: a, kind: kind, number: ch.Num, ligands: stereoLigands(m, a), span: sp}
		}
	}
}

// hasLonePair reports whether a three-coordinate atom keeps a lone pair
// that can act as its fourth ligand (amines, phosphines, sulfoxides,
// sulfonium ions), judged from its group and charge.
func hasLonePair(at *notation.Atom, valence int) bool {
	switch at.Number {
	case notation.ElemN, notation.ElemP, notation.ElemAs:
		return at.Charge == 0 && valence <= 5
	case notation.ElemS, notation.ElemSe, notation.ElemTe:
		return (at.Charge == 0 && valence == 4) || (at.Charge == 1 && valence == 3) || (at.Charge == 0 && valence == 2)
	case notation.ElemC, notation.ElemSi, notation.ElemGe:
		return at.Charge == -1
	case notation.ElemO:
		return at.Charge == 1
	}
	return false
}

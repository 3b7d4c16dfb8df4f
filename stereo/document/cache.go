package document

import (
	"fmt"
	"sync"
	"sync/atomic"

	"stereoline/notation"
	"stereoline/notation/genmap"
	"stereoline/stereo"
	"stereoline/stereo/identity"
	"stereoline/stereo/reaction"
)

// cacheLimit bounds the entries of one cache generation. When a
// generation fills, the older one is dropped, so memory stays bounded
// while the records of the file being edited stay warm.
const cacheLimit = 250_000

// fullLimit bounds the analyses whose molecule and stereo analysis the
// cache keeps (the full analyses of the records requests asked about
// last, and of the records read last). A molecule and its analysis weigh
// some kilobytes, a list holds 100,000 records, and after the findings
// are made only a request about one record needs them again.
const fullLimit = 512

// analysis is what the engine knows of one notation text, independent of
// where it was found: the compact facts every record keeps (the pre-key,
// the identity keys once computed, the findings about groups), and the
// full analysis (molecule, stereo analysis, reaction), kept only while it
// is among the last used (fullLimit) and read again on demand.
type analysis struct {
	key cacheKey
	// full is the molecule with its analyses, or nil when dropped;
	// fulls, when not nil, is the list of kept full analyses it is on.
	// A pinned analysis keeps its full analysis: one over its time
	// budget, whose analysis read again could come out otherwise.
	full   atomic.Pointer[fullAnalysis]
	fulls  *fullList
	pinned bool
	mu     sync.Mutex // serialises reading the full analysis again

	// groupFindings are the or and and groups that add nothing
	// (identity.GroupFindings), for records with stereo groups.
	groupFindings notation.ErrorList

	// identifiable is true for a structure that has identity keys (not a
	// reaction, read without error, not empty). The keys are the
	// costliest part of an analysis and most records of a list never
	// need them (identity.ConstitutionPreKey), so they are computed on first use.
	identifiable bool
	preKey       uint64
	identityOnce sync.Once
	identity     *identity.Identity
	// elements are the atomic numbers of the molecule's atoms, set with
	// the identity keys: all that naming the units two stereoisomers
	// differ in takes (atomName), so relating a list reads no molecule
	// twice for its messages.
	elements []byte
	// notes are the record's findings as the full analysis gives them,
	// with their quick fixes (recordNotes), kept once the text is read a
	// second time, so that a document read whole again after an edit
	// maps them to its host without reading and labelling the record
	// again; nil until then (a first reading keeps none: they would cost
	// the opening of a long list memory and time for nothing).
	notes atomic.Pointer[recordNotes]
	// countOnce guards count, the stereoisomers of the constitution,
	// which hovers show and which can take long for a symmetric
	// structure: it is counted once per text.
	countOnce sync.Once
	count     identity.StereoisomerCount
}

// recordNotes are the findings of one record's text in its own offsets:
// the reader's, the stereo engine's and the reaction checker's, and the
// quick fixes of those that have one, the edits of the notation. They are
// what Result.recordFindings takes from a full analysis, so either gives
// the same findings.
type recordNotes struct {
	reader   []*notation.Error
	stereo   []*notation.Error
	reaction []*notation.Error
	// fixes[k] is the fix of stereo[k], then fixes[len(stereo)+k] that of
	// the analysis's groupFindings[k]; nil when made without fixes
	fixes []noteFix
}

// noteFix is a quick fix in the notation's offsets; no edits: none.
type noteFix struct {
	title string
	edits []notation.Edit
}

// readNotes is cache.read for a document read whole: a record whose
// notes are kept (with fixes) comes back without its full analysis (f is
// nil), unless that is kept anyway. again says the text was in the
// cache: it is being read again, and its notes are worth keeping.
func (c *cache) readNotes(text string, r notation.Reading, lim limits, rr *notation.Rereader) (a *analysis, f *fullAnalysis, again bool) {
	if a, ok := c.lookup(cacheKey{text, r, lim}); ok {
		if n := a.notes.Load(); n != nil && n.fixes != nil && a.full.Load() == nil {
			return a, nil, true
		}
		again = true
	}
	a, f = c.read(text, r, lim, rr)
	return a, f, again
}

// fullAnalysis is the part of an analysis that is dropped and read again.
type fullAnalysis struct {
	mol      *notation.Molecule
	stereo   *stereo.Analysis
	reaction *reaction.Result // nil unless the record is a reaction
}

// stereoisomersOf returns identity.Stereoisomers of m, counted once per
// analysis, m being the analysis's molecule (a nil analysis counts every
// time).
func (a *analysis) stereoisomersOf(m *notation.Molecule) identity.StereoisomerCount {
	if a == nil {
		return identity.Stereoisomers(m)
	}
	a.countOnce.Do(func() { a.count = identity.Stereoisomers(m) })
	return a.count
}

// analyse runs the engine on one notation text, read under reading r,
// within the limits lim: the time budget counts the reading too. The
// analysis keeps its full analysis (it is on no list of kept ones).
func analyse(text string, r notation.Reading, lim limits) *analysis {
	return analyseInto(nil, text, r, lim, false)
}

// analyseInto is analyse reading the text into rr's storage when rr is
// not nil (stream.go): the analysis keeps its full analysis, whose
// molecule is then valid only until rr's next read. With findingsOnly
// that analysis holds the findings only (computeInto).
func analyseInto(rr *notation.Rereader, text string, r notation.Reading, lim limits, findingsOnly bool) *analysis {
	a, f := analyseUnkept(rr, text, r, lim, findingsOnly)
	a.full.Store(f)
	return a
}

// analyseUnkept is analyse that, with a Rereader, reads the molecule into
// its storage and does not keep the full analysis: the one returned is
// valid only until rr reads again. A pinned analysis keeps its full
// analysis all the same, and rr gives its storage up to it.
func analyseUnkept(rr *notation.Rereader, text string, r notation.Reading, lim limits, findingsOnly bool) (*analysis, *fullAnalysis) {
	a := &analysis{key: cacheKey{text, r, lim}}
	f := a.computeInto(rr, findingsOnly)
	if m := f.mol; !m.Reaction && !m.Errors.HasErrors() && len(m.Atoms) > 0 {
		a.identifiable = true
		id := identifiers.Get().(*identity.Identifier)
		a.preKey = id.PreKey(m)
		identifiers.Put(id)
		if len(f.stereo.Groups) > 0 {
			a.groupFindings = identity.GroupFindings(m)
		}
	}
	for _, e := range f.stereo.Diagnostics {
		if e.Code == stereo.CodeBudget {
			a.pinned = true
		}
	}
	if rr != nil && a.pinned {
		*rr = notation.Rereader{} // the molecule is the analysis's now
		a.full.Store(f)
	}
	return a, f
}

// compute reads and labels the analysis's text.
func (a *analysis) compute() *fullAnalysis { return a.computeInto(nil, false) }

// computeInto is compute reading the molecule into rr's storage, when rr
// is not nil. With findingsOnly the stereo analysis leaves out what only
// explains (stereo.Options.FindingsOnly): for a full analysis read for
// its findings and identity keys and then dropped, which a request that
// needs more computes again.
func (a *analysis) computeInto(rr *notation.Rereader, findingsOnly bool) *fullAnalysis {
	lim := a.key.limits
	if n := notation.CountAtoms(a.key.text); n > lim.atoms {
		return oversized(a.key.text, n, lim.atoms)
	}
	start := stereo.StartBudget()
	var m *notation.Molecule
	if rr != nil {
		m = rr.ReadWith(a.key.text, a.key.reading)
	} else {
		m = notation.ReadWith(a.key.text, a.key.reading)
	}
	opt := stereo.Options{NodeCap: lim.nodeCap, Budget: lim.budget, Start: start, FindingsOnly: findingsOnly}
	f := &fullAnalysis{mol: m, stereo: stereo.AnalyzeWith(m, opt)}
	if m.Reaction {
		f.reaction = reaction.AnalyzeWith(m, f.stereo)
	}
	return f
}

// rereaders keep the storage of molecules read only for as long as one
// record is worked on (the first reading of a list, identity keys), one
// Rereader per goroutine at a time.
var rereaders = sync.Pool{New: func() any { return new(notation.Rereader) }}

// readerPair is two Rereaders that one goroutine at a time reads the
// records of a list into in turn, so that the molecule of the record
// read before stays valid while the next is read: the first record of a
// pre-key needs its identity keys only when a second comes, which in a
// list of stereoisomers is mostly the next record, and is then not read
// again (AnalyzeRecords). prevMol is the molecule read before, in prev
// or kept by its analysis; nil when none.
type readerPair struct {
	cur, prev notation.Rereader
	prevMol   *notation.Molecule
}

var readerPairs = sync.Pool{New: func() any { return new(readerPair) }}

// identifiers compute identity keys; one taken on a goroutine mostly
// comes back to it, so the stereoisomers of a list, which follow one
// another, share the work on their constitution (identity.Identifier).
var identifiers = sync.Pool{New: func() any { return new(identity.Identifier) }}

// oversized is the analysis of a record with more atoms than the
// recordAtoms limit: it is not read, and its one finding says why. The
// molecule holds the text only, so requests on the record (hover, a
// drawing) find no atoms and say nothing about them. Its finding is a
// budget finding, so the analysis is pinned (never dropped).
func oversized(text string, atoms, limit int) *fullAnalysis {
	end := min(len(text), 1)
	st := &stereo.Analysis{}
	e := st.Diagnostics.Add(notation.Span{Start: 0, End: end}, stereo.CodeBudget,
		"the record has %d atoms, more than the %d one record may have (limits.recordAtoms): it was not read or analysed", atoms, limit)
	e.Severity = notation.SeverityWarning
	return &fullAnalysis{mol: &notation.Molecule{Text: text}, stereo: st}
}

// get returns the full analysis: the one kept, or the text read and
// labelled again (and kept among the last used).
func (a *analysis) get() *fullAnalysis {
	if f := a.full.Load(); f != nil {
		if a.fulls != nil && !a.pinned {
			a.fulls.touch(a)
		}
		return f
	}
	a.mu.Lock()
	defer a.mu.Unlock()
	if f := a.full.Load(); f != nil {
		return f
	}
	f := a.compute()
	a.full.Store(f)
	if a.fulls != nil {
		a.fulls.add(a)
	}
	return f
}

// molecule returns the molecule: the one kept, or the text read again
// (not kept) when the full analysis was dropped. Reading alone is cheap
// next to labelling; the relations of a list read thousands of records
// this way.
func (a *analysis) molecule() *notation.Molecule {
	if f := a.full.Load(); f != nil {
		return f.mol
	}
	return notation.ReadWith(a.key.text, a.key.reading)
}

// identify returns the identity keys, computing them once; nil when the
// record has none. The molecule is the one kept, or read again for the
// keys alone.
func (a *analysis) identify() *identity.Identity {
	if !a.identifiable {
		return nil
	}
	a.identityOnce.Do(func() {
		if f := a.full.Load(); f != nil {
			a.setIdentity(f.mol)
			return
		}
		rr := rereaders.Get().(*notation.Rereader)
		a.setIdentity(rr.ReadWith(a.key.text, a.key.reading))
		rereaders.Put(rr)
	})
	return a.identity
}

// identifyWith computes the identity keys from m, the analysis's
// molecule, unless they are known.
func (a *analysis) identifyWith(m *notation.Molecule) {
	if a.identifiable {
		a.identityOnce.Do(func() { a.setIdentity(m) })
	}
}

// setIdentity sets the identity keys and the atoms' elements from m.
func (a *analysis) setIdentity(m *notation.Molecule) {
	id := identifiers.Get().(*identity.Identifier)
	x := id.Identify(m)
	identifiers.Put(id)
	a.elements = make([]byte, len(m.Atoms))
	for i := range m.Atoms {
		if z := m.Atoms[i].Number; z >= 0 && z < 0xff {
			a.elements[i] = byte(z)
		} else {
			a.elements[i] = 0xff // no element: no symbol, as in AtomName
		}
	}
	a.identity = &x
}

// atomName is AtomName of atom i of the analysis's molecule, which it
// reads from the elements kept with the identity keys.
func (a *analysis) atomName(i int) string {
	if i < 0 {
		return "H"
	}
	if i >= len(a.elements) {
		return AtomName(a.molecule(), i)
	}
	return notation.ElementSymbol(int(a.elements[i])) + fmt.Sprint(i+1)
}

// fullList keeps the full analyses of the last fullLimit analyses used,
// dropping the full analysis of the one used longest ago.
type fullList struct {
	mu    sync.Mutex
	limit int
	// a ring of the analyses whose full analysis is kept, in the order
	// they were last used (second-chance: a touched entry is skipped
	// once when dropping).
	ring []*analysis
	used map[*analysis]bool
	hand int
}

func newFullList(limit int) *fullList {
	return &fullList{limit: limit, used: map[*analysis]bool{}}
}

// add puts an analysis whose full analysis was just set on the list,
// dropping the full analysis of another when the list is full.
func (l *fullList) add(a *analysis) {
	if a.pinned {
		return
	}
	l.mu.Lock()
	defer l.mu.Unlock()
	if _, ok := l.used[a]; ok {
		l.used[a] = true
		return
	}
	if len(l.ring) < l.limit {
		l.ring = append(l.ring, a)
		l.used[a] = false
		return
	}
	for {
		v := l.ring[l.hand]
		if l.used[v] {
			l.used[v] = false
			l.hand = (l.hand + 1) % len(l.ring)
			continue
		}
		delete(l.used, v)
		v.full.Store(nil)
		l.ring[l.hand] = a
		l.used[a] = false
		l.hand = (l.hand + 1) % len(l.ring)
		return
	}
}

// touch marks an analysis on the list as used.
func (l *fullList) touch(a *analysis) {
	l.mu.Lock()
	if _, ok := l.used[a]; ok {
		l.used[a] = true
	}
	l.mu.Unlock()
}

// kept returns how many full analyses the list keeps.
func (l *fullList) kept() int {
	l.mu.Lock()
	defer l.mu.Unlock()
	return len(l.ring)
}

// cache holds analyses keyed by notation text and reading. Repeated
// records and an edit of one line of a large list re-analyse only what
// changed.
type cache struct {
	mu       sync.Mutex
	analyses *genmap.Map[cacheKey, *analysis] // cacheLimit in a generation
	fulls    *fullList
}

// cacheKey is what an analysis depends on: the text, the reading of
// the marks OpenSMILES leaves open and the limits.
type cacheKey struct {
	text    string
	reading notation.Reading
	limits  limits
}

func newCache() *cache {
	return &cache{analyses: genmap.New[cacheKey, *analysis](cacheLimit, 0, nil), fulls: newFullList(fullLimit)}
}

// lookup returns the cached analysis of k, moving it from the older
// generation to the current one.
func (c *cache) lookup(k cacheKey) (*analysis, bool) {
	c.mu.Lock()
	defer c.mu.Unlock()
	return c.analyses.Get(k)
}

// get returns the analysis of text under reading r with its full
// analysis, computing it outside the lock.
func (c *cache) get(text string, r notation.Reading, lim limits) (*analysis, *fullAnalysis) {
	k := cacheKey{text, r, lim}
	a, ok := c.lookup(k)
	if ok {
		return a, a.get()
	}
	a = analyse(text, r, lim)
	f := a.full.Load()
	c.mu.Lock()
	if prev, ok := c.analyses.Get(k); ok {
		// Another goroutine read the same text meanwhile: keep one.
		c.mu.Unlock()
		return prev, prev.get()
	}
	c.analyses.Put(k, a)
	a.fulls = c.fulls
	c.mu.Unlock()
	c.fulls.add(a)
	return a, f
}

// read is get for reading the records of a document one after another
// on each goroutine: a missing analysis is computed with its molecule
// read into rr's storage and its full analysis not kept (unless pinned),
// and an analysis whose full analysis was dropped is computed again the
// same way. The full analysis returned is valid only until rr reads
// again, and it holds the findings only (computeInto): the cache keeps
// the compact facts as get does. A pinned one is kept as it is; it ran
// out of time, so its explanations were cut short anyway.
func (c *cache) read(text string, r notation.Reading, lim limits, rr *notation.Rereader) (*analysis, *fullAnalysis) {
	k := cacheKey{text, r, lim}
	a, ok := c.lookup(k)
	if ok {
		if f := a.full.Load(); f != nil {
			if a.fulls != nil && !a.pinned {
				a.fulls.touch(a)
			}
			return a, f
		}
		return a, a.computeInto(rr, true)
	}
	a, f := analyseUnkept(rr, text, r, lim, true)
	c.mu.Lock()
	if prev, ok := c.analyses.Get(k); ok {
		// Another goroutine read the same text meanwhile: keep one.
		c.mu.Unlock()
		if pf := prev.full.Load(); pf != nil {
			return prev, pf
		}
		return prev, f
	}
	c.analyses.Put(k, a)
	a.fulls = c.fulls
	c.mu.Unlock()
	return a, f
}

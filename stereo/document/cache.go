package document

import (
	"sync"

	"stereoline/notation"
	"stereoline/stereo"
	"stereoline/stereo/identity"
	"stereoline/stereo/reaction"
)

// cacheLimit bounds the entries of one cache generation. When a
// generation fills, the older one is dropped, so memory stays bounded
// while the records of the file being edited stay warm.
const cacheLimit = 250_000

// analysis is what the engine knows of one notation text, independent of
// where it was found.
type analysis struct {
	mol      *notation.Molecule
	stereo   *stereo.Analysis
	reaction *reaction.Result // nil unless the record is a reaction
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
	// countOnce guards count, the stereoisomers of the constitution,
	// which hovers show and which can take long for a symmetric
	// structure: it is counted once per text.
	countOnce sync.Once
	count     identity.StereoisomerCount
}

// stereoisomersOf returns identity.Stereoisomers of m, counted once per
// analysis when m is the analysis's molecule (a nil analysis counts
// every time).
func (a *analysis) stereoisomersOf(m *notation.Molecule) identity.StereoisomerCount {
	if a == nil || a.mol != m {
		return identity.Stereoisomers(m)
	}
	a.countOnce.Do(func() { a.count = identity.Stereoisomers(a.mol) })
	return a.count
}

// analyse runs the engine on one notation text, read under reading r,
// within the limits lim: the time budget counts the reading too.
func analyse(text string, r notation.Reading, lim limits) *analysis {
	if n := notation.CountAtoms(text); n > lim.atoms {
		return oversized(text, n, lim.atoms)
	}
	start := stereo.StartBudget()
	m := notation.ReadWith(text, r)
	opt := stereo.Options{NodeCap: lim.nodeCap, Budget: lim.budget, Start: start}
	a := &analysis{mol: m, stereo: stereo.AnalyzeWith(m, opt)}
	switch {
	case m.Reaction:
		a.reaction = reaction.AnalyzeWith(m, a.stereo)
	case !m.Errors.HasErrors() && len(m.Atoms) > 0:
		a.identifiable = true
		a.preKey = identity.ConstitutionPreKey(m)
		if len(a.stereo.Groups) > 0 {
			a.groupFindings = identity.GroupFindings(m)
		}
	}
	return a
}

// oversized is the analysis of a record with more atoms than the
// recordAtoms limit: it is not read, and its one finding says why. The
// molecule holds the text only, so requests on the record (hover, a
// drawing) find no atoms and say nothing about them.
func oversized(text string, atoms, limit int) *analysis {
	end := min(len(text), 1)
	st := &stereo.Analysis{}
	e := st.Diagnostics.Add(notation.Span{Start: 0, End: end}, stereo.CodeBudget,
		"the record has %d atoms, more than the %d one record may have (limits.recordAtoms): it was not read or analysed", atoms, limit)
	e.Severity = notation.SeverityWarning
	return &analysis{mol: &notation.Molecule{Text: text}, stereo: st}
}

// identify returns the identity keys, computing them once; nil when the
// record has none.
func (a *analysis) identify() *identity.Identity {
	if !a.identifiable {
		return nil
	}
	a.identityOnce.Do(func() {
		id := identity.Identify(a.mol)
		a.identity = &id
	})
	return a.identity
}

// cache holds analyses keyed by notation text and reading. Repeated
// records and an edit of one line of a large list re-analyse only what
// changed.
type cache struct {
	mu       sync.Mutex
	cur, old map[cacheKey]*analysis
}

// cacheKey is what an analysis depends on: the text, the reading of
// the marks OpenSMILES leaves open and the limits.
type cacheKey struct {
	text    string
	reading notation.Reading
	limits  limits
}

func newCache() *cache {
	return &cache{cur: map[cacheKey]*analysis{}, old: map[cacheKey]*analysis{}}
}

// get returns the analysis of text under reading r, computing it
// outside the lock.
func (c *cache) get(text string, r notation.Reading, lim limits) *analysis {
	k := cacheKey{text, r, lim}
	c.mu.Lock()
	if a, ok := c.cur[k]; ok {
		c.mu.Unlock()
		return a
	}
	if a, ok := c.old[k]; ok {
		c.cur[k] = a
		c.mu.Unlock()
		return a
	}
	c.mu.Unlock()
	a := analyse(text, r, lim)
	c.mu.Lock()
	if len(c.cur) >= cacheLimit {
		c.old, c.cur = c.cur, map[cacheKey]*analysis{}
	}
	c.cur[k] = a
	c.mu.Unlock()
	return a
}

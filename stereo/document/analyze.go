package document

import (
	"errors"
	"path"
	"runtime"
	"slices"
	"sort"
	"sync"
	"sync/atomic"

	"stereoline/notation"
	"stereoline/notation/find"
	"stereoline/stereo"
	"stereoline/stereo/identity"
	"stereoline/stereo/reaction"
)

// Source is the value of Diagnostic.Source for every finding.
const Source = "stereoline"

// Analyzer analyses documents. It is safe for concurrent use: the
// configuration is read-only and the cache locks itself.
type Analyzer struct {
	cfg   Config
	cache *cache
	// noFixes leaves the quick fixes out of Stream's findings
	// (WithoutFixes).
	noFixes bool
}

// NewAnalyzer returns an analyzer for a configuration.
func NewAnalyzer(cfg Config) *Analyzer {
	return &Analyzer{cfg: cfg, cache: newCache()}
}

// WithoutFixes returns an analyzer, sharing this one's cache, whose
// Stream hands on the findings without their quick fixes (Fixes nil):
// for callers that show none, like the command line, since some cost a
// rewrite of the record (reader-dependent marks).
func (a *Analyzer) WithoutFixes() *Analyzer {
	b := *a
	b.noFixes = true
	return &b
}

// WithConfig returns an analyzer with another configuration that shares
// this one's cache (analyses depend only on the reading and limits
// settings, which key the cache; what is reported depends on the rest).
func (a *Analyzer) WithConfig(cfg Config) *Analyzer {
	return &Analyzer{cfg: cfg, cache: a.cache}
}

// Config returns the analyzer's configuration.
func (a *Analyzer) Config() Config { return a.cfg }

// Result is everything known about one document at one version.
type Result struct {
	Name    string
	Content []byte
	Kind    find.Kind
	Records []Record
	// Queries are the query patterns (SMARTS) of the document, read by
	// their own reader and never checked as notation (query.go).
	Queries []Query
	// diags are the findings, sorted by host position, unless they are
	// kept in parts (Diagnostics, DiagnosticParts).
	diags []Diagnostic
	// parts, when not nil, are the findings of a list in parts of
	// partRecords records each (the last may hold fewer), which versions
	// share where an edit left their records alone; joined makes diags
	// of them when someone asks for all findings in one slice.
	parts  [][]Diagnostic
	joined *joinedParts

	cfg   *Config
	lines []int // line starts, built on first use
	// lineStride, when above 1, makes lines hold the start of every
	// lineStride-th line only (a streamed result: the table of every
	// line of a long list would be most of what a check holds)
	lineStride int
	// linesScanned and linesCounted say how far lines was built (the
	// offset, and the line breaks before it) when lineStride is above 1
	linesScanned, linesCounted int
	related                    bool // Relate has run
	noFixes                    bool // recordFindings leaves the quick fixes out (Analyzer.WithoutFixes)

	// own are each record's own findings, sorted by position; rel the
	// relation of each record of a list to an earlier one (set by
	// Relate). Reanalyze reuses both for the records an edit left alone.
	own [][]Diagnostic
	rel []*relation
	// ownAt, when not nil, is where each record started when its own
	// findings were made: Reanalyze moves records without moving their
	// findings, assemble does (nil: where the record is).
	ownAt []int
	// prekeys, when not nil, are the records' pre-keys (Reanalyze).
	prekeys []prekey
	// occArrays counts the arrays the records' occurrences lie in
	// (Reanalyze).
	occArrays int
	// jsonArray is where the elements of a JSON document's array of
	// records lie (the document, or one member of it), once an edit was
	// read apart (Reanalyze)
	jsonArray *find.JSONArray
	// foundWhole: Reanalyze found this version's records whole, its
	// edit could not be read apart (rereadWhole); reread is how many
	// records it read again
	foundWhole bool
	reread     int
}

// Record is one notation occurrence with its analysis. A record keeps
// only compact facts of its analysis; Mol, Stereo and Reaction give the
// rest, kept for the records used last and read again on demand.
type Record struct {
	Occ *find.Occurrence
	// Identity is set for the records of a list whose relations needed
	// it (those whose constitution pre-key another record shares) and
	// nil otherwise; Identify gives it for any record.
	Identity *identity.Identity

	an *analysis // the cached analysis the record was filled from
	// full, when set, is the full analysis the record holds on to (the
	// records of AnalyzeOccurrences, which a review reads all of).
	full *fullAnalysis
}

// get returns the record's full analysis.
func (rec *Record) get() *fullAnalysis {
	if rec.full != nil {
		return rec.full
	}
	return rec.an.get()
}

// Mol returns the record's molecule. It is safe for concurrent use; the
// molecule must not be changed.
func (rec *Record) Mol() *notation.Molecule {
	if rec.an == nil {
		return nil
	}
	return rec.get().mol
}

// Stereo returns the record's stereo analysis.
func (rec *Record) Stereo() *stereo.Analysis {
	if rec.an == nil {
		return nil
	}
	return rec.get().stereo
}

// Reaction returns the record's reaction analysis, nil unless the record
// is a reaction.
func (rec *Record) Reaction() *reaction.Result {
	if rec.an == nil {
		return nil
	}
	return rec.get().reaction
}

// Identify returns the record's identity keys, computing them on first
// use; nil for reactions and for records that do not read without error.
// It is safe for concurrent use.
func (rec *Record) Identify() *identity.Identity {
	if rec.Identity != nil || rec.an == nil {
		return rec.Identity
	}
	return rec.an.identify()
}

// Diagnostic is one finding in host byte offsets.
type Diagnostic struct {
	Span        notation.Span
	Code        notation.Code
	Severity    notation.Severity
	Message     string
	Related     []Related
	Unnecessary bool
	Fixes       []Fix
	// Record is the index of the record the finding is about, -1 for
	// findings about the host file itself.
	Record int
}

// Related is a secondary place, in host offsets.
type Related struct {
	Span    notation.Span
	Message string
}

// Fix is one way to resolve a finding: edits in host offsets.
type Fix struct {
	Title string
	Edits []Edit
}

// Edit replaces the host bytes of Span with NewText.
type Edit struct {
	Span    notation.Span
	NewText string
}

// unnecessary are the codes whose marks change nothing; editors grey
// them out.
var unnecessary = map[notation.Code]bool{
	stereo.CodeIneffectiveCenter: true,
	stereo.CodeIneffectiveBond:   true,
}

// kindOf picks the host kind from the language id, the configured file
// patterns and the file name, in that order.
func (a *Analyzer) kindOf(name, languageID string) find.Kind {
	if find.KindForName(name) == find.KindNotebook {
		// Editors often call a notebook file "json"; its cells matter.
		return find.KindNotebook
	}
	if languageID != "" {
		if k := find.KindFor(languageID); k != find.KindUnknown {
			// An editor may call a .smi file "plaintext"; the name then
			// decides below.
			return k
		}
	}
	base := path.Base(name)
	for pat, kind := range a.cfg.Files {
		if ok, _ := path.Match(pat, base); ok {
			if k := find.KindFor(kind); k != find.KindUnknown {
				return k
			}
		}
	}
	return find.KindForName(name)
}

// Handles reports whether a file of this name is one the analyzer reads
// (by its extension or a configured pattern), for scans of a folder.
func (a *Analyzer) Handles(name string) bool { return a.kindOf(name, "") != find.KindUnknown }

// Analyze finds, reads and labels every record of a document and relates
// the records of a list. name is a file name or the path of a URI (it
// picks the host kind); languageID, if not empty, overrides the name.
func (a *Analyzer) Analyze(name, languageID string, content []byte) *Result {
	return a.AnalyzeRecords(name, languageID, content).Relate()
}

// AnalyzeRecords is the first part of Analyze: every record found, read
// and labelled, with the findings about each record on its own. The
// relations between the records of a list, whose identity keys can cost
// more than all the rest, are left to Relate, so an editor can show the
// rest first.
func (a *Analyzer) AnalyzeRecords(name, languageID string, content []byte) *Result {
	cfg := a.cfg
	kind := a.kindOf(name, languageID)
	res := &Result{Name: name, Content: content, Kind: kind, cfg: &cfg}
	// The records of a list whose constitution pre-key another has get
	// their identity keys now, which Relate needs: a record from the
	// molecule at hand, and the first record with its pre-key (in the
	// order the goroutines take them) when the second comes, from its
	// molecule if it was the record read just before on this goroutine
	// (readerPair), else read again.
	var seen preKeys
	if relatedKinds[kind] {
		seen.first = make(map[uint64]int32, min(len(content)/32, 1<<20))
	}
	reading, lim := cfg.Reading.notation(), cfg.Limits.limits()
	fill := func(i int, occ *find.Occurrence) {
		p := readerPairs.Get().(*readerPair)
		an, f, again := a.cache.readNotes(occ.Text, reading, lim, &p.cur)
		res.Records[i] = Record{Occ: occ, an: an}
		if f != nil {
			res.own[i] = res.findingsFrom(i, an.notesOf(f, !res.noFixes, again))
		} else {
			res.own[i] = res.findingsFrom(i, an.notes.Load())
		}
		if an.identifiable {
			if j, again := seen.add(relateKey(an.preKey, occ), i); again {
				if f != nil {
					an.identifyWith(f.mol)
				} else {
					an.identify() // known unless it was never needed
				}
				if j >= 0 {
					first := res.Records[j].an
					if m := p.prevMol; m != nil && m.Text == first.key.text && m.Reading == first.key.reading {
						first.identifyWith(m)
					} else {
						first.identify()
					}
				}
			}
		}
		if f != nil {
			// this molecule stays valid while the next record is read
			p.cur, p.prev, p.prevMol = p.prev, p.cur, f.mol
		}
		readerPairs.Put(p)
	}
	// The records of a JSON document are handed out as its walk finds
	// them, while the chunks before are read on all cores: the walk over
	// a long dataset overlaps the reading instead of coming before it. A
	// list is found whole: streaming it copies its text a window at a
	// time and costs more than it overlaps (100,000 records: 120 to 180
	// ms against 70 to 120 ms).
	fcfg := cfg.findConfig(name)
	findOverlapped(func(each func([]find.Occurrence)) {
		if kind == find.KindJSON {
			find.FindChunks(kind, content, fcfg, overlapChunk, each)
			return
		}
		occs := find.FindKind(kind, content, fcfg)
		for from := 0; from < len(occs); from += overlapChunk {
			to := min(from+overlapChunk, len(occs))
			each(occs[from:to:to])
		}
	}, func(occs []find.Occurrence) {
		occs = res.splitChunkQueries(occs)
		base := len(res.Records)
		res.Records = append(res.Records, make([]Record, len(occs))...)
		res.own = append(res.own, make([][]Diagnostic, len(occs))...)
		parallel(len(occs), func(k int) { fill(base+k, &occs[k]) })
	})
	n := 0
	for _, own := range res.own {
		n += len(own)
	}
	res.diags = make([]Diagnostic, 0, n)
	for _, own := range res.own {
		res.diags = append(res.diags, own...)
	}
	res.queryDiagnostics()
	res.sortDiagnostics()
	return res
}

// overlapChunk is how many occurrences findOverlapped hands on at a time.
const overlapChunk = 2048

// findOverlapped calls each with the chunks of occurrences that finder
// hands out (find.FindChunks), in order, on the calling goroutine, while
// the finder goes on to the next chunks on a goroutine of its own. A
// panic of the finder is raised again on the calling goroutine; when
// each panics, the finder is stopped at its next chunk.
func findOverlapped(finder func(each func([]find.Occurrence)), each func([]find.Occurrence)) {
	ch := make(chan []find.Occurrence, 2)
	stop := make(chan struct{})
	var failure any
	go func() {
		defer close(ch)
		defer func() { failure = recover() }()
		finder(func(occs []find.Occurrence) {
			select {
			case ch <- occs:
			case <-stop:
				panic(errStopped)
			}
		})
	}()
	defer func() {
		// each panicked, or returned: let the finder end
		close(stop)
		for range ch {
		}
	}()
	for occs := range ch {
		each(occs)
	}
	if failure != nil && failure != errStopped {
		panic(failure)
	}
}

// errStopped ends a finder whose chunks are no longer wanted.
var errStopped = errors.New("finding stopped")

// preKeys is the set of the constitution pre-keys of a document's
// records that goroutines add to as they read them.
type preKeys struct {
	mu sync.Mutex
	// first holds, for each pre-key, the record that brought it while it
	// is alone, or -1 once another has come; nil: the set takes nothing.
	first map[uint64]int32
}

// add adds record i's pre-key k to the set. again says whether the set
// held k already; if so, first is the record that brought it when i is
// the second record with k, and -1 after that.
func (s *preKeys) add(k uint64, i int) (first int, again bool) {
	if s.first == nil {
		return -1, false
	}
	s.mu.Lock()
	defer s.mu.Unlock()
	j, ok := s.first[k]
	if !ok {
		s.first[k] = int32(i)
		return -1, false
	}
	s.first[k] = -1
	return int(j), true
}

// sortDiagnostics orders the findings by host position, stably, so
// findings at one place keep the order they were made in.
func (r *Result) sortDiagnostics() { sortByPosition(r.diags) }

// sortByPosition orders findings by host position, stably. Findings
// made record by record in host order (a list's) are in order already,
// which one pass finds.
func sortByPosition(ds []Diagnostic) {
	sorted := true
	for k := 1; k < len(ds) && sorted; k++ {
		sorted = !before(ds[k].Span, ds[k-1].Span)
	}
	if sorted {
		return
	}
	sort.SliceStable(ds, func(i, j int) bool { return before(ds[i].Span, ds[j].Span) })
}

// before is the order of findings: by start, then by end.
func before(x, y notation.Span) bool {
	if x.Start != y.Start {
		return x.Start < y.Start
	}
	return x.End < y.End
}

// parallelMin is the number of records from which analysis is spread
// over the cores; below it the goroutines cost more than they save.
const parallelMin = 256

// parallel calls f(0) ... f(n-1), on all cores when n is large. The
// records are handed out in chunks so the cache lock is not contended.
func parallel(n int, f func(int)) {
	workers := runtime.GOMAXPROCS(0)
	if n < parallelMin || workers < 2 {
		for i := 0; i < n; i++ {
			f(i)
		}
		return
	}
	const chunk = 64
	var next atomic.Int64
	var wg sync.WaitGroup
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for {
				start := int(next.Add(chunk)) - chunk
				if start >= n {
					return
				}
				for i := start; i < min(start+chunk, n); i++ {
					f(i)
				}
			}
		}()
	}
	wg.Wait()
}

// add appends a diagnostic after applying the configured severity.
func (r *Result) add(d Diagnostic) {
	if d, on := r.configured(d); on {
		r.diags = append(r.diags, d)
	}
}

// configured applies the configured severity to a diagnostic; on is
// false for a finding the configuration turns off.
func (r *Result) configured(d Diagnostic) (_ Diagnostic, on bool) {
	sev, on := r.cfg.severityFor(d.Code, d.Severity)
	if !on {
		return d, false
	}
	d.Severity = sev
	if unnecessary[d.Code] {
		d.Unnecessary = true
	}
	return d, true
}

// recordFindings maps the host, reader and stereo findings of one
// record (its full analysis f) to host offsets, with their quick fixes
// unless r leaves them out, through the record's notes (recordNotes).
func (r *Result) recordFindings(i int, f *fullAnalysis) []Diagnostic {
	return r.findingsFrom(i, r.Records[i].an.notesOf(f, !r.noFixes, false))
}

// notesOf returns the notes of the analysis's full analysis f: the ones
// kept, when they have fixes or none are wanted, or made from f, and
// kept when keep is set, they have fixes and an is a cached analysis.
func (an *analysis) notesOf(f *fullAnalysis, fixes, keep bool) *recordNotes {
	if an != nil {
		if n := an.notes.Load(); n != nil && (n.fixes != nil || !fixes) {
			return n
		}
	}
	// The full analysis may live in a reader's storage that the next
	// record reuses: notes that are kept hold copies; others (a result
	// without fixes, a record of no cache) are used at once.
	store := keep && an != nil && fixes
	var reaction notation.ErrorList
	if f.reaction != nil {
		reaction = f.reaction.Diagnostics
	}
	var copies []notation.Error
	if store {
		copies = make([]notation.Error, 0, len(f.mol.Errors)+len(f.stereo.Diagnostics)+len(reaction))
	}
	copied := func(es notation.ErrorList) []*notation.Error {
		if !store || len(es) == 0 {
			return es
		}
		out := make([]*notation.Error, len(es))
		for k, e := range es {
			c := *e // strings are shared: no reader writes into one
			c.Related = slices.Clone(e.Related)
			copies = append(copies, c)
			out[k] = &copies[len(copies)-1]
		}
		return out
	}
	if store && len(f.mol.Errors)+len(f.stereo.Diagnostics)+len(reaction)+len(an.groupFindings) == 0 {
		an.notes.Store(&noNotes)
		return &noNotes
	}
	n := &recordNotes{reader: copied(f.mol.Errors), stereo: copied(f.stereo.Diagnostics), reaction: copied(reaction)}
	if fixes {
		var groups notation.ErrorList
		if an != nil {
			groups = an.groupFindings
		}
		n.fixes = make([]noteFix, 0, len(n.stereo)+len(groups))
		for _, e := range f.stereo.Diagnostics {
			n.fixes = append(n.fixes, notationFix(f, e))
		}
		for _, e := range groups {
			n.fixes = append(n.fixes, notationFix(f, e))
		}
	}
	if store {
		an.notes.Store(n)
	}
	return n
}

// noNotes are the notes of every record without findings.
var noNotes = recordNotes{fixes: []noteFix{}}

// findingsFrom maps the notes of record i to host offsets, with the
// host problems of its occurrence.
func (r *Result) findingsFrom(i int, n *recordNotes) []Diagnostic {
	var out []Diagnostic
	add := func(d Diagnostic) {
		if d, on := r.configured(d); on {
			out = append(out, d)
		}
	}
	rec := &r.Records[i]
	occ := rec.Occ
	for j, e := range occ.Diagnostics {
		d := Diagnostic{Span: e.Span, Code: e.Code, Severity: e.Severity, Message: e.Msg, Record: i}
		for _, rel := range e.Related {
			d.Related = append(d.Related, Related{rel.Span, rel.Msg})
		}
		if j < len(occ.Fixes) && !r.noFixes {
			for _, f := range occ.Fixes[j] {
				d.Fixes = append(d.Fixes, Fix{Title: f.Title, Edits: []Edit{{Span: f.Span, NewText: f.NewText}}})
			}
		}
		add(d)
	}
	mapped := func(e *notation.Error) Diagnostic {
		d := Diagnostic{Span: occ.HostSpan(e.Span), Code: e.Code, Severity: e.Severity, Message: e.Msg, Record: i}
		for _, rel := range e.Related {
			d.Related = append(d.Related, Related{occ.HostSpan(rel.Span), rel.Msg})
		}
		return d
	}
	fix := func(k int) []Fix {
		if r.noFixes || k >= len(n.fixes) || len(n.fixes[k].edits) == 0 {
			return nil
		}
		return []Fix{{Title: n.fixes[k].title, Edits: r.hostEdits(i, n.fixes[k].edits)}}
	}
	for _, e := range n.reader {
		add(mapped(e))
	}
	for k, e := range n.stereo {
		d := mapped(e)
		d.Fixes = fix(k)
		add(d)
	}
	if rec.an != nil {
		for k, e := range rec.an.groupFindings {
			d := mapped(e)
			d.Fixes = fix(len(n.stereo) + k)
			add(d)
		}
	}
	for _, e := range n.reaction {
		add(mapped(e))
	}
	sortByPosition(out)
	return out
}

// RecordAt returns the index of the record whose host span holds offset
// off (a cursor at the end of a record still counts), or -1.
func (r *Result) RecordAt(off int) int {
	i := sort.Search(len(r.Records), func(i int) bool { return r.Records[i].Occ.Span.End >= off })
	for ; i < len(r.Records); i++ {
		s := r.Records[i].Occ.Span
		if s.Start > off {
			break
		}
		if off >= s.Start && off <= s.End {
			return i
		}
	}
	return -1
}

// Symbol is an outline entry: one record or query pattern.
type Symbol struct {
	Name string
	Span notation.Span
	// Query is true for a query pattern (SMARTS).
	Query bool
}

// Symbols returns an outline entry per record and query pattern of the
// document, in host order: its title, or the start of its text. In a
// list or table that is the whole outline; in source code, Markdown,
// JSON, YAML and notebooks the entries are the notation found there,
// which editors that merge the outlines of several servers show beside
// the language's own symbols.
func (r *Result) Symbols() []Symbol {
	out := make([]Symbol, 0, len(r.Records)+len(r.Queries))
	for _, rec := range r.Records {
		out = append(out, Symbol{Name: symbolName(rec.Occ), Span: rec.Occ.Span})
	}
	for _, q := range r.Queries {
		out = append(out, Symbol{Name: symbolName(q.Occ), Span: q.Occ.Span, Query: true})
	}
	sort.SliceStable(out, func(i, j int) bool { return out[i].Span.Start < out[j].Span.Start })
	return out
}

// symbolName names an occurrence in the outline: its title, or the
// start of its text.
func symbolName(o *find.Occurrence) string {
	if o.Title != "" {
		return o.Title
	}
	name := o.Text
	if len(name) > 40 {
		name = name[:40] + "…"
	}
	return name
}

package review

import (
	"fmt"
	"runtime"
	"sort"
	"sync"
	"sync/atomic"

	"stereoline/notation"
	"stereoline/notation/find"
	"stereoline/stereo/document"
	"stereoline/stereo/identity"
)

// Version is one side of a review: a file's name (which picks the host
// kind) and its content; nil content is a file that does not exist on
// that side, so all its records are added or removed.
type Version struct {
	Name    string
	Content []byte
	// LanguageID, if not empty, picks the host kind instead of the name,
	// as an editor's language id does.
	LanguageID string
}

// Options tune Review; the zero value is the default.
type Options struct {
	// Key names what identifies a record, in place of the host's own
	// identity: a table column by its header or 1-based number, a
	// 1-based field of a list line, or a member of the objects of a JSON
	// array.
	Key string
}

// Report is what Review finds for one file.
type Report struct {
	// Old and New are the records read on each side: only those that
	// appear in Pairs (records whose text did not change are never
	// read). Their Content is the version's content.
	Old, New *document.Result
	// Records counts the records of the new version (of the old one for
	// a file that no longer exists); Unchanged those paired with a
	// record of the same text.
	Records, Unchanged int
	// Pairs are the changed, added and removed records in the order of
	// the new version, a removed record where it stood.
	Pairs []Pair
}

// Pair is one record whose text changed, or that is new or gone.
type Pair struct {
	Class Class
	// Old and New are the record on each side; nil for an added record
	// (Old) or a removed one (New).
	Old, New *Record
	// Units are the units that changed, in the order of the new record
	// (units only the old record fixes last).
	Units []UnitChange
	// Roles are the classes of the parts of a reaction, Centres its
	// mapped centres whose fate changed.
	Roles   []RoleChange
	Centres []CentreChange
	// Findings are the findings the change introduced or removed.
	Findings []FindingChange
	// Explanation says in one sentence what the record now means
	// compared with before; Summary says it in a few words ("epimer at
	// C3") for an editor's lens.
	Explanation, Summary string
	// Other counts the stereocentres configured alike before and after.
	Other int
	// Reason says why a side does not read (Unreadable).
	Reason string
	// Formula is the molecular formula, old and new, of a record whose
	// constitution changed.
	OldFormula, Formula string
}

// Record is one side of a pair.
type Record struct {
	// Index is the record's index in its version's Result.
	Index int
	// Key is the identity the host gives the record ("" for none).
	Key string
	*document.Record
}

// side is a record with its version, for the classification.
type side struct {
	rec *document.Record
	res *document.Result
}

// Review pairs the records of the old and the new version of a file and
// classifies each pair whose text differs. The analyzer's configuration
// decides what is read as notation (the same for both versions), and its
// cache is shared with whoever else uses it.
func Review(a *document.Analyzer, old, new Version, opt Options) *Report {
	oldKind, oldOccs := occurrences(a, old)
	newKind, newOccs := occurrences(a, new)
	oldKeys := hostKeys(oldKind, old.Content, oldOccs, opt.Key)
	newKeys := hostKeys(newKind, new.Content, newOccs, opt.Key)

	p := newPairing(len(oldOccs), len(newOccs))
	p.byKey(oldKeys, newKeys)
	p.byText(oldOccs, newOccs)

	// Read every record that is not paired with its own text: the
	// changed pairs and those still unpaired.
	oldRead, newRead := readList(p.oldTo, oldOccs, newOccs), readList(p.newTo, newOccs, oldOccs)
	oldRes := a.AnalyzeOccurrences(old.Name, oldKind, old.Content, pick(oldOccs, oldRead))
	newRes := a.AnalyzeOccurrences(new.Name, newKind, new.Content, pick(newOccs, newRead))
	oldAt, newAt := position(oldRead, len(oldOccs)), position(newRead, len(newOccs))

	p.byContent(contentKeys(oldRes, oldAt, p.oldTo), contentKeys(newRes, newAt, p.newTo))
	p.byPosition(oldKeys, newKeys)

	rep := &Report{Old: oldRes, New: newRes, Records: len(newOccs)}
	if new.Content == nil {
		rep.Records = len(oldOccs)
	}
	oldDiags, newDiags := byRecord(oldRes), byRecord(newRes)
	record := func(res *document.Result, at []int, keys []string, i int) *Record {
		k := at[i]
		return &Record{Index: k, Key: keys[i], Record: &res.Records[k]}
	}
	type placed struct {
		pair  Pair
		at    int // new index, or the new index after which a removed record stood
		order int // old index for removed records, to keep their order
	}
	var out []placed
	for n, o := range p.newTo {
		switch {
		case o < 0:
			nr := record(newRes, newAt, newKeys, n)
			pr := Pair{Class: Added, New: nr, Findings: findingChanges(nil, newDiags[nr.Index])}
			explain(&pr)
			out = append(out, placed{pr, n, -1})
		case oldOccs[o].Text == newOccs[n].Text:
			rep.Unchanged++
		default:
			or, nr := record(oldRes, oldAt, oldKeys, o), record(newRes, newAt, newKeys, n)
			out = append(out, placed{Pair{Old: or, New: nr}, n, -1})
		}
	}
	// Classify the changed pairs on all cores: the identity keys are the
	// costliest part of a review.
	var changed []int
	for i := range out {
		if out[i].pair.Old != nil && out[i].pair.New != nil {
			changed = append(changed, i)
		}
	}
	parallel(len(changed), func(k int) {
		pr := &out[changed[k]].pair
		or, nr := pr.Old, pr.New
		*pr = pairOf(&side{or.Record, oldRes}, &side{nr.Record, newRes})
		pr.Old, pr.New = or, nr
		pr.Findings = findingChanges(oldDiags[or.Index], newDiags[nr.Index])
		explain(pr)
	})
	lastNew := -1
	for o, n := range p.oldTo {
		if n >= 0 {
			lastNew = n
			continue
		}
		or := record(oldRes, oldAt, oldKeys, o)
		pr := Pair{Class: Removed, Old: or, Findings: findingChanges(oldDiags[or.Index], nil)}
		explain(&pr)
		out = append(out, placed{pr, lastNew, o})
	}
	sort.SliceStable(out, func(i, j int) bool {
		// a removed record after the pair before it, and before the
		// next new record
		x, y := out[i], out[j]
		xa, ya := 2*x.at, 2*y.at
		if x.order >= 0 {
			xa++
		}
		if y.order >= 0 {
			ya++
		}
		if xa != ya {
			return xa < ya
		}
		return x.order < y.order
	})
	rep.Pairs = make([]Pair, len(out))
	for i := range out {
		rep.Pairs[i] = out[i].pair
	}
	return rep
}

// parallel calls f(0) ... f(n-1) on all cores, a few at a time. A panic
// in f is raised again in the caller, where the request boundary
// recovers it.
func parallel(n int, f func(int)) {
	workers := min(runtime.GOMAXPROCS(0), n)
	if workers < 2 {
		for i := 0; i < n; i++ {
			f(i)
		}
		return
	}
	var next atomic.Int64
	var wg sync.WaitGroup
	var failed atomic.Value
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			defer func() {
				if r := recover(); r != nil {
					failed.CompareAndSwap(nil, fmt.Sprint(r))
				}
			}()
			for {
				i := int(next.Add(1) - 1)
				if i >= n {
					return
				}
				f(i)
			}
		}()
	}
	wg.Wait()
	if r := failed.Load(); r != nil {
		panic(r)
	}
}

// pairOf classifies a pair of records whose text differs.
func pairOf(o, n *side) Pair {
	oc := classify(o, n)
	return Pair{Class: oc.class, Units: oc.units, Roles: oc.roles, Centres: oc.centres,
		Other: oc.other, Reason: oc.reason, OldFormula: oc.formula[0], Formula: oc.formula[1]}
}

// occurrences finds the records of a version (none for a missing file).
func occurrences(a *document.Analyzer, v Version) (find.Kind, []find.Occurrence) {
	if v.Content == nil {
		return find.KindUnknown, nil
	}
	return a.Occurrences(v.Name, v.LanguageID, v.Content)
}

// readList returns the records of one side to read: those not paired
// with a record of the same text.
func readList(to []int, mine, theirs []find.Occurrence) []int {
	var out []int
	for i, j := range to {
		if j < 0 || mine[i].Text != theirs[j].Text {
			out = append(out, i)
		}
	}
	return out
}

func pick(occs []find.Occurrence, idx []int) []find.Occurrence {
	out := make([]find.Occurrence, len(idx))
	for k, i := range idx {
		out[k] = occs[i]
	}
	return out
}

// position maps each occurrence to its index among the records read, -1
// for one not read.
func position(read []int, n int) []int {
	at := make([]int, n)
	for i := range at {
		at[i] = -1
	}
	for k, i := range read {
		at[i] = k
	}
	return at
}

// contentKeys gives each unpaired record that reads its constitution
// pre-key (for a reaction, the pre-keys of its parts mixed), 0 for the
// others.
func contentKeys(res *document.Result, at, to []int) []uint64 {
	keys := make([]uint64, len(at))
	for i, k := range at {
		if k < 0 || to[i] >= 0 {
			continue
		}
		m := res.Records[k].Mol()
		if m.Errors.HasErrors() || len(m.Atoms) == 0 {
			continue
		}
		if !m.Reaction {
			keys[i] = identity.ConstitutionPreKey(m) | 1
			continue
		}
		parts, ok := splitRoles(m)
		if !ok {
			continue
		}
		h := uint64(14695981039346656037)
		for _, r := range roles {
			var x uint64
			if len(parts[r].mol.Atoms) > 0 {
				x = identity.ConstitutionPreKey(parts[r].mol)
			}
			h = (h ^ x) * 1099511628211
		}
		keys[i] = h | 1
	}
	return keys
}

// byRecord groups a result's findings by record.
func byRecord(res *document.Result) map[int][]document.Diagnostic {
	out := map[int][]document.Diagnostic{}
	for _, d := range res.Diagnostics() {
		if d.Record >= 0 {
			out[d.Record] = append(out[d.Record], d)
		}
	}
	return out
}

// FindingChange is a finding the change introduced (present now, not
// before) or removed.
type FindingChange struct {
	Introduced bool
	// Diagnostic is the finding, in the host offsets of its version:
	// the new one for an introduced finding, the old one otherwise.
	document.Diagnostic
}

// findingChanges compares the findings of the old and the new record by
// code and message, then by code alone (a re-writing renumbers the atoms
// a message names).
func findingChanges(old, new []document.Diagnostic) []FindingChange {
	usedOld := make([]bool, len(old))
	usedNew := make([]bool, len(new))
	for _, exact := range []bool{true, false} {
		for j := range new {
			if usedNew[j] {
				continue
			}
			for i := range old {
				if !usedOld[i] && old[i].Code == new[j].Code && (!exact || old[i].Message == new[j].Message) {
					usedOld[i], usedNew[j] = true, true
					break
				}
			}
		}
	}
	var out []FindingChange
	for j := range new {
		if !usedNew[j] {
			out = append(out, FindingChange{Introduced: true, Diagnostic: new[j]})
		}
	}
	for i := range old {
		if !usedOld[i] {
			out = append(out, FindingChange{Diagnostic: old[i]})
		}
	}
	return out
}

// HostMark returns the host offset a line of output points at for a
// record of the pair: the first mark of the first changed unit on that
// side, else the start of the record.
func (p *Pair) HostMark(newSide bool) int {
	r := p.Old
	if newSide {
		r = p.New
	}
	if r == nil {
		return 0
	}
	for _, u := range p.Units {
		marks := u.OldMarks
		if newSide {
			marks = u.Marks
		}
		if len(marks) > 0 {
			return r.Occ.HostOffset(marks[0].Start)
		}
	}
	return r.Occ.Span.Start
}

// ChangedMarks returns the spans, in the record's text, of the marks of
// the changed units on one side, for highlighting.
func (p *Pair) ChangedMarks(newSide bool) []notation.Span {
	var out []notation.Span
	for _, u := range p.Units {
		if newSide {
			out = append(out, u.Marks...)
		} else {
			out = append(out, u.OldMarks...)
		}
	}
	sort.Slice(out, func(i, j int) bool { return out[i].Start < out[j].Start })
	return out
}

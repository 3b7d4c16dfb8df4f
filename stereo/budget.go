// This file implements the time budget of one analysis.

package stereo

import (
	"fmt"
	"runtime"
	"time"

	"stereoline/notation"
)

// DefaultBudget is the time one record may take by default in the engine
// (stereo/document's limits setting): it answers an editor and a checker
// record by record, and a record that takes longer is reported, not
// waited for. Analyze itself sets no budget unless asked (Options.Budget):
// its callers below the engine (tests, rewrites checked by labelling)
// want the labels whatever they cost, bounded by the node cap alone. It
// is half a second so that a record, with its reading, its identity keys,
// the finding of its host and the report around it, is answered within a
// second with room to spare (at 800 ms a marked chain of 50,000 atoms on
// one line of a list took 0.92 to 0.96 s to its finding); records of a
// thousand residues take tens of milliseconds.
const DefaultBudget = 500 * time.Millisecond

// DefaultNodeCap is the node cap of every digraph when the caller sets
// none.
const DefaultNodeCap = defaultNodeCap

// Instant is when a budget started (StartBudget); the zero Instant is
// unset.
type Instant struct {
	wall time.Time
	set  bool
}

// StartBudget starts the budget of one record, for a caller that spends
// some of it before Analyze (reading the record; Options.Start).
func StartBudget() Instant { return Instant{wall: time.Now(), set: true} }

// budget is the time one record may take, checked cooperatively: the
// digraph asks at every node it adds and every sphere it compares, the
// phases before every unit they label or perceive. Once it is spent the
// digraph adds no more nodes (its comparisons then end as at the node
// cap) and the phases label nothing more; the units left are reported
// undetermined under CodeBudget. Nothing runs on after the call returns:
// there are no goroutines to abandon.
//
// The first half of the budget is wall time; the rest is the processor
// time of the thread doing the work, where the system gives it (Linux;
// budget_clock_linux.go), and at least half the budget. So a record that
// needs less than half its budget is never cut short, however busy the
// machine (waiting for a core is not work), and a runaway still stops.
// Reading a thread's processor time is a system call, about thirty
// times dearer than the wall clock, so the wall clock is read first: a
// thread cannot use more processor time than the wall time that passed,
// so the processor clock is read only once the wall clock is past the
// point where the budget could be spent. From the switch to processor
// time on, the goroutine is wired to its thread (release undoes it), so
// the processor time read is the record's own. Where the system gives no
// processor time the budget is wall time throughout.
type budget struct {
	limit    time.Duration
	deadline time.Time // wall clock: where the budget ends, in wall mode
	wallNext time.Time // the clocks say nothing new before this
	cpu      bool      // switched to processor time
	cpuEnd   time.Duration
	locked   bool
	ticks    uint32
	spent    bool
}

// budgetCheckEvery is how many ticks pass between two looks at the
// clock: a tick is a node or a sphere, well under a microsecond, so the
// deadline is overrun by at most a millisecond or so.
const budgetCheckEvery = 1024

// tick counts one step of work and reports whether the budget is spent.
func (b *budget) tick() bool {
	if b == nil {
		return false
	}
	if b.spent {
		return true
	}
	if b.limit <= 0 {
		return false
	}
	b.ticks++
	if b.ticks%budgetCheckEvery != 0 {
		return false
	}
	return b.check()
}

// check looks at the clocks and reports whether the budget is spent.
func (b *budget) check() bool {
	if b == nil || b.spent || b.limit <= 0 {
		return b != nil && b.spent
	}
	wall := time.Now()
	if wall.Before(b.wallNext) {
		return false
	}
	if !b.cpu {
		// half the budget has passed on the wall clock: what is left is
		// counted in processor time, and is at least half the budget
		if !b.locked {
			runtime.LockOSThread()
			b.locked = true
		}
		used, ok := threadCPU()
		if !ok {
			b.release()
			if !wall.Before(b.deadline) {
				b.spent = true
			}
			b.wallNext = b.deadline
			return b.spent
		}
		b.cpu = true
		b.cpuEnd = used + max(b.deadline.Sub(wall), b.limit/2)
		b.wallNext = wall.Add(b.cpuEnd - used)
		// only a budget of a nanosecond, which tests use to spend it at
		// once, has nothing left here
		b.spent = used >= b.cpuEnd
		return b.spent
	}
	used, ok := threadCPU()
	if !ok || used >= b.cpuEnd {
		b.spent = true
		return true
	}
	b.wallNext = wall.Add(b.cpuEnd - used)
	return false
}

// release unwires the goroutine from its thread if the budget wired it.
func (b *budget) release() {
	if b != nil && b.locked {
		b.locked = false
		runtime.UnlockOSThread()
	}
}

// newBudget starts the budget of one call, or shares the budget of the
// call it runs inside (Options.shared). owned says whether this call
// must release it.
func newBudget(opt Options) (b *budget, owned bool) {
	switch {
	case opt.shared != nil:
		return opt.shared, false
	case opt.Budget <= 0:
		return &budget{}, true
	}
	start := opt.Start.wall
	if !opt.Start.set {
		start = time.Now()
	}
	end := start.Add(opt.Budget)
	return &budget{limit: opt.Budget, deadline: end, wallNext: start.Add(opt.Budget / 2)}, true
}

// skipOverBudget reports whether the budget is spent before a marked
// unit is labelled, and if so keeps the unit's mark for reportBudget.
func (l *labeller) skipOverBudget(mark notation.Span) bool {
	if !l.budget.check() {
		return false
	}
	l.overBudget = append(l.overBudget, mark)
	return true
}

// reportBudget reports, once, that the budget was spent: on the first
// mark left unlabelled, or on the first atom when only the search for
// unmarked units was cut short.
func (l *labeller) reportBudget() {
	if !l.budget.spent {
		return
	}
	limit := "its time budget"
	if l.budget.limit > 0 {
		limit = fmt.Sprintf("its time budget of %v", l.budget.limit)
	}
	if len(l.overBudget) == 0 {
		l.warn(l.g.mol.Atoms[0].Span, CodeBudget, "the record's analysis stopped at %s: unmarked stereogenic units were not all looked for", limit)
		return
	}
	e := l.warn(l.overBudget[0], CodeBudget, "the record's analysis stopped at %s: %d marked units left undetermined, unmarked ones not looked for", limit, len(l.overBudget))
	for _, sp := range l.overBudget[1:min(len(l.overBudget), maxBudgetRelated+1)] {
		e.Related = append(e.Related, notation.Related{Span: sp, Msg: "left undetermined"})
	}
}

// maxBudgetRelated bounds the marks a budget diagnostic lists as
// related places: a record over its budget may hold thousands.
const maxBudgetRelated = 20

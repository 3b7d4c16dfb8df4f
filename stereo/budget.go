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
// is a little under a second so that a record, with its reading, its
// identity keys and the report around it, is answered within a second.
const DefaultBudget = 800 * time.Millisecond

// DefaultNodeCap is the node cap of every digraph when the caller sets
// none.
const DefaultNodeCap = defaultNodeCap

// Instant is a reading of the clock the budget counts: the processor
// time of the thread that analyses the record where the system gives it
// (Linux), else the wall clock. Counting processor time keeps the labels
// of a record the same on a busy machine, where a record waiting for a
// core would otherwise run out of wall time; it still stops a runaway.
// The zero Instant is unset.
type Instant struct {
	at  time.Duration // processor time of the thread, or wall time since wallEpoch
	cpu bool          // at is processor time
	set bool
}

// wallEpoch is where wall-clock Instants count from.
var wallEpoch = time.Now()

// now reads the clock the budget counts.
func now() Instant {
	if d, ok := threadCPU(); ok {
		return Instant{at: d, cpu: true, set: true}
	}
	return Instant{at: time.Since(wallEpoch), set: true}
}

// after returns the Instant d later.
func (t Instant) after(d time.Duration) Instant { t.at += d; return t }

// passed reports whether the clock has passed t.
func (t Instant) passed() bool {
	n := now()
	if n.cpu != t.cpu {
		// the thread's clock became unreadable: count the budget spent
		// rather than compare two clocks
		return true
	}
	return n.at > t.at
}

// StartBudget starts the budget of one record on the calling goroutine,
// for a caller that spends some of it before Analyze (reading the
// record; Options.Start). It wires the goroutine to its thread, so that
// the processor time counted is the record's own, until the returned
// function is called; call it when the record is done.
func StartBudget() (Instant, func()) {
	runtime.LockOSThread()
	return now(), runtime.UnlockOSThread
}

// budget is the deadline of one analysis, checked cooperatively: the
// digraph asks at every node it adds and every sphere it compares, the
// phases before every unit they label or perceive. Once the deadline has
// passed the digraph adds no more nodes (its comparisons then end as at
// the node cap) and the phases label nothing more; the units left are
// reported undetermined under CodeBudget. Nothing runs on after the
// call returns: there are no goroutines to abandon.
type budget struct {
	deadline Instant // unset: no deadline
	limit    time.Duration
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
	if !b.deadline.set {
		return false
	}
	b.ticks++
	if b.ticks%budgetCheckEvery != 0 {
		return false
	}
	return b.check()
}

// check looks at the clock and reports whether the budget is spent.
func (b *budget) check() bool {
	if b == nil {
		return false
	}
	if !b.spent && b.deadline.set && b.deadline.passed() {
		b.spent = true
	}
	return b.spent
}

// newBudget starts the budget of one call. A call that starts its own
// budget wires its goroutine to its thread until unlock is called.
func newBudget(opt Options) (b *budget, unlock func()) {
	switch {
	case opt.deadline.set:
		return &budget{deadline: opt.deadline, limit: opt.Budget}, func() {}
	case opt.Budget <= 0:
		return &budget{}, func() {}
	}
	start, unlock := opt.Start, func() {}
	if !start.set {
		start, unlock = StartBudget()
	}
	return &budget{deadline: start.after(opt.Budget), limit: opt.Budget}, unlock
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

// This file implements the time budget of one analysis.

package stereo

import (
	"fmt"
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

// budget is the deadline of one analysis, checked cooperatively: the
// digraph asks at every node it adds and every sphere it compares, the
// phases before every unit they label or perceive. Once the deadline has
// passed the digraph adds no more nodes (its comparisons then end as at
// the node cap) and the phases label nothing more; the units left are
// reported undetermined under CodeBudget. Nothing runs on after the
// call returns: there are no goroutines to abandon.
type budget struct {
	deadline time.Time // zero: no deadline
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
	if b.deadline.IsZero() {
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
	if !b.spent && !b.deadline.IsZero() && time.Now().After(b.deadline) {
		b.spent = true
	}
	return b.spent
}

// newBudget starts the budget of one call.
func newBudget(opt Options) *budget {
	switch {
	case !opt.deadline.IsZero():
		return &budget{deadline: opt.deadline, limit: opt.Budget}
	case opt.Budget <= 0:
		return &budget{}
	}
	limit := opt.Budget
	start := opt.Start
	if start.IsZero() {
		start = time.Now()
	}
	return &budget{deadline: start.Add(limit), limit: limit}
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

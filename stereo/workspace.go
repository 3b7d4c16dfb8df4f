// This file implements the storage kept between Analyze calls.

package stereo

import (
	"sync"
	"sync/atomic"

	"stereoline/stereo/internal/skeleton"
)

// Storage kept between Analyze calls. An analysis builds a graph of the
// molecule and a digraph for every unit; growing that storage afresh for
// each molecule made allocation and garbage collection a third of the
// time of labelling a list. A workspace holds it for the next call: it is
// taken from a sync.Pool for one call and given back at the end, so two
// goroutines never share one, and nothing in a result points into it
// (units and diagnostics are allocated for the caller).

type workspace struct {
	g     graph
	spare []*digraph
	cfg   configs
	// classed is the constitution whose symmetry classes the graph's
	// storage holds (g.store.class), left by the last call that computed
	// them: a next molecule with that constitution takes them as they
	// are (the stereoisomers of a list, one after another)
	classed skeleton.Skeleton
}

var workspaces = sync.Pool{New: func() any { return new(workspace) }}

// sharedClasses counts the analyses that took the symmetry classes of
// the molecule before (workspace.classed), for the tests.
var sharedClasses atomic.Int64

// keepNodes is the largest digraph kept in a workspace: one that grew
// towards the node cap for a pathological molecule would otherwise hold
// its memory for every later small one.
const keepNodes = 1 << 14

// classedKeep is the largest molecule whose constitution a workspace
// keeps with its symmetry classes: lists of stereoisomers are of small
// molecules, and a copy of a huge one would stay in the pool.
const classedKeep = 4096

// takeWorkspace returns a workspace for one Analyze call.
func takeWorkspace() *workspace { return workspaces.Get().(*workspace) }

// giveBack returns the storage of a finished call to the pool, dropping
// what must not outlive it: the molecule and any oversized digraph.
func (w *workspace) giveBack(l *labeller) {
	if l.classes.class != nil && !l.classes.shared && w.g.n <= classedKeep {
		w.classed.Take(w.g.mol)
	}
	w.g.mol = nil
	w.g.store.geom.Release()
	// filtered in place: kept digraphs move down over dropped ones
	kept := l.spare[:0]
	for _, d := range l.spare {
		if cap(d.nodes) <= keepNodes && cap(d.arena) <= 4*keepNodes {
			d.g, d.cfg, d.budget = nil, nil, nil
			kept = append(kept, d)
		}
	}
	clear(l.spare[len(kept):])
	w.spare = kept
	w.cfg.reset()
	workspaces.Put(w)
}

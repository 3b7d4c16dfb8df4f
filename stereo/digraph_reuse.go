// This file implements the reuse of digraph storage within one Analyze
// call.

package stereo

// Reusing digraph storage within one Analyze call. Every unit builds its
// own digraph and drops it once labelled, so the node table, the child
// arena and the memo maps of one unit's digraph can be handed to the
// next instead of being grown again from nothing. The spares belong to
// one labeller, which belongs to one Analyze call: nothing is shared
// between calls or goroutines.

// keepMemo is the largest memo map kept for reuse; clearing a map costs
// time in proportion to its capacity, so a map that grew large for one
// deep unit is dropped rather than cleared for every later small one.
const keepMemo = 4096

// digraph returns an empty digraph rooted at rootAtom, built on spare
// storage when there is some.
func (l *labeller) digraph(rootAtom int) *digraph {
	n := len(l.spare)
	if n == 0 {
		return newDigraph(l.g, l.cfg, rootAtom, l.nodeCap, l.budget)
	}
	d := l.spare[n-1]
	l.spare = l.spare[:n-1]
	*d = digraph{
		g: l.g, cfg: l.cfg, limit: min(l.nodeCap, maxNodeCap), refAtom: -1, budget: l.budget,
		nodes:      d.nodes[:0],
		arena:      d.arena[:0],
		sortTables: d.sortTables[:0],
		sorts:      d.sorts[:0],
		kidBuf:     d.kidBuf[:0],
		free:       d.free,
		groupIDs:   d.groupIDs,
		compared:   reusable(d.compared),
		sortedAux:  reusable(d.sortedAux),
		sortedRoot: reusable(d.sortedRoot),
		aux:        d.aux[:0],
		auxRef:     reusable(d.auxRef),
	}
	d.addRoot(rootAtom)
	return d
}

// release hands digraphs that are no longer used back for reuse. Nothing
// may hold on to their nodes afterwards: labels keep atoms, not nodes.
func (l *labeller) release(ds ...*digraph) {
	l.spare = append(l.spare, ds...)
}

// reusable empties a memo map for reuse, or drops it when it has grown
// past keepMemo entries.
func reusable[K comparable, V any](m map[K]V) map[K]V {
	if len(m) > keepMemo {
		return nil
	}
	clear(m)
	return m
}

// Package genmap is a map of bounded size kept in two generations, for
// the caches of answers that depend on a key alone (the analyses of
// notation texts, the finder's verdicts on literals): when the current
// generation fills, it becomes the older one and the older is dropped,
// and an entry found in the older one moves to the current one. So the
// entries in use (the records of the document being edited) stay, while
// memory stays bounded whatever passes through (a scan of many files).
//
// A Map is not safe for concurrent use; its users hold a lock around it
// and compute what is missing outside the lock.
package genmap

// A Map holds at most twice entries keys, and twice weight of their
// weights.
type Map[K comparable, V any] struct {
	cur, old        map[K]V
	size            int // the weight of cur's entries
	entries, weight int
	weigh           func(K) int
}

// New returns an empty Map whose generations hold at most entries keys
// and, when weigh is not nil, keys of at most weight in all.
func New[K comparable, V any](entries, weight int, weigh func(K) int) *Map[K, V] {
	return &Map[K, V]{cur: map[K]V{}, entries: entries, weight: weight, weigh: weigh}
}

// Get returns the value of k, moving it from the older generation to the
// current one while that has room. A Get never drops the older
// generation: a set of keys in use that fills more than one generation
// (the records of a long document, asked for on every edit) would then
// push out the half it had not yet asked for, and each round of asking
// would miss most of them.
func (m *Map[K, V]) Get(k K) (V, bool) {
	if v, ok := m.cur[k]; ok {
		return v, true
	}
	v, ok := m.old[k]
	if ok && !m.full(m.weightOf(k)) {
		m.cur[k] = v
		m.size += m.weightOf(k)
	}
	return v, ok
}

// Put sets the value of k in the current generation; when that
// generation is full, it first becomes the older one.
func (m *Map[K, V]) Put(k K, v V) {
	if _, ok := m.cur[k]; ok {
		m.cur[k] = v
		return
	}
	m.put(k, v)
}

// put adds k, which the current generation lacks.
func (m *Map[K, V]) put(k K, v V) {
	w := m.weightOf(k)
	if m.full(w) {
		m.old, m.cur, m.size = m.cur, make(map[K]V, len(m.cur)), 0
	}
	m.cur[k] = v
	m.size += w
}

// full reports whether the current generation has no room for a key of
// weight w.
func (m *Map[K, V]) full(w int) bool {
	return len(m.cur) >= m.entries || m.weigh != nil && m.size+w > m.weight
}

func (m *Map[K, V]) weightOf(k K) int {
	if m.weigh == nil {
		return 0
	}
	return m.weigh(k)
}

// All calls f for each entry of both generations (an entry may come
// twice, once in each), until f returns false.
func (m *Map[K, V]) All(f func(K, V) bool) {
	for _, gen := range [2]map[K]V{m.cur, m.old} {
		for k, v := range gen {
			if !f(k, v) {
				return
			}
		}
	}
}

// Len returns the keys of the current generation and of the older one.
func (m *Map[K, V]) Len() (current, older int) { return len(m.cur), len(m.old) }

// Weight returns the weight of the current generation's keys.
func (m *Map[K, V]) Weight() int { return m.size }

package find

import (
	"sort"

	"stereoline/notation"
)

// A run says that nlen notation bytes starting at notation offset n were
// written as the host bytes [h, h+hlen). A plain run (atomic false) has
// nlen == hlen and maps byte for byte; an atomic run is one escape
// sequence (`\\` for one backslash, `""` for one quote, `\u00e9` for two
// UTF-8 bytes): every notation byte inside it maps to the whole escape.
type run struct {
	n, h, nlen, hlen int
	atomic           bool
}

// offsetMap maps notation offsets to host offsets and back. Runs are in
// notation order and cover the notation without gaps; host ranges are in
// the same order but may leave gaps (the quotes and blanks between two
// pieces of an implicitly concatenated literal, a line continuation).
//
// The zero map with runs == nil is the identity shifted by base over
// size bytes, which is what list records and most cells need; it costs
// no allocation on the hot path.
type offsetMap struct {
	base, size int
	runs       []run
}

// identityMap returns the map of notation written verbatim at host
// offset base.
func identityMap(base, size int) offsetMap { return offsetMap{base: base, size: size} }

// length returns the notation length the map covers.
func (m *offsetMap) length() int {
	if m.runs == nil {
		return m.size
	}
	last := m.runs[len(m.runs)-1]
	return last.n + last.nlen
}

// find returns the index of the run holding notation byte i (0 <= i < length).
func (m *offsetMap) find(i int) int {
	k := sort.Search(len(m.runs), func(k int) bool { return m.runs[k].n+m.runs[k].nlen > i })
	if k == len(m.runs) {
		k--
	}
	return k
}

// byteRange returns the host bytes notation byte i was written as.
func (m *offsetMap) byteRange(i int) (start, end int) {
	if m.runs == nil {
		return m.base + i, m.base + i + 1
	}
	r := m.runs[m.find(i)]
	if r.atomic {
		return r.h, r.h + r.hlen
	}
	return r.h + i - r.n, r.h + i - r.n + 1
}

// hostStart returns the host offset of the first byte of the map.
func (m *offsetMap) hostStart() int {
	if m.runs == nil {
		return m.base
	}
	return m.runs[0].h
}

// hostEnd returns the host offset just after the last byte of the map.
func (m *offsetMap) hostEnd() int {
	if m.runs == nil {
		return m.base + m.size
	}
	last := m.runs[len(m.runs)-1]
	return last.h + last.hlen
}

// host maps a notation offset, clamped to [0, length], to a host offset:
// the first host byte of notation byte i, or the end of the last host
// byte when i is the length.
func (m *offsetMap) host(i int) int {
	n := m.length()
	switch {
	case i <= 0:
		return m.hostStart()
	case i >= n:
		return m.hostEnd()
	}
	s, _ := m.byteRange(i)
	return s
}

// span maps a notation span to the host bytes it was written as. An
// empty span maps to an empty span at its host position.
func (m *offsetMap) span(s notation.Span) notation.Span {
	n := m.length()
	start, end := s.Start, s.End
	if start < 0 {
		start = 0
	}
	if end > n {
		end = n
	}
	if end <= start {
		h := m.host(start)
		return notation.Span{Start: h, End: h}
	}
	hs, _ := m.byteRange(start)
	_, he := m.byteRange(end - 1)
	return notation.Span{Start: hs, End: he}
}

// notationOffset maps a host offset back to the notation byte written
// there; the end of the map maps to the notation length. Host bytes
// outside the map, or in a gap between pieces, report false.
func (m *offsetMap) notationOffset(h int) (int, bool) {
	if m.runs == nil {
		if h < m.base || h > m.base+m.size {
			return 0, false
		}
		return h - m.base, true
	}
	if h == m.hostEnd() {
		return m.length(), true
	}
	k := sort.Search(len(m.runs), func(k int) bool { return m.runs[k].h+m.runs[k].hlen > h })
	if k == len(m.runs) || h < m.runs[k].h {
		return 0, false
	}
	r := m.runs[k]
	if r.atomic {
		return r.n, true
	}
	return r.n + h - r.h, true
}

// slice returns the map of the notation bytes [from, to), renumbered from 0.
func (m *offsetMap) slice(from, to int) offsetMap {
	if m.runs == nil {
		return identityMap(m.base+from, to-from)
	}
	var b mapBuilder
	for i := from; i < to; i++ {
		s, e := m.byteRange(i)
		b.addByte(s, e)
	}
	return b.done(m.host(from))
}

// compose returns the map from notation offsets through inner (notation
// to an intermediate text) and then outer (that text to the host file),
// as for a Python string in a notebook cell stored as a JSON string.
func compose(inner, outer offsetMap) offsetMap {
	n := inner.length()
	if inner.runs == nil && outer.runs == nil {
		return identityMap(outer.base+inner.base, n)
	}
	var b mapBuilder
	for i := 0; i < n; i++ {
		s, e := inner.byteRange(i)
		hs, _ := outer.byteRange(s)
		_, he := outer.byteRange(e - 1)
		b.addByte(hs, he)
	}
	return b.done(outer.host(inner.hostStart()))
}

// mapBuilder assembles a map run by run while a decoder walks a host
// string. It merges neighbouring plain runs so that a long literal
// without escapes is a single run.
type mapBuilder struct {
	runs []run
	n    int
}

// copy records l notation bytes written verbatim at host offset h.
func (b *mapBuilder) copy(h, l int) {
	if l <= 0 {
		return
	}
	if k := len(b.runs) - 1; k >= 0 {
		r := &b.runs[k]
		if !r.atomic && r.h+r.hlen == h {
			r.nlen += l
			r.hlen += l
			b.n += l
			return
		}
	}
	b.runs = append(b.runs, run{n: b.n, h: h, nlen: l, hlen: l})
	b.n += l
}

// escape records nlen notation bytes written as the escape sequence at
// host bytes [h, h+hlen).
func (b *mapBuilder) escape(nlen, h, hlen int) {
	if nlen <= 0 {
		return
	}
	if nlen == hlen {
		// Same length both sides: map byte for byte, which keeps the
		// inverse exact.
		b.copy(h, nlen)
		return
	}
	b.runs = append(b.runs, run{n: b.n, h: h, nlen: nlen, hlen: hlen, atomic: true})
	b.n += nlen
}

// addByte records one notation byte written as host bytes [s, e).
func (b *mapBuilder) addByte(s, e int) {
	if e-s == 1 {
		b.copy(s, 1)
		return
	}
	if k := len(b.runs) - 1; k >= 0 {
		r := &b.runs[k]
		if r.atomic && r.h == s && r.h+r.hlen == e {
			r.nlen++
			b.n++
			return
		}
	}
	b.runs = append(b.runs, run{n: b.n, h: s, nlen: 1, hlen: e - s, atomic: true})
	b.n++
}

// done returns the finished map. An empty notation maps to an empty span
// at host offset at.
func (b *mapBuilder) done(at int) offsetMap {
	if len(b.runs) == 0 {
		return identityMap(at, 0)
	}
	if len(b.runs) == 1 && !b.runs[0].atomic {
		return identityMap(b.runs[0].h, b.runs[0].nlen)
	}
	return offsetMap{runs: b.runs}
}

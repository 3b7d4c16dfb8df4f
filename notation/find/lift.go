package find

// lift moves occurrences found in an inner text (a notebook cell, a code
// block of a Markdown file) to the host file holding that text: outer
// maps inner offsets to host offsets. encode rewrites a fix's replacement
// text for the host (JSON string escapes for a notebook); fixes whose
// span crosses a seam of the outer map (two JSON strings of a cell's
// source list) are dropped, as no single replacement can express them.
func lift(occs []Occurrence, outer offsetMap, encode func(string) string) {
	for i := range occs {
		o := &occs[i]
		o.m = compose(o.m, outer)
		o.Span = outer.span(o.Span)
		if encode != nil {
			inner := o.encode
			o.encode = func(s string) string {
				if inner != nil {
					s = inner(s)
				}
				return encode(s)
			}
		}
		for k, e := range o.Diagnostics {
			e.Span = outer.span(e.Span)
			var kept []Fix
			for _, f := range o.Fixes[k] {
				if !outer.seamless(f.Span.Start, f.Span.End) {
					continue
				}
				f.Span = outer.span(f.Span)
				if encode != nil {
					f.NewText = encode(f.NewText)
				}
				kept = append(kept, f)
			}
			o.Fixes[k] = kept
		}
	}
}

// seamless reports whether the notation bytes [from, to) map to one
// unbroken stretch of host bytes.
func (m *offsetMap) seamless(from, to int) bool {
	if m.runs == nil || to-from <= 1 {
		return true
	}
	prevEnd := -1
	for i := from; i < to; i++ {
		s, e := m.byteRange(i)
		if prevEnd >= 0 && s != prevEnd && !(s < prevEnd) {
			return false
		}
		prevEnd = e
	}
	return true
}

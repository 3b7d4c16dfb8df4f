package notation

// Span is a half-open range of byte offsets [Start, End) into the text a
// value was read from. It is the only position type in notation/ and
// stereo/; conversion to lines, columns or editor positions happens at the
// edges (the command line and the language server).
type Span struct {
	Start, End int
}

// Len returns the number of bytes the span covers.
func (s Span) Len() int { return s.End - s.Start }

// Contains reports whether offset off lies inside the span. An empty span
// contains its start, so a cursor on a zero-width mark still finds it.
func (s Span) Contains(off int) bool {
	if s.Start == s.End {
		return off == s.Start
	}
	return off >= s.Start && off < s.End
}

// Overlaps reports whether two spans share at least one byte, or whether
// an empty span sits inside the other.
func (s Span) Overlaps(t Span) bool {
	if s.Start == s.End || t.Start == t.End {
		return t.Contains(s.Start) || s.Contains(t.Start)
	}
	return s.Start < t.End && t.Start < s.End
}

// Shift returns the span moved by delta bytes.
func (s Span) Shift(delta int) Span { return Span{s.Start + delta, s.End + delta} }

// Union returns the smallest span covering both.
func (s Span) Union(t Span) Span {
	if t.Start < s.Start {
		s.Start = t.Start
	}
	if t.End > s.End {
		s.End = t.End
	}
	return s
}

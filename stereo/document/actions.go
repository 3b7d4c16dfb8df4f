package document

import "stereoline/notation"

// Code action kinds. Rewrites live under refactor.rewrite so editors list
// them with other rewrites; the stereo part is our own.
const (
	KindQuickFix = "quickfix"
	KindMirror   = "refactor.rewrite.stereo.mirror"
	KindInvert   = "refactor.rewrite.stereo.invert"
	KindFlip     = "refactor.rewrite.stereo.flip"
	KindSet      = "refactor.rewrite.stereo.set"
	// Rewrites of stereo groups: a group made absolute, centres put
	// into an or group (relative) or an and group (racemic).
	KindAbsolute = "refactor.rewrite.stereo.absolute"
	KindRelative = "refactor.rewrite.stereo.relative"
	KindRacemic  = "refactor.rewrite.stereo.racemic"
)

// Action is a code action: a titled set of host edits.
type Action struct {
	Title string
	Kind  string
	Edits []Edit
	// Diagnostic is the index in Result.Diagnostics() the action fixes, or
	// -1 for rewrites.
	Diagnostic int
}

// Actions returns the quick fixes of the diagnostics that touch span and
// the rewrites available for the records inside it (or at it, for an
// empty span: the cursor).
func (r *Result) Actions(span notation.Span) []Action {
	var out []Action
	i := 0
	for _, part := range r.DiagnosticParts() {
		for k := range part {
			d := &part[k]
			if d.Span.Overlaps(span) || span.Len() == 0 && span.Start == d.Span.End {
				for _, f := range d.Fixes {
					out = append(out, Action{Title: f.Title, Kind: KindQuickFix, Edits: f.Edits, Diagnostic: i + k})
				}
			}
		}
		i += len(part)
	}
	out = append(out, r.rewrites(span)...)
	return out
}

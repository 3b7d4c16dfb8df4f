package document

import "stereoline/notation"

// fixesFor returns the quick fixes of a stereo finding on record i.
func (r *Result) fixesFor(i int, e *notation.Error) []Fix { return nil }

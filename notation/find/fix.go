package find

import "stereoline/notation"

// CodeHostEscape is the code of a host problem: a backslash of the
// notation that the host language reads as an escape, so the program does
// not see the text as written (or the file does not compile).
//
// It lives here rather than in the reader's list because the reader never
// reports it; the checker and the language server merge both lists.
const CodeHostEscape notation.Code = "host-escape"

// Fix is a suggested edit for a host problem: replace the host bytes of
// Span with NewText. Spans are host offsets, like the diagnostic's.
type Fix struct {
	Title   string // short lowercase imperative: "make it a raw string"
	Span    notation.Span
	NewText string
}

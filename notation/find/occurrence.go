package find

import (
	"strings"

	"stereoline/notation"
)

// Construct is the kind of host construct an occurrence was found in.
type Construct uint8

// Constructs.
const (
	ConstructListRecord    Construct = iota + 1 // a line of a record list (or of a smiles fence or block)
	ConstructTableCell                          // a CSV or TSV cell
	ConstructStringLiteral                      // a string literal in source code
	ConstructInlineCode                         // a Markdown inline code span
	ConstructFencedRecord                       // a line of a Markdown fenced block tagged smiles
	ConstructJSONValue                          // a JSON string value
	ConstructYAMLValue                          // a YAML scalar
)

var constructNames = [...]string{
	ConstructListRecord:    "list record",
	ConstructTableCell:     "table cell",
	ConstructStringLiteral: "string literal",
	ConstructInlineCode:    "inline code",
	ConstructFencedRecord:  "fenced record",
	ConstructJSONValue:     "json value",
	ConstructYAMLValue:     "yaml value",
}

// String returns a short lowercase description ("string literal").
func (c Construct) String() string {
	if int(c) < len(constructNames) && constructNames[c] != "" {
		return constructNames[c]
	}
	return "unknown"
}

// Reason says why the finder took a piece of text as notation.
type Reason uint8

// Reasons.
const (
	// ReasonPlace: the place itself holds notation (a list record, a
	// cell of a structure column, a line of a smiles fence).
	ReasonPlace Reason = iota + 1
	// ReasonName: a variable, key, argument or function name mentions
	// the notation.
	ReasonName
	// ReasonGuess: nothing names it, but it reads without error and
	// carries marks or rings no ordinary word has.
	ReasonGuess
	// ReasonPragma: a "stereoline: notation" comment says so.
	ReasonPragma
)

// String returns the lowercase name of the reason ("guess").
func (r Reason) String() string {
	switch r {
	case ReasonPlace:
		return "place"
	case ReasonName:
		return "name"
	case ReasonGuess:
		return "guess"
	case ReasonPragma:
		return "pragma"
	}
	return "unknown"
}

// Occurrence is one record of notation found in a host file.
//
// Text is what the reader analyses. Offsets into Text (the spans of the
// molecule read from it) are notation offsets; HostOffset, HostSpan and
// NotationOffset convert them to and from byte offsets into the host file
// content passed to Find. Nothing else should do that arithmetic: escapes
// make the two differ and only the occurrence knows how.
type Occurrence struct {
	// Text is the notation as written in the host. Escapes the host
	// resolves harmlessly are resolved (`\\` in a Python string is one
	// backslash); a backslash the host would eat is kept as written (the
	// Python literal "C1CC\1" gives the text C1CC\1), with a host-escape
	// entry in Diagnostics.
	Text string

	// Title is the text after the record on its line (lists and smiles
	// fences) or from a name or title column (tables); often empty.
	Title string

	// Span is the host bytes the text covers: a literal's content without
	// its quotes and prefix, a cell without its quotes, a record without
	// its title.
	Span notation.Span

	// Kind is the host kind the text was found in: the cell language for
	// a notebook code cell, KindMarkdown for a markdown cell.
	Kind Kind

	// Construct is the host construct holding the text.
	Construct Construct

	// Reason says why the text was taken.
	Reason Reason

	// Dialect says what the text is written in: notation (SMILES and
	// reaction SMILES, the zero value) or a query pattern (SMARTS and
	// reaction SMARTS), which is read with notation/smarts and never
	// checked as notation. It comes from the place (MolFromSmarts(...),
	// a name saying smarts or pattern) or from the content (query
	// primitives such as ;, &, !, ~, $( or #6 in brackets).
	Dialect Dialect

	// Cell is the 1-based index of the notebook cell holding the text,
	// 0 outside notebooks.
	Cell int

	// Field tells apart the records of different fields of one table
	// or dataset, which are related only to records of their own field
	// (a product is no duplicate of another row's reactant, a canonical
	// form none of the isomeric one beside it): the 1-based column of a
	// table, a hash of the key of a JSON value (FieldOfKey); 0 elsewhere.
	Field uint32

	// Diagnostics are host problems, with spans in host offsets: escapes
	// the host eats (CodeHostEscape) and, on the first record of a list
	// whose layout was unclear, CodeListLayout. Fixes[i] are the
	// suggested fixes of Diagnostics[i] (possibly none).
	Diagnostics notation.ErrorList
	Fixes       [][]Fix

	m offsetMap
	// group ties a string literal to the literals it must agree with
	// (code.go, agree).
	group groupMark
	// encode writes notation text as the host must hold it (a backslash
	// doubled inside an escaping string literal); nil writes it verbatim.
	encode func(string) string
}

// FieldOfKey is the Field of the values of a JSON key: a hash of the
// key, never 0.
func FieldOfKey(key string) uint32 {
	h := uint32(2166136261) // FNV-1a
	for i := 0; i < len(key); i++ {
		h ^= uint32(key[i])
		h *= 16777619
	}
	return h | 1<<31
}

// Encode returns notation text as it must be written at this occurrence
// for the host to read it back unchanged: in an escaping string literal
// or a JSON value a backslash is doubled, in a notebook both layers apply,
// in a list record or a raw string nothing changes. Rewrites use it for
// the text they insert.
func (o *Occurrence) Encode(s string) string {
	if o.encode == nil {
		return s
	}
	return o.encode(s)
}

// doubleBackslashes is the encoding of string literals whose escapes
// start with a backslash (Python, JavaScript, Go, Java, Kotlin, Rust,
// Julia and R non-raw strings; YAML double-quoted scalars).
func doubleBackslashes(s string) string { return strings.ReplaceAll(s, `\`, `\\`) }

// HostOffset maps a notation offset (0 to len(Text)) to a host byte
// offset: the first host byte of that notation byte, or the end of the
// occurrence for len(Text). Offsets outside the text are clamped.
func (o *Occurrence) HostOffset(notationOffset int) int { return o.m.host(notationOffset) }

// HostSpan maps a span of the notation (an atom, a bond mark) to the host
// bytes it was written as. A span ending inside an escape extends to the
// end of the escape, so `\\` in a Python string is underlined whole.
func (o *Occurrence) HostSpan(s notation.Span) notation.Span { return o.m.span(s) }

// NotationOffset maps a host offset (a cursor) back to a notation offset.
// It reports false when the host offset is outside the occurrence or
// between two pieces of it (the quotes joining implicitly concatenated
// literals). The end of the occurrence maps to len(Text).
func (o *Occurrence) NotationOffset(hostOffset int) (int, bool) {
	return o.m.notationOffset(hostOffset)
}

// addDiag appends a host problem with its fixes.
func (o *Occurrence) addDiag(e *notation.Error, fixes []Fix) {
	o.Diagnostics = append(o.Diagnostics, e)
	o.Fixes = append(o.Fixes, fixes)
}

package notation

import (
	"fmt"
	"sort"
)

// Code is a stable, machine-readable name for a kind of problem. Codes are
// part of the public interface: configuration files, SARIF rules and editor
// settings refer to them, so a code is never renamed once released.
type Code string

// Codes reported by the reader.
const (
	CodeSyntax           Code = "syntax"              // a character the grammar does not allow here
	CodeUnclosedRing     Code = "unclosed-ring"       // a ring-closure digit that is never closed
	CodeRingBondMismatch Code = "ring-bond-mismatch"  // the two ends of a ring closure name different bonds
	CodeRingDuplicate    Code = "ring-duplicate-bond" // a ring closure between atoms already bonded
	CodeRingSelf         Code = "ring-self-bond"      // a ring closure that returns to the same atom
	CodeUnknownElement   Code = "unknown-element"     // a bracket symbol that names no element
	CodeValence          Code = "valence"             // more bonds than the element allows
	CodeKekulize         Code = "kekulize"            // aromatic atoms that cannot be given a Kekulé structure
	CodeBadAromatic      Code = "aromatic-element"    // lowercase symbol for an element that has no aromatic form
	CodeBadChirality     Code = "chirality-class"     // a chirality class number outside its range
	CodeEmpty            Code = "empty"               // a record or component with no atoms
	CodeReaction         Code = "reaction"            // a malformed reaction arrow structure
	CodeEncoding         Code = "encoding"            // bytes that are not valid UTF-8 or are control characters

	// Codes of the CXSMILES extension block (extension_read.go).
	CodeExtensionUnclosed Code = "extension-unclosed" // an extension block without its closing '|'
	CodeExtensionField    Code = "extension-field"    // a field of the block that does not follow its syntax
	CodeExtensionIndex    Code = "extension-index"    // an atom, bond or component index beyond the record
	CodeGroupOverlap      Code = "group-overlap"      // an atom listed in two stereo groups, or twice in one
	CodeExtensionKept     Code = "extension-kept"     // fields kept as written but not interpreted (information)
	// CodeRingAfterBranch is a warning: ring-closure digits written after
	// a branch, outside the OpenSMILES grammar (branched_atom ::= atom
	// ringbond* branch*) but accepted by widely used readers.
	CodeRingAfterBranch Code = "ring-after-branch"
	// CodeBranchWithoutAtom is a warning: a branch that holds ring-closure
	// digits but no atom, "C(1)CC1", outside the OpenSMILES grammar
	// (branch ::= '(' chain ')'); readers part on it.
	CodeBranchWithoutAtom Code = "branch-without-atom"
)

// Severity orders diagnostics from most to least urgent. The zero value is
// SeverityError so that an error is never silently downgraded.
type Severity int

// Severities, in the order the editor protocol numbers them.
const (
	SeverityError Severity = iota
	SeverityWarning
	SeverityInformation
	SeverityHint
)

// String returns the lowercase name used in JSON and text output.
func (s Severity) String() string {
	switch s {
	case SeverityError:
		return "error"
	case SeverityWarning:
		return "warning"
	case SeverityInformation:
		return "information"
	case SeverityHint:
		return "hint"
	}
	return fmt.Sprintf("severity(%d)", int(s))
}

// ParseSeverity reads the name String returns.
func ParseSeverity(s string) (Severity, bool) {
	switch s {
	case "error":
		return SeverityError, true
	case "warning":
		return SeverityWarning, true
	case "information", "info":
		return SeverityInformation, true
	case "hint":
		return SeverityHint, true
	}
	return 0, false
}

// Error is one problem found in a text: where it is, what kind it is and a
// short lowercase message saying what was expected and what was found.
type Error struct {
	Span     Span
	Code     Code
	Severity Severity
	Msg      string
	// Related points at other places that explain this one (the other
	// end of a ring closure, the conflicting mark).
	Related []Related
}

// Related is a secondary location attached to an Error.
type Related struct {
	Span Span
	Msg  string
}

func (e *Error) Error() string {
	return fmt.Sprintf("%d-%d: %s [%s]", e.Span.Start, e.Span.End, e.Msg, e.Code)
}

// ErrorList collects errors. Its zero value is an empty list ready to use.
type ErrorList []*Error

// Add appends an error of severity error.
func (l *ErrorList) Add(span Span, code Code, format string, args ...any) *Error {
	e := &Error{Span: span, Code: code, Severity: SeverityError, Msg: fmt.Sprintf(format, args...)}
	*l = append(*l, e)
	return e
}

// Sort orders the list by position, then by code, keeping equal entries in
// the order they were added.
func (l ErrorList) Sort() {
	sort.SliceStable(l, func(i, j int) bool {
		a, b := l[i], l[j]
		if a.Span.Start != b.Span.Start {
			return a.Span.Start < b.Span.Start
		}
		if a.Span.End != b.Span.End {
			return a.Span.End < b.Span.End
		}
		return a.Code < b.Code
	})
}

// HasErrors reports whether any entry has severity error.
func (l ErrorList) HasErrors() bool {
	for _, e := range l {
		if e.Severity == SeverityError {
			return true
		}
	}
	return false
}

// Err returns the list as an error, or nil when it holds no entry of
// severity error.
func (l ErrorList) Err() error {
	if !l.HasErrors() {
		return nil
	}
	return l
}

func (l ErrorList) Error() string {
	switch len(l) {
	case 0:
		return "no errors"
	case 1:
		return l[0].Error()
	}
	return fmt.Sprintf("%s (and %d more errors)", l[0].Error(), len(l)-1)
}

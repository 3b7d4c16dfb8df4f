// Package transform rewrites stereo marks as text edits: the enantiomer,
// an epimer, the other isomer of a double bond, a unit set to a
// descriptor, the marks that mean nothing removed, a one-sided double
// bond completed. Only mark bytes change, and brackets where a mark is
// added to or removed from an atom written without them; atom order,
// ring numbers, spacing and everything around the notation stay byte for
// byte. Nothing is changed in place: apply the edits with
// notation.ApplyEdits.
//
// A transform finds its units with stereo.Analyze, checks its result by
// labelling the rewritten text again, and reads the configurations the
// marks write through identity.Configurations.
package transform

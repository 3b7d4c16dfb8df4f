// This file implements the diagnostic codes of the stereo engine.

package stereo

import "stereoline/notation"

// Diagnostic codes reported by the stereo engine. Like the reader's codes
// they are part of the public interface and never renamed.
const (
	CodeIneffectiveCenter notation.Code = "stereo-ineffective-center" // a tetrahedral or extended mark on a unit that is not stereogenic
	CodeImpossibleCenter  notation.Code = "stereo-impossible-center"  // a mark that cannot apply to its atom
	CodeOneSidedBond      notation.Code = "stereo-one-sided-bond"     // only one end of a double bond is marked
	CodeIneffectiveBond   notation.Code = "stereo-ineffective-bond"   // direction marks that specify nothing
	CodeConflictingMarks  notation.Code = "stereo-conflicting-marks"  // direction marks that contradict each other
	CodeStrainedRing      notation.Code = "stereo-strained-ring"      // a trans double bond in a ring too small to hold one (ringgeom.MinTransRing)
	CodeInvertingNitrogen notation.Code = "stereo-inverting-nitrogen" // a mark on a nitrogen that inverts quickly
	CodeUndefined         notation.Code = "stereo-undefined"          // a stereogenic unit left unmarked
	CodeUndetermined      notation.Code = "stereo-undetermined"       // the labeller hit its node cap
	CodeBudget            notation.Code = "stereo-over-budget"        // the record's analysis took longer than its time budget
	CodeReaderDependent   notation.Code = "stereo-reader-dependent"   // a mark general-purpose readers read differently (portable.go)

	// Stereo groups of the extension block (groups.go).
	CodeGroupIneffectiveMember notation.Code = "stereo-group-ineffective-member" // a listed atom that is no marked chiral centre
	CodeGroupOneCenter         notation.Code = "stereo-group-one-center"         // an or or and group of one centre: its mark's direction means nothing
	CodeGroupAcrossComponents  notation.Code = "stereo-group-across-components"  // an or or and group over separate components
	CodeGroupRepeatedTag       notation.Code = "stereo-group-repeated-tag"       // two fields with one or or and tag
)

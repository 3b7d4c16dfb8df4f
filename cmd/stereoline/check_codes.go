package main

import (
	"stereoline/notation"
	"stereoline/notation/find"
	"stereoline/notation/smarts"
	"stereoline/stereo"
	"stereoline/stereo/document"
	"stereoline/stereo/identity"
	"stereoline/stereo/reaction"
	"stereoline/stereo/transform"
)

// codeDoc documents one diagnostic code: what the SARIF rules and the
// README's catalogue say about it. Every code the
// project declares must have one (TestCatalogueCoversEveryCode).
type codeDoc struct {
	Code  notation.Code
	Short string // one line
	Full  string // what it means and why it matters
	Help  string // what to do
	// Example is a host file that gives rise to the code.
	Example codeExample
	// Origin says where the code comes from: the reader, the stereo
	// engine, the finder, or the rewriting functions (whose codes are
	// returned to the caller of a rewrite and never appear in a check).
	Origin string
}

// codeExample is a small host file that gives rise to a code.
type codeExample struct {
	File string // host file name; its extension picks the host kind
	Text string
	// Shown is how the README prints the example when Text holds
	// something unprintable; empty means Text.
	Shown string
	// NotShown says why the example cannot be checked by running the
	// engine on it (the code needs a pathological input or is not a
	// diagnostic); empty means the catalogue test runs it.
	NotShown string
}

// display is the example as the README prints it.
func (e codeExample) display() string {
	if e.Shown != "" {
		return e.Shown
	}
	return e.Text
}

const (
	originReader  = "reader"
	originStereo  = "stereo"
	originFinder  = "finder"
	originRewrite = "rewrite"
	originList    = "list"
	originMap     = "reaction"
	originQuery   = "query"
)

// codeCatalogue lists every diagnostic code, grouped by origin, in the
// order the README presents them.
var codeCatalogue = []codeDoc{
	// The reader (notation/errors.go), rules of the OpenSMILES
	// specification.
	{
		Code: notation.CodeSyntax, Origin: originReader,
		Short:   "A character the notation grammar does not allow here.",
		Full:    "The record does not follow the OpenSMILES grammar at this point: an unclosed branch, a bond symbol with no atom after it, a stray character. The reader keeps going and reports what it can, but the structure read is a guess.",
		Help:    "Correct the notation at the marked character; a missing ')' or a doubled bond symbol is the usual cause.",
		Example: codeExample{File: "example.smi", Text: "C(C\n"},
	},
	{
		Code: notation.CodeUnclosedRing, Origin: originReader,
		Short:   "A ring-closure digit that is never closed.",
		Full:    "A ring-closure number opens a bond that a later atom with the same number must close. This one has no partner, so a ring bond is missing and the molecule read has too few bonds.",
		Help:    "Add the closing digit on the atom that completes the ring, or remove the digit if there is no ring.",
		Example: codeExample{File: "example.smi", Text: "C1CC\n"},
	},
	{
		Code: notation.CodeRingBondMismatch, Origin: originReader,
		Short:   "The two ends of a ring closure name different bonds.",
		Full:    "OpenSMILES allows a bond symbol on either end of a ring closure, or the same symbol on both; two different symbols (such as '=' and '-') contradict each other and the bond order is a guess.",
		Help:    "Write the bond symbol on one end only, or the same symbol on both.",
		Example: codeExample{File: "example.smi", Text: "C=1CCC-1\n"},
	},
	{
		Code: notation.CodeRingDuplicate, Origin: originReader,
		Short:   "A ring closure between atoms that are already bonded.",
		Full:    "Two atoms can share one bond only; a ring closure between neighbours would make a second bond between them, which the notation cannot express.",
		Help:    "Remove the ring-closure digits, or write a double bond with '=' if a multiple bond was meant.",
		Example: codeExample{File: "example.smi", Text: "C1C1\n"},
	},
	{
		Code: notation.CodeRingSelf, Origin: originReader,
		Short:   "A ring closure that returns to the same atom.",
		Full:    "The same atom opens and closes a ring-closure number, which would bond the atom to itself.",
		Help:    "Move the closing digit to the atom that completes the ring.",
		Example: codeExample{File: "example.smi", Text: "C11\n"},
	},
	{
		Code: notation.CodeUnknownElement, Origin: originReader,
		Short:   "A symbol that names no element.",
		Full:    "Inside brackets any element symbol may appear; outside, only the organic subset (B C N O P S F Cl Br I and their aromatic forms). This symbol is neither, so the atom is unknown.",
		Help:    "Check the spelling and capitalisation of the element symbol (Cl, not CL), and bracket elements outside the organic subset.",
		Example: codeExample{File: "example.smi", Text: "[Xy]\n"},
	},
	{
		Code: notation.CodeValence, Origin: originReader,
		Short:   "More bonds than the element allows.",
		Full:    "The atom has more bonds than any normal valence of its element, counting bond orders and explicit hydrogens. The notation is most likely missing a charge or has a bond too many.",
		Help:    "Check the bonds to the atom; write a charge in brackets ([N+]) if the atom is charged.",
		Example: codeExample{File: "example.smi", Text: "C(C)(C)(C)(C)C\n"},
	},
	{
		Code: notation.CodeKekulize, Origin: originReader,
		Short:   "Aromatic atoms that cannot be given a Kekulé structure.",
		Full:    "Lowercase atoms must be placed in alternating single and double bonds. For these atoms no such assignment exists (an odd ring, a pyrrole-type nitrogen written without its hydrogen, an aromatic atom outside a ring), so bond orders and hydrogen counts are unknown.",
		Help:    "Write the hydrogen on a pyrrole-type nitrogen ([nH]), fix the ring size, or write the ring in Kekulé form with explicit double bonds.",
		Example: codeExample{File: "example.smi", Text: "c1cccc1\n"},
	},
	{
		Code: notation.CodeBadAromatic, Origin: originReader,
		Short:   "A lowercase symbol for an element that has no aromatic form.",
		Full:    "Only b, c, n, o, p, s, se, as and te may be written in lowercase (OpenSMILES); any other lowercase symbol is an error.",
		Help:    "Write the element in its normal capitalisation.",
		Example: codeExample{File: "example.smi", Text: "c1ccccc1[cl]\n"},
	},
	{
		Code: notation.CodeBadChirality, Origin: originReader,
		Short:   "A chirality class number outside its range.",
		Full:    "Each chirality class has a fixed number of permutations: @TH1-@TH2, @AL1-@AL2, @SP1-@SP3, @TB1-@TB20, @OH1-@OH30. A number outside that range names no configuration.",
		Help:    "Use a permutation number in range, or the plain @ and @@ for a tetrahedral centre.",
		Example: codeExample{File: "example.smi", Text: "[C@TH3](F)(Cl)(Br)I\n"},
	},
	{
		Code: notation.CodeEmpty, Origin: originReader,
		Short:   "A record or component with no atoms.",
		Full:    "Two dots in a row, a dot at the start or end, or an empty reaction role leaves a component without atoms.",
		Help:    "Remove the extra '.' or fill in the missing component.",
		Example: codeExample{File: "example.smi", Text: "C..C\n"},
	},
	{
		Code: notation.CodeReaction, Origin: originReader,
		Short:   "A malformed reaction arrow.",
		Full:    "A reaction has exactly two '>' separating reactants, agents and products; more or fewer leave the roles unclear.",
		Help:    "Write reactants>agents>products, or reactants>>products without agents.",
		Example: codeExample{File: "example.rsmi", Text: "CC>>>C\n"},
	},
	{
		Code: notation.CodeEncoding, Origin: originReader,
		Short:   "Bytes that are not valid UTF-8, or control characters.",
		Full:    "The notation holds a control character or bytes that are not UTF-8. This usually comes from a copy and paste or from an escape in a host language that turned a backslash sequence into a control character.",
		Help:    "Delete the invisible character, or fix the escape in the host file (see host-escape).",
		Example: codeExample{File: "example.smi", Text: "C\x01C\n", Shown: "C<U+0001>C (a control character between the two atoms)"},
	},
	// The reader's CXSMILES extension block (notation/extension_read.go);
	// the field syntax as the RDKit documentation gives it and RDKit
	// 2022.09.3 reads it.
	{
		Code: notation.CodeExtensionUnclosed, Origin: originReader,
		Short:   "An extension block without its closing '|'.",
		Full:    "A CXSMILES extension block (stereo groups, coordinates, labels) starts with '|' after the notation and a blank, and ends with '|'. Without the closing bar nobody can tell where the block ends and the title begins, so the block reaches to the end of the line; the general-purpose libraries reject such a record.",
		Help:    "Add the closing '|' after the last field, before the title.",
		Example: codeExample{File: "example.cxsmi", Text: "C[C@H](O)CC |&1:1 LRK-BB-001\n"},
	},
	{
		Code: notation.CodeExtensionField, Origin: originReader,
		Short:   "A field of the extension block that does not follow its syntax.",
		Full:    "A field of a known kind (a stereo group, coordinates, atom labels, radicals, link nodes, S-groups, ...) holds something its syntax does not allow: a ';' between atom indices, a letter among coordinates, a missing ')'. What follows the fault in that field is not read; a library may read less or reject the record.",
		Help:    "Write the field as the extension syntax asks: atom indices separated by ',', coordinates as x,y,z triples separated by ';'.",
		Example: codeExample{File: "example.cxsmi", Text: "C[C@H](O)[C@@H](C)Cl |o1:1;3|\n"},
	},
	{
		Code: notation.CodeExtensionIndex, Origin: originReader,
		Short:   "An atom, bond or component index beyond the record.",
		Full:    "Indices in the extension block count the atoms (bonds, components) of the whole record from 0, over every component and every part of a reaction, in the order they are written. This index names an atom the record does not have, often because the block was copied from another writing of the structure or the record was shortened.",
		Help:    "Renumber the index to the atom meant (the first atom is 0), or remove it.",
		Example: codeExample{File: "example.cxsmi", Text: "C[C@H](O)CC |&1:5|\n"},
	},
	{
		Code: notation.CodeGroupOverlap, Origin: originReader,
		Short:   "An atom in two stereo groups, or twice in one.",
		Full:    "Each marked centre belongs to at most one stereo group (absolute a, or o1, o2, ..., and &1, &2, ...): the group says how its configuration is known. An atom listed in two groups has two contradicting meanings; the libraries read such blocks differently.",
		Help:    "Keep the atom in the one group that describes what is known, and remove it from the other.",
		Example: codeExample{File: "example.cxsmi", Text: "C[C@H](O)[C@@H](C)Cl |o1:1,3,&1:3|\n"},
	},
	{
		Code: notation.CodeExtensionKept, Origin: originReader,
		Short:   "Fields of the extension block that are kept but not interpreted.",
		Full:    "Stereoline reads the stereo groups of an extension block; every other field (coordinates, atom labels and values, radicals, ring double-bond configurations, wedge hints, S-groups, link nodes, ...) is read for its extent, kept as written and renumbered when a rewrite moves atoms, but has no effect on labels or checks. This information says which fields those are.",
		Help:    "Nothing to do; it says what the checks do not take into account.",
		Example: codeExample{File: "example.cxsmi", Text: "C[C@H](O)CC |(0,0,;1,0,;1,1,;2,0,;3,0,),&1:1|\n"},
	},
	{
		Code: notation.CodeRingAfterBranch, Origin: originReader,
		Short:   "Ring-closure digits written after a branch (a warning).",
		Full:    "OpenSMILES writes an atom's ring-closure digits right after the atom, before its branches (branched_atom ::= atom ringbond* branch*). Widely used readers also accept a digit after a branch and bond it to the atom the branch hangs from, in the order written; Stereoline reads it the same way, so the structure is the one those readers see. Other readers may reject the record.",
		Help:    "Move the digit before the branch: c12ccccc1NC=CC2=O instead of c12ccccc1NC=CC(=O)2. Where a stereo mark sits on that atom, moving the digit changes the neighbour order, so rewrite the mark too, or let a writer produce the record.",
		Example: codeExample{File: "example.smi", Text: "c12ccccc1NC=CC(=O)2\n"},
	},
	{
		Code: notation.CodeBranchWithoutAtom, Origin: originReader,
		Short:   "A branch that holds ring-closure digits but no atom (a warning).",
		Full:    "In OpenSMILES a branch holds a chain of atoms (branch ::= '(' chain ')'); a branch of ring-closure digits alone, as in C(1)CC1, is outside the grammar, and readers part on it: some reject the record, others bond the digits to the atom before the branch. Stereoline reads it the second way and warns, since another reader may not read the record at all. A string that nobody names and that holds such a branch is not taken for notation.",
		Help:    "Write the digits right after the atom: C1CC1 instead of C(1)CC1. Where the atom carries a stereo mark, the digit's place sets the neighbour order, so check the mark, or let a writer produce the record.",
		Example: codeExample{File: "example.smi", Text: "C(1)CC1\n"},
	},
	// The stereo engine (stereo/codes.go).
	{
		Code: stereo.CodeIneffectiveCenter, Origin: originStereo,
		Short:   "A stereo mark on an atom or allene that is not stereogenic.",
		Full:    "The mark '@' or '@@' sits on a unit whose ligands are not all different, so swapping it changes nothing: both writings are the same compound. Often it points to a wrong substituent rather than a superfluous mark. A bridgehead of a small bicycle whose two equal bridges carry no configuration (norbornane) is fixed by its cage and gets this code too. A ring atom that is stereogenic only together with another (1,4-disubstituted rings, exocyclic double bonds) does not: when its partner is unmarked, the partner is reported as stereo-undefined instead.",
		Help:    "Check the substituents of the marked atom; if they are right, remove the mark.",
		Example: codeExample{File: "example.smi", Text: "F[C@H](F)Cl\n"},
	},
	{
		Code: stereo.CodeImpossibleCenter, Origin: originStereo,
		Short:   "A stereo mark that cannot apply to its atom.",
		Full:    "A tetrahedral mark needs an atom with three or four neighbours (counting an implicit hydrogen) and no double bond that makes it planar; this atom is not such an atom, so the mark has no meaning. The code is also given when the marks at the two bridgeheads of a small bicycle would put one bridgehead substituent inside the cage, or fuse two small rings trans (bicyclo[2.2.0]hexane and smaller), which no such molecule can do.",
		Help:    "Move the mark to the intended stereocentre, or remove it.",
		Example: codeExample{File: "example.smi", Text: "C[C@H]=CC\n"},
	},
	{
		Code: stereo.CodeOneSidedBond, Origin: originStereo,
		Short:   "Only one end of a double bond is marked.",
		Full:    "A configuration of a double bond needs a direction mark ('/' or '\\') on a substituent at each end. With one end marked the configuration is open, which is rarely what the author meant.",
		Help:    "Mark a substituent at the other end too: C/C=C/C is E (trans), C/C=C\\C is Z (cis).",
		Example: codeExample{File: "example.smi", Text: "C/C=CC\n"},
	},
	{
		Code: stereo.CodeIneffectiveBond, Origin: originStereo,
		Short:   "Direction marks that specify nothing.",
		Full:    "The direction marks lie next to no stereogenic double bond: one end carries two equal ligands, the double bond sits in a small ring where only cis is possible, or there is no double bond at all.",
		Help:    "Remove the marks, or check whether a substituent is wrong.",
		Example: codeExample{File: "example.smi", Text: "F/C(/F)=C/C\n"},
	},
	{
		Code: stereo.CodeConflictingMarks, Origin: originStereo,
		Short:   "Direction marks that contradict each other.",
		Full:    "Two marks on the same end of a double bond put both substituents on the same side. No configuration satisfies them. (The same mark on both digits of one ring closure is read by the reading setting and reported as stereo-reader-dependent.)",
		Help:    "Keep one mark per end, or make the marks agree: F/C(/Cl)=C/Br puts F and Cl on opposite sides.",
		Example: codeExample{File: "example.smi", Text: "F/C(\\Cl)=C/Br\n"},
	},
	{
		Code: stereo.CodeStrainedRing, Origin: originStereo,
		Short:   "A trans double bond in a ring of fewer than 8 atoms.",
		Full:    "A trans (E) double bond needs a ring of at least eight atoms; in a smaller ring it cannot exist as a stable compound, so the marks are almost certainly flipped.",
		Help:    "Flip one direction mark to make the ring bond cis, or check the ring size.",
		Example: codeExample{File: "example.smi", Text: "C1CCC/C=C/1\n"},
	},
	{
		Code: stereo.CodeInvertingNitrogen, Origin: originStereo,
		Short:   "A stereo mark on a nitrogen that inverts quickly.",
		Full:    "An amine nitrogen with three different substituents inverts through its planar form many times a second at room temperature, so its two configurations interconvert and the mark does not describe a separable compound. Bridgehead, aziridine and quaternary nitrogens keep their configuration and are not flagged.",
		Help:    "Remove the mark unless the nitrogen is held by a ring or a charge.",
		Example: codeExample{File: "example.smi", Text: "C[N@](CC)CCC\n"},
	},
	{
		Code: stereo.CodeUndefined, Origin: originStereo,
		Short:   "A stereogenic unit left unmarked.",
		Full:    "The atom or double bond is stereogenic but carries no mark, so the record stands for any of its stereoisomers (or a mixture). In a record that marks other units this is often an oversight; its severity is lower when nothing in the record is marked. Units stereogenic only together (the ring carbons of a 1,4-disubstituted cyclohexane, a ring carbon and an exocyclic double bond), units made stereogenic by the configurations around them (pseudoasymmetric centres and double bonds) and the bridgehead nitrogens of small bicycles are reported too.",
		Help:    "Add the mark if the configuration is known; leave it open on purpose for racemates and unknown configurations.",
		Example: codeExample{File: "example.smi", Text: "C/C=C/C(O)CC\n"},
	},
	{
		Code: stereo.CodeUndetermined, Origin: originStereo,
		Short: "The labeller hit its limit before ranking the ligands.",
		Full:  "Ranking by the Cahn-Ingold-Prelog rules explores the molecule outwards from the stereocentre; for very large or highly symmetric structures the exploration is cut off at a node cap (the limits.digraphNodes setting or --digraph-nodes, 200,000 nodes by default) so that the check stays fast, and the descriptor is left open.",
		Help:  "Check this centre with another tool or by hand; the mark itself may be fine.",
		Example: codeExample{File: "example.smi", Text: "C[C@H](CCCCCCCCCCCO)CCCCCCCCCCCN\n",
			NotShown: "needs a molecule large enough to reach the node cap; this one only shows the shape of such a centre, two branches that differ far from it"},
	},
	{
		Code: stereo.CodeBudget, Origin: originStereo,
		Short: "The record took longer than its time budget.",
		Full:  "Each record may take a limited time to read and analyse (the limits.recordTime setting or --record-time; 500 ms by default, which keeps the answer for one record within a second; past its first half the budget counts the processor time of the work, so a busy machine does not cut a record short), so that a pathological record (thousands of marked centres on a chain, large fused ring systems marked everywhere) cannot hold up a check or an editor. When the budget is spent the analysis stops: the marked units not yet labelled are left undetermined and listed as related places (the first twenty), and unmarked stereogenic units are not all looked for. The finding stands on the first mark left undetermined, or on the first atom when only the search for unmarked units was cut short. A record with more atoms than limits.recordAtoms (or --record-atoms, 200,000 by default) is not read at all; the finding on its first atom says how many atoms it has.",
		Help:  "Raise limits.recordTime for this file if the record is meant to be checked in full; otherwise the record can stay as it is.",
		Example: codeExample{File: "example.smi", Text: "[C@H](F)[C@H](F)[C@H](F)[C@H](F)\n",
			NotShown: "needs a record that takes longer than the budget, such as this unit repeated 50,000 times"},
	},
	{
		Code: stereo.CodeReaderDependent, Origin: originStereo,
		Short:   "A stereo mark that general-purpose readers read differently.",
		Full:    "OpenSMILES does not say where the lone pair of a stereocentre without hydrogen (a sulfoxide, sulfinamide, phosphine, selenoxide, sulfonium ion, aziridine or bridgehead nitrogen) stands in its neighbour order. RDKit 2022.09.3 and @rdkit/rdkit 2026.09.1 put it last and, on a centre with only single bonds, turn the reading once more for each ring-closure digit on the centre; Open Babel 3.1.1 puts it where a hydrogen would stand. The two readings give opposite configurations when the centre starts its record or dot-separated part, or carries an odd number of ring-closure digits and only single bonds, but not both. The same direction mark on both digits of one ring closure contradicts itself when each is read from its own atom: the RDKit releases let the closing digit decide, Open Babel drops the pair. The message says what the mark means under the reading setting and under the other. '@' on an allene, which OpenSMILES defines and every library surveyed drops, is reported with severity information.",
		Help:    "Rewrite the record with the quick fix or 'stereoline transform --portable': it starts the record at a neighbour of the centre and writes no ring-closure digit on it, or keeps one mark of the ring closure, so that every reader surveyed reads the meaning the record has under the reading setting. Set the reading (reading.lonePair, reading.ringMarks) to the one of the program that wrote the record.",
		Example: codeExample{File: "example.smi", Text: "[S@](=O)(C)c1ccccc1 LRK-BB-021\n"},
	},
	// Stereo groups of the extension block (stereo/groups.go,
	// stereo/identity/groups.go).
	{
		Code: stereo.CodeGroupIneffectiveMember, Origin: originStereo,
		Short:   "A stereo group lists an atom it can say nothing about.",
		Full:    "A stereo group (a:, o<n>:, &<n>: in the CXSMILES extension block) says how the configuration of its centres is known: absolute, one of two mirror-image forms (or), or their mixture (and). It can only speak of tetrahedral centres and allenes whose marks fix a configuration. This atom carries no mark, is not a stereocentre, is an end of a double bond (whose E/Z a mirror image keeps), or carries a square-planar, trigonal-bipyramidal or octahedral mark, which is read as absolute. General-purpose libraries drop such members silently.",
		Help:    "Remove the atom from the group, or mark the centre that was meant (atom indices in the block count from 0).",
		Example: codeExample{File: "example.cxsmi", Text: "CC(O)CC |o1:1|\n"},
	},
	{
		Code: stereo.CodeGroupOneCenter, Origin: originStereo,
		Short:   "An or or and stereo group that holds one centre (a hint).",
		Full:    "With one centre an or group means one configuration, unknown which (for the record's only stereocentre: one enantiomer, unknown which), and an and group both configurations mixed (the racemate). The direction of that centre's mark then means nothing: C[C@H](O)CC |&1:1| and C[C@@H](O)CC |&1:1| are one racemate.",
		Help:    "Nothing to do if that is meant; the hint says what the group states in plain words.",
		Example: codeExample{File: "example.cxsmi", Text: "C[C@H](O)CC |&1:1|\n"},
	},
	{
		Code: stereo.CodeGroupAcrossComponents, Origin: originStereo,
		Short:   "An or or and stereo group ties centres of separate components.",
		Full:    "The centres of one group invert together, as general-purpose libraries read them. Over separate components (a salt, a mixture written as one record) that states a relative configuration between separate molecules, which only one salt or complex taken as a whole can have; usually each component's configuration is known on its own, and each needs a group of its own.",
		Help:    "Give each component its own group (the quick fix numbers them), unless one diastereomeric salt of unknown absolute configuration is meant.",
		Example: codeExample{File: "example.cxsmi", Text: "C[C@H](O)CC.C[C@H](N)CC |o1:1,6|\n"},
	},
	{
		Code: stereo.CodeGroupRepeatedTag, Origin: originStereo,
		Short:   "Two fields of the extension block with one or or and tag.",
		Full:    "Two fields tagged o1 (or &1) are two groups to RDKit 2022.09.3, each inverting on its own, and one group to a reader that merges them; the record then stands for different sets of stereoisomers in different programs. Stereoline reads two groups, as RDKit does.",
		Help:    "Number the second group on its own (the quick fix does), or join the two fields into one group if the centres invert together.",
		Example: codeExample{File: "example.cxsmi", Text: "C[C@H](O)[C@@H](C)Cl |o1:1,o1:3|\n"},
	},
	{
		Code: identity.CodeGroupAddsNothing, Origin: originStereo,
		Short:   "An or or and stereo group whose mirror image is the structure itself.",
		Full:    "Inverting every centre of the group gives the same structure: the centres make a meso form (cis-cyclohexane-1,2-diol), or they are not chiral together. One enantiomer, unknown which, or the racemate of such a structure is the structure itself, so the group adds nothing and the record is the one compound its marks write.",
		Help:    "Remove the group (the quick fix does), or check the marks if another diastereomer was meant.",
		Example: codeExample{File: "example.cxsmi", Text: "O[C@H]1CCCC[C@H]1O |o1:1,6|\n"},
	},
	// Relations between the records of one list (stereo/document).
	{
		Code: document.CodeListDuplicate, Origin: originList,
		Short:   "The same structure as an earlier record of the list.",
		Full:    "Two records of one list describe the same compound, stereo included, though they may be written differently. A duplicate inflates counts and, when the two titles differ, usually means one of them was meant to be something else.",
		Help:    "Remove one record, or fix the marks of the one that was meant to be another isomer.",
		Example: codeExample{File: "example.smi", Text: "N[C@@H](C)C(=O)O A-1\nOC(=O)[C@H](C)N A-2\n"},
	},
	{
		Code: document.CodeListEnantiomer, Origin: originList,
		Short:   "The mirror image of an earlier record.",
		Full:    "The record is the enantiomer of an earlier one: every stereocentre is inverted. Lists often hold both enantiomers on purpose; when they do not, one flipped mark is the usual cause.",
		Help:    "Keep both if both are meant; otherwise invert the marks of the wrong one.",
		Example: codeExample{File: "example.smi", Text: "N[C@@H](C)C(=O)O A-1\nN[C@H](C)C(=O)O A-2\n"},
	},
	{
		Code: document.CodeListStereoisomer, Origin: originList,
		Short:   "Another configuration of an earlier record's constitution.",
		Full:    "The record has the same constitution as an earlier one but a different configuration at the units named, or leaves some of them unmarked: a diastereomer, an E/Z isomer, or a less specified writing of the same compound.",
		Help:    "Check that the units named are meant to differ.",
		Example: codeExample{File: "example.smi", Text: "C/C=C/C A-1\nC/C=C\\C A-2\n", Shown: "C/C=C/C A-1\nC/C=C\\C A-2\n"},
	},
	{
		Code: document.CodeListAbsoluteOfRelative, Origin: originList,
		Short:   "One stereoisomer of the relative configuration an earlier record gives (or the other way round).",
		Full:    "One record gives an absolute configuration, the other the same relative configuration only (an or stereo group: one enantiomer, unknown which). The absolute record is one of the compounds the relative one may be; listed together, they may be one compound registered twice, before and after its absolute configuration was known.",
		Help:    "Keep both if both are meant; otherwise keep the record that says what is known.",
		Example: codeExample{File: "example.cxsmi", Text: "C[C@H](O)[C@@H](C)Cl |o1:1,3| A-1\nC[C@H](O)[C@@H](C)Cl A-2\n"},
	},
	{
		Code: document.CodeListAbsoluteOfMixture, Origin: originList,
		Short:   "One stereoisomer of a mixture an earlier record gives: a racemate and one of its enantiomers.",
		Full:    "One record is a mixture (an and stereo group: the racemate, when its two forms are enantiomers), the other one of the stereoisomers in it. A racemate listed beside one of its enantiomers is common and often meant; the message names which enantiomer.",
		Help:    "Keep both if both are meant; check the marks if the record was meant to be the other enantiomer.",
		Example: codeExample{File: "example.cxsmi", Text: "C[C@H](O)CC |&1:1| A-1\nC[C@@H](O)CC A-2\n"},
	},
	{
		Code: document.CodeListRelativeAndMixture, Origin: originList,
		Short:   "The same stereoisomers as an earlier record, as one of them rather than their mixture.",
		Full:    "Both records stand for the same stereoisomers: one says the compound is one of them, unknown which (an or group), the other that it is their mixture (an and group). The first is one enantiomer of the second when the two forms are enantiomers.",
		Help:    "Check which was meant: a resolved compound of unknown absolute configuration, or the racemate.",
		Example: codeExample{File: "example.cxsmi", Text: "C[C@H](O)CC |o1:1| A-1\nC[C@H](O)CC |&1:1| A-2\n"},
	},
	// Atom-mapped reactions (stereo/reaction).
	{
		Code: reaction.CodeMapDuplicate, Origin: originMap,
		Short:   "An atom-map number used twice on one side of a reaction.",
		Full:    "Each atom-map number pairs one reactant atom with one product atom. Used twice on one side, the pairing is ambiguous and the stereo of the atoms involved cannot be followed across the arrow.",
		Help:    "Give each mapped atom its own number on each side.",
		Example: codeExample{File: "example.rsmi", Text: "[CH3:1][OH:2]>>[CH3:1][OH:1]\n"},
	},
	{
		Code: reaction.CodeMapUnpaired, Origin: originMap,
		Short:   "A product atom whose map number no reactant atom carries.",
		Full:    "The product atom claims to come from a reactant atom that does not exist, so its origin, and what happened to its configuration, cannot be followed.",
		Help:    "Fix the number, or remove it if the atom is not mapped.",
		Example: codeExample{File: "example.rsmi", Text: "[CH3:1][OH:2]>>[CH3:1][OH:3]\n"},
	},
	{
		Code: reaction.CodeStereoLost, Origin: originMap,
		Short:   "A mapped unit specified in the reactants is unspecified in the products.",
		Full:    "The reactant side fixes the configuration of a mapped stereocentre or double bond, the product side leaves it open. Either the reaction destroys the configuration (then say so) or a mark was dropped when the product was written.",
		Help:    "Add the mark to the product, or remove it from the reactant if the configuration is really lost.",
		Example: codeExample{File: "example.rsmi", Text: "[CH3:1][C@H:2]([OH:3])[CH2:4][CH3:5]>>[CH3:1][CH:2]([OH:3])[CH2:4][CH3:5]\n"},
	},
	// The finder (notation/find).
	{
		Code: find.CodeHostEscape, Origin: originFinder,
		Short:   "The host language turns a backslash of the notation into something else.",
		Full:    "In a Python, JavaScript or other string literal, a backslash starts an escape: '\\1' is the control character U+0001 (an octal escape), not a direction mark and a ring digit. The program reads different notation from what the file shows.",
		Help:    "Write a raw string (r\"...\" in Python) or double the backslash.",
		Example: codeExample{File: "example.py", Text: "smiles = \"F/C=C\\1CCCCC1\"\n"},
	},
	{
		Code: find.CodeListLayout, Origin: originFinder,
		Short:   "The layout of a record list was not clear (information).",
		Full:    "A record list may hold the notation in any field: first or last, after an index, between tabs, commas or semicolons, under a header. Stereoline reads the layout of each list from its content: the field that reads as notation while the others do not. When two fields read as notation (a pattern column beside an example column, or names that spell structures) it reads the earlier one; when a field reads as notation on only some lines it reads those lines only; either way it says so once for the file, at its first record. The code also reports a layout pragma it could not read.",
		Help:    "Fix the layout with a comment line such as '# stereoline: layout field=2 sep=tab header' in the file, or with the layouts setting of .stereoline.json for a file pattern.",
		Example: codeExample{File: "example.smi", Text: "CCO CCN\nCCC CCCl\nCO CN\n"},
	},
	// The SMARTS reader (notation/smarts/codes.go): query patterns are
	// checked for their grammar only.
	{
		Code: smarts.CodeSyntax, Origin: originQuery,
		Short:   "A character the SMARTS grammar does not allow here.",
		Full:    "The query pattern does not follow the SMARTS grammar at this point: an operator with nothing after it, an unclosed bracket, branch or recursive pattern, a map number that is not last in its bracket. General-purpose libraries reject such a pattern, so the filter or template that holds it does nothing.",
		Help:    "Correct the pattern at the marked character; a trailing ',' or ';' or a missing ']' is the usual cause.",
		Example: codeExample{File: "example.py", Text: "patt = Chem.MolFromSmarts(\"[C;]\")\n"},
	},
	{
		Code: smarts.CodeUnclosedRing, Origin: originQuery,
		Short:   "A ring-closure digit of a pattern that is never closed.",
		Full:    "A ring-closure number in a query pattern opens a ring bond that a later atom must close; this one has no partner, so the pattern is rejected by general-purpose libraries.",
		Help:    "Add the closing digit, or remove the digit if there is no ring.",
		Example: codeExample{File: "example.py", Text: "patt = Chem.MolFromSmarts(\"[#6]1CC\")\n"},
	},
	{
		Code: smarts.CodeRingBond, Origin: originQuery,
		Short:   "A ring closure of a pattern back to the same atom or to a neighbour.",
		Full:    "A ring-closure digit in a query pattern joins two atoms that are already bonded, or an atom to itself; general-purpose libraries reject the pattern.",
		Help:    "Check the ring digits; one of them probably belongs to another atom.",
		Example: codeExample{File: "example.py", Text: "patt = Chem.MolFromSmarts(\"C12CC12\")\n"},
	},
	{
		Code: smarts.CodeUnknownElement, Origin: originQuery,
		Short:   "A letter in an atom expression that is no element or primitive.",
		Full:    "Inside the brackets of a query pattern every letter must start an element symbol or a primitive (D, H, h, R, r, v, X, x, a, A and the like); this one starts neither.",
		Help:    "Check the spelling of the element; lowercase symbols are the aromatic forms.",
		Example: codeExample{File: "example.py", Text: "patt = Chem.MolFromSmarts(\"[Xy]\")\n"},
	},
	{
		Code: smarts.CodeReaction, Origin: originQuery,
		Short:   "A reaction pattern with one '>' or more than two.",
		Full:    "A reaction query pattern has reactants, agents and products separated by two '>' (often '>>'); with one or three the parts cannot be told apart.",
		Help:    "Write '>>' between reactants and products.",
		Example: codeExample{File: "example.py", Text: "rxn = AllChem.ReactionFromSmarts(\"[C:1]=[O:2]>[C:1][O:2]\")\n"},
	},
	// The rewriting functions (notation/edit.go): returned by rewrites,
	// never by a check.
	{
		Code: notation.CodeEditOverlap, Origin: originRewrite,
		Short:   "Two edits of a rewrite touch the same text.",
		Full:    "A rewrite was asked to make two changes that overlap or insert at the same place, so their order would be a guess. Nothing is changed.",
		Help:    "Ask for one change at a time at that place.",
		Example: codeExample{File: "example.smi", Text: "C[C@H](O)CC\n", NotShown: "returned by a rewrite that changes the same '@' twice, not by a check"},
	},
	{
		Code: notation.CodeEditRange, Origin: originRewrite,
		Short:   "An edit outside the text.",
		Full:    "A rewrite was given a place beyond the end of the text or a range that ends before it starts, usually because the text changed since the place was computed.",
		Help:    "Check the file again and retry the rewrite on the current text.",
		Example: codeExample{File: "example.smi", Text: "CCO\n", NotShown: "returned by a rewrite asked to change offset 10 of a 3-character record, not by a check"},
	},
	{
		Code: notation.CodeEditUnsupported, Origin: originRewrite,
		Short:   "The requested change cannot be written at this place.",
		Full:    "The rewrite cannot express the change in the notation as written there, for example a mark the host escapes would corrupt.",
		Help:    "Make the change by hand, or rewrite the whole record.",
		Example: codeExample{File: "example.smi", Text: "CC=CC\n", NotShown: "returned by a rewrite, not by a check"},
	},
	{
		Code: transform.CodeNoUnit, Origin: originRewrite,
		Short:   "The atom or bond named is no stereogenic unit.",
		Full:    "A rewrite was asked to invert, flip or set a unit at an atom that has no configuration to change.",
		Help:    "Name the atom of a stereocentre or an end of a stereogenic double bond (atom numbers as in describe).",
		Example: codeExample{File: "example.smi", Text: "CCO\n", NotShown: "returned by a rewrite asked to invert atom 1 of ethanol, not by a check"},
	},
	{
		Code: transform.CodeNotSpecified, Origin: originRewrite,
		Short:   "The unit has no configuration to invert or flip.",
		Full:    "Inverting or flipping needs a configuration to start from; this unit is unmarked.",
		Help:    "Set the unit to a descriptor instead.",
		Example: codeExample{File: "example.smi", Text: "CC(O)CC\n", NotShown: "returned by a rewrite asked to invert an unmarked centre, not by a check"},
	},
	{
		Code: transform.CodeBadDescriptor, Origin: originRewrite,
		Short:   "The descriptor does not fit the unit.",
		Full:    "A tetrahedral centre takes R or S, a double bond E or Z, an allene M or P; a pseudoasymmetric centre takes only r or s, which setting cannot choose.",
		Help:    "Ask for a descriptor of the unit's kind.",
		Example: codeExample{File: "example.smi", Text: "C[C@H](O)CC\n", NotShown: "returned by a rewrite asked to set a stereocentre to E, not by a check"},
	},
	{
		Code: transform.CodeNoGroup, Origin: originRewrite,
		Short:   "The stereo group named is not in the record, or cannot be rewritten so.",
		Full:    "A rewrite of stereo groups (make a group absolute, split a group) names a group the record's extension block does not hold, one that is absolute already, or one that lies in one component.",
		Help:    "Name a group as the block writes it (o1, &2); describe lists them.",
		Example: codeExample{File: "example.cxsmi", Text: "C[C@H](O)CC\n", NotShown: "returned by a rewrite asked to make group o1 of a record without groups absolute, not by a check"},
	},
	{
		Code: transform.CodeNotVerified, Origin: originRewrite,
		Short:   "The rewritten text does not read as intended.",
		Full:    "After a rewrite the result is read and labelled again; this time the label or the structure did not come out as asked, so the rewrite is refused rather than written.",
		Help:    "Make the change by hand and check it with describe.",
		Example: codeExample{File: "example.smi", Text: "C[C@H](O)CC\n", NotShown: "returned by a rewrite whose result fails its own check, not by a check"},
	},
}

// lookupCode returns the documentation of a code.
func lookupCode(c notation.Code) (codeDoc, bool) {
	for _, d := range codeCatalogue {
		if d.Code == c {
			return d, true
		}
	}
	return codeDoc{}, false
}

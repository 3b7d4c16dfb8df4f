package main

import (
	"encoding/json"
	"fmt"
	"io"

	"stereoline/notation"
	"stereoline/stereo"
	"stereoline/stereo/document"
	"stereoline/stereo/identity"
)

// compareJSON is what 'compare --json' prints.
type compareJSON struct {
	Relation  string           `json:"relation"`
	Differing []differenceJSON `json:"differing"`
	// Description says the relation in words where stereo groups make
	// a record stand for several stereoisomers.
	Description string `json:"description,omitempty"`
}

// differenceJSON is one unit in which the two structures differ. Atoms
// are 1-based, in each structure's own numbering; a label is empty where
// that structure leaves the unit unspecified.
type differenceJSON struct {
	Kind   string `json:"kind"`
	AtomsA []int  `json:"atoms_a"`
	AtomsB []int  `json:"atoms_b"`
	A      string `json:"a"`
	B      string `json:"b"`
}

// compare implements 'stereoline compare A B [--json]': how two
// structures are related.
func compare(args []string, stdin io.Reader, stdout, stderr io.Writer) int {
	asJSON := false
	var rest []string
	for _, a := range args {
		switch a {
		case "--json", "-json":
			asJSON = true
		case "-h", "--help", "-help":
			fmt.Fprintln(stdout, "usage: stereoline compare A B [--json]\n\nSays whether two structures are identical, enantiomers, diastereomers\n(naming the units that differ), constitutional isomers or different.\nWith CXSMILES stereo groups a record stands for a set of stereoisomers,\nand three more relations say how the sets meet: absolute-of-relative,\nabsolute-of-mixture, relative-and-mixture.")
			return 0
		default:
			rest = append(rest, a)
		}
	}
	if len(rest) != 2 {
		fmt.Fprintln(stderr, "usage: stereoline compare A B [--json]")
		return 2
	}
	a, b := notation.Read(rest[0]), notation.Read(rest[1])
	for i, m := range []*notation.Molecule{a, b} {
		for _, e := range m.Errors {
			if e.Severity == notation.SeverityError {
				fmt.Fprintf(stderr, "stereoline compare: %s: %d: %s [%s]\n", rest[i], e.Span.Start+1, e.Msg, e.Code)
				return 1
			}
		}
	}
	c := identity.Compare(a, b)
	anA, anB := stereo.Analyze(a), stereo.Analyze(b)
	out := compareJSON{Relation: c.Relation.String(), Differing: []differenceJSON{}, Description: describeRelation(c, a, b, anA, anB)}
	for _, d := range c.Differing {
		out.Differing = append(out.Differing, differenceJSON{Kind: d.Kind.String(), AtomsA: oneBased(d.Atoms), AtomsB: oneBased(d.OtherAtoms),
			A: labelOf(anA, d.Atoms), B: labelOf(anB, d.OtherAtoms)})
	}
	if asJSON {
		bs, err := json.Marshal(out)
		if err != nil {
			fmt.Fprintf(stderr, "stereoline compare: %v\n", err)
			return 3
		}
		fmt.Fprintln(stdout, string(bs))
		return 0
	}
	fmt.Fprintln(stdout, out.Relation)
	if out.Description != "" {
		fmt.Fprintf(stdout, "  %s\n", out.Description)
	}
	for _, d := range out.Differing {
		fmt.Fprintf(stdout, "  %s at %s: %s in A, %s in B\n", d.Kind, atomList(d.AtomsA, d.AtomsB), orUnspecified(d.A), orUnspecified(d.B))
	}
	return 0
}

// describeRelation says in words how two records are related when
// stereo groups make one of them stand for several stereoisomers; "" for
// other pairs.
func describeRelation(c identity.Comparison, a, b *notation.Molecule, anA, anB *stereo.Analysis) string {
	ia, ib := identity.Identify(a), identity.Identify(b)
	name := func(id identity.Identity) string {
		switch {
		case id.Set == identity.Mixture && id.Pair():
			return "the racemate"
		case id.Set == identity.Mixture:
			return "a mixture of stereoisomers"
		case id.Set == identity.OneOf && id.Pair():
			return "one enantiomer, unknown which"
		case id.Set == identity.OneOf:
			return "one of several stereoisomers, unknown which"
		case id.Set == identity.OneOfMixtures:
			return "one of several mixtures, unknown which"
		}
		return "one stereoisomer"
	}
	switch c.Relation {
	case identity.Identical:
		if ia.Set != identity.OneStereoisomer {
			return fmt.Sprintf("both stand for the same %d stereoisomers, as %s", ia.Isomers(), name(ia))
		}
	case identity.AbsoluteOfRelative, identity.AbsoluteOfMixture:
		single, set, an, anSet := "A", "B", anA, anB
		setID := ib
		if c.Single == 1 {
			single, set, an, anSet, setID = "B", "A", anB, anA, ia
		}
		rel := ""
		for gi := range anSet.Groups {
			if d := anSet.GroupDescriptor(gi); d != "" && anSet.Groups[gi].Kind != notation.GroupAbsolute {
				rel += ", " + d
			}
		}
		labels := document.AbsoluteLabels(an)
		if c.Relation == identity.AbsoluteOfMixture && c.Pair {
			return fmt.Sprintf("%s is the %s enantiomer of the racemate %s%s", single, labels, set, rel)
		}
		if c.Pair {
			return fmt.Sprintf("%s is %s with the same relative configuration as %s%s: %s gives the absolute configuration, %s only the relative one", single, labels, set, rel, single, set)
		}
		return fmt.Sprintf("%s, %s, is one of the stereoisomers of %s, which stands for %s", single, labels, set, name(setID))
	case identity.RelativeAndMixture:
		return fmt.Sprintf("the same stereoisomers: A stands for %s, B for %s", name(ia), name(ib))
	}
	return ""
}

func oneBased(xs []int) []int {
	out := []int{}
	for _, x := range xs {
		out = append(out, x+1)
	}
	return out
}

// labelOf returns the CIP label of the specified unit on these atoms, or
// "" when the structure leaves it unspecified.
func labelOf(an *stereo.Analysis, atoms []int) string {
	if len(atoms) == 0 {
		return ""
	}
	for _, u := range an.Units {
		if !u.Specified {
			continue
		}
		if u.Centre == atoms[0] || (len(u.Atoms) == len(atoms) && len(atoms) == 2 && (u.Atoms[0] == atoms[0] && u.Atoms[1] == atoms[1] || u.Atoms[0] == atoms[1] && u.Atoms[1] == atoms[0])) {
			if l := u.Descriptor.String(); l != "" {
				return l
			}
			return "specified"
		}
	}
	return ""
}

func atomList(a, b []int) string {
	s := func(xs []int) string {
		out := ""
		for i, x := range xs {
			if i > 0 {
				out += "-"
			}
			out += fmt.Sprint(x)
		}
		return out
	}
	switch {
	case len(a) == 0:
		return "atom " + s(b) + " of B"
	case len(b) == 0 || s(a) == s(b):
		return "atom " + s(a)
	}
	return "atom " + s(a) + " (" + s(b) + " in B)"
}

func orUnspecified(s string) string {
	if s == "" {
		return "unspecified"
	}
	return s
}

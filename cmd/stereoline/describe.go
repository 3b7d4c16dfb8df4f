package main

import (
	"bufio"
	"flag"
	"fmt"
	"io"
	"strings"
	"text/tabwriter"

	"stereoline/notation"
	"stereoline/stereo"
	"stereoline/stereo/identity"
	"stereoline/stereo/reaction"
)

// describe implements 'stereoline describe'.
func describe(args []string, stdin io.Reader, stdout, stderr io.Writer) int {
	fs := flag.NewFlagSet("describe", flag.ContinueOnError)
	fs.SetOutput(stderr)
	asJSON := fs.Bool("json", false, "print one JSON object per record, one per line")
	var rf readingFlags
	rf.add(fs)
	fs.Usage = func() {
		fmt.Fprintln(stderr, "usage: stereoline describe [--json] [--lone-pair RULE] [--ring-marks RULE] [FILE...]\n\nReads records (one notation per line, a title may follow after whitespace)\nfrom the files, or from standard input when none is named; in a table, source\ncode, Markdown, JSON, YAML or a notebook, the notation check finds there.")
		fs.PrintDefaults()
	}
	if err := fs.Parse(args); err != nil {
		return 2
	}
	reading, err := rf.reading()
	if err != nil {
		fmt.Fprintf(stderr, "stereoline describe: %v\n", err)
		return 2
	}
	out := bufio.NewWriterSize(stdout, outputBuffer)
	defer out.Flush()
	failed := false
	// The collector keeps its default pace: a record's storage is reused
	// for the next (describeRecordInto), so little is collected, and a
	// heap four times larger cost more in fresh pages than the rarer
	// collections saved (a 6,000-record list timed as a whole process:
	// processor time 0.87 of it at the default).
	var buf []byte
	var d recordJSON
	var rr notation.Rereader
	status := eachRecord(fs.Args(), stdin, stderr, func(name string, n int, rec notation.Record) {
		if trimmed := strings.TrimSpace(rec.Line); trimmed == "" || strings.HasPrefix(trimmed, "#") {
			return
		}
		describeRecordInto(&d, &rr, rec, reading)
		if !*asJSON {
			writeTable(out, d)
			return
		}
		var err error
		buf, err = appendRecordJSON(buf[:0], &d)
		if err != nil {
			fmt.Fprintf(stderr, "%s:%d: %v\n", name, n, err)
			failed = true
			return
		}
		buf = append(buf, '\n')
		out.Write(buf)
	})
	if failed && status == 0 {
		status = 1
	}
	return status
}

// recordJSON is the object describe --json prints for one record. Later
// fields are added at the end; consumers must ignore fields they do not
// know.
type recordJSON struct {
	Input string     `json:"input"`
	Name  string     `json:"name"`
	Atoms []atomJSON `json:"atoms"`
	Bonds []bondJSON `json:"bonds"`
	recordTailJSON
}

// groupJSON is one stereo group of the extension block. Descriptor is the
// group's relative or racemic descriptor ("rel-(2R,4S)", "rac-(2R,4S)")
// over the centres the engine reads in it, Starred its other form
// ("(2R*,4S*)", "(2RS,4SR)"); both empty when no member is labelled.
type groupJSON struct {
	Kind       string `json:"kind"`
	Number     int    `json:"number"`
	Atoms      []int  `json:"atoms"`
	Descriptor string `json:"descriptor,omitempty"`
	Starred    string `json:"starred,omitempty"`
}

// unitGroupJSON is the group of one unit: its kind (absolute for a
// specified chiral unit in no group), number (0 for absolute) and
// descriptor in the group's frame (R*, SR).
type unitGroupJSON struct {
	Kind   string `json:"kind"`
	Number int    `json:"number"`
	CIP    string `json:"cip,omitempty"`
}

// unitJSON is one perceived stereogenic unit. Atom numbers are 1-based.
type unitJSON struct {
	Kind      string       `json:"kind"`
	Atoms     []int        `json:"atoms"`
	Specified bool         `json:"specified"`
	CIP       string       `json:"cip,omitempty"`
	Ranked    []ligandJSON `json:"ranked"`
	// Group is set for specified tetrahedral centres and allenes.
	Group *unitGroupJSON `json:"group,omitempty"`
}

// ligandJSON is a ranked ligand: the atom it begins at (null for an
// implicit hydrogen or lone pair) and, for double bonds and allenes, the
// terminal atom it hangs from.
type ligandJSON struct {
	Rank     int    `json:"rank"`
	Atom     *int   `json:"atom"`
	Implicit string `json:"implicit,omitempty"`
	On       int    `json:"on,omitempty"`
}

type atomJSON struct {
	N         int         `json:"n"`
	Symbol    string      `json:"symbol"`
	Charge    int         `json:"charge"`
	Hydrogens int         `json:"hydrogens"`
	Aromatic  bool        `json:"aromatic"`
	Map       int         `json:"map"`
	Isotope   int         `json:"isotope,omitempty"`
	Role      string      `json:"role,omitempty"`
	Span      [2]int      `json:"span"`
	Chirality *chiralJSON `json:"chirality,omitempty"`
}

type chiralJSON struct {
	Mark string `json:"mark"`
	Span [2]int `json:"span"`
}

type bondJSON struct {
	Ends  [2]int `json:"ends"`
	Order any    `json:"order"`
	Mark  string `json:"mark,omitempty"`
	Span  [2]int `json:"span"`
	Ring  bool   `json:"ring,omitempty"`
}

type diagnosticJSON struct {
	Code     string `json:"code"`
	Severity string `json:"severity"`
	Message  string `json:"message"`
	Span     [2]int `json:"span"`
}

// reactionJSON is the form `describe --json` prints as "reaction".
type reactionJSON struct {
	Centres []reactionCentreJSON `json:"centers"`
}

// reactionCentreJSON is one centre in reactionJSON. Atoms are 1-based as
// elsewhere in the command line's output.
type reactionCentreJSON struct {
	Map           int    `json:"map"`
	Change        string `json:"change"`
	ReactantAtom  int    `json:"reactant_atom"`
	ProductAtom   int    `json:"product_atom"`
	ReactantLabel string `json:"reactant_label,omitempty"`
	ProductLabel  string `json:"product_label,omitempty"`
	Note          string `json:"note,omitempty"`
}

// reactionToJSON returns a reaction's result in the form describe prints.
func reactionToJSON(r *reaction.Result) reactionJSON {
	out := reactionJSON{Centres: []reactionCentreJSON{}}
	for _, c := range r.Centres {
		out.Centres = append(out.Centres, reactionCentreJSON{Map: c.Map, Change: c.Change.String(), ReactantAtom: c.Reactant + 1,
			ProductAtom: c.Product + 1, ReactantLabel: c.ReactantLabel.String(), ProductLabel: c.ProductLabel.String(), Note: c.Note})
	}
	return out
}

func spanJSON(s notation.Span) [2]int { return [2]int{s.Start, s.End} }

func describeRecord(rec notation.Record, reading notation.Reading) recordJSON {
	var d recordJSON
	describeRecordInto(&d, new(notation.Rereader), rec, reading)
	return d
}

// describeRecordInto is describeRecord writing into d, whose atom, bond,
// diagnostic and unit slices it reuses: describe prints a record and
// forgets it, so one recordJSON, and one reader's storage (rr), serve
// the whole list.
func describeRecordInto(d *recordJSON, rr *notation.Rereader, rec notation.Record, reading notation.Reading) {
	m := rr.ReadWith(rec.Notation, reading)
	*d = recordJSON{Input: rec.Notation, Name: rec.Title,
		Atoms: reuse(d.Atoms, len(m.Atoms)), Bonds: reuse(d.Bonds, len(m.Bonds)),
		recordTailJSON: recordTailJSON{Diagnostics: reuse(d.Diagnostics, 0), Stereo: reuse(d.Stereo, 0)}}
	for i := range m.Atoms {
		a := &m.Atoms[i]
		aj := atomJSON{N: i + 1, Symbol: a.Symbol, Charge: a.Charge, Hydrogens: a.HydrogenCount(),
			Aromatic: a.Aromatic, Map: a.Map, Isotope: a.Isotope, Span: spanJSON(a.Span)}
		if m.Reaction {
			aj.Role = a.Role.String()
		}
		if a.Chirality.Class != notation.ChiralNone {
			aj.Chirality = &chiralJSON{Mark: m.Text[a.Chirality.Span.Start:a.Chirality.Span.End], Span: spanJSON(a.Chirality.Span)}
		}
		d.Atoms = append(d.Atoms, aj)
	}
	for i := range m.Bonds {
		b := &m.Bonds[i]
		bj := bondJSON{Ends: [2]int{b.Begin + 1, b.End + 1}, Span: spanJSON(b.Span), Ring: b.Ring}
		switch b.Order {
		case notation.OrderAromatic:
			bj.Order = "aromatic"
		case notation.OrderDouble:
			bj.Order = 2
		case notation.OrderTriple:
			bj.Order = 3
		case notation.OrderQuadruple:
			bj.Order = 4
		default:
			bj.Order = 1
		}
		if b.Written != 0 {
			bj.Mark = string(b.Written)
		}
		d.Bonds = append(d.Bonds, bj)
	}
	f := notation.MolecularFormula(m)
	d.Formula = f.String()
	d.Mass = round(f.AverageMass, 4)
	d.Mono = round(f.MonoisotopicMass, 6)
	// the engine's default record budget, as check has it: a hostile
	// record is described with its units left undetermined, not waited for
	an := stereo.AnalyzeWith(m, stereo.Options{Budget: stereo.DefaultBudget})
	diags := append(append(notation.ErrorList{}, m.Errors...), an.Diagnostics...)
	if !m.Reaction && !m.Errors.HasErrors() {
		diags = append(diags, identity.GroupFindings(m)...)
	}
	if m.Reaction {
		rr := reaction.AnalyzeWith(m, an)
		j := reactionToJSON(rr)
		d.Reaction = &j
		diags = append(diags, rr.Diagnostics...)
	}
	diags.Sort()
	for _, e := range diags {
		d.Diagnostics = append(d.Diagnostics, diagnosticJSON{Code: string(e.Code), Severity: e.Severity.String(), Message: e.Msg, Span: spanJSON(e.Span)})
	}
	for i := range an.Units {
		uj := unitToJSON(&an.Units[i])
		if u := &an.Units[i]; u.GroupKind != 0 {
			g := &unitGroupJSON{Kind: u.GroupKind.String(), CIP: u.GroupLabel()}
			if u.Group >= 0 {
				g.Number = an.Groups[u.Group].Number
			}
			uj.Group = g
		}
		d.Stereo = append(d.Stereo, uj)
	}
	d.Groups = groupsToJSON(m, an)
	d.Configuration = an.Configuration()
}

// reuse returns s emptied, with room for n elements, never nil (an empty
// list is printed [], not null).
func reuse[T any](s []T, n int) []T {
	if s == nil || cap(s) < n {
		return make([]T, 0, n)
	}
	return s[:0]
}

// groupsToJSON returns the stereo groups of the block with the
// descriptors the engine gives them.
func groupsToJSON(m *notation.Molecule, an *stereo.Analysis) []groupJSON {
	if m.Extension == nil {
		return nil
	}
	out := []groupJSON{}
	for bi := range m.Extension.Groups {
		sg := &m.Extension.Groups[bi]
		g := groupJSON{Kind: sg.Kind.String(), Number: sg.Number, Atoms: []int{}}
		for _, a := range sg.Atoms {
			g.Atoms = append(g.Atoms, a+1)
		}
		var desc, starred []string
		for gi := range an.Groups {
			if an.Groups[gi].Block == bi {
				if s := an.GroupDescriptor(gi); s != "" {
					desc, starred = append(desc, s), append(starred, an.GroupStarred(gi))
				}
			}
		}
		g.Descriptor, g.Starred = strings.Join(desc, " "), strings.Join(starred, " ")
		out = append(out, g)
	}
	return out
}

func unitToJSON(u *stereo.Unit) unitJSON {
	// one allocation for each list (every record of a list has units)
	j := unitJSON{Kind: u.Kind.String(), Specified: u.Specified, Ranked: make([]ligandJSON, 0, len(u.Ranked))}
	ints := make([]int, len(u.Atoms)+len(u.Ranked))
	numbers := ints[len(u.Atoms):] // the ligands' atom numbers
	if len(u.Atoms) > 0 {
		j.Atoms = ints[:len(u.Atoms):len(u.Atoms)]
		for k, a := range u.Atoms {
			j.Atoms[k] = a + 1
		}
	}
	if u.Specified && u.Descriptor.Labelled() {
		j.CIP = u.Descriptor.String()
	}
	for k, l := range u.Ranked {
		lj := ligandJSON{Rank: l.Rank}
		if l.Atom >= 0 {
			numbers[k] = l.Atom + 1
			lj.Atom = &numbers[k]
		} else if l.LonePair {
			lj.Implicit = "lone pair"
		} else {
			lj.Implicit = "H"
		}
		if len(u.Atoms) == 2 && u.Kind != stereo.KindTetrahedral && l.End >= 0 && l.End < 2 {
			lj.On = u.Atoms[l.End] + 1
		}
		j.Ranked = append(j.Ranked, lj)
	}
	return j
}

func round(x float64, places int) float64 {
	p := 1.0
	for i := 0; i < places; i++ {
		p *= 10
	}
	if x < 0 {
		return -float64(int64(-x*p+0.5)) / p
	}
	return float64(int64(x*p+0.5)) / p
}

// writeTable prints a record for people.
func writeTable(w io.Writer, d recordJSON) {
	title := d.Name
	if title == "" {
		title = "(untitled)"
	}
	fmt.Fprintf(w, "%s  %s\n", d.Input, title)
	fmt.Fprintf(w, "  formula %s, average mass %.4f, monoisotopic mass %.6f\n", d.Formula, d.Mass, d.Mono)
	tw := tabwriter.NewWriter(w, 2, 4, 2, ' ', 0)
	fmt.Fprintln(tw, "  atom\tsymbol\tcharge\tH\taromatic\tmap\tmark")
	for _, a := range d.Atoms {
		mark := ""
		if a.Chirality != nil {
			mark = a.Chirality.Mark
		}
		fmt.Fprintf(tw, "  %d\t%s\t%+d\t%d\t%v\t%d\t%s\n", a.N, a.Symbol, a.Charge, a.Hydrogens, a.Aromatic, a.Map, mark)
	}
	tw.Flush()
	for _, u := range d.Stereo {
		label := u.CIP
		if label == "" {
			label = "unspecified"
			if u.Specified {
				label = "undetermined"
			}
		}
		if g := u.Group; g != nil && g.Kind != "absolute" {
			label += fmt.Sprintf(" (%s in stereo group %s%d)", g.CIP, map[string]string{"or": "o", "and": "&"}[g.Kind], g.Number)
		}
		fmt.Fprintf(w, "  %s %v: %s\n", u.Kind, u.Atoms, label)
	}
	for _, g := range d.Groups {
		tag := map[string]string{"absolute": "a", "or": "o", "and": "&"}[g.Kind]
		if g.Kind != "absolute" {
			tag += fmt.Sprint(g.Number)
		}
		line := fmt.Sprintf("  stereo group %s %v", tag, g.Atoms)
		if g.Descriptor != "" {
			line += fmt.Sprintf(": %s, %s", g.Descriptor, g.Starred)
		}
		fmt.Fprintln(w, line)
	}
	if d.Configuration != "" && len(d.Groups) > 0 {
		fmt.Fprintf(w, "  configuration: %s\n", d.Configuration)
	}
	for _, e := range d.Diagnostics {
		fmt.Fprintf(w, "  %s: %s [%s] at bytes %d-%d\n", e.Severity, e.Message, e.Code, e.Span[0], e.Span[1])
	}
	fmt.Fprintln(w)
}

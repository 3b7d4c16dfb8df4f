package main

import (
	"bufio"
	"encoding/json"
	"flag"
	"fmt"
	"io"
	"strings"
	"text/tabwriter"

	"stereoline/notation"
	"stereoline/stereo"
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
		fmt.Fprintln(stderr, "usage: stereoline describe [--json] [--lone-pair RULE] [--ring-marks RULE] [FILE...]\n\nReads records (one notation per line, a title may follow after whitespace)\nfrom the files, or from standard input when none is named.")
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
	out := bufio.NewWriter(stdout)
	defer out.Flush()
	failed := false
	status := eachLine(fs.Args(), stdin, stderr, func(name string, n int, line string) {
		if trimmed := strings.TrimSpace(line); trimmed == "" || strings.HasPrefix(trimmed, "#") {
			return
		}
		d := describeRecord(notation.SplitRecord(line), reading)
		if !*asJSON {
			writeTable(out, d)
			return
		}
		b, err := json.Marshal(d)
		if err != nil {
			fmt.Fprintf(stderr, "%s:%d: %v\n", name, n, err)
			failed = true
			return
		}
		out.Write(b)
		out.WriteByte('\n')
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
	Input       string           `json:"input"`
	Name        string           `json:"name"`
	Atoms       []atomJSON       `json:"atoms"`
	Bonds       []bondJSON       `json:"bonds"`
	Formula     string           `json:"formula"`
	Mass        float64          `json:"averageMass"`
	Mono        float64          `json:"monoisotopicMass"`
	Diagnostics []diagnosticJSON `json:"diagnostics"`
	Stereo      []unitJSON       `json:"stereo"`
	Reaction    *reactionJSON    `json:"reaction,omitempty"`
}

// unitJSON is one perceived stereogenic unit. Atom numbers are 1-based.
type unitJSON struct {
	Kind      string       `json:"kind"`
	Atoms     []int        `json:"atoms"`
	Specified bool         `json:"specified"`
	CIP       string       `json:"cip,omitempty"`
	Ranked    []ligandJSON `json:"ranked"`
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
	m := notation.ReadWith(rec.Notation, reading)
	d := recordJSON{Input: rec.Notation, Name: rec.Title,
		Atoms: []atomJSON{}, Bonds: []bondJSON{}, Diagnostics: []diagnosticJSON{}}
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
	an := stereo.Analyze(m)
	diags := append(append(notation.ErrorList{}, m.Errors...), an.Diagnostics...)
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
	d.Stereo = []unitJSON{}
	for i := range an.Units {
		d.Stereo = append(d.Stereo, unitToJSON(&an.Units[i]))
	}
	return d
}

func unitToJSON(u *stereo.Unit) unitJSON {
	j := unitJSON{Kind: u.Kind.String(), Specified: u.Specified, Ranked: []ligandJSON{}}
	for _, a := range u.Atoms {
		j.Atoms = append(j.Atoms, a+1)
	}
	if u.Specified && u.Descriptor.Labelled() {
		j.CIP = u.Descriptor.String()
	}
	for _, l := range u.Ranked {
		lj := ligandJSON{Rank: l.Rank}
		if l.Atom >= 0 {
			n := l.Atom + 1
			lj.Atom = &n
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
		fmt.Fprintf(w, "  %s %v: %s\n", u.Kind, u.Atoms, label)
	}
	for _, e := range d.Diagnostics {
		fmt.Fprintf(w, "  %s: %s [%s] at bytes %d-%d\n", e.Severity, e.Message, e.Code, e.Span[0], e.Span[1])
	}
	fmt.Fprintln(w)
}

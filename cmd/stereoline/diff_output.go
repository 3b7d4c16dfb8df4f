package main

import (
	"bufio"
	"encoding/json"
	"fmt"
	"strings"

	"stereoline/lsp"
	"stereoline/stereo"
	"stereoline/stereo/review"
)

// This file implements the text and JSON Lines forms of 'stereoline
// diff' and its summary line.

// placer turns host byte offsets of one version of a file into 1-based
// lines and columns (columns in Unicode code points, as the checker's
// text output counts them), through the language server's mapper, the
// one place that converts offsets.
type placer struct{ m *lsp.Mapper }

func newPlacer(content []byte) placer {
	return placer{lsp.NewMapper(content, lsp.EncodingUTF32)}
}

func (p placer) at(off int) (line, col int) {
	off = max(0, min(off, len(p.m.Content())))
	pos, err := p.m.OffsetToPosition(off)
	if err != nil {
		return 1, 1 // unreachable: off is clamped to the text
	}
	return int(pos.Line) + 1, int(pos.Character) + 1
}

// placers holds the placers of a report's two versions.
type placers struct{ old, new placer }

func placersOf(rep *review.Report) placers {
	return placers{old: newPlacer(rep.Old.Content), new: newPlacer(rep.New.Content)}
}

// where returns the line and column a pair is reported at: the first
// changed mark of the new record, or of the old one for a removed
// record.
func (ps placers) where(p *review.Pair) (line, col int) {
	if p.New != nil {
		return ps.new.at(p.HostMark(true))
	}
	return ps.old.at(p.HostMark(false))
}

// writeDiffText prints one line per pair, compiler-style.
func writeDiffText(w *bufio.Writer, files []*diffFile, base string) error {
	for _, f := range files {
		if f.report == nil {
			continue
		}
		ps := placersOf(f.report)
		for i := range f.report.Pairs {
			p := &f.report.Pairs[i]
			line, col := ps.where(p)
			text := p.Explanation
			if name := pairName(p); name != "" {
				// the record by its name, so that a reviewer of a long
				// list knows it without opening the file
				text = name + ": " + text
			}
			if p.Class == review.Removed {
				ol, _ := ps.old.at(p.Old.Occ.Span.Start)
				text += fmt.Sprintf(" (line %d at %s)", ol, base)
			}
			text += findingsSentence(p)
			fmt.Fprintf(w, "%s:%d:%d: %s: %s\n", f.path, line, col, p.Class, text)
		}
	}
	return nil
}

// pairName is the name a changed record goes by in the text report: its
// identity in the file (a list line's title, a table's ID, the name a
// literal is bound to), else its title; "" for none, and for added and
// removed records, whose explanation names them already.
func pairName(p *review.Pair) string {
	if p.Class == review.Added || p.Class == review.Removed || p.New == nil {
		return ""
	}
	if p.New.Key != "" {
		return p.New.Key
	}
	return p.New.Occ.Title
}

// findingsSentence lists the findings a change introduced or removed, as
// a tail of the explanation.
func findingsSentence(p *review.Pair) string {
	var b strings.Builder
	for _, fc := range p.Findings {
		if fc.Introduced {
			fmt.Fprintf(&b, "; new %s: %s [%s]", fc.Severity, fc.Message, fc.Code)
		} else {
			fmt.Fprintf(&b, "; %s gone: %s [%s]", fc.Severity, fc.Message, fc.Code)
		}
	}
	return b.String()
}

// diffJSON is the JSON Lines object of one pair. Later fields are added
// at the end; consumers must ignore fields they do not know.
type diffJSON struct {
	Path        string            `json:"path"`
	Class       string            `json:"class"`
	Old         *diffRecordJSON   `json:"old"`
	New         *diffRecordJSON   `json:"new"`
	Units       []diffUnitJSON    `json:"units"`
	Findings    []diffFindingJSON `json:"findings"`
	Explanation string            `json:"explanation"`
	Roles       []diffRoleJSON    `json:"roles,omitempty"`
	Centres     []diffCentreJSON  `json:"centers,omitempty"`
}

// diffRecordJSON is one side of a pair; line and column are 1-based
// (columns in code points) and point at the start of the notation.
type diffRecordJSON struct {
	Line   int    `json:"line"`
	Column int    `json:"column"`
	Text   string `json:"text"`
	Title  string `json:"title"`
	Key    string `json:"key,omitempty"`
}

// diffUnitJSON is a changed unit: atoms 1-based in the new record (in
// the old one for a unit the new record leaves open), old_atoms in the
// old record; a label is null on a side that leaves the unit unmarked
// and "?" where the unit is marked but has no CIP label.
type diffUnitJSON struct {
	Kind     string  `json:"kind"`
	Atoms    []int   `json:"atoms"`
	OldAtoms []int   `json:"old_atoms"`
	Before   *string `json:"before"`
	After    *string `json:"after"`
	Role     string  `json:"role,omitempty"`
}

// diffFindingJSON is a finding the change introduced or removed, at its
// place in the version it belongs to.
type diffFindingJSON struct {
	Change   string `json:"change"` // "introduced" or "removed"
	Code     string `json:"code"`
	Severity string `json:"severity"`
	Message  string `json:"message"`
	Line     int    `json:"line"`
	Column   int    `json:"column"`
}

type diffRoleJSON struct {
	Role  string `json:"role"`
	Class string `json:"class"`
}

type diffCentreJSON struct {
	Map    int     `json:"map"`
	Before *string `json:"before"`
	After  *string `json:"after"`
}

// writeDiffJSON prints one JSON object per pair.
func writeDiffJSON(w *bufio.Writer, files []*diffFile) error {
	enc := json.NewEncoder(w)
	enc.SetEscapeHTML(false)
	for _, f := range files {
		if f.report == nil {
			continue
		}
		ps := placersOf(f.report)
		for i := range f.report.Pairs {
			if err := enc.Encode(pairJSON(f.path, &f.report.Pairs[i], ps)); err != nil {
				return err
			}
		}
	}
	return nil
}

func pairJSON(path string, p *review.Pair, ps placers) diffJSON {
	j := diffJSON{Path: path, Class: p.Class.String(), Units: []diffUnitJSON{}, Findings: []diffFindingJSON{}, Explanation: p.Explanation}
	side := func(r *review.Record, pl placer) *diffRecordJSON {
		if r == nil {
			return nil
		}
		line, col := pl.at(r.Occ.Span.Start)
		return &diffRecordJSON{Line: line, Column: col, Text: r.Occ.Text, Title: r.Occ.Title, Key: printableKey(r.Key)}
	}
	j.Old, j.New = side(p.Old, ps.old), side(p.New, ps.new)
	for _, u := range p.Units {
		uj := diffUnitJSON{Kind: u.Kind.String(), Atoms: atomsJSON(u.Atoms), OldAtoms: atomsJSON(u.OldAtoms)}
		if u.Atoms == nil {
			uj.Atoms = atomsJSON(u.OldAtoms)
		}
		old, new := u.Marked()
		uj.Before, uj.After = labelJSON(u.Before, old), labelJSON(u.After, new)
		if u.Role != 0 {
			uj.Role = u.Role.String()
		}
		j.Units = append(j.Units, uj)
	}
	for _, fc := range p.Findings {
		pl, change := ps.old, "removed"
		if fc.Introduced {
			pl, change = ps.new, "introduced"
		}
		line, col := pl.at(fc.Span.Start)
		j.Findings = append(j.Findings, diffFindingJSON{Change: change, Code: string(fc.Code), Severity: fc.Severity.String(), Message: fc.Message, Line: line, Column: col})
	}
	for _, r := range p.Roles {
		j.Roles = append(j.Roles, diffRoleJSON{Role: r.Role.String(), Class: r.Class.String()})
	}
	for _, c := range p.Centres {
		cj := diffCentreJSON{Map: c.Map}
		if c.OldPresent {
			s := c.Before.String()
			cj.Before = &s
		}
		if c.NewPresent {
			s := c.After.String()
			cj.After = &s
		}
		j.Centres = append(j.Centres, cj)
	}
	return j
}

// printableKey shows a record's key with its parts joined by '/' (a
// table's ID and column, the members of a JSON path).
func printableKey(k string) string {
	return strings.TrimPrefix(strings.ReplaceAll(k, "\x00", "/"), "/")
}

// atomsJSON numbers atoms from 1; nil stays nil (null in JSON).
func atomsJSON(xs []int) []int {
	if xs == nil {
		return nil
	}
	return oneBased(xs)
}

func labelJSON(d stereo.Descriptor, marked bool) *string {
	if !marked {
		return nil
	}
	s := "?"
	if d.Labelled() {
		s = d.String()
	}
	return &s
}

// diffSummary counts a run's pairs.
type diffSummary struct {
	files, records, unchanged, skipped int
	byClass                            map[review.Class]int
}

func summarizeDiff(files []*diffFile) diffSummary {
	s := diffSummary{byClass: map[review.Class]int{}}
	for _, f := range files {
		if f.skipped != "" {
			s.skipped++
			continue
		}
		if f.report == nil {
			continue
		}
		s.files++
		s.records += f.report.Records
		s.unchanged += f.report.Unchanged
		for _, p := range f.report.Pairs {
			s.byClass[p.Class]++
		}
	}
	return s
}

// line is the summary printed to standard error.
func (s diffSummary) line(base string) string {
	changed := 0
	var parts []string
	for _, c := range review.Classes() {
		if n := s.byClass[c]; n > 0 {
			changed += n
			parts = append(parts, fmt.Sprintf("%d %s", n, c))
		}
	}
	out := fmt.Sprintf("stereoline diff against %s: %s changed, %s in them, %d listed", base, plural(s.files, "file"), plural(s.records, "record"), changed)
	if len(parts) > 0 {
		out += ": " + strings.Join(parts, ", ")
	}
	out += fmt.Sprintf("; %d unchanged", s.unchanged)
	if s.skipped > 0 {
		out += fmt.Sprintf("; %d files skipped", s.skipped)
	}
	return out
}

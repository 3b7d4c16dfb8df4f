package main

import (
	"bufio"
	"encoding/json"
	"fmt"
	"strings"

	"stereoline/notation"
)

// writeText prints one line per finding in the form compilers use,
// path:line:col: severity: message [code], with 1-based lines and
// columns. A column counts characters (Unicode code points), not bytes,
// so it matches what an editor shows for text with accents or Greek
// letters in a comment before the notation.
func writeText(w *bufio.Writer, reports []fileReport) error {
	for _, rep := range reports {
		for f := range rep.Findings.All() {
			fmt.Fprintf(w, "%s:%d:%d: %s: %s [%s]\n", rep.Path, f.Start.Line+1, f.Start.CharCP+1, f.Severity, f.Message, f.Code)
		}
		if err := rep.Findings.Err(); err != nil {
			return err
		}
	}
	return nil
}

// jsonPosition and jsonRange are LSP 3.17's Position and Range: 0-based
// lines and UTF-16 code units, so a finding can be handed to an editor
// as it is.
type jsonPosition struct {
	Line      int `json:"line"`
	Character int `json:"character"`
}

type jsonRange struct {
	Start jsonPosition `json:"start"`
	End   jsonPosition `json:"end"`
}

// jsonFinding is one line of the JSON Lines output.
type jsonFinding struct {
	Path     string    `json:"path"`
	Range    jsonRange `json:"range"`
	Severity string    `json:"severity"`
	Code     string    `json:"code"`
	Message  string    `json:"message"`
}

// writeJSONLines prints one JSON object per finding, one per line.
func writeJSONLines(w *bufio.Writer, reports []fileReport) error {
	enc := json.NewEncoder(w)
	enc.SetEscapeHTML(false)
	for _, rep := range reports {
		for f := range rep.Findings.All() {
			j := jsonFinding{
				Path: rep.Path,
				Range: jsonRange{
					Start: jsonPosition{f.Start.Line, f.Start.Char16},
					End:   jsonPosition{f.End.Line, f.End.Char16},
				},
				Severity: f.Severity.String(),
				Code:     string(f.Code),
				Message:  f.Message,
			}
			if err := enc.Encode(j); err != nil {
				return err
			}
		}
		if err := rep.Findings.Err(); err != nil {
			return err
		}
	}
	return nil
}

// checkSummary counts what a run looked at and found.
type checkSummary struct {
	files, skipped, records int
	bySeverity              [notation.SeverityHint + 1]int
}

// add counts one file's report.
func (s *checkSummary) add(rep fileReport) {
	if rep.Skipped != "" {
		s.skipped++
		return
	}
	s.files++
	s.records += rep.Records
	for f := range rep.Findings.All() {
		if f.Severity >= 0 && int(f.Severity) < len(s.bySeverity) {
			s.bySeverity[f.Severity]++
		}
	}
}

// atOrAbove counts findings at least as urgent as level.
func (s checkSummary) atOrAbove(level notation.Severity) int {
	n := 0
	for sev := notation.SeverityError; sev <= level; sev++ {
		n += s.bySeverity[sev]
	}
	return n
}

// line is the one-line summary printed on stderr at the end of a run, so
// that standard output holds nothing but findings in every format.
func (s checkSummary) line(changedOnly bool) string {
	total := 0
	for _, n := range s.bySeverity {
		total += n
	}
	var b strings.Builder
	fmt.Fprintf(&b, "stereoline: %s", plural(s.files, "file"))
	if s.skipped > 0 {
		fmt.Fprintf(&b, " (%d skipped)", s.skipped)
	}
	fmt.Fprintf(&b, ", %s, %s", plural(s.records, "record"), plural(total, "diagnostic"))
	if changedOnly {
		b.WriteString(" on changed lines")
	}
	fmt.Fprintf(&b, ": %s, %s, %d information, %s",
		plural(s.bySeverity[notation.SeverityError], "error"),
		plural(s.bySeverity[notation.SeverityWarning], "warning"),
		s.bySeverity[notation.SeverityInformation],
		plural(s.bySeverity[notation.SeverityHint], "hint"))
	return b.String()
}

func plural(n int, word string) string {
	if n == 1 {
		return fmt.Sprintf("1 %s", word)
	}
	return fmt.Sprintf("%d %ss", n, word)
}

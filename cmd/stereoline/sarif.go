package main

import (
	"bufio"
	"bytes"
	"encoding/json"
	"fmt"
	"net/url"
	"path"
	"strings"

	"github.com/owenrumney/go-sarif/v2/sarif"

	"stereoline/notation"
)

// sarifToolVersion is the version the SARIF report names for the tool.
const sarifToolVersion = "0.1.0"

// sarifLevel maps a severity to a SARIF result level (SARIF 2.1.0
// §3.27.10 has none, note, warning and error; information and hint both
// become note).
func sarifLevel(s notation.Severity) string {
	switch s {
	case notation.SeverityError:
		return "error"
	case notation.SeverityWarning:
		return "warning"
	}
	return "note"
}

// sarifURI turns a printed path into an artifact location URI: relative
// paths stay relative (GitHub code scanning resolves them against the
// repository root), absolute ones become file URIs (SARIF 2.1.0 §3.4.3).
func sarifURI(p string) string {
	if strings.HasPrefix(p, "/") {
		return (&url.URL{Scheme: "file", Path: p}).String()
	}
	p = path.Clean(p)
	return (&url.URL{Path: p}).String()
}

// sarifWriter writes one SARIF 2.1.0 log with one run: the tool with a
// rule for every code of the catalogue, and a result per finding.
// Columns count Unicode code points, as the text output does, and the
// run says so in columnKind (§3.14.17). The log is written as the
// reports come, each result as it is read: the head (the log without
// results) is marshalled once and split where its empty results array
// stands, and each result is marshalled at the indent it has there, so
// the bytes are those of marshalling the whole log at once, while
// memory does not grow with the findings.
type sarifWriter struct {
	w         *bufio.Writer
	tail      []byte // what follows the results
	indent    string // of the results' elements
	ruleIndex map[notation.Code]int
	results   int
}

// sarifResults is the results member of the run as the head marshals it.
const sarifResults = `"results": []`

// newSARIFWriter writes the head of the log to w.
func newSARIFWriter(w *bufio.Writer) (*sarifWriter, error) {
	report, err := sarif.New(sarif.Version210)
	if err != nil {
		return nil, err
	}
	driver := sarif.NewVersionedDriver("stereoline", sarifToolVersion)
	driver.WithSemanticVersion(sarifToolVersion)
	run := sarif.NewRun(*sarif.NewTool(driver))
	run.WithColumnKind("unicodeCodePoints")
	sw := &sarifWriter{w: w, ruleIndex: map[notation.Code]int{}}
	for i, doc := range codeCatalogue {
		example := strings.TrimSpace(doc.Example.display())
		rule := sarif.NewRule(string(doc.Code)).
			WithName(ruleName(doc.Code)).
			WithShortDescription(sarif.NewMultiformatMessageString(doc.Short)).
			WithFullDescription(sarif.NewMultiformatMessageString(doc.Full)).
			WithHelp(sarif.NewMultiformatMessageString(doc.Help + " Example: " + example).
				WithMarkdown(doc.Help + "\n\nExample: `" + example + "`"))
		driver.AddRule(rule)
		sw.ruleIndex[doc.Code] = i
	}
	run.WithResults([]*sarif.Result{})
	report.AddRun(run)
	head, err := json.MarshalIndent(report, "", "  ")
	if err != nil {
		return nil, err
	}
	// The member name cannot occur elsewhere unescaped: quotes inside
	// strings are written \".
	at := bytes.Index(head, []byte(sarifResults))
	if at < 0 || bytes.Count(head, []byte(sarifResults)) != 1 {
		return nil, fmt.Errorf("SARIF head without one results array")
	}
	line := bytes.LastIndexByte(head[:at], '\n') + 1
	sw.indent = string(head[line:at]) + "  "
	sw.tail = head[at+len(sarifResults)-1:] // from the closing bracket
	_, err = w.Write(head[:at+len(sarifResults)-1])
	return sw, err
}

// add writes the results of one file's findings.
func (sw *sarifWriter) add(rep fileReport) error {
	if rep.Findings.Len() == 0 {
		return nil
	}
	uri := sarifURI(rep.Path)
	for f := range rep.Findings.All() {
		region := sarif.NewRegion().
			WithStartLine(f.Start.Line + 1).
			WithStartColumn(f.Start.CharCP + 1).
			WithEndLine(f.End.Line + 1).
			WithEndColumn(f.End.CharCP + 1)
		loc := sarif.NewPhysicalLocation().
			WithArtifactLocation(sarif.NewSimpleArtifactLocation(uri)).
			WithRegion(region)
		res := sarif.NewRuleResult(string(f.Code)).
			WithLevel(sarifLevel(f.Severity)).
			WithMessage(sarif.NewTextMessage(sarifMessage(f.Message))).
			WithLocations([]*sarif.Location{sarif.NewLocationWithPhysicalLocation(loc)})
		// The index of the rule, or -1 for a code without one, as
		// Run.AddResult gives it.
		i, ok := sw.ruleIndex[f.Code]
		if !ok {
			i = -1
		}
		res.WithRuleIndex(i)
		b, err := json.MarshalIndent(res, sw.indent, "  ")
		if err != nil {
			return err
		}
		if sw.results > 0 {
			sw.w.WriteByte(',')
		}
		sw.results++
		sw.w.WriteString("\n")
		sw.w.WriteString(sw.indent)
		if _, err := sw.w.Write(b); err != nil {
			return err
		}
	}
	return rep.Findings.Err()
}

// finish writes the rest of the log after the last results: the run's
// invocation (SARIF 2.1.0 §3.20), which says whether the run succeeded
// (no path that could not be read, no bad configuration: exit status
// other than 2) and, as tool execution notifications (§3.20.21, §3.58),
// names each file that was not checked and why, so a log read in CI
// does not pass over a dataset that was skipped. The invocation is
// written after the results, where it is known; the order of a JSON
// object's members carries no meaning.
func (sw *sarifWriter) finish(successful bool, notes []runNote) error {
	if sw.results > 0 {
		sw.w.WriteString("\n")
		sw.w.WriteString(sw.indent[:len(sw.indent)-2])
	}
	inv := sarif.NewInvocation().WithExecutionSuccess(successful)
	for _, n := range notes {
		note := sarif.NewNotification().WithLevel(n.level).WithMessage(sarif.NewTextMessage(sarifMessage(n.text)))
		if n.path != "" {
			loc := sarif.NewPhysicalLocation().WithArtifactLocation(sarif.NewSimpleArtifactLocation(sarifURI(n.path)))
			note.WithLocations([]*sarif.Location{sarif.NewLocationWithPhysicalLocation(loc)})
		}
		inv.AddTToolExecutionNotification(note)
	}
	runIndent := sw.indent[:len(sw.indent)-2]
	b, err := json.MarshalIndent([]*sarif.Invocation{inv}, runIndent, "  ")
	if err != nil {
		return err
	}
	// the tail begins with the results' closing bracket
	sw.w.Write(sw.tail[:1])
	sw.w.WriteString(",\n" + runIndent + `"invocations": `)
	sw.w.Write(b)
	if _, err := sw.w.Write(sw.tail[1:]); err != nil {
		return err
	}
	return sw.w.WriteByte('\n')
}

// sarifMessage makes a short lowercase finding a sentence: SARIF
// recommends messages that start upper case and end with a period
// (§3.11.1 and the validator's rule SARIF2001 "terminate messages with a
// period").
func sarifMessage(m string) string {
	if m == "" {
		return m
	}
	m = strings.ToUpper(m[:1]) + m[1:]
	if !strings.HasSuffix(m, ".") {
		m += "."
	}
	return m
}

// ruleName is the code in UpperCamelCase, the form SARIF 2.1.0 §3.49.7
// suggests for reportingDescriptor.name. A name must differ from the id
// (the validator's rule SARIF1001), so one-word codes, all the reader's,
// get the prefix Notation.
func ruleName(c notation.Code) string {
	var b strings.Builder
	for _, part := range strings.Split(string(c), "-") {
		if part != "" {
			b.WriteString(strings.ToUpper(part[:1]) + part[1:])
		}
	}
	if strings.EqualFold(b.String(), string(c)) {
		return "Notation" + b.String()
	}
	return b.String()
}

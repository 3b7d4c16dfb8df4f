package main

import (
	"bufio"
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

// writeSARIF writes one SARIF 2.1.0 log with one run: the tool with a rule
// for every code of the catalogue, and a result per finding. Columns
// count Unicode code points, as the text output does, and the run says
// so in columnKind (§3.14.17).
func writeSARIF(w *bufio.Writer, reports []fileReport) error {
	report, err := sarif.New(sarif.Version210)
	if err != nil {
		return err
	}
	driver := sarif.NewVersionedDriver("stereoline", sarifToolVersion)
	driver.WithSemanticVersion(sarifToolVersion)
	run := sarif.NewRun(*sarif.NewTool(driver))
	run.WithColumnKind("unicodeCodePoints")
	ruleIndex := map[notation.Code]int{}
	for i, doc := range codeCatalogue {
		example := strings.TrimSpace(doc.Example.display())
		rule := sarif.NewRule(string(doc.Code)).
			WithName(ruleName(doc.Code)).
			WithShortDescription(sarif.NewMultiformatMessageString(doc.Short)).
			WithFullDescription(sarif.NewMultiformatMessageString(doc.Full)).
			WithHelp(sarif.NewMultiformatMessageString(doc.Help + " Example: " + example).
				WithMarkdown(doc.Help + "\n\nExample: `" + example + "`"))
		driver.AddRule(rule)
		ruleIndex[doc.Code] = i
	}
	run.WithResults([]*sarif.Result{})
	for _, rep := range reports {
		if rep.Findings.Len() == 0 {
			continue
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
			if i, ok := ruleIndex[f.Code]; ok {
				res.WithRuleIndex(i)
			}
			run.AddResult(res)
		}
		if err := rep.Findings.Err(); err != nil {
			return err
		}
	}
	report.AddRun(run)
	if err := report.PrettyWrite(w); err != nil {
		return err
	}
	return w.WriteByte('\n')
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

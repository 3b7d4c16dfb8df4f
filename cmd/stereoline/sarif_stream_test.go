package main

import (
	"bufio"
	"bytes"
	"strings"
	"testing"

	"github.com/owenrumney/go-sarif/v2/sarif"

	"stereoline/notation"
)

// TestSARIFStreamedAsWhole checks the SARIF log written result by result
// against the log go-sarif marshals when the whole run is built first
// (its Report.PrettyWrite, the reference for the bytes): no reports, a
// file without findings, several files, a code outside the catalogue
// (rule index -1, as go-sarif's Run.AddResult gives it), and messages
// with characters JSON escapes.
func TestSARIFStreamedAsWhole(t *testing.T) {
	mk := func(path string, fs ...finding) fileReport {
		rep := fileReport{Path: path, Records: len(fs)}
		for _, f := range fs {
			rep.Findings.add(f)
		}
		rep.Findings.done()
		return rep
	}
	at := func(line, col int) position { return position{Line: line, Char16: col, CharCP: col} }
	cases := map[string][]fileReport{
		"none":  nil,
		"clean": {mk("a.smi")},
		"several": {
			mk("lists/a.smi",
				finding{Start: at(0, 0), End: at(0, 9), Severity: notation.SeverityWarning, Code: "list-duplicate", Message: `the same structure as line 3 ("x" <y> & z)`},
				finding{Start: at(4, 2), End: at(4, 3), Severity: notation.SeverityInformation, Code: "not-a-catalogued-code", Message: "ends with a period."}),
			mk("b.smi"),
			mk("/abs/c d.py",
				finding{Start: at(9, 4), End: at(10, 1), Severity: notation.SeverityError, Code: "syntax", Message: "é\tunclosed"}),
		},
	}
	for name, reports := range cases {
		t.Run(name, func(t *testing.T) {
			var got bytes.Buffer
			w := bufio.NewWriter(&got)
			sw, err := newSARIFWriter(w)
			if err != nil {
				t.Fatal(err)
			}
			for _, rep := range reports {
				if err := sw.add(rep); err != nil {
					t.Fatal(err)
				}
			}
			if err := sw.finish(); err != nil {
				t.Fatal(err)
			}
			w.Flush()
			want := wholeSARIF(t, reports)
			if got.String() != want {
				t.Errorf("streamed log differs from the whole log:\n%s\nwant\n%s", tailOf(got.String()), tailOf(want))
			}
		})
	}
}

// wholeSARIF builds the run with go-sarif's own structures and writes it
// in one piece.
func wholeSARIF(t *testing.T, reports []fileReport) string {
	report, err := sarif.New(sarif.Version210)
	if err != nil {
		t.Fatal(err)
	}
	driver := sarif.NewVersionedDriver("stereoline", sarifToolVersion)
	driver.WithSemanticVersion(sarifToolVersion)
	run := sarif.NewRun(*sarif.NewTool(driver))
	run.WithColumnKind("unicodeCodePoints")
	for _, doc := range codeCatalogue {
		example := strings.TrimSpace(doc.Example.display())
		driver.AddRule(sarif.NewRule(string(doc.Code)).
			WithName(ruleName(doc.Code)).
			WithShortDescription(sarif.NewMultiformatMessageString(doc.Short)).
			WithFullDescription(sarif.NewMultiformatMessageString(doc.Full)).
			WithHelp(sarif.NewMultiformatMessageString(doc.Help + " Example: " + example).
				WithMarkdown(doc.Help + "\n\nExample: `" + example + "`")))
	}
	run.WithResults([]*sarif.Result{})
	for _, rep := range reports {
		for f := range rep.Findings.All() {
			region := sarif.NewRegion().WithStartLine(f.Start.Line + 1).WithStartColumn(f.Start.CharCP + 1).
				WithEndLine(f.End.Line + 1).WithEndColumn(f.End.CharCP + 1)
			loc := sarif.NewPhysicalLocation().
				WithArtifactLocation(sarif.NewSimpleArtifactLocation(sarifURI(rep.Path))).WithRegion(region)
			run.AddResult(sarif.NewRuleResult(string(f.Code)).
				WithLevel(sarifLevel(f.Severity)).
				WithMessage(sarif.NewTextMessage(sarifMessage(f.Message))).
				WithLocations([]*sarif.Location{sarif.NewLocationWithPhysicalLocation(loc)}))
		}
	}
	report.AddRun(run)
	var b bytes.Buffer
	if err := report.PrettyWrite(&b); err != nil {
		t.Fatal(err)
	}
	return b.String() + "\n"
}

// tailOf is the end of a log, where the results are.
func tailOf(s string) string {
	if i := strings.Index(s, `"results"`); i >= 0 {
		return s[i:]
	}
	return s
}

package main

import (
	"bufio"
	"bytes"
	"encoding/json"
	"reflect"
	"strings"
	"testing"

	"github.com/owenrumney/go-sarif/v2/sarif"

	"stereoline/notation"
)

// TestSARIFStreamedAsWhole checks the SARIF log written result by result
// against the log go-sarif marshals when the whole run is built first
// (its Report.PrettyWrite, the reference): no reports, a file without
// findings, several files, a code outside the catalogue (rule index -1,
// as go-sarif's Run.AddResult gives it), messages with characters JSON
// escapes, and a run with notes (a file skipped, a path that cannot be
// read: the invocation's tool execution notifications, and execution not
// successful). The two must be the same JSON; go-sarif writes the
// invocation before the results, the stream after them, where it is
// known, so the logs are compared as JSON values, not as bytes.
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
	type run struct {
		reports    []fileReport
		successful bool
		notes      []runNote
	}
	cases := map[string]run{
		"none":  {successful: true},
		"clean": {reports: []fileReport{mk("a.smi")}, successful: true},
		"notes": {reports: []fileReport{mk("a.smi")}, notes: []runNote{
			{path: "big/list.smi", level: "warning", text: "not checked: larger than 10485760 bytes (--max-size)"},
			{path: "gone.smi", level: "error", text: "not checked: no such file or directory"},
			{level: "error", text: ".stereoline.json: unknown setting \"x\""},
		}},
		"several": {successful: true, reports: []fileReport{
			mk("lists/a.smi",
				finding{Start: at(0, 0), End: at(0, 9), Severity: notation.SeverityWarning, Code: "list-duplicate", Message: `the same structure as line 3 ("x" <y> & z)`},
				finding{Start: at(4, 2), End: at(4, 3), Severity: notation.SeverityInformation, Code: "not-a-catalogued-code", Message: "ends with a period."}),
			mk("b.smi"),
			mk("/abs/c d.py",
				finding{Start: at(9, 4), End: at(10, 1), Severity: notation.SeverityError, Code: "syntax", Message: "é\tunclosed"}),
		}},
	}
	for name, c := range cases {
		reports := c.reports
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
			if err := sw.finish(c.successful, c.notes); err != nil {
				t.Fatal(err)
			}
			w.Flush()
			want := wholeSARIF(t, reports, c.successful, c.notes)
			var g, wj any
			if err := json.Unmarshal(got.Bytes(), &g); err != nil {
				t.Fatalf("streamed log: %v", err)
			}
			if err := json.Unmarshal([]byte(want), &wj); err != nil {
				t.Fatal(err)
			}
			if !reflect.DeepEqual(g, wj) {
				t.Errorf("streamed log differs from the whole log:\n%s\nwant\n%s", tailOf(got.String()), tailOf(want))
			}
		})
	}
}

// wholeSARIF builds the run with go-sarif's own structures and writes it
// in one piece.
func wholeSARIF(t *testing.T, reports []fileReport, successful bool, notes []runNote) string {
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
	inv := run.AddInvocation(successful)
	for _, n := range notes {
		note := sarif.NewNotification().WithLevel(n.level).WithMessage(sarif.NewTextMessage(sarifMessage(n.text)))
		if n.path != "" {
			note.AddLocation(sarif.NewLocationWithPhysicalLocation(sarif.NewPhysicalLocation().
				WithArtifactLocation(sarif.NewSimpleArtifactLocation(sarifURI(n.path)))))
		}
		inv.AddTToolExecutionNotification(note)
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

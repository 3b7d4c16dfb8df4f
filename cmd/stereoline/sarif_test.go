package main

import (
	"encoding/json"
	"testing"
)

// TestSARIFShape reads the SARIF of the golden tree back and checks what
// SARIF 2.1.0 requires of it and what code scanning needs: version 2.1.0
// (§3.13.2), a driver name (§3.19.8), a rule per catalogue code with
// short and full descriptions and help (§3.49), and results whose
// ruleIndex points at the rule of their ruleId (§3.27.6), with a level of
// the spec's set (§3.27.10), a message (§3.27.11) and a 1-based region
// (§3.30). The full schema check runs in .ci/run with the SARIF
// Multitool.
func TestSARIFShape(t *testing.T) {
	stdout, stderr, status := runCheck(t, "", "--format", "sarif", goldenTree)
	if status == 2 {
		t.Fatal(stderr)
	}
	var log struct {
		Version string `json:"version"`
		Runs    []struct {
			Tool struct {
				Driver struct {
					Name  string `json:"name"`
					Rules []struct {
						ID               string `json:"id"`
						Name             string `json:"name"`
						ShortDescription struct{ Text string }
						FullDescription  struct{ Text string }
						Help             struct{ Text, Markdown string }
					} `json:"rules"`
				} `json:"driver"`
			} `json:"tool"`
			Results []struct {
				RuleID    string `json:"ruleId"`
				RuleIndex *int   `json:"ruleIndex"`
				Level     string `json:"level"`
				Message   struct{ Text string }
				Locations []struct {
					PhysicalLocation struct {
						ArtifactLocation struct{ URI string }
						Region           struct{ StartLine, StartColumn, EndLine, EndColumn int }
					}
				}
			} `json:"results"`
		} `json:"runs"`
	}
	if err := json.Unmarshal([]byte(stdout), &log); err != nil {
		t.Fatalf("not JSON: %v", err)
	}
	if log.Version != "2.1.0" || len(log.Runs) != 1 || log.Runs[0].Tool.Driver.Name == "" {
		t.Fatalf("version %q, %d runs: want 2.1.0, one run with a driver name", log.Version, len(log.Runs))
	}
	run := log.Runs[0]
	rules := run.Tool.Driver.Rules
	if len(rules) != len(codeCatalogue) {
		t.Errorf("%d rules for %d codes", len(rules), len(codeCatalogue))
	}
	for i, r := range rules {
		if i < len(codeCatalogue) && r.ID != string(codeCatalogue[i].Code) {
			t.Errorf("rule %d is %q, want %q", i, r.ID, codeCatalogue[i].Code)
		}
		if r.ShortDescription.Text == "" || r.FullDescription.Text == "" || r.Help.Text == "" || r.Help.Markdown == "" {
			t.Errorf("rule %s lacks a description or help", r.ID)
		}
		if r.Name == r.ID {
			t.Errorf("rule %s: name must differ from id", r.ID)
		}
	}
	if len(run.Results) == 0 {
		t.Fatal("no results for a tree with findings")
	}
	levels := map[string]bool{"none": true, "note": true, "warning": true, "error": true}
	for _, res := range run.Results {
		if res.RuleIndex == nil || *res.RuleIndex >= len(rules) || rules[*res.RuleIndex].ID != res.RuleID {
			t.Errorf("result %s: ruleIndex does not point at its rule", res.RuleID)
		}
		if !levels[res.Level] || res.Message.Text == "" || len(res.Locations) != 1 {
			t.Errorf("result %s: level %q, message %q, %d locations", res.RuleID, res.Level, res.Message.Text, len(res.Locations))
			continue
		}
		reg := res.Locations[0].PhysicalLocation.Region
		if reg.StartLine < 1 || reg.StartColumn < 1 || reg.EndLine < reg.StartLine || (reg.EndLine == reg.StartLine && reg.EndColumn < reg.StartColumn) {
			t.Errorf("result %s: bad region %+v", res.RuleID, reg)
		}
		if res.Locations[0].PhysicalLocation.ArtifactLocation.URI == "" {
			t.Errorf("result %s: no artifact URI", res.RuleID)
		}
	}
}

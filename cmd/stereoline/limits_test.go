package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestCheckLimits runs the checker on a file holding a chain of marked
// centres (a hostile record of issue 13, small here) with the limits
// set by option and by configuration file: a budget spent at once
// leaves every centre undetermined and says so once, on the first
// mark (the two end atoms carry impossible marks); a node cap too small to reach the chain's ends leaves the
// centres undetermined one by one; bad values are usage errors.
func TestCheckLimits(t *testing.T) {
	dir := t.TempDir()
	record := strings.Repeat("[C@H](F)", 30)
	file := filepath.Join(dir, "chain.smi")
	if err := os.WriteFile(file, []byte(record+"\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	count := func(out, code string) int { return strings.Count(out, "["+code+"]") }

	out, _, _ := runCheck(t, "", file)
	if count(out, "stereo-over-budget")+count(out, "stereo-undetermined") != 0 {
		t.Errorf("default limits: %s", out)
	}
	out, _, _ = runCheck(t, "", "--record-time", "1ns", file)
	if count(out, "stereo-over-budget") != 1 || !strings.Contains(out, "chain.smi:1:11: warning: the record's analysis stopped at its time budget of 1ns: 28 marked units") {
		t.Errorf("--record-time 1ns: %s", out)
	}
	out, _, _ = runCheck(t, "", "--digraph-nodes", "20", file)
	if n := count(out, "stereo-undetermined"); n == 0 || n > 30 || !strings.Contains(out, "within 20 digraph nodes") {
		t.Errorf("--digraph-nodes 20: %d undetermined: %s", n, out)
	}
	// 30 centres and 30 fluorines: a limit of 59 atoms refuses the
	// record, 60 reads it
	out, _, _ = runCheck(t, "", "--record-atoms", "59", file)
	if count(out, "stereo-over-budget") != 1 || count(out, "stereo-impossible-center") != 0 ||
		!strings.Contains(out, "chain.smi:1:1: warning: the record has 60 atoms, more than the 59 one record may have") {
		t.Errorf("--record-atoms 59: %s", out)
	}
	out, _, _ = runCheck(t, "", "--record-atoms", "60", file)
	if count(out, "stereo-over-budget") != 0 || count(out, "stereo-impossible-center") == 0 {
		t.Errorf("--record-atoms 60: %s", out)
	}
	// the same through the configuration file; the option wins over it
	cfg := filepath.Join(dir, ".stereoline.json")
	if err := os.WriteFile(cfg, []byte(`{"limits": {"recordTime": "1ns"}}`), 0o644); err != nil {
		t.Fatal(err)
	}
	out, _, _ = runCheck(t, "", file)
	if count(out, "stereo-over-budget") != 1 {
		t.Errorf("limits.recordTime 1ns: %s", out)
	}
	out, _, _ = runCheck(t, "", "--record-time", "off", file)
	if count(out, "stereo-over-budget") != 0 {
		t.Errorf("--record-time off over the file's 1ns: %s", out)
	}
	for _, bad := range []string{`{"limits": {"recordTime": "soon"}}`, `{"limits": {"recordTime": "-1s"}}`, `{"limits": {"digraphNodes": -3}}`, `{"limits": {"digraphNodes": 99999999}}`, `{"limits": {"recordAtoms": -5}}`} {
		if err := os.WriteFile(cfg, []byte(bad), 0o644); err != nil {
			t.Fatal(err)
		}
		if _, stderr, status := runCheck(t, "", file); status != 2 || !strings.Contains(stderr, "limits.") {
			t.Errorf("%s: status %d, stderr %q", bad, status, stderr)
		}
	}
	for _, args := range [][]string{{"--record-time", "0s"}, {"--record-time", "fast"}, {"--digraph-nodes", "-1"}, {"--digraph-nodes", "2000000"}, {"--record-atoms", "-2"}, {"--record-atoms", "200000000"}} {
		if _, stderr, status := runCheck(t, "", append(args, file)...); status != 2 || !strings.Contains(stderr, args[0]) {
			t.Errorf("%v: status %d, stderr %q", args, status, stderr)
		}
	}
}

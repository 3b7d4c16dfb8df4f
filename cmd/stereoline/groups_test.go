package main

import (
	"bytes"
	"encoding/json"
	"strings"
	"testing"
)

// TestDescribeGroups: describe --json gives the stereo groups of the
// block and each unit's group with its descriptor in the group's frame
// (IUPAC 2013 P-93.1.3 from memory: the lowest-locant centre of a relative
// group is cited as R*; here C2 is S as written, so the group reads
// rel-(2R,4S)).
func TestDescribeGroups(t *testing.T) {
	in := "C[C@H](O)[C@@H](C)Cl |o1:1,3| LRK-BB-104\nC[C@H](O)CC |&1:1,a:3| racemate\n"
	var out, errb bytes.Buffer
	if status := run([]string{"describe", "--json"}, strings.NewReader(in), &out, &errb); status != 0 {
		t.Fatalf("status %d: %s", status, errb.String())
	}
	var recs []recordJSON
	for _, l := range strings.Split(strings.TrimSpace(out.String()), "\n") {
		var r recordJSON
		if err := json.Unmarshal([]byte(l), &r); err != nil {
			t.Fatal(err)
		}
		recs = append(recs, r)
	}
	r := recs[0]
	if len(r.Groups) != 1 || r.Groups[0].Kind != "or" || r.Groups[0].Number != 1 || len(r.Groups[0].Atoms) != 2 ||
		r.Groups[0].Atoms[0] != 2 || r.Groups[0].Atoms[1] != 4 || r.Groups[0].Descriptor != "rel-(2R,4S)" || r.Groups[0].Starred != "(2R*,4S*)" {
		t.Errorf("groups %+v", r.Groups)
	}
	if r.Configuration != "relative" || len(r.Stereo) != 2 || r.Stereo[0].CIP != "S" || r.Stereo[0].Group == nil ||
		*r.Stereo[0].Group != (unitGroupJSON{Kind: "or", Number: 1, CIP: "R*"}) || *r.Stereo[1].Group != (unitGroupJSON{Kind: "or", Number: 1, CIP: "S*"}) {
		t.Errorf("record: configuration %q, stereo %+v", r.Configuration, r.Stereo)
	}
	// an absolute group over an atom that is no centre: listed as
	// written, and said to say nothing about it
	r = recs[1]
	if len(r.Groups) != 2 || r.Groups[1].Kind != "absolute" || r.Groups[1].Descriptor != "" || r.Configuration != "racemic" {
		t.Errorf("racemate: %+v, %q", r.Groups, r.Configuration)
	}
	codes := ""
	for _, d := range r.Diagnostics {
		codes += d.Code + " "
	}
	if !strings.Contains(codes, "stereo-group-ineffective-member") || !strings.Contains(codes, "stereo-group-one-center") {
		t.Errorf("racemate findings: %s", codes)
	}
}

// TestTransformGroups: the rewrites of groups on the command line keep
// the title and every other byte.
func TestTransformGroups(t *testing.T) {
	tests := []struct {
		args   []string
		in     string
		want   string
		status int
	}{
		{[]string{"--mirror"}, "C[C@H](O)CC |&1:1| racemate\n", "C[C@H](O)CC |&1:1| racemate\n", 0},
		{[]string{"--absolute", "o1"}, "C[C@H](O)[C@@H](C)Cl |o1:1,3| x\n", "C[C@H](O)[C@@H](C)Cl |a:1,3| x\n", 0},
		{[]string{"--absolute", "o1:2=R"}, "C[C@H](O)[C@@H](C)Cl |o1:1,3| x\n", "C[C@@H](O)[C@H](C)Cl |a:1,3| x\n", 0},
		{[]string{"--relative", "all"}, "C[C@H](O)[C@@H](C)Cl x\n", "C[C@H](O)[C@@H](C)Cl |o1:1,3| x\n", 0},
		{[]string{"--racemic", "2"}, "C[C@H](O)[C@@H](C)Cl x\n", "C[C@H](O)[C@@H](C)Cl |&1:1| x\n", 0},
		{[]string{"--absolute", "&1"}, "C[C@H](O)CC |o1:1| x\n", "C[C@H](O)CC |o1:1| x\n", 1},
		{[]string{"--absolute", "o1:2"}, "C[C@H](O)CC |o1:1|\n", "", 2},
		{[]string{"--racemic", "x"}, "CCO\n", "", 2},
	}
	for _, tc := range tests {
		var out, errOut bytes.Buffer
		status := run(append([]string{"transform"}, tc.args...), strings.NewReader(tc.in), &out, &errOut)
		if status != tc.status || out.String() != tc.want {
			t.Errorf("transform %v on %q: status %d, output %q (stderr %q); want %d, %q", tc.args, tc.in, status, out.String(), errOut.String(), tc.status, tc.want)
		}
	}
}

// TestCompareGroups: compare names the relations of groups and says them
// in words.
func TestCompareGroups(t *testing.T) {
	tests := []struct {
		args []string
		want string
	}{
		{[]string{"C[C@H](O)CC |&1:1|", "C[C@@H](O)CC |&1:1|"}, "identical\n  both stand for the same 2 stereoisomers, as the racemate\n"},
		{[]string{"C[C@H](O)CC |&1:1|", "C[C@@H](O)CC"}, "absolute-of-mixture\n  B is the (2R) enantiomer of the racemate A, rac-(2R)\n"},
		{[]string{"--json", "C[C@H](O)CC |o1:1|", "C[C@H](O)CC |&1:1|"},
			`{"relation":"relative-and-mixture","differing":[],"description":"the same stereoisomers: A stands for one enantiomer, unknown which, B for the racemate"}` + "\n"},
	}
	for _, tc := range tests {
		var out, errOut bytes.Buffer
		if status := run(append([]string{"compare"}, tc.args...), strings.NewReader(""), &out, &errOut); status != 0 || out.String() != tc.want {
			t.Errorf("compare %v: status %d, %q (stderr %q), want %q", tc.args, status, out.String(), errOut.String(), tc.want)
		}
	}
}

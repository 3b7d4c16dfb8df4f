package lsp

import (
	"fmt"
	"strings"
	"testing"
	"time"

	"go.lsp.dev/protocol"

	"stereoline/stereo/document"
)

// isomerList writes n records: the sixteen configurations of
// N[C@H](C)[C@H](O)[C@H](F)[C@H](Cl)C followed by a chain that spells
// the constitution's number over C, O, N and S, so every record has
// fifteen stereoisomers in the list (four stereocentres give 2^4
// configurations; common practice) and the relations need identity keys
// for all of them. Every fiftieth record is isobutane with an
// ineffective mark, a finding of the record itself.
func isomerList(n int) string { return isomerListOf(n, 16) }

// isomerListOf is isomerList with per (1 to 16) configurations of each
// constitution, one after another. With two, half of the records are the
// first of their constitution, whose keys only the relations compute.
func isomerListOf(n, per int) string {
	var b strings.Builder
	atoms := [...]string{"C", "O", "N", "S"}
	marks := [...]string{"@", "@@"}
	for i := 0; i < n; i++ {
		if i%50 == 49 {
			fmt.Fprintf(&b, "C[C@H](C)C marked %d\n", i)
			continue
		}
		s, k := i%per, i/per
		fmt.Fprintf(&b, "N[C%sH](C)[C%sH](O)[C%sH](F)[C%sH](Cl)C", marks[s&1], marks[s>>1&1], marks[s>>2&1], marks[s>>3&1])
		for j := 0; j < 6; j++ {
			b.WriteString(atoms[k%4])
			k /= 4
		}
		fmt.Fprintf(&b, " isomer %d\n", i)
	}
	return b.String()
}

// codeCounts counts diagnostics by code; list says whether to count the
// relations between records or the other findings.
func codeCounts[D any](diags []D, code func(D) string, list bool) map[string]int {
	out := map[string]int{}
	for _, d := range diags {
		if c := code(d); strings.HasPrefix(c, "list-") == list {
			out[c]++
		}
	}
	return out
}

// A list whose relations take longer than the grace time is published
// twice at one version: its records' own findings first, then everything,
// which is what the engine gives in one pass. The relations compute the
// keys of the first record of each constitution, half of this list's.
func TestRelationsPublishedSecond(t *testing.T) {
	text := isomerListOf(3000, 2)
	c := start(t, clientSetup{hook: func(s *Server) { s.relationGrace, s.relationShare = 0, 0 }})
	const u = "file:///work/isomers.smi"
	c.open(u, "", 1, text)
	c.until("two publications", func() bool { return len(c.diags) >= 2 })
	pubs := c.published(u)
	code := func(d document.Diagnostic) string { return string(d.Code) }
	want := document.NewAnalyzer(document.DefaultConfig()).Analyze("/work/isomers.smi", "", []byte(text)).Diagnostics()
	wire := func(i int) (own, rel map[string]int) {
		code := func(d protocol.Diagnostic) string { return fmt.Sprint(d.Code) }
		return codeCounts(pubs[i].Diagnostics, code, false), codeCounts(pubs[i].Diagnostics, code, true)
	}
	own1, rel1 := wire(0)
	own2, rel2 := wire(1)
	if len(rel1) != 0 {
		t.Errorf("first publication carries relations: %v", rel1)
	}
	if fmt.Sprint(own1) != fmt.Sprint(codeCounts(want, code, false)) || fmt.Sprint(own2) != fmt.Sprint(own1) {
		t.Errorf("own findings: first %v, second %v, engine %v", own1, own2, codeCounts(want, code, false))
	}
	if fmt.Sprint(rel2) != fmt.Sprint(codeCounts(want, code, true)) || len(rel2) == 0 {
		t.Errorf("relations published second %v, engine %v", rel2, codeCounts(want, code, true))
	}
	for i, p := range pubs {
		if p.Version == nil || *p.Version != 1 {
			t.Errorf("publication %d without version 1: %v", i, p.Version)
		}
	}
	if len(pubs) != 2 {
		t.Errorf("%d publications, want 2", len(pubs))
	}
}

// Relations that come within the share of the time the records took are
// published with them, once: the list of TestRelationsPublishedSecond,
// under a share that waits as long as the records took a thousand
// times over.
func TestRelationsSoonPublishedOnce(t *testing.T) {
	text := isomerListOf(3000, 2)
	c := start(t, clientSetup{hook: func(s *Server) { s.relationGrace, s.relationShare = 0, 1000 }})
	const u = "file:///work/isomers.smi"
	c.open(u, "", 1, text)
	c.until("a publication", func() bool { return len(c.diags) >= 1 })
	quiet()
	pubs := c.published(u)
	code := func(d protocol.Diagnostic) string { return fmt.Sprint(d.Code) }
	want := document.NewAnalyzer(document.DefaultConfig()).Analyze("/work/isomers.smi", "", []byte(text)).Diagnostics()
	if len(pubs) != 1 {
		t.Fatalf("%d publications, want 1", len(pubs))
	}
	if got := len(pubs[0].Diagnostics); got != len(want) || len(codeCounts(pubs[0].Diagnostics, code, true)) == 0 {
		t.Errorf("the publication has %d findings (relations %v), the engine %d", got, codeCounts(pubs[0].Diagnostics, code, true), len(want))
	}
}

// An edit made while the relations of the version before are computed
// wins: nothing of the old version is published after the new one.
func TestRelationsOfAnOldVersionNotPublished(t *testing.T) {
	text := isomerListOf(6000, 2)
	c := start(t, clientSetup{debounce: time.Millisecond, hook: func(s *Server) { s.relationGrace, s.relationShare = 0, 0 }})
	const u = "file:///work/isomers.smi"
	c.open(u, "", 1, text)
	c.diagnostics(u, 1)
	c.change(u, 2, edit(0, 0, 0, 0, "CCO ethanol\n"))
	c.until("version 2 with its relations", func() bool {
		for _, p := range c.diags {
			if p.Version != nil && *p.Version == 2 && len(codeCounts(p.Diagnostics, func(d protocol.Diagnostic) string { return fmt.Sprint(d.Code) }, true)) > 0 {
				return true
			}
		}
		return false
	})
	quiet()
	seen2 := false
	var order []string
	for _, p := range c.published(u) {
		if p.Version != nil {
			order = append(order, fmt.Sprintf("v%d:%d", *p.Version, len(p.Diagnostics)))
		}
	}
	t.Logf("publications: %s", strings.Join(order, " "))
	for i, p := range c.published(u) {
		switch {
		case p.Version == nil:
			t.Errorf("publication %d without a version", i)
		case *p.Version == 2:
			seen2 = true
		case seen2:
			t.Errorf("publication %d is of version %d, after version 2", i, *p.Version)
		}
	}
}

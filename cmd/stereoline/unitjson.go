package main

import (
	"encoding/json"

	"stereoline/stereo"
)

// This file implements a second JSON form of the stereo units, with the
// decisions of each ranking, which no command prints yet: describe
// prints unitJSON (describe.go). It left package stereo so that output
// forms live with the commands.

// analysisUnitJSON is the shape of one unit in analysisJSON. Atom
// numbers are 1-based, as users count them in the notation.
type analysisUnitJSON struct {
	Kind        string         `json:"kind"`
	Atoms       []int          `json:"atoms"`
	Specified   bool           `json:"specified"`
	CIP         string         `json:"cip,omitempty"`
	Permutation int            `json:"permutation,omitempty"`
	Ranked      []rankedJSON   `json:"ranked"`
	Decisions   []decisionJSON `json:"decisions,omitempty"`
}

type rankedJSON struct {
	Rank     int    `json:"rank"`
	Atom     int    `json:"atom,omitempty"`     // 1-based; absent for an implicit ligand
	Implicit string `json:"implicit,omitempty"` // "hydrogen" or "lone-pair"
	End      int    `json:"end,omitempty"`      // 1-based terminal atom, for double bonds and allenes
}

type decisionJSON struct {
	Higher int    `json:"higher"`
	Lower  int    `json:"lower"`
	Rule   string `json:"rule"`
	Sphere int    `json:"sphere"`
}

// analysisUnit renders a unit as {"kind", "atoms" (1-based),
// "specified", "cip" (absent when unspecified or undetermined),
// "ranked", "decisions"}.
func analysisUnit(u *stereo.Unit) analysisUnitJSON {
	out := analysisUnitJSON{Kind: u.Kind.String(), Specified: u.Specified, Permutation: u.Permutation,
		Atoms: make([]int, len(u.Atoms)), Ranked: []rankedJSON{}}
	for i, a := range u.Atoms {
		out.Atoms[i] = a + 1
	}
	if u.Specified && u.Descriptor.Labelled() {
		out.CIP = u.Descriptor.String()
	}
	for _, r := range u.Ranked {
		lj := rankedJSON{Rank: r.Rank}
		switch {
		case r.Atom >= 0:
			lj.Atom = r.Atom + 1
		case r.LonePair:
			lj.Implicit = "lone-pair"
		default:
			lj.Implicit = "hydrogen"
		}
		if (u.Kind == stereo.KindDoubleBond || u.Kind == stereo.KindAllene) && r.End < len(u.Atoms) {
			lj.End = u.Atoms[r.End] + 1
		}
		out.Ranked = append(out.Ranked, lj)
	}
	for _, d := range u.Decisions {
		out.Decisions = append(out.Decisions, decisionJSON{Higher: d.Higher, Lower: d.Lower, Rule: d.Rule.String(), Sphere: d.Sphere})
	}
	return out
}

// analysisJSON renders the units of an analysis as a JSON array.
func analysisJSON(a *stereo.Analysis) ([]byte, error) {
	if a == nil || len(a.Units) == 0 {
		return []byte("[]"), nil
	}
	units := make([]analysisUnitJSON, len(a.Units))
	for i := range a.Units {
		units[i] = analysisUnit(&a.Units[i])
	}
	return json.Marshal(units)
}

package stereo

import "encoding/json"

// unitJSON is the shape `describe --json` prints for one unit. Atom
// numbers are 1-based, as users count them in the notation.
type unitJSON struct {
	Kind        string         `json:"kind"`
	Atoms       []int          `json:"atoms"`
	Specified   bool           `json:"specified"`
	CIP         string         `json:"cip,omitempty"`
	Permutation int            `json:"permutation,omitempty"`
	Ranked      []ligandJSON   `json:"ranked"`
	Decisions   []decisionJSON `json:"decisions,omitempty"`
}

type ligandJSON struct {
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

// MarshalJSON renders the unit as {"kind", "atoms" (1-based),
// "specified", "cip" (absent when unspecified or undetermined),
// "ranked", "decisions"}.
func (u Unit) MarshalJSON() ([]byte, error) {
	out := unitJSON{Kind: u.Kind.String(), Specified: u.Specified, Permutation: u.Permutation,
		Atoms: make([]int, len(u.Atoms)), Ranked: []ligandJSON{}}
	for i, a := range u.Atoms {
		out.Atoms[i] = a + 1
	}
	if u.Specified && u.Descriptor.Labelled() {
		out.CIP = u.Descriptor.String()
	}
	for _, r := range u.Ranked {
		lj := ligandJSON{Rank: r.Rank}
		switch {
		case r.Atom >= 0:
			lj.Atom = r.Atom + 1
		case r.LonePair:
			lj.Implicit = "lone-pair"
		default:
			lj.Implicit = "hydrogen"
		}
		if (u.Kind == KindDoubleBond || u.Kind == KindAllene) && r.End < len(u.Atoms) {
			lj.End = u.Atoms[r.End] + 1
		}
		out.Ranked = append(out.Ranked, lj)
	}
	for _, d := range u.Decisions {
		out.Decisions = append(out.Decisions, decisionJSON{Higher: d.Higher, Lower: d.Lower, Rule: d.Rule.String(), Sphere: d.Sphere})
	}
	return json.Marshal(out)
}

// UnitsJSON renders the units of an analysis as a JSON array, for the
// describe command.
func UnitsJSON(a *Analysis) ([]byte, error) {
	if a == nil || len(a.Units) == 0 {
		return []byte("[]"), nil
	}
	return json.Marshal(a.Units)
}

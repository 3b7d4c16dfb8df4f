package depict

import (
	"encoding/json"
	"math"
)

// This file implements the JSON form of a drawing: {"atoms": [{"n", "x",
// "y", "label"}], "bonds": [{"ends": [i, j], "style", "narrow"}]}, atom
// numbers as describe prints them (added hydrogens after the record's
// last atom), coordinates in bond lengths with y up, "narrow" the atom at
// the narrow end of a wedge, hash or wavy bond and absent otherwise.

type atomJSON struct {
	N     int     `json:"n"`
	X     float64 `json:"x"`
	Y     float64 `json:"y"`
	Label string  `json:"label"`
}

type bondJSON struct {
	Ends   [2]int `json:"ends"`
	Style  string `json:"style"`
	Narrow *int   `json:"narrow,omitempty"`
}

type drawingJSON struct {
	Atoms []atomJSON `json:"atoms"`
	Bonds []bondJSON `json:"bonds"`
}

func round3(x float64) float64 {
	r := math.Round(x*1000) / 1000
	if r == 0 {
		return 0 // not -0
	}
	return r
}

// MarshalJSON renders the drawing in the shape above. An atom's label is
// the text drawn at it, "" for a plain carbon of the skeleton.
func (d *Drawing) MarshalJSON() ([]byte, error) {
	out := drawingJSON{Atoms: []atomJSON{}, Bonds: []bondJSON{}}
	for _, a := range d.Atoms {
		out.Atoms = append(out.Atoms, atomJSON{N: a.N, X: round3(a.P.X), Y: round3(a.P.Y), Label: a.Label})
	}
	for _, b := range d.Bonds {
		bj := bondJSON{Ends: [2]int{d.Atoms[b.A].N, d.Atoms[b.B].N}, Style: b.Style.String()}
		if b.Narrow >= 0 && b.Narrow < len(d.Atoms) {
			n := d.Atoms[b.Narrow].N
			bj.Narrow = &n
		}
		out.Bonds = append(out.Bonds, bj)
	}
	return json.Marshal(out)
}

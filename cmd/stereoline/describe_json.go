package main

import (
	"encoding/json"
	"math"
	"strconv"
)

// This file writes describe --json's records without reflection: the
// atoms and bonds, most of the output, are appended by hand, the rest of
// the record by encoding/json. The bytes are those json.Marshal writes
// (TestDescribeJSONMatchesMarshal).

// recordTailJSON is recordJSON after its bonds, embedded there, so
// encoding/json writes its fields in this order after the bonds.
type recordTailJSON struct {
	Formula     string           `json:"formula"`
	Mass        float64          `json:"averageMass"`
	Mono        float64          `json:"monoisotopicMass"`
	Diagnostics []diagnosticJSON `json:"diagnostics"`
	Stereo      []unitJSON       `json:"stereo"`
	Reaction    *reactionJSON    `json:"reaction,omitempty"`
	// Groups are the stereo groups of the extension block as written
	// (atoms 1-based, those the block lists within the record); nil
	// without a block. Configuration says how the specified chiral
	// units are known: absolute, relative, racemic or a mix.
	Groups        []groupJSON `json:"groups,omitempty"`
	Configuration string      `json:"configuration,omitempty"`
}

// appendRecordJSON appends d as json.Marshal writes it.
func appendRecordJSON(b []byte, d *recordJSON) ([]byte, error) {
	b = append(b, `{"input":`...)
	b = appendJSONString(b, d.Input)
	b = append(b, `,"name":`...)
	b = appendJSONString(b, d.Name)
	b = append(b, `,"atoms":`...)
	if d.Atoms == nil {
		b = append(b, "null"...)
	} else {
		b = append(b, '[')
		for i := range d.Atoms {
			if i > 0 {
				b = append(b, ',')
			}
			b = appendAtomJSON(b, &d.Atoms[i])
		}
		b = append(b, ']')
	}
	b = append(b, `,"bonds":`...)
	if d.Bonds == nil {
		b = append(b, "null"...)
	} else {
		b = append(b, '[')
		for i := range d.Bonds {
			if i > 0 {
				b = append(b, ',')
			}
			var err error
			if b, err = appendBondJSON(b, &d.Bonds[i]); err != nil {
				return b, err
			}
		}
		b = append(b, ']')
	}
	return appendTailJSON(b, &d.recordTailJSON)
}

// appendTailJSON appends the fields of t after a comma as json.Marshal
// writes them: the formula, masses, diagnostics and units by hand, the
// reaction and the stereo groups, which few records have, by
// encoding/json.
func appendTailJSON(b []byte, t *recordTailJSON) ([]byte, error) {
	b = append(b, `,"formula":`...)
	b = appendJSONString(b, t.Formula)
	b = append(b, `,"averageMass":`...)
	b, err := appendFloatJSON(b, t.Mass)
	if err != nil {
		return b, err
	}
	b = append(b, `,"monoisotopicMass":`...)
	if b, err = appendFloatJSON(b, t.Mono); err != nil {
		return b, err
	}
	b = append(b, `,"diagnostics":`...)
	if t.Diagnostics == nil {
		b = append(b, "null"...)
	} else {
		b = append(b, '[')
		for i := range t.Diagnostics {
			if i > 0 {
				b = append(b, ',')
			}
			e := &t.Diagnostics[i]
			b = append(b, `{"code":`...)
			b = appendJSONString(b, e.Code)
			b = append(b, `,"severity":`...)
			b = appendJSONString(b, e.Severity)
			b = append(b, `,"message":`...)
			b = appendJSONString(b, e.Message)
			b = append(b, `,"span":`...)
			b = appendPairJSON(b, e.Span)
			b = append(b, '}')
		}
		b = append(b, ']')
	}
	b = append(b, `,"stereo":`...)
	if t.Stereo == nil {
		b = append(b, "null"...)
	} else {
		b = append(b, '[')
		for i := range t.Stereo {
			if i > 0 {
				b = append(b, ',')
			}
			b = appendUnitJSON(b, &t.Stereo[i])
		}
		b = append(b, ']')
	}
	if t.Reaction == nil && t.Groups == nil && t.Configuration == "" {
		return append(b, '}'), nil
	}
	rest, err := json.Marshal(struct {
		Reaction      *reactionJSON `json:"reaction,omitempty"`
		Groups        []groupJSON   `json:"groups,omitempty"`
		Configuration string        `json:"configuration,omitempty"`
	}{t.Reaction, t.Groups, t.Configuration})
	if err != nil {
		return b, err
	}
	if len(rest) == 2 { // {}: every field empty
		return append(b, '}'), nil
	}
	b = append(b, ',')
	return append(b, rest[1:]...), nil
}

func appendUnitJSON(b []byte, u *unitJSON) []byte {
	b = append(b, `{"kind":`...)
	b = appendJSONString(b, u.Kind)
	b = append(b, `,"atoms":`...)
	b = appendIntsJSON(b, u.Atoms)
	b = append(b, `,"specified":`...)
	b = strconv.AppendBool(b, u.Specified)
	if u.CIP != "" {
		b = append(b, `,"cip":`...)
		b = appendJSONString(b, u.CIP)
	}
	b = append(b, `,"ranked":`...)
	if u.Ranked == nil {
		b = append(b, "null"...)
	} else {
		b = append(b, '[')
		for i := range u.Ranked {
			if i > 0 {
				b = append(b, ',')
			}
			l := &u.Ranked[i]
			b = append(b, `{"rank":`...)
			b = appendJSONInt(b, l.Rank)
			b = append(b, `,"atom":`...)
			if l.Atom == nil {
				b = append(b, "null"...)
			} else {
				b = appendJSONInt(b, *l.Atom)
			}
			if l.Implicit != "" {
				b = append(b, `,"implicit":`...)
				b = appendJSONString(b, l.Implicit)
			}
			if l.On != 0 {
				b = append(b, `,"on":`...)
				b = appendJSONInt(b, l.On)
			}
			b = append(b, '}')
		}
		b = append(b, ']')
	}
	if g := u.Group; g != nil {
		b = append(b, `,"group":{"kind":`...)
		b = appendJSONString(b, g.Kind)
		b = append(b, `,"number":`...)
		b = appendJSONInt(b, g.Number)
		if g.CIP != "" {
			b = append(b, `,"cip":`...)
			b = appendJSONString(b, g.CIP)
		}
		b = append(b, '}')
	}
	return append(b, '}')
}

func appendIntsJSON(b []byte, s []int) []byte {
	if s == nil {
		return append(b, "null"...)
	}
	b = append(b, '[')
	for i, v := range s {
		if i > 0 {
			b = append(b, ',')
		}
		b = appendJSONInt(b, v)
	}
	return append(b, ']')
}

// appendFloatJSON appends f as encoding/json writes a float64: the
// shortest decimal form, in exponent form (which goes through
// encoding/json) only below 1e-6 or from 1e21 on.
func appendFloatJSON(b []byte, f float64) ([]byte, error) {
	if a := math.Abs(f); a != 0 && (a < 1e-6 || a >= 1e21) || math.IsNaN(f) || math.IsInf(f, 0) {
		v, err := json.Marshal(f)
		return append(b, v...), err
	}
	return strconv.AppendFloat(b, f, 'f', -1, 64), nil
}

func appendAtomJSON(b []byte, a *atomJSON) []byte {
	b = append(b, `{"n":`...)
	b = appendJSONInt(b, a.N)
	b = append(b, `,"symbol":`...)
	b = appendJSONString(b, a.Symbol)
	b = append(b, `,"charge":`...)
	b = appendJSONInt(b, a.Charge)
	b = append(b, `,"hydrogens":`...)
	b = appendJSONInt(b, a.Hydrogens)
	b = append(b, `,"aromatic":`...)
	b = strconv.AppendBool(b, a.Aromatic)
	b = append(b, `,"map":`...)
	b = appendJSONInt(b, a.Map)
	if a.Isotope != 0 {
		b = append(b, `,"isotope":`...)
		b = appendJSONInt(b, a.Isotope)
	}
	if a.Role != "" {
		b = append(b, `,"role":`...)
		b = appendJSONString(b, a.Role)
	}
	b = append(b, `,"span":`...)
	b = appendPairJSON(b, a.Span)
	if a.Chirality != nil {
		b = append(b, `,"chirality":{"mark":`...)
		b = appendJSONString(b, a.Chirality.Mark)
		b = append(b, `,"span":`...)
		b = appendPairJSON(b, a.Chirality.Span)
		b = append(b, '}')
	}
	return append(b, '}')
}

func appendBondJSON(b []byte, bj *bondJSON) ([]byte, error) {
	b = append(b, `{"ends":`...)
	b = appendPairJSON(b, bj.Ends)
	b = append(b, `,"order":`...)
	switch o := bj.Order.(type) {
	case int:
		b = appendJSONInt(b, o)
	case string:
		b = appendJSONString(b, o)
	default:
		v, err := json.Marshal(o)
		if err != nil {
			return b, err
		}
		b = append(b, v...)
	}
	if bj.Mark != "" {
		b = append(b, `,"mark":`...)
		b = appendJSONString(b, bj.Mark)
	}
	b = append(b, `,"span":`...)
	b = appendPairJSON(b, bj.Span)
	if bj.Ring {
		b = append(b, `,"ring":true`...)
	}
	return append(b, '}'), nil
}

func appendPairJSON(b []byte, p [2]int) []byte {
	b = append(b, '[')
	b = appendJSONInt(b, p[0])
	b = append(b, ',')
	b = appendJSONInt(b, p[1])
	return append(b, ']')
}

// appendJSONString appends s quoted as encoding/json quotes it: printable
// ASCII other than '"', '\\' and the HTML characters it escapes is
// written as it is; anything else goes through encoding/json.
// appendJSONInt writes n in decimal; the numbers of a record (atom
// numbers, offsets, counts) are mostly one or two digits, written here
// without a call into strconv.
func appendJSONInt(b []byte, n int) []byte {
	switch {
	case n >= 0 && n < 10:
		return append(b, byte('0'+n))
	case n >= 10 && n < 100:
		return append(b, byte('0'+n/10), byte('0'+n%10))
	}
	return strconv.AppendInt(b, int64(n), 10)
}

// jsonSpecial marks the bytes appendJSONString leaves to encoding/json.
var jsonSpecial = func() (t [256]bool) {
	for c := range t {
		t[c] = c < 0x20 || c >= 0x7f || c == '"' || c == '\\' || c == '<' || c == '>' || c == '&'
	}
	return t
}()

func appendJSONString(b []byte, s string) []byte {
	for i := 0; i < len(s); i++ {
		if jsonSpecial[s[i]] {
			q, _ := json.Marshal(s) // a string always encodes
			return append(b, q...)
		}
	}
	b = append(b, '"')
	b = append(b, s...)
	return append(b, '"')
}

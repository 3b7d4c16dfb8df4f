package main

import (
	"encoding/json"
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
	tail, err := json.Marshal(d.recordTailJSON)
	if err != nil {
		return b, err
	}
	b = append(b, ',')
	return append(b, tail[1:]...), nil
}

func appendAtomJSON(b []byte, a *atomJSON) []byte {
	b = append(b, `{"n":`...)
	b = strconv.AppendInt(b, int64(a.N), 10)
	b = append(b, `,"symbol":`...)
	b = appendJSONString(b, a.Symbol)
	b = append(b, `,"charge":`...)
	b = strconv.AppendInt(b, int64(a.Charge), 10)
	b = append(b, `,"hydrogens":`...)
	b = strconv.AppendInt(b, int64(a.Hydrogens), 10)
	b = append(b, `,"aromatic":`...)
	b = strconv.AppendBool(b, a.Aromatic)
	b = append(b, `,"map":`...)
	b = strconv.AppendInt(b, int64(a.Map), 10)
	if a.Isotope != 0 {
		b = append(b, `,"isotope":`...)
		b = strconv.AppendInt(b, int64(a.Isotope), 10)
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
		b = strconv.AppendInt(b, int64(o), 10)
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
	b = strconv.AppendInt(b, int64(p[0]), 10)
	b = append(b, ',')
	b = strconv.AppendInt(b, int64(p[1]), 10)
	return append(b, ']')
}

// appendJSONString appends s quoted as encoding/json quotes it: printable
// ASCII other than '"', '\\' and the HTML characters it escapes is
// written as it is; anything else goes through encoding/json.
func appendJSONString(b []byte, s string) []byte {
	for i := 0; i < len(s); i++ {
		if c := s[i]; c < 0x20 || c >= 0x7f || c == '"' || c == '\\' || c == '<' || c == '>' || c == '&' {
			q, _ := json.Marshal(s) // a string always encodes
			return append(b, q...)
		}
	}
	b = append(b, '"')
	b = append(b, s...)
	return append(b, '"')
}

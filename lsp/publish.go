package lsp

// This file implements the writing of textDocument/publishDiagnostics
// for large documents: the JSON is written by hand in one buffer, so a
// list of 100,000 records with as many findings is not turned into
// protocol structures and marshalled by reflection on every edit.

import (
	"encoding/json"
	"fmt"
	"strconv"
	"unicode/utf8"

	"go.lsp.dev/protocol"

	"stereoline/stereo/document"
)

// diagnosticsJSON writes the params of a publishDiagnostics notification
// for res: the same JSON that marshalling publishDiagnosticsParams with
// toDiagnostics gives, field for field.
func diagnosticsJSON(f *fileVersion, res *document.Result, version *int32) (json.RawMessage, error) {
	b := make([]byte, 0, 64+len(res.Diagnostics)*200)
	b = append(b, `{"uri":`...)
	b = appendString(b, f.URI)
	if version != nil {
		b = append(b, `,"version":`...)
		b = strconv.AppendInt(b, int64(*version), 10)
	}
	b = append(b, `,"diagnostics":[`...)
	uri := appendString(nil, f.URI)
	for i := range res.Diagnostics {
		if i > 0 {
			b = append(b, ',')
		}
		var err error
		if b, err = appendDiagnostic(b, f.mapper, uri, &res.Diagnostics[i]); err != nil {
			return nil, err
		}
	}
	b = append(b, "]}"...)
	return b, nil
}

// appendDiagnostic writes one finding as a protocol Diagnostic; uri is
// the document's URI written as a JSON string.
func appendDiagnostic(b []byte, m *Mapper, uri []byte, d *document.Diagnostic) ([]byte, error) {
	rng, err := m.SpanToRange(d.Span)
	if err != nil {
		return b, fmt.Errorf("%s: %w", d.Code, err)
	}
	b = append(b, `{"range":`...)
	b = appendRange(b, rng)
	b = append(b, `,"severity":`...)
	b = strconv.AppendInt(b, int64(toSeverity(d.Severity)), 10)
	b = append(b, `,"code":`...)
	b = appendString(b, string(d.Code))
	b = append(b, `,"source":`...)
	b = appendString(b, document.Source)
	b = append(b, `,"message":`...)
	b = appendString(b, d.Message)
	if d.Unnecessary {
		b = append(b, `,"tags":[`...)
		b = strconv.AppendInt(b, int64(protocol.DiagnosticTagUnnecessary), 10)
		b = append(b, ']')
	}
	if len(d.Related) > 0 {
		b = append(b, `,"relatedInformation":[`...)
		for k, rel := range d.Related {
			r, err := m.SpanToRange(rel.Span)
			if err != nil {
				return b, fmt.Errorf("%s related: %w", d.Code, err)
			}
			if k > 0 {
				b = append(b, ',')
			}
			b = append(b, `{"location":{"uri":`...)
			b = append(b, uri...)
			b = append(b, `,"range":`...)
			b = appendRange(b, r)
			b = append(b, `},"message":`...)
			b = appendString(b, rel.Message)
			b = append(b, '}')
		}
		b = append(b, ']')
	}
	return append(b, '}'), nil
}

func appendRange(b []byte, r protocol.Range) []byte {
	b = append(b, `{"start":`...)
	b = appendPosition(b, r.Start)
	b = append(b, `,"end":`...)
	b = appendPosition(b, r.End)
	return append(b, '}')
}

func appendPosition(b []byte, p protocol.Position) []byte {
	b = append(b, `{"line":`...)
	b = strconv.AppendUint(b, uint64(p.Line), 10)
	b = append(b, `,"character":`...)
	b = strconv.AppendUint(b, uint64(p.Character), 10)
	return append(b, '}')
}

// appendString writes s as a JSON string. Control characters, quotes
// and backslashes are escaped; text that is not valid UTF-8 goes
// through encoding/json, which replaces what does not decode.
func appendString(b []byte, s string) []byte {
	if !utf8.ValidString(s) {
		q, _ := json.Marshal(s)
		return append(b, q...)
	}
	const hex = "0123456789abcdef"
	b = append(b, '"')
	start := 0
	for i := 0; i < len(s); i++ {
		c := s[i]
		if c >= 0x20 && c != '"' && c != '\\' {
			continue
		}
		b = append(b, s[start:i]...)
		switch c {
		case '"', '\\':
			b = append(b, '\\', c)
		case '\n':
			b = append(b, '\\', 'n')
		case '\r':
			b = append(b, '\\', 'r')
		case '\t':
			b = append(b, '\\', 't')
		default:
			b = append(b, '\\', 'u', '0', '0', hex[c>>4], hex[c&0xf])
		}
		start = i + 1
	}
	b = append(b, s[start:]...)
	return append(b, '"')
}

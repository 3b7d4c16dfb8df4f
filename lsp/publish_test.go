package lsp

import (
	"encoding/json"
	"reflect"
	"testing"

	"stereoline/stereo/document"
)

// TestDiagnosticsJSON checks that the hand-written publication decodes
// to the same value as the protocol structures marshalled by
// encoding/json, on a list with findings of every kind: reader errors,
// ineffective marks (tagged), relations (with related places), titles
// with quotes, tabs, non-ASCII and bytes that are not UTF-8 (records
// invented for the test).
func TestDiagnosticsJSON(t *testing.T) {
	text := "C[C@H](C)C \"quoted\\\" title\n" +
		"N[C@@H](C)C(=O)O\tα-alanine\n" +
		"N[C@H](C)C(=O)O\tits mirror image \x01\n" +
		"N[C@@H](C)C(=O)O\tagain \xff\xfe\n" +
		"C1CC(\tbroken\n" +
		"F/C=C/F\t𝛼 wide\n"
	for _, enc := range []PositionEncoding{EncodingUTF16, EncodingUTF8} {
		f := &fileVersion{URI: "file:///t/a \"b\".smi", Name: "/t/a.smi", Version: 3, mapper: NewMapper([]byte(text), enc)}
		res := document.NewAnalyzer(document.DefaultConfig()).Analyze(f.Name, "", []byte(text))
		if len(res.Diagnostics) < 4 {
			t.Fatalf("%d findings, want at least 4", len(res.Diagnostics))
		}
		version := f.Version
		raw, err := diagnosticsJSON(f, res, &version)
		if err != nil {
			t.Fatal(err)
		}
		diags, err := (&Server{}).toDiagnostics(f, res)
		if err != nil {
			t.Fatal(err)
		}
		want, _ := json.Marshal(publishDiagnosticsParams{URI: f.URI, Version: &version, Diagnostics: diags})
		var g, w any
		if err := json.Unmarshal(raw, &g); err != nil {
			t.Fatalf("%s: %v", raw, err)
		}
		json.Unmarshal(want, &w)
		if !reflect.DeepEqual(g, w) {
			t.Errorf("encoding %v:\n got %s\nwant %s", enc, raw, want)
		}
	}
}

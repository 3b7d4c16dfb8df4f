package main

import (
	"io"
	"os"
	"strings"
	"testing"
)

// scaleList is the list the scale benchmarks read: STEREOLINE_SCALE_LIST,
// e.g. the first 6,000 lines of a list written by
// testdata/scale/make_list.py (not committed: generate it).
func scaleList(b *testing.B) string {
	p := os.Getenv("STEREOLINE_SCALE_LIST")
	if p == "" {
		b.Skip("set STEREOLINE_SCALE_LIST to a list, e.g. /usr/bin/python3 testdata/scale/make_list.py 6000 > /tmp/6k.smi")
	}
	return p
}

// BenchmarkScaleDescribeJSON is describe --json on the scale list, the
// output thrown away; compare with testdata/scale/rdkit_parse_cip.py.
func BenchmarkScaleDescribeJSON(b *testing.B) {
	p := scaleList(b)
	for b.Loop() {
		if st := run([]string{"describe", "--json", p}, strings.NewReader(""), io.Discard, io.Discard); st != 0 {
			b.Fatalf("status %d", st)
		}
	}
}

// BenchmarkScaleCheck is check (relations included) on the scale list.
func BenchmarkScaleCheck(b *testing.B) {
	p := scaleList(b)
	for b.Loop() {
		if st := run([]string{"check", "--max-size", "1GB", p}, strings.NewReader(""), io.Discard, io.Discard); st > 1 {
			b.Fatalf("status %d", st)
		}
	}
}

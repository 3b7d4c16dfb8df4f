package notation

import (
	"fmt"
	"math/rand/v2"
	"strings"
	"testing"
)

// centreChain returns a chain of n stereocentres, C[C@H](F)[C@@H](F)...C,
// with the atom indices of its centres (1, 3, 5, ...).
func centreChain(n int) (string, []int) {
	var sb strings.Builder
	sb.WriteString("C")
	var centres []int
	for i := 0; i < n; i++ {
		centres = append(centres, 1+2*i)
		if i%2 == 0 {
			sb.WriteString("[C@H](F)")
		} else {
			sb.WriteString("[C@@H](F)")
		}
	}
	sb.WriteString("C")
	return sb.String(), centres
}

// TestExtensionHostile feeds blocks meant to break the reader: each must
// give a clear error with a span inside the text, a bounded error list
// and the notation still read. Time is measured in
// BenchmarkReadExtension, not here.
func TestExtensionHostile(t *testing.T) {
	const base = "C[C@H](O)[C@@H](C)Cl" // 6 atoms
	mega := 1 << 20
	repeat := func(s string) string { return strings.Repeat(s, mega/len(s)) }
	rng := rand.New(rand.NewPCG(1, 2))
	garbage := make([]byte, mega)
	for i := range garbage {
		garbage[i] = byte(rng.IntN(255) + 1)
		if garbage[i] == '|' || garbage[i] == '\n' || garbage[i] == '\r' {
			garbage[i] = 'x'
		}
	}
	chain, centres := centreChain(3000)
	var list []string
	for _, c := range centres {
		list = append(list, fmt.Sprint(c))
	}
	tests := []struct {
		why   string
		text  string
		code  Code // an error of this code must be reported; "" for none
		atoms int
	}{
		{"a megabyte of one atom listed again", base + " |o1:" + repeat("1,") + "1|", CodeGroupOverlap, 6},
		{"a megabyte of indices past the record", base + " |o1:" + repeat("7,") + "7|", CodeExtensionIndex, 6},
		{"a megabyte of huge indices", base + " |o1:" + repeat("99999999999999999999,") + "1|", CodeExtensionIndex, 6},
		{"one huge index of a megabyte", base + " |o1:" + repeat("9") + "|", CodeExtensionIndex, 6},
		{"a megabyte of coordinates", base + " |(" + repeat("1.5,-2.25,;") + "0,0,)|", CodeExtensionIndex, 6},
		{"a megabyte of labels", base + " |$" + repeat("ab;") + "$|", CodeExtensionIndex, 6},
		{"a megabyte of unknown fields", base + " |" + repeat("x:1,") + "a:1|", CodeExtensionKept, 6},
		{"a megabyte of empty fields", base + " |" + repeat(",") + "a:1|", "", 6},
		{"a megabyte of malformed groups", base + " |" + repeat("&1:1;") + "|", CodeExtensionField, 6},
		{"a megabyte of group fields", base + " |" + repeat("&1:1,") + "o1:3|", CodeGroupOverlap, 6},
		{"a megabyte of garbage", base + " |" + string(garbage) + "|", CodeExtensionKept, 6},
		{"a megabyte never closed", base + " |o1:" + repeat("1,"), CodeExtensionUnclosed, 6},
		{"a megabyte of '$' fields", base + " |" + repeat("$;") + "|", CodeExtensionField, 6},
		{"a megabyte of labels holding commas", base + " |" + repeat("$,") + "|", CodeExtensionKept, 6},
		{"a megabyte of atom properties", base + " |atomProp:" + repeat("0.p.v:") + "0.p.v|", CodeExtensionKept, 6},
		{"a group of 3000 centres", chain + " |o1:" + strings.Join(list, ",") + "|", "", 6002},
	}
	for _, tt := range tests {
		m := Read(tt.text)
		if len(m.Atoms) != tt.atoms {
			t.Errorf("%s: %d atoms, want %d", tt.why, len(m.Atoms), tt.atoms)
		}
		if len(m.Errors) > maxErrors+1 {
			t.Errorf("%s: %d errors, more than the bound", tt.why, len(m.Errors))
		}
		found := tt.code == ""
		for _, e := range m.Errors {
			if e.Span.Start < 0 || e.Span.End > len(tt.text) || e.Span.End < e.Span.Start {
				t.Errorf("%s: span %v outside the text", tt.why, e.Span)
			}
			if len(e.Msg) > 300 {
				t.Errorf("%s: message of %d bytes", tt.why, len(e.Msg))
			}
			found = found || e.Code == tt.code
			if tt.code == "" && e.Severity == SeverityError {
				t.Errorf("%s: %v", tt.why, e)
			}
		}
		if !found {
			t.Errorf("%s: no %s among %d errors: %v", tt.why, tt.code, len(m.Errors), m.Errors)
		}
	}
	// The group of 3000 centres survives a writing from its far end.
	m := Read(chain + " |o1:" + strings.Join(list, ",") + "|")
	w := Write(m, WriteOptions{Start: len(m.Atoms) - 1})
	checkRenumbered(t, "chain of 3000 centres", m, w)
}

// BenchmarkReadExtension reads blocks of growing size; the time per byte
// stays flat when reading is linear:
//
//	go test -run '^$' -bench ReadExtension ./notation/
func BenchmarkReadExtension(b *testing.B) {
	const base = "C[C@H](O)[C@@H](C)Cl"
	for _, size := range []int{1 << 10, 1 << 14, 1 << 18, 1 << 20} {
		for _, kind := range []struct{ name, unit, head string }{
			{"groups", "1,", "o1:"},
			{"coordinates", "1.5,-2.25,;", "("},
			{"unknown", "x:1,", ""},
		} {
			text := base + " |" + kind.head + strings.Repeat(kind.unit, size/len(kind.unit)) + "1|"
			b.Run(fmt.Sprintf("%s/%d", kind.name, size), func(b *testing.B) {
				b.SetBytes(int64(len(text)))
				for b.Loop() {
					Read(text)
				}
			})
		}
	}
}

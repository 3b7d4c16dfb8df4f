package lsp

import (
	"fmt"
	"strings"
	"testing"
	"time"
)

// benchRecords is the size of the list the benchmarks open.
const benchRecords = 100_000

// bigList writes n distinct records: alpha-amino acids
// N[C@@H](R)C(=O)O whose side chain R spells the record number in base
// 4 over C, O, N and S, so no two records share a notation and the cache
// cannot help the first analysis. Every thousandth record carries an
// ineffective mark, so there is something to publish.
func bigList(n int) string {
	var b strings.Builder
	atoms := [...]string{"C", "O", "N", "S"}
	for i := 0; i < n; i++ {
		if i%1000 == 999 {
			fmt.Fprintf(&b, "C[C@H](C)C marked %d\n", i)
			continue
		}
		b.WriteString("N[C@@H](C")
		for k, x := 0, i; k < 9; k++ {
			b.WriteString(atoms[x%4])
			x /= 4
		}
		fmt.Fprintf(&b, ")C(=O)O record %d\n", i)
	}
	return b.String()
}

// BenchmarkFirstDiagnostics measures didOpen of a 100,000-record list to
// its diagnostics arriving at the client, on a fresh server each time.
func BenchmarkFirstDiagnostics(b *testing.B) {
	text := bigList(benchRecords)
	b.SetBytes(int64(len(text)))
	for i := 0; i < b.N; i++ {
		b.StopTimer()
		c := start(b, clientSetup{debounce: time.Millisecond, limit: 5 * time.Minute})
		b.StartTimer()
		c.open("file:///bench/big.smi", "", 1, text)
		if d := c.diagnostics("file:///bench/big.smi", 1); len(d) < benchRecords/1000 {
			b.Fatalf("%d diagnostics, want at least %d", len(d), benchRecords/1000)
		}
		b.StopTimer()
		c.stop()
		b.StartTimer()
	}
}

// BenchmarkEditDiagnostics measures a one-line edit of the same list to
// its new diagnostics: the analysis cache keyed by notation text leaves
// one record to analyse, so the cost is the finder, the relation of the
// records and the protocol. The debounce is 1 ms here.
func BenchmarkEditDiagnostics(b *testing.B) {
	text := bigList(benchRecords)
	const u = "file:///bench/big.smi"
	c := start(b, clientSetup{debounce: time.Millisecond, limit: 5 * time.Minute})
	c.open(u, "", 1, text)
	c.diagnostics(u, 1)
	line := benchRecords / 2
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		// Toggle the mark of the centre of one record: @@ and @.
		v := int32(i + 2)
		if i%2 == 0 {
			c.change(u, v, edit(line, 3, line, 4, ""))
		} else {
			c.change(u, v, edit(line, 3, line, 3, "@"))
		}
		c.diagnostics(u, v)
	}
}

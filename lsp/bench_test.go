package lsp

import (
	"bytes"
	"fmt"
	"math/rand"
	"os"
	"strings"
	"testing"
	"time"

	"go.uber.org/zap"

	"stereoline/stereo/document"
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
// relations-ms is the time until the relations between the records (the
// 99 duplicates of the marked record) have arrived as well, in the same
// publication or a second one.
func BenchmarkFirstDiagnostics(b *testing.B) {
	benchOpen(b, bigList(benchRecords), benchRecords/1000)
}

// BenchmarkIsomerListDiagnostics is the same for a list of 20,000
// stereoisomers (isomerList), where every record needs identity keys for
// the relations: the first publication carries the records' own findings
// and the relations follow.
func BenchmarkIsomerListDiagnostics(b *testing.B) {
	benchOpen(b, isomerList(20_000), 20_000/50)
}

// benchOpen opens text on a fresh server per iteration and waits for at
// least minDiags diagnostics, then for the relations.
func benchOpen(b *testing.B, text string, minDiags int) {
	const u = "file:///bench/big.smi"
	b.SetBytes(int64(len(text)))
	var first, related time.Duration
	for i := 0; i < b.N; i++ {
		b.StopTimer()
		c := start(b, clientSetup{debounce: time.Millisecond, limit: 5 * time.Minute})
		b.StartTimer()
		begun := time.Now()
		c.open(u, "", 1, text)
		if d := c.diagnostics(u, 1); len(d) < minDiags {
			b.Fatalf("%d diagnostics, want at least %d", len(d), minDiags)
		}
		first += time.Since(begun)
		c.until("the relations", func() bool {
			for _, p := range c.diags {
				for _, d := range p.Diagnostics {
					if d.Code == string(document.CodeListDuplicate) || d.Code == string(document.CodeListStereoisomer) {
						return true
					}
				}
			}
			return false
		})
		related += time.Since(begun)
		b.StopTimer()
		c.stop()
		b.StartTimer()
	}
	b.ReportMetric(float64(first.Milliseconds())/float64(b.N), "first-ms")
	b.ReportMetric(float64(related.Milliseconds())/float64(b.N), "relations-ms")
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

// BenchmarkScaleEdit measures a one-line edit (a mark toggled) of the
// list STEREOLINE_SCALE_LIST names (testdata/scale/make_list.py) to its
// new diagnostics, relations included; it skips without the variable.
// The debounce is 1 ms here. lsp/testdata/scaleclient measures the same
// through a real process.
func BenchmarkScaleEdit(b *testing.B) {
	text := scaleList(b)
	lines := strings.Split(string(text), "\n")
	line := len(lines) / 2
	for ; line < len(lines) && !strings.Contains(lines[line], "@"); line++ {
	}
	col := strings.Index(lines[line], "@")
	const u = "file:///bench/scale.smi"
	c := start(b, clientSetup{debounce: time.Millisecond, limit: 5 * time.Minute})
	c.open(u, "", 1, string(text))
	c.until("the relations", func() bool {
		for _, p := range c.diags {
			for _, d := range p.Diagnostics {
				if strings.HasPrefix(fmt.Sprint(d.Code), "list-") {
					return true
				}
			}
		}
		return false
	})
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		v := int32(i + 2)
		if i%2 == 0 {
			c.change(u, v, edit(line, col, line, col, "@"))
		} else {
			c.change(u, v, edit(line, col, line, col+1, ""))
		}
		c.diagnostics(u, v)
	}
}

// BenchmarkScaleRepublish measures, inside the server and without the
// protocol, what one edit of the list STEREOLINE_SCALE_LIST names costs
// after its debounce: the new line table, the engine's Reanalyze from the
// previous result and the publishDiagnostics JSON of the new result (in
// parts, made from the last publication, as the server makes it); a mark
// is toggled on a line in the middle. It skips without the variable.
func BenchmarkScaleRepublish(b *testing.B) {
	text := scaleList(b)
	mid := bytes.IndexByte(text[len(text)/2:], '@') + len(text)/2
	a := document.NewAnalyzer(document.DefaultConfig())
	prev := a.Analyze("scale.smi", "", text)
	versions := [2][]byte{text, append(append(append([]byte(nil), text[:mid]...), '@'), text[mid:]...)}
	last, err := publish(nil, &fileVersion{URI: "file:///bench/scale.smi", Name: "scale.smi", mapper: NewMapper(text, EncodingUTF16)}, prev, nil)
	if err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		content := versions[(i+1)%2]
		f := &fileVersion{URI: "file:///bench/scale.smi", Name: "scale.smi", mapper: NewMapper(content, EncodingUTF16)}
		next := a.Reanalyze(prev, "scale.smi", "", content)
		v := int32(i)
		p, err := publish(last, f, next, &v)
		if err != nil {
			b.Fatal(err)
		}
		last.release(p)
		last, prev = p, next
	}
}

// scaleList returns the list STEREOLINE_SCALE_LIST names, skipping the
// benchmark without it.
func scaleList(b testing.TB) []byte {
	name := os.Getenv("STEREOLINE_SCALE_LIST")
	if name == "" {
		b.Skip("STEREOLINE_SCALE_LIST is not set")
	}
	text, err := os.ReadFile(name)
	if err != nil {
		b.Skip(err)
	}
	return text
}

// BenchmarkScaleEditKinds is BenchmarkScaleRepublish for each kind of
// one-line edit lsp/testdata/scaleclient makes, at random lines: a mark
// toggled, a title extended, a line inserted (a copy of another record
// with a new title) and a line deleted, and a line inserted or deleted
// at the top, which moves every record. It reports the three parts of
// the work apart: the new line table (map-ms), Reanalyze (analyze-ms)
// and the publishDiagnostics JSON (publish-ms), and the page faults of
// the process (faults/op). It skips without
// STEREOLINE_SCALE_LIST.
func BenchmarkScaleEditKinds(b *testing.B) {
	text := scaleList(b)
	a := document.NewAnalyzer(document.DefaultConfig())
	base := a.Analyze("scale.smi", "", text)
	kinds := []struct {
		name string
		edit func(text []byte, rng *rand.Rand) []byte
	}{
		{"mark", func(text []byte, rng *rand.Rand) []byte {
			for {
				from, to := randomLine(text, rng)
				line := text[from:to]
				if i := bytes.Index(line, []byte("@@")); i >= 0 {
					return splice(text, from+i, from+i+1, "")
				}
				if i := bytes.IndexByte(line, '@'); i >= 0 {
					return splice(text, from+i, from+i, "@")
				}
			}
		}},
		{"title", func(text []byte, rng *rand.Rand) []byte {
			_, to := randomLine(text, rng)
			return splice(text, to-1, to-1, "x")
		}},
		{"insert", func(text []byte, rng *rand.Rand) []byte {
			from, to := randomLine(text, rng)
			at, _ := randomLine(text, rng)
			rec := text[from:to]
			if i := bytes.IndexAny(rec, " \t"); i >= 0 {
				rec = rec[:i]
			}
			return splice(text, at, at, string(rec)+"\tinserted\n")
		}},
		{"delete", func(text []byte, rng *rand.Rand) []byte {
			from, to := randomLine(text, rng)
			return splice(text, from, to, "")
		}},
		// at the top, every record after the edit moves: the most work
		{"insert-top", func(text []byte, rng *rand.Rand) []byte {
			from, to := randomLine(text, rng)
			rec := text[from:to]
			if i := bytes.IndexAny(rec, " \t"); i >= 0 {
				rec = rec[:i]
			}
			return splice(text, 0, 0, string(rec)+"\tinserted\n")
		}},
		{"delete-top", func(text []byte, rng *rand.Rand) []byte {
			return splice(text, 0, bytes.IndexByte(text, '\n')+1, "")
		}},
	}
	for _, k := range kinds {
		b.Run(k.name, func(b *testing.B) {
			rng := rand.New(rand.NewSource(1))
			prev, content := base, text
			m := NewMapper(text, EncodingUTF16)
			// the server published the list when it was opened
			last, err := publish(nil, &fileVersion{URI: "file:///bench/scale.smi", Name: "scale.smi", mapper: m}, base, nil)
			if err != nil {
				b.Fatal(err)
			}
			var mapping, analysing, publishing time.Duration
			b.ReportAllocs()
			b.ResetTimer()
			counting := zap.NewExample() // minorFaults counts for a debug log
			faults := minorFaults(counting)
			for i := 0; i < b.N; i++ {
				next := k.edit(content, rng)
				t0 := time.Now()
				m = m.Replace(lastSplice.from, lastSplice.to, lastSplice.n, next)
				content = next
				f := &fileVersion{URI: "file:///bench/scale.smi", Name: "scale.smi", mapper: m}
				t1 := time.Now()
				res := a.Reanalyze(prev, "scale.smi", "", content)
				t2 := time.Now()
				v := int32(i)
				p, err := publish(last, f, res, &v)
				if err != nil {
					b.Fatal(err)
				}
				last.release(p)
				last = p
				t3 := time.Now()
				mapping, analysing, publishing = mapping+t1.Sub(t0), analysing+t2.Sub(t1), publishing+t3.Sub(t2)
				prev = res
			}
			b.ReportMetric(float64(mapping.Microseconds())/1e3/float64(b.N), "map-ms")
			b.ReportMetric(float64(analysing.Microseconds())/1e3/float64(b.N), "analyze-ms")
			b.ReportMetric(float64(publishing.Microseconds())/1e3/float64(b.N), "publish-ms")
			// page faults are the cost of fresh memory (see idleGarbage)
			b.ReportMetric(float64(minorFaults(counting)-faults)/float64(b.N), "faults/op")
		})
	}
}

// randomLine returns the bounds of a random whole line of text, its line
// break included.
func randomLine(text []byte, rng *rand.Rand) (from, to int) {
	at := rng.Intn(len(text))
	from = bytes.LastIndexByte(text[:at], '\n') + 1
	to = len(text)
	if k := bytes.IndexByte(text[from:], '\n'); k >= 0 {
		to = from + k + 1
	}
	return from, to
}

// lastSplice is the edit splice made last.
var lastSplice struct{ from, to, n int }

// splice returns a copy of text with text[from:to] replaced by s.
func splice(text []byte, from, to int, s string) []byte {
	lastSplice.from, lastSplice.to, lastSplice.n = from, to, len(s)
	out := make([]byte, 0, len(text)-(to-from)+len(s))
	out = append(append(append(out, text[:from]...), s...), text[to:]...)
	return out
}

// BenchmarkScalePublish measures the publishDiagnostics JSON of the list
// STEREOLINE_SCALE_LIST names, analysed once; it skips without it.
func BenchmarkScalePublish(b *testing.B) {
	text := scaleList(b)
	res := document.NewAnalyzer(document.DefaultConfig()).Analyze("scale.smi", "", text)
	f := &fileVersion{URI: "file:///bench/scale.smi", Name: "scale.smi", mapper: NewMapper(text, EncodingUTF16)}
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		v := int32(i)
		p, err := publish(nil, f, res, &v)
		if err != nil {
			b.Fatal(err)
		}
		p.release(nil)
	}
}

// BenchmarkScalePublishMoved measures the publishDiagnostics JSON of the
// list STEREOLINE_SCALE_LIST names after a record was inserted at its
// top, made from the publication before the edit: every finding moved
// down a line. It skips without the list.
func BenchmarkScalePublishMoved(b *testing.B) {
	text := scaleList(b)
	a := document.NewAnalyzer(document.DefaultConfig())
	res := a.Analyze("scale.smi", "", text)
	m := NewMapper(text, EncodingUTF16)
	last, err := publish(nil, &fileVersion{URI: "file:///bench/scale.smi", Name: "scale.smi", mapper: m}, res, nil)
	if err != nil {
		b.Fatal(err)
	}
	first := text[:bytes.IndexByte(text, '\n')+1]
	next := splice(text, 0, 0, string(first))
	m = m.Replace(lastSplice.from, lastSplice.to, lastSplice.n, next)
	moved := a.Reanalyze(res, "scale.smi", "", next)
	f := &fileVersion{URI: "file:///bench/scale.smi", Name: "scale.smi", mapper: m}
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		v := int32(i)
		p, err := publish(last, f, moved, &v)
		if err != nil {
			b.Fatal(err)
		}
		// p's buffers, not last's, go back for reuse
		for _, buf := range p.bufs {
			if !last.uses(buf) && cap(buf) >= pooledBuffer {
				putPartBuffer(buf)
			}
		}
	}
}

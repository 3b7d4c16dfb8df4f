package document

import (
	"os"
	"runtime/pprof"
	"testing"
	"time"
)

func TestTmpPhase(t *testing.T) {
	text, err := os.ReadFile("/tmp/big100k.smi")
	if err != nil {
		t.Skip()
	}
	for k := 0; k < 3; k++ {
		a := NewAnalyzer(DefaultConfig())
		t0 := time.Now()
		r := a.AnalyzeRecords("big.smi", "", text)
		t1 := time.Now()
		if k == 2 {
			f, _ := os.Create("/tmp/fp-relate.prof")
			pprof.StartCPUProfile(f)
			defer func() { pprof.StopCPUProfile(); f.Close() }()
		}
		r2 := r.Relate()
		t2 := time.Now()
		t.Logf("records %v relate %v (%d)", t1.Sub(t0), t2.Sub(t1), len(r2.Diagnostics))
	}
}

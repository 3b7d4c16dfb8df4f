package notation

import "testing"

// TestMirrorPermutation checks the mirror pairs against the OpenSMILES
// 3.9 tables: @TB1/@TB2 and @OH1/@OH2 share an axis and turn the other
// way (the specification lists them so); the mirror is an involution
// without fixed points for TB and OH; SP maps to itself.
func TestMirrorPermutation(t *testing.T) {
	pairs := []struct {
		g    ChiralClass
		a, b int
	}{
		{ChiralTB, 1, 2}, {ChiralTB, 9, 11}, {ChiralTB, 15, 20},
		{ChiralOH, 1, 2}, {ChiralOH, 3, 16}, {ChiralOH, 4, 14}, {ChiralOH, 10, 8}, {ChiralOH, 25, 30},
	}
	for _, p := range pairs {
		if got, ok := MirrorPermutation(p.g, p.a); !ok || got != p.b {
			t.Errorf("MirrorPermutation(%v, %d) = %d, %v; want %d", p.g, p.a, got, ok, p.b)
		}
	}
	for _, g := range []ChiralClass{ChiralTB, ChiralOH} {
		for n := 1; n <= classLimit(g); n++ {
			m, ok := MirrorPermutation(g, n)
			if !ok || m == n {
				t.Errorf("%v%d: mirror %d, %v", g, n, m, ok)
				continue
			}
			if back, _ := MirrorPermutation(g, m); back != n {
				t.Errorf("%v%d: mirror of mirror is %d", g, n, back)
			}
		}
	}
	if m, ok := MirrorPermutation(ChiralSP, 2); !ok || m != 2 {
		t.Errorf("SP2 mirror = %d, %v", m, ok)
	}
	if _, ok := MirrorPermutation(ChiralOH, 31); ok {
		t.Errorf("OH31 accepted")
	}
}

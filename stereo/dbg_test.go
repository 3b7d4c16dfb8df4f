package stereo

import (
	"fmt"
	"os"
	"strconv"
	"testing"

	"stereoline/notation"
)

func TestDebugOne(t *testing.T) {
	smi := os.Getenv("SMI")
	if smi == "" {
		t.Skip()
	}
	a := Analyze(notation.Read(smi))
	for _, u := range a.Units {
		t.Logf("%v %v %v spec=%v ranked=%v dec=%v", u.Kind, u.Atoms, u.Descriptor, u.Specified, u.Ranked, u.Decisions)
	}
	for _, e := range a.Diagnostics {
		t.Logf("%v", e)
	}
}

func TestDebugSpheres(t *testing.T) {
	smi := os.Getenv("SMI2")
	if smi == "" {
		t.Skip()
	}
	m := notation.Read(smi)
	l := &labeller{g: newGraph(m), cfg: newConfigs(), nodeCap: defaultNodeCap, res: &Analysis{}}
	l.readCentres()
	d := newDigraph(l.g, l.cfg, 1, defaultNodeCap)
	d.refAtom = 0
	ligs := d.ligandsOf(0, noNode)
	var a, b nodeID
	for _, n := range ligs {
		if d.nodes[n].atom == 2 {
			a = n
		}
		if d.nodes[n].atom == 7 {
			b = n
		}
	}
	for _, x := range []nodeID{a, b} {
		q := []step{{x, 0}}
		for s := 1; s <= 8; s++ {
			var row []string
			var next []step
			for _, st := range q {
				nd := d.nodes[st.n]
				row = append(row, fmt.Sprintf("%d%s:%v", nd.atom, map[nodeKind]string{0: "", 1: "d", 2: "h", 3: "l"}[nd.kind], rule6Value(d, 0, st.n)))
				for _, k := range d.sortedNeighbours(0, st.n, st.from, Rule6) {
					next = append(next, step{k, st.n})
				}
			}
			t.Logf("sphere %d: %v", s, row)
			q = next
		}
	}
}

func TestDebugAux(t *testing.T) {
	smi := os.Getenv("SMI3")
	if smi == "" {
		t.Skip()
	}
	m := notation.Read(smi)
	l := &labeller{g: newGraph(m), cfg: newConfigs(), nodeCap: defaultNodeCap, res: &Analysis{}}
	l.readCentres()
	l.readBonds()
	rootAtom, _ := strconv.Atoi(os.Getenv("ROOT"))
	maxDepth, _ := strconv.Atoi(os.Getenv("DEPTH"))
	d := newDigraph(l.g, l.cfg, rootAtom, defaultNodeCap)
	var walk func(n nodeID, depth int)
	walk = func(n nodeID, depth int) {
		if depth > maxDepth {
			return
		}
		for _, k := range d.kids(n) {
			if x := d.auxFor(0, k); x != DescNone {
				t.Logf("node %d atom %d depth %d aux %v", k, d.nodes[k].atom, d.nodes[k].depth, x)
			}
			walk(k, depth+1)
		}
	}
	walk(0, 0)
}

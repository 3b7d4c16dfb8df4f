package lsp

import (
	"fmt"
	"math/rand"
	"reflect"
	"strings"
	"testing"
	"time"

	"go.lsp.dev/protocol"
)

// TestEditsEqualFreshOpen applies one-line edits of every kind (a mark,
// a title, an inserted line, a deleted line) to an open list of 1,000
// stereoisomers, which the server analyses from the previous version's
// result, and checks after each that the published diagnostics,
// relations included, equal those of a fresh open of the edited text.
func TestEditsEqualFreshOpen(t *testing.T) {
	c := start(t, clientSetup{debounce: time.Millisecond, limit: 2 * time.Minute,
		hook: func(s *Server) { s.relationGrace = time.Minute }})
	defer c.stop()
	n, steps := 1000, 16
	if testing.Short() {
		n, steps = 300, 8
	}
	lines := strings.Split(strings.TrimSuffix(isomerList(n), "\n"), "\n")
	text := func() string { return strings.Join(lines, "\n") + "\n" }
	const u = "file:///w/edited.smi"
	c.open(u, "", 1, text())
	c.diagnostics(u, 1)
	rng := rand.New(rand.NewSource(5))
	for step := 0; step < steps; step++ {
		v := int32(step + 2)
		i := rng.Intn(len(lines) - 1)
		if step%5 != 4 {
			i = 40 + rng.Intn(len(lines)-41) // past the lines the layout is read from
		}
		var what string
		switch step % 4 {
		case 0:
			k := strings.Index(lines[i], "@")
			if k < 0 {
				k = 1
			}
			if lines[i][k+1] == '@' {
				c.change(u, v, edit(i, k, i, k+1, ""))
				lines[i] = lines[i][:k] + lines[i][k+1:]
			} else {
				c.change(u, v, edit(i, k, i, k, "@"))
				lines[i] = lines[i][:k] + "@" + lines[i][k:]
			}
			what = "mark"
		case 1:
			c.change(u, v, edit(i, len(lines[i]), i, len(lines[i]), "x"))
			lines[i] += "x"
			what = "title"
		case 2:
			copied := strings.Fields(lines[rng.Intn(len(lines))])[0] + " copy"
			c.change(u, v, edit(i, 0, i, 0, copied+"\n"))
			lines = append(lines[:i], append([]string{copied}, lines[i:]...)...)
			what = "insert"
		case 3:
			c.change(u, v, edit(i, 0, i+1, 0, ""))
			lines = append(lines[:i], lines[i+1:]...)
			what = "delete"
		}
		got := located(c.diagnostics(u, v))
		fresh := fmt.Sprintf("file:///w/fresh%d.smi", step)
		c.open(fresh, "", 1, text())
		want := located(c.diagnostics(fresh, 1))
		if !reflect.DeepEqual(got, want) {
			t.Fatalf("step %d (%s of line %d): %d diagnostics after the edit, %d on a fresh open; first difference:\n%s",
				step, what, i, len(got), len(want), firstDifference(got, want))
		}
	}
}

// located drops the document URI from related places, so diagnostics
// of two documents with the same text compare equal.
func located(ds []protocol.Diagnostic) []protocol.Diagnostic {
	for i := range ds {
		for k := range ds[i].RelatedInformation {
			ds[i].RelatedInformation[k].Location.URI = ""
		}
	}
	return ds
}

func firstDifference(got, want []protocol.Diagnostic) string {
	for i := range min(len(got), len(want)) {
		if !reflect.DeepEqual(got[i], want[i]) {
			return fmt.Sprintf(" got %+v\nwant %+v", got[i], want[i])
		}
	}
	return "(one is a prefix of the other)"
}

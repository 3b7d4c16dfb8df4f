package depict

import (
	"fmt"
	"io"
	"strings"
)

// This file implements the MDL molfile writer (the V2000 connection
// table, CTfile formats, common practice): atoms with the drawing's
// coordinates, Kekulé bond orders, and the bond stereo flags of the
// wedges (1), hashes (6), wavy single bonds (4) and crossed double bonds
// (3), each stereo bond listed from its narrow end. Atom numbers are the
// drawing's: the record's atoms in order, then added hydrogens.

// WriteMolfile writes the drawing as one V2000 molfile, ending in
// "M  END" (callers joining several into an SD file add "$$$$").
func WriteMolfile(w io.Writer, d *Drawing) error {
	var b strings.Builder
	title := strings.ReplaceAll(d.Title, "\n", " ")
	if len(title) > 80 {
		title = title[:80]
	}
	b.WriteString(title + "\n")
	b.WriteString("  stereoline        2D\n")
	b.WriteString("\n")
	if len(d.Atoms) > 999 || len(d.Bonds) > 999 {
		return fmt.Errorf("molfile: %d atoms and %d bonds exceed the V2000 limit of 999", len(d.Atoms), len(d.Bonds))
	}
	chiral := 0
	for _, bd := range d.Bonds {
		if bd.Style == StyleWedge || bd.Style == StyleHash {
			chiral = 1
		}
	}
	fmt.Fprintf(&b, "%3d%3d  0  0%3d  0  0  0  0  0999 V2000\n", len(d.Atoms), len(d.Bonds), chiral)
	for _, a := range d.Atoms {
		sym := a.Symbol
		if a.Element == 0 {
			sym = "R#"
			if a.Symbol == "*" {
				sym = "A"
			}
		}
		fmt.Fprintf(&b, "%10.4f%10.4f%10.4f %-3s 0  0  0  0  0  0  0  0  0  0  0  0\n", a.P.X, a.P.Y, 0.0, sym)
	}
	for _, bd := range d.Bonds {
		order := bd.Order
		if order < 1 || order > 3 {
			order = 1
		}
		if bd.Style == StyleAromatic && bd.Order == 0 {
			order = 4
		}
		flag := 0
		x, y := bd.A, bd.B
		switch bd.Style {
		case StyleWedge:
			flag = 1
		case StyleHash:
			flag = 6
		case StyleWavy:
			flag = 4
			if order == 2 {
				flag = 3
			}
		}
		if bd.Narrow == bd.B {
			x, y = y, x
		}
		fmt.Fprintf(&b, "%3d%3d%3d%3d\n", x+1, y+1, order, flag)
	}
	var chg, iso []string
	for i, a := range d.Atoms {
		if a.Charge != 0 {
			chg = append(chg, fmt.Sprintf(" %3d %3d", i+1, a.Charge))
		}
		if a.Isotope != 0 {
			iso = append(iso, fmt.Sprintf(" %3d %3d", i+1, a.Isotope))
		}
	}
	for _, group := range []struct {
		tag  string
		list []string
	}{{"CHG", chg}, {"ISO", iso}} {
		for k := 0; k < len(group.list); k += 8 {
			part := group.list[k:min(k+8, len(group.list))]
			fmt.Fprintf(&b, "M  %s%3d%s\n", group.tag, len(part), strings.Join(part, ""))
		}
	}
	b.WriteString("M  END\n")
	_, err := io.WriteString(w, b.String())
	return err
}

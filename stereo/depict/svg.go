package depict

import (
	"fmt"
	"html"
	"io"
	"math"
	"strconv"
	"strings"
)

// This file implements the SVG writer. The picture carries its own
// background, light by default and dark when the viewer prefers a dark
// scheme (the colours of both switch together), so it reads the same in
// light and dark editor themes; text stays text.

// palette gives the light and dark value of each colour role.
var palette = [...][2]string{
	colFg:       {"#1c1d21", "#e4e5e8"},
	colBg:       {"#fbfbf8", "#1f2125"},
	colDesc:     {"#0b7285", "#66d0e0"},
	colErr:      {"#c22a2a", "#ff7b72"},
	colWarn:     {"#9a6200", "#f2b84b"},
	colMuted:    {"#6a6d73", "#9da2a8"},
	colErrFill:  {"rgba(214,48,48,0.22)", "rgba(255,110,100,0.30)"},
	colWarnFill: {"rgba(230,160,20,0.28)", "rgba(242,184,75,0.30)"},
	// a blue the warning and error fills do not come near
	colChangeFill: {"rgba(40,110,230,0.32)", "rgba(110,170,255,0.40)"},
}

var classOf = [...]string{colFg: "f", colBg: "g", colDesc: "d", colErr: "e", colWarn: "w", colMuted: "m", colErrFill: "ef", colWarnFill: "wf", colChangeFill: "cf"}

// WriteSVG writes the drawing as a standalone SVG document.
func WriteSVG(w io.Writer, d *Drawing) error { return writeSVG(w, d, "t", true) }

// WriteSVGFragment writes the drawing as an <svg> element for a page that
// holds many drawings: without a style sheet of its own (the page
// carries SVGStyle once) and with id as the id of its title, which must
// be unique in the page.
func WriteSVGFragment(w io.Writer, d *Drawing, id string) error { return writeSVG(w, d, id, false) }

// SVGStyle returns the style sheet of the drawings' colours, light and
// dark, for a page that holds fragments written by WriteSVGFragment.
func SVGStyle() string { return styleSheet(func(colour) bool { return true }) }

func writeSVG(w io.Writer, d *Drawing, id string, standalone bool) error {
	sc := buildScene(d)
	var b strings.Builder
	fmt.Fprintf(&b, `<svg xmlns="http://www.w3.org/2000/svg" width="%g" height="%g" viewBox="0 0 %g %g" role="img" aria-labelledby="%s">`+"\n",
		sc.w, sc.h, sc.w, sc.h, esc(id))
	title := sc.title
	if title == "" {
		title = sc.desc
	}
	fmt.Fprintf(&b, "<title id=\"%s\">%s</title>\n<desc>%s</desc>\n", esc(id), esc(title), esc(describeUnits(d)))
	if standalone {
		// the change fill only where a drawing uses it, so drawings
		// without it stay as they were
		used := map[colour]bool{}
		for _, p := range sc.prims {
			used[p.col] = true
		}
		b.WriteString(styleSheet(func(c colour) bool { return c != colChangeFill || used[c] }))
	}
	fmt.Fprintf(&b, `<rect class="g" x="0" y="0" width="%g" height="%g" rx="6"/>`+"\n", sc.w, sc.h)
	for _, p := range sc.prims {
		writePrim(&b, &p)
	}
	b.WriteString("</svg>\n")
	_, err := io.WriteString(w, b.String())
	return err
}

// styleSheet writes the <style> element of the colours keep accepts.
func styleSheet(keep func(colour) bool) string {
	var b strings.Builder
	b.WriteString("<style>\n")
	for _, scheme := range []int{0, 1} {
		if scheme == 1 {
			b.WriteString("@media (prefers-color-scheme: dark) {\n")
		}
		for c, v := range palette {
			if !keep(colour(c)) {
				continue
			}
			cls := classOf[c]
			fmt.Fprintf(&b, ".%s{fill:%s;stroke:%s}\n", cls, v[scheme], v[scheme])
		}
		if scheme == 1 {
			b.WriteString("}\n")
		}
	}
	b.WriteString("text{stroke:none;font-family:'Go',Helvetica,Arial,sans-serif}\n.l{fill:none}\n</style>\n")
	return b.String()
}

func esc(s string) string { return html.EscapeString(s) }

// f1 writes a coordinate with one decimal, without a trailing ".0".
func f1(x float64) string {
	s := strconv.FormatFloat(math.Round(x*10)/10, 'f', 1, 64)
	s = strings.TrimSuffix(s, ".0")
	if s == "-0" {
		return "0"
	}
	return s
}

func writePrim(b *strings.Builder, p *prim) {
	cls := classOf[p.col]
	switch p.kind {
	case pLine:
		b.WriteString(`<line class="` + cls + `" x1="` + f1(p.pts[0].X) + `" y1="` + f1(p.pts[0].Y) + `" x2="` + f1(p.pts[1].X) +
			`" y2="` + f1(p.pts[1].Y) + `" stroke-width="` + f1(p.w) + `" stroke-linecap="round"/>` + "\n")
	case pPoly:
		fmt.Fprintf(b, `<polygon class="%s" stroke-width="0.6" stroke-linejoin="round" points="%s"/>`+"\n", cls, points(p.pts))
	case pPath:
		fmt.Fprintf(b, `<polyline class="%s l" stroke-width="%s" stroke-linejoin="round" stroke-linecap="round" points="%s"/>`+"\n", cls, f1(p.w), points(p.pts))
	case pCircle:
		fmt.Fprintf(b, `<circle class="%s" stroke-width="0" cx="%s" cy="%s" r="%s"/>`+"\n", cls, f1(p.pts[0].X), f1(p.pts[0].Y), f1(p.r))
	case pText:
		anchor := "start"
		switch p.anchor {
		case 0:
			anchor = "middle"
		case 1:
			anchor = "end"
		}
		style := ""
		if p.bold {
			style += ` font-weight="bold"`
		}
		if p.italic {
			style += ` font-style="italic"`
		}
		fmt.Fprintf(b, `<text class="%s" x="%s" y="%s" font-size="%s" text-anchor="%s"%s>`, cls, f1(p.pts[0].X), f1(p.pts[0].Y), f1(p.size), anchor, style)
		if len(p.runs) == 1 && p.runs[0].shift == 0 {
			b.WriteString(esc(p.runs[0].s))
		} else {
			// each run sets its baseline relative to the one before
			cur := 0.0
			for _, r := range p.runs {
				target, size := 0.0, p.size
				switch r.shift {
				case -1:
					target, size = p.size*0.3, p.size*0.72
				case 1:
					target, size = -p.size*0.4, p.size*0.72
				}
				dy := ""
				if target != cur {
					dy = fmt.Sprintf(` dy="%s"`, f1(target-cur))
				}
				fs := ""
				if size != p.size {
					fs = fmt.Sprintf(` font-size="%s"`, f1(size))
				}
				fmt.Fprintf(b, `<tspan%s%s>%s</tspan>`, dy, fs, esc(r.s))
				cur = target
			}
		}
		b.WriteString("</text>\n")
	}
}

func points(ps []Point) string {
	var b strings.Builder
	for i, p := range ps {
		if i > 0 {
			b.WriteByte(' ')
		}
		b.WriteString(f1(p.X))
		b.WriteByte(',')
		b.WriteString(f1(p.Y))
	}
	return b.String()
}

// describeUnits is the text alternative of a drawing: the notation and
// its descriptors.
func describeUnits(d *Drawing) string {
	var parts []string
	for _, x := range d.Descriptors {
		parts = append(parts, x.Text)
	}
	s := d.Notation
	if len(parts) > 0 {
		s += " — CIP: " + strings.Join(parts, ", ")
	}
	return s + ". " + Caution
}

package main

import (
	"bufio"
	"bytes"
	"fmt"
	"html"
	"strconv"
	"strings"

	"stereoline/notation"
	"stereoline/stereo"
	"stereoline/stereo/depict"
	"stereoline/stereo/reaction"
	"stereoline/stereo/review"
)

// This file implements the HTML form of 'stereoline diff': one page that
// holds everything it shows (the drawings as inline SVG, the style
// sheet, and a short script for the filters and pages that loads
// nothing), so it works offline and as a CI artifact. Records are shown
// a page of pageSize at a time, each as a section that opens to its
// drawings. The first page is ordinary markup; the records after it are
// written as the same markup inside script elements of a type no browser
// runs, which a browser scans as plain text instead of building
// thousands of drawings it would not show, and which the page's script
// turns into markup when their page is shown. A page of 2,000 records
// so opens about as fast as one of a hundred.

// classNotes explain each class in the page's summary table.
var classNotes = map[review.Class]string{
	review.Rewritten:           "the same compound and configuration, written differently",
	review.StereoAdded:         "marks now fix units that were open",
	review.StereoRemoved:       "units that were fixed are now open",
	review.GroupsChanged:       "the same stereoisomers, now absolute, relative or racemic otherwise",
	review.BondFlipped:         "double bonds changed E/Z, nothing else",
	review.Epimer:              "one stereocentre inverted, the others kept",
	review.Diastereomer:        "several units changed, not into the mirror image",
	review.Enantiomer:          "the mirror image",
	review.ConstitutionChanged: "a different compound",
	review.Unreadable:          "a version does not read",
	review.Added:               "a new record",
	review.Removed:             "a record that is gone",
}

// openFirst is how many records are shown open when the page loads;
// pageSize how many are shown at a time.
const (
	openFirst = 10
	pageSize  = 100
)

// writeDiffHTML writes the page.
func writeDiffHTML(w *bufio.Writer, files []*diffFile, base string) error {
	sum := summarizeDiff(files)
	listed := 0
	for _, n := range sum.byClass {
		listed += n
	}
	esc := html.EscapeString
	fmt.Fprintf(w, "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n")
	fmt.Fprintf(w, "<title>Stereo review against %s: %s</title>\n", esc(base), esc(plural(listed, "record")))
	w.WriteString(depict.SVGStyle())
	w.WriteString(pageStyle)
	w.WriteString("</head>\n<body>\n<header>\n")
	fmt.Fprintf(w, "<h1>Stereo review against <code>%s</code></h1>\n", esc(base))
	fmt.Fprintf(w, "<p class=\"rv-caution\">Every label on this page is computed from the notation <strong>as written</strong>; Stereoline cannot know whether it describes the compound in the bottle. Critical assignments need analytical confirmation and qualified review under your local rules: treat this page as a reviewer's aid, not as proof.</p>\n")
	fmt.Fprintf(w, "<p class=\"rv-counts\">%s changed, %s in them; <strong id=\"rv-listed\">%d</strong> listed, %d unchanged", plural(sum.files, "file"), plural(sum.records, "record"), listed, sum.unchanged)
	if sum.skipped > 0 {
		fmt.Fprintf(w, "; %s skipped", plural(sum.skipped, "file"))
	}
	w.WriteString(".</p>\n")
	w.WriteString("<table class=\"rv-summary\">\n<thead><tr><th>show</th><th>class</th><th>records</th><th>meaning</th></tr></thead>\n<tbody>\n")
	for _, c := range review.Classes() {
		n := sum.byClass[c]
		disabled := ""
		if n == 0 {
			disabled = " disabled"
		}
		fmt.Fprintf(w, "<tr><td><input type=\"checkbox\" class=\"rv-filter\" value=\"%s\" checked%s aria-label=\"show %s\"></td><td><span class=\"rv-badge rv-%s\">%s</span></td><td class=\"rv-num\">%d</td><td>%s</td></tr>\n",
			c, disabled, c, c, c, n, esc(classNotes[c]))
	}
	w.WriteString("</tbody>\n</table>\n")
	w.WriteString("<p class=\"rv-tools\"><button type=\"button\" id=\"rv-open\">open this page</button> <button type=\"button\" id=\"rv-close\">close all</button> <label>find <input type=\"search\" id=\"rv-find\" placeholder=\"title, path or text\"></label> <span id=\"rv-shown\"></span></p>\n")
	w.WriteString("<nav class=\"rv-pages\"><button type=\"button\" id=\"rv-prev\">previous</button> <span id=\"rv-page\"></span> <button type=\"button\" id=\"rv-next\">next</button></nav>\n")
	if listed > pageSize {
		fmt.Fprintf(w, "<noscript><p>This page shows the first %d records; the others need JavaScript (the page loads nothing). The JSON Lines form (--format json) lists every record.</p></noscript>\n", pageSize)
	}
	w.WriteString("</header>\n<main>\n")
	// Each record's markup is made on all cores (the drawings are most
	// of the work), then written in order.
	type item struct {
		f    *diffFile
		ps   placers
		p    *review.Pair
		html []byte
	}
	var items []item
	for _, f := range files {
		if f.report == nil || len(f.report.Pairs) == 0 {
			continue
		}
		ps := placersOf(f.report)
		for i := range f.report.Pairs {
			items = append(items, item{f: f, ps: ps, p: &f.report.Pairs[i]})
		}
	}
	eachOnAllCores(len(items), func(k int) {
		it := &items[k]
		var b bytes.Buffer
		bw := bufio.NewWriter(&b)
		writeRecordHTML(bw, it.f.path, it.p, it.ps, base, k+1)
		bw.Flush()
		it.html = b.Bytes()
	})
	var section *diffFile
	for k, it := range items {
		if it.f != section {
			if section != nil {
				w.WriteString("</section>\n")
			}
			section = it.f
			fmt.Fprintf(w, "<section class=\"rv-file\">\n<h2>%s</h2>\n", esc(it.f.path))
		}
		if k < pageSize {
			w.Write(it.html)
			continue
		}
		// The markup holds no "</script": text and attributes are
		// escaped, and drawings write no script.
		fmt.Fprintf(w, "<script type=\"text/x-stereoline-record\" class=\"rv-lazy\" data-class=\"%s\" data-find=\"%s\">", it.p.Class, html.EscapeString(findText(it.f.path, it.p)))
		w.Write(it.html)
		w.WriteString("</script>\n")
	}
	if section != nil {
		w.WriteString("</section>\n")
	}
	n := len(items)
	if n == 0 {
		w.WriteString("<p>No record changed.</p>\n")
	}
	w.WriteString("</main>\n")
	w.WriteString(pageScript)
	w.WriteString("</body>\n</html>\n")
	return nil
}

// writeRecordHTML writes one record's section.
func writeRecordHTML(w *bufio.Writer, path string, p *review.Pair, ps placers, base string, n int) {
	esc := html.EscapeString
	line, col := ps.where(p)
	title := recordTitle(p)
	open := ""
	if n <= openFirst {
		open = " open"
	}
	fmt.Fprintf(w, "<details class=\"rv-rec\" id=\"r%d\" data-class=\"%s\" data-find=\"%s\"%s>\n", n, p.Class, esc(findText(path, p)), open)
	fmt.Fprintf(w, "<summary><span class=\"rv-badge rv-%s\">%s</span> <span class=\"rv-where\">%s:%d:%d</span>", p.Class, p.Class, esc(path), line, col)
	if title != "" {
		fmt.Fprintf(w, " <strong>%s</strong>", esc(title))
	}
	fmt.Fprintf(w, " <span class=\"rv-expl\">%s</span></summary>\n", esc(p.Explanation))
	w.WriteString("<div class=\"rv-body\">\n<div class=\"rv-sides\">\n")
	if p.Old != nil {
		ol, _ := ps.old.at(p.Old.Occ.Span.Start)
		writeSideHTML(w, p, false, fmt.Sprintf("before: %s, line %d", base, ol), fmt.Sprintf("d%do", n))
	}
	if p.New != nil {
		nl, _ := ps.new.at(p.New.Occ.Span.Start)
		writeSideHTML(w, p, true, fmt.Sprintf("now: line %d", nl), fmt.Sprintf("d%dn", n))
	}
	w.WriteString("</div>\n")
	fmt.Fprintf(w, "<p class=\"rv-full\">%s</p>\n", esc(p.Explanation))
	if len(p.Units) > 0 {
		w.WriteString("<table class=\"rv-units\"><thead><tr><th>unit</th><th>before</th><th>after</th></tr></thead><tbody>\n")
		for _, u := range p.Units {
			old, new := u.Marked()
			fmt.Fprintf(w, "<tr><td>%s</td><td>%s</td><td>%s</td></tr>\n", esc(unitCell(p, &u)), labelCell(u.Before, old), labelCell(u.After, new))
		}
		w.WriteString("</tbody></table>\n")
	}
	if len(p.Centres) > 0 {
		w.WriteString("<table class=\"rv-units\"><thead><tr><th>mapped centre</th><th>before</th><th>after</th></tr></thead><tbody>\n")
		for _, c := range p.Centres {
			fmt.Fprintf(w, "<tr><td>map %d</td><td>%s</td><td>%s</td></tr>\n", c.Map, centreCell(c.Before, c.OldPresent), centreCell(c.After, c.NewPresent))
		}
		w.WriteString("</tbody></table>\n")
	}
	if len(p.Findings) > 0 {
		w.WriteString("<ul class=\"rv-findings\">\n")
		for _, fc := range p.Findings {
			what := "gone"
			if fc.Introduced {
				what = "new"
			}
			fmt.Fprintf(w, "<li class=\"rv-%s\"><span class=\"rv-sev\">%s %s</span> %s <code>%s</code></li>\n", fc.Severity, what, fc.Severity, esc(fc.Message), esc(string(fc.Code)))
		}
		w.WriteString("</ul>\n")
	}
	w.WriteString("</div>\n</details>\n")
}

// recordTitle is the title of the record, new or old.
func recordTitle(p *review.Pair) string {
	if p.New != nil {
		return p.New.Occ.Title
	}
	return p.Old.Occ.Title
}

// findText is what the search field looks in: path, title and notation
// of both sides, in lower case.
func findText(path string, p *review.Pair) string {
	parts := []string{path}
	for _, r := range []*review.Record{p.Old, p.New} {
		if r != nil {
			parts = append(parts, r.Occ.Title, r.Occ.Text)
		}
	}
	return strings.ToLower(strings.Join(parts, " "))
}

// writeSideHTML writes one version's drawing, with the changed units
// highlighted, and its notation with the changed marks highlighted.
func writeSideHTML(w *bufio.Writer, p *review.Pair, newSide bool, caption, id string) {
	r := p.Old
	cls := "rv-old"
	if newSide {
		r, cls = p.New, "rv-new"
	}
	fmt.Fprintf(w, "<figure class=\"%s\">\n<figcaption>%s</figcaption>\n", cls, html.EscapeString(caption))
	d := drawForReview(r, p, newSide)
	var b strings.Builder
	if err := depict.WriteSVGFragment(&b, d, id); err == nil {
		w.WriteString(b.String())
	}
	fmt.Fprintf(w, "<code class=\"rv-notation\">%s</code>\n</figure>\n", markedNotation(r.Occ.Text, p.ChangedMarks(newSide)))
}

// drawForReview draws a record with the atoms and bonds of its changed
// units marked.
func drawForReview(r *review.Record, p *review.Pair, newSide bool) *depict.Drawing {
	opt := depict.Options{}
	if len(r.Mol().Atoms) <= depict.MaxAtoms {
		opt.Analysis = r.Stereo()
		if r.Reaction() != nil {
			opt.Diagnostics = r.Reaction().Diagnostics
		}
	}
	d := depict.Draw(r.Mol(), opt)
	atoms := map[int]bool{}
	var bonds [][2]int
	for _, u := range p.Units {
		as := u.OldAtoms
		if newSide {
			as = u.Atoms
		}
		for _, a := range as {
			atoms[a] = true
		}
		if u.Kind == stereo.KindDoubleBond && len(as) == 2 {
			bonds = append(bonds, [2]int{as[0], as[1]})
		}
	}
	for i := range d.Atoms {
		if a := &d.Atoms[i]; !a.Added && atoms[a.N-1] {
			a.Mark = depict.MarkChange
		}
	}
	for i := range d.Bonds {
		b := &d.Bonds[i]
		x, y := d.Atoms[b.A].N-1, d.Atoms[b.B].N-1
		for _, e := range bonds {
			if x == e[0] && y == e[1] || x == e[1] && y == e[0] {
				b.Mark = depict.MarkChange
			}
		}
	}
	return d
}

// markedNotation escapes a record's text with the given spans in <mark>.
func markedNotation(text string, marks []notation.Span) string {
	var b strings.Builder
	at := 0
	for _, m := range marks {
		if m.Start < at || m.End > len(text) || m.Start >= m.End {
			continue
		}
		b.WriteString(html.EscapeString(text[at:m.Start]))
		b.WriteString("<mark>" + html.EscapeString(text[m.Start:m.End]) + "</mark>")
		at = m.End
	}
	b.WriteString(html.EscapeString(text[at:]))
	return b.String()
}

func unitCell(p *review.Pair, u *review.UnitChange) string {
	var m *notation.Molecule
	atoms := u.Atoms
	if atoms != nil {
		m = p.New.Mol()
	} else {
		m, atoms = p.Old.Mol(), u.OldAtoms
	}
	var names []string
	for _, a := range atoms {
		if a >= 0 && a < len(m.Atoms) {
			names = append(names, notation.ElementSymbol(m.Atoms[a].Number)+fmt.Sprint(a+1))
		}
	}
	sep := ", "
	if u.Kind == stereo.KindDoubleBond {
		sep = "="
	}
	s := strings.Join(names, sep)
	if u.Atoms == nil {
		s += " (old numbering)"
	}
	if u.Role != notation.RoleNone {
		s += " in the " + u.Role.String() + "s"
	}
	return s
}

func labelCell(d stereo.Descriptor, marked bool) string {
	switch {
	case !marked:
		return "<span class=\"rv-open\">unmarked</span>"
	case d.Labelled():
		return "<strong>" + d.String() + "</strong>"
	}
	return "marked, no label"
}

func centreCell(c reaction.Change, present bool) string {
	if !present {
		return "<span class=\"rv-open\">not followed</span>"
	}
	return c.String()
}

// pageStyle is the page's own style sheet; its class names start with
// rv- so they never meet the drawings' colour classes.
const pageStyle = `<style>
:root{color-scheme:light dark;--fg:#1c1d21;--bg:#f4f4f1;--card:#fbfbf8;--muted:#6a6d73;--line:#d8d8d2;--mark:rgba(40,110,230,0.22)}
@media (prefers-color-scheme: dark){:root{--fg:#e4e5e8;--bg:#17181b;--card:#1f2125;--muted:#9da2a8;--line:#3a3d43;--mark:rgba(110,170,255,0.34)}}
body{margin:0;font:14px/1.45 system-ui,-apple-system,"Segoe UI",Helvetica,Arial,sans-serif;color:var(--fg);background:var(--bg)}
header{padding:16px 24px 8px;border-bottom:1px solid var(--line);background:var(--card)}
h1{font-size:20px;margin:0 0 8px}
h2{font-size:15px;margin:20px 0 8px;font-family:ui-monospace,Menlo,Consolas,monospace}
main{padding:0 24px 40px}
.rv-caution{border-left:4px solid #9a6200;padding:6px 10px;margin:8px 0;background:rgba(230,160,20,0.12);max-width:70em}
.rv-summary{border-collapse:collapse;margin:8px 0}
.rv-summary th,.rv-summary td{padding:3px 10px;border-bottom:1px solid var(--line);text-align:left}
.rv-num{text-align:right!important;font-variant-numeric:tabular-nums}
.rv-badge{display:inline-block;padding:0 7px;border-radius:9px;font-size:12px;font-weight:600;color:#fff;background:#6a6d73;white-space:nowrap}
.rv-rewritten{background:#5b7a5b}.rv-stereo-added{background:#3f7f9f}.rv-stereo-removed{background:#9a6200}.rv-groups-changed{background:#5a6f9a}
.rv-bond-flipped{background:#8a4fb0}.rv-epimer{background:#c05621}.rv-diastereomer{background:#b7410e}
.rv-enantiomer{background:#c22a2a}.rv-constitution-changed{background:#7a1f5c}.rv-unreadable{background:#444}
.rv-added{background:#2f7d3c}.rv-removed{background:#6a6d73}
.rv-tools button{font:inherit;padding:2px 10px}
.rv-tools input[type=search]{font:inherit;width:18em}
.rv-rec{background:var(--card);border:1px solid var(--line);border-radius:6px;margin:6px 0}
.rv-rec>summary{padding:6px 10px;cursor:pointer;white-space:nowrap;overflow:hidden;text-overflow:ellipsis}
.rv-where{font-family:ui-monospace,Menlo,Consolas,monospace;color:var(--muted)}
.rv-expl{color:var(--fg)}
.rv-body{padding:4px 12px 12px;content-visibility:auto}
.rv-sides{display:flex;flex-wrap:wrap;gap:16px}
.rv-sides figure{margin:0;display:flex;flex-direction:column;gap:4px;max-width:48%}
.rv-sides figcaption{font-weight:600;color:var(--muted)}
.rv-sides svg{max-width:100%;height:auto}
.rv-notation{font-family:ui-monospace,Menlo,Consolas,monospace;word-break:break-all;white-space:pre-wrap}
.rv-notation mark{background:var(--mark);color:inherit;outline:1px solid rgba(40,110,230,0.7);border-radius:2px}
.rv-units{border-collapse:collapse;margin:8px 0}
.rv-units th,.rv-units td{padding:2px 10px;border-bottom:1px solid var(--line);text-align:left}
.rv-open{color:var(--muted);font-style:italic}
.rv-findings{margin:6px 0;padding-left:20px}
.rv-sev{font-weight:600}
.rv-error .rv-sev{color:#c22a2a}.rv-warning .rv-sev{color:#9a6200}
.rv-full{margin:8px 0}
</style>
`

// pageScript runs the filters and the pages: the class check boxes and
// the search field choose the records, shown a page at a time; records
// written as text (after the first page) become markup when their page
// is shown. It loads nothing.
var pageScript = `<script>
(function () {
  var size = ` + strconv.Itoa(pageSize) + `;
  var items = Array.prototype.slice.call(document.querySelectorAll('details.rv-rec, script.rv-lazy'));
  var boxes = Array.prototype.slice.call(document.querySelectorAll('input.rv-filter'));
  var find = document.getElementById('rv-find');
  var shown = document.getElementById('rv-shown');
  var label = document.getElementById('rv-page');
  var page = 0, chosen = [];
  function live(i) {
    var el = items[i];
    if (el.tagName === 'SCRIPT') {
      var t = document.createElement('template');
      t.innerHTML = el.textContent;
      var rec = t.content.firstElementChild;
      el.replaceWith(rec);
      items[i] = rec;
      el = rec;
    }
    return el;
  }
  function choose() {
    var on = {};
    boxes.forEach(function (b) { on[b.value] = b.checked; });
    var q = find.value.trim().toLowerCase();
    chosen = [];
    items.forEach(function (el, i) {
      if (on[el.dataset.class] && (q === '' || el.dataset.find.indexOf(q) >= 0)) { chosen.push(i); }
    });
    page = 0;
    show();
  }
  function show() {
    var pages = Math.max(1, Math.ceil(chosen.length / size));
    page = Math.min(Math.max(page, 0), pages - 1);
    var visible = {};
    chosen.slice(page * size, (page + 1) * size).forEach(function (i) { visible[i] = true; });
    items.forEach(function (el, i) {
      if (visible[i]) { live(i).hidden = false; } else if (el.tagName !== 'SCRIPT') { el.hidden = true; }
    });
    shown.textContent = chosen.length + ' of ' + items.length + ' records chosen';
    label.textContent = 'page ' + (page + 1) + ' of ' + pages;
    document.getElementById('rv-prev').disabled = page === 0;
    document.getElementById('rv-next').disabled = page >= pages - 1;
  }
  boxes.forEach(function (b) { b.addEventListener('change', choose); });
  find.addEventListener('input', choose);
  document.getElementById('rv-prev').addEventListener('click', function () { page--; show(); });
  document.getElementById('rv-next').addEventListener('click', function () { page++; show(); window.scrollTo(0, document.querySelector('main').offsetTop); });
  document.getElementById('rv-open').addEventListener('click', function () {
    items.forEach(function (el) { if (el.tagName !== 'SCRIPT' && !el.hidden) { el.open = true; } });
  });
  document.getElementById('rv-close').addEventListener('click', function () {
    items.forEach(function (el) { if (el.tagName !== 'SCRIPT') { el.open = false; } });
  });
  choose();
})();
</script>
`

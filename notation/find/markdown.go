package find

import (
	"bytes"
	"strings"

	"stereoline/notation"
)

// findMarkdown reads a CommonMark document:
//   - a fenced code block (``` or ~~~) whose info string starts with
//     smiles, smi, rsmi or cxsmiles holds one record a line, as a list
//     ('#' lines are comments and may carry pragmas);
//   - a fenced block tagged with a language we lex (python, js, go, ...)
//     is searched as that language;
//   - a fenced block without a tag, or tagged as plain text, holds a
//     record on a line when the line starts with text that is
//     unmistakably notation (see unmistakable), a title after it;
//   - an inline code span is notation when it is unmistakably so, or when
//     the text just before it mentions SMILES ("SMILES: `CCO`"); see
//     codespan.go for spans over line breaks;
//   - <!-- stereoline: ... --> comments are pragmas.
//
// Backslashes are literal in code spans and blocks, so maps are plain.
func findMarkdown(src []byte, cfg *Config) []Occurrence {
	prag := newPragmas(src)
	nm := newNamer(cfg)
	var out []Occurrence
	var fence struct {
		open      bool
		char      byte
		n         int
		records   bool
		guess     bool // untagged: lines are guessed
		kind      Kind
		bodyStart int
	}
	// table is the table being read: its last row, and the names of its
	// structure columns once its delimiter row is read ("" for the
	// others; nil before the delimiter row or outside a table).
	var table struct {
		last    []byte
		columns []string
		title   int
	}
	table.title = -1
	// para is the paragraph being read: code spans may run over its
	// lines but not out of it.
	para := notation.Span{Start: -1}
	flush := func() {
		if para.Start >= 0 {
			out = inlineCode(out, src[para.Start:para.End], para.Start, nil, prag, nm, cfg)
			para.Start = -1
		}
	}
	for start := 0; start < len(src); {
		line, next := nextLine(src, start)
		lineStart := start
		start = next
		indent := 0
		for indent < len(line) && indent < 4 && line[indent] == ' ' {
			indent++
		}
		body := line[indent:]
		if fence.open {
			if n := fenceRun(body, fence.char); n >= fence.n && len(bytes.TrimSpace(body[n:])) == 0 {
				if fence.kind != KindUnknown && fence.kind != KindMarkdown {
					inner := FindKind(fence.kind, src[fence.bodyStart:lineStart], *cfg)
					lift(inner, identityMap(fence.bodyStart, lineStart-fence.bodyStart), nil)
					out = append(out, inner...)
				}
				fence.open = false
				continue
			}
			switch {
			case fence.records:
				out = fencedRecord(out, line, lineStart, prag)
			case fence.guess && !cfg.NoGuess:
				out = guessedFenceRecord(out, line, lineStart, prag)
			}
			continue
		}
		if t := bytes.TrimLeft(line, " \t"); len(t) == 0 || t[0] != '|' {
			table.last, table.columns, table.title = nil, nil, -1 // a table ends at a line that is no row
		}
		if len(bytes.TrimSpace(line)) == 0 {
			flush()
			continue
		}
		if indent < 4 {
			if n := fenceRun(body, '`'); n >= 3 {
				fence.open, fence.char, fence.n = true, '`', n
			} else if n := fenceRun(body, '~'); n >= 3 {
				fence.open, fence.char, fence.n = true, '~', n
			}
			if fence.open {
				flush()
				info := strings.Fields(strings.ToLower(string(body[fence.n:])))
				fence.records, fence.guess, fence.kind, fence.bodyStart = false, false, KindUnknown, start
				if len(info) == 0 {
					fence.guess = true
				}
				if len(info) > 0 {
					// "{r}", "{python echo=FALSE}", "{r, label}": the
					// chunk headers of R Markdown and Quarto
					tag := strings.Trim(info[0], "{}.,")
					switch tag {
					case "smiles", "smi", "rsmi", "cxsmiles":
						fence.records = true
					case "text", "txt", "plain", "plaintext":
						fence.guess = true
					default:
						fence.kind = KindFor(tag)
						if fence.kind == KindUnknown {
							fence.kind = fenceAliases[tag]
						}
					}
				}
				if start > len(src) {
					fence.bodyStart = len(src)
				}
				continue
			}
		}
		if k := bytes.Index(line, []byte("<!--")); k >= 0 {
			prag.addComment(line[k:], lineStart+k)
		}
		if t := bytes.TrimLeft(line, " \t"); len(t) > 0 && t[0] == '|' {
			// A table row (GitHub Flavored Markdown, "Tables"): its
			// cells are split at unescaped pipes before code spans are
			// read, so each cell is read on its own. The row before the
			// delimiter row is the header: the cells of a column it
			// names as structures are notation.
			flush()
			switch {
			case table.last != nil && table.columns == nil && delimiterRow(line):
				table.columns, table.title = headerColumns(table.last, nm, cfg)
			default:
				out = tableRowCode(out, line, lineStart, table.columns, table.title, prag, nm, cfg)
			}
			table.last = line
			continue
		}
		heading := indent < 4 && len(body) > 0 && body[0] == '#'
		if heading || startsItem(line) {
			// An ATX heading is a block of one line; a list item
			// starts a block of its own.
			flush()
		}
		if para.Start < 0 {
			para.Start = lineStart
		}
		para.End = start
		if heading {
			flush()
		}
	}
	flush()
	return out
}

// fenceAliases are info-string tags editors write for our languages.
var fenceAliases = map[string]Kind{
	"py": KindPython, "python3": KindPython, "js": KindJavaScript, "ts": KindJavaScript,
	"jsx": KindJavaScript, "tsx": KindJavaScript, "golang": KindGo, "rs": KindRust,
	"kt": KindKotlin, "jl": KindJulia, "yml": KindYAML,
}

// fenceRun returns the length of the run of c starting line.
func fenceRun(line []byte, c byte) int {
	n := 0
	for n < len(line) && line[n] == c {
		n++
	}
	return n
}

// fencedRecord adds the record on one line of a smiles fence.
func fencedRecord(out []Occurrence, line []byte, lineStart int, prag *pragmas) []Occurrence {
	line, lineStart = trimLead(line, lineStart)
	if len(line) == 0 || line[0] == '\r' {
		return out
	}
	if line[0] == '#' {
		prag.addComment(line, lineStart)
		return out
	}
	if !prag.allowed(lineStart) {
		return out
	}
	recEnd, ts, te := splitRecord(line)
	return append(out, fenceOccurrence(line, lineStart, recEnd, ts, te, ReasonPlace))
}

// guessedFenceRecord adds the record a line of an untagged fence starts
// with, when it is unmistakably notation: such a block holds output,
// commands and prose as often as records.
func guessedFenceRecord(out []Occurrence, line []byte, lineStart int, prag *pragmas) []Occurrence {
	line, lineStart = trimLead(line, lineStart)
	recEnd, ts, te := splitRecord(line)
	if recEnd < 3 || !prag.allowed(lineStart) {
		return out
	}
	rec := string(line[:recEnd])
	rs := decide(rec, wants{guess: true})
	if len(rs) != 1 || rs[0].from != 0 || rs[0].to != len(rec) || rs[0].dialect != DialectSMILES {
		return out
	}
	return append(out, fenceOccurrence(line, lineStart, recEnd, ts, te, ReasonGuess))
}

// trimLead drops the blanks a line of a block starts with.
func trimLead(line []byte, lineStart int) ([]byte, int) {
	lead := leadingBlanks(line)
	return line[lead:], lineStart + lead
}

// fenceOccurrence is the record line[:recEnd] of a block's line starting
// at lineStart, titled line[ts:te].
func fenceOccurrence(line []byte, lineStart, recEnd, ts, te int, reason Reason) Occurrence {
	return Occurrence{
		Text:      string(line[:recEnd]),
		Title:     string(line[ts:te]),
		Span:      notation.Span{Start: lineStart, End: lineStart + recEnd},
		Kind:      KindMarkdown,
		Construct: ConstructFencedRecord,
		Reason:    reason,
		m:         identityMap(lineStart, recEnd),
	}
}

// startsItem reports whether a line starts a list item (CommonMark 5.2:
// '-', '+' or '*', or one to nine digits and '.' or ')', then a blank or
// the line end), which ends the paragraph before it.
func startsItem(line []byte) bool {
	b := bytes.TrimLeft(line, " \t")
	if len(b) == 0 {
		return false
	}
	n := 0
	switch {
	case b[0] == '-' || b[0] == '+' || b[0] == '*':
		n = 1
	default:
		for n < len(b) && n < 9 && b[n] >= '0' && b[n] <= '9' {
			n++
		}
		if n == 0 || n >= len(b) || b[n] != '.' && b[n] != ')' {
			return false
		}
		n++
	}
	return n == len(b) || b[n] == ' ' || b[n] == '\t' || b[n] == '\r'
}

// tableRowCode adds the notation in the cells of a table row: in the
// code spans of any cell, and a cell of a structure column (columns[k]
// names it; columns is nil for a header row) as a whole unless it holds a
// code span, whose content is then taken as named by the column. title
// is the title column's index, or -1.
func tableRowCode(out []Occurrence, line []byte, lineStart int, columns []string, title int, prag *pragmas, nm namer, cfg *Config) []Occurrence {
	cells := rowCells(line)
	name := ""
	if title >= 0 && title+1 < len(cells) {
		name = cellName(line[cells[title+1][0]:cells[title+1][1]])
	}
	for n, c := range cells {
		k := n - 1 // the text before the first pipe is no cell
		cell, at := line[c[0]:c[1]], lineStart+c[0]
		pre := line[:c[0]]
		named := k >= 0 && k < len(columns) && columns[k] != ""
		if named {
			pre = []byte(columns[k] + " ")
		}
		n0 := len(out)
		if named && bytes.IndexByte(cell, '`') < 0 {
			out = markdownCell(out, cell, at, prag)
		} else {
			out = inlineCode(out, cell, at, pre, prag, nm, cfg)
		}
		for i := n0; i < len(out); i++ {
			out[i].Title = name
		}
	}
	return out
}

// rowCells returns the starts and ends of the pieces of a table row
// between unescaped pipes: the text before the first pipe, each cell,
// the text after the last.
func rowCells(line []byte) [][2]int {
	var cells [][2]int
	for from, i := 0, 0; i <= len(line); i++ {
		if i < len(line) && (line[i] != '|' || i > 0 && line[i-1] == '\\') {
			continue
		}
		cells = append(cells, [2]int{from, i})
		from = i + 1
	}
	return cells
}

// cellName is a header or name cell's text without blanks and emphasis.
func cellName(cell []byte) string {
	return strings.TrimSpace(strings.Trim(strings.TrimSpace(string(cell)), "*_`"))
}

// markdownCell adds the text of a cell of a structure column, without the
// blanks around it, as a table's cell is read (cellOccurrence), when it
// could be a record at all (plausible: not "see text" or a dash).
func markdownCell(out []Occurrence, cell []byte, at int, prag *pragmas) []Occurrence {
	o, ok := cellOccurrence(tableCell{text: cell, m: identityMap(at, len(cell))}, "")
	if !ok || !plausible(o.Text) || !prag.allowed(o.Span.Start) {
		return out
	}
	o.Kind, o.Reason = KindMarkdown, ReasonName
	if prag.forced(o.Span.Start) {
		o.Reason = ReasonPragma
	}
	return append(out, o)
}

// delimiterRow reports whether a table row is the delimiter row under a
// header: cells of dashes with an optional colon at either end
// (GitHub Flavored Markdown, "Tables").
func delimiterRow(line []byte) bool {
	cells := rowCells(line)
	n := 0
	for k, c := range cells {
		cell := bytes.TrimSpace(line[c[0]:c[1]])
		if k == 0 || k == len(cells)-1 && len(cell) == 0 {
			continue // before the first pipe, after the last
		}
		cell = bytes.TrimSuffix(bytes.TrimPrefix(cell, []byte(":")), []byte(":"))
		if len(cell) == 0 || len(bytes.Trim(cell, "-")) != 0 {
			return false
		}
		n++
	}
	return n > 0
}

// headerColumns returns, for each cell of a header row (numbered as
// tableRowCode numbers them), its name when it names a structure column
// (as a CSV header does) and "" otherwise (a non-nil slice), and the
// index of the title column (as a CSV header's is chosen), or -1.
func headerColumns(header []byte, nm namer, cfg *Config) (columns []string, title int) {
	cells := rowCells(header)[1:]
	columns, title = make([]string, len(cells)), -1
	best := 0
	for k, c := range cells {
		name := cellName(header[c[0]:c[1]])
		if nm.column(name, cfg.Columns) {
			columns[k] = name
		} else if p := titlePriority(name); p > 0 && (best == 0 || p < best) {
			best, title = p, k
		}
	}
	return columns, title
}

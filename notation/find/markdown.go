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
		kind      Kind
		bodyStart int
	}
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
			if fence.records {
				out = fencedRecord(out, line, lineStart, prag)
			}
			continue
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
				fence.records, fence.kind, fence.bodyStart = false, KindUnknown, start
				if len(info) > 0 {
					tag := strings.Trim(info[0], "{}.")
					switch tag {
					case "smiles", "smi", "rsmi", "cxsmiles":
						fence.records = true
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
			// read, so each cell is read on its own.
			flush()
			out = tableRowCode(out, line, lineStart, prag, nm, cfg)
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
	lead := 0
	for lead < len(line) && (line[lead] == ' ' || line[lead] == '\t') {
		lead++
	}
	line, lineStart = line[lead:], lineStart+lead
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
	return append(out, Occurrence{
		Text:      string(line[:recEnd]),
		Title:     string(line[ts:te]),
		Span:      notation.Span{Start: lineStart, End: lineStart + recEnd},
		Kind:      KindMarkdown,
		Construct: ConstructFencedRecord,
		Reason:    ReasonPlace,
		m:         identityMap(lineStart, recEnd),
	})
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

// tableRowCode adds the notation in the code spans of the cells of a
// table row.
func tableRowCode(out []Occurrence, line []byte, lineStart int, prag *pragmas, nm namer, cfg *Config) []Occurrence {
	from := 0
	for i := 0; i <= len(line); i++ {
		if i < len(line) && (line[i] != '|' || i > 0 && line[i-1] == '\\') {
			continue
		}
		out = inlineCode(out, line[from:i], lineStart+from, line[:from], prag, nm, cfg)
		from = i + 1
	}
	return out
}

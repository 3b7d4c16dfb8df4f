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
			out = inlineCode(out, src[para.Start:para.End], para.Start, prag, nm, cfg)
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
		heading := indent < 4 && len(body) > 0 && body[0] == '#'
		if heading {
			// An ATX heading is a block of one line.
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

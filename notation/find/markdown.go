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
//     the text just before it on the line mentions SMILES ("SMILES:
//     `CCO`"); code spans are taken within one line only;
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
		if indent < 4 {
			if n := fenceRun(body, '`'); n >= 3 {
				fence.open, fence.char, fence.n = true, '`', n
			} else if n := fenceRun(body, '~'); n >= 3 {
				fence.open, fence.char, fence.n = true, '~', n
			}
			if fence.open {
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
		out = inlineCode(out, line, lineStart, prag, nm, cfg)
	}
	return out
}

// maxCodeSpan bounds the length of an inline code span searched for.
const maxCodeSpan = 4096

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

// inlineCode adds the notation in the code spans of one line.
func inlineCode(out []Occurrence, line []byte, lineStart int, prag *pragmas, nm namer, cfg *Config) []Occurrence {
	for i := 0; i < len(line); {
		k := bytes.IndexByte(line[i:], '`')
		if k < 0 {
			break
		}
		open := i + k
		n := fenceRun(line[open:], '`')
		from := open + n
		closeAt := -1
		// A code span is looked for within maxCodeSpan bytes: longer
		// ones are not notation, and the bound keeps a line full of
		// unmatched backticks linear.
		limit := min(len(line), from+maxCodeSpan)
		for j := from; j < limit; {
			q := bytes.IndexByte(line[j:limit], '`')
			if q < 0 {
				break
			}
			m := fenceRun(line[j+q:], '`')
			if m == n {
				closeAt = j + q
				break
			}
			j += q + m
		}
		if closeAt < 0 {
			i = from
			continue
		}
		i = closeAt + n
		cs, ce := from, closeAt
		if ce-cs >= 2 && line[cs] == ' ' && line[ce-1] == ' ' && len(bytes.TrimSpace(line[cs:ce])) > 0 {
			cs, ce = cs+1, ce-1
		}
		text := string(line[cs:ce])
		if !prag.allowed(lineStart) {
			continue
		}
		reason := Reason(0)
		switch {
		case prag.forced(lineStart):
			reason = ReasonPragma
		case namedBefore(line[:open], nm) && plausible(text):
			reason = ReasonName
		case !cfg.NoGuess && unmistakable(text):
			reason = ReasonGuess
		}
		if reason == 0 {
			continue
		}
		out = append(out, Occurrence{
			Text:      text,
			Span:      notation.Span{Start: lineStart + cs, End: lineStart + ce},
			Kind:      KindMarkdown,
			Construct: ConstructInlineCode,
			Reason:    reason,
			m:         identityMap(lineStart+cs, ce-cs),
		})
	}
	return out
}

// namedBefore reports whether the last words before a code span name the
// notation ("the SMILES `CCO`", "Reaction SMILES: `...`").
func namedBefore(before []byte, nm namer) bool {
	if len(before) > 40 {
		before = before[len(before)-40:]
	}
	words := strings.Fields(string(before))
	if len(words) > 3 {
		words = words[len(words)-3:]
	}
	for _, w := range words {
		if nm.value(strings.Trim(w, ":*_,()")) {
			return true
		}
	}
	return false
}

package find

import (
	"strings"
)

// findNotebook reads a Jupyter notebook (nbformat 4: a JSON object whose
// "cells" array holds objects with "cell_type" and "source", the source
// a string or a list of strings to be joined). Code cells are searched in
// the notebook's language (metadata.kernelspec.language, else
// metadata.language_info.name, else cfg.Language, else Python); a cell
// starting with a %% cell magic is in another language and skipped.
// Markdown cells are searched as Markdown. Every offset goes through two
// layers: the cell language's own escapes, then the JSON string escapes
// of the source; the occurrences' maps compose both, and fixes are
// re-escaped for JSON.
func findNotebook(src []byte, cfg *Config) []Occurrence {
	root := parseJSON(src)
	if root.kind != 'o' {
		return nil
	}
	lang := cfg.Language
	if meta, ok := member(src, root, "metadata"); ok {
		if ks, ok := member(src, meta, "kernelspec"); ok {
			if l, ok := member(src, ks, "language"); ok && l.kind == 's' {
				lang = stringValue(src, l)
			}
		}
		if lang == "" || lang == cfg.Language {
			if li, ok := member(src, meta, "language_info"); ok {
				if l, ok := member(src, li, "name"); ok && l.kind == 's' {
					lang = stringValue(src, l)
				}
			}
		}
	}
	codeKind := KindFor(lang)
	if codeKind == KindUnknown || lang == "" {
		codeKind = KindPython
	}
	cells, ok := member(src, root, "cells")
	if !ok || cells.kind != 'a' {
		return nil
	}
	var out []Occurrence
	for n, cell := range cells.vals {
		if cell.kind != 'o' {
			continue
		}
		kind := KindUnknown
		if t, ok := member(src, cell, "cell_type"); ok {
			switch stringValue(src, t) {
			case "code":
				kind = codeKind
			case "markdown":
				kind = KindMarkdown
			}
		}
		source, ok := member(src, cell, "source")
		if kind == KindUnknown || !ok {
			continue
		}
		text, outer := cellText(src, source)
		if kind != KindMarkdown && strings.HasPrefix(strings.TrimLeft(string(text), " \t\r\n"), "%%") {
			continue
		}
		occs := FindKind(kind, text, *cfg)
		lift(occs, outer, jsonEscape)
		for i := range occs {
			occs[i].Cell = n + 1
		}
		out = append(out, occs...)
	}
	return out
}

// member returns the value of key in an object.
func member(src []byte, obj jsonValue, key string) (jsonValue, bool) {
	if obj.kind != 'o' {
		return jsonValue{}, false
	}
	for k := range obj.keys {
		if k < len(obj.vals) && stringValue(src, obj.keys[k]) == key {
			return obj.vals[k], true
		}
	}
	return jsonValue{}, false
}

// stringValue decodes a JSON string value exactly.
func stringValue(src []byte, v jsonValue) string {
	if v.kind != 's' {
		return ""
	}
	var d decoded
	decodeJSON(src, v.content(src), true, &d)
	return string(d.text)
}

// cellText joins a cell's source (a string or a list of strings) and
// returns it with the map from its offsets to the file's.
func cellText(src []byte, source jsonValue) ([]byte, offsetMap) {
	var d decoded
	parts := []jsonValue{source}
	if source.kind == 'a' {
		parts = source.vals
	}
	for _, p := range parts {
		if p.kind == 's' {
			decodeJSON(src, p.content(src), true, &d)
		}
	}
	at := source.span.Start
	if len(parts) > 0 && parts[0].kind == 's' {
		at = parts[0].content(src).Start
	}
	return d.text, d.b.done(at)
}

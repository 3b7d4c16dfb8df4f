package find

import "strings"

// nameParts splits an identifier or key into lowercase word parts at
// underscores, dashes, dots, spaces, digits and lower-to-upper case
// changes: "MolFromSmiles" is mol, from, smiles; "rxn_SMILES_2" is rxn,
// smiles.
func nameParts(s string) []string {
	var parts []string
	start := -1
	flush := func(end int) {
		if start >= 0 && end > start {
			parts = append(parts, strings.ToLower(s[start:end]))
		}
		start = -1
	}
	for i := 0; i < len(s); i++ {
		c := s[i]
		letter := c >= 'a' && c <= 'z' || c >= 'A' && c <= 'Z' || c >= 0x80
		if !letter {
			flush(i)
			continue
		}
		if start < 0 {
			start = i
			continue
		}
		// "molSmiles": split before an upper case letter that follows a
		// lower case one; "SMILESString": split before the last upper
		// case letter of a run that is followed by a lower case one.
		prev := s[i-1]
		if c >= 'A' && c <= 'Z' {
			if prev >= 'a' && prev <= 'z' {
				flush(i)
				start = i
			} else if prev >= 'A' && prev <= 'Z' && i+1 < len(s) && s[i+1] >= 'a' && s[i+1] <= 'z' {
				flush(i)
				start = i
			}
		}
	}
	flush(len(s))
	return parts
}

// notationWords are name parts that say a value is notation. A part that
// contains "smiles" counts too ("canonicalsmiles", "smilesstr").
var notationWords = map[string]bool{
	"smi": true, "smis": true, "rsmi": true, "cxsmi": true, "ism": true,
	"rxn": true, "rxns": true, "reaction": true, "reactions": true,
}

// aboutWords are name parts that say a value is about the notation rather
// than notation itself: smiles_col = "SMILES", reaction_name = "Suzuki",
// smiles_file = "in.smi".
var aboutWords = map[string]bool{
	"file": true, "files": true, "filename": true, "path": true, "paths": true, "dir": true,
	"folder": true, "col": true, "cols": true, "column": true, "columns": true, "field": true,
	"fields": true, "header": true, "headers": true, "key": true, "keys": true, "name": true,
	"names": true, "url": true, "uri": true, "format": true, "fmt": true, "type": true,
	"types": true, "kind": true, "count": true, "num": true, "len": true, "length": true,
	"size": true, "idx": true, "index": true, "id": true, "ids": true, "label": true,
	"labels": true, "prefix": true, "suffix": true, "ext": true, "extension": true, "sep": true,
	"separator": true, "delimiter": true, "encoding": true, "version": true, "pattern": true,
	"regex": true, "template": true, "mode": true, "option": true, "options": true,
	"flag": true, "flags": true, "attr": true, "tag": true, "sheet": true, "table": true,
	"title": true, "description": true, "desc": true, "comment": true, "note": true,
	"error": true, "message": true, "msg": true, "status": true, "time": true, "date": true,
	// Query notation is another language: its operators are errors to
	// a reader of SMILES (reaction_smarts, MolFromSmarts).
	"smarts": true, "smirks": true, "smart": true, "query": true,
}

// queryWords name query notation, a language of its own: a value or
// argument so named is never taken, not even by guessing
// (MolFromSmarts("[#6]"), patt_smarts = "...").
var queryWords = map[string]bool{"smarts": true, "smirks": true, "smart": true}

// pathWords are the subset of aboutWords that, in a function name, say
// its arguments are files rather than notation: read_smiles_file(p).
var pathWords = map[string]bool{
	"file": true, "files": true, "filename": true, "path": true, "dir": true, "url": true,
	"column": true, "col": true, "folder": true,
	"smarts": true, "smirks": true, "smart": true, "query": true,
}

// mentions is a quick test, without allocation, that name contains one
// of the notation words at all (case-insensitively): most names do not,
// and splitting them into parts would be wasted work.
func mentions(name string) bool {
	for i := 0; i+3 <= len(name); i++ {
		c := name[i] | 0x20
		if c != 's' && c != 'r' && c != 'i' {
			continue
		}
		w := name[i:min(i+8, len(name))]
		if hasFold(w, "smi") || hasFold(w, "rxn") || hasFold(w, "reaction") || hasFold(w, "ism") ||
			hasFold(w, "smarts") || hasFold(w, "smirks") {
			return true
		}
	}
	return false
}

// hasFold reports whether s starts with the lowercase word w, ignoring
// ASCII case.
func hasFold(s, w string) bool {
	if len(s) < len(w) {
		return false
	}
	for i := 0; i < len(w); i++ {
		if s[i]|0x20 != w[i] {
			return false
		}
	}
	return true
}

// namer decides whether names say "notation".
type namer struct{ extra map[string]bool }

func newNamer(cfg *Config) namer {
	if len(cfg.Names) == 0 {
		return namer{}
	}
	extra := make(map[string]bool, len(cfg.Names))
	for _, n := range cfg.Names {
		extra[strings.ToLower(n)] = true
	}
	return namer{extra: extra}
}

func (n namer) word(p string) bool {
	return notationWords[p] || strings.Contains(p, "smiles") || n.extra[p]
}

// value reports whether a variable, key or argument name says that the
// value assigned to it is notation.
func (n namer) value(name string) bool { return n.match(name, aboutWords) }

// call reports whether a function name says that its string arguments
// are notation.
func (n namer) call(name string) bool { return n.match(name, pathWords) }

// other reports whether a name mentions the notation but says its value
// is something else about it (smiles_file, reaction_smarts): such a value
// is not even guessed.
func (n namer) other(name string) bool {
	if len(name) < 3 || len(name) > 200 || n.extra == nil && !mentions(name) {
		return false
	}
	word, stop := false, false
	for _, p := range nameParts(name) {
		if queryWords[p] {
			return true
		}
		word = word || n.word(p)
		stop = stop || aboutWords[p]
	}
	return word && stop
}

func (n namer) match(name string, stop map[string]bool) bool {
	if len(name) < 3 || len(name) > 200 || n.extra == nil && !mentions(name) {
		return false
	}
	found := false
	for _, p := range nameParts(name) {
		if stop[p] {
			return false
		}
		if n.word(p) {
			found = true
		}
	}
	return found
}

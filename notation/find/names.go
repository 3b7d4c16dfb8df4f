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
	"separator": true, "delimiter": true, "encoding": true, "version": true,
	"regex": true, "mode": true, "option": true, "options": true,
	"flag": true, "flags": true, "attr": true, "tag": true, "sheet": true, "table": true,
	"title": true, "description": true, "desc": true, "comment": true, "note": true,
	"error": true, "message": true, "msg": true, "status": true, "time": true, "date": true,
}

// queryWords name query notation, SMARTS: a value so named is a query
// pattern (MolFromSmarts("[#6]"), patt_smarts = "..."); qmol is the
// query molecule constructor of RDKit's JavaScript build, get_qmol (from
// memory).
var queryWords = map[string]bool{"smarts": true, "smirks": true, "qmol": true}

// patternWords name what is often, not always, a query pattern: a text
// so named is taken as SMARTS when it reads as one (common practice in
// filter catalogues and reaction rule sets), and only then: in code at
// large these words name templates, rules and filters of other kinds
// (f2py's rules of C snippets, a config file's template). smart, sma
// and smas abbreviate SMARTS as smi and smis do SMILES, but name smart
// pointers, sync policies and simple moving averages as often.
var patternWords = map[string]bool{
	"pattern": true, "patterns": true, "patt": true, "patts": true, "query": true,
	"queries": true, "template": true, "templates": true, "tmpl": true, "rule": true,
	"rules": true, "filter": true, "filters": true, "smart": true, "sma": true, "smas": true,
}

// regexModules are the receivers whose functions take regular
// expressions: Python's re and regex, Go's regexp (common practice).
var regexModules = map[string]bool{"re": true, "regex": true, "regexp": true}

// pathWords are the subset of aboutWords that, in a function name, say
// its arguments are files rather than notation: read_smiles_file(p).
var pathWords = map[string]bool{
	"file": true, "files": true, "filename": true, "path": true, "dir": true, "url": true,
	"column": true, "col": true, "folder": true,
}

// mentions is a quick test, without allocation, that name contains one
// of the notation or query words at all (case-insensitively): most names
// do not, and splitting them into parts would be wasted work.
func mentions(name string) bool {
	for i := 0; i+3 <= len(name); i++ {
		c := name[i] | 0x20
		if c != 's' && c != 'r' && c != 'i' && c != 'p' && c != 'q' && c != 't' && c != 'f' {
			continue
		}
		w := name[i:min(i+8, len(name))]
		if hasFold(w, "smi") || hasFold(w, "rxn") || hasFold(w, "reaction") || hasFold(w, "ism") ||
			hasFold(w, "sma") || hasFold(w, "smirks") || hasFold(w, "patt") ||
			hasFold(w, "quer") || hasFold(w, "qmol") || hasFold(w, "templ") || hasFold(w, "tmpl") ||
			hasFold(w, "rule") || hasFold(w, "filter") {
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
// value assigned to it is notation (SMILES).
func (n namer) value(name string) bool {
	w, about := n.classify(name)
	return !about && w.smiles > 0
}

// classify says what a variable, key or argument name says about the
// value assigned to it: SMILES (smiles, rxn, reaction), a query pattern
// (smarts, and weakly pattern, query, template, rule, filter), or,
// with about true, something about the notation that is not notation
// (smiles_file, reaction_name, smarts_col), whose value is not even
// guessed. Every name context is weak: a word or label under it is not
// taken (see decide).
func (n namer) classify(name string) (w wants, about bool) {
	if len(name) < 3 || len(name) > 200 || n.extra == nil && !mentions(name) {
		return wants{}, false
	}
	var notationWord, query, pattern, aboutWord, plainWord bool
	for _, p := range nameParts(name) {
		notationWord = notationWord || n.word(p)
		query = query || queryWords[p]
		pattern = pattern || patternWords[p]
		aboutWord = aboutWord || aboutWords[p]
		// a notation word that is not also an English word of other
		// meanings (an emoji "reaction" of a chat message)
		plainWord = plainWord || n.word(p) && !englishWords[p]
	}
	if aboutWord && (notationWord || query || pattern) {
		return wants{}, true
	}
	if query || pattern {
		w.smarts = weakly
	}
	if notationWord && !query {
		w.smiles = weakly
	}
	w.loose = pattern && !query && !notationWord || notationWord && !plainWord && !query && !pattern
	return w, false
}

// englishWords are notation words (notationWords) that are ordinary words
// as often: a name made only of them is loose, its text taken only when
// it reads without error ({"reaction": {"unicode": "U+1F44D"}} holds an
// emoji, not a broken record).
var englishWords = map[string]bool{"reaction": true, "reactions": true}

// call says what a function name, and the name of the value it is called
// on, say about the string arguments: a constructor of SMILES
// (MolFromSmiles, ReactionFromSmiles, parseSmiles) or SMARTS
// (MolFromSmarts, ReactionFromSmarts, loadSmarts, SmartsPattern.create,
// new SMARTSQueryTool, get_qmol) makes them firmly so; a name that
// mentions reactions only weakly (HeteroAtomReaction(...)); a name
// about files (read_smiles_file) says they are not notation (about).
// receiver counts only when it looks like a class or module (it starts
// with a capital letter: SmartsPattern.create, Smarts.parse).
func (n namer) call(name, receiver string) (w wants, about bool) {
	if regexModules[receiver] || name == "RegExp" {
		// re.match(r'[19K]', s): a regular expression, whose character
		// classes look like bracket atoms
		return wants{}, true
	}
	if len(name) < 3 || len(name) > 200 {
		return wants{}, false
	}
	if receiver != "" && receiver[0] >= 'A' && receiver[0] <= 'Z' && mentions(receiver) {
		for _, p := range nameParts(receiver) {
			if queryWords[p] {
				return wants{smarts: firmly}, false
			}
		}
	}
	if n.extra == nil && !mentions(name) {
		return wants{}, false
	}
	var smiles, reaction, query, queryMol, mol, path bool
	for _, p := range nameParts(name) {
		switch {
		case pathWords[p]:
			path = true
		case queryWords[p]:
			query = true
		case p == "query" || p == "queries":
			queryMol = true
		case n.word(p) && (strings.Contains(p, "smi") || n.extra[p]):
			smiles = true
		case n.word(p):
			reaction = true
		case p == "mol" || p == "molecule" || p == "molecules":
			mol = true
		}
	}
	switch {
	case path:
		return wants{}, smiles || reaction || query
	case query:
		return wants{smarts: firmly}, false
	case smiles:
		return wants{smiles: firmly}, false
	case queryMol && (reaction || mol):
		// loadQueryMolecule, loadQueryReaction: a query, written in
		// SMARTS or SMILES.
		return wants{smarts: weakly, smiles: weakly}, false
	case reaction:
		return wants{smiles: weakly}, false
	}
	return wants{}, false
}

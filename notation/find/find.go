package find

// Find returns the notation records in a host file, in order of their
// host offsets. The host kind comes from cfg.Kind when set, otherwise from
// the file name's extension (see KindForName); files of unknown kind have
// no occurrences. Find never fails and never panics on any content:
// malformed hosts (an unterminated string, broken JSON) yield what could
// be found before and around the damage.
//
// Spans and offsets of the occurrences are byte offsets into content.
func Find(name string, content []byte, cfg Config) []Occurrence {
	k := cfg.Kind
	if k == KindUnknown {
		k = KindForName(name)
	}
	return FindKind(k, content, cfg)
}

// FindKind is Find for a document whose kind is already known: an editor
// buffer with a language identifier (see KindFor), standard input with a
// --stdin-name, or one notebook cell sent by the editor as a document of
// its own. For a cell, pass the cell's text and language; the offsets are
// then offsets into the cell text.
func FindKind(kind Kind, content []byte, cfg Config) []Occurrence {
	switch kind {
	case KindList:
		return findList(content, &cfg)
	case KindCSV:
		return findTable(content, ',', &cfg)
	case KindTSV:
		return findTable(content, '\t', &cfg)
	case KindMarkdown:
		return findMarkdown(content, &cfg)
	case KindJSON:
		return findJSON(content, &cfg)
	case KindYAML:
		return findYAML(content, &cfg)
	case KindNotebook:
		return findNotebook(content, &cfg)
	case KindRST:
		return findRST(content, &cfg)
	case KindSDF:
		return findSDF(content, &cfg)
	}
	if lang := codeLangs[kind]; lang != nil {
		return findCode(content, lang, &cfg)
	}
	return nil
}

// FindChunks calls each with the occurrences FindKind finds, in order,
// at most n (n > 0) at a time; the slices are each's to keep. A record
// list is read as it is handed out, the strings of each chunk copied
// apart from the rest, so that a caller that keeps only what it needs of
// each chunk never holds all the occurrences of a long list, nor a copy
// of the whole of it (Stream in stereo/document). A JSON document is
// parsed whole and its records handed out as they are found. Other
// hosts, and the lists that must be read whole, are found whole and
// handed out in slices.
func FindChunks(kind Kind, content []byte, cfg Config, n int, each func([]Occurrence)) {
	if kind == KindList && findListChunks(content, &cfg, n, each) {
		return
	}
	if len(content) >= streamFrom && (kind == KindCSV && findTableChunks(content, ',', &cfg, n, each) ||
		kind == KindTSV && findTableChunks(content, '\t', &cfg, n, each)) {
		return
	}
	if kind == KindSDF {
		// a record's occurrences handed out as soon as it ends
		findSDFChunks(content, &cfg, max(n, 1), each)
		return
	}
	if kind == KindYAML {
		// occurrences handed out as their titles are known
		findYAMLChunks(content, &cfg, n, each)
		return
	}
	if kind == KindJSON {
		// the document is parsed whole, its records handed out as the
		// walk finds them
		findJSONChunks(content, &cfg, n, each)
		return
	}
	chunks(FindKind(kind, content, cfg), n, each)
}

// streamFrom is the size from which FindChunks reads a CSV or TSV table
// in two passes and a JSON array element by element, so that their
// occurrences or values are not all held: below it, reading them whole
// costs less (a variable for the tests).
var streamFrom = 8 << 20

// chunks hands out occs n at a time.
func chunks(occs []Occurrence, n int, each func([]Occurrence)) {
	for start := 0; start < len(occs); start += n {
		each(occs[start:min(start+n, len(occs)):min(start+n, len(occs))])
	}
}

// codeLangs are the programming languages with a lexer.
var codeLangs = map[Kind]*codeLang{
	KindPython:     python,
	KindJavaScript: javascript,
	KindGo:         golang,
	KindR:          rlang,
	KindJulia:      julia,
	KindRust:       rust,
	KindJava:       java,
	KindKotlin:     kotlin,
}

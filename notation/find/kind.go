package find

import (
	"path"
	"strings"
)

// Kind is the kind of host file notation is looked for in. It decides
// which scanner runs: a record list, a table, a language lexer, a
// document or data format, or a notebook.
type Kind uint8

// Host kinds. KindUnknown files are not searched.
const (
	KindUnknown Kind = iota
	KindList         // one record a line: .smi .smiles .rsmi .cxsmi .ism .can
	KindCSV          // comma-separated table with a header row
	KindTSV          // tab-separated table with a header row
	KindPython
	KindJavaScript // also TypeScript, JSX and TSX
	KindGo
	KindR
	KindJulia
	KindRust
	KindJava
	KindKotlin
	KindMarkdown
	KindJSON
	KindYAML
	KindNotebook // Jupyter .ipynb
	KindRST      // reStructuredText (Sphinx documentation)
	KindSDF      // SD files: the data items of their records
)

var kindNames = [...]string{
	KindUnknown:    "unknown",
	KindList:       "list",
	KindCSV:        "csv",
	KindTSV:        "tsv",
	KindPython:     "python",
	KindJavaScript: "javascript",
	KindGo:         "go",
	KindR:          "r",
	KindJulia:      "julia",
	KindRust:       "rust",
	KindJava:       "java",
	KindKotlin:     "kotlin",
	KindMarkdown:   "markdown",
	KindJSON:       "json",
	KindYAML:       "yaml",
	KindNotebook:   "notebook",
	KindRST:        "rst",
	KindSDF:        "sdf",
}

// String returns the lowercase name of the kind, as used in messages and
// accepted by KindFor.
func (k Kind) String() string {
	if int(k) < len(kindNames) {
		return kindNames[k]
	}
	return "unknown"
}

// extensions maps lowercase file extensions to kinds.
var extensions = map[string]Kind{
	".smi": KindList, ".smiles": KindList, ".rsmi": KindList, ".cxsmi": KindList,
	".cxsmiles": KindList, ".ism": KindList, ".can": KindList,
	".csv": KindCSV, ".tsv": KindTSV, ".tab": KindTSV,
	".py": KindPython, ".pyi": KindPython, ".pyw": KindPython,
	".js": KindJavaScript, ".mjs": KindJavaScript, ".cjs": KindJavaScript, ".jsx": KindJavaScript,
	".ts": KindJavaScript, ".mts": KindJavaScript, ".cts": KindJavaScript, ".tsx": KindJavaScript,
	".go":   KindGo,
	".r":    KindR,
	".jl":   KindJulia,
	".rs":   KindRust,
	".java": KindJava,
	".kt":   KindKotlin, ".kts": KindKotlin,
	".md": KindMarkdown, ".markdown": KindMarkdown,
	// R Markdown and Quarto documents are Markdown whose code chunks are
	// fences tagged {r}, {python}, ...
	".rmd": KindMarkdown, ".qmd": KindMarkdown,
	".json": KindJSON, ".jsonl": KindJSON, ".ndjson": KindJSON, ".jsonlines": KindJSON,
	".yaml": KindYAML, ".yml": KindYAML,
	".ipynb": KindNotebook,
	".rst":   KindRST, ".rest": KindRST,
	".sdf": KindSDF, ".sd": KindSDF,
}

// KindForName picks the host kind from a file name (a path or a bare
// name; only the extension counts, case-insensitively). The command line
// passes the --stdin-name value here when reading standard input.
func KindForName(name string) Kind {
	return extensions[strings.ToLower(path.Ext(strings.ReplaceAll(name, "\\", "/")))]
}

// BoundedByName reports whether FindChunks hands out the records of a
// file of this name a chunk at a time in memory that does not grow with
// the file, whatever its size, judging by the extension alone (before
// the file is read): record lists, CSV and TSV tables, SD files and JSON
// Lines. Other kinds may be found whole: source code, Markdown,
// notebooks, and JSON or YAML documents of any shape.
func BoundedByName(name string) bool {
	switch KindForName(name) {
	case KindList, KindCSV, KindTSV, KindSDF:
		return true
	case KindJSON:
		switch strings.ToLower(path.Ext(strings.ReplaceAll(name, "\\", "/"))) {
		case ".jsonl", ".ndjson", ".jsonlines":
			return true
		}
	}
	return false
}

// languageIDs maps editor language identifiers to kinds. The common ones
// are those of the LSP 3.17 specification's list of known language
// identifiers; "smiles" and friends are our own, for editors that
// associate list files with a language of that name.
var languageIDs = map[string]Kind{
	"smiles": KindList, "smi": KindList, "rsmi": KindList, "cxsmiles": KindList,
	"csv": KindCSV, "tsv": KindTSV,
	"python":     KindPython,
	"javascript": KindJavaScript, "javascriptreact": KindJavaScript,
	"typescript": KindJavaScript, "typescriptreact": KindJavaScript,
	"go":       KindGo,
	"r":        KindR,
	"julia":    KindJulia,
	"rust":     KindRust,
	"java":     KindJava,
	"kotlin":   KindKotlin,
	"markdown": KindMarkdown, "rmd": KindMarkdown, "quarto": KindMarkdown,
	"json": KindJSON, "jsonc": KindJSON, "jsonl": KindJSON, "jsonlines": KindJSON, "ndjson": KindJSON,
	"yaml":     KindYAML,
	"notebook": KindNotebook, "jupyter": KindNotebook,
	"restructuredtext": KindRST, "sdf": KindSDF,
}

// KindFor returns the host kind for an editor language identifier
// ("python", "typescriptreact", "markdown", ...), case-insensitively; the
// names Kind.String returns are accepted too. Notebook cells synchronised
// by an editor arrive as separate documents with a language identifier:
// pass the cell text and this kind to FindKind.
func KindFor(languageID string) Kind {
	id := strings.ToLower(strings.TrimSpace(languageID))
	if k, ok := languageIDs[id]; ok {
		return k
	}
	for k, n := range kindNames {
		if n == id && k != int(KindUnknown) {
			return Kind(k)
		}
	}
	return KindUnknown
}

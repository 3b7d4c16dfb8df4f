// Package find finds line notation (SMILES and reaction SMILES records)
// inside host files and maps positions between the notation and the host.
//
// # Use
//
//	occs := find.Find("analysis.ipynb", content, find.Config{})
//	for i := range occs {
//		o := &occs[i]
//		m := notation.Read(o.Text)
//		for _, e := range m.Errors {
//			span := o.HostSpan(e.Span) // host byte offsets
//			...
//		}
//		// o.Diagnostics: host problems (host-escape), already in host
//		// offsets, with o.Fixes[i] for Diagnostics[i].
//	}
//
// Find picks the host kind from the file name (KindForName); Config.Kind
// overrides it (for standard input with --stdin-name, pass that name, or
// set the kind). An editor that knows a document's language identifier
// calls FindKind(KindFor(languageID), text, cfg); notebook cells that an
// editor synchronises as documents of their own are analysed that way,
// with offsets into the cell.
//
// # What is found
//
//   - Lists (.smi .smiles .rsmi .cxsmi .cxsmiles .ism .can): one record a
//     line, laid out as the file's content shows (layout.go): the field
//     that reads as notation while the others do not (first, last, after
//     an index), blanks, tabs, commas or semicolons between fields, a
//     header line, '#', '//' and ';' comment lines; a "stereoline:
//     layout" pragma line or Config.Layout fixes the layout; an unclear
//     layout is said once, on the first record (CodeListLayout). A CXSMILES
//     extension block after the notation ("|...|") belongs to the
//     record and the title follows it (notation.RecordEnd).
//   - Tables (.csv .tsv): cells of columns whose header names structures
//     (see findTable), with RFC 4180 quoting; a table whose header names
//     none is read by its content like a list (tableByContent).
//   - Source code (Python, JavaScript and TypeScript, Go, R, Julia, Rust,
//     Java, Kotlin): string literals by the rules of findCode — named by
//     a variable, key, argument or function, or unmistakably notation.
//   - Markdown: code spans that are unmistakably notation or introduced
//     by the word SMILES, fenced blocks tagged smiles (one record a line),
//     fenced blocks in a language above. Code spans are read over the
//     lines of a paragraph (CommonMark), so one that closes on the next
//     line closes there; a span still holding a line break (a space, once
//     read) is never notation, one broken only at its ends is its
//     content (codespan.go).
//   - JSON and YAML: string values under notation-named keys, and
//     unmistakable values anywhere.
//   - Notebooks (.ipynb): code cells in the notebook's language, markdown
//     cells as Markdown, through the JSON escapes of the cell source.
//
// Every occurrence carries a Dialect: notation (SMILES and reaction
// SMILES) or a query pattern (SMARTS and reaction SMARTS), which is read
// with notation/smarts and never checked as notation. A text is a
// pattern by its place (a SMARTS constructor, a name saying smarts or,
// when it reads as one, pattern, query, template, rule or filter) or by
// its content (query primitives), and the literals of one list or one
// argument of one function agree (dialect.go, code.go). A string holding
// several records separated by commas, semicolons or blanks is split
// when each part is one; a word or label under a mere name is not
// notation (decide). The code of doctest lines, and unmistakable tokens
// of docstrings' prose, are read too (doctest.go).
//
// Python's adjacent literals ("F/C=C" "/F") are joined into one
// occurrence, as Python joins them; its map is piecewise, and host
// offsets between the pieces map to no notation offset. Byte strings and
// string macros are skipped.
//
// Java text blocks are read as the Java compiler reads them: the lines
// after the opening delimiter, incidental indentation and trailing blanks
// stripped, then escapes; a named block is a record list, and a record
// split by \<newline> maps piece by piece (textblock.go). Kotlin raw
// strings are searched line by line as written (trimMargin() prefixes
// dropped).
//
// Templates (Python f- and t-strings, JavaScript template literals with
// ${...}, Kotlin and Julia strings with $name, ${...} or $(...)) are
// formatted at run time: only the fixed text between the replacement
// fields is searched, token by token (blanks and the \t, \n, \r escapes
// separate tokens), and a token touching a field is never taken, so no
// notation spans a field (template.go, fstring.go). f"{cid}\tC[C@H](N)O"
// yields C[C@H](N)O; f"C{n}CO" yields nothing. Format strings are read
// the same way: Python "...".format() and "..." % values, Java
// .formatted(), String.format() and printf(), Kotlin .format(), Go
// Sprintf-like calls, Rust format! and println!-like macros (format.go).
//
// # Escapes
//
// The notation analysed is the notation as the author wrote it: an
// escape the host resolves harmlessly (`\\` for one backslash, an escaped
// quote, `""` in a CSV cell) is resolved; a backslash the host would eat
// (`\1` in a Python string, `\/` in JavaScript, `\C` in Go) is kept and
// reported as a host-escape diagnostic, error or warning as the language
// treats it, with fixes (a raw string, doubled backslashes). The offset
// map of each occurrence is the only place that knows how notation bytes
// sit in the host; callers never compute offsets themselves.
//
// # Pragmas
//
// A comment containing "stereoline: off", "stereoline: on",
// "stereoline: skip", "stereoline: skip-next" or "stereoline: notation"
// switches detection off and on from its line, skips its line or the
// next one, or makes every literal on its line notation. See pragma.go.
// In a list, a comment line "stereoline: layout ..." fixes the layout
// (ParseLayout).
//
// # Guarantees
//
// Find never panics and never fails; malformed hosts give what can be
// found. Time and memory are linear in the input (FuzzFind, TestNoBlowUp).
// Occurrences come in host order within each scanner; spans are inside
// the content; maps are monotone.
package find

package notation

// Record is one line of a list: the notation with its CXSMILES extension
// block, if any, and the title written after it. Spans are byte offsets
// into the line.
type Record struct {
	Line string
	// Notation is what Read takes: the line notation and, when one
	// follows it, the whitespace and the extension block
	// ("C[C@H](O)CC |&1:1|").
	Notation     string
	NotationSpan Span
	// Extension is the block inside NotationSpan, from '|' to '|'; empty
	// when there is none.
	Extension Span
	Title     string
	TitleSpan Span
}

// SplitRecord separates a line into its record and its title. The
// notation ends at the first space or tab (OpenSMILES 4.5: "the SMILES
// string is terminated by a whitespace"); an extension block after it
// belongs to the record (see RecordEnd); the title is the rest, without
// the separating whitespace and without a trailing carriage return.
func SplitRecord(line string) Record {
	end := len(line)
	for end > 0 && (line[end-1] == '\r' || line[end-1] == '\n') {
		end--
	}
	start := 0
	for start < end && (line[start] == ' ' || line[start] == '\t') {
		start++
	}
	n, i := RecordEnd(line[start:end])
	n, i = n+start, i+start
	rec := Record{Line: line, Notation: line[start:i], NotationSpan: Span{start, i}}
	if i > n {
		open := n
		for line[open] != '|' {
			open++
		}
		rec.Extension = Span{open, i}
	}
	j := i
	for j < end && (line[j] == ' ' || line[j] == '\t') {
		j++
	}
	if j < end {
		t := end
		for t > j && (line[t-1] == ' ' || line[t-1] == '\t') {
			t--
		}
		rec.Title = line[j:t]
		rec.TitleSpan = Span{j, t}
	}
	return rec
}

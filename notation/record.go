package notation

// Record is one line of a list: the notation, and the title written after
// it. Spans are byte offsets into the line.
type Record struct {
	Line         string
	Notation     string
	NotationSpan Span
	Title        string
	TitleSpan    Span
}

// SplitRecord separates a line into its notation and its title. The
// notation ends at the first space or tab (OpenSMILES 4.5: "the SMILES
// string is terminated by a whitespace"); the title is the rest, without
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
	i := start
	for i < end && line[i] != ' ' && line[i] != '\t' {
		i++
	}
	rec := Record{Line: line, Notation: line[start:i], NotationSpan: Span{start, i}}
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

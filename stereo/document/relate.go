package document

// relateRecords reports duplicates, enantiomers and stereoisomers among
// the records of one document. It is filled in by the identity index.
func (r *Result) relateRecords() {}

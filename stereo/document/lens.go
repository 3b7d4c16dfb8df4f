package document

import "stereoline/notation/find"

// The values of Config.DrawingLens.
const (
	// LensLists gives the drawing lens to the records of record lists
	// (a list file, a smiles fence, a list found by its layout) and of
	// tables: the places a reader goes through record by record. A lens
	// over every string in source code would be noise.
	LensLists = "lists"
	// LensEverywhere gives every record the lens.
	LensEverywhere = "everywhere"
	// LensOff gives no record the lens.
	LensOff = "off"
)

// DrawingLenses returns the indices (into Records) of the records that
// get the editor's drawing code lens under the configuration.
func (r *Result) DrawingLenses() []int {
	mode := LensLists
	if r.cfg != nil && r.cfg.DrawingLens != "" {
		mode = r.cfg.DrawingLens
	}
	var out []int
	for i := range r.Records {
		switch mode {
		case LensOff:
			return nil
		case LensEverywhere:
			out = append(out, i)
		default:
			if listLike(r.Records[i].Occ) {
				out = append(out, i)
			}
		}
	}
	return out
}

// listLike reports a record read as a line of a list or a cell of a
// table.
func listLike(o *find.Occurrence) bool {
	if o == nil {
		return false
	}
	switch o.Construct {
	case find.ConstructListRecord, find.ConstructFencedRecord, find.ConstructTableCell:
		return true
	}
	return false
}

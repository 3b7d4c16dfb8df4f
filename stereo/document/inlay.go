package document

import (
	"stereoline/notation"
	"stereoline/stereo"
)

// Label is an inline descriptor placed after an atom or bond.
type Label struct {
	Offset int // host offset the label follows
	Text   string
}

// InlayLabels returns the descriptor of every labelled unit, placed right
// after its atom (centres, allenes) or its double-bond symbol. It returns
// nothing when inlay hints are switched off.
func (r *Result) InlayLabels() []Label {
	if !r.cfg.InlayHints {
		return nil
	}
	var out []Label
	for _, rec := range r.Records {
		m := rec.Mol()
		for _, u := range rec.Stereo().Units {
			if !u.Descriptor.Labelled() {
				continue
			}
			var after notation.Span
			switch {
			case u.Kind == stereo.KindDoubleBond && u.Bond >= 0:
				b := &m.Bonds[u.Bond]
				after = b.Span
				if b.Span.Len() == 0 && b.Ring {
					after = b.CloseSpan
				}
			case u.Centre >= 0:
				after = m.Atoms[u.Centre].Span
			default:
				continue
			}
			text := u.Descriptor.String()
			if l := u.GroupLabel(); l != "" {
				// R* or RS in an or or and group
				text = l
			}
			out = append(out, Label{Offset: rec.Occ.HostSpan(after).End, Text: text})
		}
	}
	return out
}

package document

import (
	"fmt"
	"strings"

	"stereoline/notation"
	"stereoline/stereo"
)

// Caution is the sentence every hover ends with: labels come from the
// notation, not from the compound.
const Caution = "_Descriptors are computed from the notation as written. Critical assignments need analytical confirmation and qualified review under local rules._"

// Hover explains what is at host offset off: an atom, a bond or a mark,
// and the record it belongs to. It returns compact markdown and the host
// span the explanation is about.
func (r *Result) Hover(off int) (string, notation.Span, bool) {
	ri := r.RecordAt(off)
	if ri < 0 {
		if q := r.queryAt(off); q != nil {
			text, span := q.hover(off)
			return text + "\n\n" + Caution, span, true
		}
		return "", notation.Span{}, false
	}
	rec := &r.Records[ri]
	n, ok := rec.Occ.NotationOffset(off)
	if !ok {
		return "", notation.Span{}, false
	}
	if len(rec.Mol().Atoms) == 0 && refused(rec) != "" {
		return refused(rec) + "\n\n" + Caution, rec.Occ.Span, true
	}
	var b strings.Builder
	span := rec.Occ.Span
	if a := atomAt(rec.Mol(), n); a >= 0 {
		span = rec.Occ.HostSpan(rec.Mol().Atoms[a].Span)
		writeAtom(&b, rec, a)
	} else if bi := bondAt(rec.Mol(), n); bi >= 0 {
		bd := &rec.Mol().Bonds[bi]
		s := bd.Span
		if bd.Ring && bd.CloseSpan.Contains(n) {
			s = bd.CloseSpan
		}
		span = rec.Occ.HostSpan(s)
		writeBond(&b, rec, bi)
	} else if gi, s := groupFieldAt(rec.Mol(), n); gi >= 0 {
		span = rec.Occ.HostSpan(s)
		writeGroup(&b, rec, gi)
	}
	writeRecord(&b, rec)
	b.WriteString("\n\n" + Caution)
	return b.String(), span, true
}

// refused returns why a record was not read (the recordAtoms limit,
// oversized in cache.go), or "" for a record that was: a record with no
// atoms gets a budget finding only when it was refused, since the
// analysis of an empty molecule returns before its budget starts.
func refused(rec *Record) string {
	if rec.Stereo() == nil {
		return ""
	}
	for _, d := range rec.Stereo().Diagnostics {
		if d.Code == stereo.CodeBudget {
			return "Not analysed: " + d.Msg + "."
		}
	}
	return ""
}

// atomAt returns the atom whose token holds notation offset n, or -1.
func atomAt(m *notation.Molecule, n int) int {
	for i := range m.Atoms {
		s := m.Atoms[i].Span
		if n >= s.Start && n < s.End {
			return i
		}
	}
	return -1
}

// bondAt returns the bond whose symbol or ring-closure digits hold
// notation offset n, or -1.
func bondAt(m *notation.Molecule, n int) int {
	for i := range m.Bonds {
		b := &m.Bonds[i]
		if b.Span.Len() > 0 && n >= b.Span.Start && n < b.Span.End {
			return i
		}
		if b.Ring && n >= b.CloseSpan.Start && n < b.CloseSpan.End {
			return i
		}
	}
	return -1
}

// AtomName names an atom for people: its symbol and 1-based number ("C4").
func AtomName(m *notation.Molecule, a int) string {
	if a < 0 {
		return "H"
	}
	return notation.ElementSymbol(m.Atoms[a].Number) + fmt.Sprint(a+1)
}

func unitOfAtom(an *stereo.Analysis, a int) *stereo.Unit {
	for i := range an.Units {
		u := &an.Units[i]
		if u.Centre == a && u.Kind != stereo.KindDoubleBond {
			return u
		}
	}
	return nil
}

func unitOfBond(an *stereo.Analysis, m *notation.Molecule, bi int) *stereo.Unit {
	for i := range an.Units {
		u := &an.Units[i]
		if u.Kind == stereo.KindDoubleBond && u.Bond == bi {
			return u
		}
	}
	// a direction mark: the double bond it sits next to
	b := &m.Bonds[bi]
	for i := range an.Units {
		u := &an.Units[i]
		if u.Kind != stereo.KindDoubleBond || u.Bond < 0 {
			continue
		}
		d := &m.Bonds[u.Bond]
		if b.Order == notation.OrderSingle && (b.Begin == d.Begin || b.End == d.Begin || b.Begin == d.End || b.End == d.End) {
			return u
		}
	}
	return nil
}

func writeAtom(b *strings.Builder, rec *Record, a int) {
	m := rec.Mol()
	at := &m.Atoms[a]
	fmt.Fprintf(b, "**%s** %s", AtomName(m, a), elementName(at.Number))
	if at.Charge != 0 {
		fmt.Fprintf(b, ", charge %+d", at.Charge)
	}
	fmt.Fprintf(b, ", %d H", at.HydrogenCount())
	if at.Aromatic {
		b.WriteString(", aromatic")
	}
	if at.Isotope != 0 {
		fmt.Fprintf(b, ", isotope %d", at.Isotope)
	}
	if at.Map != 0 {
		fmt.Fprintf(b, ", map %d", at.Map)
	}
	rings := notation.FindRings(m)
	if s := rings.AtomSize[a]; s > 0 {
		fmt.Fprintf(b, ", in a %d-membered ring", s)
	}
	b.WriteString("\n")
	writeReactionCentre(b, rec, a)
	u := unitOfAtom(rec.Stereo(), a)
	if u == nil {
		return
	}
	b.WriteString("\n")
	writeUnit(b, rec, u)
	for _, f := range stereo.Families(m) {
		if f.Atom == a {
			fmt.Fprintf(b, "\nFischer family: **%s** (%s reference carbon)\n", f.Family, f.Kind)
		}
	}
}

func writeBond(b *strings.Builder, rec *Record, bi int) {
	m := rec.Mol()
	bd := &m.Bonds[bi]
	fmt.Fprintf(b, "**%s bond** %s–%s", bd.Order, AtomName(m, bd.Begin), AtomName(m, bd.End))
	if bd.Ring {
		b.WriteString(", ring closure")
	}
	if d := bd.Dir; d != notation.DirNone {
		fmt.Fprintf(b, ", direction mark `%s`", d)
	}
	b.WriteString("\n")
	if u := unitOfBond(rec.Stereo(), m, bi); u != nil {
		b.WriteString("\n")
		writeUnit(b, rec, u)
	}
}

// writeUnit explains one stereogenic unit: its label, the ranked ligands
// with the rule that decided each step, and how the mark reads.
func writeUnit(b *strings.Builder, rec *Record, u *stereo.Unit) {
	m := rec.Mol()
	switch {
	case u.Descriptor.Labelled():
		fmt.Fprintf(b, "**(%s)** %s", u.Descriptor, kindName(u.Kind))
	case u.Descriptor == stereo.DescUndetermined:
		fmt.Fprintf(b, "**undetermined** %s (the ranking gave up before telling the ligands apart)", kindName(u.Kind))
	case !u.Specified && len(u.Marks) > 0:
		// a member of units stereogenic together whose partner is unmarked
		fmt.Fprintf(b, "**unspecified** %s: its mark means something only together with the configuration of another unit, which is not marked", kindName(u.Kind))
	case !u.Specified:
		fmt.Fprintf(b, "**unspecified** %s: the notation leaves this configuration open", kindName(u.Kind))
	default:
		fmt.Fprintf(b, "%s", kindName(u.Kind))
	}
	b.WriteString("\n")
	writeUnitGroup(b, rec, u)
	if len(u.Ranked) > 0 {
		b.WriteString("\nCIP priority: ")
		pair := u.Kind != stereo.KindTetrahedral && len(u.Atoms) == 2
		for i, l := range u.Ranked {
			if i > 0 {
				if pair && l.End != u.Ranked[i-1].End {
					b.WriteString("; ")
				} else {
					b.WriteString(" > ")
				}
			}
			b.WriteString(ligandName(m, l))
			if pair {
				fmt.Fprintf(b, " (on %s)", AtomName(m, u.Atoms[l.End]))
			}
		}
		b.WriteString("\n")
		for _, d := range u.Decisions {
			hi, lo := rankedAt(u, d.Higher, d.End), rankedAt(u, d.Lower, d.End)
			if hi == nil || lo == nil {
				continue
			}
			fmt.Fprintf(b, "- %s over %s: rule %s, sphere %d\n", ligandName(m, *hi), ligandName(m, *lo), d.Rule, d.Sphere)
		}
	}
	if s := markReading(m, u); s != "" {
		b.WriteString("\n" + s + "\n")
	}
}

// markReading says in words how a tetrahedral mark reads: seen from the
// first neighbour, the others run anticlockwise ('@') or clockwise ('@@').
func markReading(m *notation.Molecule, u *stereo.Unit) string {
	if u.Kind != stereo.KindTetrahedral || u.Centre < 0 {
		return ""
	}
	a := &m.Atoms[u.Centre]
	c := a.Chirality
	if c.Class != notation.ChiralTH || (c.Num != 1 && c.Num != 2) {
		return ""
	}
	var names []string
	implicit := "H"
	if a.HydrogenCount() == 0 {
		implicit = "the lone pair"
	}
	slot := a.HydrogenSlot()
	if a.HydrogenCount() == 0 && len(a.Bonds) == 3 {
		slot = m.LonePairSlot(u.Centre)
	}
	for i := range a.Bonds {
		if i == slot && (a.HydrogenCount() > 0 || len(a.Bonds) == 3) {
			names = append(names, implicit)
		}
		names = append(names, AtomName(m, m.Neighbour(u.Centre, i)))
	}
	if len(names) == 3 && len(a.Bonds) == 3 {
		names = append(names, implicit)
	}
	if len(names) != 4 {
		return ""
	}
	turn := "anticlockwise"
	if c.Num == 2 {
		turn = "clockwise"
	}
	mark := m.Text[c.Span.Start:c.Span.End]
	return fmt.Sprintf("`%s` reads: seen from %s, %s, %s and %s run %s.", mark, names[0], names[1], names[2], names[3], turn)
}

func kindName(k stereo.Kind) string {
	switch k {
	case stereo.KindTetrahedral:
		return "tetrahedral stereocentre"
	case stereo.KindDoubleBond:
		return "stereogenic double bond"
	case stereo.KindAllene:
		return "axial (allene) unit"
	}
	return k.String() + " centre"
}

// writeRecord summarises the record: formula, masses and stereo.
func writeRecord(b *strings.Builder, rec *Record) {
	m := rec.Mol()
	f := notation.MolecularFormula(m)
	fmt.Fprintf(b, "\n---\n%s, %.2f g/mol (monoisotopic %.4f)", f.String(), f.AverageMass, f.MonoisotopicMass)
	if rec.Occ.Title != "" {
		fmt.Fprintf(b, " · %s", rec.Occ.Title)
	}
	b.WriteString("\n\n")
	units, specified := len(rec.Stereo().Units), 0
	var labels []string
	for _, u := range rec.Stereo().Units {
		if u.Specified {
			specified++
		}
		if u.Descriptor.Labelled() {
			labels = append(labels, unitLabel(m, &u))
		}
	}
	fmt.Fprintf(b, "Stereo: %d unit(s), %d specified, %d not", units, specified, units-specified)
	if len(labels) > 0 {
		fmt.Fprintf(b, "; %s", strings.Join(labels, " "))
	}
	if c := rec.Stereo().Configuration(); c != "" {
		fmt.Fprintf(b, "; configuration %s", c)
		for gi, g := range rec.Stereo().Groups {
			if g.Kind != notation.GroupAbsolute {
				if d := rec.Stereo().GroupDescriptor(gi); d != "" {
					fmt.Fprintf(b, " (%s: %s)", g.Label(), d)
				}
			}
		}
	}
	if id := rec.Identify(); id != nil {
		fmt.Fprintf(b, "; %s", id.Chirality)
		n := rec.an.stereoisomersOf(m)
		if n.Exact {
			fmt.Fprintf(b, "; %d stereoisomer(s) for this constitution", n.Count)
		} else {
			fmt.Fprintf(b, "; at most %d stereoisomers for this constitution", n.Count)
		}
	}
	b.WriteString("\n")
}

// unitLabel writes a unit as "2S" or "3E" (the first atom's number), or
// in its group's frame: "2R*", "2RS".
func unitLabel(m *notation.Molecule, u *stereo.Unit) string {
	a := u.Centre
	if a < 0 && len(u.Atoms) > 0 {
		a = u.Atoms[0]
	}
	if l := u.GroupLabel(); l != "" {
		return fmt.Sprintf("%d%s", a+1, l)
	}
	return fmt.Sprintf("%d%s", a+1, u.Descriptor)
}

// groupFieldAt returns the index in the extension block of the stereo
// group whose field holds notation offset n, and the field's span.
func groupFieldAt(m *notation.Molecule, n int) (int, notation.Span) {
	ext := m.Extension
	if ext == nil || !ext.Span.Contains(n) {
		return -1, notation.Span{}
	}
	for gi := range ext.Groups {
		if f := ext.Groups[gi].Field; f >= 0 && f < len(ext.Fields) && ext.Fields[f].Span.Contains(n) {
			return gi, ext.Fields[f].Span
		}
	}
	return -1, notation.Span{}
}

// groupMeaning says in words what a group of the kind states.
func groupMeaning(k notation.GroupKind) string {
	switch k {
	case notation.GroupOr:
		return "relative configuration: the compound is as written or with every centre of the group inverted, and which one is not known"
	case notation.GroupAnd:
		return "racemic: a mixture of the compound as written and with every centre of the group inverted"
	}
	return "absolute configuration: the centres are as written"
}

// writeGroup explains the stereo group gi of the record's block.
func writeGroup(b *strings.Builder, rec *Record, gi int) {
	m, an := rec.Mol(), rec.Stereo()
	sg := &m.Extension.Groups[gi]
	fmt.Fprintf(b, "**stereo group %s**: %s\n", sg.Label(), groupMeaning(sg.Kind))
	for k := range an.Groups {
		g := &an.Groups[k]
		if g.Block != gi {
			continue
		}
		var names []string
		for _, a := range g.Atoms {
			names = append(names, AtomName(m, a))
		}
		fmt.Fprintf(b, "\nCentres: %s", strings.Join(names, ", "))
		if d := an.GroupDescriptor(k); d != "" {
			fmt.Fprintf(b, "; **%s**", d)
			if g.Kind != notation.GroupAbsolute {
				fmt.Fprintf(b, ", also written %s", an.GroupStarred(k))
			}
		}
		b.WriteString("\n")
	}
}

// writeUnitGroup says how the unit's configuration is known: its group
// and its descriptor in the group's frame.
func writeUnitGroup(b *strings.Builder, rec *Record, u *stereo.Unit) {
	an := rec.Stereo()
	if u.Group < 0 || u.GroupKind == notation.GroupAbsolute && len(an.Groups) == 0 {
		return
	}
	g := &an.Groups[u.Group]
	switch g.Kind {
	case notation.GroupOr:
		fmt.Fprintf(b, "\nIn stereo group %s: **%s**, relative configuration %s (the lowest-numbered centre of the group is cited as R)\n", g.Label(), u.GroupLabel(), an.GroupDescriptor(u.Group))
	case notation.GroupAnd:
		fmt.Fprintf(b, "\nIn stereo group %s: **%s**, racemic %s\n", g.Label(), u.GroupLabel(), an.GroupDescriptor(u.Group))
	default:
		fmt.Fprintf(b, "\nIn stereo group %s: absolute\n", g.Label())
	}
}

var elementNames = map[int]string{
	0: "wildcard atom", 1: "hydrogen", 5: "boron", 6: "carbon", 7: "nitrogen", 8: "oxygen", 9: "fluorine",
	11: "sodium", 12: "magnesium", 14: "silicon", 15: "phosphorus", 16: "sulfur", 17: "chlorine",
	19: "potassium", 20: "calcium", 26: "iron", 29: "copper", 30: "zinc", 32: "germanium", 33: "arsenic",
	34: "selenium", 35: "bromine", 50: "tin", 52: "tellurium", 53: "iodine", 54: "xenon",
}

func elementName(z int) string {
	if n, ok := elementNames[z]; ok {
		return n
	}
	return "element " + notation.ElementSymbol(z)
}

// writeReactionCentre says what a mapped reaction happens to do to the
// centre at atom a: retention or inversion by geometry, with the labels.
func writeReactionCentre(b *strings.Builder, rec *Record, a int) {
	if rec.Reaction() == nil {
		return
	}
	for _, c := range rec.Reaction().Centres {
		if c.Reactant != a && c.Product != a {
			continue
		}
		fmt.Fprintf(b, "\nAcross the reaction (map %d): **%s**", c.Map, c.Change)
		if c.ReactantLabel.Labelled() || c.ProductLabel.Labelled() {
			fmt.Fprintf(b, ", %s to %s", labelOrDash(c.ReactantLabel), labelOrDash(c.ProductLabel))
		}
		if c.Note != "" {
			fmt.Fprintf(b, " (%s)", c.Note)
		}
		b.WriteString("\n")
	}
}

func labelOrDash(d stereo.Descriptor) string {
	if d.Labelled() {
		return "(" + d.String() + ")"
	}
	return "unspecified"
}

// ligandName names a ranked ligand: its first atom, H or the lone pair.
func ligandName(m *notation.Molecule, l stereo.RankedLigand) string {
	if l.Atom < 0 && l.LonePair {
		return "lone pair"
	}
	return AtomName(m, l.Atom)
}

// rankedAt returns the ligand of a unit with the given rank (on the given
// end, for double bonds and allenes).
func rankedAt(u *stereo.Unit, rank, end int) *stereo.RankedLigand {
	pair := u.Kind != stereo.KindTetrahedral && len(u.Atoms) == 2
	for i := range u.Ranked {
		l := &u.Ranked[i]
		if l.Rank == rank && (!pair || l.End == end) {
			return l
		}
	}
	return nil
}

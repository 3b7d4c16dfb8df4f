package notation

import (
	"strconv"
	"strings"
)

// This file implements the readers of the fields of an extension block,
// one per syntax: stereo groups and other lists of indices (one table,
// listFields, says which numbers of each refer to atoms, bonds or
// components), coordinates, atom labels and values, atom properties and
// S-groups. extension_read.go finds the block and its fields.

// itemSpec describes the items of a list field: how many numbers an item
// has (separated by '.' or ':'), and what each number refers to.
type itemSpec struct {
	min, max int                    // numbers per item; max 0 is unbounded
	ref      func(i, n int) RefKind // what number i of an item of n refers to; 0 is a plain value
	star     bool                   // a plain value may be '*' (ring-bond counts)
}

// count says how many numbers an item has, for messages.
func (spec itemSpec) count() string {
	switch {
	case spec.max == 0:
		return "at least " + strconv.Itoa(spec.min) + " numbers"
	case spec.max != spec.min:
		return "from " + strconv.Itoa(spec.min) + " to " + strconv.Itoa(spec.max) + " numbers"
	case spec.min == 1:
		return "one number"
	}
	return strconv.Itoa(spec.min) + " numbers"
}

var (
	atomList      = itemSpec{min: 1, max: 1, ref: func(int, int) RefKind { return RefAtom }}
	bondList      = itemSpec{min: 1, max: 1, ref: func(int, int) RefKind { return RefBond }}
	atomBondPairs = itemSpec{min: 2, max: 2, ref: func(i, _ int) RefKind {
		if i == 0 {
			return RefAtom
		}
		return RefBond
	}}
	// hydrogen bonds: atom.bond pairs as coordinate bonds are written, or
	// bare bond indices; the syntax is not documented beyond its tag.
	hydrogenBonds = itemSpec{min: 1, max: 2, ref: func(i, n int) RefKind {
		if n == 2 && i == 0 {
			return RefAtom
		}
		return RefBond
	}}
	atomCounts = itemSpec{min: 2, max: 2, star: true, ref: func(i, _ int) RefKind {
		if i == 0 {
			return RefAtom
		}
		return 0
	}}
	// link nodes: atom:min.max, and the two outer atoms when the node has
	// more than two neighbours.
	linkNodes = itemSpec{min: 3, max: 5, ref: func(i, _ int) RefKind {
		if i == 1 || i == 2 {
			return 0
		}
		return RefAtom
	}}
	multicentre    = itemSpec{min: 2, ref: func(int, int) RefKind { return RefAtom }}
	fragmentGroups = itemSpec{min: 1, ref: func(int, int) RefKind { return RefComponent }}
	sgroupTree     = itemSpec{min: 2, ref: func(int, int) RefKind { return 0 }}
)

// listFields maps tags to the list fields read with an itemSpec.
var listFields = map[string]struct {
	kind FieldKind
	spec itemSpec
}{
	"c":   {FieldCisRing, bondList},
	"t":   {FieldTransRing, bondList},
	"ctu": {FieldUnspecifiedRing, bondList},
	"wU":  {FieldWedgeUp, atomBondPairs},
	"wD":  {FieldWedgeDown, atomBondPairs},
	"w":   {FieldWavy, atomBondPairs},
	"C":   {FieldCoordinateBonds, atomBondPairs},
	"H":   {FieldHydrogenBonds, hydrogenBonds},
	"Z":   {FieldZeroBonds, bondList},
	"LN":  {FieldLinkNodes, linkNodes},
	"m":   {FieldMulticentre, multicentre},
	"f":   {FieldFragmentGroups, fragmentGroups},
	"lp":  {FieldLonePairs, atomCounts},
	"LP":  {FieldLonePairs, atomCounts},
	"rb":  {FieldRingBondCounts, atomCounts},
	"s":   {FieldSubstitution, atomCounts},
	"u":   {FieldUnsaturation, atomList},
	"@":   {FieldLocalParity, atomList},
	"@@":  {FieldLocalParity, atomList},
	"SgH": {FieldSgroupHierarchy, sgroupTree},
}

// tagged reads a field with a tag and ':'; body is the offset after ':'.
func (b *blockReader) tagged(f *Field, tag string, body int) int {
	if kind, num, ok := groupTag(tag); ok {
		return b.group(f, kind, num, body)
	}
	if len(tag) == 2 && tag[0] == '^' {
		f.Kind = FieldRadicals
		if tag[1] < '1' || tag[1] > '7' {
			return b.malformed(f.Tag.Start, "expected a radical kind from ^1 to ^7, found '%s'", tag)
		}
		return b.items(f, body, atomList, tag)
	}
	if lf, ok := listFields[tag]; ok {
		f.Kind = lf.kind
		return b.items(f, body, lf.spec, tag)
	}
	switch tag {
	case "atomProp":
		f.Kind = FieldAtomProps
		return b.atomProps(f, body)
	case "Sg":
		f.Kind = FieldPolymerSgroup
		return b.sgroup(f, body, true)
	case "SgD":
		f.Kind = FieldDataSgroup
		return b.sgroup(f, body, false)
	}
	f.Kind = FieldUnknown
	return b.fieldEnd(body)
}

// groupTag recognises the tags of stereo groups: "a", and "o" or "&"
// with an optional number (RDKit 2022.09.3 reads "o:1" as a group).
func groupTag(tag string) (kind GroupKind, num int, ok bool) {
	switch {
	case tag == "a":
		return GroupAbsolute, 0, true
	case tag == "" || tag[0] != 'o' && tag[0] != '&':
		return 0, 0, false
	}
	digits := tag[1:]
	for i := 0; i < len(digits); i++ {
		if !isDigit(digits[i]) {
			return 0, 0, false
		}
	}
	kind = GroupOr
	if tag[0] == '&' {
		kind = GroupAnd
	}
	if len(digits) > 9 {
		return kind, -1, true
	}
	num, _ = strconv.Atoi(digits)
	if digits == "" {
		num = 0
	}
	return kind, num, true
}

// group reads a stereo group: its atom list, checked against the record
// and against the groups before it.
func (b *blockReader) group(f *Field, kind GroupKind, num, body int) int {
	f.Kind = FieldStereoGroup
	tag := b.text[f.Tag.Start:f.Tag.End]
	if num < 0 {
		return b.malformed(f.Tag.Start, "expected a group number of at most 9 digits, found %d digits", len(tag)-1)
	}
	end := b.items(f, body, atomList, tag)
	g := StereoGroup{Kind: kind, Number: num, Field: -1}
	gi := len(b.ext.Groups)
	for _, ref := range f.Refs {
		if ref.Index < 0 || ref.Index >= b.atoms {
			continue // reported by items
		}
		if b.owner == nil {
			b.owner = make([]int32, b.atoms)
			b.ownerSpan = make([]Span, b.atoms)
			for i := range b.owner {
				b.owner[i] = -1
			}
		}
		if prev := b.owner[ref.Index]; prev >= 0 {
			var e *Error
			if int(prev) == gi {
				e = b.errorf(ref.Span, CodeGroupOverlap, "expected each atom once in a stereo group, found index %d twice in %s", ref.Index, tag)
			} else {
				e = b.errorf(ref.Span, CodeGroupOverlap, "expected each atom in at most one stereo group, found index %d in %s and in %s", ref.Index, b.ext.Groups[prev].Label(), tag)
			}
			if e != nil {
				e.Related = append(e.Related, Related{Span: b.ownerSpan[ref.Index], Msg: "listed first here"})
			}
			continue
		}
		b.owner[ref.Index] = int32(gi)
		b.ownerSpan[ref.Index] = ref.Span
		g.Atoms = append(g.Atoms, ref.Index)
		g.AtomSpans = append(g.AtomSpans, ref.Span)
	}
	b.ext.Groups = append(b.ext.Groups, g)
	f.Group = gi
	return end
}

// items reads a comma-separated list of items from p, each item one or
// more numbers separated by '.' or ':', and returns the end of the field.
// The list ends at a comma after which a new field starts, or at the end
// of the block.
func (b *blockReader) items(f *Field, p int, spec itemSpec, tag string) int {
	if p >= b.end || b.text[p] == ',' && b.startsField(p+1) {
		b.errorf(Span{f.Tag.Start, p}, CodeExtensionField, "expected a number after '%s:', found %s", tag, b.foundAt(p))
		return p
	}
	var nums []Span // the numbers of one item, reused
	for {
		nums = nums[:0]
		for {
			q := p
			if spec.star && q < b.end && b.text[q] == '*' {
				q++
			} else {
				for q < b.end && isDigit(b.text[q]) {
					q++
				}
			}
			if q == p {
				return b.malformed(p, "expected a number in '%s:', found %s", tag, b.foundAt(p))
			}
			nums = append(nums, Span{p, q})
			p = q
			if p+1 < b.end && (b.text[p] == '.' || b.text[p] == ':') && (isDigit(b.text[p+1]) || spec.star && b.text[p+1] == '*') {
				p++
				continue
			}
			break
		}
		if n := len(nums); n < spec.min || spec.max > 0 && n > spec.max {
			return b.malformed(nums[0].Start, "expected %s in each item of '%s:', found %d", spec.count(), tag, n)
		}
		for i, span := range nums {
			if kind := spec.ref(i, len(nums)); kind != 0 {
				b.ref(f, kind, span, true)
			}
		}
		switch {
		case p >= b.end:
			return p
		case b.text[p] != ',':
			return b.malformed(p, "expected ',' or the end of '%s:', found %s", tag, b.foundAt(p))
		case b.startsField(p + 1):
			return p
		}
		p++
	}
}

// ref records a number that refers to an atom, bond or component, and
// checks it against the record.
func (b *blockReader) ref(f *Field, kind RefKind, span Span, check bool) {
	digits := b.text[span.Start:span.End]
	idx := -1
	if len(digits) <= 9 {
		idx, _ = strconv.Atoi(digits)
	}
	f.Refs = append(f.Refs, Ref{Kind: kind, Index: idx, Span: span})
	var limit int
	var what string
	switch kind {
	case RefAtom:
		limit, what = b.atoms, "atom"
	case RefBond:
		limit, what = b.bonds, "bond"
	default:
		limit, what = b.components, "component"
	}
	if !check || idx >= 0 && idx < limit {
		return
	}
	shown := "'" + digits + "'"
	if len(digits) > 12 {
		shown = "a number of " + strconv.Itoa(len(digits)) + " digits"
	}
	b.errorf(span, CodeExtensionIndex, "expected %s index below %d (the record has %d %ss), found %s", article(what), limit, limit, what, shown)
}

func article(w string) string {
	if w == "atom" {
		return "an atom"
	}
	return "a " + w
}

// coordinates reads "(x,y,z;x,y,z;...)": one entry per atom, each up to
// three numbers separated by commas, any of which may be empty (RDKit
// 2022.09.3 writes "1.5,1.29904," for a zero z). p is after '('.
func (b *blockReader) coordinates(f *Field, p int) int {
	close := strings.IndexByte(b.text[p:b.end], ')')
	if close < 0 {
		b.errorf(Span{p - 1, b.end}, CodeExtensionField, "expected ')' to close the coordinates, found %s", b.foundAt(b.end))
		return b.end
	}
	close += p
	reported := false
	for q := p; ; {
		k := strings.IndexByte(b.text[q:close], ';')
		e := close
		if k >= 0 {
			e = q + k
		}
		f.Entries = append(f.Entries, Span{q, e})
		if bad := badCoordinate(b.text[q:e]); bad.Len() > 0 && !reported {
			reported = true
			bad = bad.Shift(q)
			if bad.Start > q && b.text[bad.Start] == ',' {
				b.errorf(bad, CodeExtensionField, "expected at most three coordinates for an atom, found more")
			} else {
				b.errorf(bad, CodeExtensionField, "expected a coordinate (a decimal number), found %s", shownToken(b.text[bad.Start:bad.End]))
			}
		}
		if k < 0 {
			break
		}
		q = e + 1
	}
	b.checkEntries(f, "coordinates")
	p = close + 1
	if p < b.end && b.text[p] != ',' {
		return b.malformed(p, "expected ',' or '|' after the coordinates, found %s", b.foundAt(p))
	}
	return p
}

// badCoordinate returns the span (in s) of the first part of an entry
// that is not a decimal number, or of the fourth and later parts; empty
// when the entry is up to three optional numbers separated by commas.
func badCoordinate(s string) Span {
	for i, parts := 0, 1; ; parts++ {
		j := i
		for j < len(s) && s[j] != ',' {
			j++
		}
		if parts > 3 {
			return Span{i - 1, len(s)}
		}
		if !decimal(s[i:j]) {
			return Span{i, j}
		}
		if j >= len(s) {
			return Span{}
		}
		i = j + 1
	}
}

// shownToken quotes a short printable token for a message, or describes
// its first character.
func shownToken(s string) string {
	if len(s) > 16 {
		return describeAt(s, 0) + " and more"
	}
	for i := 0; i < len(s); i++ {
		if s[i] <= ' ' || s[i] > '~' || s[i] == '\'' {
			return describeAt(s, i) + " in '" + strings.ToValidUTF8(s[:i], "") + "...'"
		}
	}
	return "'" + s + "'"
}

// decimal reports whether s is empty or a decimal number: an optional
// sign, digits with an optional fraction, an optional exponent.
func decimal(s string) bool {
	i := 0
	if i < len(s) && (s[i] == '+' || s[i] == '-') {
		i++
	}
	digits := 0
	for i < len(s) && isDigit(s[i]) {
		i, digits = i+1, digits+1
	}
	if i < len(s) && s[i] == '.' {
		i++
		for i < len(s) && isDigit(s[i]) {
			i, digits = i+1, digits+1
		}
	}
	if digits == 0 {
		return s == ""
	}
	if i < len(s) && (s[i] == 'e' || s[i] == 'E') {
		i++
		if i < len(s) && (s[i] == '+' || s[i] == '-') {
			i++
		}
		exp := i
		for i < len(s) && isDigit(s[i]) {
			i++
		}
		if i == exp {
			return false
		}
	}
	return i == len(s)
}

// labels reads atom labels "$l;l;...$" or atom values "$_AV:v;v;...$".
func (b *blockReader) labels(f *Field, p int) int {
	f.Kind = FieldAtomLabels
	body := p + 1
	f.Tag = Span{p, p + 1}
	if strings.HasPrefix(b.text[body:b.end], "_AV:") {
		f.Kind = FieldAtomValues
		f.Tag = Span{p, p + 4}
		body = p + 5
	}
	close := strings.IndexByte(b.text[body:b.end], '$')
	if close < 0 {
		return b.malformed(p, "expected '$' to close the atom %s, found %s", strings.TrimPrefix(f.Kind.String(), "atom "), b.foundAt(b.end))
	}
	close += body
	for q := body; ; {
		k := strings.IndexByte(b.text[q:close], ';')
		if k < 0 {
			f.Entries = append(f.Entries, Span{q, close})
			break
		}
		f.Entries = append(f.Entries, Span{q, q + k})
		q += k + 1
	}
	b.checkEntries(f, f.Kind.String())
	p = close + 1
	if p < b.end && b.text[p] != ',' {
		return b.malformed(p, "expected ',' or '|' after the %s, found %s", f.Kind, b.foundAt(p))
	}
	return p
}

// checkEntries reports per-atom entries beyond the last atom. Empty
// entries there are harmless and accepted.
func (b *blockReader) checkEntries(f *Field, what string) {
	for i := b.atoms; i < len(f.Entries); i++ {
		if e := f.Entries[i]; e.Len() > 0 {
			b.errorf(e, CodeExtensionIndex, "expected %s for at most %d atoms (the record has %d), found one for atom index %d", what, b.atoms, b.atoms, i)
			return
		}
	}
}

// atomProps reads "atomProp:atom.name.value:atom.name.value...", as
// RDKit 2022.09.3 writes atom properties (a '.' inside a name or value
// escaped as "&#46;").
func (b *blockReader) atomProps(f *Field, p int) int {
	end := b.fieldEnd(p)
	for q := p; q < end; {
		d := q
		for d < end && isDigit(b.text[d]) {
			d++
		}
		if d == q || d >= end || b.text[d] != '.' {
			b.malformed(d, "expected an atom index and '.' in 'atomProp:', found %s", b.foundAt(d))
			return end
		}
		b.ref(f, RefAtom, Span{q, d}, true)
		// the entry runs to the next ':' that starts another entry
		next := end
		for k := d + 1; k < end; k++ {
			if b.text[k] == ':' && startsAtomProp(b.text[k+1:end]) {
				next = k
				break
			}
		}
		if next == end {
			break
		}
		q = next + 1
	}
	return end
}

// startsAtomProp reports whether s starts with digits and '.'.
func startsAtomProp(s string) bool {
	i := 0
	for i < len(s) && isDigit(s[i]) {
		i++
	}
	return i > 0 && i < len(s) && s[i] == '.'
}

// sgroup reads "Sg:type:atoms:..." (polymer) or "SgD:atoms:..." (data).
// The atom list is comma-separated; of the rest only the bond lists of a
// polymer S-group (its fifth and sixth parts, head and tail crossing
// bonds) refer to the record.
func (b *blockReader) sgroup(f *Field, p int, polymer bool) int {
	end := b.fieldEnd(p)
	tag := b.text[f.Tag.Start:f.Tag.End]
	q := p
	if polymer {
		for q < end && b.text[q] != ':' {
			q++
		}
		if q == p || q >= end {
			return b.malformed(p, "expected an S-group type and ':' in '%s:', found %s", tag, b.foundAt(q))
		}
		q++
	}
	// atoms
	for {
		d := q
		for d < end && isDigit(b.text[d]) {
			d++
		}
		if d == q {
			return b.malformed(q, "expected an atom index in '%s:', found %s", tag, b.foundAt(q))
		}
		b.ref(f, RefAtom, Span{q, d}, true)
		q = d
		if q < end && b.text[q] == ',' {
			q++
			continue
		}
		break
	}
	if q < end && b.text[q] != ':' {
		return b.malformed(q, "expected ',' or ':' after the atoms of '%s:', found %s", tag, b.foundAt(q))
	}
	if !polymer {
		return end
	}
	// subscript and connectivity, then parts that RDKit 2022.09.3 writes
	// empty ("Sg:n:1,2:n:ht:::"); numbers there (crossing bonds, in some
	// writers) are kept as bond references, unchecked, so that the field
	// is not renumbered blindly when atoms move.
	part := 0
	for q < end {
		q++ // ':'
		part++
		s := q
		for q < end && b.text[q] != ':' {
			q++
		}
		if part < 3 {
			continue
		}
		for k := s; k < q; {
			d := k
			for d < q && isDigit(b.text[d]) {
				d++
			}
			if d > k {
				b.ref(f, RefBond, Span{k, d}, false)
			}
			k = d + 1
		}
	}
	return end
}

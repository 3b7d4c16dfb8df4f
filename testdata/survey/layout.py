"""The layout of a writing: what a SMILES string says where, read without a
chemistry library.

The survey needs to know, for every stereo mark of a writing, how it is
written: whether the centre is the first atom, where its hydrogen, ring
digits and branches stand, which bonds carry direction marks and whether a
mark sits on a ring-closure digit. RDKit and Open Babel do not tell; this
small reader does, for the strings the survey writes (OpenSMILES section 2.2
grammar, plus ring digits after branches, which RDKit accepts).

Atoms are numbered in string order, as every reader of the survey numbers
them.
"""

import re

BRACKET = re.compile(
    r"\[(?P<iso>\d+)?(?P<sym>[A-Z][a-z]?|[a-z][a-z]?|\*)"
    r"(?P<chi>@(?:@|TH[12]|AL[12]|SP[123]|TB\d{1,2}|OH\d{1,2})?)?"
    r"(?P<h>H\d?)?(?P<chg>[+-]+\d*)?(?::(?P<cls>\d+))?\]")
ORGANIC = re.compile(r"Cl|Br|[BCNOPSFI]|[bcnops]|\*")


class Atom:
    def __init__(self, index, symbol, start, end):
        self.index = index
        self.symbol = symbol
        self.start, self.end = start, end
        self.bracket = False
        self.isotope = 0
        self.chirality = ""
        self.hcount = None  # written hydrogen count of a bracket atom
        self.aromatic = symbol[:1].islower()
        self.parent = None  # the atom it is bonded to on its left (from-atom)
        self.component_first = False
        self.record_first = False
        self.order = []  # neighbours in OpenSMILES order; 'H' for the bracket hydrogen
        self.digits = []  # Digit records on this atom, in order written
        self.branch_seen = False  # a branch was opened on this atom

    @property
    def is_hydrogen(self):
        return self.symbol == "H" and self.isotope == 0


class Digit:
    def __init__(self, number, atom, opening, bondsym, after_branch, pos):
        self.number = number
        self.atom = atom
        self.opening = opening
        self.bondsym = bondsym
        self.after_branch = after_branch
        self.pos = pos
        self.partner = None


class Bond:
    """A bond of the writing: its atoms (in the order written), its symbol
    and, for ring closures, the symbols at each digit."""

    def __init__(self, a, b, symbol, ring=None):
        self.a, self.b = a, b
        self.symbol = symbol  # '' '-' '=' '#' '$' ':' '/' '\\'
        self.ring = ring  # (opening Digit, closing Digit) for ring closures

    def marks(self):
        """[(char, atom written on, atom after it)]: each direction mark
        with the atom it is written after and the atom it points to."""
        out = []
        if self.ring:
            o, c = self.ring
            if o.bondsym in "/\\" and o.bondsym:
                out.append((o.bondsym, o.atom, c.atom))
            if c.bondsym in "/\\" and c.bondsym:
                out.append((c.bondsym, c.atom, o.atom))
        elif self.symbol in ("/", "\\"):
            out.append((self.symbol, self.a, self.b))
        return out

    @property
    def order(self):
        sym = self.symbol
        if self.ring:
            sym = self.ring[0].bondsym or self.ring[1].bondsym
        return {"=": 2, "#": 3, "$": 4}.get(sym, 1)


class Layout:
    def __init__(self, text):
        self.text = text
        self.atoms = []
        self.bonds = []
        self.ok = True
        self._parse()

    def bond(self, i, j):
        for b in self.bonds:
            if {b.a, b.b} == {i, j}:
                return b
        return None

    def neighbours(self, i):
        out = []
        for b in self.bonds:
            if b.a == i:
                out.append(b.b)
            elif b.b == i:
                out.append(b.a)
        return out

    def _parse(self):
        s = self.text
        i = 0
        prev = None  # atom the next atom bonds to
        stack = []
        pending = ""  # bond symbol waiting for the next atom
        open_digits = {}
        new_component = True
        while i < len(s):
            ch = s[i]
            if ch == "(":
                stack.append(prev)
                if prev is not None:
                    self.atoms[prev].branch_seen = True
                i += 1
                continue
            if ch == ")":
                prev = stack.pop() if stack else None
                i += 1
                continue
            if ch == ".":
                prev = None
                new_component = True
                i += 1
                continue
            if ch in "-=#$:/\\":
                pending = ch
                i += 1
                continue
            if ch.isdigit() or ch == "%":
                if ch == "%":
                    num = int(s[i + 1:i + 3])
                    width = 3
                else:
                    num = int(ch)
                    width = 1
                a = self.atoms[prev]
                d = Digit(num, prev, num not in open_digits, pending,
                          a.branch_seen, len(a.digits))
                a.digits.append(d)
                if d.opening:
                    open_digits[num] = d
                    a.order.append(("digit", d))
                else:
                    o = open_digits.pop(num)
                    o.partner, d.partner = prev, o.atom
                    bond = Bond(o.atom, prev, "", (o, d))
                    self.bonds.append(bond)
                    a.order.append(("digit", d))
                pending = ""
                i += width
                continue
            m = BRACKET.match(s, i) if ch == "[" else ORGANIC.match(s, i)
            if not m:
                self.ok = False
                return
            idx = len(self.atoms)
            if ch == "[":
                atom = Atom(idx, m.group("sym"), i, m.end())
                atom.bracket = True
                atom.isotope = int(m.group("iso") or 0)
                atom.chirality = m.group("chi") or ""
                h = m.group("h")
                atom.hcount = 0 if not h else (1 if h == "H" else int(h[1:]))
            else:
                atom = Atom(idx, m.group(0), i, m.end())
            self.atoms.append(atom)
            if prev is not None:
                atom.parent = prev
                self.bonds.append(Bond(prev, idx, pending))
                self.atoms[prev].order.append(("atom", idx))
                atom.order.append(("atom", prev))
            else:
                atom.component_first = True
                atom.record_first = idx == 0
            if atom.hcount:
                atom.order.append(("H", None))
            new_component = False
            pending = ""
            prev = idx
            i = m.end()
        if open_digits:
            self.ok = False
        # resolve digit entries of each atom's order into partner atoms
        for a in self.atoms:
            out = []
            for kind, v in a.order:
                if kind == "digit":
                    out.append(v.partner)
                elif kind == "H":
                    out.append("H")
                else:
                    out.append(v)
            a.order = out

    def degree(self, i):
        return len(self.neighbours(i))

    def hydrogens(self, i):
        """Hydrogens of atom i: bracket count plus [H] atoms bonded to it
        (implicit hydrogens of organic-subset atoms are not needed here:
        the survey's stereo centres are all written in brackets)."""
        a = self.atoms[i]
        return (a.hcount or 0) + sum(1 for n in self.neighbours(i) if self.atoms[n].is_hydrogen)

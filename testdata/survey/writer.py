"""A SMILES writer for the survey's targeted writings.

RDKit's writer chooses where marks go; the survey needs to choose: start at
a stereocentre, put its hydrogen in brackets or as an [H] atom at a given
place, put ring digits before or after its branches, put direction marks
on ring-closure digits (the opening one, the closing one or both), on bonds
shared by two double bonds, on bonds between aromatic atoms. This writer
takes an RDKit molecule and the configuration it is meant to have (a
configuration key as readers.py computes them, in the molecule's atom
numbers) and writes it under stated conventions, so each writing has an
intended meaning:

- tetrahedral centres: OpenSMILES section 3.8.2 (neighbours in string
  order, the bracket hydrogen right after the preceding atom or first,
  ring-closure neighbours in the order of their digits); a lone pair is
  placed either where a bracket hydrogen would stand ('implicit') or
  after all neighbours ('last'), the two readings of a first-atom lone pair
  the survey compares;
- double bonds: section 3.8.3, a mark read relative to the atom it follows;
  a mark on a ring-closure digit is read as if the partner atom followed
  that digit (so the two digits of one ring bond carry opposite marks when
  both are marked) unless ring_marks says 'both-same' (the same mark on
  both digits, section 3.4's rule for bond symbols on ring closures).

It does not write allenes or higher chirality classes.
"""

import random

from rdkit import Chem

import readers

ORGANIC = {"B": [3], "C": [4], "N": [3, 5], "O": [2], "P": [3, 5], "S": [2, 4, 6],
           "F": [1], "Cl": [1], "Br": [1], "I": [1]}
AROMATIC_BARE = {"b", "c", "n", "o", "p", "s"}


class WriteError(Exception):
    pass


class Options:
    def __init__(self, root=None, seed=0, lone_pair="implicit", marks="one",
                 ring_marks="close", prefer_ring_marks=False, digits_after_branches=False,
                 kekule=False, h_as_atom=(), shuffle=True, mark_aromatic=False):
        self.root = root
        self.seed = seed
        self.lone_pair = lone_pair  # 'implicit' or 'last'
        self.marks = marks  # 'one' per double-bond end, or 'all' neighbours
        self.ring_marks = ring_marks  # 'open', 'close', 'both', 'both-same'
        self.prefer_ring_marks = prefer_ring_marks
        self.digits_after_branches = digits_after_branches
        self.kekule = kekule
        self.h_as_atom = set(h_as_atom)  # atoms whose hydrogen becomes an [H] atom
        self.shuffle = shuffle
        self.mark_aromatic = mark_aromatic  # prefer marks on bonds between aromatic atoms


def intended_config(mol):
    """The configuration RDKit 2022.09.3 gives mol, in its own atom numbers
    (plain hydrogens as the H token)."""
    amap = [readers.H if (a.GetAtomicNum() == 1 and a.GetIsotope() == 0) else a.GetIdx()
            for a in mol.GetAtoms()]
    return readers.rdkit_config(mol, amap), amap


def write(mol, config, opt):
    """Writes mol with configuration config (keys in mol numbering, the
    form readers.rdkit_config gives) under opt. Returns (smiles, order)
    where order[k] is the mol atom written k-th."""
    mol = Chem.Mol(mol)
    if opt.h_as_atom:
        mol = Chem.AddHs(mol, onlyOnAtoms=sorted(opt.h_as_atom))
    if opt.kekule:
        Chem.Kekulize(mol, clearAromaticFlags=True)
    rng = random.Random(opt.seed)
    w = _Writer(mol, config, opt, rng)
    smiles, order = w.run()
    return smiles, order, mol


def transport(config, mol, order):
    """config (keys in mol numbering) in the numbering of a writing whose
    k-th atom is mol atom order[k]; plain hydrogens are the H token in
    both."""
    pos = {m: k for k, m in enumerate(order)}

    def tok(m):
        a = mol.GetAtomWithIdx(m)
        if a.GetAtomicNum() == 1 and a.GetIsotope() == 0:
            return readers.H
        return pos[m]

    def mtok(m):
        a = mol.GetAtomWithIdx(m)
        if a.GetAtomicNum() == 1 and a.GetIsotope() == 0:
            return readers.H
        return m

    out = {}
    for el, k in config.items():
        if el.startswith("a"):
            m = int(el[1:])
            nb = sorted(mtok(n.GetIdx()) for n in mol.GetAtomWithIdx(m).GetNeighbors())
            while len(nb) < 4:
                nb.insert(0, readers.H)
            # nb is sorted in mol numbering, so k is its '@'/'@@'
            wn = [readers.H if x == readers.H else pos[x] for x in nb]
            out["a%d" % pos[m]] = readers.centre_key(wn, k == "@")
        else:
            a, b = (int(x) for x in el[1:].split("-"))
            na = [n.GetIdx() for n in mol.GetAtomWithIdx(a).GetNeighbors() if n.GetIdx() != b]
            nb = [n.GetIdx() for n in mol.GetAtomWithIdx(b).GetNeighbors() if n.GetIdx() != a]
            ident = {m: mtok(m) for m in na + nb}
            heavy_a = [n for n in na if ident[n] != readers.H]
            heavy_b = [n for n in nb if ident[n] != readers.H]
            ra = min(heavy_a) if heavy_a else None
            rb = min(heavy_b) if heavy_b else None
            wmap = {m: tok(m) for m in na + nb}
            cis = k == "c"
            key = readers.bond_key(wmap, na, nb, ra, rb, cis)
            x, y = sorted((pos[a], pos[b]))
            out["b%d-%d" % (x, y)] = key
    return out


class _Writer:
    def __init__(self, mol, config, opt, rng):
        self.mol = mol
        self.opt = opt
        self.rng = rng
        self.n = mol.GetNumAtoms()
        self.hydrogen = [a.GetAtomicNum() == 1 and a.GetIsotope() == 0 and a.GetDegree() == 1
                         for a in mol.GetAtoms()]
        # keys of config name atoms of the molecule before AddHs; AddHs
        # appends atoms, so the numbers still hold
        self.centres = {}
        self.bonds = {}
        for el, k in config.items():
            if el.startswith("a"):
                self.centres[int(el[1:])] = k
            else:
                a, b = (int(x) for x in el[1:].split("-"))
                self.bonds[(a, b)] = k

    def token_of(self, i):
        return readers.H if self.hydrogen[i] else i

    # --- traversal -----------------------------------------------------
    def run(self):
        mol = self.mol
        roots = []
        seen = [False] * self.n
        parent = [None] * self.n
        children = [[] for _ in range(self.n)]
        ring_open = [[] for _ in range(self.n)]  # (partner) digits opened here
        ring_close = [[] for _ in range(self.n)]
        visit_order = []
        start = self.opt.root if self.opt.root is not None else 0
        order_roots = [start] + [i for i in range(self.n) if i != start]
        for r in order_roots:
            if seen[r] or (self.hydrogen[r] and r != start and self._h_parent(r) is not None):
                continue
            roots.append(r)
            self._dfs(r, seen, parent, children, ring_open, ring_close, visit_order)
        self.parent, self.children = parent, children
        self.ring_open, self.ring_close = ring_open, ring_close
        # ring digits: opened at the earlier atom; numbers assigned in
        # string order, reused when free
        self.pos = {a: k for k, a in enumerate(visit_order)}
        self.visit_order = visit_order
        self._assign_digits()
        self._assign_marks()
        self.written = []
        pieces = []
        for r in roots:
            pieces.append(self._emit(r))
        return ".".join(pieces), self.written

    def _h_parent(self, i):
        nb = [n.GetIdx() for n in self.mol.GetAtomWithIdx(i).GetNeighbors()]
        return nb[0] if nb else None

    def _dfs(self, root, seen, parent, children, ring_open, ring_close, visit_order):
        mol = self.mol

        def nbrs(a):
            out = [n.GetIdx() for n in mol.GetAtomWithIdx(a).GetNeighbors()]
            if self.opt.shuffle:
                self.rng.shuffle(out)
            return out

        seen[root] = True
        visit_order.append(root)
        stack = [(root, iter(nbrs(root)))]
        used = set()
        while stack:
            a, it = stack[-1]
            advanced = False
            for b in it:
                key = (min(a, b), max(a, b))
                if key in used:
                    continue
                if seen[b]:
                    # a ring bond: b was entered earlier and is still open
                    used.add(key)
                    ring_open[b].append(a)
                    ring_close[a].append(b)
                    continue
                used.add(key)
                seen[b] = True
                parent[b] = a
                children[a].append(b)
                visit_order.append(b)
                stack.append((b, iter(nbrs(b))))
                advanced = True
                break
            if not advanced:
                stack.pop()

    def _assign_digits(self):
        """Ring-closure numbers: an opening digit on the earlier atom, the
        closing digit on the later; the opening digits of an atom are
        ordered by where their partners come, closings by opening order."""
        self.digit = {}
        free = list(range(1, 100))
        for a in self.visit_order:
            # a number closed here is free only for later atoms, so that an
            # atom never opens and closes the same number
            freed = []
            for b in self.ring_close[a]:
                freed.append(self.digit[(min(a, b), max(a, b))])
            for b in sorted(self.ring_open[a], key=lambda x: self.pos[x]):
                self.digit[(min(a, b), max(a, b))] = free.pop(0)
            if not self.opt.digits_after_branches:
                # closing digits written after branches would let a
                # branch reuse a number still open; that mode never reuses
                free = sorted(free + freed)
            if not free:
                raise WriteError("more than 99 ring closures open")
        self.rings_at = {a: [] for a in range(self.n)}
        self.late_closes = {}
        for a in self.visit_order:
            closes = [(b, False) for b in self.ring_close[a]]
            opens = [(b, True) for b in sorted(self.ring_open[a], key=lambda x: self.pos[x])]
            if self.opt.digits_after_branches and len(self.children[a]) > 1:
                # openings before the branches, closings after them
                self.rings_at[a] = opens + closes
                self.late_closes[a] = len(closes)
                continue
            entries = closes + opens
            if self.opt.shuffle:
                self.rng.shuffle(entries)
            self.rings_at[a] = entries

    # --- written neighbour order ------------------------------------------
    def written_order(self, a):
        """Neighbours of a in the order a reader meets them (OpenSMILES
        3.8.2), with 'H' for the bracket hydrogen and 'LP' for a lone pair
        placed by the lone-pair convention."""
        out = []
        if self.parent[a] is not None:
            out.append(self.parent[a])
        atom = self.mol.GetAtomWithIdx(a)
        nh = atom.GetTotalNumHs()  # bracket hydrogens (not [H] atoms)
        if nh == 1:
            out.append("H")
        rings = [b for b, _ in self.rings_at[a]]
        kids = self.children[a]
        late = self.late_closes.get(a, 0)
        if late:
            early, tail = rings[:len(rings) - late], rings[len(rings) - late:]
            out += early + kids[:-1] + tail + kids[-1:]
        else:
            out += rings + kids
        deg = len([x for x in out if x != "H"])
        if nh == 0 and deg == 3:
            if self.opt.lone_pair == "implicit":
                out.insert(1 if self.parent[a] is not None else 0, "LP")
            else:
                out.append("LP")
        return out

    def chirality(self, a):
        k = self.centres.get(a)
        if k is None:
            return ""
        order = self.written_order(a)
        toks = [readers.H if x in ("H", "LP") else self.token_of(x) for x in order]
        if len(toks) != 4:
            raise WriteError("centre %d has %d neighbours" % (a, len(toks)))
        return "@" if readers.centre_key(toks, True) == k else "@@"

    # --- direction marks ----------------------------------------------------
    def _assign_marks(self):
        """Chooses marked bonds and their characters so that every double
        bond gets its configuration; marks shared by conjugated double
        bonds are kept consistent or the writing fails."""
        self.side = {}  # (end atom, substituent) -> +1/-1
        self.marked = set()  # bond keys carrying a mark
        mol = self.mol
        for (a, b), k in sorted(self.bonds.items()):
            bond = mol.GetBondBetweenAtoms(a, b)
            if bond is None or bond.GetBondType() != Chem.BondType.DOUBLE:
                raise WriteError("no double bond %d-%d" % (a, b))
            subs = {}
            for x, y in ((a, b), (b, a)):
                subs[x] = [n.GetIdx() for n in mol.GetAtomWithIdx(x).GetNeighbors() if n.GetIdx() != y]
            refs = {}
            for x in (a, b):
                heavy = [n for n in subs[x] if not self.hydrogen[n]]
                refs[x] = min(heavy) if heavy else (subs[x][0] if subs[x] else None)
            if refs[a] is None or refs[b] is None:
                raise WriteError("double bond end without substituent")
            want_same = k == "c"
            # side of each substituent relative to the ref of its end: the
            # ref gets s_x, the other substituent -s_x
            chosen = {}
            for x in (a, b):
                cands = [n for n in subs[x] if self._markable(x, n)]
                if not cands:
                    raise WriteError("no markable bond at %d" % x)
                if self.opt.marks == "all":
                    chosen[x] = cands
                else:
                    chosen[x] = [self._prefer(x, cands)]
            # fixed sides from marks already set by another double bond
            s = {a: None, b: None}
            for x in (a, b):
                for n in subs[x]:
                    if (x, n) in self.side:
                        v = self.side[(x, n)] * (1 if n == refs[x] else -1)
                        if s[x] is not None and s[x] != v:
                            raise WriteError("conflicting shared marks")
                        s[x] = v
            if s[a] is None and s[b] is None:
                s[a] = 1
            if s[a] is None:
                s[a] = s[b] if want_same else -s[b]
            if s[b] is None:
                s[b] = s[a] if want_same else -s[a]
            if (s[a] == s[b]) != want_same:
                raise WriteError("conflicting shared marks")
            for x in (a, b):
                for n in subs[x]:
                    v = s[x] * (1 if n == refs[x] else -1)
                    self.side[(x, n)] = v
                for n in chosen[x]:
                    self.marked.add((min(x, n), max(x, n)))
        # a marked bond shared by two double bonds must agree with both:
        # checked when characters are computed

    def _markable(self, x, n):
        bond = self.mol.GetBondBetweenAtoms(x, n)
        return bond.GetBondType() in (Chem.BondType.SINGLE, Chem.BondType.AROMATIC) and (
            bond.GetBondType() == Chem.BondType.SINGLE or self.opt.mark_aromatic)

    def _prefer(self, x, cands):
        def is_ring(n):
            return (min(x, n), max(x, n)) in self.digit

        def both_aromatic(n):
            return self.mol.GetAtomWithIdx(x).GetIsAromatic() and self.mol.GetAtomWithIdx(n).GetIsAromatic()

        if self.opt.prefer_ring_marks:
            r = [n for n in cands if is_ring(n)]
            if r:
                return r[0]
        if self.opt.mark_aromatic:
            r = [n for n in cands if both_aromatic(n)]
            if r:
                return r[0]
        # already marked bonds first (shared marks), then the first written
        r = [n for n in cands if (min(x, n), max(x, n)) in self.marked]
        if r:
            return r[0]
        return self.rng.choice(cands) if self.opt.shuffle else cands[0]

    def bond_char(self, u, v, at_digit_of=None):
        """The direction character for bond u-v written with u first (a
        chain or branch bond), or at a ring digit on atom at_digit_of."""
        key = (min(u, v), max(u, v))
        if key not in self.marked:
            return None
        # the configuration asks for side_x(n) at each end x of a double
        # bond; find a side the bond carries
        wants = []
        for x, n in ((u, v), (v, u)):
            if (x, n) in self.side:
                wants.append((x, n, self.side[(x, n)]))
        chars = set()
        for x, n, side in wants:
            # reading: the character is read as 'p c q' with p first
            if at_digit_of is None:
                p = u
            else:
                p = at_digit_of
            if self.opt.ring_marks == "both-same" and at_digit_of is not None:
                # section 3.4: the same symbol on both digits, read as
                # written at the opening digit
                p = self._opening_atom(key)
            before = n == p  # the substituent comes first
            d = side if before else -side
            chars.add("/" if d > 0 else "\\")
        if len(chars) != 1:
            raise WriteError("a shared mark cannot serve both double bonds")
        return chars.pop()

    def _opening_atom(self, key):
        a, b = key
        return a if self.pos[a] < self.pos[b] else b

    # --- output -------------------------------------------------------------
    def _atom_text(self, a):
        atom = self.mol.GetAtomWithIdx(a)
        sym = atom.GetSymbol()
        arom = atom.GetIsAromatic() and not self.opt.kekule
        text = sym.lower() if arom else sym
        chi = self.chirality(a)
        nh = atom.GetTotalNumHs()
        chg = atom.GetFormalCharge()
        iso = atom.GetIsotope()
        bare = (not chi and not chg and not iso and atom.GetNumRadicalElectrons() == 0
                and self._bare_ok(atom, arom, nh))
        if bare:
            return text
        out = "[" + (str(iso) if iso else "") + text + chi
        if nh:
            out += "H" + (str(nh) if nh > 1 else "")
        if chg:
            out += ("+" if chg > 0 else "-") + (str(abs(chg)) if abs(chg) > 1 else "")
        return out + "]"

    def _bare_ok(self, atom, arom, nh):
        sym = atom.GetSymbol()
        if arom:
            if sym.lower() not in AROMATIC_BARE:
                return False
            if sym == "C":
                return nh == 3 - atom.GetDegree() or (nh == 0 and atom.GetDegree() == 3)
            return nh == 0
        if sym not in ORGANIC:
            return False
        v = 0
        for b in atom.GetBonds():
            v += int(b.GetBondTypeAsDouble())
        for val in ORGANIC[sym]:
            if v <= val:
                return nh == val - v
        return nh == 0

    def _bond_text(self, u, v, at_digit_of=None):
        bond = self.mol.GetBondBetweenAtoms(u, v)
        bt = bond.GetBondType()
        ch = self.bond_char(u, v, at_digit_of)
        if ch:
            return ch
        if bt == Chem.BondType.DOUBLE:
            return "="
        if bt == Chem.BondType.TRIPLE:
            return "#"
        if bt == Chem.BondType.AROMATIC and not self.opt.kekule:
            return ""
        if bt == Chem.BondType.AROMATIC:
            return ""
        au, av = self.mol.GetAtomWithIdx(u), self.mol.GetAtomWithIdx(v)
        if (au.GetIsAromatic() and av.GetIsAromatic() and not self.opt.kekule):
            return "-"
        return ""

    def _ring_text(self, a, b, opening):
        key = (min(a, b), max(a, b))
        num = self.digit[key]
        digit = str(num) if num < 10 else "%" + str(num)
        sym = ""
        bond = self.mol.GetBondBetweenAtoms(a, b)
        marked = key in self.marked
        site = self.opt.ring_marks
        if marked:
            put = (site in ("both", "both-same")) or (site == "open" and opening) or (
                site == "close" and not opening)
            if put:
                sym = self.bond_char(a, b, at_digit_of=a)
        elif opening:
            sym = self._bond_text(a, b)
        return sym + digit

    def _emit(self, root):
        out = []
        # iterative emission: (atom, bond text before it)
        stack = [("atom", root, "")]
        while stack:
            kind, a, pre = stack.pop()
            if kind == "text":
                out.append(a)
                continue
            self.written.append(a)
            out.append(pre + self._atom_text(a))
            texts = [self._ring_text(a, b, opening) for b, opening in self.rings_at[a]]
            late = self.late_closes.get(a, 0)
            rings = "".join(texts[:len(texts) - late])
            tail_rings = "".join(texts[len(texts) - late:])
            kids = self.children[a]
            parts = [(c, self._bond_text(a, c)) for c in kids]
            branch = parts[:-1]
            out.append(rings)
            # push in reverse: last child (chain), tail rings, branches
            if parts:
                stack.append(("atom", parts[-1][0], parts[-1][1]))
            if tail_rings:
                stack.append(("text", tail_rings, ""))
            for c, bt in reversed(branch):
                stack.append(("text", ")", ""))
                stack.append(("atom", c, "(" + bt))
        return "".join(out)

"""The constructs of the survey: ways of writing a stereo mark that readers
read differently, how to find them, and a reference interpreter that reads
a mark under each reader's conventions.

An element of a writing is a tetrahedral centre ('a<atom>') or a double
bond ('b<atom>-<atom>'), atoms numbered from 0 in string order.

RULES lists the conventions on which readers part: for each, the values a
reader may hold. READER_RULES says which value each surveyed reader holds;
they were found by this survey (gen_survey.py fails when a reading is not
predicted by them). interpret() reads one element of a writing under a set
of rules and gives its configuration key (readers.py form). classify()
compares each reader's configuration with interpret() under that reader's
rules; where readers differ it names the construct whose rule made the
difference, and where a reader keeps no configuration although the marks
give one it names the structural reason (perception, not reading).
"""

from rdkit import Chem

import layout as L
import readers

RDKIT = "rdkit-2022.09.3"
RDKIT_JS = "rdkit-js"  # the npm release; its version goes in the fixture header
OPENBABEL = "openbabel"
READERS = (RDKIT, RDKIT_JS, OPENBABEL)

# rule -> {value: description}
RULES = {
    "lone-pair": {
        "hydrogen-place": "a lone pair stands where a bracket hydrogen would (OpenSMILES "
                          "3.8.2's rule for the hydrogen): right after the preceding atom, "
                          "first when the centre starts the record or a dot-separated part",
        "last": "a lone pair stands after all written neighbours",
        "last-flipped-per-digit": "a lone pair stands after all written neighbours; on a "
                                  "centre with only single bonds (amine nitrogen, phosphine, "
                                  "sulfonium, charge-separated sulfoxide) each ring-closure "
                                  "digit on the centre inverts the reading once more",
    },
    "ring-marks-both": {
        "relative": "each digit's mark is read relative to its own atom (3.8.3); if the two "
                    "disagree, the double bond is left unspecified",
        "as-opening": "the mark is read once, as written at the opening digit (3.4: the same "
                      "symbol on both digits)",
        "closing-decides": "only the mark at the closing digit counts, read relative to its atom",
        "ignore-disagreeing": "each digit read relative to its own atom; if they disagree both "
                              "are ignored and the other marks of the double bond decide",
    },
    "allene": {
        "extended-tetrahedral": "'@' on the middle atom of an allene is read (3.8.4)",
        "ignored": "'@' on the middle atom of an allene is dropped",
    },
}

READER_RULES = {
    RDKIT: {"lone-pair": "last-flipped-per-digit", "ring-marks-both": "closing-decides",
            "allene": "ignored"},
    RDKIT_JS: {"lone-pair": "last-flipped-per-digit", "ring-marks-both": "closing-decides",
               "allene": "ignored"},
    OPENBABEL: {"lone-pair": "hydrogen-place", "ring-marks-both": "ignore-disagreeing",
                "allene": "ignored"},
}


def writer_rules(lone_pair, ring_marks):
    """The rules under which writer.py wrote a writing."""
    return {"lone-pair": "hydrogen-place" if lone_pair == "implicit" else "last",
            "ring-marks-both": "as-opening" if ring_marks == "both-same" else "relative",
            "allene": "extended-tetrahedral"}


class Construct:
    def __init__(self, name, kind, section, says, rule, portable):
        self.name, self.kind, self.section, self.says = name, kind, section, says
        self.rule = rule  # the RULES entry whose values decide its reading, or None
        self.portable = portable


# Constructs found at elements. rule names the convention that decides
# them (None: every reader surveyed reads them alike).
CONSTRUCTS = [
    Construct("first-atom-lone-pair", "centre", "3.8.2",
              "the bracket hydrogen of a first atom is the atom one looks from; a lone pair "
              "is not mentioned", "lone-pair",
              "start the record at another atom, so the centre follows its preceding atom"),
    Construct("first-atom-lone-pair-ring-digit", "centre", "3.8.2",
              "as first-atom-lone-pair; the centre also carries a ring-closure digit",
              "lone-pair",
              "start the record at another atom and keep ring digits off the centre"),
    Construct("lone-pair-ring-digit", "centre", "3.8.2",
              "a ring-closure neighbour counts at the place of its digit; a lone pair is "
              "not mentioned", "lone-pair",
              "write the centre without ring-closure digits (open and close the ring at "
              "other atoms)"),
    Construct("lone-pair", "centre", "3.8.2",
              "silent on lone pairs; after a preceding atom and without ring digits, the "
              "readings give the same parity", "lone-pair", "already portable"),
    Construct("first-atom-hydrogen", "centre", "3.8.2",
              "a bracket hydrogen of the first atom is the atom one looks from", None,
              "already portable"),
    Construct("ring-digit", "centre", "3.8.2",
              "a ring-closure neighbour counts at the place of its digit, not of its atom",
              None, "already portable"),
    Construct("ring-digit-after-branch", "centre", "2.2",
              "the grammar puts ring-closure digits before branches (branched_atom ::= atom "
              "ringbond* branch*)", None, "write the digits right after the atom"),
    Construct("explicit-hydrogen-first", "centre", "3.6, 3.8.2",
              "an [H] atom is an ordinary neighbour, here the first one", None,
              "already portable"),
    Construct("explicit-hydrogen-middle", "centre", "3.6, 3.8.2",
              "an [H] atom is an ordinary neighbour, here neither first nor last", None,
              "already portable"),
    Construct("explicit-hydrogen-last", "centre", "3.6, 3.8.2",
              "an [H] atom is an ordinary neighbour, here the last one", None,
              "already portable"),
    Construct("two-hydrogens", "centre", "4.3.6",
              "a mark on an atom that is not a stereocentre should not be written", None,
              "remove the mark"),
    Construct("allene", "centre", "3.8.4",
              "'@' on the middle atom of an allene refers to the substituents at its ends",
              "allene", "no portable SMILES: no surveyed library keeps it"),
    Construct("ring-mark-open", "bond", "3.4, 3.8.3, 6.3",
              "a bond symbol may stand at either digit; a direction mark is read relative "
              "to the atom it follows (6.3: C/1=C/CCCCCCC1 is cis)", None, "already portable"),
    Construct("ring-mark-close", "bond", "3.4, 3.8.3",
              "as ring-mark-open, at the closing digit", None, "already portable"),
    Construct("ring-mark-both", "bond", "3.4, 3.8.3, 6.3",
              "marks on both digits read relative to each atom agree when the characters "
              "differ (6.3's cyclooctatetraene C/1=C/C=C\\C=C/C=C\\1)", "ring-marks-both",
              "keep the mark on one digit"),
    Construct("ring-mark-both-same", "bond", "3.4 against 3.8.3",
              "3.4 asks for the same bond symbol at both digits; read relative to each "
              "atom (3.8.3) the same direction mark at both digits contradicts itself",
              "ring-marks-both", "keep the mark on one digit, or on a chain bond"),
    Construct("shared-mark", "bond", "3.8.3, 6.3",
              "one mark between two double bonds serves both (6.3)", None, "already portable"),
    Construct("aromatic-mark", "bond", "3.5, 3.8.3",
              "a direction mark on a bond between two aromatic (lowercase) atoms", None,
              "already portable"),
    Construct("explicit-hydrogen-mark", "bond", "3.6, 3.8.3",
              "a direction mark on the bond to an [H] atom", None, "already portable"),
    Construct("both-substituents-marked", "bond", "3.8.3",
              "both substituents of one end marked; they must point opposite ways", None,
              "already portable"),
]

BY_NAME = {c.name: c for c in CONSTRUCTS}
ORDER = {c.name: i for i, c in enumerate(CONSTRUCTS)}


# --- the reference interpreter -------------------------------------------

def centre_info(lay, i):
    """(neighbour tokens in written order, lone pair?, double bond?)."""
    a = lay.atoms[i]
    toks = []
    for x in a.order:
        if x == "H":
            toks.append(readers.H)
        elif lay.atoms[x].is_hydrogen:
            toks.append(readers.H)
        else:
            toks.append(x)
    nb = lay.neighbours(i)
    lone_pair = (a.hcount or 0) == 0 and len(nb) == 3
    double = any(lay.bond(i, n).order == 2 for n in nb)
    return toks, lone_pair, double


def is_allene_centre(lay, i):
    nb = lay.neighbours(i)
    return len(nb) == 2 and all(lay.bond(i, n).order == 2 for n in nb)


def interpret_centre(lay, i, rules):
    a = lay.atoms[i]
    chi = {"@": "@", "@TH1": "@", "@@": "@@", "@TH2": "@@", "@AL1": "@", "@AL2": "@@"}.get(a.chirality)
    if chi is None:
        return None
    if is_allene_centre(lay, i):
        return "allene" if rules["allene"] == "extended-tetrahedral" else None
    toks, lone_pair, double = centre_info(lay, i)
    if lone_pair:
        rule = rules["lone-pair"]
        if rule == "hydrogen-place":
            toks.insert(1 if a.parent is not None else 0, readers.H)
        else:
            toks.append(readers.H)
            if rule == "last-flipped-per-digit" and not double and len(a.digits) % 2:
                chi = "@@" if chi == "@" else "@"
    return readers.centre_key(toks, chi == "@")


def mark_sides(lay, end, rules):
    """{substituent: side} from the direction marks on the bonds of end,
    or None when the marks of one bond contradict themselves under a
    rule that gives up."""
    sides = {}
    for n in lay.neighbours(end):
        b = lay.bond(end, n)
        if b.order != 1:
            continue
        marks = b.marks()
        if not marks:
            continue
        if b.ring and len(marks) == 2:
            rule = rules["ring-marks-both"]
            o, c = b.ring
            vals = [side_of(ch, p, end) for ch, p, _ in marks]
            if rule == "as-opening":
                vals = [side_of(o.bondsym, o.atom, end)]
            elif rule == "closing-decides":
                vals = [vals[1]]
            elif vals[0] != vals[1]:
                if rule == "ignore-disagreeing":
                    continue
                return None
            sides[n] = vals[0]
        else:
            ch, p, _ = marks[0]
            sides[n] = side_of(ch, p, end)
    return sides


def side_of(ch, p, end):
    """Side of the substituent relative to end for a mark ch written
    after atom p ('p ch partner'): +1 when the substituent comes first."""
    d = 1 if ch == "/" else -1
    return d if p != end else -d


def interpret_bond(lay, x, y, rules):
    sides = {}
    for end, other in ((x, y), (y, x)):
        s = mark_sides(lay, end, rules)
        if s is None:
            return None
        s.pop(other, None)
        subs = [n for n in lay.neighbours(end) if n != other]
        if not s:
            return None
        if len(s) == 2 and len(set(s.values())) == 1:
            return None  # both substituents on one side: conflicting marks
        full = dict(s)
        for n in subs:
            if n not in full:
                full[n] = -next(iter(s.values()))
        sides[end] = (subs, full)

    def ref(end):
        subs, _ = sides[end]
        heavy = [n for n in subs if not lay.atoms[n].is_hydrogen]
        return min(heavy) if heavy else (subs[0] if subs else None)

    rx, ry = ref(x), ref(y)
    if rx is None or ry is None:
        return None
    same = sides[x][1][rx] == sides[y][1][ry]
    return "c" if same else "t"


def interpret(lay, el, rules):
    if el.startswith("a"):
        return interpret_centre(lay, int(el[1:]), rules)
    x, y = (int(v) for v in el[1:].split("-"))
    return interpret_bond(lay, x, y, rules)


# --- finding constructs --------------------------------------------------

def find(lay):
    """{element: [construct names]} for every marked element of a writing."""
    found = {}
    atoms = lay.atoms
    for a in atoms:
        if not a.chirality:
            continue
        i = a.index
        names = []
        if is_allene_centre(lay, i):
            found["a%d" % i] = ["allene"]
            continue
        toks, lone_pair, double = centre_info(lay, i)
        if lay.hydrogens(i) >= 2:
            names.append("two-hydrogens")
        if lone_pair:
            if a.component_first:
                names.append("first-atom-lone-pair-ring-digit" if a.digits else "first-atom-lone-pair")
            else:
                names.append("lone-pair-ring-digit" if a.digits else "lone-pair")
        if a.component_first and (a.hcount or 0) == 1:
            names.append("first-atom-hydrogen")
        if a.digits:
            names.append("ring-digit")
            if any(d.after_branch for d in a.digits):
                names.append("ring-digit-after-branch")
        hpos = [k for k, x in enumerate(a.order) if x != "H" and atoms[x].is_hydrogen]
        for k in hpos:
            if k == 0:
                names.append("explicit-hydrogen-first")
            elif k == len(a.order) - 1:
                names.append("explicit-hydrogen-last")
            else:
                names.append("explicit-hydrogen-middle")
        found["a%d" % i] = names
    for a in atoms:
        # outside the grammar wherever it stands, marked atom or not
        if any(d.after_branch for d in a.digits):
            names = found.setdefault("a%d" % a.index, [])
            if "ring-digit-after-branch" not in names:
                names.append("ring-digit-after-branch")
    for b in lay.bonds:
        if b.order != 2:
            continue
        x, y = b.a, b.b
        names = []
        marked = False
        for end, other in ((x, y), (y, x)):
            nmarked = 0
            for n in lay.neighbours(end):
                if n == other:
                    continue
                nb = lay.bond(end, n)
                marks = nb.marks()
                if not marks:
                    continue
                marked = True
                nmarked += 1
                if nb.ring:
                    o, c = nb.ring
                    om = o.bondsym if o.bondsym in ("/", "\\") else ""
                    cm = c.bondsym if c.bondsym in ("/", "\\") else ""
                    if om and cm:
                        names.append("ring-mark-both-same" if om == cm else "ring-mark-both")
                    elif om:
                        names.append("ring-mark-open")
                    else:
                        names.append("ring-mark-close")
                if atoms[end].aromatic and atoms[n].aromatic:
                    names.append("aromatic-mark")
                if atoms[n].is_hydrogen:
                    names.append("explicit-hydrogen-mark")
                for m in lay.neighbours(n):
                    if m != end and lay.bond(n, m).order == 2 and any(
                            lay.bond(m, k).marks() for k in lay.neighbours(m) if k != n):
                        names.append("shared-mark")
            if nmarked == 2:
                names.append("both-substituents-marked")
        if marked:
            found["b%d-%d" % (min(x, y), max(x, y))] = sorted(set(names), key=ORDER.get)
    return found


RULE_CONSTRUCTS = {
    "lone-pair": ("first-atom-lone-pair", "first-atom-lone-pair-ring-digit",
                  "lone-pair-ring-digit", "lone-pair"),
    "ring-marks-both": ("ring-mark-both-same", "ring-mark-both"),
    "allene": ("allene",),
}


def causes(lay, el, names, rules_a, rules_b):
    """The constructs of el whose rule, switched alone from rules_a to
    rules_b, changes the interpreted configuration."""
    out = []
    base = interpret(lay, el, rules_a)
    for rule, cons in RULE_CONSTRUCTS.items():
        if rules_a[rule] == rules_b[rule]:
            continue
        switched = dict(rules_a)
        switched[rule] = rules_b[rule]
        if interpret(lay, el, switched) != base:
            out += [n for n in names if n in cons] or [rule]
    return out


# --- perception: why a reader keeps no configuration ---------------------

def perception_kinds(mol, el):
    """Structural reasons a reader may decide an element is not a
    stereogenic unit (RDKit's molecule of the writing, [H] atoms kept)."""
    if mol is None:
        return ["unreadable-by-rdkit"]
    kinds = []
    ranks = list(Chem.CanonicalRankAtoms(mol, breakTies=False, includeChirality=False))
    noiso = Chem.Mol(mol)
    for a in noiso.GetAtoms():
        a.SetIsotope(0)
    ranks_noiso = list(Chem.CanonicalRankAtoms(noiso, breakTies=False, includeChirality=False))

    def equal_pairs(nbrs, r):
        vals = [r[n] for n in nbrs]
        return len(vals) != len(set(vals))

    if el.startswith("a"):
        i = int(el[1:])
        atom = mol.GetAtomWithIdx(i)
        nbrs = [n.GetIdx() for n in atom.GetNeighbors()]
        sym, chg, deg = atom.GetSymbol(), atom.GetFormalCharge(), atom.GetDegree()
        if sym == "N" and chg == 1 and deg == 4:
            kinds.append("quaternary-nitrogen")
        elif sym == "N" and deg == 3:
            kinds.append("amine-nitrogen")
        elif sym in ("P", "As") and deg == 3:
            kinds.append("phosphine")
        elif sym == "Se":
            kinds.append("selenium-centre")
        hs = atom.GetTotalNumHs() + sum(1 for n in atom.GetNeighbors()
                                         if n.GetAtomicNum() == 1 and n.GetIsotope() == 0)
        if hs and any(n.GetAtomicNum() == 1 and n.GetIsotope() for n in atom.GetNeighbors()):
            kinds.append("hydrogen-isotope")
        if equal_pairs(nbrs, ranks):
            kinds.append("equivalent-ligands")
        elif equal_pairs(nbrs, ranks_noiso):
            kinds.append("isotope-ligands")
        if not kinds:
            kinds.append("centre-other")
    else:
        x, y = (int(v) for v in el[1:].split("-"))
        for end, other in ((x, y), (y, x)):
            atom = mol.GetAtomWithIdx(end)
            subs = [n.GetIdx() for n in atom.GetNeighbors() if n.GetIdx() != other]
            iso_h = any(mol.GetAtomWithIdx(n).GetAtomicNum() == 1 and mol.GetAtomWithIdx(n).GetIsotope()
                        for n in subs)
            if iso_h and (atom.GetTotalNumHs() or len(subs) == 2 and all(
                    mol.GetAtomWithIdx(n).GetAtomicNum() == 1 for n in subs)):
                kinds.append("hydrogen-isotope")
            if len(subs) == 2 and ranks[subs[0]] == ranks[subs[1]]:
                kinds.append("equivalent-substituents")
            elif len(subs) == 2 and ranks_noiso[subs[0]] == ranks_noiso[subs[1]]:
                kinds.append("isotope-substituents")
        bond = mol.GetBondBetweenAtoms(x, y)
        ri = mol.GetRingInfo()
        if bond is not None and ri.NumBondRings(bond.GetIdx()):
            size = min(len(r) for r in ri.BondRings() if bond.GetIdx() in r)
            kinds.append("ring-double-bond-%d" % size if size <= 8 else "ring-double-bond-large")
        if not kinds:
            kinds.append("bond-other")
    return sorted(set(kinds))

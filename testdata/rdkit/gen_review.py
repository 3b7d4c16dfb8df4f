#!/usr/bin/python3
"""Generates review.tsv: pairs of records (an old and a new writing) whose
relation RDKit knows, for the tests of 'stereoline diff'.

Each pair starts from one stereoisomer of cip_labels.tsv (the canonical
writing of isomer 0 of each group, all its units assigned) and changes it
on RDKit's molecule, keeping the atom indices, so RDKit knows which atom or
bond changed:

  rewrite      the same molecule
  epimer       an isomer from EnumerateStereoisomers whose chiral tag
               differs from the start at exactly one atom, no bond changed
  bond         an isomer whose double-bond stereo (STEREOE/STEREOZ)
               differs at one bond or more, no chiral tag changed
  several      an isomer that differs at two or more units, not the mirror
  mirror       every chiral tag inverted (Atom.InvertChirality)
  removed      one chiral tag cleared (CHI_UNSPECIFIED)
  added        the same pair the other way round
  constitution a carbon added to an atom that carries a hydrogen and no
               stereo

Both sides are written at random (MolToSmiles(doRandom=True) after
rdBase.SeedRandomNumberGenerator), and RDKit's canonical isomeric SMILES of
both sides decide the expected class before the construction does:

  canon_old == canon_new            -> rewritten
  nostereo_old != nostereo_new      -> constitution-changed
  canon_new == canon(mirror of old) -> enantiomer
  otherwise, by the units that differ on the common atom indices:
  only tags given -> stereo-added, only tags lost -> stereo-removed,
  only double bonds flipped -> bond-flipped, one tag inverted and no bond
  flipped -> epimer (also when several tags changed but inverting one
  tag of the old side gives the new molecule, as symmetry allows),
  anything else -> diastereomer

Usage: /usr/bin/python3 testdata/rdkit/gen_review.py [cip_labels.tsv] [out.tsv]
"""

import collections
import os
import random
import sys

from rdkit import Chem, rdBase
from rdkit.Chem.EnumerateStereoisomers import EnumerateStereoisomers, StereoEnumerationOptions

import fixturelib

SEED = 20224
GROUPS = 400

COLUMNS = [
    ("group", "NCI identifier of the record (cip_labels.tsv group)"),
    ("op", "how the new side was made: rewrite, epimer, bond, several, mirror, removed, added, constitution"),
    ("old", "the old side: Chem.MolToSmiles(mol, doRandom=True) after rdBase.SeedRandomNumberGenerator(seed)"),
    ("new", "the new side, written the same way with another seed"),
    ("canon_old", "Chem.MolToSmiles(Chem.MolFromSmiles(old)) (isomeric)"),
    ("canon_new", "the same for new"),
    ("canon_mirror_old", "canonical isomeric SMILES of old with every chiral tag inverted"),
    ("nostereo_old", "canonical SMILES of old after Chem.RemoveStereochemistry"),
    ("nostereo_new", "the same for new"),
    ("class", "the class RDKit's view gives (see the rules above)"),
    ("atoms_new", "the changed units in the new string's atom numbering (1-based, in order of "
     "appearance): a centre as n, a double bond as n=m; space-separated, sorted; '-' for none"),
    ("atoms_old", "the same in the old string's numbering"),
    ("classes_new", "per atom of the new string, its class of constitutional symmetry "
     "(Chem.CanonicalRankAtoms(mol, breakTies=False, includeChirality=False)), space-separated, "
     "so a test may accept a symmetry-equivalent atom"),
    ("classes_old", "the same for the old string"),
]

NOTES = [
    "a centre counts as changed when its chiral tag differs on the same atom index (CW/CCW on the "
    "same neighbour order), a double bond when its STEREOE/STEREOZ label differs",
]


def canon(mol):
    return Chem.MolToSmiles(mol)


def nostereo(mol):
    m = Chem.Mol(mol)
    Chem.RemoveStereochemistry(m)
    return Chem.MolToSmiles(m)


def mirror(mol):
    m = Chem.Mol(mol)
    for a in m.GetAtoms():
        if a.GetChiralTag() in (Chem.ChiralType.CHI_TETRAHEDRAL_CW, Chem.ChiralType.CHI_TETRAHEDRAL_CCW):
            a.InvertChirality()
    return m


TAGGED = (Chem.ChiralType.CHI_TETRAHEDRAL_CW, Chem.ChiralType.CHI_TETRAHEDRAL_CCW)
BONDED = (Chem.BondStereo.STEREOE, Chem.BondStereo.STEREOZ)


def units(mol):
    """Chiral tags by atom index and double-bond labels by bond index."""
    tags = {a.GetIdx(): a.GetChiralTag() for a in mol.GetAtoms() if a.GetChiralTag() in TAGGED}
    bonds = {b.GetIdx(): b.GetStereo() for b in mol.GetBonds() if b.GetStereo() in BONDED}
    return tags, bonds


def differences(old, new):
    """(inverted, added, removed) centres and (flipped, added, removed)
    bonds between two molecules on the same atom indices."""
    to, bo = units(old)
    tn, bn = units(new)
    inv = sorted(a for a in to if a in tn and to[a] != tn[a])
    add = sorted(a for a in tn if a not in to)
    rem = sorted(a for a in to if a not in tn)
    flip = sorted(b for b in bo if b in bn and bo[b] != bn[b])
    badd = sorted(b for b in bn if b not in bo)
    brem = sorted(b for b in bo if b not in bn)
    return inv, add, rem, flip, badd, brem


def expected(old, new):
    """The class RDKit's view gives, and the changed atoms and bonds."""
    if canon(old) == canon(new):
        return "rewritten", [], []
    if nostereo(old) != nostereo(new):
        return "constitution-changed", [], []
    inv, add, rem, flip, badd, brem = differences(old, new)
    atoms = inv + add + rem
    bonds = flip + badd + brem
    if canon(new) == canon(mirror(old)):
        return "enantiomer", inv, []
    if not inv and not flip:
        if rem or brem:
            return "stereo-removed", atoms, bonds
        return "stereo-added", atoms, bonds
    if not inv:
        return "bond-flipped", atoms, bonds
    if len(inv) == 1 and not flip and not (add or rem or badd or brem):
        return "epimer", atoms, bonds
    if not flip and not (add or rem or badd or brem):
        # several tags changed, but where the constitution is symmetric
        # one inverted centre may give the same molecule: the smallest
        # change that explains the pair is what a reviewer wants named
        tags, _ = units(old)
        for a in sorted(tags):
            one = Chem.Mol(old)
            one.GetAtomWithIdx(a).InvertChirality()
            if canon(one) == canon(new):
                return "epimer", [a], []
    return "diastereomer", atoms, bonds


def write(mol, seed):
    """A random writing and, per atom index, its 1-based number in it."""
    rdBase.SeedRandomNumberGenerator(seed)
    m = Chem.Mol(mol)
    s = Chem.MolToSmiles(m, doRandom=True)
    order = [int(x) for x in m.GetProp("_smilesAtomOutputOrder").strip("[]").split(",") if x]
    return s, {idx: k + 1 for k, idx in enumerate(order)}


def unit_names(mol, number, atoms, bonds):
    names = [str(number[a]) for a in atoms]
    for b in bonds:
        bd = mol.GetBondWithIdx(b)
        x, y = sorted((number[bd.GetBeginAtomIdx()], number[bd.GetEndAtomIdx()]))
        names.append("%d=%d" % (x, y))
    return " ".join(sorted(names, key=lambda n: [int(p) for p in n.split("=")])) or "-"


def symmetry_classes(mol, number):
    ranks = list(Chem.CanonicalRankAtoms(mol, breakTies=False, includeChirality=False))
    by_number = sorted((number[i], r) for i, r in enumerate(ranks))
    return " ".join(str(r) for _, r in by_number)


def isomers(mol):
    opts = StereoEnumerationOptions(onlyUnassigned=False, unique=True, maxIsomers=32)
    return list(EnumerateStereoisomers(mol, options=opts))


def variants(base, rng):
    """(op, old, new) pairs made from base."""
    out = [("rewrite", base, Chem.Mol(base))]
    tags, bonds = units(base)
    epimers, flips, several = [], [], []
    for iso in isomers(base):
        inv, add, rem, flip, badd, brem = differences(base, iso)
        if add or rem or badd or brem:
            continue
        if len(inv) == 1 and not flip:
            epimers.append(iso)
        elif not inv and flip:
            flips.append(iso)
        elif len(inv) + len(flip) >= 2 and canon(iso) != canon(mirror(base)):
            several.append(iso)
    for op, pool in (("epimer", epimers), ("bond", flips), ("several", several)):
        if pool:
            out.append((op, base, pool[rng.randrange(len(pool))]))
    if tags:
        out.append(("mirror", base, mirror(base)))
        cleared = Chem.Mol(base)
        cleared.GetAtomWithIdx(rng.choice(sorted(tags))).SetChiralTag(Chem.ChiralType.CHI_UNSPECIFIED)
        out.append(("removed", base, cleared))
        out.append(("added", cleared, base))
    stereo_atoms = set(tags)
    for b in bonds:
        bd = base.GetBondWithIdx(b)
        stereo_atoms |= {bd.GetBeginAtomIdx(), bd.GetEndAtomIdx()}
    hosts = [a.GetIdx() for a in base.GetAtoms()
             if a.GetTotalNumHs() > 0 and a.GetIdx() not in stereo_atoms and a.GetSymbol() in ("C", "N", "O")]
    if hosts:
        rw = Chem.RWMol(base)
        host = rng.choice(hosts)
        c = rw.AddAtom(Chem.Atom(6))
        rw.AddBond(host, c, Chem.BondType.SINGLE)
        grown = rw.GetMol()
        try:
            Chem.SanitizeMol(grown)
            out.append(("constitution", base, grown))
        except Exception:
            pass
    return out


def main():
    cip = sys.argv[1] if len(sys.argv) > 1 else os.path.join(fixturelib.HERE, "cip_labels.tsv")
    dst = sys.argv[2] if len(sys.argv) > 2 else os.path.join(fixturelib.HERE, "review.tsv")
    starts = collections.OrderedDict()
    for line in open(cip):
        if line.startswith("#"):
            continue
        group, isomer, variant, smiles, _ = line.rstrip("\n").split("\t")
        if variant == "canonical" and isomer == "0":
            starts[group] = smiles
    rng = random.Random(SEED)
    rows, dropped = [], 0
    for n, (group, smiles) in enumerate(starts.items()):
        if n == GROUPS:
            break
        base = Chem.MolFromSmiles(smiles)
        if base is None:
            continue
        for k, (op, old, new) in enumerate(variants(base, rng)):
            seed = SEED + 64 * n + 2 * k
            ws_old, num_old = write(old, seed)
            ws_new, num_new = write(new, seed + 1)
            back_old, back_new = Chem.MolFromSmiles(ws_old), Chem.MolFromSmiles(ws_new)
            # a writing RDKit does not read back as the molecule it was
            # written from would test the writer, not the pair
            if back_old is None or back_new is None or canon(back_old) != canon(old) or canon(back_new) != canon(new):
                dropped += 1
                continue
            cls, atoms, bonds = expected(old, new)
            rows.append([group, op, ws_old, ws_new, canon(back_old), canon(back_new), canon(mirror(back_old)),
                         nostereo(back_old), nostereo(back_new), cls,
                         unit_names(new, num_new, [a for a in atoms if a < new.GetNumAtoms()], bonds),
                         unit_names(old, num_old, [a for a in atoms if a < old.GetNumAtoms()], bonds),
                         symmetry_classes(new, num_new), symmetry_classes(old, num_old)])
    with open(dst, "w") as out:
        fixturelib.header(
            out,
            "review.tsv: pairs of writings whose relation RDKit knows, for stereoline diff",
            "isomer 0 of the first %d groups of %s, changed on RDKit's molecule as the "
            "generator's docstring says (random.Random(%d))"
            % (GROUPS, os.path.relpath(cip, fixturelib.REPO), SEED),
            COLUMNS,
            notes=NOTES + ["%d rows; %d pairs dropped because a writing did not read back to "
                           "its molecule's canonical SMILES" % (len(rows), dropped)],
        )
        for r in rows:
            out.write("\t".join(r) + "\n")


if __name__ == "__main__":
    main()

#!/usr/bin/python3
"""Generates perception.tsv: which atoms and double bonds RDKit perceives as stereogenic.

Two sets of rows, both from a deterministic sample of the first_5K.smi
records:

- "unmarked": each record with its stereo marks removed
  (Chem.RemoveStereochemistry; the NCI records carry none), written as
  RDKit's canonical SMILES, with the atoms and double bonds
  Chem.FindPotentialStereo (default flags) calls potential stereo units,
  and for comparison the legacy perception: FindMolChiralCenters
  (includeUnassigned=True, useLegacyImplementation=True) and
  FindPotentialStereoBonds (cleanIt=False).
- "marked": the records of the sample that have candidate atoms or
  bonds, each with a random configuration written on every atom that
  could carry one (sp3 atoms with at most one hydrogen and three or four
  neighbours, three-coordinate N, P, S) and on every double bond outside
  small rings whose ends each have a neighbour besides the partner,
  stereogenic or not; recorded are the marks RDKit keeps when it reads
  the string back and sanitizes it, with the new perception
  (Chem.SetUseLegacyStereoPerception(False)) and with the legacy one
  (the 2022.09 default).

The first_5K.smi records have no stereo marks of their own, so the marked
set is made here; its marks are random, not chemistry.

Atoms are 0-based in the order they appear in the written string (every
string is read back with SmilesParserParams(removeHs=False) and the
columns are computed on the molecule read from it, so no index mapping
is needed).

Usage: /usr/bin/python3 testdata/rdkit/gen_perception.py [first_5K.smi] [out.tsv]
"""

import os
import random
import sys

from rdkit import Chem

import fixturelib

SEED = 20230
SAMPLE = 1500  # records for the unmarked set
MARKED = 500   # at most this many of them for the marked set

COLUMNS = [
    ("set", "unmarked or marked (see above)"),
    ("id", "NCI identifier of the record"),
    ("smiles", "the written string"),
    ("atoms", "unmarked: atoms of the Atom_Tetrahedral units of Chem.FindPotentialStereo(mol) "
     "(default flags: cleanIt=False, flagPossible=True); marked: atoms that keep a chiral tag "
     "when read with Chem.SetUseLegacyStereoPerception(False); space-separated, 0-based"),
    ("bonds", "unmarked: Bond_Double units of Chem.FindPotentialStereo(mol) as <begin>-<end> "
     "(0-based atoms, smaller first); marked: double bonds whose GetStereo() is not STEREONONE "
     "when read with the new perception; space-separated"),
    ("legacy_atoms", "unmarked: atoms of Chem.FindMolChiralCenters(mol, includeUnassigned=True, "
     "useLegacyImplementation=True); marked: atoms that keep a chiral tag when read with the "
     "legacy perception (Chem.MolFromSmiles default of this version)"),
    ("legacy_bonds", "unmarked: bonds Chem.FindPotentialStereoBonds(mol, cleanIt=False) sets to "
     "STEREOANY; marked: double bonds with stereo when read with the legacy perception"),
    ("other", "unmarked: FindPotentialStereo units of other types as <type>:<centeredOn>; "
     "marked: empty"),
    ("classes", "RDKit's constitutional symmetry class of every atom in string order: "
     "Chem.CanonicalRankAtoms(mol, breakTies=False, includeChirality=False) of the molecule "
     "read from the string with its marks removed; atoms of one class have one number"),
]


def parse(smiles, legacy=True):
    """Reads smiles keeping [H] atoms so that atom indices follow the string."""
    Chem.SetUseLegacyStereoPerception(legacy)
    try:
        params = Chem.SmilesParserParams()
        params.removeHs = False
        return Chem.MolFromSmiles(smiles, params)
    finally:
        Chem.SetUseLegacyStereoPerception(True)


def bond_name(b):
    i, j = sorted((b.GetBeginAtomIdx(), b.GetEndAtomIdx()))
    return "%d-%d" % (i, j)


def join(xs):
    return " ".join(str(x) for x in xs)


def perception(mol):
    """The columns atoms, bonds, legacy_atoms, legacy_bonds, other of an unmarked row."""
    atoms, bonds, other = [], [], []
    for si in Chem.FindPotentialStereo(mol):
        if si.type == Chem.StereoType.Atom_Tetrahedral:
            atoms.append(si.centeredOn)
        elif si.type == Chem.StereoType.Bond_Double:
            bonds.append(bond_name(mol.GetBondWithIdx(si.centeredOn)))
        else:
            other.append("%s:%d" % (si.type, si.centeredOn))
    legacy = [i for i, _ in Chem.FindMolChiralCenters(
        mol, includeUnassigned=True, useLegacyImplementation=True)]
    probe = Chem.Mol(mol)
    Chem.FindPotentialStereoBonds(probe, cleanIt=False)
    legacy_bonds = [bond_name(b) for b in probe.GetBonds()
                    if b.GetStereo() == Chem.BondStereo.STEREOANY]
    return [join(sorted(atoms)), join(sorted(bonds)), join(sorted(legacy)),
            join(sorted(legacy_bonds)), join(other)]


def classes(mol):
    """RDKit's symmetry classes of mol's atoms, ignoring any marks."""
    m = Chem.Mol(mol)
    Chem.RemoveStereochemistry(m)
    return join(Chem.CanonicalRankAtoms(m, breakTies=False, includeChirality=False))


def can_mark_atom(a):
    """Whether a mark on a could be meaningful by a simple local test."""
    if a.GetIsAromatic() or a.GetTotalNumHs() > 1:
        return False
    deg = a.GetDegree() + a.GetTotalNumHs()
    z = a.GetAtomicNum()
    if z == 6:
        return deg == 4 and a.GetHybridization() == Chem.HybridizationType.SP3
    if z in (7, 15, 16):
        return a.GetDegree() in (3, 4)
    return False


def can_mark_bond(b):
    if b.GetBondType() != Chem.BondType.DOUBLE or b.GetIsAromatic():
        return False
    ri = b.GetOwningMol().GetRingInfo()
    if any(ri.IsBondInRingOfSize(b.GetIdx(), k) for k in range(3, 8)):
        return False
    ends = (b.GetBeginAtom(), b.GetEndAtom())
    return all(other_neighbour(a, b) is not None for a in ends)


def other_neighbour(a, b):
    for n in a.GetNeighbors():
        if n.GetIdx() != b.GetOtherAtomIdx(a.GetIdx()):
            return n.GetIdx()
    return None


def marked(mol, rng):
    """mol written with a random configuration on every candidate, or None."""
    m = Chem.Mol(mol)
    n = 0
    for a in m.GetAtoms():
        if can_mark_atom(a):
            a.SetChiralTag(rng.choice([Chem.ChiralType.CHI_TETRAHEDRAL_CW,
                                       Chem.ChiralType.CHI_TETRAHEDRAL_CCW]))
            n += 1
    for b in m.GetBonds():
        if can_mark_bond(b):
            b.SetStereoAtoms(other_neighbour(b.GetBeginAtom(), b), other_neighbour(b.GetEndAtom(), b))
            b.SetStereo(rng.choice([Chem.BondStereo.STEREOCIS, Chem.BondStereo.STEREOTRANS]))
            n += 1
    if n == 0:
        return None
    return Chem.MolToSmiles(m, canonical=False)


def kept(mol):
    atoms = [a.GetIdx() for a in mol.GetAtoms()
             if a.GetChiralTag() in (Chem.ChiralType.CHI_TETRAHEDRAL_CW,
                                     Chem.ChiralType.CHI_TETRAHEDRAL_CCW)]
    bonds = [bond_name(b) for b in mol.GetBonds()
             if b.GetBondType() == Chem.BondType.DOUBLE and b.GetStereo() != Chem.BondStereo.STEREONONE]
    return join(sorted(atoms)), join(sorted(bonds))


def main():
    src = sys.argv[1] if len(sys.argv) > 1 else fixturelib.NCI_DEFAULT
    dst = sys.argv[2] if len(sys.argv) > 2 else os.path.join(fixturelib.HERE, "perception.tsv")
    pool = []
    for smiles, ident in fixturelib.read_smi(src):
        mol = Chem.MolFromSmiles(smiles)
        if mol is not None:
            pool.append((ident, mol))
    rng = random.Random(SEED)
    chosen = sorted(rng.sample(range(len(pool)), min(SAMPLE, len(pool))))
    unmarked, marks = [], []
    for k in chosen:
        ident, mol = pool[k]
        Chem.RemoveStereochemistry(mol)
        s = Chem.MolToSmiles(mol)
        back = parse(s)
        if back is None:
            continue
        unmarked.append(["unmarked", ident, s] + perception(back) + [classes(back)])
        if len(marks) < MARKED:
            ms = marked(back, rng)
            if ms is None:
                continue
            new, old = parse(ms, legacy=False), parse(ms)
            if new is None or old is None:
                continue
            marks.append(["marked", ident, ms] + list(kept(new)) + list(kept(old)) + ["", classes(new)])
    with open(dst, "w") as out:
        fixturelib.header(
            out,
            "perception.tsv: potential stereo units (FindPotentialStereo) of unmarked NCI records, "
            "and the marks RDKit keeps on randomly marked ones",
            "%s (Debian package rdkit-data): %d of its %d readable records chosen by "
            "random.Random(%d).sample; the marked set is the first %d of them (in file order) "
            "with a candidate atom or bond, its configurations drawn from the same generator"
            % (src, len(chosen), len(pool), SEED, MARKED),
            COLUMNS,
            notes=["%d unmarked rows, %d marked rows; atoms 0-based in string order" %
                   (len(unmarked), len(marks)),
                   "RDKit's perception, not a ground truth: the test classifies each difference"],
        )
        for r in unmarked + marks:
            out.write("\t".join(r) + "\n")


if __name__ == "__main__":
    main()

#!/usr/bin/python3
"""Generates opensmiles.tsv: RDKit's reading of the records that test the
organic-subset valence table and ring-closure digits written after a branch.

The records are named in the RECORDS table below with the part of the
OpenSMILES specification they exercise ("Reading SMILES", section 3.1.5
Organic Subset: the normal valences B 3, C 4, N 3 or 5, O 2, P 3 or 5,
S 2, 4 or 6, halogens 1; section 2 Grammar: branched_atom ::= atom
ringbond* branch*, so ring digits after a branch are outside the grammar).
For each record the fixture holds whether RDKit accepts it, the hydrogen
count of every atom, its bonds as read and, for every atom with a
tetrahedral mark, the neighbour order and tag RDKit stores after AddHs
(so an implicit hydrogen is an explicit last neighbour).

Usage: /usr/bin/python3 testdata/rdkit/gen_opensmiles.py [out.tsv]
"""

import os
import sys

from rdkit import Chem

import fixturelib

VALENCE = "OpenSMILES 3.1.5 organic subset valence"
RING = "OpenSMILES 2 grammar, ring bond after a branch"
AROMATIC = "OpenSMILES 3.5 aromaticity, direction mark between aromatic atoms"

# (section, record, what it is). Molecules are real; the nitro and
# N-oxide writings are common practice.
RECORDS = [
    (VALENCE, "CN(=O)=O", "nitromethane, nitrogen valence 5"),
    (VALENCE, "O=N(=O)c1ccccc1", "nitrobenzene, nitrogen valence 5"),
    (VALENCE, "O=n1ccccc1", "pyridine N-oxide, aromatic nitrogen valence 5"),
    (VALENCE, "CN(C)(C)=O", "trimethylamine N-oxide, nitrogen valence 5"),
    (VALENCE, "CN(=O)(=O)=O", "nitrogen valence 7, above every normal valence"),
    (VALENCE, "CP(=O)(O)O", "methylphosphonic acid, phosphorus valence 5"),
    (VALENCE, "CS(=O)(=O)C", "dimethyl sulfone, sulfur valence 6"),
    (VALENCE, "CS(=O)C", "dimethyl sulfoxide, sulfur valence 4"),
    (VALENCE, "B(C)(C)C", "trimethylborane, boron valence 3"),
    (VALENCE, "CC(C)(C)(C)C", "carbon valence 5"),
    (VALENCE, "COC(C)=O", "methyl acetate, oxygen valence 2"),
    (VALENCE, "FC(F)(F)Cl", "halogens valence 1"),
    (RING, "c12ccccc1NC=CC(=O)2", "quinolin-4(1H)-one, digit after a branch"),
    (RING, "c1nncn([*])1", "4-substituted 1,2,4-triazole, digit after a branch"),
    (RING, "C1CC(C)1", "methylcyclopropane, digit after a branch"),
    (RING, "C1CC(C)(O)1", "1-methylcyclopropanol, digit after two branches"),
    (RING, "C1CCC(=C)1", "methylenecyclobutane, digit after a branch"),
    (RING, "C=1CCC(C)=1", "bond symbol on a digit after a branch"),
    (RING, "F[C@H](Cl)1.Br1", "stereocentre whose ring bond follows the branch"),
    (RING, "F[C@@H](Cl)1.Br1", "its mirror image"),
    (RING, "F[C@H]1(Cl).Br1", "the same ring bond before the branch"),
    (RING, "N[C@@](F)1CCOC1", "3-fluoro-oxolan-3-amine, digit after a branch"),
    (RING, "N[C@@]1(F)CCOC1", "the same digit before the branch"),
    (RING, "C[C@@H](O)1.[C@H]1(N)F", "two stereocentres joined by a ring digit"),
    (AROMATIC, "c1ccc/cc1", "a direction mark on a bond between aromatic atoms"),
    (AROMATIC, "c1cc/cc/c1", "direction marks on two bonds of an aromatic ring"),
    (AROMATIC, "O=C1C=CC(=C/c2ccccc2)/c2ccccc12", "a direction mark from a ring double bond into an aromatic ring"),
]

COLUMNS = [
    ("section", "the part of the OpenSMILES specification the record exercises"),
    ("smiles", "the record"),
    ("note", "what the record is"),
    ("accepted", "1 if Chem.MolFromSmiles(smiles) (sanitize=True) returns a molecule, else 0"),
    ("hcounts", "comma-separated atom.GetTotalNumHs() of the sanitized molecule in atom "
     "order; when RDKit rejects, of Chem.MolFromSmiles(smiles, sanitize=False) after "
     "UpdatePropertyCache(strict=False)"),
    ("bonds", "comma-separated begin-end atom indices (0-based) of every bond of "
     "Chem.MolFromSmiles(smiles, sanitize=False), in RDKit's bond order"),
    ("chiral", "for every atom with a tetrahedral tag: atom:tag:neighbours, tag CW or CCW, "
     "neighbours the atom indices of atom.GetNeighbors() of Chem.AddHs(unsanitized "
     "molecule), an implicit hydrogen written as H; space separated"),
]


def describe(smiles):
    sane = Chem.MolFromSmiles(smiles)
    raw = Chem.MolFromSmiles(smiles, sanitize=False)
    n = raw.GetNumAtoms()
    if sane is not None:
        hcounts = [a.GetTotalNumHs() for a in sane.GetAtoms()]
    else:
        raw.UpdatePropertyCache(strict=False)
        hcounts = [a.GetTotalNumHs() for a in raw.GetAtoms()]
    bonds = ["%d-%d" % (b.GetBeginAtomIdx(), b.GetEndAtomIdx()) for b in raw.GetBonds()]
    raw.UpdatePropertyCache(strict=False)
    withh = Chem.AddHs(raw)
    chiral = []
    for a in withh.GetAtoms():
        tag = a.GetChiralTag()
        if tag not in (Chem.ChiralType.CHI_TETRAHEDRAL_CW, Chem.ChiralType.CHI_TETRAHEDRAL_CCW):
            continue
        nbrs = []
        for b in a.GetBonds():
            o = b.GetOtherAtomIdx(a.GetIdx())
            nbrs.append("H" if o >= n else str(o))
        name = "CW" if tag == Chem.ChiralType.CHI_TETRAHEDRAL_CW else "CCW"
        chiral.append("%d:%s:%s" % (a.GetIdx(), name, ",".join(nbrs)))
    return ["1" if sane is not None else "0", ",".join(map(str, hcounts)), ",".join(bonds),
            " ".join(chiral)]


def main():
    out_path = sys.argv[1] if len(sys.argv) > 1 else os.path.join(fixturelib.HERE, "opensmiles.tsv")
    with open(out_path, "w") as out:
        fixturelib.header(
            out,
            "opensmiles.tsv: RDKit's reading of the organic-subset valence and ring-after-branch records",
            "the RECORDS table of testdata/rdkit/gen_opensmiles.py (real molecules)",
            COLUMNS,
        )
        for section, smiles, note in RECORDS:
            out.write("\t".join([section, smiles, note] + describe(smiles)) + "\n")


if __name__ == "__main__":
    main()

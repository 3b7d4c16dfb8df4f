#!/usr/bin/python3
"""Generates identity.tsv: many writings of one molecule, with RDKit's canonical keys.

Stereo part: the isomer groups of cip_labels.tsv (records with at least two
isomers, in file order, until about 1,000 isomers), so enantiomers and
diastereomers of one record sit side by side under one group id. Plain
part: a seeded sample of about 500 first_5K.smi records without any
potential stereo unit. Every molecule is written ten times at random; each
writing carries the canonical SMILES RDKit gives the molecule read from
that writing, with and without stereo, so a test can check that grouping
the writings by its own key gives the same partition as grouping them by
RDKit's canonical SMILES.

Usage: /usr/bin/python3 testdata/rdkit/gen_identity.py [first_5K.smi] [cip_labels.tsv] [out.tsv]
"""

import collections
import os
import random
import sys

from rdkit import Chem

import fixturelib

SEED = 20223
STEREO_ISOMERS = 1000
PLAIN = 500
WRITINGS = 10

COLUMNS = [
    ("group", "NCI identifier of the source record; the stereoisomers of one record share it"),
    ("isomer", "0-based isomer index as in cip_labels.tsv; 0 for the plain part"),
    ("writing", "0-based index of the writing of this molecule"),
    ("smiles", "Chem.MolToRandomSmilesVect(mol, %d, randomSeed=%d + 16*line number + isomer) "
     "(isomeric)" % (WRITINGS, SEED)),
    ("canon_iso", "Chem.MolToSmiles(Chem.MolFromSmiles(smiles), isomericSmiles=True)"),
    ("canon_nostereo", "the same after Chem.RemoveStereochemistry (isotopes kept; "
     "isomericSmiles=False would also drop isotopes)"),
    ("stereo", "1 for the stereo part (from cip_labels.tsv), 0 for the plain part"),
]


def keys(smiles):
    """RDKit's canonical SMILES of smiles with and without stereo."""
    mol = Chem.MolFromSmiles(smiles)
    if mol is None:
        return None
    iso = Chem.MolToSmiles(mol, isomericSmiles=True)
    flat = Chem.Mol(mol)
    Chem.RemoveStereochemistry(flat)
    return iso, Chem.MolToSmiles(flat, isomericSmiles=True)


def stereo_part(cip_path):
    """(group, isomer, canonical SMILES) from cip_labels.tsv."""
    groups = collections.OrderedDict()
    for line in open(cip_path):
        if line.startswith("#"):
            continue
        group, isomer, variant, smiles, _ = line.rstrip("\n").split("\t")
        if variant == "canonical":
            groups.setdefault(group, []).append((int(isomer), smiles))
    out = []
    for group, isos in groups.items():
        if len(isos) < 2:
            continue
        out += [(group, i, s) for i, s in isos]
        if len(out) >= STEREO_ISOMERS:
            break
    return out


def plain_part(src):
    """(group, 0, SMILES) for a seeded sample of records without potential stereo."""
    pool = []
    for smiles, ident in fixturelib.read_smi(src):
        mol = Chem.MolFromSmiles(smiles)
        if mol is not None and len(Chem.FindPotentialStereo(mol)) == 0:
            pool.append((ident, 0, smiles))
    chosen = sorted(random.Random(SEED).sample(range(len(pool)), min(PLAIN, len(pool))))
    return [pool[k] for k in chosen], len(pool)


def main():
    src = sys.argv[1] if len(sys.argv) > 1 else fixturelib.NCI_DEFAULT
    cip = sys.argv[2] if len(sys.argv) > 2 else os.path.join(fixturelib.HERE, "cip_labels.tsv")
    dst = sys.argv[3] if len(sys.argv) > 3 else os.path.join(fixturelib.HERE, "identity.tsv")
    lineno = {ident: n for n, (_, ident) in enumerate(fixturelib.read_smi(src), 1)}
    stereo = stereo_part(cip)
    plain, npool = plain_part(src)
    rows = []
    dropped = 0
    for flag, part in (("1", stereo), ("0", plain)):
        for group, isomer, smiles in part:
            mol = Chem.MolFromSmiles(smiles)
            want = Chem.MolToSmiles(mol)
            seed = SEED + 16 * lineno[group] + isomer
            for k, w in enumerate(Chem.MolToRandomSmilesVect(mol, WRITINGS, randomSeed=seed)):
                got = keys(w)
                # A writing RDKit does not read back as the molecule it was
                # written from would put a wrong member in the group.
                if got is None or got[0] != want:
                    dropped += 1
                    continue
                rows.append([group, str(isomer), str(k), w, got[0], got[1], flag])
    with open(dst, "w") as out:
        fixturelib.header(
            out,
            "identity.tsv: random writings with RDKit's canonical SMILES, with and without stereo",
            "stereo part: %d isomers of the groups with at least two isomers in %s, in file "
            "order; plain part: %d of the %d records of %s (Debian package rdkit-data) with "
            "no Chem.FindPotentialStereo unit, chosen by random.Random(%d).sample"
            % (len(stereo), os.path.relpath(cip, fixturelib.REPO), len(plain), npool, src, SEED),
            COLUMNS,
            notes=["%d rows; %d writings dropped because RDKit did not read them back to the "
                   "canonical SMILES of the molecule they were written from" % (len(rows), dropped),
                   "a test should partition the writings of each group by its own key and "
                   "compare with the partition by canon_iso (and by canon_nostereo for a "
                   "stereo-blind key)"],
        )
        for r in rows:
            out.write("\t".join(r) + "\n")


if __name__ == "__main__":
    main()

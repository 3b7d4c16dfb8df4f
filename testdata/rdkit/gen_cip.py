#!/usr/bin/python3
"""Generates cip_labels.tsv: CIP labels by RDKit's new labeller for stereoisomers.

A deterministic sample of the first_5K.smi records that have at least one
potential stereo unit (Chem.FindPotentialStereo) is expanded into its
stereoisomers; each isomer is written three times (RDKit's canonical
isomeric SMILES and two random writings) and every string gets the labels
rdCIPLabeler.AssignCIPLabels gives the molecule read from that string, with
atoms numbered in the order they appear in the string.

Usage: /usr/bin/python3 testdata/rdkit/gen_cip.py [first_5K.smi] [out.tsv]
"""

import os
import random
import sys

from rdkit import Chem
from rdkit.Chem import rdCIPLabeler
from rdkit.Chem.EnumerateStereoisomers import EnumerateStereoisomers, StereoEnumerationOptions

import fixturelib

SEED = 20222
SAMPLE = 500  # records; about 1,500 isomers and 4,500 rows
RANDOM_WRITINGS = 2
MAX_ISOMERS = 8

COLUMNS = [
    ("group", "NCI identifier of the record the isomers were enumerated from; "
     "isomers of one record share it"),
    ("isomer", "0-based index of the isomer in EnumerateStereoisomers order"),
    ("variant", "canonical (Chem.MolToSmiles(isomer), isomeric) or random1, random2 "
     "(Chem.MolToRandomSmilesVect(isomer, 2, randomSeed=%d + 16*line number + isomer))" % SEED),
    ("smiles", "the written string"),
    ("labels", "space-separated <atom><label>, atoms numbered from 1 in the order they appear "
     "in the string (parsed with SmilesParserParams(removeHs=False)); atom labels R S r s from "
     "the atom property _CIPCode, double-bond labels E Z (bond property _CIPCode) written on "
     "both atoms of the bond, as in the CIP validation suite's README; sorted by atom number; "
     "empty when RDKit labels nothing"),
]


def parse(smiles):
    """Reads smiles keeping [H] atoms so that atom indices follow the string."""
    params = Chem.SmilesParserParams()
    params.removeHs = False
    return Chem.MolFromSmiles(smiles, params)


def labels(smiles):
    """RDKit's new-labeller CIP labels for the molecule written as smiles."""
    mol = parse(smiles)
    if mol is None:
        return None
    # Parsing runs the legacy perception, which leaves its own _CIPCode on
    # atoms; clear it so that only the new labeller's results are recorded.
    for a in mol.GetAtoms():
        a.ClearProp("_CIPCode")
    for b in mol.GetBonds():
        b.ClearProp("_CIPCode")
    rdCIPLabeler.AssignCIPLabels(mol)
    out = []
    for a in mol.GetAtoms():
        if a.HasProp("_CIPCode"):
            out.append((a.GetIdx() + 1, a.GetProp("_CIPCode")))
    for b in mol.GetBonds():
        if b.HasProp("_CIPCode"):
            code = b.GetProp("_CIPCode")
            out.append((b.GetBeginAtomIdx() + 1, code))
            out.append((b.GetEndAtomIdx() + 1, code))
    out.sort()
    return " ".join("%d%s" % p for p in out)


def candidates(path):
    """(line number, identifier, molecule) of the records with potential stereo."""
    for lineno, (smiles, ident) in enumerate(fixturelib.read_smi(path), 1):
        mol = Chem.MolFromSmiles(smiles)
        if mol is not None and len(Chem.FindPotentialStereo(mol)) > 0:
            yield lineno, ident, mol


def isomers(mol):
    """The stereoisomers of mol as EnumerateStereoisomers gives them."""
    opts = StereoEnumerationOptions(unique=True, maxIsomers=MAX_ISOMERS, onlyUnassigned=False)
    return list(EnumerateStereoisomers(mol, options=opts))


def main():
    src = sys.argv[1] if len(sys.argv) > 1 else fixturelib.NCI_DEFAULT
    dst = sys.argv[2] if len(sys.argv) > 2 else os.path.join(fixturelib.HERE, "cip_labels.tsv")
    pool = list(candidates(src))
    chosen = sorted(random.Random(SEED).sample(range(len(pool)), min(SAMPLE, len(pool))))
    rows = []
    dropped = 0
    nisomers = 0
    for k in chosen:
        lineno, ident, mol = pool[k]
        for j, iso in enumerate(isomers(mol)):
            canon = Chem.MolToSmiles(iso)
            writings = [("canonical", canon)]
            randoms = Chem.MolToRandomSmilesVect(
                iso, RANDOM_WRITINGS, randomSeed=SEED + 16 * lineno + j)
            writings += [("random%d" % (i + 1), s) for i, s in enumerate(randoms)]
            nisomers += 1
            for variant, s in writings:
                back = Chem.MolFromSmiles(s)
                # A writing that does not read back as the same isomer
                # would make the labels describe another molecule.
                if back is None or Chem.MolToSmiles(back) != canon:
                    dropped += 1
                    continue
                lab = labels(s)
                if lab is None:
                    dropped += 1
                    continue
                rows.append([ident, str(j), variant, s, lab])
    with open(dst, "w") as out:
        fixturelib.header(
            out,
            "cip_labels.tsv: CIP labels by rdCIPLabeler.AssignCIPLabels for enumerated stereoisomers",
            "%s (Debian package rdkit-data): %d of the %d records with "
            "len(Chem.FindPotentialStereo(mol)) > 0, chosen by random.Random(%d).sample, "
            "expanded with EnumerateStereoisomers(StereoEnumerationOptions(unique=True, "
            "maxIsomers=%d, onlyUnassigned=False))"
            % (src, len(chosen), len(pool), SEED, MAX_ISOMERS),
            COLUMNS,
            notes=["%d isomers, %d rows; %d writings dropped because they did not read back "
                   "to the isomer's canonical SMILES" % (nisomers, len(rows), dropped),
                   "the labels are RDKit's, not a ground truth: RDKit 2022.09.3 matches "
                   "254/300 compounds of the CIP validation suite (see its README)"],
        )
        for r in rows:
            out.write("\t".join(r) + "\n")


if __name__ == "__main__":
    main()

#!/usr/bin/python3
"""Generates reader.tsv: what RDKit makes of every record of the NCI sample.

For each record of first_5K.smi (shipped by Debian's rdkit-data) it writes
the record as given, two random re-writings and one Kekule writing, and for
each written string: whether RDKit accepts it, the total hydrogen count of
every atom in the order the atoms appear in that string, and the molecular
formula. The NCI records carry no stereo marks, no isotopes and no [H]
atoms, so some records get one more writing that has them: a stereoisomer
(records with a potential stereo unit), all hydrogens as [H] atoms (every
fifth record) or every atom in brackets with its hydrogen count (the next
record of every five).

Usage: /usr/bin/python3 testdata/rdkit/gen_reader.py [first_5K.smi] [out.tsv]
"""

import collections
import os
import sys

from rdkit import Chem
from rdkit.Chem import rdMolDescriptors
from rdkit.Chem.EnumerateStereoisomers import EnumerateStereoisomers, StereoEnumerationOptions

import fixturelib

# Random writings are seeded per record (SEED + record number) so that the
# fixture is the same on every run with the same RDKit version.
SEED = 20221
RANDOM_WRITINGS = 2

COLUMNS = [
    ("id", "NCI identifier of the record (second column of first_5K.smi)"),
    ("variant", "given (the record as written in first_5K.smi), random1, random2 "
     "(Chem.MolToRandomSmilesVect(mol, 2, randomSeed=%d+line number), isomeric), "
     "kekule (Chem.Kekulize(mol, clearAromaticFlags=True) then "
     "Chem.MolToSmiles(mol, kekuleSmiles=True)), isomer (records with "
     "len(Chem.FindPotentialStereo(mol)) > 0: the last isomer of "
     "EnumerateStereoisomers(mol, StereoEnumerationOptions(unique=True, maxIsomers=8, "
     "onlyUnassigned=False)) written by Chem.MolToRandomSmilesVect(isomer, 1, "
     "randomSeed=%d+line number)), explicit_h (line number %% 5 == 0: "
     "Chem.MolToSmiles(Chem.AddHs(mol)), hydrogens as [H] atoms), bracket_h (line number "
     "%% 5 == 1: Chem.MolToSmiles(mol, allHsExplicit=True))" % (SEED, SEED)),
    ("smiles", "the written string"),
    ("accepted", "1 if Chem.MolFromSmiles(smiles) (sanitize=True) returns a molecule, else 0"),
    ("hcounts", "comma-separated atom.GetTotalNumHs() for every atom in the order the atoms "
     "appear in the string, parsed with SmilesParserParams(removeHs=False) so that [H] atoms "
     "stay atoms (their own count is 0 and they are not counted on their neighbour); "
     "empty when not accepted"),
    ("formula_rdkit", "rdMolDescriptors.CalcMolFormula(mol) with default arguments "
     "(isotopes merged into their element, net charge appended as +, -, +2 ...)"),
    ("formula_rdkit_isotopes", "rdMolDescriptors.CalcMolFormula(mol, separateIsotopes=True, "
     "abbreviateHIsotopes=False) (isotopes written as [2H], [13C] ...)"),
    ("hill", "Hill formula computed by this script from the atoms: isotopes ignored, no charge; "
     "C then H then the other symbols alphabetically when carbon is present, otherwise all "
     "symbols alphabetically; count 1 omitted. This is the column the Go test compares"),
    ("charge", "net formal charge (sum of atom.GetFormalCharge())"),
]


def hill(mol):
    """Hill formula of mol ignoring isotopes and charge."""
    counts = collections.Counter()
    for a in mol.GetAtoms():
        counts[a.GetSymbol()] += 1
        counts["H"] += a.GetTotalNumHs()
    counts = {k: v for k, v in counts.items() if v}
    if "C" in counts:
        order = ["C"] + (["H"] if "H" in counts else []) + sorted(
            k for k in counts if k not in ("C", "H"))
    else:
        order = sorted(counts)
    return "".join(k + (str(counts[k]) if counts[k] > 1 else "") for k in order)


def describe(smiles):
    """The columns after 'smiles' for one written string."""
    accepted = Chem.MolFromSmiles(smiles) is not None
    params = Chem.SmilesParserParams()
    params.removeHs = False
    mol = Chem.MolFromSmiles(smiles, params)
    if not accepted or mol is None:
        return ["1" if accepted else "0", "", "", "", "", ""]
    hcounts = ",".join(str(a.GetTotalNumHs()) for a in mol.GetAtoms())
    charge = sum(a.GetFormalCharge() for a in mol.GetAtoms())
    return [
        "1",
        hcounts,
        rdMolDescriptors.CalcMolFormula(mol),
        rdMolDescriptors.CalcMolFormula(mol, separateIsotopes=True, abbreviateHIsotopes=False),
        hill(mol),
        str(charge),
    ]


def writings(smiles, lineno):
    """The (variant, string) pairs written for one record."""
    yield "given", smiles
    mol = Chem.MolFromSmiles(smiles)
    if mol is None:
        return
    randoms = Chem.MolToRandomSmilesVect(mol, RANDOM_WRITINGS, randomSeed=SEED + lineno)
    for i, s in enumerate(randoms, 1):
        yield "random%d" % i, s
    kek = Chem.Mol(mol)
    try:
        Chem.Kekulize(kek, clearAromaticFlags=True)
    except Exception:  # a sanitized molecule always kekulizes; keep going if not
        return
    yield "kekule", Chem.MolToSmiles(kek, kekuleSmiles=True)
    if len(Chem.FindPotentialStereo(mol)) > 0:
        opts = StereoEnumerationOptions(unique=True, maxIsomers=8, onlyUnassigned=False)
        isomers = list(EnumerateStereoisomers(mol, options=opts))
        if isomers:
            # The last isomer: the first often carries no mark at all when
            # the potential unit is not a real one.
            yield "isomer", Chem.MolToRandomSmilesVect(isomers[-1], 1, randomSeed=SEED + lineno)[0]
    if lineno % 5 == 0:
        yield "explicit_h", Chem.MolToSmiles(Chem.AddHs(mol))
    elif lineno % 5 == 1:
        yield "bracket_h", Chem.MolToSmiles(mol, allHsExplicit=True)


def main():
    src = sys.argv[1] if len(sys.argv) > 1 else fixturelib.NCI_DEFAULT
    dst = sys.argv[2] if len(sys.argv) > 2 else os.path.join(fixturelib.HERE, "reader.tsv")
    rows = []
    rejected = 0
    for lineno, (smiles, ident) in enumerate(fixturelib.read_smi(src), 1):
        for variant, s in writings(smiles, lineno):
            cols = describe(s)
            if cols[0] == "0":
                rejected += 1
            rows.append([ident, variant, s] + cols)
    with open(dst, "w") as out:
        fixturelib.header(
            out,
            "reader.tsv: acceptance, per-atom hydrogen counts and formulas by RDKit",
            "%s (Debian package rdkit-data), every record" % src,
            COLUMNS,
            notes=["%d rows, %d of them not accepted by RDKit (records kept as given)"
                   % (len(rows), rejected)],
        )
        for r in rows:
            out.write("\t".join(r) + "\n")


if __name__ == "__main__":
    main()

#!/usr/bin/python3
"""Write a list of distinct structures for scale benchmarks.

Source: the NCI and WEHI sets of Debian's rdkit-data
(/usr/share/RDKit/Data/NCI/first_5K.smi, Pains/test_data/wehi_mols.csv),
read and rewritten by Debian's python3-rdkit. Each parent gives its
stereoisomers (up to eight, RDKit's EnumerateStereoisomers without
embedding) and single-substituent analogues (one hydrogen on a carbon
replaced by F, Cl, C or O) with their stereoisomers, until N distinct
records are written. About one record in five keeps an unmarked centre,
as curated lists do. Deterministic for a given N.

usage: make_list.py N > list.smi
"""
import random
import sys

from rdkit import Chem, RDLogger
from rdkit.Chem.EnumerateStereoisomers import (EnumerateStereoisomers,
                                               StereoEnumerationOptions)

RDLogger.DisableLog("rdApp.*")
DATA = "/usr/share/RDKit/Data"


def parents():
    with open(f"{DATA}/NCI/first_5K.smi") as f:
        for line in f:
            parts = line.split()
            if parts:
                yield parts[0], "NCI-" + (parts[1] if len(parts) > 1 else "x")
    with open(f"{DATA}/Pains/test_data/wehi_mols.csv") as f:
        for i, line in enumerate(f):
            cell = line.strip().split(",")[0]
            if i == 0 and not Chem.MolFromSmiles(cell):
                continue
            yield cell, f"WEHI-{i}"


def analogues(mol, rng):
    out = [mol]
    sites = [a.GetIdx() for a in mol.GetAtoms()
             if a.GetSymbol() == "C" and a.GetTotalNumHs() > 0]
    rng.shuffle(sites)
    for idx in sites[:4]:
        sub = rng.choice(["F", "Cl", "C", "O"])
        rw = Chem.RWMol(mol)
        new = rw.AddAtom(Chem.Atom(sub))
        rw.AddBond(idx, new, Chem.BondType.SINGLE)
        try:
            m = rw.GetMol()
            Chem.SanitizeMol(m)
            out.append(m)
        except Exception:
            pass
    return out


def main():
    n = int(sys.argv[1])
    rng = random.Random(20261202)
    opts = StereoEnumerationOptions(tryEmbedding=False, maxIsomers=8,
                                    onlyUnassigned=False, unique=True)
    seen = set()
    written = 0
    rounds = 0
    while written < n and rounds < 40:
        for smi, name in parents():
            mol = Chem.MolFromSmiles(smi)
            if mol is None or mol.GetNumAtoms() > 80:
                continue
            for k, m in enumerate(analogues(mol, rng) if rounds else [mol]):
                for j, iso in enumerate(EnumerateStereoisomers(m, options=opts)):
                    marked = [a for a in iso.GetAtoms()
                              if a.GetChiralTag() != Chem.ChiralType.CHI_UNSPECIFIED]
                    if marked and rng.random() < 0.2:
                        rng.choice(marked).SetChiralTag(Chem.ChiralType.CHI_UNSPECIFIED)
                    out = Chem.MolToSmiles(iso)
                    if out in seen:
                        continue
                    seen.add(out)
                    print(f"{out}\t{name}-{rounds}.{k}.{j}")
                    written += 1
                    if written >= n:
                        return
        rounds += 1


if __name__ == "__main__":
    main()

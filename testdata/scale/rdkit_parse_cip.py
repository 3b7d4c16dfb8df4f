#!/usr/bin/python3
"""The reference side of the throughput comparison: read each record of a
list with Debian's python3-rdkit (Chem.MolFromSmiles) and label it with its
CIP labeller (rdCIPLabeler.AssignCIPLabels), one core, printing only the
count of records read. Compare with `stereoline describe --json` and
`stereoline check` on the same file (DEVELOPERS.md, "Running things").

usage: rdkit_parse_cip.py LIST.smi
"""
import sys

from rdkit import Chem, RDLogger
from rdkit.Chem import rdCIPLabeler

RDLogger.DisableLog("rdApp.*")


def main():
    n = 0
    with open(sys.argv[1]) as f:
        for line in f:
            parts = line.split()
            if not parts:
                continue
            mol = Chem.MolFromSmiles(parts[0])
            if mol is None:
                continue
            rdCIPLabeler.AssignCIPLabels(mol)
            n += 1
    print(n)


if __name__ == "__main__":
    main()

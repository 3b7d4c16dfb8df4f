#!/usr/bin/python3
"""Times rdCIPLabeler.AssignCIPLabels on one core and prints molecules per second.

Two inputs: the CIP validation suite (compounds.smi; default path relative
to this directory, ../../../shared/reference/cip-validation-suite/compounds.smi)
and cip_labels.tsv. Molecules are parsed before the clock starts, so the
figure is for labelling alone; each molecule is copied afresh for every pass so that a
later round does not see the labels of an earlier one (copying is
not timed).

Usage: /usr/bin/python3 testdata/rdkit/bench_cip.py [compounds.smi] [cip_labels.tsv] [seconds]
"""

import os
import sys
import time

from rdkit import Chem
from rdkit.Chem import rdCIPLabeler

import fixturelib


def pin_one_core():
    """Keeps the process on one CPU so the figure compares with a one-core Go run."""
    try:
        os.sched_setaffinity(0, {sorted(os.sched_getaffinity(0))[0]})
    except (AttributeError, OSError):
        pass


def suite_molecules(path):
    mols = []
    for smiles, _ in fixturelib.read_smi(path):
        m = Chem.MolFromSmiles(smiles)
        if m is not None:
            mols.append(m)
    return mols


def fixture_molecules(path):
    mols = []
    for line in open(path):
        if line.startswith("#"):
            continue
        smiles = line.rstrip("\n").split("\t")[3]
        m = Chem.MolFromSmiles(smiles)
        if m is not None:
            mols.append(m)
    return mols


def rate(mols, seconds):
    """Molecules labelled per second, repeating whole passes for at least seconds.

    Every pass labels fresh copies; only the labelling calls are timed.
    """
    n = 0
    elapsed = 0.0
    while elapsed < seconds:
        copies = [Chem.Mol(m) for m in mols]
        start = time.perf_counter()
        for m in copies:
            rdCIPLabeler.AssignCIPLabels(m)
        elapsed += time.perf_counter() - start
        n += len(copies)
    return n / elapsed


def main():
    here = fixturelib.HERE
    suite = sys.argv[1] if len(sys.argv) > 1 else os.path.join(
        here, "..", "..", "..", "shared", "reference", "cip-validation-suite", "compounds.smi")
    fixture = sys.argv[2] if len(sys.argv) > 2 else os.path.join(here, "cip_labels.tsv")
    seconds = float(sys.argv[3]) if len(sys.argv) > 3 else 2.0
    pin_one_core()
    import rdkit
    print("RDKit %s rdCIPLabeler.AssignCIPLabels, one core" % rdkit.__version__)
    for name, path, load in (("cip-validation-suite", suite, suite_molecules),
                             ("cip_labels.tsv", fixture, fixture_molecules)):
        if not os.path.exists(path):
            print("%s: %s not found, skipped" % (name, path))
            continue
        mols = load(path)
        print("%s: %d molecules, %.0f molecules/s" % (name, len(mols), rate(mols, seconds)))


if __name__ == "__main__":
    main()

#!/usr/bin/python3
"""Generates depict_readback.tsv: RDKit reads our drawings back.

For every molecule of the stereo fixtures (the distinct strings of
cip_labels.tsv and the CIP validation suite, read through its relative
path) `stereoline draw --molfile` writes a molfile with the drawing's 2D
coordinates and wedge flags. RDKit reads each string and each molfile and
labels both (rdCIPLabeler.AssignCIPLabels after
Chem.AssignStereochemistry(cleanIt=True, force=True)); the drawing is
right when the two agree: every tetrahedral label (R S r s) and every
double-bond label (E Z) from the coordinates and wedges is the one from
the notation. Molecules with a Fischer view get the same check for the
molfile built from the Fischer rows (`draw --fischer --molfile`).

Usage: /usr/bin/python3 testdata/rdkit/gen_depict.py [out.tsv] [--limit N]
With --check, nothing is written: the run prints the agreement counts and
exits 1 when a molecule disagrees that the fixture records as agreeing.
"""

import json
import os
import subprocess
import sys
import tempfile

from rdkit import Chem
from rdkit.Chem import rdCIPLabeler

import fixturelib

COLUMNS = [
    ("source", "cip_labels (testdata/rdkit/cip_labels.tsv, its distinct strings) or suite "
     "(the CIP validation suite, ../shared/reference/cip-validation-suite/compounds.smi)"),
    ("name", "group:isomer for cip_labels rows, the VS identifier for the suite"),
    ("view", "structure (draw --molfile) or fischer (draw --fischer --molfile)"),
    ("smiles", "the string drawn"),
    ("from_notation", "RDKit's labels of the string: <atom><label>, atoms numbered from 1 in "
     "string order, double-bond labels on both atoms, sorted; '-' when none"),
    ("from_drawing", "RDKit's labels of our molfile, numbered the same way (atoms the "
     "drawing adds come after the string's last atom and carry no label)"),
    ("agree", "1 when the two label sets are equal, 0 otherwise"),
]


def params():
    p = Chem.SmilesParserParams()
    p.removeHs = False
    return p


def labels(mol, n):
    """The CIP labels of atoms 0..n-1 as a sorted list of '<atom><label>'."""
    Chem.AssignStereochemistry(mol, cleanIt=True, force=True)
    rdCIPLabeler.AssignCIPLabels(mol)
    out = set()
    for a in mol.GetAtoms():
        if a.GetIdx() < n and a.HasProp("_CIPCode"):
            out.add((a.GetIdx() + 1, a.GetProp("_CIPCode")))
    for b in mol.GetBonds():
        if b.HasProp("_CIPCode"):
            for x in (b.GetBeginAtomIdx(), b.GetEndAtomIdx()):
                if x < n:
                    out.add((x + 1, b.GetProp("_CIPCode")))
    return " ".join("%d%s" % p for p in sorted(out)) or "-"


def molecules():
    seen = set()
    path = os.path.join(fixturelib.HERE, "cip_labels.tsv")
    with open(path) as f:
        for line in f:
            if line.startswith("#"):
                continue
            cols = line.rstrip("\n").split("\t")
            smi = cols[3]
            if smi in seen:
                continue
            seen.add(smi)
            yield "cip_labels", "%s:%s" % (cols[0], cols[1]), smi
    suite = os.path.normpath(fixturelib.SUITE_DEFAULT)
    if os.path.exists(suite):
        with open(suite) as f:
            for line in f:
                cols = line.rstrip("\n").split("\t")
                if len(cols) >= 2 and cols[0]:
                    yield "suite", cols[1], cols[0]


def build(tmp):
    exe = os.path.join(tmp, "stereoline")
    subprocess.run(["go", "build", "-o", exe, "./cmd/stereoline"], cwd=fixturelib.REPO, check=True)
    return exe


def draw(exe, tmp, smiles, *flags):
    """Runs draw on the strings (one record each, no titles); returns its output."""
    inp = os.path.join(tmp, "in.smi")
    with open(inp, "w") as f:
        for s in smiles:
            f.write(s + "\n")
    return subprocess.run([exe, "draw", *flags, inp], capture_output=True, text=True).stdout


def run(limit=None):
    mols = list(molecules())
    if limit:
        mols = mols[:limit]
    rows = []
    with tempfile.TemporaryDirectory() as tmp:
        exe = build(tmp)
        smiles = [s for _, _, s in mols]
        blocks = draw(exe, tmp, smiles, "--molfile").split("$$$$\n")
        fischer = [json.loads(x) for x in draw(exe, tmp, smiles, "--fischer", "--json").splitlines()]
        fidx = [i for i, x in enumerate(fischer) if x.get("fischer")]
        fblocks = draw(exe, tmp, [smiles[i] for i in fidx], "--fischer", "--molfile").split("$$$$\n")
        views = [(i, "structure", blocks[i]) for i in range(len(mols))]
        views += [(i, "fischer", fblocks[k]) for k, i in enumerate(fidx)]
        for i, view, block in views:
            source, name, smi = mols[i]
            ref = Chem.MolFromSmiles(smi, params())
            if ref is None:
                continue
            n = ref.GetNumAtoms()
            want = labels(ref, n)
            got_mol = Chem.MolFromMolBlock(block, sanitize=True, removeHs=False)
            got = labels(got_mol, n) if got_mol is not None else "unreadable"
            rows.append((source, name, view, smi, want, got, "1" if want == got else "0"))
    return rows


def main():
    args = sys.argv[1:]
    check = "--check" in args
    limit = None
    if "--limit" in args:
        limit = int(args[args.index("--limit") + 1])
    rest = [a for a in args if not a.startswith("--") and not a.isdigit()]
    out_path = rest[0] if rest else os.path.join(fixturelib.HERE, "depict_readback.tsv")
    rows = run(limit)
    counts = {}
    for r in rows:
        k = (r[0], r[2])
        tot, ok = counts.get(k, (0, 0))
        counts[k] = (tot + 1, ok + int(r[6]))
    summary = "; ".join("%s %s: %d of %d agree" % (k[0], k[1], v[1], v[0]) for k, v in sorted(counts.items()))
    if check:
        recorded = {}
        with open(out_path) as f:
            for line in f:
                if not line.startswith("#"):
                    c = line.rstrip("\n").split("\t")
                    recorded[(c[2], c[3])] = c[6]
        bad = [r for r in rows if r[6] == "0" and recorded.get((r[2], r[3])) == "1"]
        print(summary)
        for r in bad:
            print("now disagrees:", *r, sep="\t")
        sys.exit(1 if bad else 0)
    with open(out_path, "w") as out:
        fixturelib.header(
            out, "depict_readback.tsv: RDKit labels of our molfiles against RDKit labels of the notation",
            "testdata/rdkit/cip_labels.tsv (distinct strings) and ../shared/reference/cip-validation-suite/compounds.smi; "
            "molfiles from `stereoline draw --molfile` and `stereoline draw --fischer --molfile` built from this tree",
            COLUMNS, notes=["agreement: " + summary])
        for r in rows:
            out.write("\t".join(r) + "\n")
    print(summary)


if __name__ == "__main__":
    main()

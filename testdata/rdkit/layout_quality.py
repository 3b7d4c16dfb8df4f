#!/usr/bin/python3
"""Measures layout quality: our drawings beside RDKit's Compute2DCoords.

For every molecule of the stereo fixtures (the distinct strings of
cip_labels.tsv and the CIP validation suite) it takes our coordinates
(`stereoline draw --json`, the record's own atoms; hydrogens the drawing
adds for wedges are left out) and RDKit's (rdDepictor.Compute2DCoords on
the molecule read with removeHs=False, so both lay out the same atoms),
and counts a layout as tidy when
  1. every bond length is within 10% of the median bond length,
  2. no two atoms are closer than half the median bond length,
  3. no two bonds cross (applied to every molecule; a graph that is not
     planar cannot meet it, and both layouts are judged alike).

Usage: /usr/bin/python3 testdata/rdkit/layout_quality.py [--limit N] [--list] [--write]
--list prints the molecules each layout fails, with the failed criteria.
--write also writes layout_quality.tsv beside this script: RDKit's verdict
for every molecule, which stereo/depict's TestLayoutQuality compares our
layouts with (suite molecules by their identifier only: the test reads
their notation from the suite through its relative path).
"""

import json
import math
import os
import subprocess
import sys
import tempfile

from rdkit import Chem
from rdkit.Chem import rdDepictor

import fixturelib
import gen_depict


def crosses(p, q, r, s):
    def cross(o, a, b):
        return (a[0] - o[0]) * (b[1] - o[1]) - (a[1] - o[1]) * (b[0] - o[0])
    eps = 1e-9
    d1, d2 = cross(p, q, r), cross(p, q, s)
    d3, d4 = cross(r, s, p), cross(r, s, q)
    return ((d1 > eps and d2 < -eps) or (d1 < -eps and d2 > eps)) and \
        ((d3 > eps and d4 < -eps) or (d3 < -eps and d4 > eps))


def judge(xy, bonds):
    """Returns the set of failed criteria: 'length', 'close', 'cross'."""
    failed = set()
    if not bonds:
        return failed
    lens = sorted(math.dist(xy[a], xy[b]) for a, b in bonds)
    med = lens[len(lens) // 2] if len(lens) % 2 else (lens[len(lens) // 2 - 1] + lens[len(lens) // 2]) / 2
    if med <= 0:
        return {"length", "close"}
    if any(abs(x - med) > 0.1 * med for x in lens):
        failed.add("length")
    n = len(xy)
    for i in range(n):
        for j in range(i + 1, n):
            if math.dist(xy[i], xy[j]) < 0.5 * med:
                failed.add("close")
                break
        if "close" in failed:
            break
    for i in range(len(bonds)):
        a, b = bonds[i]
        for j in range(i + 1, len(bonds)):
            c, d = bonds[j]
            if len({a, b, c, d}) < 4:
                continue
            if crosses(xy[a], xy[b], xy[c], xy[d]):
                failed.add("cross")
                break
        if "cross" in failed:
            break
    return failed


COLUMNS = [
    ("source", "cip_labels (testdata/rdkit/cip_labels.tsv, its distinct strings) or suite "
     "(the CIP validation suite, ../shared/reference/cip-validation-suite/compounds.smi)"),
    ("name", "group:isomer for cip_labels rows, the VS identifier for the suite"),
    ("smiles", "the string laid out; '-' for suite rows, whose notation the test reads from the suite"),
    ("rdkit_failed", "the criteria RDKit's Compute2DCoords layout fails, comma separated "
     "(length, close, cross), or '-' when it is tidy"),
]


def main():
    args = sys.argv[1:]
    limit = int(args[args.index("--limit") + 1]) if "--limit" in args else None
    listing = "--list" in args
    rows = []
    mols = list(gen_depict.molecules())
    if limit:
        mols = mols[:limit]
    with tempfile.TemporaryDirectory() as tmp:
        exe = gen_depict.build(tmp)
        ours = [json.loads(x) for x in gen_depict.draw(exe, tmp, [s for _, _, s in mols], "--json").splitlines()]
    stats = {"ours": {"tidy": 0, "length": 0, "close": 0, "cross": 0},
             "rdkit": {"tidy": 0, "length": 0, "close": 0, "cross": 0}}
    total = 0
    for (source, name, smi), d in zip(mols, ours):
        mol = Chem.MolFromSmiles(smi, gen_depict.params())
        if mol is None:
            continue
        n = mol.GetNumAtoms()
        bonds = [(b.GetBeginAtomIdx(), b.GetEndAtomIdx()) for b in mol.GetBonds()]
        our_xy = {a["n"] - 1: (a["x"], a["y"]) for a in d["atoms"] if a["n"] <= n}
        if len(our_xy) != n:
            continue
        rdDepictor.Compute2DCoords(mol)
        conf = mol.GetConformer()
        rd_xy = {i: (conf.GetAtomPosition(i).x, conf.GetAtomPosition(i).y) for i in range(n)}
        total += 1
        rows.append((source, name, smi if source != "suite" else "-",
                     ",".join(sorted(judge(rd_xy, bonds))) or "-"))
        for who, xy in (("ours", our_xy), ("rdkit", rd_xy)):
            failed = judge(xy, bonds)
            for f in failed:
                stats[who][f] += 1
            if not failed:
                stats[who]["tidy"] += 1
            elif listing and who == "ours":
                print("untidy", source, name, smi, " ".join(sorted(failed)), sep="\t")
    lines = ["molecules: %d (cip_labels distinct strings and the CIP validation suite)" % total]
    for who in ("ours", "rdkit"):
        s = stats[who]
        lines.append("%-6s tidy %d (%.1f%%); bond length off by >10%%: %d; atoms closer than half a bond: %d; crossing bonds: %d"
                     % (who, s["tidy"], 100.0 * s["tidy"] / max(total, 1), s["length"], s["close"], s["cross"]))
    print("\n".join(lines))
    if "--write" in args:
        with open(os.path.join(fixturelib.HERE, "layout_quality.tsv"), "w") as out:
            fixturelib.header(
                out, "layout_quality.tsv: RDKit's Compute2DCoords layouts judged tidy or not",
                "testdata/rdkit/cip_labels.tsv (distinct strings) and ../shared/reference/cip-validation-suite/compounds.smi, "
                "read with removeHs=False; tidy: every bond within 10% of the median bond, no two atoms closer than half "
                "of it, no two bonds crossing",
                COLUMNS, notes=["when written: " + lines[1].replace("ours  ", "ours (this tree)"), lines[2]])
            for r in rows:
                out.write("\t".join(r) + "\n")


if __name__ == "__main__":
    main()

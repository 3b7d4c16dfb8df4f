#!/usr/bin/python3
"""Generates smarts.tsv: RDKit's verdict on every SMARTS that Debian's
rdkit-data ships, and on variants of them one edit away.

Sources (all under /usr/share/RDKit/Data, package rdkit-data):
  Salts.txt                       first field of each line (salt fragments)
  FunctionalGroups.txt            second tab-separated field (label, SMARTS, note)
  Functional_Group_Hierarchy.txt  second field and, when present, the removal
                                  reaction in the fourth
  Crippen.txt                     second field (atom types of the logP model)
  FragmentDescriptors.csv         third and fourth fields (SMARTS, MOE_SMARTS)
  SmartsLib/RLewis_smarts.txt     first field (filters)
  SmartsLib/patty_rules.txt       first field (atom typing rules)
  Pains/wehi_pains.csv            first CSV field (PAINS filters)
  BaseFeatures.fdef               the pattern of AtomType and DefineFeature
                                  lines that use no {macro}

Every distinct pattern is kept once, with the first place it was found.
Each gets three variants made by a seeded random edit (a character
deleted, a character inserted from the SMARTS alphabet, two neighbours
swapped), so that the fixture holds patterns RDKit rejects as well as
ones it accepts. A pattern with '>' outside brackets is read with
AllChem.ReactionFromSmarts, the others with Chem.MolFromSmarts.

Usage: /usr/bin/python3 testdata/rdkit/gen_smarts.py [data dir] [out.tsv]
"""

import csv
import os
import random
import re
import sys

from rdkit import Chem
from rdkit.Chem import AllChem

import fixturelib

DATA_DEFAULT = "/usr/share/RDKit/Data"
SEED = 20229
ALPHABET = "CNOcnos[]()=#-:~@!&,;$*+123456789%.>HDXxRrvh"

COLUMNS = [
    ("source", "file and line (1-based) of the pattern under the data directory"),
    ("variant", "given (the pattern as shipped), or delete@i, insert@i:c, swap@i "
     "(one edit at character i of the given pattern, random.Random(%d + row))" % SEED),
    ("pattern", "the pattern"),
    ("accepted", "1 if RDKit returns a query (Chem.MolFromSmarts, or "
     "AllChem.ReactionFromSmarts when the pattern has '>' outside brackets "
     "and the call does not raise), else 0"),
]


def fields(line, sep=None):
    return [f for f in (line.split(sep) if sep else line.split()) if f != ""]


def patterns(data):
    """Yields (source, pattern) from the data files."""
    def lines(rel):
        with open(os.path.join(data, rel), encoding="utf-8", errors="replace") as f:
            for n, line in enumerate(f, 1):
                yield n, line.rstrip("\n").rstrip("\r")

    for n, line in lines("Salts.txt"):
        if line.strip() and not line.lstrip().startswith("//"):
            yield "Salts.txt:%d" % n, fields(line)[0]
    for n, line in lines("FunctionalGroups.txt"):
        f = fields(line, "\t")
        if len(f) >= 2 and not line.startswith("//"):
            yield "FunctionalGroups.txt:%d" % n, f[1].strip()
    for n, line in lines("Functional_Group_Hierarchy.txt"):
        f = [x.strip() for x in fields(line, "\t")]
        if len(f) >= 2 and not line.startswith("//"):
            yield "Functional_Group_Hierarchy.txt:%d" % n, f[1]
            if len(f) >= 4:
                yield "Functional_Group_Hierarchy.txt:%d" % n, f[3]
    for n, line in lines("Crippen.txt"):
        f = fields(line, "\t")
        if len(f) >= 2 and not line.startswith("#"):
            yield "Crippen.txt:%d" % n, f[1]
    for n, line in lines("FragmentDescriptors.csv"):
        f = fields(line, "\t")
        if len(f) >= 4 and not line.startswith("#"):
            yield "FragmentDescriptors.csv:%d" % n, f[2]
            yield "FragmentDescriptors.csv:%d" % n, f[3]
    for n, line in lines("SmartsLib/RLewis_smarts.txt"):
        if line.strip() and not line.startswith("#"):
            yield "SmartsLib/RLewis_smarts.txt:%d" % n, fields(line)[0]
    for n, line in lines("SmartsLib/patty_rules.txt"):
        if line.strip() and not line.lstrip().startswith("#"):
            yield "SmartsLib/patty_rules.txt:%d" % n, fields(line)[0]
    with open(os.path.join(data, "Pains/wehi_pains.csv"), newline="") as f:
        for n, row in enumerate(csv.reader(f), 1):
            if row:
                yield "Pains/wehi_pains.csv:%d" % n, row[0]
    for n, line in lines("BaseFeatures.fdef"):
        m = re.match(r"\s*(AtomType|Atomtype|DefineFeature)\s+!?\S+\s+(\S+)", line)
        if m and "{" not in m.group(2):
            yield "BaseFeatures.fdef:%d" % n, m.group(2)


def is_reaction(s):
    depth = 0
    for c in s:
        if c == "[":
            depth += 1
        elif c == "]":
            depth = max(0, depth - 1)
        elif c == ">" and depth == 0:
            return True
    return False


def accepted(s):
    if is_reaction(s):
        try:
            return AllChem.ReactionFromSmarts(s) is not None
        except Exception:  # RDKit raises on some malformed reactions
            return False
    return Chem.MolFromSmarts(s) is not None


def variants(s, rng):
    n = len(s)
    if n > 1:
        i = rng.randrange(n)
        yield "delete@%d" % i, s[:i] + s[i + 1:]
    i = rng.randrange(n + 1)
    c = rng.choice(ALPHABET)
    yield "insert@%d:%s" % (i, c), s[:i] + c + s[i:]
    if n > 1:
        i = rng.randrange(n - 1)
        yield "swap@%d" % i, s[:i] + s[i + 1] + s[i] + s[i + 2:]


def main():
    data = sys.argv[1] if len(sys.argv) > 1 else DATA_DEFAULT
    out_path = sys.argv[2] if len(sys.argv) > 2 else os.path.join(fixturelib.HERE, "smarts.tsv")
    seen = set()
    rows = []
    for source, pat in patterns(data):
        if pat in seen or "\t" in pat:
            continue
        seen.add(pat)
        rows.append((source, "given", pat))
    out_rows = []
    for k, (source, variant, pat) in enumerate(rows):
        out_rows.append((source, variant, pat, accepted(pat)))
        rng = random.Random(SEED + k)
        for v, s in variants(pat, rng):
            if s in seen or "\t" in s:
                continue
            seen.add(s)
            out_rows.append((source, v, s, accepted(s)))
    given = sum(1 for r in out_rows if r[1] == "given")
    given_ok = sum(1 for r in out_rows if r[1] == "given" and r[3])
    var_ok = sum(1 for r in out_rows if r[1] != "given" and r[3])
    with open(out_path, "w") as out:
        fixturelib.header(
            out,
            "smarts.tsv: RDKit's verdict on the SMARTS shipped by rdkit-data and on one-edit variants",
            "%s (Debian package rdkit-data): the files named in testdata/rdkit/gen_smarts.py" % data,
            COLUMNS,
            notes=["%d distinct patterns as shipped (%d accepted), %d variants (%d accepted)"
                   % (given, given_ok, len(out_rows) - given, var_ok)],
        )
        for source, variant, pat, ok in out_rows:
            out.write("\t".join([source, variant, pat, "1" if ok else "0"]) + "\n")


if __name__ == "__main__":
    main()

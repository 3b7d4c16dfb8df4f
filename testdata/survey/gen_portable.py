"""Reads Stereoline's portable rewrites of the survey's flagged writings
with the three readers of the survey and writes portable.tsv.

For each reader setting (the default, lone pair last and the closing
digit deciding, as both RDKit releases read; and lone pair in the
hydrogen's slot with the pair of ring marks dropped, as Open Babel reads)
every distinct writing of survey.tsv that `stereoline describe --json`
flags with a stereo-reader-dependent warning under that setting is
rewritten with `stereoline transform --portable` under the same setting,
and the original and the rewrite are read with RDKit 2022.09.3 (Debian
python3-rdkit), @rdkit/rdkit (npm, read_rdkitjs.js) and Open Babel 3.1.1
(Debian python3-openbabel), as readers.py reads them.
stereo/readings/portable_test.go checks the fixture: the rewrite is
today's, every reader configures the rewrite alike, and the libraries the
setting is named for read the rewrite as they read the original.

Run from the repository root (needs go, node and the npm package, see
README.md):

    /usr/bin/python3 testdata/survey/gen_portable.py
"""

import json
import os
import subprocess
import sys

HERE = os.path.dirname(os.path.abspath(__file__))
REPO = os.path.dirname(os.path.dirname(HERE))
sys.path.insert(0, HERE)

import readers  # noqa: E402
from gen_survey import amap_of, config_text, npm_version, package_version, rdkit_version, node_version  # noqa: E402

SETTINGS = [
    ("lonePair=last ringMarks=closing", []),
    ("lonePair=hydrogen-slot ringMarks=dropped", ["--lone-pair", "hydrogen-slot", "--ring-marks", "dropped"]),
]


def stereoline(args, lines):
    """Runs the command line from the tree on lines (one record each) and
    returns its standard output and error."""
    out = subprocess.run(["go", "run", "./cmd/stereoline"] + args, cwd=REPO, input="".join(l + "\n" for l in lines),
                         capture_output=True, text=True)
    if out.returncode not in (0, 1):
        sys.exit("stereoline %s failed: %s" % (" ".join(args), out.stderr))
    return out.stdout, out.stderr


def survey_writings():
    """[(structure, writing id, smiles)] of survey.tsv, one per distinct string."""
    seen, out = set(), []
    with open(os.path.join(HERE, "survey.tsv"), encoding="utf-8") as f:
        for line in f:
            if line.startswith("#") or not line.strip():
                continue
            c = line.rstrip("\n").split("\t")
            if c[3] in seen:
                continue
            seen.add(c[3])
            out.append((c[0], c[1], c[3]))
    return out


def flagged(smiles, flags):
    """The writings with a stereo-reader-dependent warning under flags."""
    out, _ = stereoline(["describe", "--json"] + flags, smiles)
    keep = []
    for s, line in zip(smiles, out.splitlines()):
        d = json.loads(line)
        if d["input"] != s:
            sys.exit("describe answered %r for %r" % (d["input"], s))
        if any(x["code"] == "stereo-reader-dependent" and x["severity"] == "warning" for x in d["diagnostics"]):
            keep.append(s)
    return keep


def rewrite(smiles, flags):
    """{writing: rewrite, or '!' when the rewrite is refused}."""
    out, err = stereoline(["transform", "--portable"] + flags, smiles)
    lines = out.splitlines()
    if len(lines) != len(smiles):
        sys.exit("transform printed %d lines for %d records: %s" % (len(lines), len(smiles), err))
    refused = set()
    for e in err.splitlines():
        if e.startswith("-:"):
            refused.add(int(e.split(":")[1]) - 1)
    return {s: ("!" if i in refused else r) for i, (s, r) in enumerate(zip(smiles, lines))}


def read(strings):
    """{string: {reader: Reading}} for every string, by the three readers."""
    reqs = [("%d" % i, s, amap_of(s)) for i, s in enumerate(strings)]
    js, _ = readers.rdkitjs_read_all(reqs)
    out = {}
    for i, s in enumerate(strings):
        amap = reqs[i][2]
        mol = readers.rdkit_parse(s)
        j = js["%d" % i]
        if j.ok and mol is not None:
            readers.rdkitjs_bonds(j, mol, amap)
        out[s] = {"rdkit": readers.rdkit_read(s, amap), "rdkit-js": j, "openbabel": readers.openbabel_read(s, amap)}
    return out


def canonical(r):
    return r.canonical if r.ok else "!"


COLUMNS = [
    ("structure", "the structure of survey.tsv the writing came from"),
    ("writing", "the writing's id in survey.tsv (its first row with that string)"),
    ("setting", "the reader setting (notation.Reading) the writing was flagged and rewritten under"),
    ("smiles", "the writing"),
    ("rewrite", "stereoline transform --portable under the setting; ! when it refuses"),
    ("rdkit_config", "the configuration RDKit 2022.09.3 reads in the rewrite (survey.tsv form, atoms of the rewrite)"),
    ("rdkitjs_config", "the same by @rdkit/rdkit; = when the same as rdkit_config"),
    ("openbabel_config", "the same by Open Babel 3.1.1; = when the same as rdkit_config"),
    ("rdkit_canonical", "RDKit 2022.09.3's canonical isomeric SMILES of the writing, then of the rewrite "
     "(space separated; = for the rewrite when the same)"),
    ("rdkitjs_canonical", "the same by @rdkit/rdkit"),
    ("openbabel_canonical", "the same by Open Babel 3.1.1"),
]


def main():
    writings = survey_writings()
    by_smiles = {s: (sid, wid) for sid, wid, s in writings}
    rows = []
    for setting, flags in SETTINGS:
        marked = flagged([s for _, _, s in writings], flags)
        rewrites = rewrite(marked, flags)
        reads = read(marked + sorted(set(r for r in rewrites.values() if r != "!")))
        for s in marked:
            r = rewrites[s]
            sid, wid = by_smiles[s]
            if r == "!":
                rows.append([sid, wid, setting, s, "!", "", "", "", "", "", ""])
                continue
            got = reads[r]
            rd = config_text(got["rdkit"])
            js = config_text(got["rdkit-js"])
            ob = config_text(got["openbabel"])
            canon = []
            for name in ("rdkit", "rdkit-js", "openbabel"):
                a, b = canonical(reads[s][name]), canonical(got[name])
                canon.append("%s %s" % (a, "=" if a == b else b))
            rows.append([sid, wid, setting, s, r, rd, "=" if js == rd else js, "=" if ob == rd else ob] + canon)
        print("%s: %d writings flagged, %d rewritten" % (setting, len(marked),
                                                          sum(1 for s in marked if rewrites[s] != "!")), file=sys.stderr)
    path = os.path.join(HERE, "portable.tsv")
    with open(path, "w", encoding="utf-8") as f:
        f.write("# portable.tsv: Stereoline's portable rewrites of the survey's flagged writings, read by the survey's readers\n")
        f.write("# readers: RDKit %s (Debian python3-rdkit %s); @rdkit/rdkit %s (npm, under node %s); Open Babel %s (Debian python3-openbabel %s)\n"
                % (rdkit_version(), package_version("python3-rdkit"), npm_version(), node_version(),
                   readers.openbabel_version(), package_version("python3-openbabel")))
        f.write("# generator (from the repository root): /usr/bin/python3 testdata/survey/gen_portable.py (runs go run ./cmd/stereoline describe and transform)\n")
        f.write("# %d rows\n" % len(rows))
        f.write("# columns (tab separated):\n")
        for i, (name, doc) in enumerate(COLUMNS):
            f.write("#   %d. %s: %s\n" % (i + 1, name, doc))
        f.write("#" + "\t".join(n for n, _ in COLUMNS) + "\n")
        for r in rows:
            f.write("\t".join(r) + "\n")
    print("%d rows written to %s" % (len(rows), path), file=sys.stderr)


if __name__ == "__main__":
    main()

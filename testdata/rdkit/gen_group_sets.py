#!/usr/bin/python3
"""Generates group_sets.tsv: records with CXSMILES stereo groups and the sets
of absolute stereoisomers they stand for, by RDKit and by the npm package
@rdkit/rdkit.

For each of a sample of constitutions of cip_labels.tsv (the stereoisomers
of one NCI record, see gen_cip.py) the script builds records: stereoisomers
and their mirror images with random stereo groups (a, o<n>, &<n>) over
random subsets of their tetrahedral centres, and, on purpose, an isomer
with every centre in one and group, the same for its mirror image, the
isomer with no group, and both with every centre in one or group. Each
record is written by RDKit's CXSMILES writer (Chem.MolToCXSmiles) and
written again at random: rooted at a random atom (rootedAtAtom), or as a
seeded random writing whose block is composed here (gen_groups.py's
random_writing); a writing RDKit does not read back to the molecule
written is replaced by the canonical one.

Each record is expanded into what it stands for: for every choice of its
or and and groups (as the library reads them, GetStereoGroups), the
marks of the chosen groups inverted, the stereoisomer written as the
library's canonical isomeric SMILES without groups. One substance per
choice of the or groups, holding the stereoisomers of every choice of the
and groups; the record's set is the set of substances. The mirror set is
the expansion of the record with every mark inverted.

RDKit (Python) expands on the molecule (Atom.InvertChirality). The npm
package expands the same choices written as text (the '@' marks of the
chosen atoms swapped in the written string; the groups it reads are
compared with RDKit's first) and canonicalises each with get_smiles().

Usage: /usr/bin/python3 testdata/rdkit/gen_group_sets.py [out.tsv]
Environment: RDKIT_JS_DIR, the folder whose node_modules holds
@rdkit/rdkit (default ~/.cache/stereoline-npm);
without it the js columns are "-".
"""

import os
import random
import shutil
import subprocess
import sys

from rdkit import Chem

import fixturelib
import gen_groups

SEED = 20417
CONSTITUTIONS = 220  # sampled from cip_labels.tsv
RANDOM_RECORDS = 6  # random records per constitution, besides the five on purpose
JS_DIRS = [d for d in (os.environ.get("RDKIT_JS_DIR"), os.path.expanduser("~/.cache/stereoline-npm")) if d]

COLUMNS = [
    ("set", "the NCI identifier of the constitution (cip_labels.tsv group); records of one set share a constitution"),
    ("record", "0-based index of the record in its set, in the order a list would hold them"),
    ("how", "what the record was built as: and-all, and-all-mirror, absolute, or-all, or-all-mirror, random; "
     "with the writing after a slash: canonical, rooted<atom> or random"),
    ("cxsmiles", "the written record"),
    ("rdkit", "the set RDKit 2022.09.3 expands the record into: substances separated by ' ; ', each the sorted "
     "canonical isomeric SMILES of its stereoisomers separated by ' '; substances sorted"),
    ("rdkit_mirror", "the same for the record with every mark inverted (its mirror image)"),
    ("js", "the same by the npm package @rdkit/rdkit (get_smiles of each expanded writing); '-' when not run, "
     "'!groups' when it reads other groups than RDKit, '!' when it rejects a writing"),
    ("js_mirror", "the same for the mirror image"),
]


def parse(smiles):
    return gen_groups.parse(smiles)


def atom_marks(smiles):
    """For each atom in string order, the span of its '@' mark in the
    notation (or None): a small tokenizer of the organic subset, bracket
    atoms, bonds, branches and ring digits."""
    out = []
    i, n = 0, len(smiles)
    while i < n:
        c = smiles[i]
        if c == "[":
            j = smiles.index("]", i)
            at = smiles.find("@", i, j)
            if at >= 0:
                end = at + 1
                while end < j and smiles[end] == "@":
                    end += 1
                out.append((at, end))
            else:
                out.append(None)
            i = j + 1
        elif c in "BCNOPSFI" or c in "bcnops*":
            if smiles.startswith("Cl", i) or smiles.startswith("Br", i):
                i += 2
            else:
                i += 1
            out.append(None)
        elif c == "%":
            i += 3
        else:
            i += 1
    return out


def flipped_text(smiles, atoms):
    """The notation of smiles (the block dropped) with the '@' marks of the
    atoms swapped ('@' to '@@' and back)."""
    text = smiles.split(" ")[0]
    marks = atom_marks(text)
    edits = sorted((marks[a] for a in atoms if marks[a] is not None), reverse=True)
    for s, e in edits:
        old = text[s:e]
        new = "@@" if old == "@" else "@"
        text = text[:s] + new + text[e:]
    return text


def choices(groups):
    """Every choice of the or and and groups: (or bits, and bits, atoms to invert)."""
    ors = [atoms for kind, atoms in groups if kind == "or"]
    ands = [atoms for kind, atoms in groups if kind == "and"]
    for o in range(1 << len(ors)):
        for a in range(1 << len(ands)):
            inv = []
            for k, atoms in enumerate(ors):
                if o & (1 << k):
                    inv += atoms
            for k, atoms in enumerate(ands):
                if a & (1 << k):
                    inv += atoms
            yield o, a, inv


def rdkit_group_list(mol):
    return [(gen_groups.KINDS[g.GetGroupType()], [x.GetIdx() for x in g.GetAtoms()]) for g in mol.GetStereoGroups()]


def serialise(table):
    """table: {or bits: set of canonical SMILES} -> the set string."""
    subs = sorted(" ".join(sorted(isos)) for isos in table.values())
    return " ; ".join(sorted(set(subs)))


def rdkit_set(mol, mirror):
    """The set RDKit expands mol into (mirror: every mark inverted first)."""
    groups = rdkit_group_list(mol)
    table = {}
    for o, a, inv in choices(groups):
        rw = Chem.RWMol(mol)
        rw.SetStereoGroups([])
        flip = set(inv)
        if mirror:
            # every mark inverted, then the chosen groups: those twice
            flip = set(range(rw.GetNumAtoms())) ^ flip
        for x in rw.GetAtoms():
            if x.GetIdx() in flip:
                x.InvertChirality()
        table.setdefault(o, set()).add(Chem.MolToSmiles(rw))
    return serialise(table)


def js_writings(smiles, mol):
    """The texts the npm package canonicalises for a record: [(o, text)] for the
    record and for its mirror image."""
    groups = rdkit_group_list(mol)
    n = mol.GetNumAtoms()
    plain, mirrored = [], []
    for o, a, inv in choices(groups):
        plain.append((o, flipped_text(smiles, inv)))
        flip = set(range(n)) - set(inv)
        mirrored.append((o, flipped_text(smiles, sorted(flip))))
    return plain, mirrored


def js_dir():
    for d in JS_DIRS:
        if os.path.isdir(os.path.join(d, "node_modules", "@rdkit", "rdkit")):
            return os.path.join(d, "node_modules", "@rdkit", "rdkit")
    return None


def run_js(script, module, lines):
    proc = subprocess.run([shutil.which("node"), os.path.join(fixturelib.HERE, script), module],
                          input="\n".join(lines) + "\n", capture_output=True, text=True, check=True)
    out = proc.stdout.split("\n")
    return out[0], out[1:1 + len(lines)]


def build_record(rng, smiles, how):
    """The molecule of smiles with the groups how asks for, or None."""
    mol = parse(smiles)
    if mol is None:
        return None
    cs = gen_groups.centres(mol)
    if not cs:
        return None
    if how.startswith("and-all"):
        picks = [("and", cs)]
    elif how.startswith("or-all"):
        picks = [("or", cs)]
    elif how == "absolute":
        picks = []
    else:
        picks = gen_groups.random_groups(rng, cs)
    rw = Chem.RWMol(mol)
    rw.SetStereoGroups([Chem.rdchem.CreateStereoGroup(gen_groups.GROUP_TYPES[k], rw, atoms) for k, atoms in picks])
    return rw.GetMol()


def mirror_smiles(smiles):
    mol = parse(smiles)
    for x in mol.GetAtoms():
        x.InvertChirality()
    return Chem.MolToSmiles(mol)


def write(rng, mol, seed):
    """A writing of mol by RDKit's writer, written again at random."""
    canonical = Chem.MolToCXSmiles(mol)
    if rng.random() < 0.5:
        root = rng.randrange(mol.GetNumAtoms())
        try:
            s, variant = Chem.MolToCXSmiles(mol, rootedAtAtom=root), "rooted%d" % root
        except RuntimeError:
            s, variant = canonical, "canonical"
    else:
        s, variant = gen_groups.random_writing(rng, mol, seed), "random"
    if s is None or not gen_groups.faithful(s, mol):
        s, variant = canonical, "canonical"
    return s, variant


def constitutions(path, rng):
    """{NCI id: [canonical isomer SMILES with a tetrahedral centre]} sampled."""
    sets = {}
    order = []
    with open(path) as f:
        for line in f:
            if line.startswith("#"):
                continue
            cols = line.rstrip("\n").split("\t")
            if cols[2] != "canonical":
                continue
            m = parse(cols[3])
            if m is None or not gen_groups.centres(m):
                continue
            if cols[0] not in sets:
                sets[cols[0]] = []
                order.append(cols[0])
            sets[cols[0]].append(cols[3])
    rng.shuffle(order)
    return [(k, sets[k]) for k in order[:CONSTITUTIONS]]


def main():
    out_path = sys.argv[1] if len(sys.argv) > 1 else os.path.join(fixturelib.HERE, "group_sets.tsv")
    rng = random.Random(SEED)
    rows = []
    for ident, isomers in constitutions(os.path.join(fixturelib.HERE, "cip_labels.tsv"), rng):
        x = rng.choice(isomers)
        plan = [("and-all", x), ("and-all-mirror", mirror_smiles(x)), ("absolute", x), ("or-all", x),
                ("or-all-mirror", mirror_smiles(x))]
        for _ in range(RANDOM_RECORDS):
            iso = rng.choice(isomers)
            if rng.random() < 0.3:
                iso = mirror_smiles(iso)
            plan.append(("random", iso))
        rng.shuffle(plan)
        k = 0
        for how, smi in plan:
            mol = build_record(rng, smi, how)
            if mol is None:
                continue
            s, variant = write(rng, mol, SEED + len(rows))
            read = parse(s)
            rows.append({"set": ident, "record": str(k), "how": how + "/" + variant, "cxsmiles": s,
                         "rdkit": rdkit_set(read, False), "rdkit_mirror": rdkit_set(read, True),
                         "mol": read})
            k += 1
    module = js_dir() if shutil.which("node") else None
    version = None
    if module is not None:
        version, js_groups = run_js("read_groups.js", module, [r["cxsmiles"] for r in rows])
        texts = []
        for r in rows:
            plain, mirrored = js_writings(r["cxsmiles"], r["mol"])
            r["plain"], r["mirrored"] = plain, mirrored
            texts += [t for _, t in plain] + [t for _, t in mirrored]
        _, canon = run_js("canon_smiles.js", module, texts)
        it = iter(canon)
        for r, jg in zip(rows, js_groups):
            theirs = sorted(jg.split())
            ours = sorted("%s:%s" % (kind, ",".join(map(str, atoms))) for kind, atoms in rdkit_group_list(r["mol"]))
            for side in ("plain", "mirrored"):
                table, bad = {}, False
                for o, _ in r[side]:
                    c = next(it)
                    if c == "!":
                        bad = True
                    table.setdefault(o, set()).add(c)
                key = "js" if side == "plain" else "js_mirror"
                r[key] = "!groups" if theirs != ours else ("!" if bad else serialise(table))
    for r in rows:
        r.setdefault("js", "-")
        r.setdefault("js_mirror", "-")
    with open(out_path, "w") as out:
        fixturelib.header(
            out,
            "group_sets.tsv: records with CXSMILES stereo groups and the sets of stereoisomers they stand for",
            "constitutions of testdata/rdkit/cip_labels.tsv (its canonical rows with a tetrahedral centre), "
            "%d sampled by random.Random(%d); records built and written as gen_group_sets.py says" % (CONSTITUTIONS, SEED),
            COLUMNS,
            notes=["npm package @rdkit/rdkit %s (Node.js %s)" % (
                version or "not run",
                subprocess.run(["node", "--version"], capture_output=True, text=True).stdout.strip()
                if shutil.which("node") else "absent"),
                "%d records over %d constitutions" % (len(rows), len({r["set"] for r in rows}))],
        )
        for r in rows:
            out.write("\t".join(r[c] for c, _ in COLUMNS) + "\n")
    print("%d records" % len(rows), file=sys.stderr)


if __name__ == "__main__":
    main()

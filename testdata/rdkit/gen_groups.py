#!/usr/bin/python3
"""Generates groups.tsv: CXSMILES extension blocks and the stereo groups RDKit reads from them.

Stereoisomers come from cip_labels.tsv (the canonical rows: isomers of NCI
records, see gen_cip.py) and from fresh NCI records of
/usr/share/RDKit/Data/NCI/first_5K.smi (EnumerateStereoisomers). Each
isomer with at least one marked tetrahedral centre gets random stereo
groups over a random subset of its centres (one absolute group a at most,
or-groups and and-groups), and one of four sets of further fields:
nothing, 2D coordinates (Compute2DCoords), other fields that RDKit writes
(atom labels, atom values, atom properties, radicals, data and polymer
S-groups, read into the molecule from a block written here and written
back by RDKit), or both.

Each molecule is written by RDKit's CXSMILES writer: canonically
(Chem.MolToCXSmiles) and rooted at two random atoms (rootedAtAtom), and
once as a random writing (Chem.MolToRandomSmilesVect, seeded) whose block
is composed here with the group atoms, coordinates and labels mapped
through the new atom order (Chem.MolToCXSmiles cannot write a random
writing reproducibly in this version, and Chem.RenumberAtoms fails on
molecules with stereo groups). Reaction rows join two isomers as
reactant>>product with one block whose indices run over both.

Every row records the stereo groups RDKit reads from the string
(GetStereoGroups: kind and atoms, with atom indices in string order) and,
when Node.js and the npm package @rdkit/rdkit are available, the groups
that package reads (get_mol(...).get_json(), "stereoGroups"). A writing
that RDKit does not read back to the molecule it was written from
(canonical CXSMILES compared) is dropped and counted in the header.

Usage: /usr/bin/python3 testdata/rdkit/gen_groups.py [first_5K.smi] [out.tsv]
Environment: RDKIT_JS_DIR, the folder whose node_modules holds
@rdkit/rdkit (default ~/.cache/stereoline-npm); without it the js column is "-".
"""

import json
import os
import random
import shutil
import subprocess
import sys

from rdkit import Chem
from rdkit.Chem import AllChem
from rdkit.Chem.EnumerateStereoisomers import EnumerateStereoisomers, StereoEnumerationOptions

import fixturelib

SEED = 20316
FROM_CIP = 400  # isomers taken from cip_labels.tsv
FROM_NCI = 250  # fresh NCI records
REACTIONS = 120
JS_DIR = os.environ.get("RDKIT_JS_DIR", os.path.expanduser("~/.cache/stereoline-npm"))

KINDS = {
    Chem.StereoGroupType.STEREO_ABSOLUTE: "abs",
    Chem.StereoGroupType.STEREO_OR: "or",
    Chem.StereoGroupType.STEREO_AND: "and",
}

COLUMNS = [
    ("molecule", "identifier of the isomer: cip:<line of cip_labels.tsv> or nci:<NCI identifier>:<isomer>, "
     "rxn:<n> for reactions"),
    ("variant", "canonical (Chem.MolToCXSmiles), rooted<atom> (Chem.MolToCXSmiles(rootedAtAtom=atom)), "
     "random (Chem.MolToRandomSmilesVect, block composed by this script) or reaction"),
    ("fields", "what the block holds besides stereo groups: groups, coords, other, coords+other"),
    ("cxsmiles", "the written string"),
    ("rdkit", "the groups RDKit 2022.09.3 reads (Chem.MolFromSmiles with SmilesParserParams(removeHs=False); "
     "reactions AllChem.ReactionFromSmarts(useSmiles=True) with template atoms numbered through the record): "
     "space-separated <kind>:<atom>,<atom>... with kind abs, or, and, in GetStereoGroups order; empty when none"),
    ("js", "the groups the npm package @rdkit/rdkit reads (get_mol with removeHs false, get_json stereoGroups), "
     "same format; '-' when the package was not run for the row (reactions, or no Node.js)"),
]


def parse(smiles):
    params = Chem.SmilesParserParams()
    params.removeHs = False
    return Chem.MolFromSmiles(smiles, params)


def groups_text(groups, offset=0):
    out = []
    for g in groups:
        atoms = [a.GetIdx() + offset for a in g.GetAtoms()]
        out.append("%s:%s" % (KINDS[g.GetGroupType()], ",".join(map(str, atoms))))
    return out


def rdkit_groups(smiles):
    mol = parse(smiles)
    if mol is None:
        return None
    return " ".join(groups_text(mol.GetStereoGroups()))


def rdkit_reaction_groups(smiles):
    try:
        rxn = AllChem.ReactionFromSmarts(smiles, useSmiles=True)
    except Exception:
        return None
    out, offset = [], 0
    for tpl in list(rxn.GetReactants()) + list(rxn.GetAgents()) + list(rxn.GetProducts()):
        out += groups_text(tpl.GetStereoGroups(), offset)
        offset += tpl.GetNumAtoms()
    return " ".join(out)


def centres(mol):
    tags = (Chem.ChiralType.CHI_TETRAHEDRAL_CW, Chem.ChiralType.CHI_TETRAHEDRAL_CCW)
    return [a.GetIdx() for a in mol.GetAtoms() if a.GetChiralTag() in tags]


def random_groups(rng, cs):
    """A random partition of a random subset of the centres cs: [(kind, atoms)]."""
    chosen = rng.sample(cs, rng.randint(1, len(cs)))
    parts = rng.randint(1, min(3, len(chosen)))
    bins = [[] for _ in range(parts)]
    for i, a in enumerate(chosen):
        bins[i if i < parts else rng.randrange(parts)].append(a)
    out, absolute = [], False
    for b in bins:
        kind = rng.choice(["abs", "or", "and", "or", "and"])
        if kind == "abs":
            if absolute:
                kind = "or"
            absolute = True
        out.append((kind, sorted(b)))
    return out


GROUP_TYPES = {"abs": Chem.StereoGroupType.STEREO_ABSOLUTE, "or": Chem.StereoGroupType.STEREO_OR,
               "and": Chem.StereoGroupType.STEREO_AND}


def other_fields(rng, mol, cs):
    """A block of fields other than groups for mol (atom indices in its order), which RDKit reads."""
    n = mol.GetNumAtoms()
    fields = []
    labels = [""] * n
    for a in rng.sample(range(n), min(n, rng.randint(1, 2))):
        labels[a] = "lbl%d" % a
    fields.append("$" + ";".join(labels) + "$")
    values = [""] * n
    values[rng.randrange(n)] = "%d.5" % rng.randint(1, 99)
    fields.append("$_AV:" + ";".join(values) + "$")
    a = rng.randrange(n)
    fields.append("atomProp:%d.tag.p%d" % (a, rng.randint(1, 999)))
    # a radical on a carbon with hydrogens that is not a centre
    hs = [x.GetIdx() for x in mol.GetAtoms()
          if x.GetSymbol() == "C" and x.GetTotalNumHs() > 0 and x.GetIdx() not in cs and not x.GetIsAromatic()]
    if hs and rng.random() < 0.5:
        fields.append("^1:%d" % rng.choice(hs))
    fields.append("SgD:%d:note:LRK-%03d::::" % (rng.randrange(n), rng.randint(1, 999)))
    return ",".join(fields)


def build(rng, smiles, with_coords, with_other):
    """The molecule of smiles with random groups and the chosen fields, or None."""
    mol = parse(smiles)
    if mol is None:
        return None
    cs = centres(mol)
    if not cs:
        return None
    if with_other:
        mol = parse(smiles + " |" + other_fields(rng, mol, cs) + "|")
        if mol is None:
            return None
        cs = centres(mol)
        if not cs:
            return None
    rw = Chem.RWMol(mol)
    groups = [Chem.rdchem.CreateStereoGroup(GROUP_TYPES[k], rw, atoms) for k, atoms in random_groups(rng, cs)]
    rw.SetStereoGroups(groups)
    mol = rw.GetMol()
    if with_coords:
        AllChem.Compute2DCoords(mol)
    return mol


def canonical(mol):
    return Chem.MolToCXSmiles(mol)


def random_writing(rng, mol, seed):
    """A seeded random writing with a block composed here: groups, and
    coordinates when the molecule has them. Other fields are not composed."""
    plain = Chem.Mol(mol)
    r = Chem.MolToRandomSmilesVect(plain, 1, randomSeed=seed)[0]
    rm = parse(r)
    if rm is None:
        return None
    match = rm.GetSubstructMatch(mol, useChirality=True)
    if len(match) != mol.GetNumAtoms():
        return None
    fields = []
    if mol.GetNumConformers():
        pos = mol.GetConformer().GetPositions()
        inv = [0] * len(match)
        for old, new in enumerate(match):
            inv[new] = old
        fields.append("(" + ";".join("%g,%g," % (pos[o][0], pos[o][1]) for o in inv) + ")")
    ors = ands = 0
    for g in mol.GetStereoGroups():
        atoms = sorted(match[a.GetIdx()] for a in g.GetAtoms())
        t = g.GetGroupType()
        if t == Chem.StereoGroupType.STEREO_ABSOLUTE:
            tag = "a"
        elif t == Chem.StereoGroupType.STEREO_OR:
            ors += 1
            tag = "o%d" % ors
        else:
            ands += 1
            tag = "&%d" % ands
        fields.append(tag + ":" + ",".join(map(str, atoms)))
    return r + " |" + ",".join(fields) + "|"


def group_sets(mol, mapping=None):
    out = set()
    for g in mol.GetStereoGroups():
        atoms = [a.GetIdx() for a in g.GetAtoms()]
        if mapping is not None:
            atoms = [mapping[a] for a in atoms]
        out.add((KINDS[g.GetGroupType()], tuple(sorted(atoms))))
    return out


def faithful(written, source):
    """Whether RDKit reads written back as the molecule source: the same
    canonical isomeric SMILES, and the same groups under some mapping of
    the atoms that keeps the marks (the canonical writer breaks ties
    between symmetric atoms without regard to groups, coordinates or
    labels, so those may move between equivalent atoms)."""
    mol = parse(written)
    if mol is None or Chem.MolToSmiles(mol) != Chem.MolToSmiles(source):
        return False
    for match in mol.GetSubstructMatches(source, useChirality=True, uniquify=False, maxMatches=1000):
        if group_sets(source, match) == group_sets(mol):
            return True
    return False


def cip_isomers(path):
    """(identifier, smiles) of the canonical rows of cip_labels.tsv."""
    with open(path) as f:
        for lineno, line in enumerate(f, 1):
            if line.startswith("#"):
                continue
            cols = line.rstrip("\n").split("\t")
            if cols[2] == "canonical":
                yield "cip:%d" % lineno, cols[3]


def nci_isomers(path, rng):
    """(identifier, smiles) of stereoisomers of NCI records with potential stereo."""
    opts = StereoEnumerationOptions(unique=True, maxIsomers=2, onlyUnassigned=False)
    recs = []
    for smiles, ident in fixturelib.read_smi(path):
        mol = Chem.MolFromSmiles(smiles)
        if mol is not None and len(Chem.FindPotentialStereo(mol)) > 0:
            recs.append((ident, mol))
    # records whose isomers are not already in cip_labels.tsv come first
    rng.shuffle(recs)
    for ident, mol in recs:
        for k, iso in enumerate(EnumerateStereoisomers(mol, options=opts)):
            yield "nci:%s:%d" % (ident, k), Chem.MolToSmiles(iso)


def js_groups(strings):
    """Groups read by the npm package, one entry per string; None when not run."""
    node = shutil.which("node")
    module = os.path.join(JS_DIR, "node_modules", "@rdkit", "rdkit")
    if node is None or not os.path.isdir(module):
        return None, None
    script = os.path.join(fixturelib.HERE, "read_groups.js")
    proc = subprocess.run([node, script, module], input="\n".join(strings) + "\n",
                          capture_output=True, text=True, check=True)
    lines = proc.stdout.split("\n")
    version = lines[0]
    return version, lines[1:1 + len(strings)]


def main():
    nci = sys.argv[1] if len(sys.argv) > 1 else fixturelib.NCI_DEFAULT
    out_path = sys.argv[2] if len(sys.argv) > 2 else os.path.join(fixturelib.HERE, "groups.tsv")
    rng = random.Random(SEED)
    cip = list(cip_isomers(os.path.join(fixturelib.HERE, "cip_labels.tsv")))
    rng.shuffle(cip)
    sources = []
    for ident, smi in cip:
        if len(sources) >= FROM_CIP:
            break
        if centres(parse(smi) or Chem.Mol()):
            sources.append((ident, smi))
    taken = 0
    for ident, smi in nci_isomers(nci, rng):
        if taken >= FROM_NCI:
            break
        m = parse(smi)
        if m is not None and centres(m):
            sources.append((ident, smi))
            taken += 1
    rows, dropped, failed, built = [], 0, 0, []
    for i, (ident, smi) in enumerate(sources):
        with_coords, with_other = i % 4 in (1, 3), i % 4 in (2, 3)
        fields = ["groups", "coords", "other", "coords+other"][i % 4]
        mol = build(rng, smi, with_coords, with_other)
        if mol is None:
            continue
        key = canonical(mol)
        built.append((ident, mol))
        writings = [("canonical", key)]
        for root in rng.sample(range(mol.GetNumAtoms()), min(2, mol.GetNumAtoms())):
            try:
                writings.append(("rooted%d" % root, Chem.MolToCXSmiles(mol, rootedAtAtom=root)))
            except RuntimeError:
                # this version's writer fails on some rooted writings
                # (a range error in ROMol); counted with the dropped
                failed += 1
        if not with_other:
            r = random_writing(rng, mol, SEED + i)
            if r is not None:
                writings.append(("random", r))
        for variant, s in writings:
            if not faithful(s, mol):
                dropped += 1
                continue
            rows.append([ident, variant, fields, s, rdkit_groups(s)])
    reactions = 0
    for k in range(REACTIONS):
        (_, a), (_, b) = rng.sample(built, 2)
        sa, sb = Chem.MolToSmiles(a), Chem.MolToSmiles(b)
        ma, mb = parse(sa), parse(sb)
        off = ma.GetNumAtoms()
        cs = [(x, 0) for x in centres(ma)] + [(x, off) for x in centres(mb)]
        picks = random_groups(rng, [x + o for x, o in cs])
        fields, ors, ands = [], 0, 0
        for kind, atoms in picks:
            if kind == "abs":
                tag = "a"
            elif kind == "or":
                ors += 1
                tag = "o%d" % ors
            else:
                ands += 1
                tag = "&%d" % ands
            fields.append(tag + ":" + ",".join(map(str, atoms)))
        s = sa + ">>" + sb + " |" + ",".join(fields) + "|"
        g = rdkit_reaction_groups(s)
        if g is None:
            dropped += 1
            continue
        rows.append(["rxn:%d" % k, "reaction", "groups", s, g])
        reactions += 1
    version, js = js_groups([r[3] for r in rows if r[1] != "reaction"])
    it = iter(js or [])
    for r in rows:
        r.append("-" if js is None or r[1] == "reaction" else next(it))
    molecules = len({r[0] for r in rows})
    with open(out_path, "w") as out:
        fixturelib.header(
            out,
            "groups.tsv: CXSMILES stereo groups as RDKit reads them, over RDKit-written extension blocks",
            "stereoisomers from testdata/rdkit/cip_labels.tsv (canonical rows) and "
            "/usr/share/RDKit/Data/NCI/first_5K.smi (Debian package rdkit-data, EnumerateStereoisomers "
            "maxIsomers=2); random.Random(%d)" % SEED,
            COLUMNS,
            notes=[
                "npm package @rdkit/rdkit %s (Node.js %s)" % (
                    version or "not run", subprocess.run(["node", "--version"], capture_output=True, text=True).stdout.strip()
                    if shutil.which("node") else "absent"),
                "%d rows over %d molecules and reactions (%d reaction rows); %d writings dropped because "
                "RDKit did not read them back to the molecule written, %d rooted writings that RDKit's writer "
                "failed on (a range error)" % (len(rows), molecules, reactions, dropped, failed),
            ],
        )
        for r in rows:
            out.write("\t".join(r) + "\n")
    print("%d rows, %d dropped" % (len(rows), dropped), file=sys.stderr)


if __name__ == "__main__":
    main()

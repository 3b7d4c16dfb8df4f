#!/usr/bin/python3
"""Generates survey.tsv and constructs.tsv: how general-purpose libraries read
stereo marks written in many ways.

Each structure (a stereoisomer of testdata/rdkit/cip_labels.tsv, a compound
of the CIP validation suite, a randomly marked record of
testdata/rdkit/perception.tsv, or a targeted case below) is written many
ways: by RDKit's writer (canonical, on randomly renumbered atoms, rooted at
each stereocentre, with all hydrogens as atoms) and by this directory's
writer (writer.py: chosen first atom, lone-pair convention, ring-digit and
mark placement, [H] atoms). Every writing is read by RDKit 2022.09.3
(python3-rdkit), by the npm package @rdkit/rdkit (through read_rdkitjs.js
and node) and by Open Babel (python3-openbabel): canonical isomeric SMILES,
CIP labels and the configuration read. Every difference, between readers
or between a reader and the writer's intent, is classified by the construct
of constructs.py that accounts for it; the run fails if one is left
unexplained.

Usage (from the repository root):
    /usr/bin/python3 testdata/survey/gen_survey.py
Needs node and @rdkit/rdkit installed in RDKIT_JS_DIR (default
/work/coord/npm-survey: npm install --prefix DIR @rdkit/rdkit).
"""

import collections
import json
import os
import random
import subprocess
import sys

from rdkit import Chem

HERE = os.path.dirname(os.path.abspath(__file__))
sys.path.insert(0, HERE)
sys.path.insert(0, os.path.join(HERE, "..", "rdkit"))

import constructs as K  # noqa: E402
import fixturelib  # noqa: E402
import readers  # noqa: E402
import writer as W  # noqa: E402
from layout import Layout  # noqa: E402

SEED = 20317
REPO = os.path.dirname(os.path.dirname(HERE))
CIP = os.path.join(REPO, "testdata", "rdkit", "cip_labels.tsv")
PERCEPTION = os.path.join(REPO, "testdata", "rdkit", "perception.tsv")
SUITE = os.path.join("..", "shared", "reference", "cip-validation-suite", "compounds.smi")

RDKIT_RANDOM = 4  # RDKit doRandom writings per NCI isomer
SURVEY_RANDOM = 1  # writer.py writings with random options per NCI isomer


class Writing:
    def __init__(self, sid, wid, writer, smiles, intended=None, rules=None):
        self.sid, self.wid, self.writer, self.smiles = sid, wid, writer, smiles
        self.intended = intended  # configuration key dict, writing numbering
        self.writer_rules = rules  # the rules the writer wrote under, or None
        self.found = {}
        self.classes = {}


def rdkit_writer_rules():
    return dict(K.READER_RULES[K.RDKIT])


def survey_writer_rules(opt):
    return K.writer_rules(opt.lone_pair, opt.ring_marks)


def describe(opt):
    parts = ["lone-pair=" + opt.lone_pair, "ring-marks=" + opt.ring_marks]
    if opt.digits_after_branches:
        parts.append("digits-after-branches")
    if opt.kekule:
        parts.append("kekule")
    if opt.h_as_atom:
        parts.append("h-atoms=" + "+".join(str(a) for a in sorted(opt.h_as_atom)))
    if opt.marks == "all":
        parts.append("all-marks")
    if opt.mark_aromatic:
        parts.append("aromatic-marks")
    return "survey(" + ",".join(parts) + ")"


# --- writings of one structure -------------------------------------------

def rdkit_intended(smiles):
    mol = readers.rdkit_parse(smiles)
    if mol is None:
        return None
    return readers.rdkit_config(mol, amap_of(smiles))


def amap_of(smiles):
    """Each atom of the writing keeps its number; plain [H] atoms become H."""
    lay = Layout(smiles)
    return [readers.H if a.is_hydrogen else a.index for a in lay.atoms]


def rdkit_writings(sid, mol, rng, count, rooted=True, with_h=True):
    out = []
    wr = rdkit_writer_rules()
    n = mol.GetNumAtoms()
    seen = set()

    def add(wid, s):
        if s in seen:
            return
        seen.add(s)
        out.append(Writing(sid, wid, "rdkit", s, rdkit_intended(s), wr))

    add("canonical", Chem.MolToSmiles(mol))
    # RDKit's own random writer (doRandom), seeded
    for k, s in enumerate(Chem.MolToRandomSmilesVect(mol, count, randomSeed=rng.randrange(1 << 30))):
        add("rdkit-random-%d" % (k + 1), s)
    if rooted:
        centres = [a.GetIdx() for a in mol.GetAtoms()
                   if a.GetChiralTag() != Chem.ChiralType.CHI_UNSPECIFIED]
        for c in centres[:1]:
            # RDKit's non-canonical writer starts at atom 0 (rootedAtAtom
            # with canonical=False raised range errors in this version)
            rest = [i for i in range(n) if i != c]
            rng.shuffle(rest)
            add("rdkit-root-%d" % c, Chem.MolToSmiles(Chem.RenumberAtoms(mol, [c] + rest), canonical=False))
    if with_h and n < 40:
        hmol = Chem.AddHs(mol)
        for s in Chem.MolToRandomSmilesVect(hmol, 1, randomSeed=rng.randrange(1 << 30)):
            add("rdkit-h", s)
    return out


def survey_writing(sid, wid, mol, config, opt):
    try:
        s, order, wmol = W.write(mol, config, opt)
    except W.WriteError:
        return None
    intended = W.transport(config, wmol, order)
    return Writing(sid, wid, describe(opt), s, intended, survey_writer_rules(opt))


def random_options(mol, config, rng):
    centres = [int(el[1:]) for el in config if el.startswith("a")]
    n = mol.GetNumAtoms()
    root = rng.choice(centres) if centres and rng.random() < 0.5 else rng.randrange(n)
    one_h = [c for c in centres if mol.GetAtomWithIdx(c).GetTotalNumHs() == 1]
    return W.Options(
        root=root, seed=rng.randrange(1 << 30),
        lone_pair=rng.choice(["implicit", "last"]),
        marks=rng.choice(["one", "one", "all"]),
        ring_marks=rng.choice(["open", "close", "both", "both-same"]),
        prefer_ring_marks=rng.random() < 0.5,
        digits_after_branches=rng.random() < 0.15,
        kekule=rng.random() < 0.2,
        h_as_atom=[c for c in one_h if rng.random() < 0.3],
        mark_aromatic=rng.random() < 0.2)


def survey_writings(sid, mol, rng, count):
    config, _ = W.intended_config(mol)
    out = []
    seen = set()
    tries = 0
    while len(out) < count and tries < 4 * count:
        tries += 1
        opt = random_options(mol, config, rng)
        w = survey_writing(sid, "survey-%d" % (len(out) + 1), mol, config, opt)
        if w and w.smiles not in seen:
            seen.add(w.smiles)
            out.append(w)
    return out


# --- sources -------------------------------------------------------------

def nci_structures():
    for line in open(CIP):
        if line.startswith("#"):
            continue
        group, isomer, variant, smiles = line.rstrip("\n").split("\t")[:4]
        if variant == "canonical":
            yield "nci-%s/%s" % (group, isomer), smiles


def suite_structures():
    path = os.path.join(REPO, SUITE)
    if not os.path.exists(path):
        sys.exit("CIP validation suite not found at %s" % path)
    for smiles, ident in fixturelib.read_smi(path):
        yield "suite-" + ident, smiles


def perception_structures():
    for line in open(PERCEPTION):
        if line.startswith("#"):
            continue
        cols = line.rstrip("\n").split("\t")
        if cols[0] == "marked":
            yield "marked-" + cols[1], cols[2]


# Targeted cases: real compounds, each written every way the writer can
# start it, with the options that make each construct.
CASES = [
    ("methyl-phenyl-sulfoxide", "C[S@](=O)c1ccccc1"),
    ("methyl-p-tolyl-sulfoxide", "Cc1ccc([S@@](C)=O)cc1"),
    ("sulfoxide-charge-separated", "C[S@+]([O-])c1ccccc1"),
    ("tert-butanesulfinamide", "CC(C)(C)[S@@](N)=O"),
    ("menthyl-sulfinate", "CC(C)[C@@H]1CC[C@@H](C)C[C@H]1O[S@@](=O)c1ccc(C)cc1"),
    ("methylphenylpropylphosphine", "CCC[P@](C)c1ccccc1"),
    ("methyl-phenyl-selenoxide", "C[Se@](=O)c1ccccc1"),
    ("sulfonium", "CC[S@+](C)c1ccccc1"),
    ("aziridine-n", "C[N@]1C[C@H]1C"),
    ("troger-base", "Cc1ccc2c(c1)C[N@]1Cc3cc(C)ccc3N(C2)C1"),
    ("bromochlorofluoromethane", "F[C@H](Cl)Br"),
    ("alanine", "C[C@H](N)C(=O)O"),
    ("lactic-acid", "C[C@@H](O)C(=O)O"),
    ("2-methylcyclohexanone", "C[C@@H]1CCCCC1=O"),
    ("menthol", "CC(C)[C@@H]1CC[C@@H](C)C[C@H]1O"),
    ("1-methylcyclohexene-oxide", "C[C@@]12CCCC[C@H]1O2"),
    ("proline", "OC(=O)[C@@H]1CCCN1"),
    ("cyclooctene-e", "C1CCC/C=C/CC1"),
    ("cyclooctene-z", "C1CCC/C=C\\CC1"),
    ("cyclodecene-e", "C1CCCC/C=C/CCC1"),
    ("cyclododecene-e", "C1CCCCC/C=C/CCCC1"),
    ("2-butene-e", "C/C=C/C"),
    ("hexa-2,4-diene-ee", "C/C=C/C=C/C"),
    ("hexa-2,4-diene-ez", "C/C=C/C=C\\C"),
    ("retinal-like", "CC1=C(/C=C/C(C)=C/C=C/C(C)=C/C=O)C(C)(C)CCC1"),
    ("cinnamic-acid-e", "OC(=O)/C=C/c1ccccc1"),
    ("stilbene-z", "c1ccc(/C=C\\c2ccccc2)cc1"),
    ("benzaldoxime-e", "O/N=C/c1ccccc1"),
    ("4-methylene-cyclohexyl", "C/C=C1/CC[C@H](C)CC1"),
    ("quinone-methide", "C/C=C1/C=CC(=O)C=C1C"),
    ("1,3-dimethylallene", "C/C=C=C/C"),
    ("penta-2,3-diene", "CC=[C@]=CC"),
    ("penta-2,3-diene-other", "CC=[C@@]=CC"),
    ("allene-acid", "OC(=O)C=[C@@]=CC(=O)O"),
    ("ch2-mark", "C[C@H2]CO"),
    ("ch2-mark-ring", "C1C[C@H2]CC1"),
]


# Writings the writer cannot make (it writes what RDKit keeps), given as
# they stand; each is read as written.
GIVEN = [
    ("given-first-atom-lone-pair", ["[S@](=O)(C)c1ccccc1", "[S@@](=O)(C)c1ccccc1",
                                    "C.[S@](=O)(C)c1ccccc1", "[S@+]([O-])(C)c1ccccc1",
                                    "[S@@](N)(=O)C(C)(C)C", "[Se@](=O)(C)c1ccccc1",
                                    "[P@](C)(CCC)c1ccccc1", "[N@]1(C)C[C@H]1C",
                                    "[S@]1(=O)CCC[C@H]1C", "[S@+]1(C)CCC[C@H]1C"]),
    ("given-two-hydrogens", ["C[C@H2]CO", "OC[C@@H2]C", "[C@H2](C)CO", "C1C[C@H2]CC1",
                             "C[C@@H2]F"]),
    ("given-allene", ["CC=[C@]=CC", "CC=[C@@]=CC", "C(C)=[C@]=CC", "OC(=O)C=[C@]=CC(O)=O",
                      "CC=[C@]=C(C)Br", "[H]C(C)=[C@@]=C(C)[H]"]),
    ("given-ring-digit-after-branch", ["F[C@@](Cl)1CCCC1C", "F[C@](Cl)1CCCC1C",
                                       "F[C@@]1(Cl)CCCC1C", "C[C@H](O)1.C1"]),
    ("given-ring-mark-both-same", ["C/1=C/CCCCCCCC/1", "C\\1=C/CCCCCCCC\\1", "C/1CCCCCCC/C=C/1",
                                   "C/1=C/CCCCCCCC\\1", "C/1CCCCCCC/C=C\\1", "F/C=C/1CCCCCCCC/1"]),
]


def case_writings(sid, smiles):
    """Every root; for each root, the lone-pair conventions, ring-mark
    placements, digits after branches and [H] atoms at each centre."""
    mol = Chem.MolFromSmiles(smiles)
    if mol is None:
        return []
    config, _ = W.intended_config(readers.rdkit_parse(smiles))
    out = [Writing(sid, "given", "given", smiles, None, None)]
    out += rdkit_writings(sid, mol, random.Random(sid), 2)
    centres = [int(el[1:]) for el in config if el.startswith("a")]
    one_h = [c for c in centres if mol.GetAtomWithIdx(c).GetTotalNumHs() == 1]
    seen = {w.smiles for w in out}
    k = 0
    variants = []
    for root in range(mol.GetNumAtoms()):
        for lp in ("implicit", "last"):
            for rm in ("open", "close", "both", "both-same"):
                variants.append(dict(root=root, lone_pair=lp, ring_marks=rm, prefer_ring_marks=True,
                                     shuffle=False))
        variants.append(dict(root=root, digits_after_branches=True, shuffle=False))
        variants.append(dict(root=root, marks="all", shuffle=False))
        variants.append(dict(root=root, mark_aromatic=True, shuffle=False))
        for seed in range(2):
            variants.append(dict(root=root, seed=seed, h_as_atom=one_h))
    for v in variants:
        opt = W.Options(**v)
        w = survey_writing(sid, "w%d" % k, mol, config, opt)
        if w and w.smiles not in seen:
            seen.add(w.smiles)
            out.append(w)
            k += 1
    return out


def all_writings():
    rng = random.Random(SEED)
    writings = []
    for sid, smiles in nci_structures():
        mol = Chem.MolFromSmiles(smiles)
        writings += rdkit_writings(sid, mol, rng, RDKIT_RANDOM)
        writings += survey_writings(sid, readers.rdkit_parse(smiles), rng, SURVEY_RANDOM)
    for sid, smiles in suite_structures():
        mol = Chem.MolFromSmiles(smiles)
        writings.append(Writing(sid, "given", "given", smiles, None, None))
        if mol is None:
            continue
        writings += rdkit_writings(sid, mol, rng, 6)
        writings += survey_writings(sid, readers.rdkit_parse(smiles), rng, 3)
    for sid, smiles in perception_structures():
        mol = Chem.MolFromSmiles(smiles)
        writings.append(Writing(sid, "given", "given", smiles, None, None))
        if mol is None:
            continue
        writings += rdkit_writings(sid, mol, rng, 2, rooted=False, with_h=False)
    for name, smiles in CASES:
        writings += case_writings("case-" + name, smiles)
    for name, given in GIVEN:
        for k, s in enumerate(given):
            writings.append(Writing("%s-%d" % (name, k + 1), "given", "given", s, None, None))
    return writings


# --- reading and classifying -----------------------------------------------

def read_all(writings):
    reqs = [("%d" % i, w.smiles, amap_of(w.smiles)) for i, w in enumerate(writings)]
    js, js_version = readers.rdkitjs_read_all(reqs)
    results = []
    for i, w in enumerate(writings):
        amap = reqs[i][2]
        mol = readers.rdkit_parse(w.smiles)
        rd = readers.rdkit_read(w.smiles, amap)
        ob = readers.openbabel_read(w.smiles, amap)
        j = js["%d" % i]
        if j.ok and mol is not None:
            readers.rdkitjs_bonds(j, mol, amap)
        if ob.ok and mol is not None:
            ob.labels = sorted(readers.label_with_config(mol, amap, ob.config), key=readers.label_order)
        results.append({K.RDKIT: rd, K.RDKIT_JS: j, K.OPENBABEL: ob})
    return results, js_version


def classify(w, res):
    """Compares every reader's configuration of every element of writing w
    with the reference interpreter under that reader's rules. Returns
    (classes, unexplained): classes maps each element where readers (or
    the writer's intent) differ to the constructs and perception kinds
    that account for it."""
    lay = Layout(w.smiles)
    found = K.find(lay)
    w.found = found
    elements = set(found)
    for r in res.values():
        elements |= set(r.config)
    if w.intended:
        elements |= set(w.intended)
    mol = None
    classes, unexplained = {}, []
    for el in sorted(elements, key=element_order):
        names = found.get(el, [])
        why = set()
        values = {}
        for name, r in res.items():
            obs = r.config.get(el) if r.ok else "reject"
            values[name] = obs
            pred = K.interpret(lay, el, K.READER_RULES[name])
            if obs == pred:
                continue
            if obs is None or obs == "reject":
                if mol is None:
                    mol = readers.rdkit_parse(w.smiles)
                for k in K.perception_kinds(mol, el) if obs is None else ["rejected"]:
                    why.add("%s:%s" % ("perception" if obs is None else "reject", k))
                continue
            unexplained.append("%s %s %s: %s read %s, interpreter %s (constructs %s)" % (
                w.sid, w.smiles, el, name, obs, pred, ",".join(names) or "none"))
        if w.writer_rules is not None and w.intended is not None and el in w.intended:
            pred = K.interpret(lay, el, w.writer_rules)
            if pred != w.intended[el]:
                unexplained.append("%s %s %s: writer meant %s, interpreter %s under %s" % (
                    w.sid, w.smiles, el, w.intended[el], pred, w.writer))
        # readers (and the writer) whose values differ although each read
        # as the interpreter predicts: the rules they differ on say why
        rules = dict(K.READER_RULES)
        agreeing = {n: v for n, v in values.items()
                    if v == K.interpret(lay, el, rules[n])}
        if w.writer_rules is not None and w.intended is not None and el in w.intended:
            rules["writer"] = w.writer_rules
            agreeing["writer"] = w.intended[el]
        keys = list(agreeing)
        for i, a in enumerate(keys):
            for b in keys[i + 1:]:
                if agreeing[a] != agreeing[b]:
                    why |= set(K.causes(lay, el, names, rules[a], rules[b]))
        if why or len(set(values.values())) > 1:
            classes[el] = sorted(why) or ["?"]
            if not why:
                unexplained.append("%s %s %s: readers differ %s without a cause" % (
                    w.sid, w.smiles, el, values))
    return classes, unexplained


def element_order(el):
    if el.startswith("a"):
        return (int(el[1:]), 0)
    x, y = el[1:].split("-")
    return (int(x), int(y))


def config_text(r):
    if not r.ok:
        return "!"
    return " ".join("%s%s" % (el, r.config[el]) for el in sorted(r.config, key=element_order))


def classes_text(classes):
    return " ".join("%s:%s" % (el, ",".join(v)) for el, v in classes.items())


def found_text(found):
    return " ".join("%s:%s" % (el, ",".join(v))
                    for el, v in sorted(found.items(), key=lambda kv: element_order(kv[0])) if v)


def package_version(name):
    try:
        return subprocess.run(["dpkg-query", "-W", "-f=${Version}", name], capture_output=True,
                              text=True, check=True).stdout.strip()
    except (OSError, subprocess.CalledProcessError):
        return "unknown"


def npm_version():
    try:
        with open(os.path.join(readers.RDKIT_JS_DIR, "node_modules", "@rdkit", "rdkit",
                               "package.json")) as f:
            return json.load(f)["version"]
    except OSError:
        return "unknown"


COLUMNS = [
    ("structure", "the structure the writing came from: nci-<NCI id>/<isomer> "
     "(testdata/rdkit/cip_labels.tsv), suite-<VSnnn> (CIP validation suite), marked-<NCI id> "
     "(randomly marked records of testdata/rdkit/perception.tsv), case-<name> (targeted cases)"),
    ("writing", "canonical: RDKit's canonical SMILES; rdkit-<n>: RDKit's writer on randomly "
     "renumbered atoms; rdkit-root-<atom>: RDKit's writer starting at a stereocentre; rdkit-h: "
     "RDKit's writer with all hydrogens as atoms; survey-<n>, w<n>: writer.py; given: the "
     "string as the source gives it"),
    ("writer", "rdkit (RDKit 2022.09.3's writer), survey(<options>) (writer.py: lone-pair "
     "convention, placement of marks on ring-closure digits, digits after branches, Kekule "
     "form, atoms written with an [H] atom, all substituents marked, marks between aromatic "
     "atoms) or given"),
    ("smiles", "the writing"),
    ("constructs", "space-separated <element>:<construct>,...: the constructs of "
     "constructs.py at each marked element; elements are a<atom> (centre) and b<atom>-<atom> "
     "(double bond), atoms numbered from 0 in string order"),
    ("intended", "writer.py's writings: the configuration meant, as <element><key>; key '@' "
     "or '@@' says how the centre's neighbours, listed in increasing atom number with a "
     "hydrogen (implicit, bracket or [H] atom) or lone pair first, run (OpenSMILES 3.8.2), "
     "'c' or 't' relates the lowest-numbered heavy neighbour of each end of a double bond; "
     "empty for other writers"),
    ("rdkit_config", "the configuration RDKit 2022.09.3 reads (Chem.FindPotentialStereo, "
     "specified units), same form; ! when it refuses the string"),
    ("rdkitjs_config", "the configuration @rdkit/rdkit reads (chiral tags and bond stereo of "
     "get_json); = when the same as rdkit_config"),
    ("openbabel_config", "the configuration Open Babel reads (OBStereoFacade, specified "
     "units); = when the same as rdkit_config"),
    ("rdkit_canonical", "RDKit 2022.09.3's canonical isomeric SMILES (MolToSmiles); = when "
     "the same as on the structure's first row"),
    ("rdkitjs_canonical", "@rdkit/rdkit's get_smiles(); = as above"),
    ("openbabel_canonical", "Open Babel's canonical SMILES (format can); = as above"),
    ("rdkit_labels", "rdCIPLabeler.AssignCIPLabels labels as <atom><label>, atoms from 1 in "
     "string order ([H] atoms kept), double-bond labels on both atoms"),
    ("rdkitjs_labels", "get_stereo_tags labels, same form (undetermined labels left out); = "
     "when the same as rdkit_labels"),
    ("openbabel_labels", "Open Babel has no CIP labeller: its configuration put on RDKit "
     "2022.09.3's molecule of the same string and labelled by rdCIPLabeler; = when the same "
     "as rdkit_labels"),
    ("classes", "each element where the readers, or a reader and the writer's intent, differ: "
     "<element>:<cause>,... where a cause is a construct of constructs.tsv, "
     "perception:<kind> (a reader keeps no configuration for a unit whose marks give one) or "
     "reject:rejected; *:writer-changed when every reader's canonical SMILES differs from the "
     "structure's most common one (the writer wrote another structure), "
     "*:canonical-form:<reader> when only some do (that reader wrote two canonical strings "
     "for one reading)"),
]


def main():
    writings = all_writings()
    print("%d writings" % len(writings), file=sys.stderr)
    results, js_version = read_all(writings)
    unexplained = []
    for w, res in zip(writings, results):
        c, u = classify(w, res)
        w.classes = c
        unexplained += u
    for u in unexplained:
        print(u, file=sys.stderr)
    canon_faults = canonical_consistency(writings, results)
    write_survey(writings, results, js_version, canon_faults)
    write_constructs(writings, js_version)
    if unexplained:
        sys.exit("%d unexplained differences" % len(unexplained))


def canonical_consistency(writings, results):
    """Writings without a class whose canonical SMILES differs, in some
    reader, from the structure's most common one. When every reader that
    accepts the writing gives a different canonical SMILES, the writing
    stands for another structure (its writer changed it: RDKit 2022.09.3's
    writer does so for some double bonds closed by a ring digit); class
    '*:writer-changed'. Otherwise the differing readers wrote two
    canonical strings for one reading; class '*:canonical-form:<reader>'."""
    by = collections.defaultdict(list)
    for w, res in zip(writings, results):
        by[w.sid].append((w, res))
    counts = collections.Counter()
    for sid, rows in by.items():
        modal = {}
        for name in K.READERS:
            canon = collections.Counter(r[name].canonical for _, r in rows if r[name].ok)
            if canon:
                modal[name] = canon.most_common(1)[0][0]
        for w, r in rows:
            if w.writer == "rdkit" and all(
                    r[n].ok and n in modal and r[n].canonical != modal[n] for n in (K.RDKIT, K.RDKIT_JS)):
                # both RDKit releases read RDKit's writing under the rules
                # it was written by, and both find another structure
                w.classes.setdefault("*", []).append("writer-changed")
                counts["writer-changed"] += 1
                continue
            if w.classes:
                continue
            ok = [n for n in K.READERS if r[n].ok and n in modal]
            off = [n for n in ok if r[n].canonical != modal[n]]
            if not off:
                continue
            if len(off) == len(ok):
                w.classes["*"] = ["writer-changed"]
                counts["writer-changed"] += 1
            else:
                w.classes["*"] = ["canonical-form:" + n for n in off]
                for n in off:
                    counts["canonical-form:" + n] += 1
    print("writings whose canonical SMILES differs without a reading difference: %s" %
          dict(counts), file=sys.stderr)
    return counts


def write_survey(writings, results, js_version, faults):
    path = os.path.join(HERE, "survey.tsv")
    structures = len({w.sid for w in writings})
    with_classes = sum(1 for w in writings if w.classes)
    with open(path, "w") as out:
        out.write("# survey.tsv: how general-purpose libraries read stereo marks written many ways\n")
        out.write("# readers: RDKit %s (Debian python3-rdkit %s); @rdkit/rdkit %s (npm, RDKit %s, "
                  "under node %s); Open Babel %s (Debian python3-openbabel %s)\n" % (
                      rdkit_version(), package_version("python3-rdkit"), npm_version(),
                      js_version, node_version(), readers.openbabel_version(),
                      package_version("python3-openbabel")))
        out.write("# generator (from the repository root): /usr/bin/python3 "
                  "testdata/survey/gen_survey.py (constructs.py, writer.py, layout.py, "
                  "readers.py, read_rdkitjs.js); seed %d\n" % SEED)
        out.write("# sources: testdata/rdkit/cip_labels.tsv (isomers), %s, testdata/rdkit/"
                  "perception.tsv (marked set), the targeted cases of gen_survey.py\n" % SUITE)
        out.write("# %d writings of %d structures; %d writings with at least one class; "
                  "writings whose canonical SMILES differs with no reading difference: %s\n" % (
                      len(writings), structures, with_classes,
                      ", ".join("%s %d" % kv for kv in sorted(faults.items())) or "none"))
        out.write("# columns (tab separated):\n")
        for i, (name, desc) in enumerate(COLUMNS, 1):
            out.write("#   %d. %s: %s\n" % (i, name, desc))
        out.write("#" + "\t".join(n for n, _ in COLUMNS) + "\n")
        first = {}
        for w, res in zip(writings, results):
            canon = []
            for name in K.READERS:
                c = res[name].canonical if res[name].ok else "!"
                key = (w.sid, name)
                if key not in first:
                    first[key] = c
                    canon.append(c)
                else:
                    canon.append("=" if c == first[key] else c)
            labels = [" ".join(res[n].labels) if res[n].ok else "!" for n in K.READERS]
            configs = [config_text(res[n]) for n in K.READERS]
            # the later readers' columns say = when they equal RDKit 2022.09.3's
            for k in (1, 2):
                if labels[k] == labels[0]:
                    labels[k] = "="
                if configs[k] == configs[0]:
                    configs[k] = "="
            intended = ""
            if w.intended is not None and w.writer.startswith("survey"):
                intended = " ".join("%s%s" % (el, w.intended[el])
                                    for el in sorted(w.intended, key=element_order))
            row = [w.sid, w.wid, w.writer, w.smiles, found_text(w.found), intended] + \
                configs + canon + labels + [classes_text(w.classes)]
            out.write("\t".join(row) + "\n")


def write_constructs(writings, js_version):
    counts = collections.Counter()
    causes = collections.Counter()
    perception = collections.Counter()
    for w in writings:
        seen = set()
        for el, names in w.found.items():
            seen |= set(names)
        for n in seen:
            counts[n] += 1
        for el, why in w.classes.items():
            for c in why:
                if c.startswith("perception:"):
                    perception[c] += 1
                else:
                    causes[c] += 1
    path = os.path.join(HERE, "constructs.tsv")
    with open(path, "w") as out:
        out.write("# constructs.tsv: the constructs of the survey and how each reader reads them\n")
        out.write("# made with survey.tsv by testdata/survey/gen_survey.py; readers as in "
                  "survey.tsv (rdkit-js is @rdkit/rdkit %s)\n" % npm_version())
        out.write("# rules (the reading of a construct whose rule is '-' is the same in every "
                  "reader surveyed):\n")
        for rule, vals in K.RULES.items():
            for v, desc in vals.items():
                out.write("#   %s=%s: %s\n" % (rule, v, desc))
        cols = ["construct", "element", "opensmiles", "opensmiles_says", "rule"] + \
            ["reading_" + n.replace("-2022.09.3", "").replace("-", "") for n in K.READERS] + \
            ["writings", "differences", "portable"]
        out.write("# columns: construct; element (centre or bond); opensmiles: section of the "
                  "OpenSMILES specification (opensmiles.org, 2016 text); opensmiles_says "
                  "(paraphrased); rule (RULES above, or -); the rule's value for each reader; "
                  "writings: survey.tsv rows with the construct; differences: elements where "
                  "it accounts for a difference between readers or between a reader and the "
                  "writer; portable: how to write it so that every reader agrees\n")
        out.write("#" + "\t".join(cols) + "\n")
        for c in K.CONSTRUCTS:
            readings = [K.READER_RULES[n][c.rule] if c.rule else "as-written" for n in K.READERS]
            out.write("\t".join([c.name, c.kind, c.section, c.says, c.rule or "-"] + readings +
                                [str(counts[c.name]), str(causes[c.name]), c.portable]) + "\n")
        for k, v in sorted(perception.items()):
            out.write("# %s: %d elements\n" % (k, v))


def rdkit_version():
    import rdkit
    return rdkit.__version__


def node_version():
    try:
        return subprocess.run(["node", "--version"], capture_output=True, text=True,
                              check=True).stdout.strip()
    except (OSError, subprocess.CalledProcessError):
        return "unknown"


if __name__ == "__main__":
    main()

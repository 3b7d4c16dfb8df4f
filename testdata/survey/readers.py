"""The three general-purpose readers of the survey and what each makes of a writing.

Every reader returns a Reading: whether it accepted the string, its canonical
isomeric SMILES, the CIP labels of the molecule it read (atoms numbered in
string order, as the CIP validation suite numbers them) and its
configuration: every tetrahedral centre and double bond it keeps, in the
writing's own atom numbers and in one form that does not depend on the
reader (centre_key, bond_key). amap maps each atom of a writing to its
number in the key, H for a plain hydrogen atom, so that an [H] atom counts
as an implicit hydrogen does.

- RDKit 2022.09.3, Debian's python3-rdkit (run with /usr/bin/python3):
  configuration from Chem.FindPotentialStereo, labels from
  rdCIPLabeler.AssignCIPLabels.
- @rdkit/rdkit (npm, RDKit's MinimalLib), read by read_rdkitjs.js under node:
  configuration from the chiral tags and bond stereo of get_json, labels
  from get_stereo_tags.
- Open Babel 3.1.1, Debian's python3-openbabel: configuration from
  OBStereoFacade; Open Babel has no CIP labeller, so its configuration is
  written onto RDKit 2022.09.3's molecule of the same string and labelled
  by rdCIPLabeler (a labelling of Open Babel's reading, not Open Babel's
  own labels).
"""

import json
import os
import subprocess

from rdkit import Chem, RDLogger
from rdkit.Chem import rdCIPLabeler

RDLogger.DisableLog("rdApp.*")

HERE = os.path.dirname(os.path.abspath(__file__))
RDKIT_JS_DIR = os.environ.get("RDKIT_JS_DIR", "/work/coord/npm-survey")

# H stands for the hydrogen or lone pair of a centre in a configuration key
# (an implicit hydrogen, a lone pair and an explicit [H] atom all count as
# it), and for an absent neighbour of a double-bond end.
H = -1


class Reading:
    """What one reader makes of one writing."""

    def __init__(self, ok, canonical="", labels=(), config=None):
        self.ok = ok
        self.canonical = canonical
        self.labels = sorted(labels, key=label_order)
        self.config = config or {}


def label_order(label):
    digits = "".join(ch for ch in label if ch.isdigit())
    return (int(digits), label)


def parity(seq):
    """+1 for an even permutation of the sorted sequence, -1 for odd."""
    seq = list(seq)
    sign = 1
    for i in range(len(seq)):
        for j in range(i + 1, len(seq)):
            if seq[i] > seq[j]:
                sign = -sign
    return sign


def centre_key(neighbours, anticlockwise):
    """The configuration of a centre.

    neighbours lists the neighbours (atom numbers, H for the
    hydrogen or lone pair) in the order the reader's chirality refers to,
    looking from the first: anticlockwise is True when the other three run
    anticlockwise (SMILES '@'). The key says the same for the neighbours in
    increasing order with H first: '@' or '@@'; None when the list has no
    four distinct entries.
    """
    if len(neighbours) != 4 or len(set(neighbours)) != 4:
        return None
    s = parity(neighbours) * (1 if anticlockwise else -1)
    return "@" if s > 0 else "@@"


def bond_key(amap, nbrs_begin, nbrs_end, ref_begin, ref_end, cis):
    """The configuration of a double bond in the numbering amap gives.

    nbrs_begin and nbrs_end are the writing's neighbours of each end (other
    than the partner); ref_begin and ref_end the two the reader's cis/trans
    refers to. The key relates the lowest-numbered heavy neighbour of each
    end: 'c' (cis) or 't' (trans).
    """
    def lowest(nbrs):
        heavy = [amap[n] for n in nbrs if amap[n] != H]
        return min(heavy) if heavy else H

    def token(ref):
        return amap[ref] if ref is not None else H

    same = cis
    # each end whose reference is not the lowest neighbour turns the relation
    if token(ref_begin) != lowest(nbrs_begin):
        same = not same
    if token(ref_end) != lowest(nbrs_end):
        same = not same
    return "c" if same else "t"


def atom_element(i, amap):
    return "a%d" % amap[i]


def bond_element(i, j, amap):
    a, b = sorted((amap[i], amap[j]))
    return "b%d-%d" % (a, b)


# --- RDKit 2022.09.3 (Python) ----------------------------------------------

def rdkit_parse(smiles):
    """Reads smiles keeping [H] atoms so that atom indices follow the string."""
    params = Chem.SmilesParserParams()
    params.removeHs = False
    return Chem.MolFromSmiles(smiles, params)


def rdkit_labels(mol):
    """rdCIPLabeler labels as <atom><label>, atoms numbered from 1; double-bond
    labels on both atoms, as the CIP validation suite writes them."""
    for a in mol.GetAtoms():
        a.ClearProp("_CIPCode")
    for b in mol.GetBonds():
        b.ClearProp("_CIPCode")
    try:
        rdCIPLabeler.AssignCIPLabels(mol)
    except Exception:  # the labeller gives up on some cages; no labels then
        return []
    out = []
    for a in mol.GetAtoms():
        if a.HasProp("_CIPCode"):
            out.append("%d%s" % (a.GetIdx() + 1, a.GetProp("_CIPCode")))
    for b in mol.GetBonds():
        if b.HasProp("_CIPCode"):
            for i in (b.GetBeginAtomIdx(), b.GetEndAtomIdx()):
                out.append("%d%s" % (i + 1, b.GetProp("_CIPCode")))
    return out


def rdkit_config(mol, amap):
    """The configuration RDKit keeps, from FindPotentialStereo (specified units)."""
    config = {}
    for si in Chem.FindPotentialStereo(mol):
        if si.specified != Chem.StereoSpecified.Specified:
            continue
        if si.type == Chem.StereoType.Atom_Tetrahedral:
            ctrl = [c for c in si.controllingAtoms]
            nb = [amap[c] if c != Chem.StereoInfo.NOATOM else H for c in ctrl]
            # the chiral tag refers to the bonds in order with the implicit
            # hydrogen or lone pair last
            while len(nb) < 4:
                nb.append(H)
            k = centre_key(nb, si.descriptor == Chem.StereoDescriptor.Tet_CCW)
            if k:
                config[atom_element(si.centeredOn, amap)] = k
        elif si.type == Chem.StereoType.Bond_Double:
            b = mol.GetBondWithIdx(si.centeredOn)
            i, j = b.GetBeginAtomIdx(), b.GetEndAtomIdx()
            ctrl = list(si.controllingAtoms)
            na = [n.GetIdx() for n in mol.GetAtomWithIdx(i).GetNeighbors() if n.GetIdx() != j]
            nb = [n.GetIdx() for n in mol.GetAtomWithIdx(j).GetNeighbors() if n.GetIdx() != i]
            ra = ctrl[0] if ctrl[0] != Chem.StereoInfo.NOATOM else None
            rb = ctrl[2] if ctrl[2] != Chem.StereoInfo.NOATOM else None
            cis = si.descriptor == Chem.StereoDescriptor.Bond_Cis
            config[bond_element(i, j, amap)] = bond_key(amap, na, nb, ra, rb, cis)
    return config


def rdkit_read(smiles, amap):
    mol = rdkit_parse(smiles)
    plain = Chem.MolFromSmiles(smiles)
    if mol is None or plain is None:
        return Reading(False)
    return Reading(True, Chem.MolToSmiles(plain), rdkit_labels(Chem.Mol(mol)), rdkit_config(mol, amap))


# --- @rdkit/rdkit (node) ----------------------------------------------------

def rdkitjs_read_all(requests):
    """Reads [(id, smiles, amap)] with @rdkit/rdkit; returns {id: Reading}
    and the package's version."""
    script = os.path.join(HERE, "read_rdkitjs.js")
    payload = "".join(json.dumps({"id": i, "smiles": s}) + "\n" for i, s, _ in requests)
    env = dict(os.environ, RDKIT_JS_DIR=RDKIT_JS_DIR)
    out = subprocess.run(["node", script], input=payload, capture_output=True,
                         text=True, check=True, env=env).stdout
    amaps = {i: m for i, _, m in requests}
    res, version = {}, ""
    for line in out.splitlines():
        r = json.loads(line)
        version = r.get("version", version)
        if not r["ok"]:
            res[r["id"]] = Reading(False)
            continue
        amap = amaps[r["id"]]
        labels = []
        for i, lab in r["tags"]["CIP_atoms"]:
            if lab.strip("()") in ("R", "S", "r", "s"):
                labels.append("%d%s" % (i + 1, lab.strip("()")))
        for i, j, lab in r["tags"]["CIP_bonds"]:
            if lab.strip("()") in ("E", "Z", "e", "z"):
                labels += ["%d%s" % (i + 1, lab.strip("()")), "%d%s" % (j + 1, lab.strip("()"))]
        config = {}
        nbrs = {}
        for i, stereo, nb in r["atoms"]:
            nbrs[i] = nb
            b = [amap[n] for n in nb]
            while len(b) < 4:
                b.append(H)
            k = centre_key(b, stereo == "ccw")
            if k:
                config[atom_element(i, amap)] = k
        res[r["id"]] = Reading(True, r["canonical"], labels, config)
        res[r["id"]].js_bonds = r["bonds"]
    return res, version


def rdkitjs_bonds(reading, mol, amap):
    """Adds the double bonds of an @rdkit/rdkit reading; the neighbours of
    the ends come from RDKit 2022.09.3's molecule of the same string (the
    same atoms and bonds in the same order)."""
    for i, j, stereo, ref in getattr(reading, "js_bonds", []):
        na = [n.GetIdx() for n in mol.GetAtomWithIdx(i).GetNeighbors() if n.GetIdx() != j]
        nb = [n.GetIdx() for n in mol.GetAtomWithIdx(j).GetNeighbors() if n.GetIdx() != i]
        ra, rb = ref
        if ra not in na:  # stereo atoms are given begin first
            ra, rb = rb, ra
        reading.config[bond_element(i, j, amap)] = bond_key(amap, na, nb, ra, rb, stereo == "cis")


# --- Open Babel 3.1.1 -------------------------------------------------------

_ob = None


def _openbabel():
    global _ob
    if _ob is None:
        from openbabel import openbabel as ob
        ob.obErrorLog.SetOutputLevel(0)
        conv = ob.OBConversion()
        conv.SetInAndOutFormats("smi", "can")
        _ob = (ob, conv)
    return _ob


def openbabel_version():
    ob, _ = _openbabel()
    return ob.OBReleaseVersion()


def openbabel_read(smiles, amap):
    ob, conv = _openbabel()
    mol = ob.OBMol()
    if not conv.ReadString(mol, smiles) or mol.NumAtoms() == 0:
        return Reading(False)
    canonical = conv.WriteString(mol).strip()
    if not canonical:
        return Reading(False)
    canonical = canonical.split("\t")[0]
    implicit = ob.OBStereo.ImplicitRef & 0xFFFFFFFF  # refs come back unsigned
    facade = ob.OBStereoFacade(mol)
    idx = {a.GetId(): a.GetIdx() - 1 for a in ob.OBMolAtomIter(mol)}

    def ref(r):
        return H if r == implicit else amap[idx[r]]

    config = {}
    for a in ob.OBMolAtomIter(mol):
        if not facade.HasTetrahedralStereo(a.GetId()):
            continue
        c = facade.GetTetrahedralStereo(a.GetId()).GetConfig()
        if not c.specified:
            continue
        anti = c.winding == ob.OBStereo.AntiClockwise
        if c.view == ob.OBStereo.ViewTowards:
            anti = not anti
        k = centre_key([ref(c.from_or_towards)] + [ref(r) for r in c.refs], anti)
        if k:
            config[atom_element(a.GetIdx() - 1, amap)] = k
    for b in ob.OBMolBondIter(mol):
        if not facade.HasCisTransStereo(b.GetId()):
            continue
        ct = facade.GetCisTransStereo(b.GetId())
        c = ct.GetConfig()
        if not c.specified:
            continue
        i, j = idx[c.begin], idx[c.end]
        bi, bj = mol.GetAtomById(c.begin), mol.GetAtomById(c.end)
        na = [idx[n.GetId()] for n in ob.OBAtomAtomIter(bi) if n.GetId() != c.end]
        nb = [idx[n.GetId()] for n in ob.OBAtomAtomIter(bj) if n.GetId() != c.begin]
        # refs run begin, begin, end, end; the first of each end that is a
        # real atom decides, and IsCis tells its relation
        ra = next((r for r in c.refs[:2] if r != implicit), None)
        rb = next((r for r in c.refs[2:] if r != implicit), None)
        if ra is None or rb is None:
            continue
        cis = ct.IsCis(ra, rb)
        config[bond_element(i, j, amap)] = bond_key(amap, na, nb, idx[ra], idx[rb], cis)
    return Reading(True, canonical, [], config)


def label_with_config(mol, amap, config):
    """rdCIPLabeler labels of RDKit's molecule of a writing once its
    configuration is replaced by config (writing numbering): how another
    reader's configuration is labelled."""
    mol = Chem.RWMol(mol)
    inv = {}
    for i, b in enumerate(amap):
        if b != H:
            inv[b] = i
    for a in mol.GetAtoms():
        a.SetChiralTag(Chem.ChiralType.CHI_UNSPECIFIED)
    for b in mol.GetBonds():
        if b.GetBondType() == Chem.BondType.DOUBLE:
            b.SetStereo(Chem.BondStereo.STEREONONE)
        b.SetBondDir(Chem.BondDir.NONE)
    for el, k in config.items():
        if el.startswith("a"):
            i = inv[int(el[1:])]
            atom = mol.GetAtomWithIdx(i)
            nb = [amap[x.GetOtherAtomIdx(i)] for x in atom.GetBonds()]
            while len(nb) < 4:
                nb.append(H)
            # find the tag whose key equals k
            want_anti = centre_key(nb, True) == k
            atom.SetChiralTag(Chem.ChiralType.CHI_TETRAHEDRAL_CCW if want_anti
                              else Chem.ChiralType.CHI_TETRAHEDRAL_CW)
        else:
            a, b = (int(x) for x in el[1:].split("-"))
            i, j = inv[a], inv[b]
            bond = mol.GetBondBetweenAtoms(i, j)
            if bond is None:
                continue
            i, j = bond.GetBeginAtomIdx(), bond.GetEndAtomIdx()
            na = [n.GetIdx() for n in mol.GetAtomWithIdx(i).GetNeighbors() if n.GetIdx() != j]
            nb = [n.GetIdx() for n in mol.GetAtomWithIdx(j).GetNeighbors() if n.GetIdx() != i]
            if not na or not nb:
                continue
            ra, rb = na[0], nb[0]
            cis = bond_key(amap, na, nb, ra, rb, True) == k
            bond.SetStereoAtoms(ra, rb)
            bond.SetStereo(Chem.BondStereo.STEREOCIS if cis else Chem.BondStereo.STEREOTRANS)
    return rdkit_labels(mol.GetMol())

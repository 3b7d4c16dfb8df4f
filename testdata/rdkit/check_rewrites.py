#!/usr/bin/python3
"""Checks with RDKit the extension blocks Stereoline's writer renumbers.

TestRDKitGroups (notation/groups_rdkit_test.go) writes every row of
groups.tsv from a random atom; with STEREOLINE_REWRITES set it lists those
writings with the order of their atoms. This script reads each source and
its writing with RDKit and checks, through the order, that RDKit finds the
same stereo groups on the same atoms, and for molecules the same atom
labels, atom values, atom properties, radicals, 2D coordinates, S-groups
and canonical isomeric SMILES. It prints the counts and the first
differences; it is a check run by hand, since go test does not run RDKit.

Usage (from the repository root):
    STEREOLINE_REWRITES=/tmp/rewrites.tsv go test ./notation -run TestRDKitGroups
    /usr/bin/python3 testdata/rdkit/check_rewrites.py /tmp/rewrites.tsv
"""

import sys

from rdkit import Chem
from rdkit.Chem import AllChem

import fixturelib  # noqa: F401  (silences RDKit's log)

KINDS = {
    Chem.StereoGroupType.STEREO_ABSOLUTE: "abs",
    Chem.StereoGroupType.STEREO_OR: "or",
    Chem.StereoGroupType.STEREO_AND: "and",
}


def parse(smiles):
    params = Chem.SmilesParserParams()
    params.removeHs = False
    return Chem.MolFromSmiles(smiles, params)


def mol_groups(mol):
    return [(KINDS[g.GetGroupType()], [a.GetIdx() for a in g.GetAtoms()]) for g in mol.GetStereoGroups()]


def reaction_groups(smiles):
    rxn = AllChem.ReactionFromSmarts(smiles, useSmiles=True)
    out, offset = [], 0
    for tpl in list(rxn.GetReactants()) + list(rxn.GetAgents()) + list(rxn.GetProducts()):
        out += [(k, [a + offset for a in atoms]) for k, atoms in mol_groups(tpl)]
        offset += tpl.GetNumAtoms()
    return out


def same_atoms(a, b, order):
    """Whether b (the writing) says of atom i what a says of atom order[i]."""
    for i, old in enumerate(order):
        x, y = a.GetAtomWithIdx(old), b.GetAtomWithIdx(i)
        for prop in ("atomLabel", "molFileValue", "tag"):
            if (x.GetProp(prop) if x.HasProp(prop) else None) != (y.GetProp(prop) if y.HasProp(prop) else None):
                return False
        if x.GetNumRadicalElectrons() != y.GetNumRadicalElectrons():
            return False
        if a.GetNumConformers():
            p, q = a.GetConformer().GetAtomPosition(old), b.GetConformer().GetAtomPosition(i)
            if abs(p.x - q.x) > 1e-9 or abs(p.y - q.y) > 1e-9:
                return False
    sa = sorted((sg.GetProp("TYPE"), sorted(order.index(i) for i in sg.GetAtoms())) for sg in Chem.GetMolSubstanceGroups(a))
    sb = sorted((sg.GetProp("TYPE"), sorted(sg.GetAtoms())) for sg in Chem.GetMolSubstanceGroups(b))
    return sa == sb and Chem.MolToSmiles(a) == Chem.MolToSmiles(b)


def main():
    rows = groups_ok = mols = atoms_ok = 0
    shown = 0
    for line in open(sys.argv[1]):
        lineno, variant, source, written, order = line.rstrip("\n").split("\t")
        order = list(map(int, order.split(",")))
        rows += 1
        if variant == "reaction":
            a, b = reaction_groups(source), reaction_groups(written)
        else:
            ma, mb = parse(source), parse(written)
            a, b = mol_groups(ma), (mol_groups(mb) if mb is not None else None)
        good = b is not None and sorted((k, sorted(x)) for k, x in a) == sorted((k, sorted(order[i] for i in x)) for k, x in b)
        groups_ok += good
        if variant != "reaction" and mb is not None:
            mols += 1
            same = same_atoms(ma, mb, order)
            atoms_ok += same
            good = good and same
        if not good and shown < 10:
            shown += 1
            print("differs (groups.tsv line %s): %s -> %s" % (lineno, source, written))
    print("%d writings: RDKit %s reads the same groups on %d; of %d molecules, %d have the same "
          "labels, values, properties, radicals, coordinates, S-groups and canonical SMILES"
          % (rows, Chem.rdBase.rdkitVersion, groups_ok, mols, atoms_ok))


if __name__ == "__main__":
    main()

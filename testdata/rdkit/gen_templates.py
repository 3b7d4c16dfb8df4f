#!/usr/bin/python3
"""Generates templates.tsv: what RDKit's reaction code says a template does
to the configuration of its mapped centre.

The templates are built here from one tetrahedral centre (map 1) with
four neighbours: every ordering of the neighbours in which the centre is
written (preceding atom, branches, chain, a ring closure), each side
marked @, @@ or not at all, with the neighbours all mapped, with a
hydrogen written in the brackets, and with one unmapped neighbour
replaced across the arrow (a leaving group and its nucleophile). A
sample of the combinations is kept (seeded).

For each template, AllChem.ReactionFromSmarts(t) then rxn.Initialize();
the product template atom with map 1 carries the integer property
molInversionFlag: 1 inverts, 2 retains, 3 removes (marked in the
reactant only), 4 creates (marked in the product only); absent when
neither side is marked.

Usage: /usr/bin/python3 testdata/rdkit/gen_templates.py [out.tsv]
"""

import itertools
import os
import random
import sys

from rdkit.Chem import AllChem

import fixturelib

SEED = 20226
SAMPLE = 400

COLUMNS = [
    ("template", "the reaction SMARTS"),
    ("flag", "molInversionFlag of the product atom with map 1 after rxn.Initialize(): "
     "1 inverts, 2 retains, 3 removes, 4 creates, 0 when the property is absent"),
]


def writings(centre, nbrs):
    """Writes a centre (its bracket text without the closing ']') with four
    neighbour tokens in the given order, in three shapes: the first
    neighbour before the centre; the centre first with branches; and a
    ring closure standing for the last neighbour, a dot-separated partner
    inside a component group "( ... )" so that the reaction keeps it in
    the same reactant."""
    a, b, c, d = nbrs
    yield "%s%s](%s)(%s)%s" % (a, centre, b, c, d)
    yield "%s](%s)(%s)(%s)%s" % (centre, a, b, c, d)
    yield "(%s%s]1(%s)%s.%s1)" % (a, centre, b, c, d)


def hwritings(centre, nbrs):
    """The same for a centre with a hydrogen in its brackets (the H is the
    second neighbour when an atom precedes, the first otherwise)."""
    a, b, c = nbrs
    yield "%s%sH](%s)%s" % (a, centre, b, c)
    yield "%sH](%s)(%s)%s" % (centre, a, b, c)


def templates(rng):
    mapped = ["[F:2]", "[Cl:3]", "[Br:4]", "[O:5]"]
    out = []
    marks = ["@", "@@", ""]
    for rm, pm in itertools.product(marks, marks):
        for rp in itertools.permutations(mapped):
            for pp in itertools.permutations(mapped):
                for rw in writings("[C%s:1" % rm, rp):
                    for pw in writings("[C%s:1" % pm, pp):
                        out.append(rw + ">>" + pw)
    # A leaving group (Br, unmapped) replaced by a nucleophile (N, unmapped).
    left = ["[F:2]", "[Cl:3]", "[O:5]", "Br"]
    right = ["[F:2]", "[Cl:3]", "[O:5]", "N"]
    for rm, pm in itertools.product(marks[:2], marks[:2]):
        for rp in itertools.permutations(left):
            for pp in itertools.permutations(right):
                out.append(next(writings("[C%s:1" % rm, rp)) + ">>" + next(writings("[C%s:1" % pm, pp)))
    # A hydrogen in the brackets.
    h = ["[F:2]", "[Cl:3]", "[O:5]"]
    for rm, pm in itertools.product(marks, marks):
        for rp in itertools.permutations(h):
            for pp in itertools.permutations(h):
                for rw in hwritings("[C%s" % rm, rp):
                    for pw in hwritings("[C%s" % pm, pp):
                        out.append(rw.replace("H]", "H:1]", 1) + ">>" + pw.replace("H]", "H:1]", 1))
    rng.shuffle(out)
    return out[:SAMPLE]


def flag(t):
    rxn = AllChem.ReactionFromSmarts(t)
    rxn.Initialize()
    for tpl in rxn.GetProducts():
        for a in tpl.GetAtoms():
            if a.GetAtomMapNum() == 1:
                return a.GetIntProp("molInversionFlag") if a.HasProp("molInversionFlag") else 0
    return 0


def main():
    out_path = sys.argv[1] if len(sys.argv) > 1 else os.path.join(fixturelib.HERE, "templates.tsv")
    rng = random.Random(SEED)
    rows = [(t, flag(t)) for t in templates(rng)]
    with open(out_path, "w") as out:
        fixturelib.header(
            out,
            "templates.tsv: RDKit's molInversionFlag for the mapped centre of reaction templates",
            "templates built by testdata/rdkit/gen_templates.py (a sample of %d, random.Random(%d))" % (SAMPLE, SEED),
            COLUMNS,
        )
        for t, f in rows:
            out.write("%s\t%d\n" % (t, f))


if __name__ == "__main__":
    main()

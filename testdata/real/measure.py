#!/usr/bin/python3
"""Measures precision and recall of the finder on the real corpus (see
cmd/stereoline/real_test.go) against RDKit 2022.09.3.

Precision: of the occurrences found, the share that is notation in the
dialect found (RDKit reads a SMILES occurrence with MolFromSmiles,
sanitize=False, or a pattern occurrence with MolFromSmarts /
ReactionFromSmarts), after the ones RDKit does not read are looked at
(listed, so that a person can tell true notation with a real error from
text that is not notation), and words that read by accident are counted
against.

Recall: of the strings a person would call notation, the share found.
In Python modules they are the string literals, and the literals of
doctest lines, that are an argument of a SMILES or SMARTS constructor,
or that RDKit reads and that show structure beyond letters (a bracket,
bond, branch, ring digit or mark); a literal holding several records
separated by commas, semicolons or blanks counts each. In data files
they are, for each line that is no comment, the fields RDKit reads
that show structure beyond letters. Notebooks are left out of recall
(their cells' lines are not the file's).

Usage (from the repository root):
    STEREOLINE_REAL_DUMP=/tmp/real_dump.tsv go test ./cmd/stereoline -run RealCorpus
    /usr/bin/python3 testdata/real/measure.py /tmp/real_dump.tsv
"""

import ast
import collections
import csv
import doctest
import glob
import io
import os
import re
import sys
import tokenize

from rdkit import Chem, RDLogger
from rdkit.Chem import AllChem

RDLogger.DisableLog("rdApp.*")

ROOTS = {
    "rdkit-python": "/usr/lib/python3/dist-packages/rdkit",
    "rdkit-data": "/usr/share/RDKit/Data",
    "openbabel-data": (glob.glob("/usr/share/openbabel/3.*") or [""])[0],
}
DATA_FILES = {
    "rdkit-data": ["NCI/first_5K.smi", "NCI/first_5k.tpsa.csv", "NCI/first_200.tpsa.csv",
                   "Pains/wehi_pains.csv", "Pains/test_data/wehi_mols.csv", "Salts.txt",
                   "FunctionalGroups.txt", "Functional_Group_Hierarchy.txt", "Crippen.txt",
                   "SmartsLib/RLewis_smarts.txt", "SmartsLib/patty_rules.txt",
                   "Pains/test_data/test_set3.txt"],
    "openbabel-data": ["SMARTS_InteLigand.txt", "patterns.txt", "superatom.txt", "torsion.txt",
                       "rigid-fragments-index.txt"],
}
CONSTRUCTOR = re.compile(r"(MolFrom|ReactionFrom)(Smiles|Smarts)\s*\(\s*$")
SHAPED = re.compile(r"[\[\]()=#@/\\0-9%.~*]")


def reads_smiles(s):
    try:
        return Chem.MolFromSmiles(s, sanitize=False) is not None
    except Exception:
        return False


def reads_smarts(s):
    try:
        if re.search(r">", re.sub(r"\[[^\]]*\]", "", s)):
            return AllChem.ReactionFromSmarts(s) is not None
        return Chem.MolFromSmarts(s) is not None
    except Exception:
        return False


def parts(s):
    """The records of a string: split at commas and semicolons outside
    brackets and at blanks."""
    out, depth, cur = [], 0, ""
    for c in s:
        if c == "[":
            depth += 1
        elif c == "]":
            depth = max(0, depth - 1)
        if c in " \t" or c in ",;" and depth == 0:
            if cur:
                out.append(cur)
            cur = ""
            continue
        cur += c
    if cur:
        out.append(cur)
    return out


ELEMENT = re.compile(r"Cl|Br|[BCNOPSFIbcnops]|\[[^\]]*[A-Za-z#][^\]]*\]")
QUERY = re.compile(r"\[[^\]]*[;&!,#][^\]]*\]|\$\(|~|!@|-@")


def notation_like(s):
    """Notation a person would call so: it reads (as SMILES, or as SMARTS
    with query primitives), names an element, and is not a slash-joined
    abbreviation such as N/A or I/O (a direction mark with no double
    bond and nothing else), a regular expression's class ([a-z,A-Z]) or
    a format string ([%s*])."""
    if not s or " " in s or not ELEMENT.search(s):
        return False
    if re.search(r"\[[^\]]*[a-zA-Z0-9]-[a-zA-Z0-9]", s) or re.search(r"%[sdr]|\{\}", s):
        return False
    if re.fullmatch(r"[A-Za-z]{1,3}[/\\][A-Za-z]{1,3}", s):
        return False
    return reads_smiles(s) or QUERY.search(s) is not None and reads_smarts(s)


def python_truth(path):
    """(first line, last line, text) of the notation strings of a module."""
    with open(path, encoding="utf-8") as f:
        src = f.read()
    out = []
    try:
        toks = list(tokenize.generate_tokens(io.StringIO(src).readline))
    except (tokenize.TokenError, SyntaxError):
        return out
    lines = src.splitlines()
    for i, t in enumerate(toks):
        if t.type != tokenize.STRING:
            continue
        try:
            value = ast.literal_eval(t.string)
        except Exception:
            continue
        if not isinstance(value, str):
            continue
        before = lines[t.start[0] - 1][:t.start[1]]
        after = lines[t.end[0] - 1][t.end[1]:]
        if before.rstrip().endswith("+") or after.lstrip().startswith("+"):
            continue  # a piece of a string built at run time
        firm = bool(CONSTRUCTOR.search(before))
        out.extend(candidates(value, t.start[0], t.end[0], firm))
        examples = []
        if ">>>" in value:
            try:
                examples = doctest.DocTestParser().get_examples(value)
            except ValueError:
                examples = []  # not a well-formed doctest
            for ex in examples:
                try:
                    etoks = list(tokenize.generate_tokens(io.StringIO(ex.source).readline))
                except (tokenize.TokenError, SyntaxError):
                    continue
                src_lines = ex.source.splitlines()
                for et in etoks:
                    if et.type != tokenize.STRING:
                        continue
                    try:
                        v = ast.literal_eval(et.string)
                    except Exception:
                        continue
                    if isinstance(v, str):
                        b = src_lines[et.start[0] - 1][:et.start[1]]
                        a = src_lines[et.end[0] - 1][et.end[1]:]
                        if b.rstrip().endswith("+") or a.lstrip().startswith("+"):
                            continue  # a piece of a string built at run time
                        line = t.start[0] + value[:value.find(ex.source.splitlines()[0])].count("\n") + et.start[0] - 1
                        out.extend(candidates(v, line - 1, line + 1, bool(CONSTRUCTOR.search(b))))
    return out


def candidates(value, first, last, firm):
    out = []
    if "\n" in value.strip():
        for k, ln in enumerate(value.split("\n")):
            fields = ln.split()
            if fields and notation_like(fields[0]) and SHAPED.search(fields[0]):
                out.append((first, last, fields[0], False))
        return out
    if firm and value and " " not in value:
        if re.search(r"%[sdr]|\{\}", value):
            return []  # a format string, filled in at run time
        return [(first, last, value, True)]
    ps = parts(value)
    if ps and all(notation_like(p) and SHAPED.search(p) for p in ps):
        out.extend((first, last, p, False) for p in ps)
    return out


def data_truth(path):
    out = []
    with open(path, encoding="utf-8", errors="replace") as f:
        for n, line in enumerate(f, 1):
            s = line.strip()
            if not s or s[0] in "#;" or s.startswith("//"):
                continue
            # Fields: tab-separated, else blank-separated, else comma-
            # separated outside brackets and quotes (csv).
            if "\t" in s:
                raw = s.split("\t")
            elif path.endswith(".csv"):
                raw = next(csv.reader([s]))
            else:
                raw = s.split()
            fields = [x.strip().strip('"') for x in raw if x.strip().strip('"')]
            truth = [x for x in fields if SHAPED.search(x) and notation_like(x)]
            if truth:
                out.append((n, truth))
    return out


def main():
    found = collections.defaultdict(list)  # (corpus, file) -> [(line, dialect, text)]
    with open(sys.argv[1], encoding="utf-8") as f:
        for line in f:
            corpus, path, n, dialect, reason, text, title = line.rstrip("\n").split("\t")
            found[(corpus, path)].append((int(n), dialect, text))

    # Precision.
    total, ok, unread, words = 0, 0, [], []
    for (corpus, path), occs in found.items():
        for n, dialect, text in occs:
            total += 1
            reads = reads_smiles(text) if dialect == "smiles" else reads_smarts(text)
            if reads and re.fullmatch(r"[A-Za-z]+[0-9]?[A-Za-z]*(-[A-Za-z]+[0-9]?)?", text) and \
                    not re.fullmatch(r"(Cl|Br|[BCNOPSFIcnops])+", text):
                words.append("%s/%s:%d %s %s" % (corpus, path, n, dialect, text))
                continue
            if reads:
                ok += 1
            else:
                unread.append("%s/%s:%d %s %s" % (corpus, path, n, dialect, text))
    print("PRECISION: %d occurrences; %d read by RDKit in their dialect; %d not read (listed, to be "
          "judged by hand); %d words that read by accident (counted against)" % (total, ok, len(unread), len(words)))
    for u in unread:
        print("  NOT READ " + u)
    for w in words:
        print("  WORD " + w)

    # Recall in Python modules.
    truth_n, hit_n, misses = 0, 0, []
    root = ROOTS["rdkit-python"]
    for dirpath, _, files in os.walk(root):
        for fn in files:
            if not fn.endswith(".py"):
                continue
            full = os.path.join(dirpath, fn)
            rel = os.path.relpath(full, root)
            # Matched by text within the file (doctest lines make line
            # numbers approximate): each found occurrence counts once.
            have = collections.Counter(t for n, d, t in found.get(("rdkit-python", rel), []))
            for first, last, text, firm in python_truth(full):
                truth_n += 1
                if have[text] > 0:
                    have[text] -= 1
                    hit_n += 1
                else:
                    misses.append("rdkit-python/%s:%d %s%s" % (rel, first, "(firm) " if firm else "", text))
    print("RECALL (Python modules of rdkit): %d of %d notation strings found (%.1f%%)" % (
        hit_n, truth_n, 100.0 * hit_n / max(1, truth_n)))
    for m in misses:
        print("  MISSED " + m)

    # Recall in data files.
    for corpus, files in DATA_FILES.items():
        root = ROOTS[corpus]
        if not root:
            continue
        t_n, h_n, dmiss = 0, 0, []
        for rel in files:
            full = os.path.join(root, rel)
            if not os.path.exists(full):
                continue
            by_line = collections.defaultdict(set)
            for n, d, t in found.get((corpus, rel), []):
                by_line[n].add(t)
            for n, truth in data_truth(full):
                t_n += 1
                if by_line[n] & set(truth):
                    h_n += 1
                else:
                    dmiss.append("%s/%s:%d %s" % (corpus, rel, n, " | ".join(truth)))
        print("RECALL (%s lists and tables): %d of %d lines with notation found (%.1f%%)" % (
            corpus, h_n, t_n, 100.0 * h_n / max(1, t_n)))
        per_file = collections.Counter(m.split(":")[0] for m in dmiss)
        for f, n in sorted(per_file.items()):
            print("  missed %d lines in %s" % (n, f))
        for m in dmiss[:60]:
            print("  MISSED " + m)
        if len(dmiss) > 60:
            print("  ... %d more" % (len(dmiss) - 60))


if __name__ == "__main__":
    main()

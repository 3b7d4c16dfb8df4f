#!/usr/bin/env python3
"""Writes the hostile records of issue 13, one file per record, into DIR.

usage: gen.py DIR

Each file holds one record (a .smi list of one line). run.sh checks them
with `stereoline check` under /usr/bin/time -v. The same inputs are built
by the tests and benchmarks in stereo/hostile_test.go and
notation/hostile_test.go.
"""
import os
import sys


def chain_marks(n):
    # marks on every atom of a chain: [C@H](F) repeated
    return "[C@H](F)" * n


def small_rings(n):
    # a chain of three-membered rings
    return "C%10CC%10" * n


def fused_ladder(n, marked=True):
    assert n < 90, "one ring number per rung"
    # n fused six-membered rings: a top row t0..tn and a bottom row
    # b0..bn joined by the rungs t_i-b_i, with one CH2 between
    # neighbouring fusion atoms of each row. Written as one path (the top
    # row, then the bottom row back) with the rungs as ring closures.
    def fusion(i, hand):
        if not marked or i == 0 or i == n:
            return "C"
        return "[C@H]" if hand else "[C@@H]"
    out = []
    for i in range(n + 1):
        out.append(fusion(i, i % 2 == 0))
        if i < n:
            out.append("%%%d" % (10 + i))
            out.append("C")
    for i in range(n, -1, -1):
        out.append(fusion(i, i % 2 == 1))
        if i < n:
            out.append("%%%d" % (10 + i))
        if i > 0:
            out.append("C")
    return "".join(out)


def sheet(rows, cols):
    # a saturated honeycomb (a brick wall: atom (r, c) bonded to its row
    # neighbours, and to (r+1, c) when r+c is even), every atom marked.
    # Rows are written as chains joined by '.', the bonds between rows
    # as ring closures.
    free = list(range(99, 9, -1))
    down = {}
    out = []
    for r in range(rows):
        if r:
            out.append(".")
        for c in range(cols):
            out.append("[C@H]" if (r * cols + c) % 3 else "[C@@H]")
            if (r - 1, c) in down:
                num = down.pop((r - 1, c))
                out.append("%%%d" % num)
                free.append(num)
            if r + 1 < rows and (r + c) % 2 == 0:
                num = free.pop()
                down[(r, c)] = num
                out.append("%%%d" % num)
    return "".join(out)


def long_chain(n):
    return "C" * n


def nested(n):
    return "C(" * n + "C" + ")" * n


def closures_on_pair(n):
    # n ring closures between the same two atoms, numbered with the
    # reader's %(N) ring numbers beyond 99
    seq = "".join("%%(%d)" % (100 + i) for i in range(n))
    return "C" + seq + "C" + seq


def reaction(n, mapped=False):
    if mapped:
        side = ".".join("[CH4:%d]" % (i + 1) for i in range(n))
    else:
        side = ".".join("C" for _ in range(n))
    return side + ">>" + side


CASES = {
    "chain-marks-2000": chain_marks(2000),
    "chain-marks-4000": chain_marks(4000),
    "chain-marks-8000": chain_marks(8000),
    "chain-marks-50000": chain_marks(50000),
    "small-rings-8000": small_rings(8000),
    "small-rings-20000": small_rings(20000),
    "fused-ladder-20": fused_ladder(20),
    "fused-ladder-40": fused_ladder(40),
    "fused-ladder-80": fused_ladder(80),
    "sheet-30x30": sheet(30, 30),
    "chain-1000000": long_chain(1000000),
    "nested-100000": nested(100000),
    "closures-20000": closures_on_pair(20000),
    "reaction-10000": reaction(10000),
    "reaction-mapped-10000": reaction(10000, mapped=True),
}

if __name__ == "__main__":
    d = sys.argv[1]
    os.makedirs(d, exist_ok=True)
    for name, smi in CASES.items():
        with open(os.path.join(d, name + ".smi"), "w") as f:
            f.write(smi + "\n")

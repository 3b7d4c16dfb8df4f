#!/usr/bin/python3
"""Relate the records of many shards on a Dask cluster.

Each worker runs `stereoline keys` on some of the shards (the binary and
the shards must be reachable from every worker, e.g. on a shared file
system); the keys are then grouped, as any engine's group-by would:

- duplicates: records that share a stereo key (the same structure, or the
  same set of stereoisomers said the same way);
- stereoisomers: records that share a constitution key (the same
  constitution, whatever the configuration), two or more;
- enantiomers: records whose stereo key is another's mirror key (chiral
  records only).

The result is one JSON object on standard output:
{"records": N, "duplicates": [[PLACE, ...], ...],
 "stereoisomers": [[PLACE, ...], ...], "enantiomers": [[[PLACE, ...], [PLACE, ...]], ...]}
where PLACE is "path:line:column"; sets and their members are sorted.

usage:
  dask_relations.py [--scheduler ADDRESS | --workers N] [--stereoline BIN] SHARD...

Without --scheduler a LocalCluster of N worker processes (default 2) is
started and stopped. Needs Debian's python3-dask and python3-distributed.
"""
import argparse
import json
import subprocess
import sys

import dask.bag as db
from distributed import Client, LocalCluster


def keys_of(shard, binary):
    """The records of one shard as stereoline keys prints them."""
    out = subprocess.run([binary, "keys", "--format", "json", shard],
                         check=True, capture_output=True, text=True).stdout
    return [json.loads(line) for line in out.splitlines() if line]


def place(r):
    return f"{r['path']}:{r['line']}:{r['column']}"


def groups(bag, key):
    """Sets of places sharing a key, two or more, each sorted."""
    folded = bag.foldby(key, lambda acc, r: acc + [place(r)], [],
                        lambda a, b: a + b, [])
    return sorted(sorted(g) for _, g in folded.compute() if len(g) > 1)


def enantiomers(bag):
    """Pairs of sides: the records of one stereo key and those of its
    mirror key, for chiral records whose mirror image is in the shards."""
    chiral = bag.filter(lambda r: r["stereo"] != r["mirror"])
    pair_key = lambda r: (r.get("field", 0), min(r["stereo"], r["mirror"]))
    side = lambda r: 0 if r["stereo"] < r["mirror"] else 1

    def add(acc, r):
        acc = [list(acc[0]), list(acc[1])]
        acc[side(r)].append(place(r))
        return acc

    folded = chiral.foldby(pair_key, add, [[], []],
                           lambda a, b: [a[0] + b[0], a[1] + b[1]], [[], []])
    return sorted([sorted(a), sorted(b)] for _, (a, b) in folded.compute() if a and b)


def relate(shards, binary, client):
    bag = db.from_sequence(shards, npartitions=max(1, len(shards)))
    records = bag.map(keys_of, binary).flatten().persist()
    keyed = records.filter(lambda r: r["stereo"] != "")
    return {
        "records": records.count().compute(),
        # check relates records within their field (a table's column, a
        # JSON key; 0 for a list): so does the group-by
        "duplicates": groups(keyed, lambda r: (r.get("field", 0), r["stereo"])),
        "stereoisomers": groups(keyed, lambda r: (r.get("field", 0), r["constitution"])),
        "enantiomers": enantiomers(keyed),
    }


def main():
    ap = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    ap.add_argument("--scheduler", help="address of a running Dask scheduler")
    ap.add_argument("--workers", type=int, default=2, help="LocalCluster worker processes")
    ap.add_argument("--stereoline", default="stereoline", help="the stereoline binary")
    ap.add_argument("shards", nargs="+")
    args = ap.parse_args()
    if args.scheduler:
        with Client(args.scheduler) as client:
            result = relate(args.shards, args.stereoline, client)
    else:
        with LocalCluster(n_workers=args.workers, threads_per_worker=1,
                          processes=True, dashboard_address=None) as cluster, \
                Client(cluster) as client:
            result = relate(args.shards, args.stereoline, client)
    json.dump(result, sys.stdout)
    sys.stdout.write("\n")


if __name__ == "__main__":
    main()

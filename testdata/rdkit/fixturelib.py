"""Shared helpers for the RDKit fixture generators in this directory.

Every generator writes a tab-separated file whose header lines (starting
with '#') name the library, its version, the command that produced the file
and the column format, so a test reading the fixture can say where each
expected value came from.
"""

import os
import shlex
import subprocess
import sys

import rdkit
from rdkit import RDLogger

# RDKit reports every rejected record on stderr; the rejection itself is
# what the fixtures record, so the log is noise.
RDLogger.DisableLog("rdApp.*")

HERE = os.path.dirname(os.path.abspath(__file__))
REPO = os.path.dirname(os.path.dirname(HERE))
NCI_DEFAULT = "/usr/share/RDKit/Data/NCI/first_5K.smi"
SUITE_DEFAULT = os.path.join(
    REPO, "..", "shared", "reference", "cip-validation-suite", "compounds.smi"
)


def debian_version():
    """The Debian package version of python3-rdkit, or 'unknown'."""
    try:
        out = subprocess.run(
            ["dpkg-query", "-W", "-f=${Version}", "python3-rdkit"],
            capture_output=True, text=True, check=True,
        ).stdout.strip()
        return out or "unknown"
    except (OSError, subprocess.CalledProcessError):
        return "unknown"


def command_line():
    """The command that is running, as typed from the repository root."""
    script = os.path.relpath(os.path.abspath(sys.argv[0]), REPO)
    args = [shlex.quote(a) for a in sys.argv[1:]]
    return " ".join(["/usr/bin/python3", script] + args)


def header(out, title, source, columns, notes=()):
    """Writes the '#' header lines common to all fixtures."""
    out.write("# %s\n" % title)
    out.write("# generator: RDKit %s (Debian package python3-rdkit %s)\n"
              % (rdkit.__version__, debian_version()))
    out.write("# command (from the repository root): %s\n" % command_line())
    out.write("# source: %s\n" % source)
    for n in notes:
        out.write("# %s\n" % n)
    out.write("# columns (tab separated):\n")
    for i, (name, desc) in enumerate(columns, 1):
        out.write("#   %d. %s: %s\n" % (i, name, desc))
    out.write("#" + "\t".join(name for name, _ in columns) + "\n")


def read_smi(path):
    """Yields (smiles, identifier) from a tab-separated .smi file."""
    with open(path) as f:
        for line in f:
            line = line.rstrip("\n")
            if not line or line.startswith("#"):
                continue
            parts = line.split("\t")
            yield parts[0], (parts[1] if len(parts) > 1 else "")

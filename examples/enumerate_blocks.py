"""Enumerate amides of the Project Larkspur building blocks.

Written by the Fenwick Row pool team; the structures below are copied from
building_blocks.smi and the reagent table so that the script runs alone.
"""

AMINES = {
    "LRK-BB-001": r"N[C@@H](C)CO",
    "LRK-BB-002": r"N[C@@H](C)C(=O)OC",
    "LRK-BB-003": r"C[C@@H](N)c1ccccc1",
}

# (E)-cyclooctene (trans-cyclooctene) scaffold for the tetrazine ligation
# series. The ring closure sits on a marked atom, so the backslash is
# followed by a digit.
scaffold_smiles = "C\1=C/CCCCCC1"

# The same scaffold in a raw string, as it should be written.
scaffold_smiles_raw = r"C\1=C/CCCCCC1"

acid_smiles = "OC(=O)c1ccccc1"
alkene_smiles = "C/C=CC(=O)O"


def amide_names():
    """Return the IDs of the amides the series will make."""
    return [f"{key}-BZ" for key in AMINES]


if __name__ == "__main__":
    for name in amide_names():
        print(name)

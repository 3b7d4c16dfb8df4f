# Marker file for Python sources. Escape rules from the Python Language
# Reference, "String and Bytes literals" (escape sequences table; invalid
# escapes are kept and warned about since 3.6, SyntaxWarning since 3.12).
# Molecules: (E)-1,2-difluoroethene F/C=C/F and (S)-alanine-like centres
# from the OpenSMILES specification's examples.
import re

smiles = "F/C=C/F"  # want «F/C=C/F»
SMILES_LIST = ["CCO", 'c1ccccc1']  # want «CCO» want «c1ccccc1»
reactant_smiles: str = "CC(=O)O"  # want «CC(=O)O»
data = {"smiles": "N[C@@H](C)C(=O)O", "name": "alanine"}  # want «N[C@@H](C)C(=O)O»
mol = Chem.MolFromSmiles("C[C@H](N)O", sanitize=False)  # want «C[C@H](N)O»
mol = load(smiles="F/C=C\\F")  # want «F/C=C\\F» text «F/C=C\F»
row["smiles"] = "OCC"  # want «OCC»
rxn = "CC=O.N>>CC=N"  # want «CC=O.N>>CC=N»
racemate_smiles = "C[C@H](O)CC |&1:1|"  # want «C[C@H](O)CC |&1:1|»
smiles_col = "SMILES"
smiles_file = "input.smi"
reaction_name = "Suzuki coupling"
label = "CO"
element = "Cl"
status = "OK"
path = "/usr/local/bin"
date = "2024/01/31"
version = "1.2.3"
na = "N/A"
io = "I/O"
pattern = re.compile(r"\d+/\w+")
url = "https://example.org/a/b"
guess = "C/C=C/C"  # want «C/C=C/C»
ring = 'C1CCCCC1'  # want «C1CCCCC1»
# comment "F/C=C/F" is not code
text = "a # F/C=C/F in a string is not a comment"

# Raw strings keep backslashes; \\ is one backslash.
raw = r"F/C=C\F"  # want «F/C=C\F»
doubled = "F/C=C\\F"  # want «F/C=C\\F» text «F/C=C\F»

# Escapes that change the string are errors; the text is as written.
smiles_octal = "C1CC\1"  # want «C1CC\1» error «\1» fix «r"C1CC\1"» fix «"C1CC\\1"»
smiles_oct7 = "C\7C"  # want «C\7C» error «\7»
smiles_t = "C\tC"  # want «C\tC» error «\t»
smiles_n = "C\nC"  # want «C\nC» error «\n»
smiles_r = "C\rC"  # want «C\rC» error «\r»
smiles_a = "C\aC"  # want «C\aC» error «\a»
smiles_b = "C\bC"  # want «C\bC» error «\b»
smiles_f = "F/C=C\fC"  # want «F/C=C\fC» error «\f»
smiles_v = "C\vC"  # want «C\vC» error «\v»
smiles_x = "C\x41C"  # want «C\x41C» error «\x41»
smiles_bad_n = "C\NC"  # want «C\NC» error «\N»
# Invalid escapes are kept by Python with a warning.
warn = "F/C=C\C"  # want «F/C=C\C» warning «\C» fix «r"F/C=C\C"»
smiles_slash = "C\/C=C/C"  # want «C\/C=C/C» warning «\/»

# Implicitly joined literals are one occurrence with a piecewise map.
joined_smiles = "F/C=C" "/F"  # want «F/C=C" "/F» text «F/C=C/F»
# Byte strings are skipped. f-strings and t-strings (language reference,
# "f-strings", "t-strings"; PEP 701 for quotes reused inside fields):
# their fixed text is searched token by token; a token touching a
# replacement field is built at run time and never taken.
smiles_f2 = f"F/C=C/{x}"
smiles_b2 = b"F/C=C/F"
line = f"{cid}\tC[C@H](N)C(=O)O\n"  # want «C[C@H](N)C(=O)O»
row = f"{cid} {name:>{width}} F/C=C/F {row["note"]!r:'>10}"  # want «F/C=C/F»
prefix = f"C{n}CO {core}/F N{x}"
literal_braces = f"{{F/C=C/F}} {x}"
smiles_fixed = f"N[C@@H](C)C(=O)O"  # want «N[C@@H](C)C(=O)O»
smiles_prose = f"see {table} for C{n}"
template_string = t"{a} C1CCCCC1"  # want «C1CCCCC1»
raw_f = rf"{a} F/C=C\F"  # want «F/C=C\F»
smiles_escaped_f = f"{a} C1CC\1"  # want «C1CC\1» error «\1» fix «C1CC\\1»
named_escape = f"{a} \N{DEGREE SIGN}C1CCCCC1 F/C=C/F"  # want «F/C=C/F»
joined = "C1CCCC" f"C1 {x}"  # want «C1CCCC" f"C1» text «C1CCCCC1»
# want-after «CCO» title «ethanol» want-after «F/C=C/F» title «»
SMILES_F_BLOCK = f"""
CCO ethanol
{x} CCN
F/C=C/F {name}
"""
# stereoline: skip-next
skip_f = f"{a} C1CCCCC1"
forced_f = f"{a} CO"  # stereoline: notation  want «CO»

# A named triple-quoted literal is a list, one record a line.
# want-after «CCO» title «ethanol» want-after «F/C=C/F» title «difluoroethene»
SMILES_BLOCK = """
CCO ethanol
F/C=C/F difluoroethene
"""
# stereoline: off
off_smiles = "F/C=C/F"
# stereoline: on
on_smiles = "F/C=C/F"  # want «F/C=C/F»
skipped_smiles = "F/C=C/F"  # stereoline: skip
# stereoline: skip-next
next_smiles = "F/C=C/F"
forced = "CO"  # stereoline: notation  want «CO»
# Format strings (library reference, "Format String Syntax" and
# "printf-style String Formatting"): their fields are replacement fields.
fmt_line = "{}\tC[C@H](N)C(=O)O\n".format(cid)  # want «C[C@H](N)C(=O)O»
pct_line = "%s\tF/C=C/F %5.2f" % (cid, mass)  # want «F/C=C/F»
smiles_pct = "C%sC" % ring
smiles_ring = "C%%10CCCCC%%10 %s" % x  # want «C%%10CCCCC%%10» text «C%10CCCCC%10»
smiles_fmt = "{0}{{x}} C{n}C".format(a, n=2)
# A plain name passed whole to a constructor of the notation carries it:
# the strings it is given or iterates over are taken where they read
# without error ("C1CC", "hello" are left alone).
for probe in ["CCO", "CC(C)O", "C1CC"]:  # want «CCO» want «CC(C)O»
    Chem.MolFromSmiles(probe)
mols = [Chem.MolFromSmiles(q9) for q9 in ("OCC(C)N", "hello")]  # want «OCC(C)N»
held = "CCC(C=O)CCC"  # want «CCC(C=O)CCC»
img = Chem.MolFromSmiles(held, sanitize=False)
p9 = "C=O"  # want «C=O» dialect «smarts»
Chem.MolFromSmarts(p9)
# A converter's argument is not what its name calls it: the reaction side
# held is SMILES, found for what it is.
conv_in = "[*:1][H]"  # want «[*:1][H]»
conv_out = smiles_to_smarts(conv_in)

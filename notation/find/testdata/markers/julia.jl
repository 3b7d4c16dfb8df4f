# Marker file for Julia. Strings from the Julia manual, "Strings": escapes
# as in C (an invalid one is a parse error), $ interpolation, raw"..."
# without escapes, #= =# comments that nest, ' after a value is the
# adjoint operator.
smiles = "F/C=C/F"  # want «F/C=C/F»
raw_smiles = raw"F/C=C\F"  # want «F/C=C\F»
interp = "F/C=C/$x"
bad_smiles = "F/C=C\F"  # want «F/C=C\F» error «\F»
#= "F/C=C/F" #= nested =# "F/C=C/F" =#
t = a' * b'; s2 = "C1CCCCC1"  # want «C1CCCCC1»
r = r"F/C=C/F"
# Interpolation: the fixed text between $name and $(...) is searched token
# by token; a token touching an interpolation is built at run time.
line = "$id\tC[C@H](N)C(=O)O"  # want «C[C@H](N)C(=O)O»
call = "$(f(x, ")")) F/C=C/F C$(n)C"  # want «F/C=C/F»

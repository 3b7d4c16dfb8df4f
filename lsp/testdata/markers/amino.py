# Marker file for the language server tests: each @-annotation in a
# comment names what the server must answer on its line (lsp/marker_test.go).
# The non-ASCII text (é, 😀) keeps the UTF-16 columns honest.
# Sources: L-alanine is (S) and (E)-1,2-difluoroethene is F/C=C/F (common
# practice); Python reads "\1" in an ordinary string as the octal escape
# U+0001 (The Python Language Reference, "String and Bytes literals").

comment = "é😀"
alanine_smiles = "N[C@@H](C)C(=O)O"  # @hover("[C@@H]", "(S)") @inlay("[C@@H]", "S")
trans_smiles = "F/C=C/F"  # é😀 @inlay("F/C=", "E")
ring_smiles = "C1CC\1"  # @diag("\1", "host-escape") @diag("\1", "stereo-ineffective-bond")
isobutane_smiles = "C[C@H](C)C"  # @diag("@", "stereo-ineffective-center")
one_sided_smiles = 'F/C=CF'  # @diag("/", "stereo-one-sided-bond")
label, pair_smiles = "é😀", "C[C@H](C)C"  # @diag("@", "stereo-ineffective-center")
plain = "Cl"  # an element-like word, not notation: no annotation, so no finding

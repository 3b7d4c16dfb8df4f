# Marker file for R. Escapes from the R Language Definition, 10.3.1
# "Constants" and ?Quotes: an unrecognised escape is an error; raw
# strings r"(...)" since R 4.0.0.
smiles <- "F/C=C/F"  # want «F/C=C/F»
raw_smiles <- r"(F/C=C\F)"  # want «F/C=C\F»
bad_smiles <- "F/C=C\F"  # want «F/C=C\F» error «\F» fix «r"(F/C=C\F)"»
mols <- c("CO", "Cl")
smiles_vec <- c("CCO", "C1CC1")  # want «CCO» want «C1CC1»
`odd name` <- "F/C=C/F"  # want «F/C=C/F»

# label is Greek and has an emoji before the notation on one line
label = "α-🧪"; smiles = "C1CCC/C=C/1"
ring_smiles = "F/C=C\1CCCCC1"

// Marker file for Kotlin. Escapes and templates from the Kotlin language
// specification, "String literals": \t \b \n \r \' \" \\ \$ and \u; raw
// strings """...""" have no escapes; $name and ${...} are templates.
val smiles = "F/C=C/F" // want «F/C=C/F»
val raw = """F/C=C\F""" // want «F/C=C\F»
val templ = "F/C=C/$x"
val bad = "F/C=C\F" // want «F/C=C\F» error «\F» fix «"""F/C=C\F"""»
val list = listOf("CO", "Cl")
val smilesList = listOf("CCO", "C1CC1") // want «CCO» want «C1CC1»

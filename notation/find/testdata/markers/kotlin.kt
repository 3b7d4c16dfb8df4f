// Marker file for Kotlin. Escapes and templates from the Kotlin language
// specification, "String literals": \t \b \n \r \' \" \\ \$ and \u; raw
// strings """...""" have no escapes; $name and ${...} are templates.
val smiles = "F/C=C/F" // want «F/C=C/F»
val raw = """F/C=C\F""" // want «F/C=C\F»
val templ = "F/C=C/$x"
val bad = "F/C=C\F" // want «F/C=C\F» error «\F» fix «"""F/C=C\F"""»
val list = listOf("CO", "Cl")
val smilesList = listOf("CCO", "C1CC1") // want «CCO» want «C1CC1»
// Templates: the fixed text between $name and ${...} is searched token by
// token; a token touching a template is built at run time.
val line = "$id\tC[C@H](N)C(=O)O" // want «C[C@H](N)C(=O)O»
val row = "${m["k"]} F/C=C/F $x/y C${n}C1" // want «F/C=C/F»
val dollar = "\$x C1CCCCC1 $y" // want «C1CCCCC1»
val money = "${'$'}F/C=C/F"
val raw2 = """${'$'} F/C=C\F $x""" // want «F/C=C\F»
val quotes = """a""""
// trimIndent() is not applied: each line's leading blanks are trimmed as
// in any record list.
// want-after «CCO» title «» want-after «F/C=C/F»
val smilesBlock = """
    CCO $name
    $x CCN
    F/C=C/F
""".trimIndent()
// stereoline: skip-next
val skipped = "$id C1CCCCC1"
// trimMargin() drops the margin prefix after the blanks of each line.
// want-after «CCO» title «ethanol» want-after «F/C=C/F»
val smilesMargin = """
    |CCO ethanol
    |F/C=C/F
""".trimMargin()
// want-after «C1CCCCC1»
val smilesHash = """
    >C1CCCCC1
""".trimMargin(">")
// Format strings: java.util.Formatter conversions are replacement fields.
val fmtLine = "%s\tC[C@H](N)C(=O)O%n".format(id) // want «C[C@H](N)C(=O)O»
val smilesFmt = String.format("C%dC", n)

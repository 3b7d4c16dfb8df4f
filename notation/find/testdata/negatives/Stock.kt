// Ordinary Kotlin: nothing here is notation.
val states = listOf("CO", "NO", "OK", "IN", "OR")
val units = mapOf("C" to "celsius", "F" to "fahrenheit", "K" to "kelvin")
val missing = "N/A"
val port = "I/O"
val path = """C:\Data\stock.csv"""
fun label(loc: String, sku: String) = "$loc/$sku"
val codes = arrayOf("C3PO", "B12", "CO2", "H2O", "A1:C10")
val sep = '/'
fun report(sku: String, qty: Int, year: Int) = "$sku: $qty items on $year/01/31 at 12:30:00"
fun path(year: Int) = "data/${year}/C1/report.csv or B2:B10, v1.2.3, I/O, N/A"
val help = """
    Usage: stock --input ${'$'}HOME/stock.csv
    Codes: H2O CO2 C3PO A1:C10 at ${System.currentTimeMillis()}
""".trimIndent()
val margin = """
    |state CO
    |ratio 16/9
""".trimMargin()

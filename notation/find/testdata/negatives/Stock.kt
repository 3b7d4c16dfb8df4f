// Ordinary Kotlin: nothing here is notation.
val states = listOf("CO", "NO", "OK", "IN", "OR")
val units = mapOf("C" to "celsius", "F" to "fahrenheit", "K" to "kelvin")
val missing = "N/A"
val port = "I/O"
val path = """C:\Data\stock.csv"""
fun label(loc: String, sku: String) = "$loc/$sku"
val codes = arrayOf("C3PO", "B12", "CO2", "H2O", "A1:C10")
val sep = '/'

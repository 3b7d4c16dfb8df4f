# Ordinary Julia: nothing here is notation.
module Stock
const STATES = ["CO", "NO", "OK", "IN", "OR"]
const UNITS = Dict("C" => "celsius", "F" => "fahrenheit", "K" => "kelvin")
missing_label = "N/A"
port = "I/O"
path = raw"C:\Data\stock.csv"
greeting(name) = "Hello, $name!"
codes = ["C3PO", "B12", "CO2", "H2O", "A1:C10"]
#= block comment "F/C=C/F"? no: block comments are not code =#
re = r"^[A-Z]{2}[0-9]+$"
A = [1 2; 3 4]; B = A'; c = 'x'
ratio = 16 / 9
end
report(sku, qty, year) = "$sku: $qty items on $(year)/01/31, ratio $(qty/2)/9, v1.2.3"
help = """
    Usage: model --input $(ENV["HOME"])/stock.csv
    Codes: H2O CO2 C3PO A1:C10 N/A I/O
"""

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

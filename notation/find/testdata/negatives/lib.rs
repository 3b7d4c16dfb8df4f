// Ordinary Rust: nothing here is notation.
use std::collections::HashMap;

const STATES: [&str; 5] = ["CO", "NO", "OK", "IN", "OR"];

fn units() -> HashMap<&'static str, &'static str> {
    let mut m = HashMap::new();
    m.insert("C", "celsius");
    m.insert("F", "fahrenheit");
    m.insert("K", "kelvin");
    m
}

fn label<'a>(loc: &'a str, sku: &'a str) -> String {
    format!("{}/{}", loc, sku)
}

fn main() {
    let path = r"C:\Data\stock.csv";
    let missing = "N/A";
    let port = "I/O";
    let c = 'x';
    let bytes = b"C3PO";
    let codes = vec!["C3PO", "B12", "CO2", "H2O", "A1:C10"];
    println!("{} {} {} {} {:?} {:?}", path, missing, port, c, bytes, codes);
    println!("{}", label("B2", "A-100"));
}

fn report(sku: &str, qty: u32, year: u32) -> String {
    println!("{sku:<12} {qty:>6} C{}N at {year}/01/31 {{total}}", 1);
    format!("saved to /var/lib/{}/C1/report.csv (B2:B10, v1.2.3), N/A I/O", sku)
}

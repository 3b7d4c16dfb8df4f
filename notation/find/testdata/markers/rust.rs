// Marker file for Rust. Escape rules from The Rust Reference, "Tokens"
// (quote escapes, ASCII escapes \n \r \t \\ \0, unicode escapes; anything
// else is an error). Raw strings r"..." and r#"..."# have no escapes.
fn main() {
    let smiles = "F/C=C/F"; // want «F/C=C/F»
    let raw_smiles = r"F/C=C\F"; // want «F/C=C\F»
    let hashed = r#"C[C@H](N)O"#; // want «C[C@H](N)O»
    let lifetime: &'static str = "CO";
    let c = '"';
    let bytes_smiles = b"F/C=C/F";
    let bad_smiles = "F/C=C\F"; // want «F/C=C\F» error «\F» fix «r"F/C=C\F"»
    /* "F/C=C/F" /* nested */ "F/C=C/F" */
    let ok = "F/C=C\\F"; // want «F/C=C\\F» text «F/C=C\F»
    // Format strings (std::fmt): {...} fields, {{ and }} for braces.
    let line = format!("{}\tC[C@H](N)C(=O)O\n", id); // want «C[C@H](N)C(=O)O»
    writeln!(out, "{id:>8} F/C=C/F {{C}}").unwrap(); // want «F/C=C/F»
    let smiles = format!("C{}C", n);
}

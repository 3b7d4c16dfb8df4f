// Marker file for Java. Escape rules from The Java Language
// Specification, 3.10.7 "Escape Sequences": any other escape is a
// compile-time error.
class Markers {
    String smiles = "F/C=C/F"; // want «F/C=C/F»
    String bad = "F/C=C\F"; // want «F/C=C\F» error «\F» fix «"F/C=C\\F"»
    String ok = "F/C=C\\F"; // want «F/C=C\\F» text «F/C=C\F»
    char q = '"';
    Mol m = Mol.fromSmiles("C[C@H](N)O"); // want «C[C@H](N)O»
    String block = """
        F/C=C/F
        """;
    String[] words = {"CO", "Cl", "N/A"};
}

// Marker file for Java. Escape rules from The Java Language
// Specification, 3.10.7 "Escape Sequences": any other escape is a
// compile-time error.
class Markers {
    String smiles = "F/C=C/F"; // want «F/C=C/F»
    String bad = "F/C=C\F"; // want «F/C=C\F» error «\F» fix «"F/C=C\\F"»
    String ok = "F/C=C\\F"; // want «F/C=C\\F» text «F/C=C\F»
    char q = '"';
    Mol m = Mol.fromSmiles("C[C@H](N)O"); // want «C[C@H](N)O»
    // Text blocks (JLS 3.10.6): incidental white space and trailing blanks
    // are stripped before escapes are read; \<line end> joins two lines
    // and \s is a space. Unnamed blocks are not guessed.
    String block = """
        F/C=C/F
        """;
    // want-after «F/C=C/F» title «trans» want-after «N[C@@H](C)C(=O)O» title «alanine»
    String smilesBlock = """
        F/C=C/F   trans   
            N[C@@H](C)C(=O)O alanine

        """;
    // A record split by a line continuation: see TestTemplateMaps.
    // want-after «C1CC\1» error «\1» fix «C1CC\\1» want-after «C1CCCCC1» title «cyclohexane\s»
    String[] smilesList = {"""
      C1CC\1
      C1CCCCC1 cyclohexane\s
      """};
    String notBlock = """ F/C=C/F""";
    Mol fromBlock = Mol.fromSmiles("""
        C[C@@H](O)CC"""); // want «C[C@@H](O)CC»
    // stereoline: skip-next
    String skippedSmiles = """
        F/C=C/F
        """;
    // A switch inside a block's lines works from its line on.
    // want-after «CCO»
    String smilesSwitch = """
        CCO
        """ + // stereoline: off
        """
        CCN
        """;
    // stereoline: on
    // Format strings (java.util.Formatter): conversions are fields, %n a
    // line end, %% a percent sign.
    // want-after «C1CCCCC1» title «»
    String smilesFormatted = """
        C1CCCCC1 %s
        C%dC
        """.formatted(name, n);
    String line = String.format("%s\tF/C=C/F%n", id); // want «F/C=C/F»
    void print() { System.out.printf("%d C%%10CC%%10 %s", a, b); } // want «C%%10CC%%10» text «C%10CC%10»
    String[] words = {"CO", "Cl", "N/A"};
}

package find

import (
	"strings"
	"testing"
	"time"
)

// TestNoBlowUp feeds each scanner a hostile file of a few hundred
// kilobytes (nested brackets, unmatched backticks, unterminated raw
// strings, thousands of pragmas, unclosed replacement fields, text
// blocks and code spans) and checks that it finishes quickly: no input
// may make the finder hang or go quadratic.
func TestNoBlowUp(t *testing.T) {
	cases := []struct {
		k Kind
		s string
	}{
		{KindMarkdown, strings.Repeat("` `` ", 100000)},
		{KindMarkdown, strings.Repeat("`a\n``b\n", 100000)},
		{KindPython, strings.Repeat("(", 300000) + "'''"},
		{KindPython, strings.Repeat(`f"{(" `, 100000)},
		{KindPython, `f"""` + strings.Repeat("{x:{", 100000)},
		{KindPython, strings.Repeat(`f"{x["`, 100000)},
		// One literal joined from 20,000 pieces with 40,000 records.
		{KindPython, strings.Repeat(`f"{x} C1CCCCC1 F/C=C/F {y}" `, 20000)},
		{KindJavaScript, strings.Repeat("/\n", 200000)},
		{KindJavaScript, strings.Repeat("`${", 100000)},
		{KindYAML, strings.Repeat("- ", 200000)},
		{KindJSON, strings.Repeat("[", 200000)},
		// errors the reading goes on after (resync): at every depth of
		// 500 nested arrays, each element on a line of its own, and on
		// every line of a long array
		{KindJSON, deepBrokenJSON(500, 100000)},
		{KindJSON, "[\n" + strings.Repeat("  {\"smiles\": \"C\" \"x\"}\n", 100000) + "]\n"},
		{KindJSON, "[\n" + strings.Repeat("  x\n", 200000) + "]\n"},
		{KindNotebook, `{"cells":[` + strings.Repeat(`{"cell_type":"code","source":"x_smiles = 'C'\n"},`, 10000) + `]}`},
		{KindList, strings.Repeat("# stereoline: off\nC\n# stereoline: on\nC\n", 50000)},
		{KindCSV, "smiles\n" + strings.Repeat("\"C\"\"\n", 100000)},
		{KindGo, strings.Repeat("`", 100001)},
		{KindRust, strings.Repeat("r#\"", 100000)},
		{KindKotlin, strings.Repeat("\"\"\"$", 100000)},
		{KindKotlin, strings.Repeat("\"${\"", 100000)},
		{KindJava, "String smiles = \"\"\"\n" + strings.Repeat("  C1CCCCC1 \\\n", 50000) + "\"\"\";"},
		{KindJava, strings.Repeat("\"\"\"\n", 100000)},
		{KindJulia, strings.Repeat("\"$(", 100000)},
		// reStructuredText: nested directives, literal blocks, one long
		// line of notation with blocks after it, unclosed literals
		{KindRST, strings.Repeat(".. code-block:: python\n ", 50000)},
		{KindRST, strings.Repeat("a::\n\n  C1CC1\n", 50000)},
		{KindRST, strings.Repeat("C[C@H](F)Cl |", 100000)},
		{KindRST, strings.Repeat("``C ", 100000)},
		{KindPython, `"""` + strings.Repeat("C |x ", 200000) + `"""`},
		// SD files: items without values, records without end
		{KindSDF, strings.Repeat("> <SMILES>\n", 100000)},
		{KindSDF, strings.Repeat("x\n\n\nM  END\n> <SMILES>\nC1CC1\n\n$$$$\n", 30000)},
	}
	for _, c := range cases {
		start := time.Now()
		FindKind(c.k, []byte(c.s), Config{})
		if d := time.Since(start); d > 5*time.Second {
			t.Errorf("%s: %v for %d bytes", c.k, d, len(c.s))
		}
	}
}

// deepBrokenJSON nests depth arrays, each element beginning a line one
// space further in, with a line that does not read at the bottom and
// lines more indented than any member after it.
func deepBrokenJSON(depth, lines int) string {
	var b strings.Builder
	for k := range depth {
		b.WriteString(strings.Repeat(" ", k) + "[\n")
	}
	b.WriteString(strings.Repeat(" ", depth) + "x x\n")
	b.WriteString(strings.Repeat(strings.Repeat(" ", depth+100)+"y\n", lines))
	return b.String()
}

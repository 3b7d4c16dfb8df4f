package find

import (
	"strings"
	"testing"
	"time"
)

// TestNoBlowUp feeds each scanner a hostile file of a few hundred
// kilobytes (nested brackets, unmatched backticks, unterminated raw
// strings, thousands of pragmas) and checks that it finishes quickly: no
// input may make the finder hang or go quadratic.
func TestNoBlowUp(t *testing.T) {
	cases := map[Kind]string{
		KindMarkdown:   strings.Repeat("` `` ", 100000),
		KindPython:     strings.Repeat("(", 300000) + "'''",
		KindJavaScript: strings.Repeat("/\n", 200000),
		KindYAML:       strings.Repeat("- ", 200000),
		KindJSON:       strings.Repeat("[", 200000),
		KindNotebook:   `{"cells":[` + strings.Repeat(`{"cell_type":"code","source":"x_smiles = 'C'\n"},`, 10000) + `]}`,
		KindList:       strings.Repeat("# stereoline: off\nC\n# stereoline: on\nC\n", 50000),
		KindCSV:        "smiles\n" + strings.Repeat("\"C\"\"\n", 100000),
		KindGo:         strings.Repeat("`", 100001),
		KindRust:       strings.Repeat("r#\"", 100000),
		KindKotlin:     strings.Repeat("\"\"\"$", 100000),
	}
	for k, s := range cases {
		start := time.Now()
		FindKind(k, []byte(s), Config{})
		if d := time.Since(start); d > 5*time.Second {
			t.Errorf("%s: %v for %d bytes", k, d, len(s))
		}
	}
}

package find

import (
	"reflect"
	"testing"
)

// TestCodeRules is a table of small sources and the notation texts the
// rules must take from them, in order; "q:" marks a query pattern
// (DialectSMARTS). Molecules are OpenSMILES examples;
// the language syntax is each language's reference.
func TestCodeRules(t *testing.T) {
	tests := []struct {
		kind Kind
		src  string
		want []string
	}{
		{KindPython, `if smiles == "CCO": pass`, []string{"CCO"}},
		// a word under a loose name is taken beside other patterns of its
		// list (rdkit's VLib doctests write smas = ['C=O','CN']), not
		// alone (a parser's mode letter, pattern = 'O')
		{KindPython, `smas = ['C=O', 'CN']`, []string{"q:C=O", "q:CN"}},
		{KindPython, `pattern = 'O'`, nil},
		// a URL query under a loose name, alone and beside a pattern
		{KindGo, `u := URL{Path: "/p", RawQuery: "a=b"}`, nil},
		{KindPython, `queries = ["c=c", "[#6]=O"]`, []string{"q:c=c", "q:[#6]=O"}},
		// globs and regular expressions under a loose name (setuptools'
		// tests write patterns = ["**/*.txt", "[ab].*"])
		{KindPython, `patterns = ["**/*.txt", "[ab].*", "[cn]**"]`, nil},
		// a recursive pattern's bond is no range of characters, and a
		// mapped wildcard is an attachment point (rdkit-data Contrib's
		// LEF and mmpa scripts write both unnamed); a bare "[*-]" is not
		{KindPython, `x = "[N;!H0;$(N-[#6]);!$(N-C=[O,N,S])]"`, []string{"q:[N;!H0;$(N-[#6]);!$(N-C=[O,N,S])]"}},
		{KindPython, `core = frag.replace("[*:1]", "[H]")`, []string{"[*:1]"}},
		{KindPython, `marks = ("[*-]", "[*+]")`, nil},
		// a bracket that requires two elements at once is a compound
		// expression of another language (sympy's Mathematica parser
		// tests); conjunctions with counts and numbers are patterns
		{KindPython, `assert chain("a*b/c") == 1` + "\n" + `assert chain("a[b;c]") == 2`, nil},
		{KindPython, `x = "[C;#7]CC"`, nil},
		{KindPython, `x = "c[n;H1]c"`, []string{"q:c[n;H1]c"}},
		{KindPython, `x = "[N;H]CC"`, []string{"q:[N;H]CC"}},
		{KindPython, `x = "[#6;C]C[c&#6]"`, []string{"q:[#6;C]C[c&#6]"}},
		// C-API format strings: a list that repeats its item is none
		{KindPython, `buildvalue('[O]', 1)` + "\n" + `buildvalue('[O,O]', 1, 2)`, nil},
		{KindPython, `x = "[Cl,Br,I]C"`, []string{"q:[Cl,Br,I]C"}},
		{KindPython, `def f(smiles: str = "CCO"): pass`, []string{"CCO"}},
		{KindPython, "smiles_list = []\nsmiles_list.append(\"CCN\")\n", []string{"CCN"}},
		{KindPython, `mols = {"a": "CCO"}`, nil},
		{KindPython, `SMILES = {"ethanol": "CCO", "name": "x"}`, []string{"CCO"}},
		{KindPython, `smiles = open("input.smi").read()`, nil},
		{KindPython, `smiles = ""`, nil},
		{KindPython, `smiles = "see table 2"`, nil},
		{KindPython, "SMILES = \"\"\"\nCCO ethanol\n\"\"\"", []string{"CCO"}},
		{KindPython, `rxn = "CC>>CO" if x else "CC>>CN"`, []string{"CC>>CO", "CC>>CN"}},
		{KindPython, "smiles = (\n    \"F/C=C\"\n    \"/F\"\n)\n", []string{"F/C=C/F"}},
		{KindPython, `df["smiles"] = "CCO"`, []string{"CCO"}},
		{KindPython, `x = dict(smiles="CCO", label="CO")`, []string{"CCO"}},
		{KindPython, `parse_smiles("CCO", sanitize="CO")`, []string{"CCO"}},
		{KindPython, `print("F/C=C/F")`, []string{"F/C=C/F"}},
		{KindPython, `print("CO")`, nil},
		{KindPython, `rxn = AllChem.ReactionFromSmarts("[C:1](=[O:2])-[OD1].[N!H0:3]>>[C:1](=[O:2])[N:3]")`, []string{"q:[C:1](=[O:2])-[OD1].[N!H0:3]>>[C:1](=[O:2])[N:3]"}},
		{KindPython, `reaction_smarts = "[C:1]=[O:2]>>[C:1][O:2]"`, []string{"q:[C:1]=[O:2]>>[C:1][O:2]"}},
		{KindPython, `patt = Chem.MolFromSmarts("[#6]-[#8]")`, []string{"q:[#6]-[#8]"}},
		{KindPython, `rxn = AllChem.ReactionFromSmarts("[C:1]=[C:2]>>[C:1][C:2]")`, []string{"q:[C:1]=[C:2]>>[C:1][C:2]"}},
		{KindPython, `patt_smarts = "[C:1]=[C:2]"`, []string{"q:[C:1]=[C:2]"}},
		{KindPython, `reaction = AllChem.ReactionFromSmiles("C=CC>>CCC")`, []string{"C=CC>>CCC"}},
		{KindPython, `inchi = "InChI=1S/C2H6O/c1-2-3/h3H,2H2,1H3"`, nil},
		// Words that often name other things (pattern, template, rule,
		// filter, smart) name notation only when it reads without error:
		// general code (f2py's rule tables of C snippets, a certificate
		// request template, a sync policy class) is full of them.
		{KindPython, `SmartSyncPolicy.local = SmartSyncPolicy('local')`, nil},
		{KindPython, `sma = compute_sma("close", window=20)`, nil},
		{KindPython, `rules = {"return": "return;", "append": "flen(#varname#),", "fmt": "O!"}`, nil},
		{KindPython, "req_template = \"\"\"\n    [req]\n    distinguished_name = req_dn\n\"\"\"\n", nil},
		{KindPython, `patt = "[C;H2]-[O"`, nil},
		{KindPython, `pattern = "[#6]-[#8]"`, []string{"q:[#6]-[#8]"}},
		{KindPython, `template = "[C:1]=[O:2]>>[C:1][O:2]"`, []string{"q:[C:1]=[O:2]>>[C:1][O:2]"}},
		{KindPython, "templates = \"\"\"\n[C:1]=[O:2]>>[C:1][O:2]\n[N;H2:1]>>[N;H1:1]C\n\"\"\"\n", []string{"q:[C:1]=[O:2]>>[C:1][O:2]", "q:[N;H2:1]>>[N;H1:1]C"}},
		// regular expressions, whose classes look like bracket atoms with
		// an isotope (CPython's test_re writes these); a method named like
		// a keyword is still a call
		{KindPython, `m = re.match(r"[19K]", s, re.I)`, nil},
		{KindPython, `m = re.match(u(r"[19K]"), u(s))`, nil},
		{KindGo, `var rx = regexp.MustCompile("[13C]+")`, nil},
		{KindJavaScript, `const rx = new RegExp("[13C]", "g");`, nil},
		{KindPython, `hit = table.match("C[C@H](F)Cl")`, []string{"C[C@H](F)Cl"}},
		// an explicit SMARTS name keeps a broken pattern, to report it
		{KindPython, `smarts = "[C;H2]-[O"`, []string{"q:[C;H2]-[O"}},
		{KindPython, `smiles = f"{a}CC"`, nil},
		{KindPython, `smiles = rb"CC"`, nil},
		{KindPython, "x = 1 \\\n  ; smiles = 'CCO'", []string{"CCO"}},
		{KindJavaScript, `const { smiles = "CCO" } = opts;`, []string{"CCO"}},
		{KindJavaScript, `items.push({ smiles: "CCO", id: "CO" });`, []string{"CCO"}},
		{KindJavaScript, `const smiles: string[] = ["CCO", "CCN"];`, []string{"CCO", "CCN"}},
		{KindJavaScript, "x = a / b; y = 'F/C=C/F' // 'C1CC1'", []string{"F/C=C/F"}},
		{KindGo, "var m = map[string]string{\"smiles\": \"CCO\", \"name\": \"x\"}", []string{"CCO"}},
		{KindGo, "smiles := []string{\n\t\"CCO\",\n\t\"CCN\",\n}\n", []string{"CCO", "CCN"}},
		{KindR, `df$smiles <- c("CCO", "CCN")`, []string{"CCO", "CCN"}},
		{KindJulia, `smiles = ["CCO", "CCN"]`, []string{"CCO", "CCN"}},
		{KindRust, `let v = vec!["CCO"]; let smiles = vec!["CCN"];`, []string{"CCN"}},
		{KindKotlin, `val smiles = mutableListOf("CCO")`, []string{"CCO"}},
		{KindGo, "var smiles = `CCO\r\nCCN`", []string{"CCO", "CCN"}},
		{KindYAML, "query_smarts: C1CCCCC1\nother: C1CCCCC1\n", []string{"q:C1CCCCC1", "C1CCCCC1"}},
		{KindJSON, `{"query_smarts": "C1CCCCC1", "other": "C1CCCCC1"}`, []string{"q:C1CCCCC1", "C1CCCCC1"}},
		{KindJSON, `{"smarts_col": "SMARTS", "patterns": ["[#6;R]", "[CX3]=[OX1]"]}`, []string{"q:[#6;R]", "q:[CX3]=[OX1]"}},
		// SMARTS by context: constructors of Python, JavaScript, Java and
		// Kotlin libraries (RDKit, the CDK, pybel, Indigo, RDKit's
		// JavaScript build), names that say smarts, and lists so named.
		{KindPython, `acc = [Chem.MolFromSmarts(s) for s in ("[oH0;X2]", "[OH1;X2;v2]")]`, []string{"q:[oH0;X2]", "q:[OH1;X2;v2]"}},
		{KindPython, "StructuralAlertSmarts = [\n  '*1[O,S,N]*1',\n  '[CH1](=O)',\n  'I',\n]", []string{"q:*1[O,S,N]*1", "q:[CH1](=O)", "q:I"}},
		{KindPython, `p = pybel.Smarts("[#6]=O")`, []string{"q:[#6]=O"}},
		{KindJavaScript, `const q = RDKit.get_qmol("[#7;H2]");`, []string{"q:[#7;H2]"}},
		{KindJava, `SmartsPattern ptrn = SmartsPattern.create("[NX3;H2]c");`, []string{"q:[NX3;H2]c"}},
		{KindJava, `SMARTSQueryTool sqt = new SMARTSQueryTool("c1ccccc1", builder);`, []string{"q:c1ccccc1"}},
		{KindKotlin, `val q = SmartsPattern.create("[OX2H][CX3]=[OX1]")`, []string{"q:[OX2H][CX3]=[OX1]"}},
		{KindJava, `IndigoObject q = indigo.loadSmarts("[#6]-[#7]");`, []string{"q:[#6]-[#7]"}},
		// SMARTS by content, whatever the name.
		{KindPython, `reactionDefs = ("[#7;+0;D2,D3:1]!@C(!@=O)!@[#7;+0;D2,D3:2]>>*[#7:1].[#7:2]*",)`, []string{"q:[#7;+0;D2,D3:1]!@C(!@=O)!@[#7;+0;D2,D3:2]>>*[#7:1].[#7:2]*"}},
		{KindPython, `rxn = "[C:1]=!@[C:2]>>[C:1]*.*[C:2]"`, []string{"q:[C:1]=!@[C:2]>>[C:1]*.*[C:2]"}},
		{KindPython, `salts = ["[Cl,Br,I]", "[Li,Na,K,Ca,Mg]"]`, []string{"q:[Cl,Br,I]", "q:[Li,Na,K,Ca,Mg]"}},
		{KindPython, `x = "[c;x2;D2;r5:1]([n;x2;r5:2])[n;x2;r5:3]"`, []string{"q:[c;x2;D2;r5:1]([n;x2;r5:2])[n;x2;r5:3]"}},
		{KindPython, `regex = "[a-z]"`, nil},
		// A loosely named list (rules, templates) whose literals are
		// mostly no records holds no patterns: the one that happens to
		// read is dropped (pyparsing's arithmetic examples hold "A=B"
		// among "(A+B)=C"); one that is a record by its content stays.
		{KindPython, `rules = ["(A+B)=C", "A GT 0", "A=B", "(A-B)=C", "A < 7000"]`, nil},
		{KindPython, `templates = ["[C:1]=[O:2]>>[C:1][O:2]", "x", "y", "z", "w"]`, []string{"q:[C:1]=[O:2]>>[C:1][O:2]"}},
		{KindPython, `patterns = ["C=O", "CN", "not a pattern", "[OH]"]`, []string{"q:C=O", "q:CN", "q:[OH]"}},
		// Adjacent primitives are ANDed (Daylight SMARTS theory manual,
		// 4.1): "[san]" is an atom both sulfur and nitrogen, an INI
		// section of a configuration template, not a pattern.
		{KindPython, "req_template = \"\"\"\n[san]\nDNS.1 = host\n\"\"\"\n", nil},
		{KindPython, `pattern = "[se]"`, []string{"q:[se]"}},
		// A comma list of single capitals nobody names is a commutator
		// or an index pair in prose ("[A,C] + [B,C]" in sympy's
		// docstrings); a list of elements stays.
		{KindPython, "def f():\n    \"\"\"Expands.\n\n    >>> c.expand()\n    [A,C] + [B,C]\n    \"\"\"\n", nil},
		{KindPython, `x = "[Cl,Br,I]"`, []string{"q:[Cl,Br,I]"}},
		// "reaction" alone is an English word as often (the emoji
		// reactions of a chat API): its text is taken only when it reads
		{KindJSON, `{"reaction": {"emoji": "x", "unicode": "U+1F44D"}}`, nil},
		{KindPython, `reactions = ["C=C.O>>CCO", "CC(=O>>CC"]`, []string{"C=C.O>>CCO", "CC(=O>>CC"}},
		{KindPython, `reaction = "CC(=O"`, nil},
		{KindPython, `rxn = "CC(=O>>CC"`, []string{"CC(=O>>CC"}},
		// docstring prose keeps a CXSMILES extension block with its
		// notation: without it the racemate would read as one enantiomer
		{KindPython, "def f():\n    \"\"\"The racemate C[C@H](O)CC |&1:1| is read whole.\"\"\"\n", []string{"C[C@H](O)CC |&1:1|"}},
		{KindPython, `print(f"{cid}\tC[C@H](O)CC |&1:1|\t{n}")`, []string{"C[C@H](O)CC |&1:1|"}},
		// A list nobody names that holds unmistakable notation holds
		// records: its other literals that read as notation are taken,
		// words and key=value pairs are not (common practice: lists of
		// test structures mix ring and stereo records with acyclic ones).
		{KindPython, `xs = ["F/C=C/F", "CC(=O)O", "CCN(CC)CC", "CCO", "hello", "a=b"]`, []string{"F/C=C/F", "CC(=O)O", "CCN(CC)CC"}},
		{KindJavaScript, `const list = ["C[C@H](N)C(=O)O", "OCC(O)CO"];`, []string{"C[C@H](N)C(=O)O", "OCC(O)CO"}},
		// without one, they are not
		{KindPython, `ys = ["CC(=O)O", "CCN(CC)CC"]`, nil},
		// a string of records separated by blanks nobody names, likewise
		// (the records of "...".split())
		{KindPython, `parts = "CC(=O)O C[C@@H](O)CC".split()`, []string{"CC(=O)O", "C[C@@H](O)CC"}},
		{KindPython, `msg = "use C[C@@H](O)CC here"`, nil},
		{KindPython, `msg = "CC(=O)O CCN(CC)CC"`, nil},
		{KindPython, `glob_pattern = "*"`, nil},
		// One argument of one function agrees over the file.
		{KindPython, "P('a', 'c[SH]', 'c[S-]')\nP('b', '[!O]S(=O)(=O)[OH]', '[!O]S(=O)(=O)[O-]')", []string{"q:c[SH]", "q:c[S-]", "q:[!O]S(=O)(=O)[OH]", "q:[!O]S(=O)(=O)[O-]"}},
		// Several records in one string, split when each part is one.
		{KindPython, `rxn_examples = "c1nc[nH]c1,c1ncn([*])c1"`, []string{"c1nc[nH]c1", "c1ncn([*])c1"}},
		{KindPython, `smiles = "CCO CCN"`, []string{"CCO", "CCN"}},
		{KindPython, `smiles = "CC(=O)O acetic acid"`, nil},
		{KindPython, `x = "c1ccccc1;C1CCCCC1"`, []string{"c1ccccc1", "C1CCCCC1"}},
		// Words and labels under a mere name are not notation; in a
		// constructor they are.
		{KindPython, `SMILES = 'smiles'`, nil},
		{KindPython, `smiles = "WATER"`, nil},
		{KindPython, `reaction = "R1a"`, nil},
		{KindPython, `smiles = "CCO"`, []string{"CCO"}},
		{KindPython, `m = Chem.MolFromSmiles("WATER")`, []string{"WATER"}},
		{KindPython, `m = Chem.MolFromSmiles("O")`, []string{"O"}},
		{KindPython, "rxn_block = '''$RXN\n\n  RDKit\n\n  1  1\nM  END\n'''", nil},
		// for-loops over literals bound to notation names.
		{KindPython, "for smi in ['CCO', 'c1ccccc1']:\n    pass", []string{"CCO", "c1ccccc1"}},
		{KindPython, "for name in ['CCO']:\n    pass", nil},
		{KindJavaScript, `for (const smi of ["CCO", "CCN"]) {}`, []string{"CCO", "CCN"}},
		{KindPython, `if smi in ("CCO", "CCN"): pass`, []string{"CCO", "CCN"}},
		// Doctest lines of a docstring are code.
		{KindPython, "def f():\n    \"\"\"Reads.\n\n    >>> m = Chem.MolFromSmiles('CC(=O)O')\n    >>> smiles = ['CCO',\n    ...           'c1ccccc1']\n    3\n    \"\"\"\n", []string{"CC(=O)O", "CCO", "c1ccccc1"}},
		{KindList, "\ufeffF/C=C/F trans\r\nCCO\r\n\r\n", []string{"F/C=C/F", "CCO"}},
		// Tabs aligning columns leave empty fields (FunctionalGroups.txt
		// of rdkit-data writes its lines so).
		{KindList, "-NC(=O)CH3\t*-[N;D2]-[C;D3](=O)-[C;D1;H3]\tmethyl amide\n-X\t\t*-[#9,#17,#35,#53]\thalogens\n-C#N\t*-[C;D2]#[N;D1]\tcyano\n",
			[]string{"q:*-[N;D2]-[C;D3](=O)-[C;D1;H3]", "q:*-[#9,#17,#35,#53]", "q:*-[C;D2]#[N;D1]"}},
		{KindCSV, "\ufeffSMILES;Name\r\nCCO;ethanol\r\n", []string{"CCO"}},
		// Markdown tables (GitHub Flavored Markdown, "Tables"): the cells
		// of a column the header names as structures are records, plain
		// or in a code span; other cells only by their code spans.
		{KindMarkdown, "| name | SMILES |\n|:---|---:|\n| ethanol | CCO |\n| alanine | `C[C@H](N)C(=O)O` |\n| methanol | `CO` |\n| unknown | n/a |\n| later | see text |\n",
			[]string{"CCO", "C[C@H](N)C(=O)O", "CO"}},
		{KindMarkdown, "| name | formula |\n|---|---|\n| ethanol | CCO |\n| alanine | `C[C@H](N)C(=O)O` |\n", []string{"C[C@H](N)C(=O)O"}},
		// no delimiter row: no header, no table
		{KindMarkdown, "| SMILES |\n| CCO |\n", nil},
		// a table ends at the first line that is no row
		{KindMarkdown, "| SMILES |\n|---|\n| CCO |\n\n| CCN |\n", []string{"CCO"}},
		// A fenced block without a tag (CommonMark 4.5) holds output,
		// commands and prose as often as records: a line is a record when
		// it starts with text that is unmistakably notation, a title
		// after it; a block tagged smiles is a list, one tagged with
		// another word is left alone.
		{KindMarkdown, "```\n$ run --in data.smi\nC[C@H](F)Cl |&1:1| racemic sample\nN[C@@H](C)C(=O)O alanine\nCCO\n[INFO] 2024/01/02\nc1ccccc1 benzene\n```\n",
			[]string{"C[C@H](F)Cl |&1:1|", "N[C@@H](C)C(=O)O", "c1ccccc1"}},
		{KindMarkdown, "~~~ text\nF/C=C/F\n~~~\n", []string{"F/C=C/F"}},
		{KindMarkdown, "```smiles\nCCO ethanol\n```\n", []string{"CCO"}},
		{KindMarkdown, "```console\nF/C=C/F\n```\n", nil},
		// R Markdown and Quarto chunks are fences tagged {r}, {python},
		// with options after the language (common practice)
		{KindMarkdown, "```{r, echo=FALSE}\nm <- parse.smiles(\"C[C@H](O)CC\")\n```\n```{python}\nx = Chem.MolFromSmiles(\"F/C=C/F\")\n```\n", []string{"C[C@H](O)CC", "F/C=C/F"}},
		{KindTSV, "name\tsmiles\tnote\nethanol\tCCO\tx\n", []string{"CCO"}},
	}
	for _, tt := range tests {
		var got []string
		for _, o := range FindKind(tt.kind, []byte(tt.src), Config{}) {
			if o.Dialect == DialectSMARTS {
				got = append(got, "q:"+o.Text)
			} else {
				got = append(got, o.Text)
			}
		}
		if !reflect.DeepEqual(got, tt.want) {
			t.Errorf("%s %q: got %q, want %q", tt.kind, tt.src, got, tt.want)
		}
	}
}

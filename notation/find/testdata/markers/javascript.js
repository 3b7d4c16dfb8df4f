// Marker file for JavaScript. Escape rules from ECMA-262, "String
// Literals" (SingleEscapeCharacter, LegacyOctalEscapeSequence,
// NonEscapeCharacter: a backslash before any other character is dropped)
// and "Template Literals"; regular expression literals from "Regular
// Expression Literals".
const smiles = "F/C=C/F"; // want «F/C=C/F»
const mol = { smiles: 'N[C@@H](C)C(=O)O', name: "alanine" }; // want «N[C@@H](C)C(=O)O»
const parsed = parseSmiles("C[C@H](N)O"); // want «C[C@H](N)O»
let reactionSmiles = ["CC=O.N>>CC=N"]; // want «CC=O.N>>CC=N»
const re = /["'\/]+/g; const after = "F/C=C/F"; // want «F/C=C/F»
const ratio = a / b / c; const s2 = "C1CCCCC1"; // want «C1CCCCC1»
/* "F/C=C/F" in a block comment */
// "F/C=C/F" in a line comment
const words = ["CO", "NO", "Cl", "OK", "SCSS", "N/A", "I/O", "src/app", "1.2.3"];
const tpl = `F/C=C/F`; // want «F/C=C/F»
const sub = `F/C=C/${x}`;
const raw = String.raw`F/C=C\F`; // want «F/C=C\F»
const doubled = "F/C=C\\F"; // want «F/C=C\\F» text «F/C=C\F»
// Escapes: JavaScript drops the backslash of \/ and \C, reads \1 as octal.
const smilesSlash = "C\/C=C/C"; // want «C\/C=C/C» error «\/» fix «String.raw`C\/C=C/C`»
const smilesC = "F/C=C\C"; // want «F/C=C\C» error «\C» fix «"F/C=C\\C"»
const smilesOct = "C1CC\1"; // want «C1CC\1» error «\1»
const smilesTab = 'C\tC'; // want «C\tC» error «\t»
const smilesHex = "C\x41"; // want «C\x41» error «\x41»
// stereoline: off
const offSmiles = "F/C=C/F";
// stereoline: on
const typed: string = "F/C=C/F"; // want «F/C=C/F»
// Templates with substitutions: the fixed text between ${...} is searched
// token by token; a token touching a substitution is built at run time.
const tsv = `${id}\tC[C@H](N)C(=O)O\n`; // want «C[C@H](N)C(=O)O»
const nested = `${a}/${b} F/C=C/F ${`x${y}`} C${n}CC`; // want «F/C=C/F»
const rawSub = String.raw`${a} F/C=C\F`; // want «F/C=C\F»
const objSub = `${{ k: "}" }.k} C1CCCCC1`; // want «C1CCCCC1»
// stereoline: skip-next
const skipTpl = `${id} C1CCCCC1`;

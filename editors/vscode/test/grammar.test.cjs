// Tokenises SMILES records with the extension's TextMate grammar, using
// the same engine VS Code uses (vscode-textmate on the Oniguruma regex
// library), and checks the scope of each token class. The token classes
// are those of the OpenSMILES specification: atoms (organic subset,
// aromatic, bracket), bonds, ring-closure digits (including %nn),
// branches, chirality marks (@, @@, @TH1 ...) and direction marks (/, \).
const fs = require("node:fs");
const path = require("node:path");
const assert = require("node:assert/strict");
const { test } = require("node:test");
const textmate = require("vscode-textmate");
const oniguruma = require("vscode-oniguruma");

const root = path.join(__dirname, "..");

async function loadGrammar() {
  const wasm = fs.readFileSync(path.join(root, "node_modules/vscode-oniguruma/release/onig.wasm"));
  await oniguruma.loadWASM(wasm.buffer.slice(wasm.byteOffset, wasm.byteOffset + wasm.byteLength));
  const registry = new textmate.Registry({
    onigLib: Promise.resolve({
      createOnigScanner: (sources) => new oniguruma.OnigScanner(sources),
      createOnigString: (s) => new oniguruma.OnigString(s),
    }),
    loadGrammar: async (scopeName) => {
      if (scopeName !== "source.smiles") return null;
      const file = path.join(root, "syntaxes/smiles.tmLanguage.json");
      return textmate.parseRawGrammar(fs.readFileSync(file, "utf8"), file);
    },
  });
  return registry.loadGrammar("source.smiles");
}

// tokens returns [text, innermost scope] for each token of one line.
function tokens(grammar, line) {
  const r = grammar.tokenizeLine(line, textmate.INITIAL);
  return r.tokens.map((t) => [line.slice(t.startIndex, t.endIndex), t.scopes[t.scopes.length - 1]]);
}

// scopeOf finds the scope of the first token with the given text at or
// after character index from.
function scopeOf(grammar, line, text, from = 0) {
  const r = grammar.tokenizeLine(line, textmate.INITIAL);
  for (const t of r.tokens) {
    if (t.startIndex >= from && line.slice(t.startIndex, t.endIndex) === text) {
      return t.scopes[t.scopes.length - 1];
    }
  }
  return `no token ${JSON.stringify(text)} in ${JSON.stringify(tokens(grammar, line))}`;
}

test("token classes of a SMILES list record", async () => {
  const g = await loadGrammar();
  // (R)-lactic acid with a title, then cis-1,2-difluoroethene: the
  // OpenSMILES specification's own example of direction marks is F/C=C\F.
  const cases = [
    // [line, token text, search from, scope prefix]
    ["C[C@@H](O)C(=O)O lactate", "C", 0, "entity.name.type.atom.smiles"],
    ["C[C@@H](O)C(=O)O lactate", "[", 0, "punctuation.definition.atom.begin.smiles"],
    ["C[C@@H](O)C(=O)O lactate", "@@", 0, "keyword.control.stereo.chirality.smiles"],
    ["C[C@@H](O)C(=O)O lactate", "H", 0, "constant.other.hydrogen-count.smiles"],
    ["C[C@@H](O)C(=O)O lactate", "(", 0, "punctuation.section.branch.smiles"],
    ["C[C@@H](O)C(=O)O lactate", "=", 0, "keyword.operator.bond.smiles"],
    ["C[C@@H](O)C(=O)O lactate", "lactate", 0, "string.unquoted.title.smiles"],
    ["F/C=C\\F cis", "/", 0, "keyword.control.stereo.direction.smiles"],
    ["F/C=C\\F cis", "\\", 0, "keyword.control.stereo.direction.smiles"],
    // benzene written aromatic, with a ring-closure digit
    ["c1ccccc1", "c", 0, "entity.name.type.atom.aromatic.smiles"],
    ["c1ccccc1", "1", 0, "constant.numeric.ring-closure.smiles"],
    ["C%12CC%12", "%12", 0, "constant.numeric.ring-closure.smiles"],
    // Cl is one atom, not C then l (OpenSMILES organic subset)
    ["ClC(Br)F", "Cl", 0, "entity.name.type.atom.smiles"],
    ["ClC(Br)F", "Br", 0, "entity.name.type.atom.smiles"],
    // isotope, charge and atom map inside brackets
    ["[13CH3][NH3+:2]", "13", 0, "constant.numeric.isotope.smiles"],
    ["[13CH3][NH3+:2]", "+", 0, "keyword.operator.charge.smiles"],
    ["[13CH3][NH3+:2]", ":2", 0, "constant.numeric.atom-map.smiles"],
    ["N[C@TH1H](C)O", "@TH1", 0, "keyword.control.stereo.chirality.smiles"],
    // reaction roles and components
    ["CC(=O)O.OCC>>CC(=O)OCC", ">", 0, "keyword.operator.reaction.smiles"],
    ["CC(=O)O.OCC>>CC(=O)OCC", ".", 0, "punctuation.separator.component.smiles"],
    ["# a comment line", "# a comment line", 0, "comment.line.number-sign.smiles"],
  ];
  for (const [line, text, from, want] of cases) {
    assert.equal(scopeOf(g, line, text, from), want, `${JSON.stringify(text)} in ${JSON.stringify(line)}`);
  }
});

test("a character the grammar does not allow is marked invalid", async () => {
  const g = await loadGrammar();
  assert.equal(scopeOf(g, "C&C", "&"), "invalid.illegal.character.smiles");
});

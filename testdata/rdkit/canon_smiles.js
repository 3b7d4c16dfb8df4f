// Reads one SMILES a line from standard input with the npm package
// @rdkit/rdkit and prints the package version, then for each string its
// canonical isomeric SMILES (get_smiles), or "!" when the package does
// not read it. Used by gen_group_sets.py.
//
// Usage: node testdata/rdkit/canon_smiles.js <path of node_modules/@rdkit/rdkit>

const init = require(process.argv[2]);
const lines = require("fs").readFileSync(0, "utf8").split("\n");

init().then((RDKit) => {
  const out = [RDKit.version()];
  for (const s of lines.slice(0, lines.length - 1)) {
    const mol = RDKit.get_mol(s, JSON.stringify({ removeHs: false }));
    if (!mol) {
      out.push("!");
      continue;
    }
    out.push(mol.get_smiles());
    mol.delete();
  }
  process.stdout.write(out.join("\n") + "\n");
});

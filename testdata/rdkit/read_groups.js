// Reads one CXSMILES string a line from standard input with the npm
// package @rdkit/rdkit and prints the package version, then for each
// string the stereo groups it reads: space-separated <kind>:<atom>,...
// (kind abs, or, and), in the order of get_json's "stereoGroups"; "!"
// when the package does not read the string. Used by gen_groups.py.
//
// Usage: node testdata/rdkit/read_groups.js <path of node_modules/@rdkit/rdkit>

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
    const j = JSON.parse(mol.get_json());
    mol.delete();
    const groups = (j.molecules[0].stereoGroups || []).map(
      (g) => g.type + ":" + g.atoms.join(","),
    );
    out.push(groups.join(" "));
  }
  process.stdout.write(out.join("\n") + "\n");
});

// Reads writings with the npm package @rdkit/rdkit (RDKit's MinimalLib in
// WebAssembly) for gen_survey.py: one JSON object a line on stdin
// ({"id": ..., "smiles": ...}), one JSON object a line on stdout with what
// this RDKit release makes of the writing. The package is found through
// RDKIT_JS_DIR (a folder holding node_modules/@rdkit/rdkit), never from the
// repository.
//
// Output fields: id; ok (false when the writing is rejected); version;
// canonical (get_smiles of the molecule read with default options: canonical
// isomeric SMILES, [H] atoms removed); tags (get_stereo_tags of the molecule
// read with removeHs false, so atom indices follow the string: CIP labels
// from RDKit's new labeller); atoms and bonds (from get_json of that
// molecule: the chiral tag of each atom, cw or ccw relative to its bonds in
// bond-index order, and each double bond's cis/trans with its stereo
// atoms), from which gen_survey.py computes the configuration read.
"use strict";
const path = require("path");
const readline = require("readline");

const dir = process.env.RDKIT_JS_DIR || "/work/coord/npm-survey";
const initRDKitModule = require(path.join(dir, "node_modules", "@rdkit", "rdkit", "dist", "RDKit_minimal.js"));

initRDKitModule().then((RDKit) => {
  const version = RDKit.version();
  const rl = readline.createInterface({ input: process.stdin, terminal: false });
  const out = [];
  rl.on("line", (line) => {
    if (!line.trim()) return;
    const req = JSON.parse(line);
    out.push(JSON.stringify(read(RDKit, version, req)));
    if (out.length >= 256) flush(out);
  });
  rl.on("close", () => flush(out));
});

function flush(out) {
  if (out.length) process.stdout.write(out.join("\n") + "\n");
  out.length = 0;
}

function read(RDKit, version, req) {
  const res = { id: req.id, version, ok: false };
  let plain = null;
  let full = null;
  try {
    plain = RDKit.get_mol(req.smiles);
    full = RDKit.get_mol(req.smiles, JSON.stringify({ removeHs: false }));
    if (!plain || !full || !plain.is_valid() || !full.is_valid()) return res;
    res.canonical = plain.get_smiles();
    res.tags = JSON.parse(full.get_stereo_tags());
    const mol = JSON.parse(full.get_json()).molecules[0];
    const atoms = [];
    (mol.atoms || []).forEach((a, i) => {
      if (a.stereo === "cw" || a.stereo === "ccw") atoms.push([i, a.stereo]);
    });
    const nbrs = (mol.atoms || []).map(() => []);
    const bonds = [];
    (mol.bonds || []).forEach((b) => {
      nbrs[b.atoms[0]].push(b.atoms[1]);
      nbrs[b.atoms[1]].push(b.atoms[0]);
      if (b.stereo === "cis" || b.stereo === "trans") bonds.push([b.atoms[0], b.atoms[1], b.stereo, b.stereoAtoms]);
    });
    res.atoms = atoms.map(([i, s]) => [i, s, nbrs[i]]);
    res.bonds = bonds;
    res.ok = true;
  } catch (e) {
    res.error = String(e);
  } finally {
    if (plain) plain.delete();
    if (full) full.delete();
  }
  return res;
}

// An LSP 3.17 client built on vscode-languageserver-protocol and
// vscode-jsonrpc (the libraries VS Code's own client uses) that drives
// `stereoline serve` over stdio: position-encoding negotiation, pull
// diagnostics, configuration, inlay hints, code actions with
// codeAction/resolve, notebook document sync and a clean exit.
//
// Run: STEREOLINE_BIN=/path/to/stereoline node --test client.test.mjs
// The expected values come from the LSP 3.17 specification (position
// encodings, result shapes), the Unicode encoding forms (code units per
// character), the OpenSMILES specification and the CIP rules of the IUPAC
// 2013 recommendations (P-92, P-93); each check names its source.
import { spawn, spawnSync } from "node:child_process";
import { readFileSync } from "node:fs";
import { dirname, join } from "node:path";
import { fileURLToPath, pathToFileURL } from "node:url";
import { test } from "node:test";
import assert from "node:assert/strict";
import {
  createProtocolConnection,
  StreamMessageReader,
  StreamMessageWriter,
  InitializeRequest,
  InitializedNotification,
  ShutdownRequest,
  ExitNotification,
  ConfigurationRequest,
  RegistrationRequest,
  WorkDoneProgressCreateRequest,
  PublishDiagnosticsNotification,
  DidOpenTextDocumentNotification,
  DidChangeConfigurationNotification,
  DocumentDiagnosticRequest,
  InlayHintRequest,
  CodeActionRequest,
  CodeActionResolveRequest,
  HoverRequest,
  CodeLensRequest,
  ExecuteCommandRequest,
  DocumentSymbolRequest,
  DidOpenNotebookDocumentNotification,
  DidChangeNotebookDocumentNotification,
  DidCloseNotebookDocumentNotification,
} from "vscode-languageserver-protocol/node";

const bin = process.env.STEREOLINE_BIN;
if (!bin) throw new Error("STEREOLINE_BIN is not set");
const fixtures = join(dirname(fileURLToPath(import.meta.url)), "..", "fixtures");
const fixture = (name) => ({ uri: pathToFileURL(join(fixtures, name)).href, text: readFileSync(join(fixtures, name), "utf8") });

const timeout = (p, ms, what) =>
  Promise.race([p, new Promise((_, reject) => setTimeout(() => reject(new Error(`timed out: ${what}`)), ms).unref())]);

// The client capabilities of an LSP 3.17 editor: pull diagnostics, inlay
// hints, code action literals with lazy edits, notebook sync and the
// position encodings given.
function capabilities(encodings) {
  const general = encodings ? { positionEncodings: encodings } : {};
  return {
    general,
    workspace: {
      configuration: true,
      didChangeConfiguration: { dynamicRegistration: false },
      workspaceEdit: { documentChanges: true },
      // The server asks for these after new settings: the client then
      // pulls again, knowing the settings are in force.
      inlayHint: { refreshSupport: true },
      diagnostics: { refreshSupport: true },
    },
    textDocument: {
      synchronization: { dynamicRegistration: false, didSave: true },
      publishDiagnostics: { relatedInformation: true, tagSupport: { valueSet: [1, 2] }, codeDescriptionSupport: true, dataSupport: true },
      diagnostic: { dynamicRegistration: false, relatedDocumentSupport: false },
      hover: { contentFormat: ["markdown", "plaintext"] },
      inlayHint: { dynamicRegistration: false, resolveSupport: { properties: ["tooltip"] } },
      documentSymbol: { hierarchicalDocumentSymbolSupport: true },
      codeAction: {
        dataSupport: true,
        resolveSupport: { properties: ["edit"] },
        codeActionLiteralSupport: {
          codeActionKind: { valueSet: ["quickfix", "refactor", "refactor.rewrite", "source"] },
        },
      },
    },
    notebookDocument: { synchronization: { dynamicRegistration: false, executionSummarySupport: false } },
  };
}

// withImages adds what an editor that renders markdown images and opens
// documents for the server declares: its markdown parser (LSP 3.16
// general.markdown) and window/showDocument support.
function withImages(caps) {
  return {
    ...caps,
    general: { ...caps.general, markdown: { parser: "marked", version: "1.1.0" } },
    window: { showDocument: { support: true } },
  };
}

// wellFormed checks that text is well-formed XML as far as an SVG needs
// (XML 1.0: elements nest and close, attribute values are quoted, '&'
// starts an entity or character reference) and returns the root
// element's name and the character data.
function wellFormed(text) {
  const token = /<!--[\s\S]*?-->|<\?[\s\S]*?\?>|<\/([A-Za-z][\w:.-]*)\s*>|<([A-Za-z][\w:.-]*)((?:\s+[\w:.-]+\s*=\s*(?:"[^"<]*"|'[^'<]*'))*)\s*(\/?)>|[^<]+/gy;
  const stack = [];
  let root = null;
  let chars = "";
  let pos = 0;
  for (let m; pos < text.length && (m = token.exec(text)); pos = token.lastIndex) {
    if (m[1]) {
      assert.equal(stack.pop(), m[1], `closing </${m[1]}> at ${pos}`);
    } else if (m[2]) {
      if (root === null) root = m[2];
      else assert.ok(stack.length > 0, `second root element <${m[2]}>`);
      if (!m[4]) stack.push(m[2]);
    } else if (!m[0].startsWith("<")) {
      assert.ok(!/&(?!(?:amp|lt|gt|quot|apos|#\d+|#x[0-9a-fA-F]+);)/.test(m[0]), `bare '&' at ${pos}`);
      if (stack.length > 0) chars += m[0];
      else assert.ok(/^\s*$/.test(m[0]), `text outside the root at ${pos}`);
    }
  }
  assert.equal(pos, text.length, `not XML at offset ${pos}: ${text.slice(pos, pos + 40)}`);
  assert.equal(stack.length, 0, `unclosed <${stack.at(-1)}>`);
  return { root, chars };
}

// start spawns the server and runs initialize/initialized. settings is
// what the client answers for the "stereoline" section.
async function start({ encodings, settings = {}, initializationOptions, images = false } = {}) {
  const proc = spawn(bin, ["serve"], { stdio: ["pipe", "pipe", "pipe"] });
  let stderr = "";
  proc.stderr.on("data", (d) => (stderr += d));
  const exited = new Promise((resolve) => proc.on("exit", (code, signal) => resolve({ code, signal })));
  const conn = createProtocolConnection(new StreamMessageReader(proc.stdout), new StreamMessageWriter(proc.stdin));
  const s = { proc, conn, exited, settings, pushed: new Map(), shown: [], stderr: () => stderr };
  conn.onRequest(ConfigurationRequest.type, (p) => p.items.map((it) => (it.section === "stereoline" ? s.settings : null)));
  conn.onRequest(RegistrationRequest.type, () => null);
  conn.onRequest(WorkDoneProgressCreateRequest.type, () => null);
  // Refresh requests come after new settings are in force; the tests
  // pull again until the answer changes (see eventually), as an editor
  // pulls again on a refresh.
  for (const method of ["workspace/inlayHint/refresh", "workspace/diagnostic/refresh"]) {
    conn.onRequest(method, () => null);
  }
  conn.onRequest("window/showDocument", (p) => {
    s.shown.push(p.uri);
    return { success: true };
  });
  conn.onNotification(PublishDiagnosticsNotification.type, (p) => s.pushed.set(p.uri, p));
  conn.onNotification("window/logMessage", () => {});
  conn.onNotification("window/showMessage", () => {});
  conn.listen();
  s.init = await timeout(
    conn.sendRequest(InitializeRequest.type, {
      processId: process.pid,
      clientInfo: { name: "stereoline-node-test" },
      rootUri: pathToFileURL(fixtures).href,
      workspaceFolders: [{ uri: pathToFileURL(fixtures).href, name: "fixtures" }],
      capabilities: images ? withImages(capabilities(encodings)) : capabilities(encodings),
      initializationOptions,
    }),
    10000,
    "initialize",
  );
  await conn.sendNotification(InitializedNotification.type, {});
  s.encoding = s.init.capabilities.positionEncoding ?? "utf-16";
  s.request = (type, params) => timeout(conn.sendRequest(type, params), 10000, type.method);
  s.open = (doc, languageId) =>
    conn.sendNotification(DidOpenTextDocumentNotification.type, { textDocument: { uri: doc.uri, languageId, version: 1, text: doc.text } });
  s.pull = (uri, previousResultId) =>
    s.request(DocumentDiagnosticRequest.type, { textDocument: { uri }, ...(previousResultId ? { previousResultId } : {}) });
  // stop sends shutdown then exit and returns the process's exit.
  s.stop = async () => {
    await s.request(ShutdownRequest.type, undefined);
    await conn.sendNotification(ExitNotification.type);
    const r = await timeout(exited, 5000, "server exit");
    conn.dispose();
    return r;
  };
  return s;
}

// units counts a code point in an encoding (Unicode encoding forms:
// UTF-8 uses 1-4 bytes, UTF-16 one or two code units, UTF-32 one).
function units(cp, enc) {
  if (enc === "utf-8") return cp < 0x80 ? 1 : cp < 0x800 ? 2 : cp < 0x10000 ? 3 : 4;
  if (enc === "utf-32") return 1;
  return cp < 0x10000 ? 1 : 2;
}

// indexOf turns an LSP position into a JavaScript string index.
function indexOf(text, pos, enc) {
  let i = 0;
  for (let line = 0; line < pos.line; line++) {
    const nl = text.indexOf("\n", i);
    if (nl < 0) return text.length;
    i = nl + 1;
  }
  for (let c = 0; c < pos.character && i < text.length && text[i] !== "\n"; ) {
    const cp = text.codePointAt(i);
    c += units(cp, enc);
    i += cp > 0xffff ? 2 : 1;
  }
  return i;
}

// positionOf turns a string index into an LSP position.
function positionOf(text, index, enc) {
  const before = text.slice(0, index);
  const line = before.split("\n").length - 1;
  const start = before.lastIndexOf("\n") + 1;
  let character = 0;
  for (const ch of text.slice(start, index)) character += units(ch.codePointAt(0), enc);
  return { line, character };
}

// applyEdit applies the edits of a workspace edit that touch uri.
function applyEdit(text, edit, uri, enc) {
  let edits = [];
  if (edit.changes && edit.changes[uri]) edits = edit.changes[uri];
  for (const dc of edit.documentChanges ?? []) {
    if (dc.textDocument && dc.textDocument.uri === uri) edits = edits.concat(dc.edits);
  }
  const spans = edits.map((e) => [indexOf(text, e.range.start, enc), indexOf(text, e.range.end, enc), e.newText]);
  spans.sort((a, b) => b[0] - a[0]);
  for (const [s, e, t] of spans) text = text.slice(0, s) + t + text.slice(e);
  return text;
}

// eventually calls ask until check accepts its answer or 5 s pass, and
// returns the last answer: settings sent in a notification take effect
// when the server has applied them, which the client cannot observe
// directly (the server's initial workspace/configuration pull may also
// still be in flight).
async function eventually(ask, check) {
  const end = Date.now() + 5000;
  let last = await ask();
  while (!check(last) && Date.now() < end) {
    await new Promise((r) => setTimeout(r, 50));
    last = await ask();
  }
  return last;
}

const codesOf = (items) => items.map((d) => `${d.code}@${d.range.start.line}`).sort();

test("position encoding negotiation", async () => {
  // LSP 3.17, "Position Encoding Kind": the server picks one of the
  // encodings the client offers, and UTF-16 when the client offers none.
  // The record's '@' follows "𝛼-demo,CC[C" on its line; U+1D6FC is 4
  // UTF-8 bytes, 2 UTF-16 units, 1 UTF-32 unit, the other 10 characters
  // are ASCII (Unicode encoding forms).
  const doc = fixture("encoding.csv");
  const want = { "utf-8": 14, "utf-16": 12, "utf-32": 11 };
  for (const offered of [["utf-8", "utf-16"], ["utf-32", "utf-16"], undefined]) {
    const s = await start({ encodings: offered });
    try {
      const chosen = s.init.capabilities.positionEncoding;
      if (offered) {
        assert.ok(chosen === undefined || offered.includes(chosen), `chose ${chosen} from ${offered}`);
      } else {
        assert.ok(chosen === undefined || chosen === "utf-16", `chose ${chosen} without an offer`);
      }
      await s.open(doc, "csv");
      const r = await s.pull(doc.uri);
      const d = r.items.find((x) => x.code === "stereo-ineffective-center");
      assert.ok(d, `no stereo-ineffective-center in ${JSON.stringify(r.items)}`);
      assert.deepEqual(d.range.start, { line: 1, character: want[s.encoding] }, `encoding ${s.encoding}`);
      assert.equal(d.range.end.character - d.range.start.character, 1, "the mark '@' is one unit wide");
    } finally {
      assert.deepEqual(await s.stop(), { code: 0, signal: null });
    }
  }
});

test("pull diagnostics, result ids and configuration", async () => {
  const s = await start({ encodings: ["utf-16"] });
  try {
    // The server offers pull diagnostics (LSP 3.17 diagnosticProvider).
    assert.ok(s.init.capabilities.diagnosticProvider, "no diagnosticProvider");
    const smi = fixture("sample.smi");
    const py = fixture("sample.py");
    await s.open(smi, "smiles");
    await s.open(py, "python");
    // Line 3: CC[C@H](C)C, two methyl groups on the marked carbon, no
    // stereocentre (IUPAC 2013 P-92). Line 4: F/C=CCl, one side of the
    // double bond marked only (OpenSMILES, cis/trans double bonds).
    let r = await s.pull(smi.uri);
    assert.equal(r.kind, "full");
    assert.deepEqual(codesOf(r.items), ["stereo-ineffective-center@3", "stereo-one-sided-bond@4"]);
    // Python Language Reference, string literals: "\F" is no escape, so
    // the plain string on line 3 is not the notation as written.
    const p = await s.pull(py.uri);
    assert.deepEqual(codesOf(p.items), ["host-escape@3", "stereo-ineffective-center@6"]);
    // LSP 3.17: with an unchanged document and its previous result id,
    // the answer is either "unchanged" with the same id or the same report.
    if (r.resultId) {
      const again = await s.pull(smi.uri, r.resultId);
      if (again.kind === "unchanged") assert.equal(again.resultId, r.resultId);
      else assert.deepEqual(codesOf(again.items), codesOf(r.items));
    }
    // Settings pushed with didChangeConfiguration under "stereoline":
    // one code switched off, one raised to error (severity 1 in LSP).
    s.settings = { severity: { "stereo-ineffective-center": "off", "stereo-one-sided-bond": "error" } };
    await s.conn.sendNotification(DidChangeConfigurationNotification.type, { settings: { stereoline: s.settings } });
    r = await eventually(
      () => s.pull(smi.uri),
      (x) => x.kind === "full" && codesOf(x.items).length === 1,
    );
    assert.equal(r.kind, "full");
    assert.deepEqual(codesOf(r.items), ["stereo-one-sided-bond@4"]);
    assert.equal(r.items[0].severity, 1);
    // Document symbols: one per record, named by its title.
    const syms = await s.request(DocumentSymbolRequest.type, { textDocument: { uri: smi.uri } });
    assert.deepEqual(syms.map((x) => x.name), ["lactate-demo", "difluoroethene-demo", "ineffective-demo", "one-sided-demo"]);
  } finally {
    assert.deepEqual(await s.stop(), { code: 0, signal: null });
  }
});

test("inlay hints follow the stereocentre and the double bond", async () => {
  const s = await start({ encodings: ["utf-16"], initializationOptions: { inlayHints: true } });
  try {
    assert.ok(s.init.capabilities.inlayHintProvider, "no inlayHintProvider");
    const smi = fixture("sample.smi");
    await s.open(smi, "smiles");
    const range = { start: { line: 0, character: 0 }, end: { line: 5, character: 0 } };
    const hints = await s.request(InlayHintRequest.type, { textDocument: { uri: smi.uri }, range });
    const labels = hints.map((h) => {
      const label = typeof h.label === "string" ? h.label : h.label.map((p) => p.value).join("");
      return `${label.replace(/[()\s]/g, "")}@${h.position.line}:${h.position.character}`;
    });
    // (R)-lactic acid: O > COOH > CH3 > H and C[C@@H](O)C(=O)O runs
    // clockwise with H away (IUPAC 2013 P-92, worked by hand); the hint
    // sits after the bracket atom, which ends at character 7 of line 1.
    // F/C=C/F is trans (OpenSMILES), (E) with F first on both carbons
    // (IUPAC 2013 P-93), after the '=' at character 3 of line 2.
    assert.deepEqual(labels.sort(), ["E@2:4", "R@1:7"]);
    // inlayHints off (a setting of the "stereoline" section): no hints.
    s.settings = { inlayHints: false };
    await s.conn.sendNotification(DidChangeConfigurationNotification.type, { settings: { stereoline: s.settings } });
    const none = await eventually(
      () => s.request(InlayHintRequest.type, { textDocument: { uri: smi.uri }, range }),
      (x) => (x ?? []).length === 0,
    );
    assert.deepEqual(none ?? [], []);
  } finally {
    assert.deepEqual(await s.stop(), { code: 0, signal: null });
  }
});

// action finds a code action by kind (and title pattern), resolving it
// when it comes without an edit.
async function action(s, uri, range, context, kind, title = /./) {
  const actions = (await s.request(CodeActionRequest.type, { textDocument: { uri }, range, context })) ?? [];
  let a = actions.find((x) => x.kind === kind && title.test(x.title));
  assert.ok(a, `no ${kind} ${title} among ${JSON.stringify(actions.map((x) => [x.kind, x.title]))}`);
  // This client declares resolveSupport for "edit", so the server may
  // leave edits out and fill them in on codeAction/resolve (LSP 3.17).
  let resolved = false;
  if (!a.edit) {
    assert.ok(s.init.capabilities.codeActionProvider?.resolveProvider, "an action without an edit, and no resolveProvider");
    a = await s.request(CodeActionResolveRequest.type, a);
    resolved = true;
  }
  assert.ok(a.edit, "the resolved action has no edit");
  return { ...a, resolved };
}

test("code action: the mirror rewrite, resolved", async () => {
  const s = await start({ encodings: ["utf-16"] });
  try {
    const smi = fixture("sample.smi");
    await s.open(smi, "smiles");
    // OpenSMILES, tetrahedral centres: '@' for '@@' is the mirror image,
    // so only the lactate record changes.
    const at = smi.text.indexOf("@@");
    const range = { start: positionOf(smi.text, at, s.encoding), end: positionOf(smi.text, at + 2, s.encoding) };
    const m = await action(s, smi.uri, range, { diagnostics: [], only: ["refactor.rewrite.stereo.mirror"] }, "refactor.rewrite.stereo.mirror");
    assert.ok(m.resolved, "the rewrite came with its edit: codeAction/resolve not exercised");
    const want = smi.text.replace("C[C@@H](O)C(=O)O lactate", "C[C@H](O)C(=O)O lactate");
    assert.notEqual(want, smi.text);
    assert.equal(applyEdit(smi.text, m.edit, smi.uri, s.encoding), want);
  } finally {
    assert.deepEqual(await s.stop(), { code: 0, signal: null });
  }
});

test("code action: a quick fix, resolved, and hover", async () => {
  const s = await start({ encodings: ["utf-16"] });
  try {
    const py = fixture("sample.py");
    await s.open(py, "python");
    // Python Language Reference, string literals: a raw string keeps the
    // backslash as written.
    const diags = (await s.pull(py.uri)).items;
    const esc = diags.find((d) => d.code === "host-escape");
    assert.ok(esc, "no host-escape diagnostic");
    const q = await action(s, py.uri, esc.range, { diagnostics: [esc], only: ["quickfix"] }, "quickfix", /raw/);
    // stereoline defers every edit to codeAction/resolve for a client
    // that resolves them (its design: rewrites of a selection are not free).
    assert.ok(q.resolved, "the quick fix came with its edit: codeAction/resolve not exercised");
    const fixed = applyEdit(py.text, q.edit, py.uri, s.encoding);
    assert.equal(fixed, py.text.replace('alkene = "F/C=C\\F"', 'alkene = r"F/C=C\\F"'));
    // (R)-lactic acid by the CIP rules (IUPAC 2013 P-92, worked by hand).
    const at = py.text.indexOf("@@");
    const hv = await s.request(HoverRequest.type, { textDocument: { uri: py.uri }, position: positionOf(py.text, at, s.encoding) });
    assert.match(typeof hv.contents === "string" ? hv.contents : hv.contents.value, /\(R\)/);
  } finally {
    assert.deepEqual(await s.stop(), { code: 0, signal: null });
  }
});

test("hover drawing and the drawing command", async () => {
  const s = await start({ encodings: ["utf-16"], images: true });
  try {
    const smi = fixture("sample.smi");
    await s.open(smi, "smi");
    // (R)-lactic acid, C[C@@H](O)C(=O)O (IUPAC 2013 P-92, worked by hand).
    const at = smi.text.indexOf("@@");
    const hv = await s.request(HoverRequest.type, { textDocument: { uri: smi.uri }, position: positionOf(smi.text, at, s.encoding) });
    const md = hv.contents.value;
    assert.match(md, /\(R\)/);
    const img = /!\[[^\]]*\]\(data:image\/svg\+xml;base64,([A-Za-z0-9+/=]+)\)/.exec(md);
    assert.ok(img, "no SVG data URI in the hover of a client that renders markdown");
    const svg = wellFormed(Buffer.from(img[1], "base64").toString("utf8"));
    assert.equal(svg.root, "svg");
    assert.match(svg.chars, /analytical confirmation/);
    assert.match(svg.chars, /\bR\b/, "the descriptor is not text in the SVG");
    // a code lens per record; its command opens the drawing
    const lenses = await s.request(CodeLensRequest.type, { textDocument: { uri: smi.uri } });
    assert.ok(lenses.length >= 4, `${lenses.length} code lenses`);
    const paths = await s.request(ExecuteCommandRequest.type, lenses[0].command);
    assert.equal(s.shown.length, paths.length, "window/showDocument not sent for every file");
    for (const uri of s.shown) {
      const file = wellFormed(readFileSync(fileURLToPath(uri), "utf8"));
      assert.equal(file.root, "svg");
      assert.match(file.chars, /lactate-demo/);
    }
  } finally {
    assert.deepEqual(await s.stop(), { code: 0, signal: null });
  }
});

test("notebook document sync", async () => {
  const s = await start({ encodings: ["utf-16"] });
  try {
    // LSP 3.17 notebookDocumentSync: the server names the notebooks and
    // cell languages it wants.
    assert.ok(s.init.capabilities.notebookDocumentSync, "no notebookDocumentSync");
    const nb = fixture("sample.ipynb");
    const json = JSON.parse(nb.text);
    // Cell URIs in the form VS Code uses: the notebook path with a
    // fragment per cell, in a scheme of their own.
    const cellUri = (i) => `vscode-notebook-cell:${fileURLToPath(nb.uri)}#W${i}sZmlsZQ%3D%3D`;
    const cells = json.cells.map((c, i) => ({ kind: c.cell_type === "code" ? 2 : 1, document: cellUri(i) }));
    const docs = json.cells.map((c, i) => ({
      uri: cellUri(i),
      languageId: c.cell_type === "code" ? "python" : "markdown",
      version: 1,
      text: c.source.join(""),
    }));
    await s.conn.sendNotification(DidOpenNotebookDocumentNotification.type, {
      notebookDocument: { uri: nb.uri, notebookType: "jupyter-notebook", version: 1, cells },
      cellTextDocuments: docs,
    });
    // Cell 1, line 1: C[C@H](C)O, two methyl groups, no stereocentre
    // (IUPAC 2013 P-92).
    let r = await s.pull(cellUri(1));
    assert.deepEqual(codesOf(r.items), ["stereo-ineffective-center@1"]);
    // Change the cell's text to (R)-lactic acid: the finding goes.
    await s.conn.sendNotification(DidChangeNotebookDocumentNotification.type, {
      notebookDocument: { uri: nb.uri, version: 2 },
      change: {
        cells: {
          textContent: [
            { document: { uri: cellUri(1), version: 2 }, changes: [{ text: 'lactate = "C[C@@H](O)C(=O)O"\n' }] },
          ],
        },
      },
    });
    r = await s.pull(cellUri(1));
    assert.deepEqual(codesOf(r.items), []);
    // Add a cell with the problem again: the new cell is analysed.
    await s.conn.sendNotification(DidChangeNotebookDocumentNotification.type, {
      notebookDocument: { uri: nb.uri, version: 3 },
      change: {
        cells: {
          structure: {
            array: { start: 2, deleteCount: 0, cells: [{ kind: 2, document: cellUri(2) }] },
            didOpen: [{ uri: cellUri(2), languageId: "python", version: 1, text: 'smiles = "F/C=CF"\n' }],
          },
        },
      },
    });
    r = await s.pull(cellUri(2));
    // F/C=CF: one side of the double bond marked (OpenSMILES).
    assert.deepEqual(codesOf(r.items), ["stereo-one-sided-bond@0"]);
    await s.conn.sendNotification(DidCloseNotebookDocumentNotification.type, {
      notebookDocument: { uri: nb.uri },
      cellTextDocuments: [0, 1, 2].map((i) => ({ uri: cellUri(i) })),
    });
  } finally {
    assert.deepEqual(await s.stop(), { code: 0, signal: null });
  }
});

test("the editor reports what stereoline check reports", async () => {
  // The project README promises that the editor and `stereoline check`
  // report the same findings for the same text and settings; LSP 3.17
  // numbers severities 1 error, 2 warning, 3 information, 4 hint.
  const severity = { error: 1, warning: 2, information: 3, hint: 4 };
  const s = await start({ encodings: ["utf-16"] });
  try {
    for (const [name, languageId] of [["sample.smi", "smiles"], ["sample.py", "python"], ["encoding.csv", "csv"]]) {
      const doc = fixture(name);
      const out = spawnSync(bin, ["check", "--format", "json", "--fail-on", "error", join(fixtures, name)], { encoding: "utf8" });
      assert.equal(out.status, 0, out.stderr);
      const want = out.stdout
        .split("\n")
        .filter((l) => l.trim() !== "")
        .map((l) => JSON.parse(l))
        .map((f) => ({ range: f.range, code: f.code, message: f.message, severity: severity[f.severity] }));
      await s.open(doc, languageId);
      const have = (await s.pull(doc.uri)).items.map((d) => ({ range: d.range, code: d.code, message: d.message, severity: d.severity }));
      assert.ok(want.length > 0, `check found nothing in ${name}`);
      assert.deepEqual(have, want, name);
    }
  } finally {
    assert.deepEqual(await s.stop(), { code: 0, signal: null });
  }
});

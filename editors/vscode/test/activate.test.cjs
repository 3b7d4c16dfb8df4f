// Loads the bundled extension (dist/extension.js) the way VS Code would,
// with a stand-in for the `vscode` module, and checks that activating it
// starts `<stereoline.path> serve`, completes the LSP handshake with the
// settings as initializationOptions, answers the server's
// workspace/configuration request from the "stereoline" section, and that
// deactivating it shuts the server down (shutdown, then exit: status 0,
// LSP 3.17). VS Code itself cannot be installed here; vscode-languageclient
// is the real one, bundled as shipped.
//
// The stand-in implements what the client calls during start and stop
// (configuration, events, disposables, URIs, output channel); anything
// else is an inert stub. Needs STEREOLINE_BIN and a prior `npm run bundle`.
const fs = require("node:fs");
const os = require("node:os");
const path = require("node:path");
const Module = require("node:module");
const assert = require("node:assert/strict");
const { test } = require("node:test");

const bin = process.env.STEREOLINE_BIN;
const bundle = path.join(__dirname, "..", "dist", "extension.js");

// stub is a callable, constructible object whose every property is
// another stub: the inert part of the stand-in.
function stub(name) {
  const target = function () {};
  return new Proxy(target, {
    get(t, key) {
      if (key === "then") return undefined; // not a promise
      if (key === Symbol.toPrimitive) return () => `[stub ${name}]`;
      if (key === "dispose") return () => {};
      if (!(key in t)) t[key] = stub(`${name}.${String(key)}`);
      return t[key];
    },
    apply() {
      return stub(`${name}()`);
    },
    construct() {
      return stub(`new ${name}`);
    },
  });
}

class Disposable {
  constructor(fn) {
    this.fn = fn;
  }
  static from(...ds) {
    return new Disposable(() => ds.forEach((d) => d && d.dispose && d.dispose()));
  }
  dispose() {
    if (this.fn) this.fn();
    this.fn = undefined;
  }
}

class EventEmitter {
  constructor() {
    this.listeners = new Set();
    this.event = (fn, thisArg) => {
      const l = thisArg ? fn.bind(thisArg) : fn;
      this.listeners.add(l);
      return new Disposable(() => this.listeners.delete(l));
    };
  }
  fire(e) {
    for (const l of [...this.listeners]) l(e);
  }
  dispose() {
    this.listeners.clear();
  }
}

class Uri {
  constructor(scheme, p) {
    this.scheme = scheme;
    this.path = p;
    this.fsPath = p;
  }
  static file(p) {
    return new Uri("file", p);
  }
  static parse(s) {
    const m = /^([a-z-]+):(?:\/\/)?(.*)$/.exec(s);
    return m ? new Uri(m[1], m[2]) : new Uri("file", s);
  }
  toString() {
    return `${this.scheme}://${this.path}`;
  }
  with() {
    return this;
  }
}

class CancellationTokenSource {
  constructor() {
    const e = new EventEmitter();
    this.token = { isCancellationRequested: false, onCancellationRequested: e.event };
    this.emitter = e;
  }
  cancel() {
    this.token.isCancellationRequested = true;
    this.emitter.fire();
  }
  dispose() {}
}

// fakeVscode builds the stand-in with the given settings of the
// "stereoline" section and records what the extension registers.
function fakeVscode(settings, record) {
  const event = () => new Disposable();
  record.opened = new EventEmitter();
  const configuration = (section) => ({
    get: (key, dflt) => {
      const all = section === "stereoline" ? settings : section ? {} : { stereoline: settings };
      const v = key.split(".").reduce((o, k) => (o == null ? undefined : o[k]), all);
      return v === undefined ? dflt : v;
    },
    has: () => false,
    inspect: () => undefined,
    update: async () => {},
  });
  const base = stub("vscode");
  const override = {
    version: "1.91.0",
    Disposable,
    EventEmitter,
    Uri,
    CancellationTokenSource,
    CancellationError: class CancellationError extends Error {},
    LogLevel: { Off: 0, Trace: 1, Debug: 2, Info: 3, Warning: 4, Error: 5 },
    ProgressLocation: { SourceControl: 1, Window: 10, Notification: 15 },
    env: { appName: "stand-in", language: "en", machineId: "test", sessionId: "test", openExternal: async () => true },
    workspace: new Proxy(
      {
        getConfiguration: configuration,
        workspaceFolders: undefined,
        textDocuments: [],
        notebookDocuments: [],
        onDidChangeConfiguration: event,
        onDidOpenTextDocument: record.opened.event,
        onDidChangeTextDocument: event,
        onDidCloseTextDocument: event,
        onDidSaveTextDocument: event,
        onWillSaveTextDocument: event,
        onDidChangeWorkspaceFolders: event,
        onDidOpenNotebookDocument: event,
        onDidChangeNotebookDocument: event,
        onDidCloseNotebookDocument: event,
        onDidSaveNotebookDocument: event,
        createFileSystemWatcher: () => ({ onDidCreate: event, onDidChange: event, onDidDelete: event, dispose() {} }),
      },
      { get: (t, k) => (k in t ? t[k] : stub(`workspace.${String(k)}`)) },
    ),
    window: new Proxy(
      {
        createOutputChannel: (name) => ({
          name,
          append: (s) => record.output.push(s),
          appendLine: (s) => record.output.push(s),
          replace() {},
          clear() {},
          show() {},
          hide() {},
          dispose() {},
          logLevel: 3,
          onDidChangeLogLevel: event,
          trace() {},
          debug() {},
          info: (s) => record.output.push(s),
          warn: (s) => record.output.push(s),
          error: (s) => record.output.push(String(s)),
        }),
        showErrorMessage: async (m) => {
          record.errors.push(m);
        },
        showWarningMessage: async () => undefined,
        showInformationMessage: async () => undefined,
        activeTextEditor: undefined,
        visibleTextEditors: [],
        onDidChangeActiveTextEditor: event,
        onDidChangeVisibleTextEditors: event,
        tabGroups: { all: [], onDidChangeTabs: event, onDidChangeTabGroups: event },
      },
      { get: (t, k) => (k in t ? t[k] : stub(`window.${String(k)}`)) },
    ),
    commands: new Proxy(
      {
        registerCommand: (id) => {
          record.commands.push(id);
          return new Disposable();
        },
        executeCommand: async () => undefined,
      },
      { get: (t, k) => (k in t ? t[k] : stub(`commands.${String(k)}`)) },
    ),
    languages: new Proxy(
      {
        // VS Code's rule, reduced to what the extension's selector uses:
        // a filter matches when its language and scheme both match.
        match: (selector, doc) => {
          const filters = Array.isArray(selector) ? selector : [selector];
          return filters.some((f) =>
            typeof f === "string"
              ? f === doc.languageId
              : (!f.language || f.language === doc.languageId) && (!f.scheme || f.scheme === doc.uri.scheme) && !f.notebookType,
          )
            ? 10
            : 0;
        },
        createDiagnosticCollection: () => ({ set() {}, delete() {}, clear() {}, forEach() {}, get() {}, has: () => false, dispose() {} }),
      },
      {
        get: (t, k) => {
          if (k in t) return t[k];
          if (typeof k === "string" && k.startsWith("register")) {
            return () => {
              record.providers.push(k);
              return new Disposable();
            };
          }
          return stub(`languages.${String(k)}`);
        },
      },
    ),
  };
  return new Proxy(override, { get: (t, k) => (k in t ? t[k] : base[k]) });
}

// frames splits a captured JSON-RPC stream (LSP base protocol:
// Content-Length headers, a blank line, then the JSON body).
function frames(buf) {
  const out = [];
  let i = 0;
  while (i < buf.length) {
    const sep = buf.indexOf("\r\n\r\n", i);
    if (sep < 0) break;
    const m = /Content-Length: *(\d+)/i.exec(buf.slice(i, sep).toString("latin1"));
    if (!m) break;
    const start = sep + 4;
    const end = start + Number(m[1]);
    if (end > buf.length) break; // a frame still being written
    out.push(JSON.parse(buf.slice(start, end).toString("utf8")));
    i = end;
  }
  return out;
}

// textDocument is the part of vscode.TextDocument the client reads.
function textDocument(file, languageId, text) {
  return { uri: Uri.file(file), fileName: file, languageId, version: 1, isClosed: false, isUntitled: false, getText: () => text, lineCount: text.split("\n").length };
}

const wait = async (pred, ms) => {
  const end = Date.now() + ms;
  while (!pred() && Date.now() < end) await new Promise((r) => setTimeout(r, 20));
  return pred();
};

test("activate starts stereoline serve with the settings, deactivate stops it", { skip: !bin && "STEREOLINE_BIN not set" }, async () => {
  assert.ok(fs.existsSync(bundle), "dist/extension.js missing: run npm run bundle first");
  // A wrapper as stereoline.path: it copies both directions of the
  // stream to files and records the server's exit status.
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "stereoline-vscode-"));
  const sent = path.join(dir, "sent.jsonrpc");
  const received = path.join(dir, "received.jsonrpc");
  const status = path.join(dir, "status");
  const wrapper = path.join(dir, "stereoline");
  fs.writeFileSync(
    wrapper,
    `#!/bin/sh\n[ "$1" = serve ] || exit 2\ntee "${sent}" | { "${bin}" serve 2>/dev/null; echo $? > "${status}"; } | tee "${received}"\n`,
    { mode: 0o755 },
  );
  const settings = { path: wrapper, inlayHints: false, drawingLens: "everywhere", detection: "names", severity: { "stereo-undefined": "off" } };
  const record = { output: [], errors: [], commands: [], providers: [] };
  const fake = fakeVscode(settings, record);
  const load = Module._load;
  Module._load = function (request, ...rest) {
    return request === "vscode" ? fake : load.call(this, request, ...rest);
  };
  let ext;
  let stopped = false;
  try {
    ext = require(bundle);
    const context = { subscriptions: [], extensionPath: path.join(__dirname, ".."), extensionUri: Uri.file(path.join(__dirname, "..")) };
    await ext.activate(context);
    assert.deepEqual(record.errors, [], "activation reported an error");
    assert.ok(record.commands.includes("stereoline.restartServer"), "restart command not registered");
    // The client registers its feature providers once the server's
    // capabilities are known, i.e. after a successful initialize.
    assert.ok(await wait(() => record.providers.includes("registerHoverProvider"), 10000), `providers: ${record.providers}`);
    const init = frames(fs.readFileSync(sent))[0];
    assert.equal(init.method, "initialize");
    // initializationOptions: the server's settings, not the extension's own path.
    assert.deepEqual(init.params.initializationOptions, {
      severity: { "stereo-undefined": "off" },
      inlayHints: false,
      drawingLens: "everywhere",
      detection: "names",
      columns: [],
      names: [],
      files: {},
      reading: { lonePair: "last", ringMarks: "closing" },
      limits: { recordTime: "500ms", digraphNodes: 200000, recordAtoms: 200000 },
    });
    // The server asks for the "stereoline" section (workspace/configuration);
    // the client answers from the same settings.
    assert.ok(
      await wait(() => {
        const asked = frames(fs.readFileSync(received)).find((m) => m.method === "workspace/configuration");
        return asked && frames(fs.readFileSync(sent)).some((m) => m.id === asked.id && m.result);
      }, 5000),
      "no workspace/configuration exchange",
    );
    const asked = frames(fs.readFileSync(received)).find((m) => m.method === "workspace/configuration");
    assert.equal(asked.params.items[0].section, "stereoline");
    const answer = frames(fs.readFileSync(sent)).find((m) => m.id === asked.id && m.result);
    assert.equal(answer.result[0].detection, "names");
    assert.equal(answer.result[0].inlayHints, false);
    assert.equal(answer.result[0].drawingLens, "everywhere");
    // Documents of the languages the extension selects reach the server
    // (didOpen); others do not.
    const fixtures = path.join(__dirname, "..", "..", "tests", "fixtures");
    const open = [
      ["sample.smi", "smiles"],
      ["sample.py", "python"],
      ["encoding.csv", "csv"],
      ["sample.jsonl", "jsonl"],
    ];
    for (const [name, lang] of open) {
      const f = path.join(fixtures, name);
      record.opened.fire(textDocument(f, lang, fs.readFileSync(f, "utf8")));
    }
    // JSON datasets and source code of other languages the server reads
    const inline = [
      ["compounds.json", "json", '[{"id": "A-1", "smiles": "C[C@H](N)C(=O)O"}]\n'],
      ["screen.ts", "typescript", 'const lead = "C[C@H](N)C(=O)O";\n'],
      ["catalogue.sdf", "sdf", "KL-1\n\n\n  0  0  0  0  0  0  0  0  0  0999 V2000\nM  END\n> <SMILES>\nC[C@H](N)C(=O)O\n\n$$$$\n"],
    ];
    for (const [name, lang, text] of inline) {
      record.opened.fire(textDocument(path.join(dir, name), lang, text));
    }
    record.opened.fire(textDocument(path.join(dir, "notes.txt"), "plaintext", "C[C@H](C)O\n"));
    const didOpen = () => frames(fs.readFileSync(sent)).filter((m) => m.method === "textDocument/didOpen");
    const expected = open.length + inline.length;
    assert.ok(await wait(() => didOpen().length >= expected, 5000), `didOpen: ${JSON.stringify(didOpen())}`);
    await new Promise((r) => setTimeout(r, 200));
    assert.deepEqual(didOpen().map((m) => m.params.textDocument.languageId).sort(), ["csv", "json", "jsonl", "python", "sdf", "smiles", "typescript"]);
    stopped = true;
    await ext.deactivate();
    assert.ok(await wait(() => fs.existsSync(status), 5000), "the server did not exit after deactivate");
    assert.equal(fs.readFileSync(status, "utf8").trim(), "0", "server exit status");
    const methods = frames(fs.readFileSync(sent)).map((m) => m.method);
    assert.ok(methods.includes("shutdown") && methods.indexOf("exit") > methods.indexOf("shutdown"), `sent: ${methods}`);
  } finally {
    // A failed assertion before deactivate would leave the server
    // running and the test runner waiting for it.
    if (ext && !stopped) await ext.deactivate().catch(() => {});
    Module._load = load;
    fs.rmSync(dir, { recursive: true, force: true });
  }
});

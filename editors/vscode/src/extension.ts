// The Stereoline extension: it starts `stereoline serve` over stdio and
// hands it list files, tables, source code, notebooks, Markdown, JSON and
// YAML. All
// analysis happens in the server; this file only wires settings and
// documents to it.
import * as vscode from "vscode";
import {
  LanguageClient,
  LanguageClientOptions,
  ServerOptions,
  TransportKind,
} from "vscode-languageclient/node";

// section is the settings section the server reads, both from
// initializationOptions and from workspace/configuration.
const section = "stereoline";

// Languages whose documents go to the server: every host kind it reads.
// "smiles" and "rsmi" are contributed by this extension; the others are
// VS Code's own ids (csv, tsv and sdf are also contributed here, since VS
// Code has none built in; r, julia, rust, kotlin, rmd and quarto come with the
// extensions of those languages). jsonl: Visual Studio Code's language of
// JSON Lines datasets (.jsonl).
const languages = [
  "smiles", "rsmi", "python", "csv", "tsv", "markdown", "jsonl", "json", "yaml",
  "javascript", "javascriptreact", "typescript", "typescriptreact",
  "go", "r", "julia", "rust", "java", "kotlin", "rmd", "quarto", "restructuredtext", "sdf",
];

let client: LanguageClient | undefined;

// settings returns the server's part of the configuration: every key but
// the ones the extension itself uses (path, trace).
function settings(): Record<string, unknown> {
  const c = vscode.workspace.getConfiguration(section);
  return {
    severity: c.get("severity", {}),
    inlayHints: c.get("inlayHints", true),
    drawingLens: c.get("drawingLens", "lists"),
    detection: c.get("detection", "normal"),
    columns: c.get("columns", []),
    names: c.get("names", []),
    files: c.get("files", {}),
    reading: {
      lonePair: c.get("reading.lonePair", "last"),
      ringMarks: c.get("reading.ringMarks", "closing"),
    },
    limits: {
      recordTime: c.get("limits.recordTime", "500ms"),
      digraphNodes: c.get("limits.digraphNodes", 200000),
      recordAtoms: c.get("limits.recordAtoms", 200000),
    },
  };
}

function newClient(): LanguageClient {
  const command = vscode.workspace.getConfiguration(section).get<string>("path", "stereoline") || "stereoline";
  const server: ServerOptions = {
    run: { command, args: ["serve"], transport: TransportKind.stdio },
    debug: { command, args: ["serve"], transport: TransportKind.stdio },
  };
  const documentSelector = languages.flatMap((language) => [
    { scheme: "file", language },
    { scheme: "untitled", language },
  ]);
  const options: LanguageClientOptions = {
    documentSelector,
    initializationOptions: settings(),
    // Notebook cells reach the server through notebookDocument/* once it
    // announces notebookDocumentSync; the client takes the notebook
    // selector from the server's capabilities.
    synchronize: {
      // Send workspace/didChangeConfiguration when our settings change,
      // so the server pulls them again.
      configurationSection: section,
    },
    outputChannelName: "Stereoline",
  };
  return new LanguageClient(section, "Stereoline", server, options);
}

async function start(): Promise<void> {
  client = newClient();
  try {
    await client.start();
  } catch (err) {
    const message = err instanceof Error ? err.message : String(err);
    void vscode.window.showErrorMessage(
      `Stereoline: could not start the language server (${message}). Set "stereoline.path" to the stereoline program.`,
    );
  }
}

async function stop(): Promise<void> {
  const c = client;
  client = undefined;
  if (c && c.isRunning()) {
    await c.stop();
  }
}

export async function activate(context: vscode.ExtensionContext): Promise<void> {
  context.subscriptions.push(
    vscode.commands.registerCommand("stereoline.restartServer", async () => {
      await stop();
      await start();
    }),
    // A new program path needs a new process; other settings reach the
    // running server through didChangeConfiguration.
    vscode.workspace.onDidChangeConfiguration(async (e) => {
      if (e.affectsConfiguration(`${section}.path`)) {
        await stop();
        await start();
      }
    }),
  );
  await start();
}

export async function deactivate(): Promise<void> {
  await stop();
}

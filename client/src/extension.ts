/**
 * The VS Code extension: a thin client. It starts the bundled language server, adds the
 * commands, the status bar item and the trend view, and leaves every computation to the server.
 */
import * as vscode from 'vscode';
import {
  LanguageClient,
  RevealOutputChannelOn,
  State,
  TransportKind,
  type LanguageClientOptions,
  type Middleware,
  type ServerOptions,
} from 'vscode-languageclient/node';
import { ANALYSED_NOTIFICATION, type AnalysedParams } from '../../server/src/protocol';
import { convertNoteUnits, insertTimepoint, linkCodesToCheckDocs, openCheckDocs } from './commands';
import { crashHandler, pneumarkSettingsOnly, restartServer, traceChannel, type CrashHandler } from './server-process';
import { shownEscaped } from '../../server/src/core/util/format';
import { LANGUAGE, TimepointStatus, type Requester } from './status';
import { TREND_VIEW_TYPE, TrendView } from './trend-view';

let client: LanguageClient | null = null;

export async function activate(context: vscode.ExtensionContext): Promise<void> {
  const output = vscode.window.createOutputChannel('Pneumark', { log: true });
  const trace = traceChannel(output);
  // Settles when the latest start of the server (the first, a restart on request, or one after
  // a crash) has succeeded or failed.
  let starting: Promise<unknown> = Promise.resolve();
  // The end of a restart after a crash, which the language client starts itself.
  let crashRestart: (() => void) | null = null;
  const crashes = crashHandler(output, Date.now, () => {
    if (!crashRestart) starting = new Promise<void>((resolve) => { crashRestart = resolve; });
  });
  const settingsChanges = pneumarkSettingsOnly();
  context.subscriptions.push(output, trace, settingsChanges);
  client = createClient(output, trace, crashes, settingsChanges.middleware, context.asAbsolutePath('dist/server.js'));
  // Requests go to the server only while it runs (not while it starts, stops or is stopped).
  const send = (): Requester | null => {
    const c = client;
    return c && c.isRunning() ? (method, params) => c.sendRequest(method, params) : null;
  };
  // The trend view may ask before then (a view restored after a reload, a note analysed while the
  // server restarts): it waits for the start instead of saying the server is not running.
  const trends = new TrendView(context.extensionUri, async () => {
    await starting;
    return send();
  });
  const status = new TimepointStatus(send);
  context.subscriptions.push(status, trends);
  context.subscriptions.push(client.onDidChangeState((e) => {
    // Out of the start after a crash: running again, failed to start, or stopped while starting.
    if (crashRestart && e.oldState === State.Starting) {
      crashRestart();
      crashRestart = null;
    }
    // Stopped (for good after repeated crashes, or to restart) or running again: the status item
    // hides at once rather than keep its last figures, and shows the note's again when it runs.
    status.schedule();
  }));
  // Registered before the server is started: VS Code hands a trend view restored after a reload
  // (which is what woke the extension up when it was the only editor left open) to the
  // serializer at once, so the view shows its page and opens its note for the server instead of
  // staying blank while the server starts (or for good, should the start never end).
  context.subscriptions.push(vscode.window.registerWebviewPanelSerializer(TREND_VIEW_TYPE, trends));

  context.subscriptions.push(
    vscode.commands.registerCommand('pneumark.restartServer', () => {
      const restarted = restartServer(client, crashes, output);
      starting = restarted;
      return restarted;
    }),
    vscode.commands.registerCommand('pneumark.convertNoteUnits', () => convertNoteUnits(starting.then(send))),
    vscode.commands.registerCommand('pneumark.insertTimepoint', () => insertTimepoint()),
    vscode.commands.registerCommand('pneumark.showTrends', (resource?: unknown) => {
      const note = noteFor(resource, trends.note);
      if (!(note instanceof Promise)) return trends.show(note);
      return note.then((picked) => { if (picked !== null) trends.show(picked); });
    }),
    vscode.commands.registerCommand('pneumark.openCheckDocs', (code?: unknown) => openCheckDocs(context.extensionUri, code)),
    vscode.commands.registerCommand('pneumark.showOutput', () => output.show()),
  );

  client.onNotification(ANALYSED_NOTIFICATION, (p: AnalysedParams) => {
    trends.noteAnalysed(p.uri);
    status.noteAnalysed(p.uri);
  });
  const started = client.start();
  starting = started.catch(() => undefined);
  try {
    await started;
  } catch (error) {
    output.error(`the language server could not be started: ${error instanceof Error ? error.message : String(error)}`);
    void vscode.window.showErrorMessage('The Pneumark language server could not be started, so notes are not checked.', 'Restart', 'Show Output').then((choice) => {
      if (choice === 'Restart') void vscode.commands.executeCommand('pneumark.restartServer');
      if (choice === 'Show Output') output.show();
    });
  }
  status.schedule();
}

export async function deactivate(): Promise<void> {
  const c = client;
  client = null;
  try {
    await c?.stop();
  } catch {
    // A server that never started (or already stopped) has nothing to stop.
  }
}

/**
 * The note a Show Trends command is for: the one whose editor title bar it was run from, else
 * the active editor's, else the one visible Pneumark note (when the focus is in a panel or a
 * webview such as the trend view itself). With several notes in view and no text editor active,
 * the one the trend view shows, if it is among them, else the one the user picks (null: the pick
 * was cancelled). Undefined (or a document of another language) makes the view say to open a note.
 */
function noteFor(resource: unknown, shown: vscode.Uri | null): vscode.TextDocument | undefined | Promise<vscode.TextDocument | null> {
  if (resource instanceof vscode.Uri) {
    const document = vscode.workspace.textDocuments.find((d) => d.uri.toString() === resource.toString());
    if (document) return document;
  }
  const active = vscode.window.activeTextEditor?.document;
  if (active?.languageId === LANGUAGE) return active;
  const notes: vscode.TextDocument[] = [];
  for (const e of vscode.window.visibleTextEditors) {
    if (e.document.languageId === LANGUAGE && !notes.some((d) => d.uri.toString() === e.document.uri.toString())) notes.push(e.document);
  }
  if (notes.length === 1) return notes[0]!;
  if (active || notes.length === 0) return active;
  const onShow = shown ? notes.find((d) => d.uri.toString() === shown.toString()) : undefined;
  if (onShow) return onShow;
  // Asked only here, so that the view opens at once (before the command's promise settles) otherwise.
  return Promise.resolve(vscode.window.showQuickPick(
    // `$(name)` in a label is an icon: a zero-width space keeps a file name as it is written.
    notes.map((document) => ({ label: shownEscaped(document.isUntitled ? document.uri.path : vscode.workspace.asRelativePath(document.uri)).replace(/\$\(/g, '$\u200b('), document })),
    { title: 'Show the trends of', placeHolder: 'a Pneumark note in view' },
  )).then((picked) => picked?.document ?? null);
}

function createClient(output: vscode.LogOutputChannel, trace: vscode.LogOutputChannel, crashes: CrashHandler, didChangeConfiguration: NonNullable<NonNullable<Middleware['workspace']>['didChangeConfiguration']>, module: string): LanguageClient {
  // stdio: the server writes its messages as ASCII JSON there, which keeps big notes cheap to publish.
  // The same when the extension host is being debugged (any extension's F5 session runs the
  // installed extensions with --inspect): the server never opens an inspector port, which would let
  // any local process run code in it.
  const node = { module, transport: TransportKind.stdio } as const;
  const serverOptions: ServerOptions = { run: node, debug: node };
  const clientOptions: LanguageClientOptions = {
    documentSelector: [{ language: LANGUAGE }],
    synchronize: { fileEvents: vscode.workspace.createFileSystemWatcher('**/pneumark.config.json') },
    outputChannel: output,
    traceOutputChannel: trace,
    revealOutputChannelOn: RevealOutputChannelOn.Never,
    errorHandler: crashes,
    middleware: {
      workspace: { didChangeConfiguration },
      // A code's link opens the check's documentation rendered, at its heading (see checkDocsLink).
      handleDiagnostics: (uri, diagnostics, next) => next(uri, linkCodesToCheckDocs(diagnostics)),
    },
  };
  return new LanguageClient('pneumark', 'Pneumark', serverOptions, clientOptions);
}

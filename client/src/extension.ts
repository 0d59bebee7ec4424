/**
 * The VS Code extension: a thin client. It starts the bundled language server over IPC, adds the
 * commands, the status bar item and the trend view, and leaves every computation to the server.
 */
import * as vscode from 'vscode';
import {
  CloseAction,
  ErrorAction,
  LanguageClient,
  RevealOutputChannelOn,
  TransportKind,
  type ErrorHandler,
  type LanguageClientOptions,
  type ServerOptions,
} from 'vscode-languageclient/node';
import {
  ANALYSED_NOTIFICATION,
  CONVERT_UNITS_REQUEST,
  SUMMARY_REQUEST,
  type AnalysedParams,
  type ConvertUnitsParams,
  type PlainTextEdit,
  type SummaryParams,
  type SummaryResult,
} from '../../server/src/protocol';
import { TrendView } from './trend-view';

const LANGUAGE = 'pneumark';
/** Crashes within this window that count as "repeated". */
const CRASH_WINDOW_MS = 3 * 60 * 1000;
const MAX_RESTARTS = 4;

let client: LanguageClient | null = null;

export async function activate(context: vscode.ExtensionContext): Promise<void> {
  const output = vscode.window.createOutputChannel('Pneumark', { log: true });
  context.subscriptions.push(output);
  client = createClient(context, output);
  const trends = new TrendView(context, () => client);
  const status = vscode.window.createStatusBarItem('pneumark.timepoint', vscode.StatusBarAlignment.Right, 100);
  status.name = 'Pneumark timepoint';
  status.command = 'pneumark.showTrends';
  context.subscriptions.push(status, trends);

  context.subscriptions.push(
    vscode.commands.registerCommand('pneumark.restartServer', async () => {
      output.info('restarting the language server on request');
      await client?.restart();
    }),
    vscode.commands.registerCommand('pneumark.convertNoteUnits', () => convertNoteUnits()),
    vscode.commands.registerCommand('pneumark.insertTimepoint', () => insertTimepoint()),
    vscode.commands.registerCommand('pneumark.showTrends', () => trends.show(vscode.window.activeTextEditor?.document)),
    vscode.commands.registerCommand('pneumark.openCheckDocs', (code?: string) => openCheckDocs(context, code)),
  );

  let summaryTimer: NodeJS.Timeout | undefined;
  const refreshStatus = () => {
    if (summaryTimer) clearTimeout(summaryTimer);
    summaryTimer = setTimeout(() => void updateStatus(status), 120);
  };
  context.subscriptions.push(
    vscode.window.onDidChangeTextEditorSelection((e) => { if (e.textEditor.document.languageId === LANGUAGE) refreshStatus(); }),
    vscode.window.onDidChangeActiveTextEditor(() => refreshStatus()),
  );

  await client.start();
  client.onNotification(ANALYSED_NOTIFICATION, (p: AnalysedParams) => {
    trends.noteAnalysed(p.uri);
    if (vscode.window.activeTextEditor?.document.uri.toString() === p.uri) refreshStatus();
  });
  refreshStatus();
}

export async function deactivate(): Promise<void> {
  await client?.stop();
  client = null;
}

function createClient(context: vscode.ExtensionContext, output: vscode.LogOutputChannel): LanguageClient {
  const module = context.asAbsolutePath('dist/server.js');
  const serverOptions: ServerOptions = {
    // stdio: the server writes its messages as ASCII JSON there, which keeps big notes cheap to publish.
    run: { module, transport: TransportKind.stdio },
    debug: { module, transport: TransportKind.stdio, options: { execArgv: ['--nolazy', '--inspect=6019'] } },
  };
  const clientOptions: LanguageClientOptions = {
    documentSelector: [{ language: LANGUAGE }],
    synchronize: { fileEvents: vscode.workspace.createFileSystemWatcher('**/pneumark.config.json') },
    outputChannel: output,
    traceOutputChannel: output,
    revealOutputChannelOn: RevealOutputChannelOn.Never,
    errorHandler: crashHandler(output),
  };
  return new LanguageClient('pneumark', 'Pneumark', serverOptions, clientOptions);
}

/** Restarts a crashed server, and says so visibly after repeated crashes. */
function crashHandler(output: vscode.LogOutputChannel): ErrorHandler {
  const crashes: number[] = [];
  return {
    error: () => ({ action: ErrorAction.Continue }),
    closed: () => {
      const now = Date.now();
      crashes.push(now);
      while (crashes.length > 0 && now - crashes[0]! > CRASH_WINDOW_MS) crashes.shift();
      output.warn(`the language server stopped (${crashes.length} time(s) in the last 3 minutes)`);
      if (crashes.length > MAX_RESTARTS) {
        void vscode.window.showErrorMessage('The Pneumark language server stopped repeatedly and will not be restarted. See the Pneumark output for details.', 'Restart', 'Show Output').then((choice) => {
          if (choice === 'Restart') void vscode.commands.executeCommand('pneumark.restartServer');
          if (choice === 'Show Output') output.show();
        });
        return { action: CloseAction.DoNotRestart };
      }
      if (crashes.length > 1) void vscode.window.showWarningMessage('The Pneumark language server stopped and was restarted.');
      return { action: CloseAction.Restart };
    },
  };
}

async function updateStatus(status: vscode.StatusBarItem): Promise<void> {
  const editor = vscode.window.activeTextEditor;
  if (!client || !editor || editor.document.languageId !== LANGUAGE) {
    status.hide();
    return;
  }
  try {
    const params: SummaryParams = { uri: editor.document.uri.toString(), line: editor.selection.active.line };
    const summary = await client.sendRequest<SummaryResult | null>(SUMMARY_REQUEST, params);
    if (!summary) {
      status.hide();
      return;
    }
    status.text = `$(pulse) ${summary.text}`;
    status.tooltip = summary.tooltip;
    status.show();
  } catch {
    status.hide();
  }
}

async function convertNoteUnits(): Promise<void> {
  const editor = vscode.window.activeTextEditor;
  if (!client || !editor || editor.document.languageId !== LANGUAGE) {
    void vscode.window.showInformationMessage('Open a Pneumark note (.pneu) to convert its units.');
    return;
  }
  const pick = await vscode.window.showQuickPick(
    [
      { label: 'mmHg', description: 'gas pressures in millimetres of mercury' },
      { label: 'kPa', description: 'gas pressures in kilopascals' },
    ],
    { title: 'Convert every gas pressure of this note to' },
  );
  if (!pick) return;
  const params: ConvertUnitsParams = { uri: editor.document.uri.toString(), to: pick.label as 'mmHg' | 'kPa' };
  const edits = await client.sendRequest<PlainTextEdit[]>(CONVERT_UNITS_REQUEST, params);
  const edit = new vscode.WorkspaceEdit();
  for (const e of edits) {
    edit.replace(editor.document.uri, new vscode.Range(e.range.start.line, e.range.start.character, e.range.end.line, e.range.end.character), e.newText);
  }
  await vscode.workspace.applyEdit(edit);
}

async function insertTimepoint(): Promise<void> {
  const editor = vscode.window.activeTextEditor;
  if (!editor) return;
  const line = editor.selection.active.line;
  const atEnd = editor.document.lineAt(line).isEmptyOrWhitespace ? '' : '\n';
  const position = atEnd ? editor.document.lineAt(line).range.end : editor.selection.active;
  await editor.insertSnippet(new vscode.SnippetString(`${atEnd}@ \${1|+1h,+30m,day 1 08:00|}  \${2:label}\n\$0`), position);
}

async function openCheckDocs(context: vscode.ExtensionContext, code?: string): Promise<void> {
  const uri = vscode.Uri.joinPath(context.extensionUri, 'docs', 'checks.md');
  const target = typeof code === 'string' && /^PN\d{3}$/.test(code) ? uri.with({ fragment: code.toLowerCase() }) : uri;
  await vscode.commands.executeCommand('markdown.showPreview', target);
}

/**
 * The trend view: a webview beside the note that plots, per timepoint, the gases, oxygen
 * settings and mechanics. The data come from the server (`pneumark/trends`); the webview runs a
 * bundled charting library with a strict content security policy (a nonce, no remote resources).
 * It follows the note it was opened for, updates when that note is analysed again, and a click
 * on a point moves the editor to that timepoint.
 */
import { randomBytes } from 'node:crypto';
import * as vscode from 'vscode';
import type { LanguageClient } from 'vscode-languageclient/node';
import { TRENDS_REQUEST, type TrendsParams, type TrendsResult } from '../../server/src/protocol';
import type { FromWebview, ToWebview } from '../webview/messages';

export class TrendView implements vscode.Disposable {
  private panel: vscode.WebviewPanel | null = null;
  private uri: vscode.Uri | null = null;
  private pending: NodeJS.Timeout | null = null;
  private readonly disposables: vscode.Disposable[] = [];

  constructor(private readonly context: vscode.ExtensionContext, private readonly client: () => LanguageClient | null) {}

  show(document: vscode.TextDocument | undefined): void {
    if (!document || document.languageId !== 'pneumark') {
      void vscode.window.showInformationMessage('Open a Pneumark note (.pneu) to see its trends.');
      return;
    }
    this.uri = document.uri;
    if (!this.panel) this.panel = this.createPanel();
    this.panel.title = `Trends: ${vscode.workspace.asRelativePath(document.uri)}`;
    this.panel.reveal(vscode.ViewColumn.Beside, true);
    void this.refresh();
  }

  /** Called when the server has analysed a note: refresh if it is the one on show. */
  noteAnalysed(uri: string): void {
    if (!this.panel || this.uri?.toString() !== uri) return;
    if (this.pending) clearTimeout(this.pending);
    this.pending = setTimeout(() => void this.refresh(), 150);
  }

  dispose(): void {
    this.panel?.dispose();
    for (const d of this.disposables) d.dispose();
  }

  private createPanel(): vscode.WebviewPanel {
    const root = vscode.Uri.joinPath(this.context.extensionUri, 'dist', 'webview');
    const panel = vscode.window.createWebviewPanel('pneumark.trends', 'Trends', { viewColumn: vscode.ViewColumn.Beside, preserveFocus: true }, {
      enableScripts: true,
      localResourceRoots: [root],
      retainContextWhenHidden: false,
    });
    panel.webview.html = this.html(panel.webview, root);
    panel.onDidDispose(() => { this.panel = null; }, null, this.disposables);
    panel.webview.onDidReceiveMessage((m: FromWebview) => this.onMessage(m), null, this.disposables);
    return panel;
  }

  private async refresh(): Promise<void> {
    const client = this.client();
    if (!this.panel || !this.uri || !client) return;
    try {
      const params: TrendsParams = { uri: this.uri.toString() };
      const result = await client.sendRequest<TrendsResult | null>(TRENDS_REQUEST, params);
      const message: ToWebview = { type: 'trends', points: result?.points ?? [], note: vscode.workspace.asRelativePath(this.uri) };
      await this.panel?.webview.postMessage(message);
    } catch (error) {
      const message: ToWebview = { type: 'error', message: error instanceof Error ? error.message : String(error) };
      await this.panel?.webview.postMessage(message);
    }
  }

  private onMessage(m: FromWebview): void {
    if (m.type === 'ready') void this.refresh();
    if (m.type === 'reveal' && this.uri && Number.isInteger(m.line) && m.line >= 0) {
      const position = new vscode.Position(m.line, 0);
      void vscode.window.showTextDocument(this.uri, { viewColumn: vscode.ViewColumn.One, selection: new vscode.Range(position, position), preserveFocus: false });
    }
  }

  private html(webview: vscode.Webview, root: vscode.Uri): string {
    const nonce = randomBytes(16).toString('base64');
    const script = webview.asWebviewUri(vscode.Uri.joinPath(root, 'trends.js'));
    const style = webview.asWebviewUri(vscode.Uri.joinPath(root, 'trends.css'));
    const csp = [
      "default-src 'none'",
      `img-src ${webview.cspSource} data:`,
      `style-src ${webview.cspSource} 'nonce-${nonce}'`,
      `script-src 'nonce-${nonce}'`,
      `font-src ${webview.cspSource}`,
    ].join('; ');
    return `<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="UTF-8">
<meta http-equiv="Content-Security-Policy" content="${csp}">
<meta name="viewport" content="width=device-width, initial-scale=1.0">
<link rel="stylesheet" href="${style}" nonce="${nonce}">
<title>Trends</title>
</head>
<body>
<header><h1 id="title">Trends</h1><p class="caution">Decision support only — defer to local protocols and licensed practice.</p></header>
<main id="charts" aria-live="polite"><p class="empty">Waiting for the note's analysis…</p></main>
<script nonce="${nonce}" src="${script}"></script>
</body>
</html>`;
  }
}

/**
 * The trend view: a webview beside the note that plots, per timepoint, the gases, oxygen
 * settings and mechanics. The data come from the server (`pneumark/trends`); the webview runs a
 * bundled charting library with a strict content security policy (a nonce, no remote resources).
 *
 * It shows one note, named in its title, and follows the user: when another Pneumark note
 * becomes the active editor, the view shows that one. It updates when its note is analysed
 * again; when the note is closed it keeps its last trends and says so; a click on a point or a
 * timepoint's button in the table moves the editor to that timepoint. After a reload of the
 * window VS Code gives the panel back to the serializer, which reopens the note it showed; the
 * page itself keeps which lines its reader hid (its state, which VS Code keeps with the panel).
 */
import { randomBytes } from 'node:crypto';
import * as vscode from 'vscode';
import { TRENDS_REQUEST, type TrendPoint, type TrendsParams, type TrendsResult } from '../../server/src/protocol';
import { fromWebview, trendViewState, type FromWebview, type ToWebview } from '../webview/messages';
import { shownEscaped } from '../../server/src/core/util/format';
import { inMessage } from './message-text';
import { LANGUAGE, type Requester } from './status';
import { trendPageHtml } from './trend-html';

export const TREND_VIEW_TYPE = 'pneumark.trends';

export class TrendView implements vscode.Disposable, vscode.WebviewPanelSerializer {
  private panel: vscode.WebviewPanel | null = null;
  private panelDisposables: vscode.Disposable[] = [];
  /** The note on show. */
  private uri: vscode.Uri | null = null;
  /** Its points from the last answer, shown again when the page reloads or the note is closed. */
  private last: { uri: string; points: readonly TrendPoint[] } | null = null;
  private pending: ReturnType<typeof setTimeout> | null = null;
  /** Bumped by every refresh: an answer to an older one (another note, older text) is dropped. */
  private generation = 0;
  private readonly disposables: vscode.Disposable[] = [];

  /**
   * `send` gives the way to the server, or null when it is not running; it may first wait for
   * the server to start (after a reload of the window the view is restored before it runs).
   */
  constructor(private readonly extensionUri: vscode.Uri, private readonly send: () => Requester | null | Promise<Requester | null>, private readonly refreshDelayMs = 150) {
    this.disposables.push(
      vscode.window.onDidChangeActiveTextEditor((editor) => {
        if (this.panel && editor && editor.document.languageId === LANGUAGE && editor.document.uri.toString() !== this.uri?.toString()) this.follow(editor.document);
      }),
      vscode.workspace.onDidCloseTextDocument((document) => {
        if (this.panel && document.uri.toString() === this.uri?.toString()) void this.refresh();
      }),
      // A change of the note's language mode closes it and opens it again in the new language.
      vscode.workspace.onDidOpenTextDocument((document) => {
        if (this.panel && document.uri.toString() === this.uri?.toString()) void this.refresh();
      }),
    );
  }

  /** Opens the view beside the note (or brings it forward) and shows that note. */
  show(document: vscode.TextDocument | undefined): void {
    if (!document || document.languageId !== LANGUAGE) {
      void vscode.window.showInformationMessage('Open a Pneumark note (.pneu) to see its trends.');
      return;
    }
    if (this.panel) {
      this.panel.reveal(this.panel.viewColumn, true);
    } else {
      const panel = vscode.window.createWebviewPanel(TREND_VIEW_TYPE, 'Trends', { viewColumn: vscode.ViewColumn.Beside, preserveFocus: true }, this.options());
      this.adopt(panel);
    }
    this.follow(document);
  }

  /** The note on show, if any (for tests and the status bar). */
  get note(): vscode.Uri | null {
    return this.uri;
  }

  /** Restores the panel after a reload of the window (VS Code calls this). */
  deserializeWebviewPanel(panel: vscode.WebviewPanel, state: unknown): Promise<void> {
    if (this.panel) {
      // One trend view at a time: a second restored panel is not needed.
      panel.dispose();
      return Promise.resolve();
    }
    panel.webview.options = this.options();
    this.adopt(panel);
    // The page keeps the rest of its state (the lines hidden) itself, and reads it back once loaded.
    const saved = trendViewState(state)?.uri;
    const active = vscode.window.activeTextEditor?.document;
    if (saved !== undefined) {
      let uri: vscode.Uri | null = null;
      try {
        uri = vscode.Uri.parse(saved, true);
      } catch {
        uri = null;
      }
      if (uri) {
        this.uri = uri;
        this.panel!.title = `Trends: ${this.name(uri)}`;
        void this.refresh();
        return Promise.resolve();
      }
    }
    // Nothing here is awaited: VS Code shows the page only once this returns, and a message to
    // a page not shown yet waits until it is (awaiting one here would keep the panel loading).
    if (active && active.languageId === LANGUAGE) this.follow(active);
    else void this.post({ type: 'notice', message: 'Open a Pneumark note and run "Pneumark: Show Trends" to see its trends.' });
    return Promise.resolve();
  }

  /** Called when the server has analysed a note: refresh if it is the one on show. */
  noteAnalysed(uri: string): void {
    if (!this.panel || this.uri?.toString() !== uri) return;
    if (this.pending) clearTimeout(this.pending);
    this.pending = setTimeout(() => { this.pending = null; void this.refresh(); }, this.refreshDelayMs);
  }

  dispose(): void {
    if (this.pending) clearTimeout(this.pending);
    this.panel?.dispose();
    for (const d of this.disposables) d.dispose();
  }

  private options(): vscode.WebviewPanelOptions & vscode.WebviewOptions {
    return {
      enableScripts: true,
      enableCommandUris: false,
      enableForms: false,
      localResourceRoots: [vscode.Uri.joinPath(this.extensionUri, 'dist', 'webview')],
      retainContextWhenHidden: false,
    };
  }

  private follow(document: vscode.TextDocument): void {
    if (!this.panel) return;
    this.uri = document.uri;
    this.panel.title = `Trends: ${this.name(document.uri)}`;
    void this.refresh();
  }

  /** The note's name as the view shows it (its title, its messages): see message-text.ts. */
  private name(uri: vscode.Uri): string {
    return shownEscaped(uri.scheme === 'untitled' ? uri.path : vscode.workspace.asRelativePath(uri));
  }

  private adopt(panel: vscode.WebviewPanel): void {
    this.panel = panel;
    const root = vscode.Uri.joinPath(this.extensionUri, 'dist', 'webview');
    panel.webview.html = trendPageHtml({
      cspSource: panel.webview.cspSource,
      nonce: randomBytes(16).toString('base64'),
      script: panel.webview.asWebviewUri(vscode.Uri.joinPath(root, 'trends.js')).toString(),
      style: panel.webview.asWebviewUri(vscode.Uri.joinPath(root, 'trends.css')).toString(),
    });
    this.panelDisposables.push(
      panel.onDidDispose(() => {
        if (this.panel !== panel) return;
        this.panel = null;
        this.uri = null;
        this.last = null;
        for (const d of this.panelDisposables.splice(0)) d.dispose();
      }),
      panel.webview.onDidReceiveMessage((m: unknown) => {
        const message = fromWebview(m);
        if (message) void this.onMessage(message);
      }),
    );
  }

  private isOpen(uri: vscode.Uri): boolean {
    return this.openDocument(uri) !== undefined;
  }

  private openDocument(uri: vscode.Uri): vscode.TextDocument | undefined {
    const key = uri.toString();
    return vscode.workspace.textDocuments.find((d) => d.uri.toString() === key && !d.isClosed);
  }

  /** Asks the server for the note's points and posts them; keeps the last ones for a closed note. */
  private async refresh(): Promise<void> {
    const generation = ++this.generation;
    const uri = this.uri;
    if (!this.panel || !uri) return;
    const key = uri.toString();
    const note = this.name(uri);
    if (!this.isOpen(uri)) {
      if (this.last?.uri === key) {
        await this.post({ type: 'trends', points: this.last.points, note, uri: key, closed: true });
        return;
      }
      // After a reload of the window the note may not be open: open it (as a document, not an
      // editor) so that the server reads it. An untitled note that was closed is gone.
      if (uri.scheme === 'untitled') {
        await this.post({ type: 'notice', message: `${note} was closed without being saved: there are no trends to show.` });
        return;
      }
      try {
        await vscode.workspace.openTextDocument(uri);
      } catch {
        if (generation === this.generation) await this.post({ type: 'notice', message: `${note} could not be opened: it may have been moved or deleted.` });
        return;
      }
      if (generation !== this.generation) return;
    }
    // A note whose language mode was changed (or that a reload opened in another one) is not
    // analysed: the server knows nothing of it, which would read as a note without timepoints.
    const language = this.openDocument(uri)?.languageId;
    if (language !== undefined && language !== LANGUAGE) {
      this.last = null;
      await this.post({ type: 'notice', message: `${note} is not open as a Pneumark note: set its language mode to Pneumark to see its trends.`, uri: key });
      return;
    }
    const send = await this.send();
    if (generation !== this.generation) return;
    if (!send) {
      await this.post({ type: 'error', message: 'the Pneumark language server is not running (run "Pneumark: Restart Language Server")' });
      return;
    }
    try {
      const result = await this.ask(send, key);
      if (generation !== this.generation || this.uri?.toString() !== key) return;
      if (result === null && this.last?.uri === key && !this.isOpen(uri)) {
        await this.post({ type: 'trends', points: this.last.points, note, uri: key, closed: true });
        return;
      }
      if (result?.notAnalysed) {
        this.last = null;
        await this.post({ type: 'notice', message: `${note}: ${result.notAnalysed}`, uri: key });
        return;
      }
      const points = result?.points ?? [];
      this.last = { uri: key, points };
      await this.post({ type: 'trends', points, note, uri: key, closed: false });
    } catch (error) {
      if (generation !== this.generation) return;
      await this.post({ type: 'error', message: error instanceof Error ? error.message : String(error) });
    }
  }

  /**
   * The trends of a note from the server. A request that fails is sent once more to the server
   * running by then (`send` waits for a start under way): a request caught by a restart of the
   * server fails as the old one stops, and the new one answers it.
   */
  private async ask(send: Requester, uri: string): Promise<TrendsResult | null> {
    const params: TrendsParams = { uri };
    try {
      return await send<TrendsResult | null>(TRENDS_REQUEST, params);
    } catch (error) {
      const again = await this.send();
      if (!again) throw error;
      return await again<TrendsResult | null>(TRENDS_REQUEST, params);
    }
  }

  private async post(message: ToWebview): Promise<void> {
    await this.panel?.webview.postMessage(message);
  }

  private async onMessage(m: FromWebview): Promise<void> {
    if (m.type === 'ready') {
      await this.refresh();
      return;
    }
    if (!this.uri) return;
    const uri = this.uri;
    const position = new vscode.Position(m.line, 0);
    // The editor already showing the note, else a column other than the view's own.
    const visible = vscode.window.visibleTextEditors.find((e) => e.document.uri.toString() === uri.toString());
    const viewColumn = visible?.viewColumn ?? (this.panel?.viewColumn === vscode.ViewColumn.One ? vscode.ViewColumn.Two : vscode.ViewColumn.One);
    try {
      await vscode.window.showTextDocument(uri, { viewColumn, selection: new vscode.Range(position, position), preserveFocus: false });
    } catch {
      void vscode.window.showWarningMessage(`${inMessage(this.name(uri))} could not be opened: it may have been moved, deleted or closed without being saved.`);
    }
  }
}

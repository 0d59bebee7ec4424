/**
 * The status bar item: the key figures of the timepoint under the cursor, asked of the server
 * (`pneumark/timepointSummary`). It is shown only while a Pneumark note is the active editor,
 * follows the cursor and the note's analyses, and changes only when what it says changes (no
 * flicker while typing: the item keeps its figures until new ones come, and a stale answer, for
 * an earlier cursor position or another editor, is dropped).
 */
import * as vscode from 'vscode';
import { SUMMARY_REQUEST, type SummaryParams, type SummaryResult } from '../../server/src/protocol';
import { shownEscaped } from '../../server/src/core/util/format';

export const LANGUAGE = 'pneumark';

/** Sends a request to the language server (null while it is not running). */
export type Requester = <R>(method: string, params: unknown) => Promise<R>;

/** What the item shows for a summary: its text, tooltip and the name a screen reader reads. */
export function statusContent(raw: SummaryResult): { text: string; tooltip: string; accessibleName: string } {
  // A label from the note is text: characters that reorder or hide text are shown as escapes.
  const summary = { label: shownEscaped(raw.label), text: shownEscaped(raw.text), tooltip: raw.tooltip.split('\n').map(shownEscaped).join('\n') };
  // `$(name)` in it must not turn into an icon.
  const text = `$(pulse) ${summary.text.replace(/\$\(/g, '\\$(')}`;
  const figures = summary.text.split(' · ').map(spokenFigure).join(', ');
  const accessibleName = summary.text === summary.label
    ? `Pneumark timepoint ${summary.label}. Show trends.`
    : `Pneumark timepoint ${summary.label}: ${figures}. Show trends.`;
  const tooltip = `${summary.tooltip}\n\nClick to show the trends of this note.`;
  return { text, tooltip, accessibleName };
}

/**
 * A figure of the item as a screen reader should say it: the driving pressure by its name (`ΔP`
 * is read as "delta P"), and the mmHg of a P/F shown in kPa with its unit (`P/F 19.6 kPa (147)`).
 */
function spokenFigure(figure: string): string {
  return figure.replace(/^ΔP /, 'driving pressure ').replace(/^(P\/F [\d.]+ kPa) \(([\d.]+)\)$/, '$1 ($2 mmHg)');
}

export class TimepointStatus implements vscode.Disposable {
  readonly item: vscode.StatusBarItem;
  private timer: ReturnType<typeof setTimeout> | undefined;
  /** Bumped by every update: an answer to an older one is dropped. */
  private generation = 0;
  private readonly disposables: vscode.Disposable[] = [];

  constructor(private readonly send: () => Requester | null, private readonly delayMs = 120) {
    this.item = vscode.window.createStatusBarItem('pneumark.timepoint', vscode.StatusBarAlignment.Right, 100);
    this.item.name = 'Pneumark timepoint';
    this.item.command = 'pneumark.showTrends';
    this.disposables.push(
      vscode.window.onDidChangeTextEditorSelection((e) => { if (e.textEditor.document.languageId === LANGUAGE) this.schedule(); }),
      vscode.window.onDidChangeActiveTextEditor(() => this.schedule()),
      // A note whose language mode is changed is closed and opened again with the new language.
      vscode.workspace.onDidOpenTextDocument(() => this.schedule()),
      vscode.workspace.onDidCloseTextDocument(() => this.schedule()),
    );
  }

  /** The active editor's document when it is a Pneumark note. */
  private activeNote(): vscode.TextEditor | null {
    const editor = vscode.window.activeTextEditor;
    return editor && editor.document.languageId === LANGUAGE ? editor : null;
  }

  /** Updates after a short pause (cursor moves and keystrokes come in bursts). */
  schedule(): void {
    if (this.timer) clearTimeout(this.timer);
    if (!this.activeNote()) {
      // Another language, or no editor: hide at once rather than show stale figures.
      this.generation++;
      this.item.hide();
      return;
    }
    this.timer = setTimeout(() => { this.timer = undefined; void this.update(); }, this.delayMs);
  }

  /** Called when the server has analysed a note. */
  noteAnalysed(uri: string): void {
    if (this.activeNote()?.document.uri.toString() === uri) this.schedule();
  }

  async update(): Promise<void> {
    const generation = ++this.generation;
    const editor = this.activeNote();
    const send = this.send();
    if (!editor || !send) {
      this.item.hide();
      return;
    }
    const params: SummaryParams = { uri: editor.document.uri.toString(), line: editor.selection.active.line };
    let summary: SummaryResult | null;
    try {
      summary = await send<SummaryResult | null>(SUMMARY_REQUEST, params);
    } catch {
      summary = null;
    }
    // The cursor moved, the editor changed or another update started meanwhile: that one decides.
    if (generation !== this.generation || vscode.window.activeTextEditor !== editor || editor.document.languageId !== LANGUAGE) return;
    if (!summary) {
      this.item.hide();
      return;
    }
    const content = statusContent(summary);
    if (this.item.text !== content.text) this.item.text = content.text;
    if (this.item.tooltip !== content.tooltip) this.item.tooltip = content.tooltip;
    if (this.item.accessibilityInformation?.label !== content.accessibleName) this.item.accessibilityInformation = { label: content.accessibleName, role: 'button' };
    this.item.show();
  }

  dispose(): void {
    if (this.timer) clearTimeout(this.timer);
    this.item.dispose();
    for (const d of this.disposables) d.dispose();
  }
}

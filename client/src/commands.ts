/**
 * The editing commands and the check documentation: Convert Gas Units of This Note, Insert
 * Timepoint and Open Check Documentation. Each says plainly why it did nothing, when it did
 * nothing: no Pneumark note in front, a read-only note, a note that changed or was closed while
 * the server worked out the edits.
 */
import * as vscode from 'vscode';
import { CONVERT_UNITS_REQUEST, type ConvertUnitsParams, type PlainTextEdit } from '../../server/src/protocol';
import { inMessage } from './message-text';
import { LANGUAGE, type Requester } from './status';

/**
 * What the unit picker of Convert Gas Units says it converts. Short enough for the picker's input
 * at its usual width (about 80 characters): cut off, its end ("line") was lost and a tooltip
 * repeated it over the list.
 */
export const CONVERT_PLACEHOLDER = 'PaO2, PaCO2, venous gases, EtCO2, barometric pressure and the units gas line';

function activeNote(purpose: string): vscode.TextEditor | null {
  const editor = vscode.window.activeTextEditor;
  if (editor && editor.document.languageId === LANGUAGE) return editor;
  void vscode.window.showInformationMessage(`Open a Pneumark note (.pneu) ${purpose}.`);
  return null;
}

/** The note as a message names it: its path in the workspace, as text (see message-text.ts). */
function noteName(document: vscode.TextDocument): string {
  return document.isUntitled ? 'This note' : inMessage(vscode.workspace.asRelativePath(document.uri));
}

function readOnlyMessage(document: vscode.TextDocument): string {
  return `${noteName(document)} could not be changed: it is read-only.`;
}

/**
 * `server` gives the way to the server, or null when it is not running; it may first wait for a
 * start under way (the note that woke the extension up, a restart on request), so that a command
 * run at once is not told the server is not running.
 */
export async function convertNoteUnits(server: Requester | null | Promise<Requester | null>): Promise<void> {
  const editor = activeNote('to convert its gas units');
  if (!editor) return;
  const send = await server;
  if (!send) {
    void vscode.window.showWarningMessage('The Pneumark language server is not running: restart it with "Pneumark: Restart Language Server".');
    return;
  }
  const pick = await vscode.window.showQuickPick(
    [
      { label: 'mmHg', description: 'millimetres of mercury' },
      { label: 'kPa', description: 'kilopascals' },
    ],
    { title: 'Convert every gas pressure of this note to', placeHolder: CONVERT_PLACEHOLDER },
  );
  if (!pick) return;
  const to = pick.label as ConvertUnitsParams['to'];
  const document = editor.document;
  const version = document.version;
  let edits: PlainTextEdit[];
  try {
    edits = await send<PlainTextEdit[]>(CONVERT_UNITS_REQUEST, { uri: document.uri.toString(), to } satisfies ConvertUnitsParams);
  } catch (error) {
    void vscode.window.showErrorMessage(`The gas units could not be converted: ${inMessage(error instanceof Error ? error.message : String(error))}`);
    return;
  }
  if (document.isClosed) {
    void vscode.window.showWarningMessage(`${noteName(document)} was closed while its units were being converted, so nothing was changed.`);
    return;
  }
  // Edits worked out for one version of the note would land in the wrong places in another.
  if (document.version !== version) {
    void vscode.window.showWarningMessage('The note changed while its units were being converted, so nothing was changed: run the command again.');
    return;
  }
  if (edits.length === 0) {
    void vscode.window.showInformationMessage(`Nothing to convert: the gas pressures of this note are already in ${to}.`);
    return;
  }
  const edit = new vscode.WorkspaceEdit();
  for (const e of edits) {
    edit.replace(document.uri, new vscode.Range(e.range.start.line, e.range.start.character, e.range.end.line, e.range.end.character), e.newText);
  }
  if (!(await vscode.workspace.applyEdit(edit))) void vscode.window.showWarningMessage(readOnlyMessage(document));
}

/** Where a new timepoint goes and what is typed there: a snippet at a line's end or start. */
export interface TimepointInsertion {
  readonly line: number;
  readonly atEnd: boolean;
  readonly snippet: string;
}

const TIMEPOINT_LINE = /^\s*@/;

/**
 * A new timepoint goes after the timepoint (or the header) the cursor is in, never inside it:
 * a timepoint line in the middle of another's lines would move the lines below it to the new
 * time. It follows the block's last line that is not blank, after a blank line, or starts an
 * empty note. The time offered first is an offset from the timepoint before (`+1h`); a note
 * with no timepoint yet starts with a day and a time of day.
 */
export function timepointInsertion(lines: readonly string[], cursorLine: number): TimepointInsertion {
  const at = Math.min(Math.max(cursorLine, 0), Math.max(lines.length - 1, 0));
  let next = at + 1;
  while (next < lines.length && !TIMEPOINT_LINE.test(lines[next]!)) next++;
  let last = next - 1;
  while (last >= 0 && lines[last]!.trim() === '') last--;
  const before = lines.slice(0, Math.max(last + 1, 0)).some((l) => TIMEPOINT_LINE.test(l));
  const times = before ? '+1h,+30m,+15m,day 2 08:00' : 'day 1 08:00,08:00';
  const timepoint = `@ \${1|${times}|}  \${2:label}\n\$0`;
  if (last < 0) return { line: 0, atEnd: false, snippet: lines.length > 0 && lines[0]!.trim() !== '' ? `${timepoint}\n` : timepoint };
  return { line: last, atEnd: true, snippet: `\n\n${timepoint}` };
}

export async function insertTimepoint(): Promise<void> {
  const editor = activeNote('to insert a timepoint');
  if (!editor) return;
  const document = editor.document;
  const lines: string[] = [];
  for (let i = 0; i < document.lineCount; i++) lines.push(document.lineAt(i).text);
  const plan = timepointInsertion(lines, editor.selection.active.line);
  const position = plan.atEnd ? document.lineAt(plan.line).range.end : new vscode.Position(plan.line, 0);
  const done = await editor.insertSnippet(new vscode.SnippetString(plan.snippet), position);
  if (!done) void vscode.window.showWarningMessage(readOnlyMessage(document));
}

/** A check as its documentation heading names it: `## PN101 unknown-section`. */
export interface CheckDoc {
  readonly code: string;
  readonly alias: string;
  /** The heading's anchor in the Markdown preview: `pn101-unknown-section`. */
  readonly anchor: string;
  /** Its title (`Unknown section`), for the picker. */
  readonly summary: string;
}

/** The checks documented in docs/checks.md, in its order. */
export function checkDocs(markdown: string): CheckDoc[] {
  const lines = markdown.split(/\r?\n/);
  const docs: CheckDoc[] = [];
  for (let i = 0; i < lines.length; i++) {
    const m = /^## (PN\d{3}) ([a-z0-9-]+)\s*$/.exec(lines[i]!);
    if (!m) continue;
    let summary = '';
    for (let j = i + 1; j < lines.length && !lines[j]!.startsWith('#'); j++) {
      const text = lines[j]!.trim();
      if (text !== '') {
        // `**Unknown section** — default severity: error; …`: the title in bold.
        summary = /^\*\*(.+?)\*\*/.exec(text)?.[1] ?? text;
        break;
      }
    }
    docs.push({ code: m[1]!, alias: m[2]!, anchor: `${m[1]!.toLowerCase()}-${m[2]!}`, summary });
  }
  return docs;
}

/**
 * The link of a diagnostic's code: the server links each code to its heading in docs/checks.md
 * (a file URI with the heading as fragment, which any editor can open), but VS Code opens such a
 * link as Markdown source at its first line, whatever the fragment. In VS Code the code opens
 * Open Check Documentation at that check instead: the rendered documentation, at its heading.
 */
export function checkDocsLink(code: string): vscode.Uri {
  return vscode.Uri.parse(`command:pneumark.openCheckDocs?${encodeURIComponent(JSON.stringify([code]))}`);
}

/** The diagnostics given, each code that links to docs/checks.md linked with `checkDocsLink`. */
export function linkCodesToCheckDocs(diagnostics: vscode.Diagnostic[]): vscode.Diagnostic[] {
  for (const d of diagnostics) {
    const code = d.code;
    if (typeof code !== 'object' || code === null || typeof code.value !== 'string') continue;
    if (!/^PN\d{3}$/.test(code.value) || !code.target.path.endsWith('/docs/checks.md')) continue;
    d.code = { value: code.value, target: checkDocsLink(code.value) };
  }
  return diagnostics;
}

/** The documented check a code (`PN101`, `pn101`) or alias (`unknown-section`) names. */
export function findCheck(docs: readonly CheckDoc[], name: string): CheckDoc | undefined {
  const wanted = name.trim().toLowerCase();
  return docs.find((d) => d.code.toLowerCase() === wanted || d.alias === wanted);
}

/**
 * Opens the check documentation that ships with the extension (docs/checks.md: it works
 * offline) in the Markdown preview, at the check named, or at the one picked from a list when
 * none is named. Without the Markdown preview it opens the file itself at that heading.
 */
export async function openCheckDocs(extensionUri: vscode.Uri, name?: unknown): Promise<void> {
  const uri = vscode.Uri.joinPath(extensionUri, 'docs', 'checks.md');
  let docs: CheckDoc[] = [];
  let text = '';
  try {
    text = new TextDecoder().decode(await vscode.workspace.fs.readFile(uri));
    docs = checkDocs(text);
  } catch {
    void vscode.window.showErrorMessage('The check documentation (docs/checks.md) is missing from the Pneumark extension: reinstall it.');
    return;
  }
  let check: CheckDoc | undefined;
  if (typeof name === 'string' && name.trim() !== '') {
    check = findCheck(docs, name);
    if (!check) void vscode.window.showInformationMessage(`${inMessage(name)} is not a Pneumark check: showing the list of checks.`);
  } else {
    const picked = await vscode.window.showQuickPick(
      [{ label: 'All checks', description: 'the whole list', check: undefined as CheckDoc | undefined },
        ...docs.map((d) => ({ label: `${d.code} ${d.alias}`, description: d.summary, check: d as CheckDoc | undefined }))],
      { title: 'Open the documentation of a Pneumark check', placeHolder: 'type a code (PN405) or a word of its name', matchOnDescription: true },
    );
    if (!picked) return;
    check = picked.check;
  }
  const target = check ? uri.with({ fragment: check.anchor }) : uri;
  try {
    await vscode.commands.executeCommand('markdown.showPreview', target);
  } catch {
    const line = check ? Math.max(0, text.split(/\r?\n/).findIndex((l) => l.startsWith(`## ${check.code} `))) : 0;
    const position = new vscode.Position(line, 0);
    await vscode.window.showTextDocument(uri, { selection: new vscode.Range(position, position), preview: true });
  }
}

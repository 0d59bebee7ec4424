// A note typed one character at a time through the path the language server takes on
// `textDocument/didChange`: the editor's incremental change applied to the open document
// (vscode-languageserver-textdocument, as the server's `TextDocuments` does), then the note's
// `NoteSession` brought to the new text (`steps`, as server.ts does, which is one step for a
// keystroke). At each keystroke it keeps the findings and the cursor; the editor features
// (completion, hover, code actions, hints) can be asked of any keystroke's result.
import { TextDocument } from 'vscode-languageserver-textdocument';
import { NoteSession, type NoteResult, type Settings } from '../../server/src/core';
import type { Finding, Position } from '../../server/src/core/types';
import { codeActions, completionsAt, heldWhileTyping, hoverAt, inlayHints, type InlayHintInfo } from '../../server/src/core/service';
import { HINT_CATEGORIES } from '../../server/src/core/service/types';

export interface Keystroke {
  /** The text after this keystroke. */
  readonly text: string;
  /** Where the cursor is after it (just after the character typed). */
  readonly cursor: Position;
  /** The character typed (`\n` for Enter). */
  readonly typed: string;
  readonly result: NoteResult;
}

export interface TypingOptions {
  readonly settings?: Partial<Settings>;
  /** Text already in the note before typing starts (the cursor starts at its end). */
  readonly before?: string;
}

/** A note typed from `options.before` (or nothing) to `before + typed`, a keystroke per character. */
export function typeNote(typed: string, options: TypingOptions = {}): Keystroke[] {
  const session = new NoteSession(options.settings ?? {});
  let doc = TextDocument.create('file:///typed.pneu', 'pneumark', 1, options.before ?? '');
  analyse(session, doc.getText());
  const strokes: Keystroke[] = [];
  for (const ch of typed) {
    const at = doc.positionAt(doc.getText().length);
    doc = TextDocument.update(doc, [{ range: { start: at, end: at }, text: ch }], doc.version + 1);
    const text = doc.getText();
    const result = analyse(session, text);
    strokes.push({ text, cursor: doc.positionAt(text.length), typed: ch, result });
  }
  return strokes;
}

function analyse(session: NoteSession, text: string): NoteResult {
  const steps = session.steps(text);
  for (;;) {
    const next = steps.next();
    if (next.done) return next.value;
  }
}

/** A finding shown while its line was typed, gone once the line was finished (Enter, or the end of typing). */
export interface Flash {
  readonly finding: Finding;
  /** The text of the line when it was shown. */
  readonly lineText: string;
}

const sameFinding = (a: Finding, b: Finding) => a.code === b.code && a.range.start.line === b.range.start.line && a.range.start.character === b.range.start.character;

/**
 * The findings on the line under the cursor that the finished line does not have: what a
 * person typing sees come and go. Each (code, line, start) is listed once, at its first showing.
 */
export function flashes(strokes: readonly Keystroke[], shownAt: (k: number) => readonly Finding[] = (k) => strokes[k]!.result.findings): Flash[] {
  const out: Flash[] = [];
  for (let k = 0; k < strokes.length; k++) {
    const { cursor, text } = strokes[k]!;
    // The keystroke after which the cursor's line is finished: the Enter that leaves it, or the last.
    let done = k + 1;
    while (done < strokes.length && strokes[done]!.typed !== '\n') done++;
    if (done === strokes.length) done--;
    const finished = strokes[done]!.result.findings;
    for (const f of shownAt(k)) {
      if (f.range.start.line !== cursor.line) continue;
      if (finished.some((g) => sameFinding(f, g))) continue;
      if (out.some((o) => sameFinding(o.finding, f))) continue;
      out.push({ finding: f, lineText: text.split(/\r\n|\r|\n/)[cursor.line]! });
    }
  }
  return out;
}

/**
 * What the language server shows at each keystroke while the typist does not pause: the findings
 * less those `heldWhileTyping` holds back at the keystroke's place (none after Enter), a finding
 * shown at the keystroke before staying shown.
 */
export function shownWhileTyping(strokes: readonly Keystroke[]): Finding[][] {
  const shown: Finding[][] = [];
  let before: readonly Finding[] = [];
  for (const { result, cursor, text, typed } of strokes) {
    const all = result.findings;
    const lineText = text.split(/\r\n|\r|\n/)[cursor.line]!;
    const held = typed === '\n' ? [] : heldWhileTyping(all, lineText, cursor, (f) => before.some((g) => sameFinding(f, g)));
    const now = all.filter((f) => !held.includes(f));
    shown.push(now);
    before = now;
  }
  return shown;
}

/** The editor features at a keystroke's cursor (or at `at`). */
export function completionsAfter(stroke: Keystroke, at: Position = stroke.cursor) {
  return completionsAt(stroke.result, at);
}

export function hoverAfter(stroke: Keystroke, at: Position) {
  return hoverAt(stroke.result, at);
}

export function actionsAfter(stroke: Keystroke, at: Position = stroke.cursor) {
  return codeActions(stroke.result, { start: at, end: at });
}

/** Every hint category's hints on the note's lines. */
export function hintsAfter(stroke: Keystroke): InlayHintInfo[] {
  const lines = stroke.text.split(/\r\n|\r|\n/).length;
  return inlayHints(stroke.result, { start: 0, end: lines - 1 }, { categories: new Set(HINT_CATEGORIES) });
}

/** The keystroke after which the note first reads `prefix` (its text ends there). */
export function strokeAt(strokes: readonly Keystroke[], prefix: string): Keystroke {
  const found = strokes.find((s) => s.text === prefix);
  if (!found) throw new Error(`no keystroke leaves the note as ${JSON.stringify(prefix)}`);
  return found;
}

// A note typed as a person types it, over a real stdio connection to the bundled server: CRLF
// line endings, tabs and characters outside the BMP before the cursor (UTF-16 columns), half-typed
// keys, completions applied with the edit they carry, quick fixes applied as the editor applies
// them, incremental changes, and formatting that holds still once done.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import type { CodeAction, CompletionItem, Diagnostic, Hover, InlayHint, Position, TextEdit } from 'vscode-languageserver-protocol';
import { applyEdits } from '../../server/src/core/service/text-edits';
import { serverForTests } from './lsp-client';

const client = serverForTests();

const path = (name: string) => join(process.cwd(), name);

/** A note being typed: its text and version, kept in step with the server. */
class Typed {
  version = 1;
  constructor(readonly uri: string, public text: string) {}

  static async open(name: string, text: string): Promise<Typed> {
    const note = new Typed(client.open(path(name), text), text);
    await client.diagnostics(note.uri);
    return note;
  }

  /** Applies edits as the editor does, and sends them as incremental changes (UTF-16 ranges). */
  async edit(edits: readonly TextEdit[]): Promise<void> {
    this.text = applyEdits(this.text, edits);
    this.version++;
    // Sent last edit first, so that each range still refers to the text it was made against.
    const sorted = [...edits].sort((a, b) => b.range.start.line - a.range.start.line || b.range.start.character - a.range.start.character);
    await client.connection.sendNotification('textDocument/didChange', {
      textDocument: { uri: this.uri, version: this.version },
      contentChanges: sorted.map((e) => ({ range: e.range, text: e.newText })),
    });
    const version = this.version;
    await client.diagnostics(this.uri, (p) => p.version === version);
  }

  async complete(position: Position): Promise<CompletionItem[]> {
    return client.connection.sendRequest<CompletionItem[]>('textDocument/completion', { textDocument: { uri: this.uri }, position });
  }

  async hover(position: Position): Promise<Hover | null> {
    return client.connection.sendRequest<Hover | null>('textDocument/hover', { textDocument: { uri: this.uri }, position });
  }

  async actions(position: Position): Promise<CodeAction[]> {
    return client.connection.sendRequest<CodeAction[]>('textDocument/codeAction', { textDocument: { uri: this.uri }, range: { start: position, end: position }, context: { diagnostics: [] } });
  }

  async format(): Promise<TextEdit[]> {
    return client.connection.sendRequest<TextEdit[]>('textDocument/formatting', { textDocument: { uri: this.uri }, options: { tabSize: 2, insertSpaces: true } });
  }

  /** Picks a completion and applies its edit. */
  async pick(position: Position, label: string): Promise<void> {
    const item = (await this.complete(position)).find((c) => c.label === label);
    expect(item, `${label} offered at ${JSON.stringify(position)} of ${JSON.stringify(this.text)}`).toBeDefined();
    const edit = item!.textEdit as TextEdit;
    await this.edit([edit]);
  }

  /** Types text at a position. */
  async type(position: Position, text: string): Promise<void> {
    await this.edit([{ range: { start: position, end: position }, newText: text }]);
  }

  lines(): string[] {
    return this.text.split(/\r\n|\r|\n/);
  }

  /** The end of a line, in UTF-16 code units. */
  end(line: number): Position {
    return { line, character: this.lines()[line]!.length };
  }
}

describe('typing a note with CRLF line endings, tabs and emoji', () => {
  it('completes, converts, fixes and formats with UTF-16 columns', async () => {
    const note = await Typed.open('typing-crlf.pneu', '@ day 1 08:00  🚑 arrival\r\n');
    // A new line: the section, chosen from a half-typed word after a tab and an emoji comment.
    await note.type({ line: 1, character: 0 }, 'vi');
    await note.pick({ line: 1, character: 2 }, 'vitals');
    expect(note.lines()[1]).toBe('vitals    ');
    await note.type(note.end(1), '\thr 92,');
    // Right after the comma (a trigger character): the key comes after a blank.
    await note.pick(note.end(1), 'spo2');
    await note.type(note.end(1), ' 9');
    // A number being typed: nothing to offer.
    expect(await note.complete(note.end(1))).toEqual([]);
    await note.type(note.end(1), '1 ');
    await note.pick(note.end(1), '%');
    expect(note.lines()[1]).toBe('vitals    \thr 92, spo2 91 %');

    // A gas line after a line with emoji, half-typed, then in kPa.
    await note.type(note.end(1), '\r\nabg 😀');
    expect(note.text.endsWith('\r\nabg 😀')).toBe(true);
    await note.edit([{ range: { start: { line: 2, character: 4 }, end: note.end(2) }, newText: 'ph 7.31, pc' }]);
    const half = await note.complete(note.end(2));
    expect(half.map((c) => c.label)).toEqual(['pco2']);
    expect((half[0]!.textEdit as TextEdit).range).toEqual({ start: { line: 2, character: 13 }, end: { line: 2, character: 15 } });
    await note.pick(note.end(2), 'pco2');
    await note.type(note.end(2), ' 7.1 kPa, po2 9,0 kPa');
    expect(note.lines()[2]).toBe('abg ph 7.31, pco2 7.1 kPa, po2 9,0 kPa');

    // The decimal comma's quick fix, applied as the editor applies it.
    const fix = (await note.actions({ line: 2, character: 32 })).find((a) => a.title === 'Write `9.0`');
    expect(fix?.kind).toBe('quickfix');
    await note.edit(fix!.edit!.changes![note.uri]!);
    expect(note.lines()[2]).toBe('abg ph 7.31, pco2 7.1 kPa, po2 9.0 kPa');

    // Hover after the emoji of the label and on the value written in kPa.
    const onPo2 = await note.hover({ line: 2, character: 31 });
    expect(onPo2?.range).toEqual({ start: { line: 2, character: 31 }, end: { line: 2, character: 34 } });
    expect(JSON.stringify(onPo2?.contents)).toContain('**9.0 kPa** = 68 mmHg');
    const onTime = await note.hover({ line: 0, character: 20 });
    expect(onTime?.range).toEqual({ start: { line: 0, character: 0 }, end: { line: 0, character: '@ day 1 08:00  🚑 arrival'.length } });

    // Every gas pressure in mmHg, then back: the values as written come back, CRLF kept.
    const toMmhg = (await note.actions({ line: 2, character: 19 })).find((a) => a.title === 'Convert every gas pressure in the note to mmHg');
    await note.edit(toMmhg!.edit!.changes![note.uri]!);
    expect(note.lines()[0]).toBe('units     gas mmHg');
    // 9.0 kPa is 67.5 mmHg: 68 mmHg would come back as 9.1 kPa.
    expect(note.lines()[3]).toBe('abg ph 7.31, pco2 53 mmHg, po2 67.5 mmHg');
    const toKpa = (await note.actions({ line: 3, character: 19 })).find((a) => a.title === 'Convert every gas pressure in the note to kPa');
    await note.edit(toKpa!.edit!.changes![note.uri]!);
    expect(note.lines()[3]).toBe('abg ph 7.31, pco2 7.1 kPa, po2 9.0 kPa');
    expect(note.text.split('\r\n').length).toBe(note.lines().length);

    // Formatting: once, then nothing more to do; tabs become the layout, the emoji stay.
    await note.edit(await note.format());
    expect(note.lines()[2]).toBe('vitals    hr 92, spo2 91 %');
    expect(note.lines()[1]).toBe('@ day 1 08:00  🚑 arrival');
    expect(await note.format()).toEqual([]);
    expect(note.text).toContain('\r\n');
    expect(note.text).not.toMatch(/[^\r]\n/);

    // Hints sit at the end of each line's content, in UTF-16 columns.
    const hints = await client.connection.sendRequest<InlayHint[]>('textDocument/inlayHint', { textDocument: { uri: note.uri }, range: { start: { line: 0, character: 0 }, end: { line: 5, character: 0 } } });
    for (const h of hints) expect(h.position.character).toBe(note.lines()[h.position.line]!.length);
  });

  it('keeps the word after the cursor when what is offered is of another kind', async () => {
    const note = await Typed.open('typing-before-word.pneu', '@ 08:00\nvitals    hr 80 rr 18\n');
    await note.pick({ line: 1, character: 16 }, '/min');
    expect(note.lines()[1]).toBe('vitals    hr 80 /min rr 18');
  });

  it('completes a device of two words, and no unit after a FiO2 fraction', async () => {
    const note = await Typed.open('typing-device.pneu', '@ 08:00\noxygen    room a');
    await note.pick(note.end(1), 'room air');
    expect(note.lines()[1]).toBe('oxygen    room air');
    await note.type(note.end(1), '\nvent      fio2 0.4 ');
    expect((await note.complete(note.end(2))).map((c) => c.label)).not.toContain('%');
  });
});

describe('a note typed one character at a time', () => {
  it('gets what the same text opened at once gets: diagnostics, outline, folding and hints', async () => {
    const text = readFileSync(join(process.cwd(), 'samples/broken-note.pneu'), 'utf8') + readFileSync(join(process.cwd(), 'samples/icu-ventilated-lung-injury.pneu'), 'utf8');
    const note = await Typed.open('typing-one-by-one.pneu', '');
    let line = 0;
    let character = 0;
    for (let i = 0; i < text.length; i++) {
      const c = text[i]!;
      note.text += c;
      note.version++;
      // Sent as an editor sends keystrokes, without waiting for the analysis of each.
      await client.connection.sendNotification('textDocument/didChange', {
        textDocument: { uri: note.uri, version: note.version },
        contentChanges: [{ range: { start: { line, character }, end: { line, character } }, text: c }],
      });
      if (c === '\n') { line++; character = 0; } else character++;
    }
    const version = note.version;
    const typed = await client.diagnostics(note.uri, (p) => p.version === version);
    const opened = await Typed.open('typing-opened-at-once.pneu', text);
    const diagnostics = await client.diagnostics(opened.uri);
    const plain = (list: readonly Diagnostic[]) => list.map((d) => ({ range: d.range, code: d.code, severity: d.severity, message: d.message }));
    expect(typed.diagnostics.length).toBeGreaterThan(20);
    expect(plain(typed.diagnostics)).toEqual(plain(diagnostics.diagnostics));
    for (const method of ['textDocument/documentSymbol', 'textDocument/foldingRange']) {
      expect(await client.connection.sendRequest(method, { textDocument: { uri: note.uri } }), method).toEqual(await client.connection.sendRequest(method, { textDocument: { uri: opened.uri } }));
    }
    const range = { start: { line: 0, character: 0 }, end: { line: note.lines().length, character: 0 } };
    const hints = async (uri: string) => (await client.connection.sendRequest<InlayHint[]>('textDocument/inlayHint', { textDocument: { uri }, range })).map((h) => [h.position, h.label, h.tooltip ?? null]);
    expect(await hints(note.uri)).toEqual(await hints(opened.uri));
  }, 60_000);
});

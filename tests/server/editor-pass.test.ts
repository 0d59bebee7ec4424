// What an editor shows for a note, over a real stdio connection to the bundled server: a fix that
// two diagnostics of a selection share is one entry of the menu; a blood pressure in kPa is
// offered converted; no line snippet goes in front of a section word; the unit after a shorthand
// gas names both pressures; the outline's section lines come without an empty `children`.
// (Found driving the server as an editor does: typing, pasting, undoing and asking at every step.)
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import type { CodeAction, CompletionItem, Diagnostic, DocumentSymbol, Hover, TextEdit } from 'vscode-languageserver-protocol';
import { applyEdits } from '../../server/src/core/service/text-edits';
import { serverForTests } from './lsp-client';

const client = serverForTests();

const path = (name: string) => join(process.cwd(), name);

async function opened(name: string, text: string): Promise<{ uri: string; diagnostics: Diagnostic[] }> {
  const uri = client.open(path(name), text);
  return { uri, diagnostics: (await client.diagnostics(uri)).diagnostics };
}

const actionsOn = (uri: string, range: { start: { line: number; character: number }; end: { line: number; character: number } }, diagnostics: Diagnostic[]) =>
  client.connection.sendRequest<CodeAction[]>('textDocument/codeAction', { textDocument: { uri }, range, context: { diagnostics } });

describe('code actions on a selected line', () => {
  it('offer a fix two diagnostics share once, claiming both', async () => {
    const text = '@ 08:00\noxygen    hfnc 50 L/min, fio2 0.6, ipap 12, epap 6\n';
    const { uri, diagnostics } = await opened('editor-pass-niv.pneu', text);
    const line = { start: { line: 1, character: 0 }, end: { line: 1, character: 50 } };
    const niv = (await actionsOn(uri, line, diagnostics)).filter((a) => a.title === 'Change the device to `niv`');
    expect(niv).toHaveLength(1);
    expect(niv[0]!.diagnostics?.map((d) => d.code)).toEqual(['PN318', 'PN318']);
    const fixed = applyEdits(text, niv[0]!.edit!.changes![uri]!);
    expect(fixed).toBe('@ 08:00\noxygen    niv 50 L/min, fio2 0.6, ipap 12, epap 6\n');
  });

  it('offer a mean pressure written in kPa converted, and the fixed note has no diagnostic', async () => {
    const text = '@ 08:00\nvitals    bp 120/80 (12 kPa), hr 80\n';
    const { uri, diagnostics } = await opened('editor-pass-map.pneu', text);
    const unit = diagnostics.find((d) => d.code === 'PN203')!;
    const actions = await actionsOn(uri, unit.range, [unit]);
    expect(actions.filter((a) => a.kind === 'quickfix').map((a) => a.title)).toEqual(['Convert to 90 mmHg', 'Change to mmHg']);
    const fixed = applyEdits(text, actions[0]!.edit!.changes![uri]!);
    expect(fixed).toBe('@ 08:00\nvitals    bp 120/80 (90 mmHg), hr 80\n');
    const again = await opened('editor-pass-map-fixed.pneu', fixed);
    expect(again.diagnostics).toEqual([]);
  });
});

describe('completion at the start of a line', () => {
  it('offers section words in place of the first word, and no line snippet in front of it', async () => {
    const text = '@ 08:00\nvitals    hr 80\n\n';
    const { uri } = await opened('editor-pass-start.pneu', text);
    const atWord = await client.connection.sendRequest<CompletionItem[]>('textDocument/completion', { textDocument: { uri }, position: { line: 1, character: 0 } });
    expect(atWord.filter((c) => c.label.startsWith('@') || c.label.includes('/'))).toEqual([]);
    const abg = atWord.find((c) => c.label === 'abg');
    expect(applyEdits(text, [abg!.textEdit as TextEdit])).toBe('@ 08:00\nabg    hr 80\n\n');
    // On the blank line below, the snippets are there.
    const onBlank = await client.connection.sendRequest<CompletionItem[]>('textDocument/completion', { textDocument: { uri }, position: { line: 2, character: 0 } });
    expect(onBlank.map((c) => c.label)).toContain('@ HH:MM  label');
  });
});

describe('hover on the unit of a shorthand gas', () => {
  it('names both pressures the unit applies to', async () => {
    const { uri } = await opened('editor-pass-hover.pneu', '@ 08:00\nabg       7.30/6.4/9.3/23 kPa\n');
    const hover = await client.connection.sendRequest<Hover | null>('textDocument/hover', { textDocument: { uri }, position: { line: 1, character: 27 } });
    const value = (hover?.contents as { value: string }).value;
    expect(value).toContain('for both its pressures');
    expect(value).toContain('- PaCO2: **6.4 kPa** = 48 mmHg');
    expect(value).toContain('- PaO2: **9.3 kPa** = 70 mmHg');
  });
});

describe('the outline', () => {
  it('sends section lines without an empty `children`, under their timepoint', async () => {
    const { uri } = await opened('editor-pass-outline.pneu', '@ 08:00  round\nvitals    hr 80\nabg       7.40/40/90/24\n');
    const symbols = await client.connection.sendRequest<DocumentSymbol[]>('textDocument/documentSymbol', { textDocument: { uri } });
    expect(symbols.map((s) => [s.name, s.children?.map((c) => c.name)])).toEqual([['round', ['vitals', 'abg']]]);
    expect(symbols[0]!.children!.every((c) => !('children' in c))).toBe(true);
  });
});

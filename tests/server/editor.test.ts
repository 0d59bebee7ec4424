// Protocol-level tests of editor features: formatting (size limit, ranges), folding regions,
// settings (pushed, key by key), completion inside a word, the diagnostics a quick fix claims,
// the size limit in bytes, unit conversion of an empty note, and pneumark.config.json errors.
import { mkdtempSync, unlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { describe, expect, it } from 'vitest';
import { DiagnosticSeverity, type CodeAction, type CompletionItem, type Diagnostic, type FoldingRange, type InlayHint, type InsertReplaceEdit, type TextEdit } from 'vscode-languageserver-protocol';
import { applyEdits } from '../../server/src/core/service/text-edits';
import { serverForTests, startClient } from './lsp-client';

const client = serverForTests();

const codes = (diagnostics: readonly Diagnostic[]) => diagnostics.map((d) => String(d.code));
const path = (name: string) => join(process.cwd(), name);
const formatting = { tabSize: 2, insertSpaces: true };

describe('formatting', () => {
  it('formats nothing in a note over the size limit, like its analysis', async () => {
    const huge = 'vitals hr 80, rr 16, spo2 97 %\n'.repeat(680000);
    const uri = client.open(path('huge-format.pneu'), huge);
    const p = await client.diagnostics(uri, undefined, 30000);
    expect(p.diagnostics[0]?.message).toMatch(/does not analyse notes over/);
    const whole = await client.connection.sendRequest<TextEdit[]>('textDocument/formatting', { textDocument: { uri }, options: formatting });
    expect(whole).toEqual([]);
    const range = await client.connection.sendRequest<TextEdit[]>('textDocument/rangeFormatting', { textDocument: { uri }, range: { start: { line: 10, character: 0 }, end: { line: 20, character: 0 } }, options: formatting });
    expect(range).toEqual([]);
    void client.connection.sendNotification('textDocument/didClose', { textDocument: { uri } });
  });

  it('formats the lines of a range, leaving out a line the range ends at the start of', async () => {
    const text = 'vitals hr 1\nvitals hr 2\nvitals hr 3\n';
    const uri = client.open(path('range-format.pneu'), text);
    await client.diagnostics(uri);
    const lines = async (start: { line: number; character: number }, end: { line: number; character: number }) =>
      (await client.connection.sendRequest<TextEdit[]>('textDocument/rangeFormatting', { textDocument: { uri }, range: { start, end }, options: formatting })).map((e) => e.range.start.line);
    expect(await lines({ line: 1, character: 0 }, { line: 2, character: 0 })).toEqual([1]);
    expect(await lines({ line: 0, character: 0 }, { line: 2, character: 0 })).toEqual([0, 1]);
    expect(await lines({ line: 1, character: 0 }, { line: 2, character: 1 })).toEqual([1, 2]);
    expect(await lines({ line: 2, character: 4 }, { line: 2, character: 4 })).toEqual([2]);
  });
});

describe('folding', () => {
  it('folds `# region` … `# endregion` pairs as regions, beside the timepoints', async () => {
    const text = '# region header\npatient   age 58 y\n# endregion\n@ 08:00\nvitals    hr 80\n# endregion stray\n';
    const uri = client.open(path('regions.pneu'), text);
    await client.diagnostics(uri);
    const folds = await client.connection.sendRequest<FoldingRange[]>('textDocument/foldingRange', { textDocument: { uri } });
    expect(folds).toEqual([{ startLine: 0, endLine: 2, kind: 'region' }, { startLine: 3, endLine: 5 }]);
  });
});

describe('settings', () => {
  it('applies the valid settings when one is invalid', async () => {
    client.settings = { gasUnit: 'kPa', disabledChecks: ['PN306'], debounceMs: 10000 };
    const uri = client.open(path('one-bad-setting.pneu'), '@ 08:00\nvitals spo2 104\nabg pco2 5.3, po2 12\n');
    const p = await client.diagnostics(uri);
    expect(codes(p.diagnostics)).toEqual([]);
    client.settings = {};
  });

  it('uses settings pushed with didChangeConfiguration by a client that cannot be asked for them', async () => {
    const pushing = await startClient({}, { pullConfiguration: false });
    try {
      const uri = pushing.open(path('pushed.pneu'), '@ 08:00\nvitals spo2 104\nabg pco2 5.3, po2 12\n');
      const first = await pushing.diagnostics(uri);
      expect(codes(first.diagnostics)).toContain('PN306');
      const count = pushing.published.length;
      await pushing.connection.sendNotification('workspace/didChangeConfiguration', { settings: { pneumark: { gasUnit: 'kPa', disabledChecks: ['PN306'] } } });
      const after = await pushing.diagnostics(uri, (p) => pushing.published.indexOf(p) >= count);
      expect(codes(after.diagnostics)).toEqual([]);
      // A note opened later takes them too.
      const later = pushing.open(path('pushed-later.pneu'), '@ 08:00\nvitals spo2 104\n');
      expect(codes((await pushing.diagnostics(later)).diagnostics)).toEqual([]);
    } finally {
      await pushing.close();
    }
  });
});

describe('completion inside a word', () => {
  const text = '@ 08:00\nvitals    hr 80, sp2 90\n';
  const position = { line: 1, character: 18 };

  it('replaces the whole word for a client without insert-and-replace edits', async () => {
    const uri = client.open(path('mid-word.pneu'), text);
    await client.diagnostics(uri);
    const items = await client.connection.sendRequest<CompletionItem[]>('textDocument/completion', { textDocument: { uri }, position });
    const spo2 = items.find((c) => c.label === 'spo2');
    expect(spo2?.textEdit).toEqual({ range: { start: { line: 1, character: 17 }, end: { line: 1, character: 20 } }, newText: 'spo2' });
    expect(applyEdits(text, [spo2!.textEdit as TextEdit])).toBe('@ 08:00\nvitals    hr 80, spo2 90\n');
  });

  it('gives both ranges to a client that supports insert-and-replace edits', async () => {
    const other = await startClient({}, { completion: { completionItem: { insertReplaceSupport: true, snippetSupport: true } } });
    try {
      const uri = other.open(path('mid-word-insert-replace.pneu'), text);
      await other.diagnostics(uri);
      const items = await other.connection.sendRequest<CompletionItem[]>('textDocument/completion', { textDocument: { uri }, position });
      const edit = items.find((c) => c.label === 'spo2')?.textEdit as InsertReplaceEdit | undefined;
      expect(edit).toEqual({
        newText: 'spo2',
        insert: { start: { line: 1, character: 17 }, end: { line: 1, character: 18 } },
        replace: { start: { line: 1, character: 17 }, end: { line: 1, character: 20 } },
      });
      // At the end of a word both ranges are the same: a plain edit.
      const atEnd = await other.connection.sendRequest<CompletionItem[]>('textDocument/completion', { textDocument: { uri }, position: { line: 1, character: 20 } });
      expect(atEnd.every((c) => c.textEdit === undefined || 'range' in c.textEdit)).toBe(true);
    } finally {
      await other.close();
    }
  });
});

describe('quick fixes', () => {
  it('claim only the diagnostic they fix, not every one of the same code', async () => {
    const uri = client.open(path('two-commas.pneu'), '@ 08:00\nabg ph 7,35, pco2 41\nvbg ph 7,31\n');
    const p = await client.diagnostics(uri);
    const commas = p.diagnostics.filter((d) => d.code === 'PN103');
    expect(commas).toHaveLength(2);
    const actions = await client.connection.sendRequest<CodeAction[]>('textDocument/codeAction', { textDocument: { uri }, range: { start: { line: 1, character: 0 }, end: { line: 2, character: 11 } }, context: { diagnostics: commas } });
    const first = actions.find((a) => a.title === 'Write `7.35`');
    expect(first?.diagnostics).toEqual([commas[0]]);
    const second = actions.find((a) => a.title === 'Write `7.31`');
    expect(second?.diagnostics).toEqual([commas[1]]);
    const all = actions.find((a) => a.kind === 'quickfix' && /^Fix all/.test(a.title));
    expect(all?.diagnostics).toEqual(commas);
  });
});

describe('the size limit', () => {
  it('publishes at most 10,000 diagnostics, errors first, and says how many were left out', async () => {
    // One line of 10,050 heart rates: 10,049 warnings for a key given again (PN206); then an
    // impossible SpO2 at the end (an error), which must not be the one left out.
    const text = `@ 08:00\nvitals ${'hr 80 '.repeat(10_050)}\nvitals spo2 140\n`;
    const uri = client.open(path('many-findings.pneu'), text);
    const p = await client.diagnostics(uri, undefined, 60_000);
    expect(p.diagnostics).toHaveLength(10_001);
    const notice = p.diagnostics.find((d) => d.code === 'too-many-findings');
    expect(notice?.severity).toBe(DiagnosticSeverity.Information);
    expect(notice?.message).toMatch(/shows 10,000 of this note's 10,05\d findings, the most severe first/);
    const errors = p.diagnostics.filter((d) => d.severity === DiagnosticSeverity.Error);
    expect(errors.map((d) => [d.code, d.range.start.line])).toEqual([['PN306', 2]]);
    // The rest in note order.
    const shown = p.diagnostics.filter((d) => d !== notice).map((d) => d.range.start.line * 1e6 + d.range.start.character);
    expect(shown).toEqual([...shown].sort((a, b) => a - b));
  }, 60_000);

  it('counts a note in UTF-8 bytes', async () => {
    const sized = await startClient({ maxNoteSizeKb: 16 });
    try {
      // 10,000 UTF-16 code units, but 18,000 bytes: over 16 KB.
      const text = `@ 08:00\n${`note      ${'é'.repeat(80)}\n`.repeat(100)}`;
      expect(text.length).toBeLessThan(16 * 1024);
      expect(Buffer.byteLength(text)).toBeGreaterThan(16 * 1024);
      const uri = sized.open(path('non-ascii-over-limit.pneu'), text);
      const p = await sized.diagnostics(uri);
      expect(p.diagnostics.map((d) => d.code)).toEqual(['too-large']);
    } finally {
      await sized.close();
    }
  });

  it('tells the trend view why a note too large to analyse has no points, rather than giving it none as for a note without timepoints', async () => {
    const sized = await startClient({ maxNoteSizeKb: 16 });
    try {
      const text = '@ day 1 08:00\nabg ph 7.30, pco2 50, po2 60\n\n'.repeat(500);
      const uri = sized.open(path('trends-over-limit.pneu'), text);
      await sized.diagnostics(uri);
      const trends = await sized.connection.sendRequest<{ points: unknown[]; notAnalysed?: string }>('pneumark/trends', { uri });
      expect(trends.points).toEqual([]);
      expect(trends.notAnalysed).toMatch(/^Pneumark does not analyse notes over 16 KB \(this one is 21 KB\)/);
    } finally {
      await sized.close();
    }
  });
});

describe('unit conversion', () => {
  it('starts an empty note with its units line', async () => {
    const uri = client.open(path('empty-convert.pneu'), '');
    await client.diagnostics(uri);
    const edits = await client.connection.sendRequest<TextEdit[]>('pneumark/convertUnits', { uri, to: 'kPa' });
    expect(applyEdits('', edits)).toBe('units     gas kPa\n');
  });
});

describe('pneumark.config.json', () => {
  it('puts the diagnostic of invalid JSON where the JSON stops being valid', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'pneumark-config-json-'));
    writeFileSync(join(dir, 'pneumark.config.json'), '{\n  "gasUnit": kPa\n}\n');
    const configUri = pathToFileURL(join(dir, 'pneumark.config.json')).toString();
    client.open(join(dir, 'note.pneu'), '@ 08:00\nabg pco2 40\n');
    const p = await client.diagnostics(configUri);
    expect(p.diagnostics[0]?.message).toMatch(/not valid JSON \(`kPa` is not a value: text must be in double quotes/);
    expect(p.diagnostics[0]?.range).toEqual({ start: { line: 1, character: 13 }, end: { line: 1, character: 16 } });
  });

  it('clears the problems of a file that is deleted', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'pneumark-config-deleted-'));
    const file = join(dir, 'pneumark.config.json');
    writeFileSync(file, '{ "gasUnit": "kpaa" }\n');
    const configUri = pathToFileURL(file).toString();
    const noteUri = client.open(join(dir, 'note.pneu'), '@ 08:00\nabg pco2 40\n');
    expect((await client.diagnostics(configUri)).diagnostics).toHaveLength(1);
    await client.diagnostics(noteUri);
    // Requests about the note do not send the file's problems again.
    const sent = client.published.filter((p) => p.uri === configUri).length;
    await client.connection.sendRequest('textDocument/hover', { textDocument: { uri: noteUri }, position: { line: 1, character: 5 } });
    await client.connection.sendRequest('textDocument/inlayHint', { textDocument: { uri: noteUri }, range: { start: { line: 0, character: 0 }, end: { line: 2, character: 0 } } });
    expect(client.published.filter((p) => p.uri === configUri)).toHaveLength(sent);
    unlinkSync(file);
    const count = client.published.length;
    await client.connection.sendNotification('workspace/didChangeWatchedFiles', { changes: [{ uri: configUri, type: 3 }] });
    const cleared = await client.diagnostics(configUri, (p) => client.published.indexOf(p) >= count);
    expect(cleared.diagnostics).toEqual([]);
    // The note is analysed again, with the editor's settings.
    await client.diagnostics(noteUri, (p) => client.published.indexOf(p) >= count);
  });
});

describe('inlay hints after a change of settings', () => {
  it('asks the editor to show them again, and they follow the new settings', async () => {
    const refreshing = await startClient({}, { refreshHints: true });
    try {
      const text = '@ 08:00\nabg       7.40/40/90/24, fio2 0.4\n';
      const uri = refreshing.open(path('hints-refresh.pneu'), text);
      await refreshing.diagnostics(uri);
      const hints = async () => (await refreshing.connection.sendRequest<InlayHint[]>('textDocument/inlayHint', { textDocument: { uri }, range: { start: { line: 0, character: 0 }, end: { line: 2, character: 0 } } })).map((h) => h.label);
      expect((await hints()).join(' ')).toMatch(/^P\/F 225/);
      const before = refreshing.hintRefreshes();
      refreshing.settings = { hints: { oxygenation: false } };
      await refreshing.connection.sendNotification('workspace/didChangeConfiguration', { settings: null });
      await refreshing.hintRefresh(before);
      expect((await hints()).join(' ')).not.toMatch(/P\/F/);
      const again = refreshing.hintRefreshes();
      refreshing.settings = {};
      await refreshing.connection.sendNotification('workspace/didChangeConfiguration', { settings: null });
      await refreshing.hintRefresh(again);
      expect((await hints()).join(' ')).toMatch(/^P\/F 225/);
    } finally {
      await refreshing.close();
    }
  });
});

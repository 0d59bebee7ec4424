// Protocol-level tests: the bundled server over a real stdio JSON-RPC connection.
import { spawn } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { beforeAll, describe, expect, it } from 'vitest';
import type { CodeAction, CompletionItem, Diagnostic, DocumentSymbol, FoldingRange, Hover, InlayHint, TextEdit } from 'vscode-languageserver-protocol';
import { checkNote } from '../../server/src/core/check-note';
import { applyEdits } from '../../server/src/core/service/text-edits';
import { generateNote } from '../bench/generate.mjs';
import { serverForTests, startClient } from './lsp-client';

const icuPath = join(process.cwd(), 'samples/icu-ventilated-lung-injury.pneu');
const icu = readFileSync(icuPath, 'utf8');

const client = serverForTests();

function codes(diagnostics: readonly Diagnostic[]): string[] {
  return diagnostics.map((d) => String(d.code));
}

describe('lifecycle and diagnostics', () => {
  it('initializes with the features it serves', () => {
    const caps = client.initialize.capabilities;
    expect(caps.hoverProvider).toBe(true);
    expect(caps.inlayHintProvider).toBeTruthy();
    expect(caps.documentFormattingProvider).toBe(true);
    expect(caps.completionProvider?.triggerCharacters).toContain('@');
  });

  it('publishes diagnostics with stable codes and links to their documentation', async () => {
    const uri = client.open(icuPath, icu);
    const p = await client.diagnostics(uri);
    expect(p.version).toBe(1);
    const dp = p.diagnostics.find((d) => d.code === 'PN405');
    expect(dp?.range.start.line).toBe(6);
    expect(dp?.severity).toBe(2);
    expect(dp?.source).toBe('pneumark');
    expect(dp?.codeDescription?.href).toMatch(/^file:\/\/.*\/docs\/checks\.md#pn405-driving-pressure-high$/);
    expect(codes(p.diagnostics)).toContain('PN410');
  });

  it('answers an edit with diagnostics for the new version, and only the newest of quick edits', async () => {
    const uri = client.open(join(process.cwd(), 'edit-me.pneu'), '@ 08:00\nvitals hr 80\n');
    await client.diagnostics(uri, (p) => p.version === 1);
    client.change(uri, '@ 08:00\nvitals hr 80, spo2 104\n', 2);
    client.change(uri, '@ 08:00\nvitals hr 80, spo2 105\n', 3);
    client.change(uri, '@ 08:00\nvitals hr 80, spo2 106\n', 4);
    const p = await client.diagnostics(uri, (d) => d.version === 4);
    expect(p.diagnostics[0]?.message).toMatch(/SpO2 106/);
    expect(client.published.filter((d) => d.uri === uri).map((d) => d.version)).toEqual([1, 4]);
  });

  it('sweeps the fixture notes: every expected code on its line, nothing else above information', async () => {
    for (const name of ['tests/fixtures/boundaries.pneu', 'samples/broken-note.pneu']) {
      const text = readFileSync(name, 'utf8');
      const uri = client.open(join(process.cwd(), name), text);
      const p = await client.diagnostics(uri);
      const byLine = new Map<number, string[]>();
      for (const d of p.diagnostics) if ((d.severity ?? 1) <= 2) byLine.set(d.range.start.line, [...(byLine.get(d.range.start.line) ?? []), String(d.code)].sort());
      const expected = new Map<number, string[]>();
      text.split('\n').forEach((l, i) => {
        const m = /# expect: ((?:PN\d{3}\s*)+)$/.exec(l);
        if (m?.[1]) expected.set(i, m[1].trim().split(/\s+/).sort());
      });
      expect(Object.fromEntries(byLine), name).toEqual(Object.fromEntries(expected));
    }
  });
});

describe('language features', () => {
  let uri: string;
  beforeAll(async () => {
    uri = client.open(join(process.cwd(), 'features.pneu'), icu);
    await client.diagnostics(uri);
  });

  it('hovers a key with the field, both unit systems and a caution', async () => {
    const line = icu.split('\n').findIndex((l) => l.startsWith('abg       ph 7.29'));
    const hover = await client.connection.sendRequest<Hover | null>('textDocument/hover', { textDocument: { uri }, position: { line, character: 22 } });
    const value = typeof hover?.contents === 'object' && 'value' in hover.contents ? hover.contents.value : '';
    expect(value).toMatch(/PaCO2/);
    expect(value).toMatch(/kPa/);
    expect(value).toMatch(/defer to local protocols and licensed practice/);
  });

  it('shows inlay hints with derived values for the visible range', async () => {
    const hints = await client.connection.sendRequest<InlayHint[]>('textDocument/inlayHint', { textDocument: { uri }, range: { start: { line: 0, character: 0 }, end: { line: 30, character: 0 } } });
    const labels = hints.map((h) => (typeof h.label === 'string' ? h.label : h.label.map((p) => p.value).join('')));
    expect(labels.some((l) => /P\/F 93/.test(l))).toBe(true);
    expect(labels.some((l) => /ΔP 19/.test(l))).toBe(true);
    // The client declares it resolves tooltips: hints come without them, and resolve gives them.
    expect(client.initialize.capabilities.inlayHintProvider).toEqual({ resolveProvider: true });
    expect(hints.every((h) => h.tooltip === undefined)).toBe(true);
    const resolved = await client.connection.sendRequest<InlayHint>('inlayHint/resolve', hints[0]);
    const tooltip = resolved.tooltip;
    expect(typeof tooltip === 'object' ? tooltip.value : tooltip).toMatch(/defer to local protocols/);
    expect(resolved.label).toEqual(hints[0]?.label);
  });

  it('answers inlay hint tooltips only for the version of the note the hint came from', async () => {
    const path = join(process.cwd(), 'resolve-version.pneu');
    const text = '@ 08:00\noxygen mask, fio2 0.4\nabg 7.28/56/71/26\n';
    const doc = client.open(path, text, 1);
    await client.diagnostics(doc);
    const hints = await client.connection.sendRequest<InlayHint[]>('textDocument/inlayHint', { textDocument: { uri: doc }, range: { start: { line: 0, character: 0 }, end: { line: 5, character: 0 } } });
    expect(hints.length).toBeGreaterThan(0);
    client.change(doc, `${text}note later\n`, 2);
    await client.diagnostics(doc, (p) => p.version === 2);
    const stale = await client.connection.sendRequest<InlayHint>('inlayHint/resolve', hints[0]);
    expect(stale.tooltip).toBeUndefined();
    const odd = await client.connection.sendRequest<InlayHint>('inlayHint/resolve', { position: { line: 0, character: 0 }, label: 'x', data: { nonsense: true } });
    expect(odd.label).toBe('x');
  });

  it('shows gas pressures in kPa first in a kPa note: summary, hints and their tooltips', async () => {
    // samples/home-oxygen-exacerbation.pneu says `units gas kPa`; at 14:50 PaO2 7.9 kPa on FiO2
    // 0.28: P/F 7.9 ÷ 0.28 = 28.2 kPa = 212 mmHg (1 kPa = 7.50062 mmHg, the units' definition,
    // cross-checked with @lhncbc/ucum-lhc in tests/service/kpa-notes.test.ts).
    const path = join(process.cwd(), 'samples/home-oxygen-exacerbation.pneu');
    const text = readFileSync(path, 'utf8');
    const doc = client.open(path, text);
    await client.diagnostics(doc);
    const gasLine = text.split('\n').findIndex((l) => l.startsWith('abg       ph 7.28'));
    const summary = await client.connection.sendRequest<{ text: string }>('pneumark/timepointSummary', { uri: doc, line: gasLine });
    expect(summary.text).toBe('P/F 28.2 kPa (212) · pH 7.28 · PaCO2 9.1 kPa · PaO2 7.9 kPa · SpO2 90 %');
    const hints = await client.connection.sendRequest<InlayHint[]>('textDocument/inlayHint', { textDocument: { uri: doc }, range: { start: { line: gasLine, character: 0 }, end: { line: gasLine, character: 0 } } });
    const pf = hints.find((h) => String(h.label).startsWith('P/F'));
    expect(pf?.label).toBe('P/F 28.2 kPa (212) · A–a 7.3 kPa (55), ≤ 2.9');
    const resolved = await client.connection.sendRequest<InlayHint>('inlayHint/resolve', pf);
    const tooltip = typeof resolved.tooltip === 'object' ? resolved.tooltip.value : resolved.tooltip;
    expect(tooltip).toContain('With the numbers: `7.9 ÷ 0.28 = 28.2 kPa (212 mmHg)`');
    // The trend view's data: the same gases in kPa, each value with its unit.
    const trends = await client.connection.sendRequest<{ points: { values: Record<string, { value: number; unit: string }> }[] }>('pneumark/trends', { uri: doc });
    const titrated = trends.points[1]?.values;
    expect(titrated?.pao2).toEqual({ value: expect.closeTo(7.9, 6), unit: 'kPa' });
    expect(titrated?.pf_ratio?.unit).toBe('kPa');
    expect(titrated?.pf_ratio?.value.toFixed(1)).toBe('28.2');
    expect(titrated?.fio2).toEqual({ value: expect.closeTo(28, 6), unit: '%' });
  });

  it('completes sections at the start of a line and keys after a section', async () => {
    const text = `${icu}\nvi`;
    client.change(uri, text, 2);
    const lastLine = text.split('\n').length - 1;
    const sections = await client.connection.sendRequest<CompletionItem[]>('textDocument/completion', { textDocument: { uri }, position: { line: lastLine, character: 2 } });
    expect(sections.map((c) => c.label)).toContain('vitals');
    const withSection = `${icu}\nvent `;
    client.change(uri, withSection, 3);
    const keys = await client.connection.sendRequest<CompletionItem[]>('textDocument/completion', { textDocument: { uri }, position: { line: lastLine, character: 5 } });
    expect(keys.map((c) => c.label)).toEqual(expect.arrayContaining(['peep', 'vt', 'plateau']));
    client.change(uri, icu, 4);
    await client.diagnostics(uri, (p) => p.version === 4);
  });

  it('offers the quick fix of a finding, and a fix-all of its kind', async () => {
    const broken = client.open(join(process.cwd(), 'commas.pneu'), '@ 08:00\nabg ph 7,35, pco2 41\nvbg ph 7,31\n');
    const p = await client.diagnostics(broken);
    const comma = p.diagnostics.find((d) => d.code === 'PN103')!;
    const actions = await client.connection.sendRequest<CodeAction[]>('textDocument/codeAction', { textDocument: { uri: broken }, range: comma.range, context: { diagnostics: [comma] } });
    const fix = actions.find((a) => a.title === 'Write `7.35`');
    expect(fix?.isPreferred).toBe(true);
    expect(fix?.diagnostics?.[0]?.code).toBe('PN103');
    expect(fix?.edit?.changes?.[broken]).toEqual([{ range: comma.range, newText: '7.35' }]);
    const all = actions.find((a) => a.kind === 'source.fixAll' || /all/i.test(a.title));
    expect(all?.edit?.changes?.[broken]?.length).toBe(2);
  });

  it('applies two renames of one line that each keep its comment in its column in one source.fixAll', async () => {
    const text = '@ 08:00\nvent      plateu 24, amplitde 30     # in column 37\n';
    const uri = client.open(join(process.cwd(), 'two-renames.pneu'), text);
    const p = await client.diagnostics(uri);
    expect(codes(p.diagnostics)).toEqual(['PN201', 'PN201']);
    const at = { line: 0, character: 0 };
    const actions = await client.connection.sendRequest<CodeAction[]>('textDocument/codeAction', { textDocument: { uri }, range: { start: at, end: at }, context: { diagnostics: [], only: ['source.fixAll'] } });
    const all = actions.find((a) => a.kind === 'source.fixAll');
    expect(all?.title).toBe('Apply every safe fix in the note (2)');
    expect(applyEdits(text, all!.edit!.changes![uri]!)).toBe('@ 08:00\nvent      plateau 24, amplitude 30   # in column 37\n');
  });

  it('offers a misspelt oxygen device of two words as one quick fix over both words', async () => {
    const text = '@ 08:00\noxygen room aor\n';
    const uri = client.open(join(process.cwd(), 'device-words.pneu'), text);
    const p = await client.diagnostics(uri);
    const unknown = p.diagnostics.filter((d) => d.code === 'PN201');
    expect(unknown.map((d) => d.range)).toEqual([{ start: { line: 1, character: 7 }, end: { line: 1, character: 15 } }]);
    // Asked at the second word, where the cursor is after typing it.
    const at = { line: 1, character: 13 };
    const actions = await client.connection.sendRequest<CodeAction[]>('textDocument/codeAction', { textDocument: { uri }, range: { start: at, end: at }, context: { diagnostics: unknown } });
    const fix = actions.find((a) => a.title === 'Change to `room air`');
    expect(fix?.isPreferred).toBe(true);
    expect(fix?.edit?.changes?.[uri]).toEqual([{ range: unknown[0]!.range, newText: 'room air' }]);
    expect(applyEdits(text, fix!.edit!.changes![uri]!)).toBe('@ 08:00\noxygen room air\n');
  });

  it('gives timepoints as the outline, folding ranges, and formatting edits', async () => {
    const symbols = await client.connection.sendRequest<DocumentSymbol[]>('textDocument/documentSymbol', { textDocument: { uri } });
    expect(symbols.map((s) => s.name)).toEqual(expect.arrayContaining(['admitted to intensive care, intubated', 'weaning trial']));
    const folds = await client.connection.sendRequest<FoldingRange[]>('textDocument/foldingRange', { textDocument: { uri } });
    expect(folds.length).toBeGreaterThanOrEqual(4);
    const messyText = '@ 08:00   first\nvitals hr 80,rr 12 ,  spo2 97 %\n';
    const messy = client.open(join(process.cwd(), 'messy.pneu'), messyText);
    await client.diagnostics(messy);
    const edits = await client.connection.sendRequest<TextEdit[]>('textDocument/formatting', { textDocument: { uri: messy }, options: { tabSize: 2, insertSpaces: true } });
    expect(edits.length).toBeGreaterThan(0);
    expect(applyEdits(messyText, edits)).toBe('@ 08:00  first\nvitals    hr 80, rr 12, spo2 97 %\n');
  });

  it('answers the trend and summary requests, and unit conversion edits', async () => {
    const trends = await client.connection.sendRequest<{ points: { values: Record<string, { value: number; unit: string }> }[] }>('pneumark/trends', { uri });
    expect(trends.points.length).toBe(4);
    expect(trends.points[0]?.values.pf_ratio?.value).toBeCloseTo(92.5, 1);
    expect(trends.points[0]?.values.pf_ratio?.unit).toBe('mmHg');
    const summary = await client.connection.sendRequest<{ text: string }>('pneumark/timepointSummary', { uri, line: 8 });
    expect(summary.text).toMatch(/P\/F 93/);
    const edits = await client.connection.sendRequest<TextEdit[]>('pneumark/convertUnits', { uri, to: 'kPa' });
    expect(edits.length).toBeGreaterThan(4);
  });
});

describe('messages that quote the note', () => {
  it('show an invisible character in what they quote as an escape, as the command line does', async () => {
    const uri = client.open(join(process.cwd(), 'joiner.pneu'), '@ 08:00\nvitals h\u200dr 80, spo2 94\nnote seen by the team 👩\u200d⚕️\n');
    const p = await client.diagnostics(uri);
    const messages = p.diagnostics.map((d) => d.message);
    expect(messages).toContain('`h\\u{200D}r` is not a key of vitals lines. Did you mean `hr`?');
    expect(messages.join('\n')).not.toContain('\u200d');
  });
});

describe('settings', () => {
  it('follows workspace configuration: hint categories and conventions', async () => {
    const uri = client.open(join(process.cwd(), 'settings.pneu'), '@ 08:00\nvent vt 420, peep 8, plateau 27, fio2 0.5\nabg 7.40/40/90/24.4\n');
    await client.diagnostics(uri);
    const before = await client.connection.sendRequest<InlayHint[]>('textDocument/inlayHint', { textDocument: { uri }, range: { start: { line: 0, character: 0 }, end: { line: 5, character: 0 } } });
    expect(before.some((h) => String(h.label).includes('ΔP'))).toBe(true);
    client.settings = { hints: { mechanics: false }, hypoxaemiaBelowMmhg: 95 };
    const count = client.published.length;
    await client.connection.sendNotification('workspace/didChangeConfiguration', { settings: null });
    await client.diagnostics(uri, (p) => client.published.indexOf(p) >= count);
    const after = await client.connection.sendRequest<InlayHint[]>('textDocument/inlayHint', { textDocument: { uri }, range: { start: { line: 0, character: 0 }, end: { line: 5, character: 0 } } });
    expect(after.some((h) => String(h.label).includes('ΔP'))).toBe(false);
    const p = client.published.filter((d) => d.uri === uri).at(-1)!;
    expect(p.diagnostics.some((d) => /hypoxaemia/.test(String(d.message)))).toBe(true);
    client.settings = {};
  });

  it('asks to hear of changes to Pneumark\'s own settings only (section pneumark)', async () => {
    await expect.poll(() => client.registrations.find((r) => r.method === 'workspace/didChangeConfiguration'), { timeout: 5000 }).toEqual({ id: expect.any(String) as unknown, method: 'workspace/didChangeConfiguration', registerOptions: { section: 'pneumark' } });
  });

  it('ignores settings of the wrong shape and keeps going with defaults', async () => {
    client.settings = { gasUnit: 42, hints: 'all', debounceMs: -1 };
    await client.connection.sendNotification('workspace/didChangeConfiguration', { settings: null });
    const uri = client.open(join(process.cwd(), 'wrong-shape.pneu'), '@ 08:00\nvitals spo2 104\n');
    const p = await client.diagnostics(uri);
    expect(codes(p.diagnostics)).toEqual(['PN306']);
    client.settings = {};
  });

  it('reads pneumark.config.json upward from the note, and reports an invalid one on the file itself', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'pneumark-config-'));
    writeFileSync(join(dir, 'pneumark.config.json'), JSON.stringify({ gasUnit: 'kPa' }));
    const uri = client.open(join(dir, 'note.pneu'), '@ 08:00\nabg pco2 5.3, po2 12\n');
    const p = await client.diagnostics(uri);
    expect(codes(p.diagnostics).filter((c) => c.startsWith('PN2'))).toEqual([]);
    const bad = mkdtempSync(join(tmpdir(), 'pneumark-config-'));
    writeFileSync(join(bad, 'pneumark.config.json'), '{ "gasUnit": "bar", "__proto__": { "polluted": true } }');
    const configUri = pathToFileURL(join(bad, 'pneumark.config.json')).toString();
    client.open(join(bad, 'note.pneu'), '@ 08:00\nabg pco2 40\n');
    const configDiagnostics = await client.diagnostics(configUri);
    expect(configDiagnostics.diagnostics[0]?.message).toMatch(/gasUnit/);
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
  });

  it('names a check in disabledChecks that does not exist on the config file, and still applies the file', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'pneumark-config-'));
    writeFileSync(join(dir, 'pneumark.config.json'), '{\n  "gasUnit": "kPa",\n  "disabledChecks": ["PN 101", "decimal-comma"]\n}\n');
    const configUri = pathToFileURL(join(dir, 'pneumark.config.json')).toString();
    const uri = client.open(join(dir, 'note.pneu'), '@ 08:00\nabg ph 7,35, pco2 5.3, po2 12\n');
    const p = await client.diagnostics(uri);
    expect(codes(p.diagnostics)).not.toContain('PN103');
    expect(codes(p.diagnostics).filter((c) => c.startsWith('PN2'))).toEqual([]);
    const config = await client.diagnostics(configUri);
    expect(config.diagnostics.map((d) => [d.message, d.range.start])).toEqual([
      ['pneumark.config.json: `disabledChecks`: "PN 101" is not the code or alias of a check (see docs/checks.md), so it switches nothing off. Did you mean PN101 (unknown-section)?', { line: 2, character: 21 }],
    ]);
  });
});

describe('robustness', () => {
  it('answers requests for unknown documents and positions past the end without failing', async () => {
    const unknown = 'file:///nowhere/never-opened.pneu';
    expect(await client.connection.sendRequest('textDocument/hover', { textDocument: { uri: unknown }, position: { line: 0, character: 0 } })).toBeNull();
    expect(await client.connection.sendRequest('textDocument/completion', { textDocument: { uri: unknown }, position: { line: 0, character: 0 } })).toEqual([]);
    const uri = client.open(join(process.cwd(), 'short.pneu'), 'vitals hr 80');
    await client.diagnostics(uri);
    expect(await client.connection.sendRequest('textDocument/hover', { textDocument: { uri }, position: { line: 999, character: 999 } })).toBeNull();
    expect(await client.connection.sendRequest('textDocument/hover', { textDocument: { uri }, position: { line: 0, character: 9999 } })).toBeNull();
    const hints = await client.connection.sendRequest('textDocument/inlayHint', { textDocument: { uri }, range: { start: { line: 50, character: 0 }, end: { line: 90, character: 0 } } });
    expect(hints).toEqual([]);
  });

  // A big note is read in steps: requests about other notes are answered while it is analysed,
  // and requests about the note itself wait until it is read. Read in one go, the big note
  // would hold every request up until its diagnostics were sent. Either when its analysis has
  // begun, or with a request about it before (an editor asks for hints as soon as it opens a note).
  for (const when of ['once its analysis has begun', 'with a request about it before its analysis begins'] as const) {
    it(`reads a big note in steps, ${when}`, async () => {
      const small = client.open(join(process.cwd(), 'beside-big.pneu'), '@ 08:00\nvitals hr 80\n');
      await client.diagnostics(small);
      const big = join(process.cwd(), `big-first-open-${when.length}.pneu`);
      const bigUri = pathToFileURL(big).toString();
      const configured = client.configured(bigUri);
      client.open(big, generateNote(5000)); // about 25,000 lines
      if (when === 'once its analysis has begun') await configured;
      let bigDone = false;
      let answeredMeanwhile = 0;
      const diagnosed = client.diagnostics(bigUri, undefined, 60000).then((p) => { bigDone = true; return p; });
      const hints = client.connection.sendRequest<InlayHint[]>('textDocument/inlayHint', { textDocument: { uri: bigUri }, range: { start: { line: 100, character: 0 }, end: { line: 160, character: 0 } } })
        .then((h) => ({ h, afterDiagnostics: bigDone }));
      // Hovers on the small note, one after another, until the big note's diagnostics arrive.
      while (!bigDone) {
        const hover = await Promise.race([
          client.connection.sendRequest<Hover | null>('textDocument/hover', { textDocument: { uri: small }, position: { line: 1, character: 8 } }),
          diagnosed.then(() => 'done' as const),
        ]);
        if (hover === 'done' || bigDone) break;
        expect(hover?.contents).toBeTruthy();
        answeredMeanwhile++;
      }
      expect(answeredMeanwhile).toBeGreaterThanOrEqual(3);
      const p = await diagnosed;
      expect(p.version).toBe(1);
      expect(p.diagnostics.length).toBeGreaterThan(1000);
      const answered = await hints;
      expect(answered.afterDiagnostics).toBe(true);
      expect(answered.h.length).toBeGreaterThan(0);
      // The server says how it went: in steps, none of them the whole analysis.
      const report = await client.analysedOf(bigUri);
      expect(report.steps).toBeGreaterThan(5);
      expect(report.longestStepMillis).toBeLessThan(report.millis);
    });
  }

  it('drops the steps left when a big note changes while it is read, and answers the newest version only', async () => {
    const path = join(process.cwd(), 'big-changed-while-read.pneu');
    const uri = pathToFileURL(path).toString();
    // Big enough that the change always lands while the note is still being read, however fast the machine.
    const first = generateNote(10000);
    const configured = client.configured(uri);
    client.open(path, first);
    await configured;
    const lines = first.split('\n');
    lines[lines.length - 4] = 'abg       7.21/66/58/26';
    const second = lines.join('\n');
    client.change(uri, second, 2);
    const p = await client.diagnostics(uri, (d) => d.version === 2, 60000);
    expect(client.published.filter((d) => d.uri === uri).map((d) => d.version)).toEqual([2]);
    const expected = checkNote(second).findings;
    expect(p.diagnostics.map((d) => [d.code, d.range.start.line])).toEqual(expected.map((f) => [f.code, f.range.start.line]));
  });

  it('stops reading a big note that is closed while it is read, and keeps serving', async () => {
    const path = join(process.cwd(), 'big-closed-while-read.pneu');
    const uri = pathToFileURL(path).toString();
    const configured = client.configured(uri);
    client.open(path, generateNote(10000)); // big enough to be still read when the close arrives
    await configured;
    void client.connection.sendNotification('textDocument/didClose', { textDocument: { uri } });
    const cleared = await client.diagnostics(uri, (d) => d.diagnostics.length === 0);
    expect(cleared.diagnostics).toEqual([]);
    const small = client.open(join(process.cwd(), 'after-closed-big.pneu'), '@ 08:00\nvitals spo2 104\n');
    expect(codes((await client.diagnostics(small)).diagnostics)).toEqual(['PN306']);
    // Nothing for the closed note comes after it was cleared.
    expect(client.published.filter((d) => d.uri === uri && d.diagnostics.length > 0)).toEqual([]);
  });

  it('degrades gracefully on a 20 MB note, and keeps serving others', async () => {
    const huge = `${'vitals hr 80, rr 16, spo2 97 %\n'.repeat(680000)}`;
    expect(huge.length).toBeGreaterThan(20_000_000);
    const uri = client.open(join(process.cwd(), 'huge.pneu'), huge);
    const p = await client.diagnostics(uri, undefined, 30000);
    expect(p.diagnostics).toHaveLength(1);
    expect(p.diagnostics[0]?.message).toMatch(/does not analyse notes over/);
    const small = client.open(join(process.cwd(), 'after-huge.pneu'), '@ 08:00\nvitals spo2 104\n');
    expect(codes((await client.diagnostics(small)).diagnostics)).toEqual(['PN306']);
  });

  it('exits cleanly on shutdown and exit', async () => {
    const other = await startClient();
    expect(await other.close()).toBe(0);
  });

  it('ends when the client closes its end of stdio, and keeps console output off the protocol stream', async () => {
    const child = spawn(process.execPath, ['dist/server.js', '--stdio'], { stdio: 'pipe' });
    let stdout = '';
    child.stdout.on('data', (d: Buffer) => { stdout += d.toString(); });
    const exited = new Promise<number | null>((resolve) => child.once('exit', (code) => resolve(code)));
    child.stdin.end();
    // Without a shutdown request first, the status says the end was abrupt.
    expect(await exited).toBe(1);
    expect(stdout).toBe('');
  });
});

// A value or word half typed is not reported while it is typed (see core/service/typing.ts):
// over a real stdio connection, keystroke by keystroke as an editor sends them, the diagnostics
// published for each version, those shown once typing pauses, on Enter and on save.
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import type { CodeAction, Diagnostic, InlayHint, PublishDiagnosticsParams } from 'vscode-languageserver-protocol';
import { serverForTests, startClient } from './lsp-client';

const client = serverForTests();

let names = 0;

/** A note opened with `text`, typed into at its end a character at a time. */
async function opened(text: string) {
  const uri = client.open(join(process.cwd(), `typing-pause-${++names}.pneu`), text);
  let version = 1;
  let current = text;
  await client.diagnostics(uri);
  const lines = () => current.split('\n');
  return {
    uri,
    get version() { return version; },
    /** Types `keys` at the end of the note, one change per character; the diagnostics of each version. */
    async type(keys: string): Promise<Diagnostic[][]> {
      const seen: Diagnostic[][] = [];
      for (const ch of keys) {
        const all = lines();
        const at = { line: all.length - 1, character: all.at(-1)!.length };
        current += ch;
        const v = ++version;
        await client.connection.sendNotification('textDocument/didChange', { textDocument: { uri, version: v }, contentChanges: [{ range: { start: at, end: at }, text: ch }] });
        seen.push((await client.diagnostics(uri, (p) => p.version === v)).diagnostics);
      }
      return seen;
    },
    /** The second publication of the current version: what is shown once typing pauses (or on save). */
    async afterPause(timeoutMs = 5000): Promise<PublishDiagnosticsParams> {
      const v = version;
      const first = client.published.findIndex((p) => p.uri === uri && p.version === v);
      return client.diagnostics(uri, (p) => p.version === v && client.published.indexOf(p) > first, timeoutMs);
    },
    async actions(line: number, character: number): Promise<CodeAction[]> {
      const at = { line, character };
      return client.connection.sendRequest<CodeAction[]>('textDocument/codeAction', { textDocument: { uri }, range: { start: at, end: at }, context: { diagnostics: [] } });
    },
  };
}

const on = (line: number, ds: readonly Diagnostic[]) => ds.filter((d) => d.range.start.line === line).map((d) => d.code);

describe('a note typed a key at a time over the protocol', () => {
  it('shows nothing of a value or word half typed while typing goes on, and what is wrong once typing pauses', async () => {
    client.settings = {};
    const note = await opened('@ day 1 08:00\n');
    const started = performance.now();
    const seen = await note.type('vitals    hr 1');
    // `v`, `vitals    h`, `vitals    hr`, `vitals    hr 1`: a section, a key and a value half typed.
    for (const ds of seen) expect(on(1, ds)).toEqual([]);
    // Left standing, `hr 1` is shown once typing pauses (a second by default).
    const paused = await note.afterPause();
    expect(performance.now() - started).toBeGreaterThanOrEqual(1000);
    expect(on(1, paused.diagnostics)).toEqual(['PN302']);
    // Shown once, it stays shown while typing goes on (`hr 10` is as unusual), then goes.
    const more = await note.type('0');
    expect(on(1, more[0]!)).toEqual(['PN302']);
    const done = await note.type('2');
    expect(on(1, done[0]!)).toEqual([]);
  });

  it('shows a line\'s problems at once when it is left with Enter, and those of the other items on the line', async () => {
    client.settings = { typingPauseMs: 10000 };
    const note = await opened('@ day 1 08:00\n');
    const seen = await note.type('oxygen    mask, fio2 4');
    expect(on(1, seen.at(-1)!)).toEqual([]);
    const [enter] = await note.type('\n');
    expect(on(1, enter!)).toEqual(['PN307']);
    const line2 = await note.type('vitals    spo2 950, h');
    // SpO2 950 is shown as soon as the next item is begun; the key half typed is not.
    expect(on(2, line2.at(-1)!)).toEqual(['PN306']);
  });

  it('shows what was held back when the note is saved', async () => {
    client.settings = { typingPauseMs: 10000 };
    const note = await opened('@ day 1 08:00\n');
    const seen = await note.type('abg       7.32/58/61/2');
    expect(on(1, seen.at(-1)!)).toEqual([]);
    const pending = note.afterPause(3000);
    client.save(note.uri);
    expect(on(1, (await pending).diagnostics).sort()).toEqual(['PN302', 'PN402', 'PN411', 'PN412']);
  });

  it('offers no quick fix of a problem held back: no full stop to remove while `38.2` is typed', async () => {
    client.settings = { typingPauseMs: 10000 };
    const note = await opened('@ day 1 08:00\n');
    await note.type('vitals    temp 38.');
    const titles = (await note.actions(1, 18)).filter((a) => a.kind === 'quickfix').map((a) => a.title);
    expect(titles).toEqual([]);
    const pending = note.afterPause(3000);
    client.save(note.uri);
    expect(on(1, (await pending).diagnostics)).toEqual(['PN105']);
    expect((await note.actions(1, 18)).filter((a) => a.kind === 'quickfix').map((a) => a.title)).toEqual(['Remove the full stop']);
  });

  it('shows at once what is pasted: several words are no keystroke', async () => {
    client.settings = { typingPauseMs: 10000 };
    const note = await opened('@ day 1 08:00\n');
    const uri = note.uri;
    const at = { line: 1, character: 0 };
    const v = note.version + 1;
    await client.connection.sendNotification('textDocument/didChange', { textDocument: { uri, version: v }, contentChanges: [{ range: { start: at, end: at }, text: 'vitals    hr 80, spo2 9' }] });
    expect(on(1, (await client.diagnostics(uri, (p) => p.version === v)).diagnostics)).toEqual(['PN302']);
  });

  it('shows everything at once with typingPauseMs 0', async () => {
    client.settings = { typingPauseMs: 0 };
    const note = await opened('@ day 1 08:00\n');
    const seen = await note.type('vitals    spo2 9');
    expect(on(1, seen.at(-1)!)).toEqual(['PN302']);
    expect(on(1, seen[0]!)).toEqual(['PN101']);
  });
});

describe('inlay hints of the line being typed', () => {
  it('are left out until typing pauses, and the editor is asked for them again then', async () => {
    const refreshing = await startClient({}, { refreshHints: true });
    try {
      const text = 'patient   age 61 y, sex female, height 160 cm\n@ day 1 22:05\n';
      const uri = refreshing.open(join(process.cwd(), 'typing-pause-hints.pneu'), text);
      await refreshing.diagnostics(uri);
      const hints = async () => (await refreshing.connection.sendRequest<InlayHint[]>('textDocument/inlayHint', { textDocument: { uri }, range: { start: { line: 0, character: 0 }, end: { line: 3, character: 0 } } }))
        .map((h) => `${h.position.line}: ${typeof h.label === 'string' ? h.label : h.label.map((p) => p.value).join('')}`);
      let version = 1;
      let line = '';
      const type = async (keys: string) => {
        for (const ch of keys) {
          const at = { line: 2, character: line.length };
          line += ch;
          const v = ++version;
          await refreshing.connection.sendNotification('textDocument/didChange', { textDocument: { uri, version: v }, contentChanges: [{ range: { start: at, end: at }, text: ch }] });
          await refreshing.diagnostics(uri, (p) => p.version === v);
        }
      };
      const before = refreshing.hintRefreshes();
      // `vt 4`, then `vt 40`: VT 0.1 mL/kg, then 0.8 mL/kg, would follow each digit.
      await type('vent      mode VC, vt 4');
      expect(await hints()).toEqual([]);
      await type('0');
      expect(await hints()).toEqual([]);
      await type('0 mL');
      await refreshing.hintRefresh(before);
      expect(await hints()).toEqual(['2: VT 7.6 mL/kg']);
    } finally {
      await refreshing.close();
    }
  });
});

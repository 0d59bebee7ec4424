// The language server's memory on hostile notes. A note of nothing but bare `@` lines is a
// timepoint and a finding on every two bytes, and its analysis keeps about 470 bytes of heap per
// byte: 4 MB of it (the largest note `pneumark.maxNoteSizeKb` lets through) would take the server
// past 1.9 GB. The server is started here with a small heap (`--max-old-space-size`), so a server
// that read such a note to the end would die of it; it must instead stop, say why on the note,
// and go on serving the other notes. No timing is asserted.
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { startClient } from '../server/lsp-client';

const path = (name: string) => join(process.cwd(), name);
const SMALL_HEAP = { command: process.execPath, args: ['--max-old-space-size=384', 'dist/server.js'] };

describe('a hostile note in a server with a small heap', () => {
  it('is analysed until its analysis outgrows the memory the server allows, then refused with one diagnostic that says so', async () => {
    const client = await startClient({ maxNoteSizeKb: 4096 }, { server: SMALL_HEAP });
    try {
      const hostile = '@\n'.repeat(2 * 1024 * 1024 - 8);
      const uri = client.open(path('bare-timepoints.pneu'), hostile);
      const p = await client.diagnostics(uri, () => true, 120_000);
      expect(p.diagnostics.map((d) => d.code)).toEqual(['too-costly']);
      expect(p.diagnostics[0]?.message).toMatch(/^Pneumark stopped analysing this note/);
      // Requests about it answer empty instead of reading it again.
      expect(await client.connection.sendRequest('textDocument/documentSymbol', { textDocument: { uri } })).toEqual([]);
      const trends = await client.connection.sendRequest<{ points: unknown[]; notAnalysed?: string }>('pneumark/trends', { uri });
      expect(trends.points).toEqual([]);
      expect(trends.notAnalysed).toMatch(/^Pneumark stopped analysing this note/);
      // An edit that leaves it as long is refused without being read again; one that cuts it
      // down to an ordinary note is analysed.
      client.change(uri, `${hostile}@\n`, 2);
      expect((await client.diagnostics(uri, (d) => d.version === 2, 60_000)).diagnostics.map((d) => d.code)).toEqual(['too-costly']);
      client.change(uri, '@ 08:00\nvitals spo2 104\n', 3);
      expect((await client.diagnostics(uri, (d) => d.version === 3, 60_000)).diagnostics.map((d) => d.code)).toEqual(['PN306']);
      // The server is alive and serves other notes.
      const other = client.open(path('ordinary.pneu'), '@ 08:00\nvitals hr 80\n');
      expect((await client.diagnostics(other)).diagnostics).toEqual([]);
      expect(client.process.exitCode).toBeNull();
    } finally {
      await client.close();
    }
  }, 240_000);

  it('analyses a small note even when other open notes already hold more than the heap budget', async () => {
    // Eight notes of 20 MB, too large to analyse but held open: about 160 MB of text, over the
    // budget (half of the 304 MB heap limit) and under a small note's ceiling (three quarters).
    const client = await startClient({}, { server: { command: process.execPath, args: ['--max-old-space-size=256', 'dist/server.js'] } });
    try {
      for (let i = 0; i < 8; i++) {
        const big = client.open(path(`held-${i}.pneu`), '@\n'.repeat(10 * 1024 * 1024));
        expect((await client.diagnostics(big, () => true, 60_000)).diagnostics.map((d) => d.code)).toEqual(['too-large']);
      }
      // The heap is over the budget: a note over 64 K characters is refused...
      const medium = client.open(path('medium.pneu'), '@ 08:00\nvitals hr 80\n'.repeat(4_000));
      expect((await client.diagnostics(medium, () => true, 60_000)).diagnostics.map((d) => d.code)).toEqual(['too-costly']);
      // ...and a small one is analysed all the same.
      const small = client.open(path('small.pneu'), '@ 08:00\nvitals spo2 104\n');
      expect((await client.diagnostics(small, () => true, 60_000)).diagnostics.map((d) => d.code)).toEqual(['PN306']);
      expect(client.process.exitCode).toBeNull();
    } finally {
      await client.close();
    }
  }, 240_000);

  it('refuses a note with a line too long to analyse within that memory, before reading it, and reads the note once the line is cut down', async () => {
    // A finding on every two characters (`q` is no key of a vitals line): about 750 bytes of heap
    // per character of the line, all in one step of the reading (a line is never cut in two).
    const client = await startClient({}, { server: SMALL_HEAP });
    try {
      const line = `vitals ${'q '.repeat(600_000)}`;
      const uri = client.open(path('one-long-line.pneu'), `@ 08:00\n${line}\nvitals spo2 104\n`);
      const p = await client.diagnostics(uri, () => true, 60_000);
      expect(p.diagnostics.map((d) => d.code)).toEqual(['too-costly']);
      expect(p.diagnostics[0]?.message).toMatch(/^Pneumark does not analyse this note: its line 2 is 1,200,007 characters long/);
      expect(await client.connection.sendRequest('textDocument/hover', { textDocument: { uri }, position: { line: 1, character: 8 } })).toBeNull();
      client.change(uri, `@ 08:00\nvitals ${'q '.repeat(2_000)}\nvitals spo2 104\n`, 2);
      const shorter = await client.diagnostics(uri, (d) => d.version === 2, 60_000);
      expect(shorter.diagnostics.filter((d) => d.code === 'PN201')).toHaveLength(2_000);
      expect(shorter.diagnostics.map((d) => d.code)).toContain('PN306');
      expect(client.process.exitCode).toBeNull();
    } finally {
      await client.close();
    }
  }, 240_000);

  it('refuses a note over the largest size limit without offering to raise the limit', async () => {
    const client = await startClient({ maxNoteSizeKb: 4096 }, { server: SMALL_HEAP });
    try {
      const uri = client.open(path('twenty-megabytes.pneu'), '@\n'.repeat(10 * 1024 * 1024));
      const p = await client.diagnostics(uri, () => true, 60_000);
      expect(p.diagnostics.map((d) => [d.code, d.message])).toEqual([['too-large', 'Pneumark does not analyse notes over 4096 KB (this one is 20.0 MB), the most pneumark.maxNoteSizeKb allows: split it into smaller notes, or run `pneumark check` on it.']]);
    } finally {
      await client.close();
    }
  }, 120_000);
});


// A change of settings while notes are open: the server asks the editor for each note's settings
// again, and until the answer comes the note keeps the settings it had. An edit analysed in that
// window is analysed with the user's settings, never with the defaults (a check the user switched
// off, back on for one version), and a request in it does not make the note be read afresh twice.
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startClient, type LspClient } from './lsp-client';

let client: LspClient;
beforeAll(async () => {
  client = await startClient({ disabledChecks: ['PN306'], debounceMs: 0 });
});
afterAll(async () => {
  await client?.close();
});

describe('a change of settings while an edit is analysed', () => {
  it('analyses the edit with the settings in force, not the defaults', async () => {
    const uri = client.open(join(process.cwd(), 'settings-window.pneu'), '@ 08:00\nvitals spo2 104\n');
    expect((await client.diagnostics(uri)).diagnostics.map((d) => d.code)).toEqual([]);
    for (let version = 2; version <= 21; version++) {
      // The same settings as before: nothing the user sees should change.
      void client.connection.sendNotification('workspace/didChangeConfiguration', { settings: null });
      client.change(uri, `@ 08:00\nvitals spo2 ${100 + version}\n`, version);
      const p = await client.diagnostics(uri, (d) => d.version === version);
      expect({ version, codes: p.diagnostics.map((d) => d.code) }).toEqual({ version, codes: [] });
    }
  });
});

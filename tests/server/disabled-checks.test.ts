// The editor setting pneumark.disabledChecks over a real stdio connection: a name that is no
// check's code or alias (a typo such as PN220 or unusal-value) switches nothing off, so the server
// says so, once per distinct list, with the check it likely meant; valid names bring no message.
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startClient, type LspClient, type ServerMessage } from './lsp-client';

let client: LspClient;
beforeAll(async () => {
  client = await startClient({ disabledChecks: ['PN220', 'unusal-value', 'decimal-comma', 'no-such-thing'] });
});
afterAll(async () => {
  await client?.close();
});

const note = '@ 08:00\nabg ph 7,35, pco2 40, po2 90\n';
const aboutDisabledChecks = (m: ServerMessage) => m.message.includes('disabledChecks');

describe('unknown names in pneumark.disabledChecks', () => {
  it('are named in one warning, with the likely check, while the valid names still apply', async () => {
    const uri = client.open(join(process.cwd(), 'disabled-unknown.pneu'), note);
    const p = await client.diagnostics(uri);
    // decimal-comma is a real alias: PN103 is off.
    expect(p.diagnostics.map((d) => String(d.code))).not.toContain('PN103');
    const warning = await client.message(aboutDisabledChecks);
    expect(warning).toEqual({
      method: 'window/logMessage',
      type: 2,
      message: 'pneumark: pneumark.disabledChecks: '
        + '"PN220" is not the code or alias of a check (see docs/checks.md), so it switches nothing off. Did you mean PN202 (unknown-unit) or PN320 (pressure-unlike-altitude)? '
        + '"unusal-value" is not the code or alias of a check (see docs/checks.md), so it switches nothing off. Did you mean unusual-value (PN302)? '
        + '"no-such-thing" is not the code or alias of a check (see docs/checks.md), so it switches nothing off.',
    });
  });

  it('are reported once for the same list, however many notes ask for the settings', async () => {
    const uri = client.open(join(process.cwd(), 'disabled-unknown-2.pneu'), note);
    await client.diagnostics(uri);
    await client.connection.sendNotification('workspace/didChangeConfiguration', { settings: null });
    const count = client.published.length;
    await client.diagnostics(uri, (p) => client.published.indexOf(p) >= count);
    expect(client.messages.filter(aboutDisabledChecks)).toHaveLength(1);
  });

  it('bring no message when every name is a check’s code or alias, in any case', async () => {
    client.settings = { disabledChecks: ['PN302', 'pn103', 'flow-on-room-air'] };
    const before = client.messages.length;
    const count = client.published.length;
    await client.connection.sendNotification('workspace/didChangeConfiguration', { settings: null });
    const uri = pathToFileURL(join(process.cwd(), 'disabled-unknown-2.pneu')).toString();
    const p = await client.diagnostics(uri, (d) => client.published.indexOf(d) >= count);
    expect(p.diagnostics.map((d) => String(d.code))).not.toContain('PN103');
    expect(client.messages.slice(before).filter(aboutDisabledChecks)).toEqual([]);
  });

  it('are reported again for another list', async () => {
    client.settings = { disabledChecks: ['PN 103'] };
    await client.connection.sendNotification('workspace/didChangeConfiguration', { settings: null });
    const warning = await client.message((m) => m.message.includes('"PN 103"'));
    expect(warning.message).toBe('pneumark: pneumark.disabledChecks: "PN 103" is not the code or alias of a check (see docs/checks.md), so it switches nothing off. Did you mean PN103 (decimal-comma)?');
  });
});

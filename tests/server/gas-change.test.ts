// Over a real stdio connection to the bundled server: the change since the previous arterial gas
// in the hover of a gas value and in the P/F ratio's inlay-hint tooltip (resolved when shown), in a
// note that writes its gases in kPa. Invented note; P/F = PaO2 ÷ FiO2 (ARDS Definition Task Force,
// Acute respiratory distress syndrome: the Berlin Definition, JAMA 2012): 10.0 kPa ÷ 0.40 = 25.0
// kPa at the first gas, 8.0 ÷ 0.50 = 16.0 kPa at the second.
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import type { Hover, InlayHint, MarkupContent } from 'vscode-languageserver-protocol';
import { serverForTests } from './lsp-client';

const client = serverForTests();

const NOTE = [
  'units     gas kPa',
  '@ day 1 08:00  on the ward',
  'oxygen    mask, fio2 0.4',
  'abg       ph 7.35, pco2 6.0, po2 10.0',
  '@ day 2 09:00  next morning',
  'oxygen    mask, fio2 0.5',
  'abg       ph 7.33, pco2 6.5, po2 8.0',
  '',
].join('\n');

const CHANGE = 'from timepoint 1 (on the ward, day 1 08:00), 25 h earlier: PaO2 down 2.0 kPa (was 10.0) · PaCO2 up 0.5 kPa (was 6.0) · pH down 0.02 (was 7.35) · P/F down 9.0 kPa (was 25.0) · FiO2 up 0.10 (was 0.40)';

const valueOf = (contents: Hover['contents'] | InlayHint['tooltip'] | undefined): string =>
  typeof contents === 'object' && contents !== null && 'value' in contents ? (contents as MarkupContent).value : String(contents ?? '');

describe('the change since the previous arterial gas, over the protocol', () => {
  it('is in the hover of the later PaO2 and under the P/F ratio of its hint, in kPa', async () => {
    const uri = client.open(join(process.cwd(), 'gas-change.pneu'), NOTE);
    await client.diagnostics(uri);
    const line = 6;
    const character = NOTE.split('\n')[line]!.indexOf('po2 8.0') + 5;
    const hover = await client.connection.sendRequest<Hover | null>('textDocument/hover', { textDocument: { uri }, position: { line, character } });
    const md = valueOf(hover?.contents);
    expect(md).toContain(`**Since the previous arterial gas**: ${CHANGE}.`);
    expect(md).toMatch(/defer to local protocols and licensed practice/);

    const hints = await client.connection.sendRequest<InlayHint[]>('textDocument/inlayHint', { textDocument: { uri }, range: { start: { line: 0, character: 0 }, end: { line: 8, character: 0 } } });
    const label = (h: InlayHint) => (typeof h.label === 'string' ? h.label : h.label.map((p) => p.value).join(''));
    const pf = hints.filter((h) => h.position.line === line && /P\/F/.test(label(h)));
    expect(pf).toHaveLength(1);
    const resolved = await client.connection.sendRequest<InlayHint>('inlayHint/resolve', pf[0]);
    expect(valueOf(resolved.tooltip)).toContain(`**Since the previous arterial gas**: ${CHANGE}.`);
    void client.connection.sendNotification('textDocument/didClose', { textDocument: { uri } });
  });
});

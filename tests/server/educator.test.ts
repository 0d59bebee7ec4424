// A respiratory educator's teaching notes, through the protocol as an editor asks for them:
// what the hints, hovers and diagnostics say of the values an invented teaching case holds.
// All patients, places and times are invented.
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import type { Diagnostic, Hover, InlayHint } from 'vscode-languageserver-protocol';
import { applyEdits } from '../../server/src/core/service/text-edits';
import { serverForTests } from './lsp-client';

const client = serverForTests();

const path = (name: string) => join(process.cwd(), name);
const WHOLE = { start: { line: 0, character: 0 }, end: { line: 1000, character: 0 } };

async function hintsOf(uri: string): Promise<string[]> {
  const hints = await client.connection.sendRequest<InlayHint[]>('textDocument/inlayHint', { textDocument: { uri }, range: WHOLE });
  return hints.map((h) => (typeof h.label === 'string' ? h.label : h.label.map((p) => p.value).join('')));
}

async function hoverText(uri: string, line: number, character: number): Promise<string> {
  const hover = await client.connection.sendRequest<Hover | null>('textDocument/hover', { textDocument: { uri }, position: { line, character } });
  const contents = hover?.contents;
  return contents !== undefined && typeof contents === 'object' && 'value' in contents ? contents.value : '';
}

describe('a PaO2 above the inspired PO2, with no PaCO2 to work out the alveolar PO2', () => {
  // PAO2 = PiO2 − PaCO2 × (FiO2 + (1 − FiO2) ÷ R) is below PiO2 for any PaCO2 above 0 (the alveolar gas
  // equation: Riley RL, Cournand A, J Appl Physiol 1949;1:825–847, from memory), so no arterial PO2
  // can be above the inspired PO2, whether or not a PaCO2 is written.
  it('is reported as PN401, and neither a P/F nor a reading is made from it', async () => {
    // Room air at sea level: PiO2 0.21 × (760 − 47) = 150 mmHg; a PaO2 of 160 cannot be.
    const uri = client.open(path('teaching-room-air-no-pco2.pneu'), [
      '# Invented teaching case: a gas sent without its PaCO2.',
      '@ day 1 10:00  Brookfield ward',
      'oxygen    room air',
      'abg       ph 7.41, po2 160',
      '',
    ].join('\n'));
    const { diagnostics } = await client.diagnostics(uri);
    const pn401 = diagnostics.filter((d) => d.code === 'PN401');
    expect(pn401.map((d) => [d.range.start.line, d.range.start.character])).toEqual([[3, 23]]);
    expect(pn401[0]!.message).toContain('inspired PO2');
    expect(diagnostics.map((d) => d.code)).not.toContain('PN410');
    expect(await hintsOf(uri)).toEqual(['P/F withheld (PN401)']);
    const hover = await hoverText(uri, 1, 0);
    expect(hover).not.toMatch(/consistent with adequate arterial oxygenation/);
    expect(hover).toContain('**Withheld**\n- P/F ratio (P/F): the PaO2 is above the inspired PO2');
    expect(hover).toContain('PaO2 160 mmHg: oxygenation not read');
  });

  it('holds where a bare PaCO2 is not used because the gas unit makes it implausible', async () => {
    // gasUnit kPa: `pco2 50` is doubted (PN204) and `po2 70` reads 70 kPa = 525 mmHg, above the
    // PiO2 of 0.70 × (755 − 47) = 496 mmHg.
    const uri = client.open(path('teaching-kpa-doubted.pneu'), [
      'units     gas kPa',
      'place     barometric 755 mmHg',
      '@ day 1 11:00  Orchard ICU',
      'vent      mode PC, pinsp 20, peep 10, fio2 0.7',
      'abg       ph 7.30, pco2 50, po2 70, hco3 24',
      '',
    ].join('\n'));
    const { diagnostics } = await client.diagnostics(uri);
    expect(diagnostics.filter((d) => d.code === 'PN401').map((d) => d.range.start.line)).toEqual([4]);
    const hints = (await hintsOf(uri)).join(' | ');
    expect(hints).toContain('P/F withheld (PN401)');
    expect(hints).not.toMatch(/P\/F \d/);
  });

  it('leaves a possible PaO2 without a PaCO2 as it was: P/F and its reading', async () => {
    const uri = client.open(path('teaching-possible-no-pco2.pneu'), [
      '@ day 1 10:00',
      'oxygen    room air',
      'abg       ph 7.41, po2 90',
      '',
    ].join('\n'));
    const { diagnostics } = await client.diagnostics(uri);
    expect(diagnostics.map((d) => d.code)).not.toContain('PN401');
    expect((await hintsOf(uri)).join(' | ')).toContain('P/F 429');
  });
});

describe("a child's height and weight", () => {
  // The usual minimum of height (120 cm) and weight (25 kg) is an adult's (the range where the ARDS
  // Network predicted-body-weight equation was used; common practice, no source): a child of 6 is
  // smaller, and the warning only made noise on every paediatric teaching note.
  it('are not called unusual below an adult minimum when the patient is under 18 years', async () => {
    const uri = client.open(path('teaching-child.pneu'), [
      '# Invented teaching case: a child with a chest infection.',
      'patient   age 6 y, sex male, height 116 cm, weight 21 kg',
      '@ day 1 03:10  Larkmoor children\'s ward',
      'vitals    hr 138, rr 38, spo2 91 %',
      '@ 05:00  weighed again on the ward scales',
      'patient   weight 20.5 kg',
      '',
    ].join('\n'));
    const { diagnostics } = await client.diagnostics(uri);
    expect(diagnostics.filter((d) => d.code === 'PN302').map((d) => d.message)).toEqual([]);
  });

  it('are still called unusual above the usual maximum, and below the minimum in an adult or with no age', async () => {
    const uri = client.open(path('teaching-sizes.pneu'), [
      'patient   age 9 y, weight 260 kg',
      '',
    ].join('\n'));
    const adult = client.open(path('teaching-adult-small.pneu'), 'patient   age 30 y, height 116 cm, weight 21 kg\n');
    const ageless = client.open(path('teaching-no-age.pneu'), 'patient   height 116 cm\n');
    const codes = async (u: string) => (await client.diagnostics(u)).diagnostics.filter((d) => d.code === 'PN302').map((d) => d.range.start.character);
    expect(await codes(uri)).toEqual([26]);
    expect(await codes(adult)).toEqual([27, 42]);
    expect(await codes(ageless)).toEqual([17]);
  });
});

describe('a key typed with the digit 0 for the letter o', () => {
  it('is offered that key alone, not a key of another quantity as near by spelling', async () => {
    // `pc02` was offered `pco2`, `fi02` and `paco2`: `fi02` (FiO2) would turn a PaCO2 into an FiO2.
    const text = ['@ day 1 10:00  Brookfield ward', 'abg       ph 7.40, pc02 40, po2 90', 'vitals    sp02 96 %', ''].join('\n');
    const uri = client.open(path('teaching-zero-for-o.pneu'), text);
    const { diagnostics } = await client.diagnostics(uri);
    const unknown = diagnostics.filter((d) => d.code === 'PN201');
    expect(unknown.map((d) => d.message)).toEqual([
      '`pc02` is not a key of abg lines. Did you mean `pco2`?',
      '`sp02` is not a key of vitals lines. Did you mean `spo2`?',
    ]);
    const actions = await client.connection.sendRequest<{ title: string; kind?: string; isPreferred?: boolean }[]>('textDocument/codeAction', {
      textDocument: { uri },
      range: unknown[0]!.range,
      context: { diagnostics: [unknown[0]] },
    });
    const fixes = actions.filter((a) => a.kind === 'quickfix' && !a.title.startsWith('Fix all'));
    expect(fixes.map((a) => [a.title, a.isPreferred === true])).toEqual([['Change to `pco2`', true]]);
  });
});

describe('a teaching note edited as an editor sends its edits', () => {
  /** A position in UTF-16 code units, lines broken at CRLF, CR or LF, as LSP counts them. */
  function positionOf(text: string, offset: number): { line: number; character: number } {
    let line = 0;
    let start = 0;
    for (let i = 0; i < offset; i++) {
      if (text[i] === '\r' && text[i + 1] === '\n') continue;
      if (text[i] === '\n' || text[i] === '\r') {
        line++;
        start = i + 1;
      }
    }
    return { line, character: offset - start };
  }

  // Several edits in one didChange, each against the text the ones before it left: a block pasted
  // across timepoints, a timepoint header deleted and restored (undo), a carried setting edited
  // inside its line, a line break typed in a CRLF note, and a lone CR.
  const BASE = [
    '# Invented teaching case: weaning on the ward at Fenwick.',
    'patient   age 58 y, sex female, height 165 cm, weight 70 kg',
    'place     altitude 1400 m',
    '',
    '@ day 1 08:00  on the ventilator',
    'vent      mode PC, pinsp 18, peep 8, fio2 0.5, rate 18',
    'abg       7.34/48/72/25',
    '',
    '@ 12:00  PEEP lowered',
    'vent      peep 6',
    'abg       7.36/46/68/25.5',
    '',
    '@ +4h',
    'oxygen    niv ipap 14, epap 6, fio2 40 %',
    'abg       ph 7.38, pco2 44, po2 70, hco3 25',
    '',
  ].join('\r\n');
  type Step = readonly { readonly find: string; readonly length?: number; readonly insert: string }[];
  const STEPS: readonly Step[] = [
    // A block of two timepoints pasted after the first gas, its lines ending as the note's do.
    [{ find: 'abg       7.34/48/72/25\r\n', insert: '\r\n@ 09:00  pasted\r\nvent      fio2 0.7\r\nabg       7.30/52/60/24\r\n@ 10:00\r\nabg       7.31/50/65/24\r\n' }],
    // The header of `@ 12:00` deleted: its lines join the timepoint before.
    [{ find: '@ 12:00  PEEP lowered\r\n', length: '@ 12:00  PEEP lowered\r\n'.length, insert: '' }],
    // Undone.
    [{ find: 'vent      peep 6', insert: '@ 12:00  PEEP lowered\r\n' }],
    // The carried FiO2 changed inside its line, and the altitude, in one notification.
    [{ find: 'fio2 0.5', length: 'fio2 0.5'.length, insert: 'fio2 0.35' }, { find: '1400 m', length: 4, insert: '2600' }],
    // A line break typed at the end of a line of a CRLF note, then a lone CR typed in a line.
    [{ find: '\r\n@ +4h', insert: '\r\n' }],
    [{ find: 'oxygen    niv', insert: 'units     gas kPa\r' }],
    // Everything from the middle of one timepoint to the middle of another replaced by a paste.
    [{ find: 'rate 18', length: 'rate 18\r\nabg       7.34/48/72/25'.length, insert: 'rate 20\r\nabg       7.33/49/70/25' }],
  ];

  it('gives after each edit what a fresh analysis of the same text gives', async () => {
    let text = BASE;
    const uri = client.open(path('teaching-edited.pneu'), text);
    await client.diagnostics(uri);
    const plain = (list: readonly Diagnostic[]) => list.map((d) => [d.range, d.code, d.message]);
    let version = 1;
    for (const [n, step] of STEPS.entries()) {
      const changes = [];
      for (const edit of step) {
        const at = text.indexOf(edit.find);
        expect(at, `step ${n}: ${JSON.stringify(edit.find)}`).toBeGreaterThanOrEqual(0);
        const start = positionOf(text, at);
        const end = positionOf(text, at + (edit.length ?? 0));
        changes.push({ range: { start, end }, text: edit.insert });
        text = text.slice(0, at) + edit.insert + text.slice(at + (edit.length ?? 0));
      }
      version++;
      await client.connection.sendNotification('textDocument/didChange', { textDocument: { uri, version }, contentChanges: changes });
      const v = version;
      const edited = await client.diagnostics(uri, (p) => p.version === v);
      const fresh = client.open(path(`teaching-edited-fresh-${n}.pneu`), text);
      const opened = await client.diagnostics(fresh);
      expect(plain(edited.diagnostics), `step ${n}`).toEqual(plain(opened.diagnostics));
      expect(await hintsOf(uri), `step ${n}`).toEqual(await hintsOf(fresh));
      for (const method of ['textDocument/documentSymbol', 'textDocument/foldingRange']) {
        expect(await client.connection.sendRequest(method, { textDocument: { uri } }), `step ${n} ${method}`).toEqual(await client.connection.sendRequest(method, { textDocument: { uri: fresh } }));
      }
      await client.connection.sendNotification('textDocument/didClose', { textDocument: { uri: fresh } });
    }
    // The edits did change what is seen: the pasted gas is read at its own timepoint.
    expect((await client.diagnostics(uri, (p) => p.version === version)).diagnostics.length).toBeGreaterThan(3);
  });
});

describe('completion at the start of a line inside a timepoint', () => {
  it('offers the sections of a timepoint first, and says a header section written there holds from it on', async () => {
    const text = ['patient   age 58 y', '', '@ day 1 08:00  Fenwick ward', '', ''].join('\n');
    const uri = client.open(path('teaching-complete-in-timepoint.pneu'), text);
    await client.diagnostics(uri);
    const at = async (line: number) => {
      const items = await client.connection.sendRequest<{ label: string; detail?: string; kind?: number }[]>('textDocument/completion', { textDocument: { uri }, position: { line, character: 0 } });
      return items.filter((i) => !i.label.includes(' ')).map((i) => [i.label, i.detail]);
    };
    // Before the first timepoint: the header's own lines first, as before.
    const header = await at(1);
    expect(header.slice(0, 3).map(([label]) => label)).toEqual(['patient', 'place', 'units']);
    expect(header[0]![1]).toBe('header line: holds for the whole note');
    const inside = await at(3);
    expect(inside.slice(0, 7).map(([label]) => label)).toEqual(['vitals', 'oxygen', 'abg', 'vbg', 'labs', 'vent', 'note']);
    expect(inside.slice(7)).toEqual([
      ['patient', 'restates a header line: holds from this timepoint on'],
      ['place', 'restates a header line: holds from this timepoint on'],
      ['units', 'restates a header line: holds from this timepoint on'],
    ]);
  });
});

describe('converting every gas pressure of a note', () => {
  type Edit = { range: { start: { line: number; character: number }; end: { line: number; character: number } }; newText: string };
  async function converted(name: string, text: string, to: 'mmHg' | 'kPa'): Promise<string[]> {
    const uri = client.open(path(name), text);
    await client.diagnostics(uri);
    const edits = await client.connection.sendRequest<Edit[]>('pneumark/convertUnits', { uri, to });
    return applyEdits(text, edits).split('\n');
  }

  it('keeps trailing comments in their column', async () => {
    const lines = await converted('teaching-convert-comments.pneu', [
      'units     gas kPa',
      '@ day 1 14:20  Saltmarsh emergency department',
      'oxygen    cannula 4 L/min                       # flow turned up by the crew',
      'abg       7.26/9.6/10.8/31                      # pH / PaCO2 / PaO2 / HCO3',
      'abg       ph 7.28, pco2 9.1, po2 7.9            # repeat',
      'abg       ph 7.30, pco2 8.93, po2 12.25 kPa     # with its unit',
      '',
    ].join('\n'), 'mmHg');
    expect(lines[3]).toMatch(/^abg {7}7\.26\/72\/81\/31 +# pH/);
    for (const line of [2, 3, 4, 5]) expect(lines[line]!.indexOf('#'), lines[line]).toBe(48);
  });

  it('puts a comment two spaces after content that grows past its column', async () => {
    const lines = await converted('teaching-convert-comment-close.pneu', [
      '@ day 1 14:20',
      'abg       ph 7.30, pco2 67, po2 92 mmHg, hco3 31.5  # close to the comment',
      '',
    ].join('\n'), 'kPa');
    expect(lines.find((l) => l.startsWith('abg'))).toMatch(/hco3 31\.5 {2}# close/);
  });
});
